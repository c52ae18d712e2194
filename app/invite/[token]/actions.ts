"use server";

import bcrypt from "bcryptjs";
import { z } from "zod";
import type { ActionResult } from "@/app/_server/access";
import { acceptInvitation } from "@/db/queries/shops";
import { parseInput } from "@/lib/input";

const schema = z.object({
  token: z.string().min(20).max(200),
  name: z.string().trim().min(1, "Tell us your name.").max(80).optional(),
  password: z.string().min(10, "Use at least 10 characters.").max(200).optional(),
});

export async function acceptInvitationAction(input: z.input<typeof schema>): Promise<ActionResult<{ shopSlug: string; email: string }>> {
  const parsed = parseInput(schema, input);
  if (!parsed.success) return { ok: false, error: "Check the highlighted fields.", fieldErrors: z.flattenError(parsed.error).fieldErrors };
  const passwordHash = parsed.data.password ? await bcrypt.hash(parsed.data.password, 10) : undefined;
  const result = await acceptInvitation({ token: parsed.data.token, name: parsed.data.name, passwordHash });
  if (!result.ok) return { ok: false, error: result.message };
  return { ok: true, data: { shopSlug: result.shopSlug, email: result.email } };
}
