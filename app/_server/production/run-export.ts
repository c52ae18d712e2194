import "server-only";
import { findShopById } from "@/db/queries/shops";
import { finishExport, loadExportForWork, markExport } from "@/db/queries/production";
import type { ExportSummaryFacts } from "@/db/schema";
import { listJobDecisions, proofContext } from "@/db/queries/review";
import { fileTimeStamp, formatShopDate, formatShopDateTime } from "@/lib/dates";
import { LOCATION_LABELS, locationSpec } from "@/lib/garments/locations";
import { DECORATION_LABELS, type DecorationMethod } from "@/lib/jobs";
import { exportFileName, type ExportSubject } from "@/lib/production/export-names";
import { expandTransfers, packGangSheet } from "@/lib/production/packing";
import { gangItems, planForSize, usesGangSheets } from "@/lib/production/print-plan";
import { PAPER_SIZES, type PaperId } from "@/lib/production/tiling";
import { formatLength } from "@/lib/units";
import { productionArt } from "./art-source";
import { renderGangSheetPdf, renderGangSheetPngs } from "./gang-sheet";
import { loadJobPrints } from "./plans";
import { renderSpecSheetPdf, specSheetLocation } from "./spec-sheet";
import { renderTestPrintPdf } from "./test-print";

type Done = { fileName: string; mime: string; bytes: Buffer };
type Made = { files: Done[]; summary: ExportSummaryFacts | null; subject: ExportSubject };

/** The shop's clock for a file's time stamp and the dates printed on it. */
async function shopClock(shopId: string) {
  const shop = await findShopById({ shopId });
  return { locale: shop?.locale, timeZone: shop?.timeZone };
}

async function loadPrints(shopId: string, jobId: string) {
  const loaded = await loadJobPrints({ shopId, jobId });
  if (!loaded) throw new Error("The job no longer exists.");
  return loaded;
}

async function specSheet(shopId: string, jobId: string, progress: (f: number) => Promise<void>): Promise<Made> {
  const { job, sizeRun, printed, prints } = await loadPrints(shopId, jobId);
  const decisions = await listJobDecisions({ shopId, jobId });
  await progress(0.3);
  const doc = printed[0]?.document;
  if (!doc) throw new Error("This job has no proof yet, so there is nothing to print.");
  const several = printed.length > 1;
  const locations = prints.map(({ document: d, placement, plan }) => specSheetLocation({ label: LOCATION_LABELS[placement.location], proofName: several ? d.proof.name : null, plan }));
  const thumbnails: Array<{ label: string; png: Buffer }> = [];
  for (const { placement, artwork } of prints) {
    if (!artwork) continue;
    try {
      const { png } = await productionArt(artwork);
      const sharp = (await import("sharp")).default;
      thumbnails.push({ label: `${LOCATION_LABELS[placement.location]}: ${artwork.name}`, png: await sharp(png).resize(400, 400, { fit: "inside" }).png().toBuffer() });
    } catch {
      // A missing original leaves out its thumbnail; the measurements still print.
    }
  }
  await progress(0.7);
  const approved = decisions.find((d) => d.decision === "approved");
  const clock = await shopClock(shopId);
  const when = (at: Date) => formatShopDateTime(at, clock);
  const madeAt = new Date();
  const pdf = await renderSpecSheetPdf({
    shopName: (await proofContext({ proofId: doc.proof.id }))?.shopName ?? "",
    jobTitle: job.title,
    clientName: doc.job.clientName,
    dueDate: job.dueDate ? formatShopDate(job.dueDate, clock) : null,
    method: DECORATION_LABELS[job.method as DecorationMethod],
    garment: { style: doc.blank.name, colourName: doc.proof.colourName, colourHex: doc.proof.colourHex },
    sizeRun,
    sparePercent: job.sparePercent,
    locations,
    thumbnails,
    approval: approved ? { name: approved.fullName, at: when(approved.at), revision: approved.revisionLetter } : null,
    madeAt: when(madeAt),
  });
  const subject: ExportSubject = { locations: prints.map((p) => LOCATION_LABELS[p.placement.location]), sizes: sizeRun.filter((r) => r.quantity > 0).map((r) => r.size) };
  const fileName = exportFileName({ jobTitle: job.title, kind: "spec-sheet", subject, stamp: fileTimeStamp(madeAt, clock), ext: "pdf" });
  return { files: [{ fileName, mime: "application/pdf", bytes: Buffer.from(pdf) }], summary: null, subject };
}

