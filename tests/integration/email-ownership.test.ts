/**
 * An address gives access only once it is proven, against the real PostgreSQL: client contacts
 * are linked to an account only when its owner opened a link sent to the address (or came in
 * through an invitation e-mailed to it), and an invitation to an address that already has an
 * account joins only that account, signed in. Only the session lookup is replaced, per call.
 */
import { AsyncLocalStorage } from "node:async_hooks";
import { randomBytes } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it, vi } from "vitest";
import type { SessionUser } from "@/app/_server/auth";

const session = new AsyncLocalStorage<SessionUser | null>();
vi.mock("@/app/_server/auth", () => ({
  getSessionUser: async () => session.getStore() ?? null,
  getAuthOptions: () => {
    throw new Error("next-auth is not used while the session is mocked");
  },
}));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));

const { acceptInvitationAction } = await import("@/app/invite/[token]/actions");
const { db } = await import("@/db/client");
const { linkContactsToUser, listClientContacts } = await import("@/db/queries/access");
const { createClient, findClient, updateClient } = await import("@/db/queries/clients");
const { createInvitation, createShopWithOwner, signInAsInviteeMessage } = await import("@/db/queries/shops");
const { findUserByEmail, markEmailVerified } = await import("@/db/queries/users");
const { auditLog, invitations, memberships, shops } = await import("@/db/schema");

const tag = randomBytes(3).toString("hex");
let seq = 0;
const address = (who: string) => `${who}-${tag}-${(seq += 1)}@ownership.test`;

type Shop = { id: string; slug: string; owner: SessionUser };
let shop: Shop;

/** A shop signed up the way the sign-up action does it: the owner's address not proven yet. */
async function signedUp(name: string, email = address("owner")): Promise<Shop> {
  const { userId, shopSlug } = await createShopWithOwner({ shopName: `${name} ${tag}`, name: "Rook Amsel", email, passwordHash: "not-used" });
  const [row] = await db.select({ id: shops.id, slug: shops.slug }).from(shops).where(eq(shops.slug, shopSlug));
  return { ...row!, owner: { id: userId, email, name: "Rook Amsel" } };
}

async function contactUser(clientId: string, email: string) {
  const client = await findClient({ shopId: shop.id, clientId });
  return client!.contacts.find((c) => c.email === email)?.userId ?? null;
}

async function membershipOf(shopId: string, userId: string) {
  const [row] = await db.select().from(memberships).where(and(eq(memberships.shopId, shopId), eq(memberships.userId, userId)));
  return row;
}

const as = <T,>(user: SessionUser | null, fn: () => Promise<T>) => session.run(user, fn);

beforeAll(async () => {
  shop = await signedUp("Ownership Prints");
  await markEmailVerified({ userId: shop.owner.id });
});

