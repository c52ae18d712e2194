"use server";

import bcrypt from "bcryptjs";
import { z } from "zod";
import { getActor, type ActionResult } from "@/app/_server/access";
import { acceptInvitation } from "@/db/queries/shops";
import { parseInput } from "@/lib/input";

const schema = z.object({
  token: z.string().min(20).max(200),
  name: z.string().trim().min(1, "Tell us your name.").max(80).optional(),
  password: z.string().min(10, "Use at least 10 characters.").max(200).optional(),
});

/**
 * Joins the shop the invitation is for. A new account (name and password) is made for the invited
 * address; an existing account must be the one signed in: 401 when nobody is, 403 when someone else is.
 */
export async function acceptInvitationAction(input: z.input<typeof schema>): Promise<ActionResult<{ shopSlug: string; email: string }>> {
  const parsed = parseInput(schema, input);
  if (!parsed.success) return { ok: false, error: "Check the highlighted fields.", fieldErrors: z.flattenError(parsed.error).fieldErrors };
  const actor = await getActor();
  const passwordHash = parsed.data.password ? await bcrypt.hash(parsed.data.password, 10) : undefined;
  const result = await acceptInvitation({ token: parsed.data.token, name: parsed.data.name, passwordHash, signedInUserId: actor?.id ?? null });
  if (!result.ok) return { ok: false, error: result.message, ...(result.reason === "sign-in-as-invitee" ? { status: actor ? 403 : 401 } : {}) };
  return { ok: true, data: { shopSlug: result.shopSlug, email: result.email } };
}