async function testPrint(shopId: string, jobId: string, params: Record<string, unknown>, progress: (f: number) => Promise<void>): Promise<Made> {
  const { prints } = await loadPrints(shopId, jobId);
  const print = prints.find((p) => p.document.proof.id === params.proofId && p.placement.id === params.placementId);
  if (!print) throw new Error("That print is no longer on the proof.");
  if (!print.artwork) throw new Error("That print has no art to print.");
  const { document: doc, placement, plan } = print;
  const row = doc.blank.sizeChart.find((r) => r.size === params.size) ?? doc.blank.sizeChart.find((r) => r.size === doc.proof.size)!;
  // The size's own print from the plan; a size outside the run is planned on its own.
  const sized = planForSize(print.input, plan, row.size);
  if (!sized) throw new Error(`Size ${row.size} has no room for this print.`);
  await progress(0.2);
  const source = await productionArt(print.artwork);
  await progress(0.5);
  let printArea;
  if (params.outline) {
    const spec = locationSpec({ location: placement.location, category: doc.blank.category, group: row.group, measurements: row.measurements });
    const artLeft = sized.fromCentreIn - sized.widthIn / 2;
    printArea = { widthIn: spec.printArea.width, heightIn: spec.printArea.height, offsetXIn: spec.printArea.x - artLeft, offsetYIn: spec.printArea.y - sized.topIn };
  }
  const { pdf } = await renderTestPrintPdf({
    title: `${doc.job.title} · ${LOCATION_LABELS[placement.location]} · size ${row.size} · ${sized.group} · ink ${formatLength(sized.widthIn, "in")} × ${formatLength(sized.heightIn, "in")}, ${formatLength(sized.topIn, "in")} below ${plan.topFrom === "collar" ? "collar" : "top edge"}`,
    art: source,
    artWidthIn: sized.widthIn,
    artHeightIn: sized.heightIn,
    paper: params.paper as PaperId,
    mirror: Boolean(params.mirror),
    printArea,
    collarLineYIn: params.outline ? -sized.topIn : undefined,
  });
  const paper = PAPER_SIZES[params.paper as PaperId];
  const subject: ExportSubject = { locations: [LOCATION_LABELS[placement.location]], sizes: [row.size], paper: paper?.label ?? String(params.paper), mirrored: Boolean(params.mirror) };
  const fileName = exportFileName({ jobTitle: doc.job.title, kind: "test-print", subject, stamp: fileTimeStamp(new Date(), await shopClock(shopId)), ext: "pdf" });
  return { files: [{ fileName, mime: "application/pdf", bytes: Buffer.from(pdf) }], summary: null, subject };
}

