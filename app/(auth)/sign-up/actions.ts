"use server";

import bcrypt from "bcryptjs";
import { z } from "zod";
import type { ActionResult } from "@/app/_server/access";
import { LIMITS, takeLimits, UNAVAILABLE_MESSAGE } from "@/app/_server/rate-limit";
import { createShopWithOwner, EmailTakenError } from "@/db/queries/shops";
import { isKnownLocale, isKnownTimeZone } from "@/lib/dates";
import { parseInput } from "@/lib/input";

const signUpSchema = z.object({
  shopName: z.string().trim().min(2, "Give your shop a name of at least 2 characters.").max(80, "Keep the shop name under 80 characters."),
  name: z.string().trim().min(1, "Tell us your name.").max(80, "Keep your name under 80 characters."),
  email: z.string().trim().toLowerCase().email("Enter a valid e-mail address."),
  password: z.string().min(10, "Use at least 10 characters.").max(200, "Use at most 200 characters."),
  /** The browser's own clock and language, so a new shop's dates read right from the start; unknown ones are dropped. */
  timeZone: z.string().max(64).optional(),
  locale: z.string().max(35).optional(),
});

export type SignUpInput = z.input<typeof signUpSchema>;

export async function signUpAction(input: SignUpInput): Promise<ActionResult<{ shopSlug: string }>> {
  const parsed = parseInput(signUpSchema, input);
  if (!parsed.success) {
    return { ok: false, error: "Check the highlighted fields.", fieldErrors: z.flattenError(parsed.error).fieldErrors };
  }
  const taken = await takeLimits({ rule: LIMITS.signUp, subject: parsed.data.email });
  if (!taken.ok) return { ok: false, error: taken.status === 429 ? "Too many attempts. Wait a minute and try again." : UNAVAILABLE_MESSAGE, status: taken.status };
  try {
    const passwordHash = await bcrypt.hash(parsed.data.password, 10);
    const { timeZone, locale, ...account } = parsed.data;
    const { shopSlug } = await createShopWithOwner({
      ...account,
      passwordHash,
      timeZone: timeZone && isKnownTimeZone(timeZone) ? timeZone : undefined,
      locale: locale && isKnownLocale(locale) ? locale : undefined,
    });
    return { ok: true, data: { shopSlug } };
  } catch (error) {
    if (error instanceof EmailTakenError) return { ok: false, error: error.message, fieldErrors: { email: [error.message] } };
    console.error("[sign-up]", error);
    return { ok: false, error: "We could not create your shop just now. Nothing was saved; try again in a moment." };
  }
}
