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
