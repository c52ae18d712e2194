import "server-only";
import { and, asc, desc, eq, sql } from "drizzle-orm";
import { db } from "../client";
import { exportJobs, jobGradings, jobSizes, jobs, type ExportJob } from "../schema";

export async function listJobSizes({ jobId }: { jobId: string }) {
  return db.select().from(jobSizes).where(eq(jobSizes.jobId, jobId)).orderBy(asc(jobSizes.sortOrder));
}

/** Replaces the size run (and, when given, the spares) in one go, so a failed save leaves the old run untouched. */
export async function saveJobSizes({ jobId, sizes, sparePercent }: { jobId: string; sizes: Array<{ size: string; quantity: number }>; sparePercent?: number }) {
  await db.transaction(async (tx) => {
    if (sparePercent !== undefined) await tx.update(jobs).set({ sparePercent, updatedAt: new Date() }).where(eq(jobs.id, jobId));
    await tx.delete(jobSizes).where(eq(jobSizes.jobId, jobId));
    if (sizes.length) await tx.insert(jobSizes).values(sizes.map((s, i) => ({ jobId, size: s.size, quantity: s.quantity, sortOrder: i })));
  });
}

export async function listGradings({ jobId }: { jobId: string }) {
  return db.select().from(jobGradings).where(eq(jobGradings.jobId, jobId));
}

export async function saveGrading(input: { jobId: string; placementId: string; transferCount: number; assignment: Record<string, number>; totalShortfall: number }) {
  await db
    .insert(jobGradings)
    .values({ ...input, updatedAt: new Date() })
    .onConflictDoUpdate({ target: [jobGradings.jobId, jobGradings.placementId], set: { transferCount: input.transferCount, assignment: input.assignment, totalShortfall: input.totalShortfall, updatedAt: new Date() } });
}

const exportColumns = {
  id: exportJobs.id,
  shopId: exportJobs.shopId,
  jobId: exportJobs.jobId,
  kind: exportJobs.kind,
  params: exportJobs.params,
  state: exportJobs.state,
  progress: exportJobs.progress,
  message: exportJobs.message,
  fileName: exportJobs.fileName,
  mime: exportJobs.mime,
  attempts: exportJobs.attempts,
  createdAt: exportJobs.createdAt,
  finishedAt: exportJobs.finishedAt,
};

export type ExportSummary = Omit<ExportJob, "result" | "requestedBy">;

export async function createExport(input: { shopId: string; jobId: string; kind: ExportJob["kind"]; params: Record<string, unknown>; requestedBy: string }): Promise<string> {
  const [row] = await db.insert(exportJobs).values(input).returning({ id: exportJobs.id });
  return row!.id;
}

export async function findExport({ shopId, exportId }: { shopId: string; exportId: string }): Promise<ExportSummary | undefined> {
  const [row] = await db.select(exportColumns).from(exportJobs).where(and(eq(exportJobs.id, exportId), eq(exportJobs.shopId, shopId))).limit(1);
  return row;
}

export async function exportShop({ exportId }: { exportId: string }) {
  const [row] = await db.select({ shopId: exportJobs.shopId }).from(exportJobs).where(eq(exportJobs.id, exportId)).limit(1);
  return row;
}

export async function listExports({ shopId, jobId }: { shopId: string; jobId: string }) {
  return db.select(exportColumns).from(exportJobs).where(and(eq(exportJobs.shopId, shopId), eq(exportJobs.jobId, jobId))).orderBy(desc(exportJobs.createdAt)).limit(20);
}

export async function exportFile({ shopId, exportId }: { shopId: string; exportId: string }) {
  const [row] = await db
    .select({ result: exportJobs.result, fileName: exportJobs.fileName, mime: exportJobs.mime, state: exportJobs.state })
    .from(exportJobs)
    .where(and(eq(exportJobs.id, exportId), eq(exportJobs.shopId, shopId)))
    .limit(1);
  return row;
}

export async function markExport(exportId: string, patch: Partial<Pick<ExportJob, "state" | "progress" | "message" | "fileName" | "mime" | "result" | "finishedAt">> & { bumpAttempts?: boolean }) {
  const { bumpAttempts, ...rest } = patch;
  await db
    .update(exportJobs)
    .set({ ...rest, ...(bumpAttempts ? { attempts: sql`${exportJobs.attempts} + 1` } : {}) })
    .where(eq(exportJobs.id, exportId));
}

export async function loadExportForWork({ exportId }: { exportId: string }) {
  const [row] = await db.select(exportColumns).from(exportJobs).where(eq(exportJobs.id, exportId)).limit(1);
  return row;
}