async function gangSheet(shopId: string, jobId: string, kind: "gang-sheet-png" | "gang-sheet-pdf", params: Record<string, unknown>, progress: (f: number) => Promise<void>): Promise<Made> {
  const { job, prints } = await loadPrints(shopId, jobId);
  if (!usesGangSheets(job.method as DecorationMethod)) throw new Error(`A ${DECORATION_LABELS[job.method as DecorationMethod].toLowerCase()} job prints without transfers, so it has no gang sheet.`);
  const items = gangItems(prints.filter((p) => p.artwork).map((p) => ({ plan: p.plan, artworkId: p.artwork!.id })));
  if (items.length === 0) throw new Error("No transfers to pack: add quantities to the size run and art to the proof.");
  // Spares are already in each item's quantity (the plan counts them per size).
  const pieces = expandTransfers(items, 0);
  const rollWidthIn = Number(params.rollWidthIn);
  const packed = packGangSheet({ pieces, rollWidthIn, gapIn: Number(params.gapIn), allowRotation: Boolean(params.allowRotation), maxSheetLengthIn: Number(params.maxSheetLengthIn) });
  await progress(0.05);
  // The ink of each artwork, once, however many sizes and sheets it is on.
  const byArtwork = new Map<string, Promise<{ png: Buffer }>>();
  const art: Record<string, { png: Buffer }> = {};
  for (const item of items) {
    const a = prints.find((p) => p.artwork?.id === item.artworkId)?.artwork;
    if (!a) continue;
    if (!byArtwork.has(a.id)) byArtwork.set(a.id, productionArt(a));
    art[item.id] = await byArtwork.get(a.id)!;
  }
  await progress(0.15);
  const input = { sheets: packed.sheets, rollWidthIn, art, onProgress: (f: number) => void progress(0.15 + f * 0.83) };
  const count = packed.sheets.length;
  const packedPrints = prints.filter((p) => p.artwork && p.plan.tools === "transfers");
  const subject: ExportSubject = {
    locations: packedPrints.map((p) => LOCATION_LABELS[p.placement.location]),
    sizes: packedPrints[0]?.plan.sizes.filter((sz) => sz.quantity > 0).map((sz) => sz.size) ?? [],
  };
  const stamp = fileTimeStamp(new Date(), await shopClock(shopId));
  const name = (ext: "pdf" | "png", part?: { n: number; of: number }) => exportFileName({ jobTitle: job.title, kind, subject, stamp, part, ext });
  const summary: ExportSummaryFacts = { rollWidthIn, pieces: pieces.length, sheetLengthsIn: packed.sheets.map((sh) => sh.lengthIn), totalLengthIn: packed.totalLengthIn, efficiency: packed.efficiency };
  if (kind === "gang-sheet-pdf") {
    const pdf = await renderGangSheetPdf(input);
    return { files: [{ fileName: name("pdf"), mime: "application/pdf", bytes: Buffer.from(pdf) }], summary, subject };
  }
  const pngs = await renderGangSheetPngs(input);
  return { files: pngs.map((png, i) => ({ fileName: name("png", { n: i + 1, of: count }), mime: "image/png", bytes: png })), summary, subject };
}

/** Least time between two progress writes, and most: the bar moves at least once a second while work goes on. */
const PROGRESS_MIN_MS = 250;

/** Runs one export and records its progress and result. A failure says why and can be retried. */
export async function runExport(exportId: string): Promise<void> {
  const row = await loadExportForWork({ exportId });
  if (!row) return;
  await markExport(exportId, { state: "running", progress: 0.02, message: null, bumpAttempts: true });
  // Progress is written when it has moved 2 %, or at all after PROGRESS_MIN_MS: small steps of a
  // long sheet still reach the page, and quick bursts do not flood the database.
  // Writes go one after another, so a slower write never puts the bar back.
  let last = 0;
  let lastAt = Date.now();
  let writes: Promise<void> = Promise.resolve();
  const progress = (f: number): Promise<void> => {
    const value = Math.max(0, Math.min(0.99, f));
    const now = Date.now();
    if (value <= last || (value - last < 0.02 && now - lastAt < PROGRESS_MIN_MS)) return writes;
    last = value;
    lastAt = now;
    writes = writes.then(() => markExport(exportId, { progress: value })).catch((error: unknown) => console.error(`[export ${exportId}] progress`, error));
    return writes;
  };
  try {
    const done =
      row.kind === "spec-sheet"
        ? await specSheet(row.shopId, row.jobId!, progress)
        : row.kind === "test-print"
          ? await testPrint(row.shopId, row.jobId!, row.params, progress)
          : await gangSheet(row.shopId, row.jobId!, row.kind, row.params, progress);
    await writes;
    await finishExport(exportId, done.files, done.summary, done.subject);
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    console.error(`[export ${exportId}]`, message);
    await writes;
    await markExport(exportId, { state: "failed", message: `The export failed: ${message}`, finishedAt: new Date() });
  }
}
