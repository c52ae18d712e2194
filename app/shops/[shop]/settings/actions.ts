"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { deniedAction, resolveShopAccess, type ActionResult } from "@/app/_server/access";
import { appUrl } from "@/app/_server/config";
import { composeMail } from "@/app/_server/emails";
import { sendMailSafely } from "@/app/_server/mail";
import { changeMemberRole, createInvitation, removeMember, saveShopClock, withdrawInvitation, type TeamChangeRefusal, type TeamChangeResult } from "@/db/queries/shops";
import { LAST_OWNER_MESSAGE, ROLE_LABELS, SHOP_ROLES, type ShopRole } from "@/lib/access";
import { isKnownLocale, isKnownTimeZone } from "@/lib/dates";
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

const recordId = z.string().trim().min(1).max(80);
const memberSchema = z.object({ shopSlug: z.string().min(1).max(80), memberId: recordId });
const roleSchema = memberSchema.extend({ role: z.enum(SHOP_ROLES, { message: "Pick a role." }) });
const invitationSchema = z.object({ shopSlug: z.string().min(1).max(80), invitationId: recordId });

const NOT_ON_TEAM = "That person is not on this team (any more). Reload the page to see the team as it is.";
const TRY_AGAIN = "The team could not be changed just now. Nothing was changed; try again.";

/** What a team change tells the owner, in words, or the refusal. */
type TeamChangeView = { memberId: string; name: string; role: ShopRole | null; self: boolean; changed: boolean; message: string };

const FORBIDDEN = "Your role in this shop does not allow this.";

function refusal(reason: TeamChangeRefusal, notFound = NOT_ON_TEAM): ActionResult<never> {
  if (reason === "last-owner") return { ok: false, error: LAST_OWNER_MESSAGE, status: 409 };
  // Their role changed between the access check and the change itself.
  if (reason === "forbidden") return { ok: false, error: FORBIDDEN, status: 403 };
  return { ok: false, error: notFound, status: 404 };
}

/** Gives a member another role. The shop's last owner keeps the owner role. */
export async function changeMemberRoleAction(input: z.input<typeof roleSchema>): Promise<ActionResult<TeamChangeView>> {
  const parsed = parseInput(roleSchema, input);
  if (!parsed.success) return { ok: false, error: "Pick a role for a member of this team.", fieldErrors: z.flattenError(parsed.error).fieldErrors };
  const access = await resolveShopAccess(parsed.data.shopSlug, "members.manage");
  if (access.kind !== "ok") return deniedAction(access);
  const { shop, actor } = access.access;
  let result: TeamChangeResult;
  try {
    result = await changeMemberRole({ shopId: shop.id, membershipId: parsed.data.memberId, role: parsed.data.role, actorUserId: actor.id });
  } catch (error) {
    console.error("[team] role change failed:", error instanceof Error ? error.message : error);
    return { ok: false, error: TRY_AGAIN };
  }
  if (!result.ok) return refusal(result.reason);
  const { member } = result;
  const self = member.userId === actor.id;
  const name = member.name ?? member.email;
  const label = ROLE_LABELS[member.role].toLowerCase();
  if (!self) revalidatePath(`/shops/${shop.slug}/settings`);
  return {
    ok: true,
    data: {
      memberId: member.id,
      name,
      role: member.role,
      self,
      changed: result.changed,
      message: !result.changed ? `${name} is already ${label}.` : self ? `You are now ${label} in ${shop.name}.` : `${name} is now ${label}.`,
    },
  };
}

/** Takes a member off the team. The shop's last owner stays; anyone else, the owner themselves included, may go. */
export async function removeMemberAction(input: z.input<typeof memberSchema>): Promise<ActionResult<TeamChangeView>> {
  const parsed = parseInput(memberSchema, input);
  if (!parsed.success) return { ok: false, error: "Pick a member of this team." };
  const access = await resolveShopAccess(parsed.data.shopSlug, "members.manage");
  if (access.kind !== "ok") return deniedAction(access);
  const { shop, actor } = access.access;
  let result: TeamChangeResult;
  try {
    result = await removeMember({ shopId: shop.id, membershipId: parsed.data.memberId, actorUserId: actor.id });
  } catch (error) {
    console.error("[team] removal failed:", error instanceof Error ? error.message : error);
    return { ok: false, error: TRY_AGAIN };
  }
  if (!result.ok) return refusal(result.reason);
  const { member } = result;
  const self = member.userId === actor.id;
  const name = member.name ?? member.email;
  if (!self) revalidatePath(`/shops/${shop.slug}/settings`);
  return {
    ok: true,
    data: { memberId: member.id, name, role: null, self, changed: true, message: self ? `You left ${shop.name}.` : `${name} is no longer on the team.` },
  };
}

/** Withdraws an open invitation: its link stops working at once. */
export async function withdrawInvitationAction(input: z.input<typeof invitationSchema>): Promise<ActionResult<{ invitationId: string; message: string }>> {
  const parsed = parseInput(invitationSchema, input);
  if (!parsed.success) return { ok: false, error: "Pick an open invitation of this shop." };
  const access = await resolveShopAccess(parsed.data.shopSlug, "members.manage");
  if (access.kind !== "ok") return deniedAction(access);
  const { shop, actor } = access.access;
  let result: Awaited<ReturnType<typeof withdrawInvitation>>;
  try {
    result = await withdrawInvitation({ shopId: shop.id, invitationId: parsed.data.invitationId, actorUserId: actor.id });
  } catch (error) {
    console.error("[team] withdrawal failed:", error instanceof Error ? error.message : error);
    return { ok: false, error: TRY_AGAIN };
  }
  if (!result.ok) return refusal(result.reason, "That invitation is already used or withdrawn. Reload the page to see the open ones.");
  const { invitation } = result;
  revalidatePath(`/shops/${shop.slug}/settings`);
  return { ok: true, data: { invitationId: invitation.id, message: `The invitation to ${invitation.email} is withdrawn; its link no longer works.` } };
}

const clockSchema = z.object({
  shopSlug: z.string().min(1).max(80),
  locale: z.string().trim().min(2).max(35).refine(isKnownLocale, "Pick a language and region from the list."),
  timeZone: z.string().trim().min(1).max(64).refine(isKnownTimeZone, "Pick a time zone from the list."),
});

/** The shop's language-and-region and time zone, used for every date it prints and shows. */
export async function saveShopClockAction(input: z.input<typeof clockSchema>): Promise<ActionResult<null>> {
  const parsed = parseInput(clockSchema, input);
  if (!parsed.success) return { ok: false, error: parsed.error.issues[0]?.message ?? "Check the date settings.", fieldErrors: z.flattenError(parsed.error).fieldErrors };
  const access = await resolveShopAccess(parsed.data.shopSlug, "shop.settings");
  if (access.kind !== "ok") return deniedAction(access);
  await saveShopClock({ shopId: access.access.shop.id, locale: parsed.data.locale, timeZone: parsed.data.timeZone });
  revalidatePath(`/shops/${parsed.data.shopSlug}/settings`);
  return { ok: true, data: null };
}
