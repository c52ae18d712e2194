import "server-only";
import { and, desc, eq, inArray } from "drizzle-orm";
import { db } from "../client";
import { clients, jobs, shops } from "../schema";

export async function listJobs({ shopId }: { shopId: string }) {
  return db
    .select({
      id: jobs.id,
      title: jobs.title,
      status: jobs.status,
      method: jobs.method,
      dueDate: jobs.dueDate,
      clientId: clients.id,
      clientName: clients.name,
      updatedAt: jobs.updatedAt,
    })
    .from(jobs)
    .innerJoin(clients, eq(clients.id, jobs.clientId))
    .where(eq(jobs.shopId, shopId))
    .orderBy(desc(jobs.updatedAt));
}

export async function listJobsForClients({ clientIds }: { clientIds: string[] }) {
  if (clientIds.length === 0) return [];
  return db
    .select({
      id: jobs.id,
      title: jobs.title,
      status: jobs.status,
      dueDate: jobs.dueDate,
      clientName: clients.name,
      shopName: shops.name,
      updatedAt: jobs.updatedAt,
    })
    .from(jobs)
    .innerJoin(clients, eq(clients.id, jobs.clientId))
    .innerJoin(shops, eq(shops.id, jobs.shopId))
    .where(inArray(jobs.clientId, clientIds))
    .orderBy(desc(jobs.updatedAt));
}

export async function findJob({ shopId, jobId }: { shopId: string; jobId: string }) {
  const [row] = await db
    .select()
    .from(jobs)
    .where(and(eq(jobs.id, jobId), eq(jobs.shopId, shopId)))
    .limit(1);
  return row;
}
