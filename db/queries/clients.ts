import "server-only";
import { and, asc, count, eq } from "drizzle-orm";
import { db } from "../client";
import { clientContacts, clients, jobs } from "../schema";

export async function listClients({ shopId }: { shopId: string }) {
  const rows = await db
    .select({ id: clients.id, name: clients.name, notes: clients.notes, archived: clients.archived, createdAt: clients.createdAt })
    .from(clients)
    .where(and(eq(clients.shopId, shopId), eq(clients.archived, false)))
    .orderBy(asc(clients.name));
  const contactRows = await db
    .select({ clientId: clientContacts.clientId, name: clientContacts.name, email: clientContacts.email })
    .from(clientContacts)
    .innerJoin(clients, eq(clients.id, clientContacts.clientId))
    .where(eq(clients.shopId, shopId));
  const jobCounts = await db
    .select({ clientId: jobs.clientId, n: count() })
    .from(jobs)
    .where(eq(jobs.shopId, shopId))
    .groupBy(jobs.clientId);
  return rows.map((row) => ({
    ...row,
    contacts: contactRows.filter((c) => c.clientId === row.id),
    jobs: jobCounts.find((j) => j.clientId === row.id)?.n ?? 0,
  }));
}
