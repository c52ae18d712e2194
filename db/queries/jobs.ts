import "server-only";
import { and, asc, desc, eq, inArray, ne, sql } from "drizzle-orm";
import type { JobStatus } from "@/lib/jobs";
import type { SizeRunEntry } from "@/lib/pricing";
import { db } from "../client";
import { blanks, clients, jobs, jobSizes, payments, proofs, quotes, shops, type JobPrintLocation } from "../schema";
import { recordAudit } from "./audit";

/** Per job: the newest quote still in force and what has been paid. */
async function moneyByJob(jobIds: string[]) {
  if (jobIds.length === 0) return new Map<string, { quote: { state: "sent" | "accepted" | "replaced"; totalCents: number; depositCents: number } | null; paid: number }>();
  const quoteRows = await db
    .selectDistinctOn([quotes.jobId], { jobId: quotes.jobId, state: quotes.state, totalCents: quotes.totalCents, depositCents: quotes.depositCents })
    .from(quotes)
    .where(and(inArray(quotes.jobId, jobIds), ne(quotes.state, "replaced")))
    .orderBy(quotes.jobId, desc(quotes.number));
  const paidRows = await db
    .select({ jobId: payments.jobId, paid: sql<number>`coalesce(sum(${payments.amountCents}), 0)::int` })
    .from(payments)
    .where(and(inArray(payments.jobId, jobIds), eq(payments.state, "paid")))
    .groupBy(payments.jobId);
  const out = new Map<string, { quote: { state: "sent" | "accepted" | "replaced"; totalCents: number; depositCents: number } | null; paid: number }>();
  for (const id of jobIds) {
    const q = quoteRows.find((r) => r.jobId === id);
    out.set(id, { quote: q ? { state: q.state, totalCents: q.totalCents, depositCents: q.depositCents } : null, paid: paidRows.find((r) => r.jobId === id)?.paid ?? 0 });
  }
  return out;
}

async function sizesByJob(jobIds: string[]) {
  if (jobIds.length === 0) return new Map<string, SizeRunEntry[]>();
  const rows = await db.select().from(jobSizes).where(inArray(jobSizes.jobId, jobIds)).orderBy(asc(jobSizes.sortOrder));
  const out = new Map<string, SizeRunEntry[]>();
  for (const r of rows) {
    const list = out.get(r.jobId) ?? [];
    list.push({ size: r.size, quantity: r.quantity });
    out.set(r.jobId, list);
  }
  return out;
}

export async function listJobs({ shopId }: { shopId: string }) {
  const rows = await db
    .select({
      id: jobs.id,
      title: jobs.title,
      status: jobs.status,
      method: jobs.method,
      dueDate: jobs.dueDate,
      rush: jobs.rush,
      clientId: clients.id,
      clientName: clients.name,
      garmentName: blanks.name,
      garmentColour: jobs.garmentColour,
      updatedAt: jobs.updatedAt,
    })
    .from(jobs)
    .innerJoin(clients, eq(clients.id, jobs.clientId))
    .leftJoin(blanks, eq(blanks.id, jobs.blankId))
    .where(eq(jobs.shopId, shopId))
    .orderBy(desc(jobs.updatedAt));
  const ids = rows.map((r) => r.id);
  const [sizes, money] = await Promise.all([sizesByJob(ids), moneyByJob(ids)]);
  return rows.map((r) => ({ ...r, sizeRun: sizes.get(r.id) ?? [], money: money.get(r.id)! }));
}

export type JobListRow = Awaited<ReturnType<typeof listJobs>>[number];

export async function listJobsForClients({ clientIds }: { clientIds: string[] }) {
  if (clientIds.length === 0) return [];
  const rows = await db
    .select({
      id: jobs.id,
      title: jobs.title,
      status: jobs.status,
      dueDate: jobs.dueDate,
      clientName: clients.name,
      shopName: shops.name,
      shopLocale: shops.locale,
      updatedAt: jobs.updatedAt,
    })
    .from(jobs)
    .innerJoin(clients, eq(clients.id, jobs.clientId))
    .innerJoin(shops, eq(shops.id, jobs.shopId))
    .where(inArray(jobs.clientId, clientIds))
    .orderBy(desc(jobs.updatedAt));
  const money = await moneyByJob(rows.map((r) => r.id));
  return rows.map((r) => ({ ...r, money: money.get(r.id)! }));
}

export async function findJob({ shopId, jobId }: { shopId: string; jobId: string }) {
  const [row] = await db
    .select()
    .from(jobs)
    .where(and(eq(jobs.id, jobId), eq(jobs.shopId, shopId)))
    .limit(1);
  return row;
}

/** A job by id alone, for callers that check the shop or client themselves (portal, review links). */
export async function findJobById({ jobId }: { jobId: string }) {
  const [row] = await db.select().from(jobs).where(eq(jobs.id, jobId)).limit(1);
  return row;
}