describe("client contacts", () => {
  it("a shop filing a contact under an address someone signed up with links nobody until that address is proven", async () => {
    const email = address("squatted");
    const squatter = await signedUp("Squatted Screens", email);
    const client = await createClient({ shopId: shop.id, actorUserId: shop.owner.id, input: { name: `Harbor Rowing ${tag}`, notes: null, taxExempt: false, contacts: [{ name: "Tove Linde", email, phone: null }] } });
    expect(await contactUser(client.id, email)).toBeNull();
    // A sign-in of any kind tries to link; an unproven account gets nothing.
    await linkContactsToUser({ userId: squatter.owner.id });
    expect(await contactUser(client.id, email)).toBeNull();
    expect(await listClientContacts({ userId: squatter.owner.id })).toEqual([]);

    // The address's owner opens the link: now the contact is theirs.
    await markEmailVerified({ userId: squatter.owner.id });
    expect(await contactUser(client.id, email)).toBe(squatter.owner.id);
  });

  it("a contact added for a proven account is linked at once, and a saved form does not link an unproven one", async () => {
    const proven = address("proven");
    const unproven = address("unproven");
    const provenShop = await signedUp("Proven Platen", proven);
    await markEmailVerified({ userId: provenShop.owner.id });
    const unprovenShop = await signedUp("Unproven Platen", unproven);
    const client = await createClient({ shopId: shop.id, actorUserId: shop.owner.id, input: { name: `Quay Choir ${tag}`, notes: null, taxExempt: false, contacts: [{ name: "Ida Proven", email: proven, phone: null }] } });
    expect(await contactUser(client.id, proven)).toBe(provenShop.owner.id);

    const saved = await findClient({ shopId: shop.id, clientId: client.id });
    const contacts = saved!.contacts.map((c) => ({ id: c.id, name: c.name, email: c.email, phone: c.phone }));
    await updateClient({ shopId: shop.id, clientId: client.id, actorUserId: shop.owner.id, input: { name: saved!.name, notes: null, taxExempt: false, contacts: [...contacts, { name: "Ulf Unproven", email: unproven, phone: null }] } });
    expect(await contactUser(client.id, proven)).toBe(provenShop.owner.id);
    expect(await contactUser(client.id, unproven)).toBeNull();
    expect(await listClientContacts({ userId: unprovenShop.owner.id })).toEqual([]);
  });

  it("a contact whose address the shop changes stops showing the old address's account its jobs", async () => {
    const first = address("first");
    const firstShop = await signedUp("First Address Prints", first);
    await markEmailVerified({ userId: firstShop.owner.id });
    const client = await createClient({ shopId: shop.id, actorUserId: shop.owner.id, input: { name: `Moor Hikers ${tag}`, notes: null, taxExempt: false, contacts: [{ name: "Esa Moor", email: first, phone: null }] } });
    expect(await contactUser(client.id, first)).toBe(firstShop.owner.id);
    const [contact] = (await findClient({ shopId: shop.id, clientId: client.id }))!.contacts;
    const second = address("second");
    await updateClient({ shopId: shop.id, clientId: client.id, actorUserId: shop.owner.id, input: { name: `Moor Hikers ${tag}`, notes: null, taxExempt: false, contacts: [{ id: contact!.id, name: "Esa Moor", email: second, phone: null }] } });
    expect(await contactUser(client.id, second)).toBeNull();
    expect(await listClientContacts({ userId: firstShop.owner.id })).toEqual([]);
  });

  it("joining by invitation as a new account proves the address and links its contacts", async () => {
    const email = address("invited-client");
    const client = await createClient({ shopId: shop.id, actorUserId: shop.owner.id, input: { name: `Fell Runners ${tag}`, notes: null, taxExempt: false, contacts: [{ name: "Aud Fell", email, phone: null }] } });
    const { token } = await createInvitation({ shopId: shop.id, email, role: "designer", invitedBy: shop.owner.id });
    const joined = await as(null, () => acceptInvitationAction({ token, name: "Aud Fell", password: "a-long-enough-password" }));
    expect(joined).toMatchObject({ ok: true });
    const user = await findUserByEmail({ email });
    expect(user!.emailVerified).toBeInstanceOf(Date);
    expect(await contactUser(client.id, email)).toBe(user!.id);
  });
});

describe("an invitation to an address that already has an account", () => {
  it("is refused to anyone not signed in as that account, with or without a new name and password, and adds no member", async () => {
    const email = address("pre-registered");
    const early = await signedUp("Early Bird Transfers", email);
    const { token, invitationId } = await createInvitation({ shopId: shop.id, email, role: "designer", invitedBy: shop.owner.id });
    const stranger = (await signedUp("Bystander Blanks")).owner;
    const before = await db.select().from(auditLog).where(eq(auditLog.shopId, shop.id));

    const anonymous = await as(null, () => acceptInvitationAction({ token }));
    expect(anonymous).toEqual({ ok: false, error: signInAsInviteeMessage(email), status: 401 });
    const withPassword = await as(null, () => acceptInvitationAction({ token, name: "Not Them", password: "a-long-enough-password" }));
    expect(withPassword).toMatchObject({ ok: false, status: 401 });
    const someoneElse = await as(stranger, () => acceptInvitationAction({ token }));
    expect(someoneElse).toMatchObject({ ok: false, status: 403 });

    expect(await membershipOf(shop.id, early.owner.id)).toBeUndefined();
    const [invite] = await db.select().from(invitations).where(eq(invitations.id, invitationId));
    expect(invite!.acceptedAt).toBeNull();
    expect(await db.select().from(auditLog).where(eq(auditLog.shopId, shop.id))).toEqual(before);
    // The pre-registered password is not replaced by the refused attempt.
    expect((await findUserByEmail({ email }))!.passwordHash).toBe("not-used");

    // The account itself, signed in, may accept.
    const joined = await as(early.owner, () => acceptInvitationAction({ token }));
    expect(joined).toMatchObject({ ok: true, data: { shopSlug: shop.slug, email } });
    expect(await membershipOf(shop.id, early.owner.id)).toMatchObject({ role: "designer" });
  });
});
