"use server";

import bcrypt from "bcryptjs";
import { z } from "zod";
import { getActor, type ActionResult } from "@/app/_server/access";
import { actionClientAddress } from "@/app/_server/client-address";
import { addressSubject, LIMITS, takeLimits, UNAVAILABLE_MESSAGE } from "@/app/_server/rate-limit";
import { acceptInvitation } from "@/db/queries/shops";
import { parseInput } from "@/lib/input";

const schema = z.object({
  token: z.string().min(20).max(200),
  name: z.string().trim().min(1, "Tell us your name.").max(80).optional(),
  password: z.string().min(10, "Use at least 10 characters.").max(200).optional(),
});

const INVITE_LIMIT_MESSAGE = "Too many tries with invitations. Wait a few minutes and try again.";

/**
 * Joins the shop the invitation is for. A new account (name and password) is made for the invited
 * address; an existing account must be the one signed in: 401 when nobody is, 403 when someone else is.
 */
export async function acceptInvitationAction(input: z.input<typeof schema>): Promise<ActionResult<{ shopSlug: string; email: string }>> {
  const parsed = parseInput(schema, input);
  if (!parsed.success) return { ok: false, error: "Check the highlighted fields.", fieldErrors: z.flattenError(parsed.error).fieldErrors };
  // Per address, then per invitation: guessing tokens, or hashing passwords on our time, goes nowhere.
  const taken = await takeLimits({ rule: LIMITS.inviteAddress, subject: addressSubject(await actionClientAddress()) }, { rule: LIMITS.inviteToken, subject: parsed.data.token });
  if (!taken.ok) return { ok: false, error: taken.status === 429 ? INVITE_LIMIT_MESSAGE : UNAVAILABLE_MESSAGE, status: taken.status };
  const actor = await getActor();
  const passwordHash = parsed.data.password ? await bcrypt.hash(parsed.data.password, 10) : undefined;
  const result = await acceptInvitation({ token: parsed.data.token, name: parsed.data.name, passwordHash, signedInUserId: actor?.id ?? null });
  if (!result.ok) return { ok: false, error: result.message, ...(result.reason === "sign-in-as-invitee" ? { status: actor ? 403 : 401 } : {}) };
  return { ok: true, data: { shopSlug: result.shopSlug, email: result.email } };
}