/** The job with its client, garment, size run and proofs. */
export async function findJobDetail({ shopId, jobId }: { shopId: string; jobId: string }) {
  const job = await findJob({ shopId, jobId });
  if (!job) return undefined;
  const [client] = await db.select().from(clients).where(eq(clients.id, job.clientId)).limit(1);
  const [blank] = job.blankId ? await db.select({ id: blanks.id, name: blanks.name, category: blanks.category }).from(blanks).where(eq(blanks.id, job.blankId)).limit(1) : [];
  const sizeRun = (await sizesByJob([job.id])).get(job.id) ?? [];
  const proofRows = await db
    .select({ id: proofs.id, name: proofs.name, revision: proofs.revision, colourName: proofs.colourName, updatedAt: proofs.updatedAt })
    .from(proofs)
    .where(eq(proofs.jobId, job.id))
    .orderBy(asc(proofs.createdAt));
  return { job, client: client!, blank: blank ?? null, sizeRun, proofs: proofRows };
}

export type JobDetail = NonNullable<Awaited<ReturnType<typeof findJobDetail>>>;

export type JobInput = {
  title: string;
  clientId: string;
  dueDate: string | null;
  method: (typeof jobs.$inferInsert)["method"];
  blankId: string | null;
  garmentColour: string | null;
  printLocations: JobPrintLocation[];
  dtfAreaIn2: number | null;
  rush: boolean;
  notes: string | null;
  sizeRun: SizeRunEntry[];
};

async function replaceSizes(tx: Parameters<Parameters<typeof db.transaction>[0]>[0], jobId: string, sizeRun: SizeRunEntry[]) {
  await tx.delete(jobSizes).where(eq(jobSizes.jobId, jobId));
  const rows = sizeRun.filter((s) => s.quantity > 0);
  if (rows.length) await tx.insert(jobSizes).values(rows.map((s, i) => ({ jobId, size: s.size, quantity: s.quantity, sortOrder: i })));
}

function jobColumns(input: JobInput) {
  const { title, clientId, dueDate, method, blankId, garmentColour, printLocations, dtfAreaIn2, rush, notes } = input;
  return { title, clientId, dueDate, method, blankId, garmentColour, printLocations, dtfAreaIn2, rush, notes };
}

export async function createJob({ shopId, actorUserId, input }: { shopId: string; actorUserId: string; input: JobInput }) {
  return db.transaction(async (tx) => {
    const [job] = await tx.insert(jobs).values({ shopId, createdBy: actorUserId, ...jobColumns(input) }).returning();
    await replaceSizes(tx, job!.id, input.sizeRun);
    await recordAudit({ shopId, actorUserId, action: "job.created", subjectType: "job", subjectId: job!.id, detail: { title: input.title } }, tx);
    return job!;
  });
}

export async function updateJob({ shopId, jobId, actorUserId, input }: { shopId: string; jobId: string; actorUserId: string; input: JobInput }) {
  return db.transaction(async (tx) => {
    const [job] = await tx
      .update(jobs)
      .set({ ...jobColumns(input), updatedAt: new Date() })
      .where(and(eq(jobs.id, jobId), eq(jobs.shopId, shopId)))
      .returning();
    if (!job) return undefined;
    await replaceSizes(tx, jobId, input.sizeRun);
    await recordAudit({ shopId, actorUserId, action: "job.updated", subjectType: "job", subjectId: jobId, detail: { title: input.title } }, tx);
    return job;
  });
}

export async function setJobStatus({ shopId, jobId, status, actorUserId }: { shopId: string; jobId: string; status: JobStatus; actorUserId: string }) {
  return db.transaction(async (tx) => {
    const [job] = await tx
      .update(jobs)
      .set({ status, updatedAt: new Date() })
      .where(and(eq(jobs.id, jobId), eq(jobs.shopId, shopId)))
      .returning({ id: jobs.id, title: jobs.title, status: jobs.status });
    if (job) await recordAudit({ shopId, actorUserId, action: "job.moved", subjectType: "job", subjectId: jobId, detail: { title: job.title, status } }, tx);
    return job;
  });
}

export async function clientBelongsToShop({ shopId, clientId }: { shopId: string; clientId: string }) {
  const [row] = await db.select({ id: clients.id, archived: clients.archived }).from(clients).where(and(eq(clients.id, clientId), eq(clients.shopId, shopId))).limit(1);
  return row;
}

export async function blankUsableByShop({ shopId, blankId }: { shopId: string; blankId: string }) {
  const [row] = await db
    .select({ id: blanks.id })
    .from(blanks)
    .where(and(eq(blanks.id, blankId), sql`(${blanks.shopId} = ${shopId} or ${blanks.shopId} is null)`))
    .limit(1);
  return row;
}
