import "server-only";
import { eq } from "drizzle-orm";
import { db } from "../client";
import { clientContacts } from "../schema";

export async function findContactByEmail({ email }: { email: string }) {
  const [row] = await db.select().from(clientContacts).where(eq(clientContacts.email, email.trim().toLowerCase())).limit(1);
  return row;
}

export async function firstContact({ clientId }: { clientId: string }) {
  const [row] = await db.select().from(clientContacts).where(eq(clientContacts.clientId, clientId)).orderBy(clientContacts.createdAt).limit(1);
  return row;
}
