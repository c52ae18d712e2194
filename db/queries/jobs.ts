import "server-only";
import { and, asc, count, desc, eq, gte, ilike, inArray, isNull, lte, ne, or, sql, type AnyColumn, type SQL } from "drizzle-orm";
import { containsPattern, type JobListFilter, type JobListQuery, type JobSort, type SortDir } from "@/lib/job-list";
import { JOB_STATUSES, type JobStatus } from "@/lib/jobs";
import type { SizeRunEntry } from "@/lib/pricing";
import { db } from "../client";
import { blanks, clients, jobs, jobSizes, payments, proofs, quotes, shopJobCounts, shops, type JobPrintLocation } from "../schema";
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

const listColumns = {
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
};

/** The job's own columns a list row shows, read before its client and garment are joined. */
const jobRowColumns = { id: jobs.id, title: jobs.title, status: jobs.status, method: jobs.method, dueDate: jobs.dueDate, rush: jobs.rush, clientId: jobs.clientId, blankId: jobs.blankId, garmentColour: jobs.garmentColour, updatedAt: jobs.updatedAt };

/** The shop's jobs that pass the filters other than search. */
function jobFilter(shopId: string, f: Partial<JobListFilter>): SQL {
  const conditions: SQL[] = [eq(jobs.shopId, shopId)];
  if (f.status) conditions.push(eq(jobs.status, f.status));
  if (f.clientId) conditions.push(eq(jobs.clientId, f.clientId));
  if (f.dueFrom) conditions.push(gte(jobs.dueDate, f.dueFrom));
  if (f.dueTo) conditions.push(lte(jobs.dueDate, f.dueTo));
  return and(...conditions)!;
}

/**
 * Where search looks, one condition per place, each with its own index: the title (trigram), the
 * client's name (the matching clients, then their jobs by the client index) and the garment's name
 * (the matching blanks, then their jobs by the blank index). A search reads the union of the three.
 */
function searchArms(shopId: string, q: string): SQL[] {
  const like = containsPattern(q);
  return [
    ilike(jobs.title, like),
    // As an array the matching clients are one bitmap over the client index, however many match.
    sql`${jobs.clientId} = any(array(${db.select({ id: clients.id }).from(clients).where(and(eq(clients.shopId, shopId), ilike(clients.name, like)))}))`,
    inArray(jobs.blankId, db.select({ id: blanks.id }).from(blanks).where(and(or(eq(blanks.shopId, shopId), isNull(blanks.shopId)), ilike(blanks.name, like)))),
  ];
}

type OrderColumns = { id: AnyColumn; title: AnyColumn; status: AnyColumn; method: AnyColumn; dueDate: AnyColumn; updatedAt: AnyColumn };

/** Each order ends in the job's id, so every row has one place and pages never overlap. By client, the client's name comes first. */
function jobOrder(c: OrderColumns, sort: JobSort, dir: SortDir, clientName: AnyColumn = clients.name): SQL[] {
  const d = dir === "asc" ? asc : desc;
  const back = dir === "asc" ? desc : asc;
  switch (sort) {
    case "due":
      return [d(c.dueDate), d(c.id)];
    case "title":
      return [d(c.title), d(c.id)];
    case "client":
      return [d(clientName), back(c.updatedAt), d(c.id)];
    case "status":
      return [d(c.status), back(c.updatedAt), d(c.id)];
    case "method":
      return [d(c.method), d(c.id)];
    case "updated":
      // Newest first is "desc"; ties by id the other way, as the index holds them.
      return [d(c.updatedAt), back(c.id)];
  }
}

/**
 * The page's rows and the count of all rows, as two statements.
 * - Search: the union of the search arms (each with the other filters) is read first, then joined.
 * - By client: the shop's clients are walked in name order (their index) and each one's jobs read
 *   newest first from the client index, so a page reads only the clients before it.
 * - Otherwise: the shop's jobs in an order that has its own index.
 */
function jobPageStatements(shopId: string, query: JobListQuery) {
  const where = jobFilter(shopId, query);
  const offset = (query.page - 1) * query.pageSize;
  if (query.q) {
    const [byTitle, byClient, byGarment] = searchArms(shopId, query.q);
    const arm = (condition: SQL | undefined) => db.select(jobRowColumns).from(jobs).where(and(where, condition));
    const idArm = (condition: SQL | undefined) => db.select({ id: jobs.id }).from(jobs).where(and(where, condition));
    const found = arm(byTitle).union(arm(byClient)).union(arm(byGarment)).as("found");
    const ids = idArm(byTitle).union(idArm(byClient)).union(idArm(byGarment)).as("ids");
    return {
      rows: db
        .select({ id: found.id, title: found.title, status: found.status, method: found.method, dueDate: found.dueDate, rush: found.rush, clientId: clients.id, clientName: clients.name, garmentName: blanks.name, garmentColour: found.garmentColour, updatedAt: found.updatedAt })
        .from(found)
        .innerJoin(clients, eq(clients.id, found.clientId))
        .leftJoin(blanks, eq(blanks.id, found.blankId))
        .orderBy(...jobOrder(found, query.sort, query.dir))
        .limit(query.pageSize)
        .offset(offset),
      count: db.select({ n: count() }).from(ids),
    };
  }
  const counting = db.select({ n: count() }).from(jobs).where(where);
  if (query.sort === "client") {
    const j = db.select(jobRowColumns).from(jobs).where(and(eq(jobs.clientId, clients.id), where)).orderBy(desc(jobs.updatedAt), asc(jobs.id)).as("j");
    return {
      rows: db
        .select({ id: j.id, title: j.title, status: j.status, method: j.method, dueDate: j.dueDate, rush: j.rush, clientId: clients.id, clientName: clients.name, garmentName: blanks.name, garmentColour: j.garmentColour, updatedAt: j.updatedAt })
        .from(clients)
        .crossJoinLateral(j)
        .leftJoin(blanks, eq(blanks.id, j.blankId))
        .where(eq(clients.shopId, shopId))
        .orderBy(...jobOrder(j, query.sort, query.dir))
        .limit(query.pageSize)
        .offset(offset),
      count: counting,
    };
  }
  return {
    rows: db
      .select(listColumns)
      .from(jobs)
      .innerJoin(clients, eq(clients.id, jobs.clientId))
      .leftJoin(blanks, eq(blanks.id, jobs.blankId))
      .where(where)
      .orderBy(...jobOrder(jobs, query.sort, query.dir))
      .limit(query.pageSize)
      .offset(offset),
    count: counting,
  };
}

