import "server-only";
import { findBlank } from "@/db/queries/blanks";
import { findJob } from "@/db/queries/jobs";
import { listGradings, listJobSizes, loadExportForWork, markExport } from "@/db/queries/production";
import { getProductionDocument, listProofsForJob } from "@/db/queries/proofs";
import { listJobDecisions, proofContext } from "@/db/queries/review";
import { LOCATION_LABELS, locationSpec, sideOf } from "@/lib/garments/locations";
import { DECORATION_LABELS, type DecorationMethod } from "@/lib/jobs";
import { expandTransfers, packGangSheet } from "@/lib/production/packing";
import { printsPerSize } from "@/lib/production/plan";
import type { PaperId } from "@/lib/production/tiling";
import { productionArt } from "./art-source";
import { renderGangSheet } from "./gang-sheet";
import { renderSpecSheetPdf } from "./spec-sheet";
import { renderTestPrintPdf } from "./test-print";

type Done = { fileName: string; mime: string; bytes: Buffer };

const slugify = (s: string) => s.replace(/[^A-Za-z0-9]+/g, "-").replace(/^-|-$/g, "").toLowerCase() || "export";

/** The job's proofs as production prints them: each one's approved revision, or its working copy while none is approved. */
async function jobProofs(shopId: string, jobId: string) {
  const list = await listProofsForJob({ shopId, jobId });
  const docs = await Promise.all(list.map((p) => getProductionDocument({ shopId, proofId: p.id })));
  return docs.filter((d): d is NonNullable<typeof d> => !!d).map((d) => d.document);
}

async function specSheet(shopId: string, jobId: string, progress: (f: number) => Promise<void>): Promise<Done> {
  const job = await findJob({ shopId, jobId });
  if (!job) throw new Error("The job no longer exists.");
  const [sizes, gradings, docs, decisions] = await Promise.all([listJobSizes({ jobId }), listGradings({ jobId }), jobProofs(shopId, jobId), listJobDecisions({ shopId, jobId })]);
  await progress(0.3);
  const doc = docs[0];
  if (!doc) throw new Error("This job has no proof yet, so there is nothing to print.");
  const sizeRun = sizes.map((s) => ({ size: s.size, quantity: s.quantity }));
  const locations = docs.flatMap((d) =>
    d.placements.map((p) => ({
      label: `${LOCATION_LABELS[p.location]} (${d.proof.name})`,
      side: sideOf(p.location),
      perSize: printsPerSize({ placement: p, sizeRun, assignment: gradings.find((g) => g.placementId === p.id)?.assignment ?? null }),
    })),
  );
  const thumbnails: Array<{ label: string; png: Buffer }> = [];
  for (const d of docs) {
    for (const p of d.placements) {
      const art = d.artworks.find((a) => a.id === p.artworkId);
      if (!art) continue;
      try {
        const { png } = await productionArt(art);
        const sharp = (await import("sharp")).default;
        thumbnails.push({ label: `${LOCATION_LABELS[p.location]}: ${art.name}`, png: await sharp(png).resize(400, 400, { fit: "inside" }).png().toBuffer() });
      } catch {
        // A missing original leaves out its thumbnail; the measurements still print.
      }
    }
  }
  await progress(0.7);
  const approved = decisions.find((d) => d.decision === "approved");
  const pdf = await renderSpecSheetPdf({
    shopName: (await proofContext({ proofId: doc.proof.id }))?.shopName ?? "",
    jobTitle: job.title,
    clientName: doc.job.clientName,
    dueDate: job.dueDate,
    method: DECORATION_LABELS[job.method as DecorationMethod],
    garment: { style: doc.blank.name, colourName: doc.proof.colourName, colourHex: doc.proof.colourHex },
    sizeRun,
    locations,
    thumbnails,
    approval: approved ? { name: approved.fullName, at: approved.at.toISOString(), revision: approved.revisionLetter } : null,
  });
  return { fileName: `${slugify(job.title)}-spec-sheet.pdf`, mime: "application/pdf", bytes: Buffer.from(pdf) };
}

