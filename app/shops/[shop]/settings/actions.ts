"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { deniedAction, resolveShopAccess, type ActionResult } from "@/app/_server/access";
import { appUrl } from "@/app/_server/config";
import { composeMail } from "@/app/_server/emails";
import { sendMailSafely } from "@/app/_server/mail";
import { createInvitation } from "@/db/queries/shops";
import { ROLE_LABELS, SHOP_ROLES } from "@/lib/access";
import { parseInput } from "@/lib/input";

const inviteSchema = z.object({
  shopSlug: z.string().min(1).max(80),
  email: z.string().trim().toLowerCase().email("Enter a valid e-mail address."),
  role: z.enum(SHOP_ROLES, { message: "Pick a role." }),
});

export async function inviteMemberAction(input: z.input<typeof inviteSchema>): Promise<ActionResult<{ emailed: boolean; link: string }>> {
  const parsed = parseInput(inviteSchema, input);
  if (!parsed.success) {
    return { ok: false, error: "Check the highlighted fields.", fieldErrors: z.flattenError(parsed.error).fieldErrors };
  }
  const access = await resolveShopAccess(parsed.data.shopSlug, "members.invite");
  if (access.kind !== "ok") return deniedAction(access);
  const { shop, actor } = access.access;
  if (actor.memberships.some((m) => m.shopId === shop.id) && parsed.data.email === actor.email) {
    return { ok: false, error: "You are already on this team.", fieldErrors: { email: ["You are already on this team."] } };
  }
  const { token } = await createInvitation({ shopId: shop.id, email: parsed.data.email, role: parsed.data.role, invitedBy: actor.id });
  const link = `${appUrl()}/invite/${token}`;
  const mail = await sendMailSafely(
    composeMail({
      to: parsed.data.email,
      subject: `${actor.name ?? "Your shop"} invited you to ${shop.name} on Chalkline`,
      heading: `Join ${shop.name} on Chalkline`,
      paragraphs: [
        `${actor.name ?? actor.email} invited you to join ${shop.name} as ${ROLE_LABELS[parsed.data.role].toLowerCase()}.`,
        "The invitation is valid for 7 days.",
      ],
      action: { label: "Accept invitation", url: link },
    }),
  );
  revalidatePath(`/shops/${shop.slug}/settings`);
  return { ok: true, data: { emailed: mail.sent, link } };
}
