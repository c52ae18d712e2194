import "server-only";
import { eq, sql } from "drizzle-orm";
import { db } from "../client";
import { users, type User } from "../schema";

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
 * An account without a shop, as a client's first sign-in makes one: the contacts filed under that
 * e-mail are linked to it by the client queries.
 */
export async function createUser({ email, name, passwordHash }: { email: string; name: string; passwordHash: string | null }): Promise<{ id: string }> {
  const [row] = await db.insert(users).values({ email: normalizeEmail(email), name, passwordHash }).returning({ id: users.id });
  return row!;
}

/** Records that the account's owner proved the e-mail address (by opening a link sent to it). */
export async function markEmailVerified({ userId }: { userId: string }): Promise<void> {
  await db.update(users).set({ emailVerified: new Date() }).where(eq(users.id, userId));
}