async function testPrint(shopId: string, params: Record<string, unknown>, progress: (f: number) => Promise<void>): Promise<Done> {
  const doc = (await getProductionDocument({ shopId, proofId: String(params.proofId) }))?.document;
  if (!doc) throw new Error("The proof no longer exists.");
  const placement = doc.placements.find((p) => p.id === params.placementId);
  if (!placement) throw new Error("That print is no longer on the proof.");
  const art = doc.artworks.find((a) => a.id === placement.artworkId);
  if (!art) throw new Error("That print has no art to print.");
  const blank = (await findBlank({ shopId, blankId: doc.blank.id })) ?? doc.blank;
  const row = blank.sizeChart.find((r) => r.size === params.size) ?? blank.sizeChart.find((r) => r.size === doc.proof.size)!;
  await progress(0.2);
  const source = await productionArt(art);
  await progress(0.5);
  let printArea;
  if (params.outline) {
    const spec = locationSpec({ location: placement.location, category: blank.category, group: row.group, measurements: row.measurements });
    const artLeft = placement.offsetFromCenterIn - placement.widthIn / 2;
    printArea = { widthIn: spec.printArea.width, heightIn: spec.printArea.height, offsetXIn: spec.printArea.x - artLeft, offsetYIn: spec.printArea.y - placement.belowCollarIn };
  }
  const { pdf } = await renderTestPrintPdf({
    title: `${doc.job.title} · ${LOCATION_LABELS[placement.location]} · size ${row.size}`,
    art: source,
    artWidthIn: placement.widthIn,
    artHeightIn: placement.heightIn,
    paper: params.paper as PaperId,
    mirror: Boolean(params.mirror),
    printArea,
    collarLineYIn: params.outline ? -placement.belowCollarIn : undefined,
  });
  return { fileName: `${slugify(doc.job.title)}-test-print-${String(params.paper)}${params.mirror ? "-mirrored" : ""}.pdf`, mime: "application/pdf", bytes: Buffer.from(pdf) };
}

async function gangSheet(shopId: string, jobId: string, kind: "gang-sheet-png" | "gang-sheet-pdf", params: Record<string, unknown>, progress: (f: number) => Promise<void>): Promise<Done> {
  const [sizes, gradings, docs] = await Promise.all([listJobSizes({ jobId }), listGradings({ jobId }), jobProofs(shopId, jobId)]);
  const sizeRun = sizes.map((s) => ({ size: s.size, quantity: s.quantity }));
  const items: Array<{ id: string; widthIn: number; heightIn: number; quantity: number }> = [];
  const artFor: Record<string, string> = {};
  for (const d of docs) {
    for (const p of d.placements) {
      if (!p.artworkId) continue;
      for (const print of printsPerSize({ placement: p, sizeRun, assignment: gradings.find((g) => g.placementId === p.id)?.assignment ?? null })) {
        if (print.quantity <= 0) continue;
        const key = `${p.id}@${print.widthIn.toFixed(3)}`;
        const existing = items.find((i) => i.id === key);
        if (existing) existing.quantity += print.quantity;
        else items.push({ id: key, widthIn: print.widthIn, heightIn: print.heightIn, quantity: print.quantity });
        artFor[key] = p.artworkId;
      }
    }
  }
  if (items.length === 0) throw new Error("No transfers to pack: add quantities to the size run and art to the proof.");
  const pieces = expandTransfers(items, Number(params.sparePercent ?? 0));
  const packed = packGangSheet({ pieces, rollWidthIn: Number(params.rollWidthIn), gapIn: Number(params.gapIn), allowRotation: Boolean(params.allowRotation), maxSheetLengthIn: Number(params.maxSheetLengthIn) });
  await progress(0.15);
  const sheet = packed.sheets[0]!;
  const art: Record<string, { png: Buffer }> = {};
  for (const key of new Set(sheet.placements.map((p) => p.itemId))) {
    const doc = docs.find((d) => d.artworks.some((a) => a.id === artFor[key]));
    const a = doc?.artworks.find((x) => x.id === artFor[key]);
    if (a) art[key] = await productionArt(a);
  }
  await progress(0.3);
  const rendered = await renderGangSheet({ sheet, rollWidthIn: Number(params.rollWidthIn), art, onProgress: (f) => void progress(0.3 + f * 0.65) });
  const job = await findJob({ shopId, jobId });
  const name = `${slugify(job?.title ?? "job")}-gang-sheet-1-of-${packed.sheets.length}`;
  return kind === "gang-sheet-png"
    ? { fileName: `${name}.png`, mime: "image/png", bytes: rendered.png }
    : { fileName: `${name}.pdf`, mime: "application/pdf", bytes: Buffer.from(rendered.pdf) };
}

/** Runs one export and records its progress and result. A failure says why and can be retried. */
export async function runExport(exportId: string): Promise<void> {
  const row = await loadExportForWork({ exportId });
  if (!row) return;
  await markExport(exportId, { state: "running", progress: 0.02, message: null, bumpAttempts: true });
  let last = 0;
  const progress = async (f: number) => {
    const value = Math.max(0, Math.min(0.99, f));
    if (value - last < 0.02) return;
    last = value;
    await markExport(exportId, { progress: value });
  };
  try {
    const done =
      row.kind === "spec-sheet"
        ? await specSheet(row.shopId, row.jobId!, progress)
        : row.kind === "test-print"
          ? await testPrint(row.shopId, row.params, progress)
          : await gangSheet(row.shopId, row.jobId!, row.kind, row.params, progress);
    await markExport(exportId, { state: "done", progress: 1, fileName: done.fileName, mime: done.mime, result: done.bytes, finishedAt: new Date(), message: null });
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    console.error(`[export ${exportId}]`, message);
    await markExport(exportId, { state: "failed", message: `The export failed: ${message}`, finishedAt: new Date() });
  }
}
