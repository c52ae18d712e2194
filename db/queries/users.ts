import "server-only";
import { eq, sql } from "drizzle-orm";
import { db } from "../client";
import { clientContacts, users, type User } from "../schema";

export function normalizeEmail(email: string): string {
  return email.trim().toLowerCase();
}

export async function findUserByEmail({ email }: { email: string }): Promise<User | undefined> {
  const [row] = await db.select().from(users).where(eq(users.email, normalizeEmail(email))).limit(1);
  return row;
}

export async function findUserById({ id }: { id: string }): Promise<User | undefined> {
  const [row] = await db.select().from(users).where(eq(users.id, id)).limit(1);
  return row;
}

export async function pingDatabase(): Promise<void> {
  await db.execute(sql`select 1`);
}

/**
 * An account without a shop, as a client's first sign-in makes one. Its address is not proven yet:
 * contacts filed under that e-mail are linked to it once it is (`markEmailVerified`).
 */
export async function createUser({ email, name, passwordHash }: { email: string; name: string; passwordHash: string | null }): Promise<{ id: string }> {
  const [row] = await db.insert(users).values({ email: normalizeEmail(email), name, passwordHash }).returning({ id: users.id });
  return row!;
}

/**
 * Records that the account's owner proved the e-mail address (by opening a link sent to it), and
 * links the client contacts filed under that address to the account, in one go.
 */
export async function markEmailVerified({ userId }: { userId: string }): Promise<void> {
  await db.transaction(async (tx) => {
    const [user] = await tx.update(users).set({ emailVerified: new Date() }).where(eq(users.id, userId)).returning({ email: users.email });
    if (user) await tx.update(clientContacts).set({ userId }).where(eq(clientContacts.email, user.email));
  });
}
