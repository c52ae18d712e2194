import "server-only";
import { and, asc, count, eq, inArray, isNotNull, notInArray } from "drizzle-orm";
import { db } from "../client";
import { clientContacts, clients, jobs, users } from "../schema";
import { recordAudit } from "./audit";

export async function listClients({ shopId, includeArchived = false }: { shopId: string; includeArchived?: boolean }) {
  const rows = await db
    .select({ id: clients.id, name: clients.name, notes: clients.notes, archived: clients.archived, taxExempt: clients.taxExempt, createdAt: clients.createdAt })
    .from(clients)
    .where(includeArchived ? eq(clients.shopId, shopId) : and(eq(clients.shopId, shopId), eq(clients.archived, false)))
    .orderBy(asc(clients.name));
  const contactRows = await db
    .select({ id: clientContacts.id, clientId: clientContacts.clientId, name: clientContacts.name, email: clientContacts.email, phone: clientContacts.phone, hasAccount: clientContacts.userId })
    .from(clientContacts)
    .innerJoin(clients, eq(clients.id, clientContacts.clientId))
    .where(eq(clients.shopId, shopId))
    .orderBy(asc(clientContacts.createdAt));
  const jobCounts = await db
    .select({ clientId: jobs.clientId, n: count() })
    .from(jobs)
    .where(eq(jobs.shopId, shopId))
    .groupBy(jobs.clientId);
  return rows.map((row) => ({
    ...row,
    contacts: contactRows.filter((c) => c.clientId === row.id).map((c) => ({ ...c, hasAccount: c.hasAccount !== null })),
    jobs: jobCounts.find((j) => j.clientId === row.id)?.n ?? 0,
  }));
}

/** The shop's clients by name, id and name only (the job list's client filter). */
export async function listClientNames({ shopId }: { shopId: string }) {
  return db.select({ id: clients.id, name: clients.name }).from(clients).where(eq(clients.shopId, shopId)).orderBy(asc(clients.name), asc(clients.id));
}

export type ClientListRow = Awaited<ReturnType<typeof listClients>>[number];

export async function findClient({ shopId, clientId }: { shopId: string; clientId: string }) {
  const [row] = await db
    .select()
    .from(clients)
    .where(and(eq(clients.id, clientId), eq(clients.shopId, shopId)))
    .limit(1);
  if (!row) return undefined;
  const contacts = await db.select().from(clientContacts).where(eq(clientContacts.clientId, clientId)).orderBy(asc(clientContacts.createdAt));
  return { ...row, contacts };
}

export type ClientInput = {
  name: string;
  notes: string | null;
  taxExempt: boolean;
  contacts: Array<{ id?: string; name: string; email: string; phone: string | null }>;
};

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

/**
 * The accounts these addresses prove to be theirs: only accounts whose owner opened a link sent to
 * the address (emailVerified set). Anyone may make an account with any address; until it is
 * proven, a contact filed under it is linked to nobody.
 */
async function provenAccountsByEmail(tx: Tx, emails: string[]): Promise<Map<string, string>> {
  if (emails.length === 0) return new Map();
  const rows = await tx
    .select({ id: users.id, email: users.email })
    .from(users)
    .where(and(inArray(users.email, emails), isNotNull(users.emailVerified)));
  return new Map(rows.map((r) => [r.email, r.id]));
}

/** Creates a client with its contacts in one go. Contacts whose e-mail has a proven account are linked to it. */
export async function createClient({ shopId, actorUserId, input }: { shopId: string; actorUserId: string; input: ClientInput }) {
  return db.transaction(async (tx) => {
    const accounts = await provenAccountsByEmail(tx, input.contacts.map((c) => c.email));
    const [client] = await tx.insert(clients).values({ shopId, name: input.name, notes: input.notes, taxExempt: input.taxExempt }).returning();
    if (input.contacts.length) {
      await tx.insert(clientContacts).values(input.contacts.map((c) => ({ clientId: client!.id, name: c.name, email: c.email, phone: c.phone, userId: accounts.get(c.email) ?? null })));
    }
    await recordAudit({ shopId, actorUserId, action: "client.created", subjectType: "client", subjectId: client!.id, detail: { name: input.name } }, tx);
    return client!;
  });
}

/**
 * Saves a client and its contact list: listed contacts are updated or added, contacts left out are
 * removed. All or nothing. Each contact is linked to the proven account of its (new) address, or to
 * nobody: a contact whose address changes stops showing the old address's account its jobs.
 */
export async function updateClient({ shopId, clientId, actorUserId, input }: { shopId: string; clientId: string; actorUserId: string; input: ClientInput }) {
  return db.transaction(async (tx) => {
    const accounts = await provenAccountsByEmail(tx, input.contacts.map((c) => c.email));
    const [client] = await tx
      .update(clients)
      .set({ name: input.name, notes: input.notes, taxExempt: input.taxExempt })
      .where(and(eq(clients.id, clientId), eq(clients.shopId, shopId)))
      .returning();
    if (!client) return undefined;
    const keep = input.contacts.flatMap((c) => (c.id ? [c.id] : []));
    await tx
      .delete(clientContacts)
      .where(keep.length ? and(eq(clientContacts.clientId, clientId), notInArray(clientContacts.id, keep)) : eq(clientContacts.clientId, clientId));
    for (const c of input.contacts) {
      if (c.id) {
        const [updated] = await tx
          .update(clientContacts)
          .set({ name: c.name, email: c.email, phone: c.phone, userId: accounts.get(c.email) ?? null })
          .where(and(eq(clientContacts.id, c.id), eq(clientContacts.clientId, clientId)))
          .returning({ id: clientContacts.id });
        if (!updated) throw new ContactMissingError();
      } else {
        await tx.insert(clientContacts).values({ clientId, name: c.name, email: c.email, phone: c.phone, userId: accounts.get(c.email) ?? null });
      }
    }
    await recordAudit({ shopId, actorUserId, action: "client.updated", subjectType: "client", subjectId: clientId, detail: { name: input.name } }, tx);
    return client;
  });
}

export class ContactMissingError extends Error {
  constructor() {
    super("A contact on this form was removed meanwhile. Reload the page and try again.");
  }
}

export async function setClientArchived({ shopId, clientId, archived, actorUserId }: { shopId: string; clientId: string; archived: boolean; actorUserId: string }) {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(clients)
      .set({ archived })
      .where(and(eq(clients.id, clientId), eq(clients.shopId, shopId)))
      .returning({ id: clients.id, name: clients.name });
    if (row) await recordAudit({ shopId, actorUserId, action: archived ? "client.archived" : "client.restored", subjectType: "client", subjectId: clientId, detail: { name: row.name } }, tx);
    return row;
  });
}
