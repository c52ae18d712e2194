/**
 * Team management through the real server actions against the real PostgreSQL: invitations,
 * role changes, removals and withdrawn invitations in shops made here (the demo shop is never
 * touched). Only the session lookup is replaced, per call, so the access checks run as they do
 * in a request.
 */
import { AsyncLocalStorage } from "node:async_hooks";
import { and, eq, inArray } from "drizzle-orm";
import { beforeAll, describe, expect, it, vi } from "vitest";
import type { SessionUser } from "@/app/_server/auth";

const session = new AsyncLocalStorage<SessionUser | null>();
vi.mock("@/app/_server/auth", () => ({
  getSessionUser: async () => session.getStore() ?? null,
  getAuthOptions: () => {
    throw new Error("next-auth is not used while the session is mocked");
  },
}));
// Outside a request there is no cache to revalidate.
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));

const { changeMemberRoleAction, inviteMemberAction, removeMemberAction, withdrawInvitationAction } = await import("@/app/shops/[shop]/settings/actions");
const { acceptInvitationAction } = await import("@/app/invite/[token]/actions");
const { db } = await import("@/db/client");
const { linkContactsToUser } = await import("@/db/queries/access");
const { createClient } = await import("@/db/queries/clients");
const { createInvitation, createShopWithOwner, findInvitation, listMembers, listOpenInvitations } = await import("@/db/queries/shops");
const { auditLog, memberships, shops, users } = await import("@/db/schema");
const { LAST_OWNER_MESSAGE } = await import("@/lib/access");
const { describeAudit } = await import("@/lib/audit-text");
const { addTeamMember, MEMBER_PASSWORD } = await import("@/tests/authz/fixtures");
const { shopFactory } = await import("@/tests/support/factory");

type Shop = { id: string; slug: string; owner: SessionUser };

// The shops signed up here, and the people who joined them, go again after the file.
const made = shopFactory("team");
const tag = made.tag;
let seq = 0;
const unique = () => `${tag}-${(seq += 1)}`;

function as<T>(user: SessionUser | null, fn: () => Promise<T>): Promise<T> {
  return session.run(user, fn);
}

/** A shop of its own, signed up the way the sign-up action does it. */
async function newShop(name: string): Promise<Shop> {
  const email = `team-owner-${unique()}@example.test`;
  const { userId, shopSlug } = await createShopWithOwner({ shopName: `${name} ${tag}`, name: "Wren Calder", email, passwordHash: "not-used" });
  made.adopt({ shopSlugs: [shopSlug], userIds: [userId] });
  const [shop] = await db.select({ id: shops.id, slug: shops.slug }).from(shops).where(eq(shops.slug, shopSlug));
  return { ...shop!, owner: { id: userId, email, name: "Wren Calder" } };
}

async function roleOf(memberId: string) {
  const [row] = await db.select({ role: memberships.role }).from(memberships).where(eq(memberships.id, memberId));
  return row?.role;
}

async function ownerCount(shopId: string) {
  return (await db.select({ id: memberships.id }).from(memberships).where(and(eq(memberships.shopId, shopId), eq(memberships.role, "owner")))).length;
}

async function auditOf(shopId: string, actions: string[]) {
  return db.select().from(auditLog).where(and(eq(auditLog.shopId, shopId), inArray(auditLog.action, actions)));
}

async function membershipIdOf(shop: Shop, userId: string) {
  const [row] = await db.select({ id: memberships.id }).from(memberships).where(and(eq(memberships.shopId, shop.id), eq(memberships.userId, userId)));
  return row!.id;
}

let shop: Shop;
let elsewhere: Shop;

beforeAll(async () => {
  shop = await newShop("Lantern Yard Prints");
  elsewhere = await newShop("Kiln Row Transfers");
});

