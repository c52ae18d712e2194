"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { deniedAction, resolveShopAccess, type ActionResult } from "@/app/_server/access";
import { enqueueExport } from "@/app/_server/queue";
import { findJob } from "@/db/queries/jobs";
import { createExport, findExport, markExport, saveGrading, saveJobSizes } from "@/db/queries/production";
import { placementOnJob } from "@/db/queries/proofs";
import { DECORATION_LABELS, type DecorationMethod } from "@/lib/jobs";
import { usesGangSheets } from "@/lib/production/print-plan";
import { PAPER_SIZES, type PaperId } from "@/lib/production/tiling";
import { parseInput } from "@/lib/input";

const slug = z.string().min(1).max(80);
const id = z.string().min(1).max(80);

const sizesSchema = z.object({
  shopSlug: slug,
  jobId: id,
  sizes: z
    .array(z.object({ size: z.string().trim().min(1).max(12), quantity: z.number().int("Quantities are whole garments.").min(0, "Quantities cannot be negative.").max(100_000) }))
    .max(40)
    .refine((rows) => new Set(rows.map((r) => r.size)).size === rows.length, "Each size appears once."),
  /** Spares per size, percent of the ordered quantity (rounded up per size). */
  sparePercent: z.number().min(0, "Spares cannot be negative.").max(50, "Spares are at most 50 %.").optional(),
});

export async function saveSizeRunAction(input: z.input<typeof sizesSchema>): Promise<ActionResult<null>> {
  const parsed = parseInput(sizesSchema, input);
  if (!parsed.success) return { ok: false, error: parsed.error.issues[0]?.message ?? "Check the quantities." };
  const access = await resolveShopAccess(parsed.data.shopSlug, "jobs.edit");
  if (access.kind !== "ok") return deniedAction(access);
  if (!(await findJob({ shopId: access.access.shop.id, jobId: parsed.data.jobId }))) return { ok: false, error: "Not found.", status: 404 };
  await saveJobSizes({ jobId: parsed.data.jobId, sizes: parsed.data.sizes, sparePercent: parsed.data.sparePercent });
  revalidatePath(`/shops/${parsed.data.shopSlug}/jobs/${parsed.data.jobId}/production`);
  return { ok: true, data: null };
}

const gradingSchema = z.object({
  shopSlug: slug,
  jobId: id,
  placementId: id,
  transferCount: z.number().int().min(1).max(4),
  assignment: z.record(z.string().max(12), z.number().positive().max(60)),
  // Inches short across the run, kept to a thousandth: a float column cannot hold 1e-320 or 1e308.
  totalShortfall: z
    .number()
    .min(0)
    .max(1e9)
    .transform((v) => Math.round(v * 1000) / 1000),
});

export async function saveGradingAction(input: z.input<typeof gradingSchema>): Promise<ActionResult<null>> {
  const parsed = parseInput(gradingSchema, input);
  if (!parsed.success) return { ok: false, error: "That grading could not be read." };
  const access = await resolveShopAccess(parsed.data.shopSlug, "production.grade");
  if (access.kind !== "ok") return deniedAction(access);
  if (!(await findJob({ shopId: access.access.shop.id, jobId: parsed.data.jobId }))) return { ok: false, error: "Not found.", status: 404 };
  // The print graded must be on this job's proofs: never another job's, never one that does not exist.
  if (!(await placementOnJob({ jobId: parsed.data.jobId, placementId: parsed.data.placementId }))) return { ok: false, error: "That print is not on this job's proofs.", status: 404 };
  await saveGrading({ jobId: parsed.data.jobId, placementId: parsed.data.placementId, transferCount: parsed.data.transferCount, assignment: parsed.data.assignment, totalShortfall: parsed.data.totalShortfall });
  revalidatePath(`/shops/${parsed.data.shopSlug}/jobs/${parsed.data.jobId}/production`);
  return { ok: true, data: null };
}

const exportSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("spec-sheet"), shopSlug: slug, jobId: id }),
  z.object({
    kind: z.literal("test-print"),
    shopSlug: slug,
    jobId: id,
    proofId: id,
    placementId: id,
    size: z.string().min(1).max(12),
    paper: z.enum(Object.keys(PAPER_SIZES) as [PaperId, ...PaperId[]]),
    mirror: z.boolean(),
    outline: z.boolean(),
  }),
  z.object({
    kind: z.enum(["gang-sheet-png", "gang-sheet-pdf"]),
    shopSlug: slug,
    jobId: id,
    rollWidthIn: z.union([z.literal(11), z.literal(13), z.literal(22), z.literal(24)]),
    gapIn: z.number().min(0).max(2),
    /** Ignored: spares come from the job's size run (the print plan counts them per size). */
    sparePercent: z.number().min(0).max(50).optional(),
    allowRotation: z.boolean(),
    maxSheetLengthIn: z.number().min(12).max(600),
  }),
]);

/** Queues a heavy export for the worker; the page follows its progress. */
export async function requestExportAction(input: z.input<typeof exportSchema>): Promise<ActionResult<{ exportId: string }>> {
  const parsed = parseInput(exportSchema, input);
  if (!parsed.success) return { ok: false, error: parsed.error.issues[0]?.message ?? "Check the export settings." };
  const access = await resolveShopAccess(parsed.data.shopSlug, "production.view");
  if (access.kind !== "ok") return deniedAction(access);
  const { shopSlug, kind, jobId, ...params } = parsed.data;
  const job = await findJob({ shopId: access.access.shop.id, jobId });
  if (!job) return { ok: false, error: "Not found.", status: 404 };
  if ((kind === "gang-sheet-png" || kind === "gang-sheet-pdf") && !usesGangSheets(job.method as DecorationMethod)) {
    return { ok: false, error: `A ${DECORATION_LABELS[job.method as DecorationMethod].toLowerCase()} job prints without transfers, so it has no gang sheet.`, status: 409 };
  }
  const exportId = await createExport({ shopId: access.access.shop.id, jobId, kind, params, requestedBy: access.access.actor.id });
  try {
    await enqueueExport(exportId);
  } catch (error) {
    console.error("[export queue]", error);
    await markExport(exportId, { state: "failed", message: "The export queue is not answering. Try again in a moment." });
  }
  revalidatePath(`/shops/${shopSlug}/jobs/${jobId}/production`);
  return { ok: true, data: { exportId } };
}

export async function retryExportAction(input: { shopSlug: string; exportId: string }): Promise<ActionResult<null>> {
  const parsed = parseInput(z.object({ shopSlug: slug, exportId: id }), input);
  if (!parsed.success) return { ok: false, error: "Unknown export." };
  const access = await resolveShopAccess(parsed.data.shopSlug, "production.view");
  if (access.kind !== "ok") return deniedAction(access);
  const row = await findExport({ shopId: access.access.shop.id, exportId: parsed.data.exportId });
  if (!row) return { ok: false, error: "Not found.", status: 404 };
  if (row.state !== "failed") return { ok: false, error: "Only a failed export can be tried again." };
  await markExport(row.id, { state: "queued", progress: 0, message: null });
  try {
    await enqueueExport(row.id);
  } catch {
    await markExport(row.id, { state: "failed", message: "The export queue is not answering. Try again in a moment." });
  }
  return { ok: true, data: null };
}
