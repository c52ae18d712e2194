import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "../client";
import { clientContacts, clients, memberships, shops, users } from "../schema";

export type ActorMembership = { shopId: string; shopSlug: string; shopName: string; role: "owner" | "designer" | "production"; locale: string; timeZone: string };
export type ActorContact = { contactId: string; clientId: string; clientName: string; shopId: string; shopSlug: string; shopName: string };

export async function listMemberships({ userId }: { userId: string }): Promise<ActorMembership[]> {
  return db
    .select({ shopId: shops.id, shopSlug: shops.slug, shopName: shops.name, role: memberships.role, locale: shops.locale, timeZone: shops.timeZone })
    .from(memberships)
    .innerJoin(shops, eq(shops.id, memberships.shopId))
    .where(eq(memberships.userId, userId))
    .orderBy(shops.name);
}

export async function listClientContacts({ userId }: { userId: string }): Promise<ActorContact[]> {
  return db
    .select({
      contactId: clientContacts.id,
      clientId: clients.id,
      clientName: clients.name,
      shopId: shops.id,
      shopSlug: shops.slug,
      shopName: shops.name,
    })
    .from(clientContacts)
    .innerJoin(clients, eq(clients.id, clientContacts.clientId))
    .innerJoin(shops, eq(shops.id, clients.shopId))
    .where(and(eq(clientContacts.userId, userId), eq(clients.archived, false)));
}

/**
 * Links the client contacts filed under the user's e-mail to the user, so a contact who signs in
 * sees their jobs. Only once the address is proven (e-mailVerified set): an account someone made
 * with an address they never opened a link at gets nobody's jobs. Reads the address from the
 * account itself, never from the caller.
 */
export async function linkContactsToUser({ userId }: { userId: string }): Promise<void> {
  const [user] = await db.select({ email: users.email, emailVerified: users.emailVerified }).from(users).where(eq(users.id, userId)).limit(1);
  if (!user?.emailVerified) return;
  await db.update(clientContacts).set({ userId }).where(eq(clientContacts.email, user.email));
}

export async function findShopBySlug({ slug }: { slug: string }) {
  const [row] = await db.select().from(shops).where(eq(shops.slug, slug)).limit(1);
  return row;
}