describe("a shop's team, from invitation to removal", () => {
  it("invites someone, who joins; the owner changes their role and then removes them, each step in the audit log", async () => {
    const email = `team-joiner-${unique()}@example.test`;
    const invited = await as(shop.owner, () => inviteMemberAction({ shopSlug: shop.slug, email, role: "designer" }));
    expect(invited.ok).toBe(true);
    const token = invited.ok ? invited.data.link.split("/invite/")[1]! : "";
    expect((await listOpenInvitations({ shopId: shop.id })).map((i) => i.email)).toContain(email);

    const joined = await as(null, () => acceptInvitationAction({ token, name: "Juno Park", password: MEMBER_PASSWORD }));
    expect(joined).toMatchObject({ ok: true, data: { shopSlug: shop.slug, email } });
    const member = (await listMembers({ shopId: shop.id })).find((m) => m.email === email)!;
    expect(member.role).toBe("designer");
    expect((await listOpenInvitations({ shopId: shop.id })).map((i) => i.email)).not.toContain(email);

    const changed = await as(shop.owner, () => changeMemberRoleAction({ shopSlug: shop.slug, memberId: member.id, role: "production" }));
    expect(changed).toMatchObject({ ok: true, data: { memberId: member.id, role: "production", self: false, changed: true, message: "Juno Park is now production." } });
    expect(await roleOf(member.id)).toBe("production");
    // This member's entries only: other tests share the shop, in whatever order they run.
    const [roleEntry] = (await auditOf(shop.id, ["member.role-changed"])).filter((e) => e.subjectId === member.id);
    expect(roleEntry).toMatchObject({ actorUserId: shop.owner.id, subjectType: "membership", subjectId: member.id, detail: { email, from: "designer", role: "production" } });
    expect(describeAudit(roleEntry!.action, roleEntry!.detail ?? {})).toBe(`Someone made ${email} production (was a designer) on the team.`);

    const removed = await as(shop.owner, () => removeMemberAction({ shopSlug: shop.slug, memberId: member.id }));
    expect(removed).toMatchObject({ ok: true, data: { self: false, message: "Juno Park is no longer on the team." } });
    expect(await roleOf(member.id)).toBeUndefined();
    // The account stays; only the place on this team goes.
    expect(await db.select({ id: users.id }).from(users).where(eq(users.id, member.userId))).toHaveLength(1);
    const [removedEntry] = (await auditOf(shop.id, ["member.removed"])).filter((e) => e.subjectId === member.id);
    expect(removedEntry).toMatchObject({ actorUserId: shop.owner.id, subjectId: member.id, detail: { email, role: "production" } });

    // Removed, they are no one to this shop.
    const after = await as({ id: member.userId, email, name: "Juno Park" }, () => changeMemberRoleAction({ shopSlug: shop.slug, memberId: member.id, role: "owner" }));
    expect(after).toMatchObject({ ok: false, status: 404 });
    expect(await as(shop.owner, () => removeMemberAction({ shopSlug: shop.slug, memberId: member.id }))).toMatchObject({ ok: false, status: 404 });
  });

  it("withdraws an open invitation: it leaves the list, its token no longer joins, and the log says so", async () => {
    const email = `team-withdrawn-${unique()}@example.test`;
    const invited = await as(shop.owner, () => inviteMemberAction({ shopSlug: shop.slug, email, role: "production" }));
    const token = invited.ok ? invited.data.link.split("/invite/")[1]! : "";
    const invitation = (await listOpenInvitations({ shopId: shop.id })).find((i) => i.email === email)!;

    const withdrawn = await as(shop.owner, () => withdrawInvitationAction({ shopSlug: shop.slug, invitationId: invitation.id }));
    expect(withdrawn).toMatchObject({ ok: true, data: { invitationId: invitation.id } });
    expect(withdrawn.ok && withdrawn.data.message).toContain(email);
    expect((await listOpenInvitations({ shopId: shop.id })).map((i) => i.id)).not.toContain(invitation.id);
    expect(await findInvitation({ token })).toBeUndefined();

    const joined = await as(null, () => acceptInvitationAction({ token, name: "Ivo Lund", password: MEMBER_PASSWORD }));
    expect(joined.ok).toBe(false);
    expect((await listMembers({ shopId: shop.id })).map((m) => m.email)).not.toContain(email);
    expect(await db.select({ id: users.id }).from(users).where(eq(users.email, email))).toEqual([]);

    const entries = await auditOf(shop.id, ["member.invitation-withdrawn"]);
    expect(entries.find((e) => e.subjectId === invitation.id)).toMatchObject({ actorUserId: shop.owner.id, detail: { email, role: "production" } });
    // Twice is not found: there is nothing left to withdraw.
    expect(await as(shop.owner, () => withdrawInvitationAction({ shopSlug: shop.slug, invitationId: invitation.id }))).toMatchObject({ ok: false, status: 404 });
  });

  it("an invitation already accepted cannot be withdrawn", async () => {
    const joiner = await addTeamMember({ shopId: shop.id, ownerId: shop.owner.id, email: `team-accepted-${unique()}@example.test`, name: "Tove Brand", role: "designer" });
    const [entry] = (await auditOf(shop.id, ["member.joined"])).filter((e) => e.actorUserId === joiner.user.id);
    const result = await as(shop.owner, () => withdrawInvitationAction({ shopSlug: shop.slug, invitationId: entry!.subjectId! }));
    expect(result).toMatchObject({ ok: false, status: 404 });
    expect(await roleOf(joiner.memberId)).toBe("designer");
  });
});