/**
 * One page of the shop's jobs, as the list asks for it; size runs and money only for the page's rows.
 * With the shop's counts by status (`countJobsByStatus`) at hand, a list filtered by status alone, or
 * not at all, takes its total from them instead of counting again.
 */
export async function listJobPage({ shopId, query, statusCounts }: { shopId: string; query: JobListQuery; statusCounts?: Record<JobStatus, number> | Promise<Record<JobStatus, number>> }) {
  const statements = jobPageStatements(shopId, query);
  const fromCounts = statusCounts && !query.q && !query.clientId && !query.dueFrom && !query.dueTo;
  const totalOf = (counts: Record<JobStatus, number>) => (query.status ? counts[query.status] : JOB_STATUSES.reduce((n, s) => n + counts[s], 0));
  const [total, found] = await Promise.all([fromCounts ? Promise.resolve(statusCounts).then(totalOf) : statements.count.then(([r]) => r?.n ?? 0), statements.rows]);
  const rows = await withSizesAndMoney(found);
  return { rows, total };
}

async function withSizesAndMoney<T extends { id: string }>(found: T[]) {
  const ids = found.map((r) => r.id);
  const [sizes, money] = await Promise.all([sizesByJob(ids), moneyByJob(ids)]);
  return found.map((r) => ({ ...r, sizeRun: sizes.get(r.id) ?? [], money: money.get(r.id)! }));
}

/** Every job the list's filters find, in its order, with size runs: the size-run export. */
export async function listJobSizeRuns({ shopId, query }: { shopId: string; query: JobListQuery }) {
  const where = jobFilter(shopId, query);
  const found = await db
    .select({ id: jobs.id, title: jobs.title, clientName: clients.name, status: jobs.status, dueDate: jobs.dueDate })
    .from(jobs)
    .innerJoin(clients, eq(clients.id, jobs.clientId))
    .leftJoin(blanks, eq(blanks.id, jobs.blankId))
    .where(query.q ? and(where, or(...searchArms(shopId, query.q))) : where)
    .orderBy(...jobOrder(jobs, query.sort, query.dir));
  const sizes = new Map<string, SizeRunEntry[]>();
  for (let i = 0; i < found.length; i += 1000) {
    for (const [id, run] of await sizesByJob(found.slice(i, i + 1000).map((r) => r.id))) sizes.set(id, run);
  }
  return found.map((r) => ({ ...r, sizeRun: sizes.get(r.id) ?? [] }));
}

export type JobListRow = Awaited<ReturnType<typeof listJobPage>>["rows"][number];

/** How many jobs the shop has in each status, from the counts the database keeps (`shop_job_counts`). */
export async function countJobsByStatus({ shopId }: { shopId: string }): Promise<Record<JobStatus, number>> {
  const rows = await db.select({ status: shopJobCounts.status, n: shopJobCounts.n }).from(shopJobCounts).where(eq(shopJobCounts.shopId, shopId));
  const out = Object.fromEntries(JOB_STATUSES.map((s) => [s, 0])) as Record<JobStatus, number>;
  for (const r of rows) out[r.status] = r.n;
  return out;
}

/** The board: the `perColumn` most recently changed jobs of each status. */
export async function listBoardColumns({ shopId, perColumn }: { shopId: string; perColumn: number }) {
  const columns = await Promise.all(
    JOB_STATUSES.map((status) =>
      db
        .select(listColumns)
        .from(jobs)
        .innerJoin(clients, eq(clients.id, jobs.clientId))
        .leftJoin(blanks, eq(blanks.id, jobs.blankId))
        .where(and(eq(jobs.shopId, shopId), eq(jobs.status, status)))
        .orderBy(desc(jobs.updatedAt), asc(jobs.id))
        .limit(perColumn),
    ),
  );
  return withSizesAndMoney(columns.flat());
}

/** One page of the jobs of these clients (a contact's portal), newest change first. */
export async function listJobsForClients({ clientIds, page, pageSize }: { clientIds: string[]; page: number; pageSize: number }) {
  if (clientIds.length === 0) return { rows: [], total: 0 };
  const [[counted], found] = await Promise.all([
    db.select({ n: count() }).from(jobs).where(inArray(jobs.clientId, clientIds)),
    db
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
      .orderBy(desc(jobs.updatedAt), asc(jobs.id))
      .limit(pageSize)
      .offset((page - 1) * pageSize),
  ]);
  const money = await moneyByJob(found.map((r) => r.id));
  return { rows: found.map((r) => ({ ...r, money: money.get(r.id)! })), total: counted?.n ?? 0 };
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
