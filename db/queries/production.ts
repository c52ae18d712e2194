import "server-only";
import { and, asc, desc, eq, inArray, sql } from "drizzle-orm";
import { db } from "../client";
import { exportFiles, exportJobs, jobGradings, jobSizes, jobs, type ExportJob, type ExportSummaryFacts, type ExportSubject } from "../schema";

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
  fileCount: exportJobs.fileCount,
  summary: exportJobs.summary,
  subject: exportJobs.subject,
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

/** File `n` (1-based) of a finished export in the shop, or undefined when there is none. */
export async function exportFile({ shopId, exportId, n = 1 }: { shopId: string; exportId: string; n?: number }) {
  const [row] = await db
    .select({ result: n === 1 ? exportJobs.result : sql<Buffer | null>`null`, fileName: exportJobs.fileName, mime: exportJobs.mime, state: exportJobs.state, fileCount: exportJobs.fileCount })
    .from(exportJobs)
    .where(and(eq(exportJobs.id, exportId), eq(exportJobs.shopId, shopId)))
    .limit(1);
  if (!row || n === 1) return row;
  if (n > row.fileCount) return undefined;
  const [file] = await db
    .select({ result: exportFiles.content, fileName: exportFiles.fileName, mime: exportFiles.mime })
    .from(exportFiles)
    .where(and(eq(exportFiles.exportId, exportId), eq(exportFiles.position, n)))
    .limit(1);
  return file ? { ...file, state: row.state, fileCount: row.fileCount } : undefined;
}

/** Names and sizes of every file of an export, in order (file 1 first). */
export async function listExportFiles({ shopId, exportId }: { shopId: string; exportId: string }) {
  const [first] = await db
    .select({ fileName: exportJobs.fileName, bytes: sql<number | null>`octet_length(${exportJobs.result})`, state: exportJobs.state })
    .from(exportJobs)
    .where(and(eq(exportJobs.id, exportId), eq(exportJobs.shopId, shopId)))
    .limit(1);
  if (!first || first.state !== "done" || !first.fileName) return [];
  const more = await db
    .select({ n: exportFiles.position, fileName: exportFiles.fileName, bytes: exportFiles.bytes })
    .from(exportFiles)
    .where(eq(exportFiles.exportId, exportId))
    .orderBy(asc(exportFiles.position));
  return [{ n: 1, fileName: first.fileName, bytes: Number(first.bytes ?? 0) }, ...more];
}

type ExportPatch = Partial<Pick<ExportJob, "state" | "progress" | "message" | "fileName" | "mime" | "result" | "finishedAt">> & { bumpAttempts?: boolean };

export async function markExport(exportId: string, patch: ExportPatch) {
  const { bumpAttempts, ...rest } = patch;
  await db
    .update(exportJobs)
    .set({ ...rest, ...(bumpAttempts ? { attempts: sql`${exportJobs.attempts} + 1` } : {}) })
    .where(eq(exportJobs.id, exportId));
}

/**
 * Finishes an export with all its files in one transaction: file 1 on the export row, the rest
 * in export_files (any left from an earlier try are replaced), so a reader sees all or none.
 */
export async function finishExport(exportId: string, files: Array<{ fileName: string; mime: string; bytes: Buffer }>, summary: ExportSummaryFacts | null = null, subject: ExportSubject | null = null) {
  const [first, ...more] = files;
  if (!first) throw new Error("An export must make at least one file.");
  await db.transaction(async (tx) => {
    await tx.delete(exportFiles).where(eq(exportFiles.exportId, exportId));
    if (more.length > 0)
      await tx.insert(exportFiles).values(more.map((f, i) => ({ exportId, position: i + 2, fileName: f.fileName, mime: f.mime, bytes: f.bytes.length, content: f.bytes })));
    await tx
      .update(exportJobs)
      .set({ state: "done", progress: 1, fileName: first.fileName, mime: first.mime, result: first.bytes, fileCount: files.length, summary, subject, finishedAt: new Date(), message: null })
      .where(eq(exportJobs.id, exportId));
  });
}

/**
 * Puts an export a stopping worker took but could not finish back in the queue: only while it is
 * still unfinished (running, or not yet marked so); one that finished in the meantime stays as it
 * ended. True when it was put back.
 */
export async function requeueExport({ exportId }: { exportId: string }): Promise<boolean> {
  const rows = await db
    .update(exportJobs)
    .set({ state: "queued", progress: 0, message: null })
    .where(and(eq(exportJobs.id, exportId), inArray(exportJobs.state, ["queued", "running"])))
    .returning({ id: exportJobs.id });
  return rows.length > 0;
}

export async function loadExportForWork({ exportId }: { exportId: string }) {
  const [row] = await db.select(exportColumns).from(exportJobs).where(eq(exportJobs.id, exportId)).limit(1);
  return row;
}