describe("the last owner", () => {
  it("can be neither demoted nor removed, and nothing is written when refused", async () => {
    const solo = await newShop("Chalk Pit Screens");
    const memberId = await membershipIdOf(solo, solo.owner.id);
    const before = await auditOf(solo.id, ["member.role-changed", "member.removed"]);
    for (const role of ["designer", "production"] as const) {
      const result = await as(solo.owner, () => changeMemberRoleAction({ shopSlug: solo.slug, memberId, role }));
      expect(result).toEqual({ ok: false, error: LAST_OWNER_MESSAGE, status: 409 });
    }
    expect(await as(solo.owner, () => removeMemberAction({ shopSlug: solo.slug, memberId }))).toEqual({ ok: false, error: LAST_OWNER_MESSAGE, status: 409 });
    expect(await roleOf(memberId)).toBe("owner");
    expect(await auditOf(solo.id, ["member.role-changed", "member.removed"])).toEqual(before);
    // Choosing the role they already have is fine and changes nothing.
    expect(await as(solo.owner, () => changeMemberRoleAction({ shopSlug: solo.slug, memberId, role: "owner" }))).toMatchObject({ ok: true, data: { changed: false } });
  });

  it("cannot be demoted by accepting an invitation to their own shop with another role", async () => {
    const solo = await newShop("Platen Lane");
    const { token } = await createInvitation({ shopId: solo.id, email: solo.owner.email, role: "designer", invitedBy: solo.owner.id });
    const result = await as(solo.owner, () => acceptInvitationAction({ token }));
    expect(result.ok).toBe(false);
    expect(await roleOf(await membershipIdOf(solo, solo.owner.id))).toBe("owner");
  });

  it("an owner may step down or leave while another owner remains, and not once they are the last", async () => {
    const pair = await newShop("Gang Sheet Works");
    const second = await addTeamMember({ shopId: pair.id, ownerId: pair.owner.id, email: `team-co-owner-${unique()}@example.test`, name: "Odo Reyes", role: "owner" });
    const firstId = await membershipIdOf(pair, pair.owner.id);

    const stepDown = await as(pair.owner, () => changeMemberRoleAction({ shopSlug: pair.slug, memberId: firstId, role: "designer" }));
    expect(stepDown).toMatchObject({ ok: true, data: { self: true, changed: true, role: "designer" } });
    expect(await roleOf(firstId)).toBe("designer");
    // A designer now: the team is no longer theirs to change.
    expect(await as(pair.owner, () => changeMemberRoleAction({ shopSlug: pair.slug, memberId: firstId, role: "owner" }))).toMatchObject({ ok: false, status: 403 });

    expect(await as(second.user, () => removeMemberAction({ shopSlug: pair.slug, memberId: second.memberId }))).toEqual({ ok: false, error: LAST_OWNER_MESSAGE, status: 409 });
    expect(await as(second.user, () => changeMemberRoleAction({ shopSlug: pair.slug, memberId: firstId, role: "owner" }))).toMatchObject({ ok: true });
    const leave = await as(second.user, () => removeMemberAction({ shopSlug: pair.slug, memberId: second.memberId }));
    expect(leave).toMatchObject({ ok: true, data: { self: true } });
    expect(await ownerCount(pair.id)).toBe(1);
    expect(await roleOf(firstId)).toBe("owner");
  });

  it("survives two owners demoting each other at the same moment: one change lands, the other is refused", async () => {
    const pair = await newShop("Transfer Dock");
    const a = { memberId: await membershipIdOf(pair, pair.owner.id), user: pair.owner };
    const b = await addTeamMember({ shopId: pair.id, ownerId: pair.owner.id, email: `team-rival-${unique()}@example.test`, name: "Pia Norr", role: "owner" });
    for (let round = 0; round < 8; round += 1) {
      const [byA, byB] = await Promise.all([
        as(a.user, () => changeMemberRoleAction({ shopSlug: pair.slug, memberId: b.memberId, role: round % 2 ? "designer" : "production" })),
        as(b.user, () => changeMemberRoleAction({ shopSlug: pair.slug, memberId: a.memberId, role: round % 2 ? "production" : "designer" })),
      ]);
      expect(await ownerCount(pair.id), `round ${round}`).toBe(1);
      const results = [byA, byB];
      expect(results.filter((r) => r.ok), `round ${round}: ${JSON.stringify(results)}`).toHaveLength(1);
      const refused = results.find((r) => !r.ok)!;
      // The loser was either the last owner by then (409) or no longer an owner at all (403).
      expect([LAST_OWNER_MESSAGE, "Your role in this shop does not allow this."]).toContain(refused.ok ? "" : refused.error);
      // Both owners again for the next round.
      await db.update(memberships).set({ role: "owner" }).where(inArray(memberships.id, [a.memberId, b.memberId]));
    }
  });

  it("survives two owners removing each other at the same moment", async () => {
    const pair = await newShop("Size Run Supply");
    const aId = await membershipIdOf(pair, pair.owner.id);
    const b = await addTeamMember({ shopId: pair.id, ownerId: pair.owner.id, email: `team-remover-${unique()}@example.test`, name: "Lev Amsel", role: "owner" });
    const [byA, byB] = await Promise.all([
      as(pair.owner, () => removeMemberAction({ shopSlug: pair.slug, memberId: b.memberId })),
      as(b.user, () => removeMemberAction({ shopSlug: pair.slug, memberId: aId })),
    ]);
    expect(await ownerCount(pair.id)).toBe(1);
    expect([byA, byB].filter((r) => r.ok)).toHaveLength(1);
  });
});

