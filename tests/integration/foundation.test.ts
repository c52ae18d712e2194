import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { createInvitation, acceptInvitation, createShopWithOwner, EmailTakenError, findInvitation } from "@/db/queries/shops";
import { listClientContacts, listMemberships } from "@/db/queries/access";
import { findUserByEmail } from "@/db/queries/users";
import { auditLog, invitations, memberships, shops, users } from "@/db/schema";
import { GET as health } from "@/app/api/health/route";
import { shopFactory } from "@/tests/support/factory";

// The shops signed up here go again after the file, with their people.
const made = shopFactory("foundation");
let seq = 0;
/** Names and addresses of this file's own: its factory tag (printed with any failure) and a count. */
const unique = () => `${made.tag}-${(seq += 1)}`;

async function signUp(input: Parameters<typeof createShopWithOwner>[0]) {
  const result = await createShopWithOwner(input);
  made.adopt({ shopSlugs: [result.shopSlug], userIds: [result.userId] });
  return result;
}

// About the demo itself: reads what the seed made, changes nothing.
describe("demo data", () => {
  it("seeds one shop with an owner, a designer, a press operator and a client contact", async () => {
    const owner = await findUserByEmail({ email: "owner@chalkline.test" });
    const press = await findUserByEmail({ email: "press@chalkline.test" });
    const client = await findUserByEmail({ email: "client@chalkline.test" });
    expect(owner && press && client).toBeTruthy();
    expect((await listMemberships({ userId: owner!.id })).map((m) => m.role)).toEqual(["owner"]);
    expect((await listMemberships({ userId: press!.id })).map((m) => m.role)).toEqual(["production"]);
    expect(await listMemberships({ userId: client!.id })).toEqual([]);
    const contacts = await listClientContacts({ userId: client!.id });
    expect(contacts).toHaveLength(1);
    expect(contacts[0]!.clientName).toBe("Eastfield Youth Soccer Club");
  });
});

describe("sign-up", () => {
  it("creates a shop whose creator is its owner, and records it in the audit log", async () => {
    const email = `maker-${unique()}@example.test`;
    const { userId, shopSlug } = await signUp({ shopName: `Cinder Alley Prints ${unique()}`, name: "Lou", email, passwordHash: "x" });
    const [shop] = await db.select().from(shops).where(eq(shops.slug, shopSlug));
    const [member] = await db.select().from(memberships).where(eq(memberships.shopId, shop!.id));
    expect(member).toMatchObject({ userId, role: "owner" });
    const audit = await db.select().from(auditLog).where(eq(auditLog.shopId, shop!.id));
    expect(audit.map((a) => a.action)).toContain("shop.created");
  });

  it("gives two shops with the same name different slugs", async () => {
    const shopName = `Same Name ${unique()}`;
    const a = await signUp({ shopName, name: "A", email: `a-${unique()}@example.test`, passwordHash: "x" });
    const b = await signUp({ shopName, name: "B", email: `b-${unique()}@example.test`, passwordHash: "x" });
    expect(a.shopSlug).not.toBe(b.shopSlug);
  });

  it("refuses an e-mail that already has an account and saves nothing", async () => {
    const email = `taken-${unique()}@example.test`;
    await signUp({ shopName: `First ${unique()}`, name: "First", email, passwordHash: "x" });
    const dupName = `Dup ${unique()}`;
    const before = await db.select({ id: shops.id }).from(shops);
    await expect(createShopWithOwner({ shopName: dupName, name: "Dup", email: email.toUpperCase(), passwordHash: "x" })).rejects.toBeInstanceOf(EmailTakenError);
    const after = await db.select({ id: shops.id }).from(shops);
    expect(after.length).toBe(before.length);
    expect(await db.select({ id: shops.id }).from(shops).where(eq(shops.name, dupName))).toEqual([]);
  });
});

describe("invitations", () => {
  it("stores only a hash of the token and adds the member with the invited role", async () => {
    const owner = await signUp({ shopName: `Invite Test ${unique()}`, name: "O", email: `o-${unique()}@example.test`, passwordHash: "x" });
    const [shop] = await db.select().from(shops).where(eq(shops.slug, owner.shopSlug));
    const email = `new-${unique()}@example.test`;
    const { token, invitationId } = await createInvitation({ shopId: shop!.id, email, role: "production", invitedBy: owner.userId });
    const [row] = await db.select().from(invitations).where(eq(invitations.id, invitationId));
    expect(row!.tokenHash).not.toContain(token);
    expect(row!.tokenHash).toMatch(/^[0-9a-f]{64}$/);

    const missing = await acceptInvitation({ token });
    expect(missing).toEqual({ ok: false, message: "Choose a name and a password to join." });
    const accepted = await acceptInvitation({ token, name: "New Person", passwordHash: "hash" });
    expect(accepted).toMatchObject({ ok: true, shopSlug: owner.shopSlug });
    const [user] = await db.select().from(users).where(eq(users.email, email));
    expect((await listMemberships({ userId: user!.id }))[0]!.role).toBe("production");
    expect(await acceptInvitation({ token, name: "Again", passwordHash: "hash" })).toEqual({ ok: false, message: "This invitation has already been used." });
  });

  it("refuses an expired invitation", async () => {
    const owner = await signUp({ shopName: `Expiry Test ${unique()}`, name: "O", email: `e-${unique()}@example.test`, passwordHash: "x" });
    const [shop] = await db.select().from(shops).where(eq(shops.slug, owner.shopSlug));
    const { token, invitationId } = await createInvitation({ shopId: shop!.id, email: `late-${unique()}@example.test`, role: "designer", invitedBy: owner.userId });
    await db.update(invitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitations.id, invitationId));
    expect((await acceptInvitation({ token, name: "L", passwordHash: "h" })).ok).toBe(false);
    expect(await findInvitation({ token: "not-a-real-token-at-all-xxxxxxxx" })).toBeUndefined();
  });
});

describe("health route", () => {
  it("answers 200 with the database reachable", async () => {
    const response = await health();
    expect(response.status).toBe(200);
    expect(await response.json()).toEqual({ status: "ok", db: "ok" });
  });
});