describe("who may change the team", () => {
  it("refuses designers, production and clients (403) and leaves the team as it was", async () => {
    const designer = await addTeamMember({ shopId: shop.id, ownerId: shop.owner.id, email: `team-designer-${unique()}@example.test`, name: "Ines Moro", role: "designer" });
    const press = await addTeamMember({ shopId: shop.id, ownerId: shop.owner.id, email: `team-press-${unique()}@example.test`, name: "Bo Strand", role: "production" });
    const clientEmail = `team-client-${unique()}@example.test`;
    await createClient({ shopId: shop.id, actorUserId: shop.owner.id, input: { name: `Harbour Rowing ${tag}`, notes: null, taxExempt: false, contacts: [{ name: "Cato Rell", email: clientEmail, phone: null }] } });
    // The client proved the address (opened a link sent to it), so the contact is theirs.
    const [clientUser] = await db.insert(users).values({ email: clientEmail, name: "Cato Rell", emailVerified: new Date() }).returning({ id: users.id });
    made.adopt({ userIds: [clientUser!.id] });
    await linkContactsToUser({ userId: clientUser!.id });
    const client: SessionUser = { id: clientUser!.id, email: clientEmail, name: "Cato Rell" };
    const { invitationId } = await createInvitation({ shopId: shop.id, email: `team-pending-${unique()}@example.test`, role: "designer", invitedBy: shop.owner.id });
    const ownerId = await membershipIdOf(shop, shop.owner.id);

    for (const user of [designer.user, press.user, client]) {
      expect(await as(user, () => changeMemberRoleAction({ shopSlug: shop.slug, memberId: press.memberId, role: "owner" })), user.email).toMatchObject({ ok: false, status: 403 });
      expect(await as(user, () => changeMemberRoleAction({ shopSlug: shop.slug, memberId: ownerId, role: "production" })), user.email).toMatchObject({ ok: false, status: 403 });
      expect(await as(user, () => removeMemberAction({ shopSlug: shop.slug, memberId: designer.memberId })), user.email).toMatchObject({ ok: false, status: 403 });
      expect(await as(user, () => withdrawInvitationAction({ shopSlug: shop.slug, invitationId })), user.email).toMatchObject({ ok: false, status: 403 });
    }
    expect(await as(null, () => removeMemberAction({ shopSlug: shop.slug, memberId: designer.memberId }))).toMatchObject({ ok: false, status: 401 });
    expect(await roleOf(press.memberId)).toBe("production");
    expect(await roleOf(designer.memberId)).toBe("designer");
    expect(await roleOf(ownerId)).toBe("owner");
    expect((await listOpenInvitations({ shopId: shop.id })).map((i) => i.id)).toContain(invitationId);
  });

  it("treats another shop's members and invitations as not found, by either shop's address", async () => {
    const theirs = await addTeamMember({ shopId: elsewhere.id, ownerId: elsewhere.owner.id, email: `team-theirs-${unique()}@example.test`, name: "Rue Falk", role: "designer" });
    const { invitationId } = await createInvitation({ shopId: elsewhere.id, email: `team-their-invite-${unique()}@example.test`, role: "designer", invitedBy: elsewhere.owner.id });
    // Our owner, our address, their ids.
    expect(await as(shop.owner, () => changeMemberRoleAction({ shopSlug: shop.slug, memberId: theirs.memberId, role: "production" }))).toMatchObject({ ok: false, status: 404 });
    expect(await as(shop.owner, () => removeMemberAction({ shopSlug: shop.slug, memberId: theirs.memberId }))).toMatchObject({ ok: false, status: 404 });
    expect(await as(shop.owner, () => withdrawInvitationAction({ shopSlug: shop.slug, invitationId }))).toMatchObject({ ok: false, status: 404 });
    // Our owner at their address.
    expect(await as(shop.owner, () => removeMemberAction({ shopSlug: elsewhere.slug, memberId: theirs.memberId }))).toMatchObject({ ok: false, status: 404 });
    // Their owner, with our ids.
    const ours = await membershipIdOf(shop, shop.owner.id);
    expect(await as(elsewhere.owner, () => removeMemberAction({ shopSlug: elsewhere.slug, memberId: ours }))).toMatchObject({ ok: false, status: 404 });
    expect(await as(elsewhere.owner, () => changeMemberRoleAction({ shopSlug: shop.slug, memberId: ours, role: "designer" }))).toMatchObject({ ok: false, status: 404 });
    expect(await roleOf(theirs.memberId)).toBe("designer");
    expect(await roleOf(ours)).toBe("owner");
    expect((await listOpenInvitations({ shopId: elsewhere.id })).map((i) => i.id)).toContain(invitationId);
  });

  it("answers malformed input with a refusal, never a throw", async () => {
    for (const input of [{}, { shopSlug: shop.slug }, { shopSlug: shop.slug, memberId: "" }, { shopSlug: shop.slug, memberId: "x\u0000y", role: "owner" }, { shopSlug: shop.slug, memberId: "m", role: "boss" }, null]) {
      const results = await as(shop.owner, () =>
        Promise.all([
          changeMemberRoleAction(input as never),
          removeMemberAction(input as never),
          withdrawInvitationAction(input as never),
        ]),
      );
      for (const r of results) expect(r.ok).toBe(false);
    }
  });
});
