/**
 * Gang sheet files for the demo tee order, made as the worker makes them: the demo emblem read
 * as an upload is (ink trimmed), the order planned per size (37 tees, 10 in on M, 5 % spares),
 * packed on a 22 in roll, then every sheet drawn as one PDF and as one PNG per sheet at 300 ppi.
 * Each time stands beside the packing time and the 3 s each file may take; the longest wait
 * between two progress reports stands beside the 1 s the page may sit still.
 */
import { performance } from "node:perf_hooks";
import { analyzeArtwork } from "../../app/_server/artwork/analyze";
import { productionArt } from "../../app/_server/production/art-source";
import { renderGangSheetPdf, renderGangSheetPngs, type RenderGangSheetsInput } from "../../app/_server/production/gang-sheet";
import type { ArtworkSummary } from "../../db/queries/artworks";
import { DEMO_ART } from "../../lib/demo-art";
import { CATALOG } from "../../lib/garments/catalog";
import { locationSpec } from "../../lib/garments/locations";
import { expandTransfers, packGangSheet } from "../../lib/production/packing";
import { gangItems, printPlan } from "../../lib/production/print-plan";
import { defaultPlacement } from "../../lib/placement/model";
import { time, timeAsync } from "./cpu-timing";
import { median, type Row } from "./table";

/** What the issue allows for each file of this order, and for the bar to sit still. */
const FILE_TARGET_MS = 3000;
const PROGRESS_TARGET_MS = 1000;
const RUNS = 3;

const TEE_RUN = [["XS", 2], ["S", 6], ["M", 10], ["L", 8], ["XL", 5], ["2XL", 3], ["3XL", 2], ["4XL", 1]] as const;

async function demoTeeOrder() {
  const demo = DEMO_ART.find((a) => a.key === "eastfield-emblem")!;
  const analysed = await analyzeArtwork(Buffer.from(demo.svg), { name: `${demo.name}.svg`, type: "image/svg+xml" });
  if (!analysed.ok) throw new Error(`the demo emblem was refused: ${analysed.message}`);
  const a = analysed.analysis;
  const artwork = { id: "emblem", name: demo.name, kind: "upload", svg: a.sanitizedSvg, widthPx: a.widthPx, heightPx: a.heightPx, inkLeftPx: a.ink.left, inkTopPx: a.ink.top, inkWidthPx: a.ink.width, inkHeightPx: a.ink.height, fileUrl: null } as unknown as ArtworkSummary;
  const blank = CATALOG.find((b) => b.id === "everyday-crew-tee")!;
  const m = blank.sizes.find((r) => r.size === "M")!;
  const spec = locationSpec({ location: "full-front", category: blank.category, group: m.group, measurements: m.measurements });
  const aspect = a.ink.width / a.ink.height;
  const placement = { ...defaultPlacement(spec, aspect, "front"), artworkId: artwork.id, widthIn: 10, heightIn: 10 / aspect, belowCollarIn: 3 };
  const plan = printPlan({ method: "dtf", category: blank.category, chart: blank.sizes, sizeRun: TEE_RUN.map(([size, quantity]) => ({ size, quantity })), placement, designedOn: "M", saved: null, sparePercent: 5 });
  const items = gangItems([{ plan, artworkId: artwork.id }]);
  return { artwork, items };
}

async function timed(render: (input: RenderGangSheetsInput) => Promise<unknown>, input: Omit<RenderGangSheetsInput, "onProgress">) {
  const samples: number[] = [];
  const gaps: number[] = [];
  for (let i = 0; i < RUNS; i += 1) {
    const t0 = performance.now();
    let last = t0;
    let gap = 0;
    await render({
      ...input,
      onProgress: () => {
        const now = performance.now();
        gap = Math.max(gap, now - last);
        last = now;
      },
    });
    samples.push(performance.now() - t0);
    gaps.push(gap);
  }
  return { ms: median(samples), gapMs: Math.max(...gaps) };
}

export async function measureGangFiles(): Promise<Row[]> {
  const rows: Row[] = [];
  const { artwork, items } = await demoTeeOrder();
  const pieces = expandTransfers(items, 0);
  const inkMs = await timeAsync(() => productionArt(artwork), RUNS);
  const { png } = await productionArt(artwork);
  for (const maxSheetLengthIn of [120, 40]) {
    const settings = { rollWidthIn: 22, gapIn: 0.25, allowRotation: true, maxSheetLengthIn };
    const packMs = time(() => packGangSheet({ pieces, ...settings }), RUNS);
    const packed = packGangSheet({ pieces, ...settings });
    const art = Object.fromEntries(items.map((i) => [i.id, { png }]));
    const input = { sheets: packed.sheets, rollWidthIn: 22, art };
    const name = `gang sheet files, demo tee order (${pieces.length} transfers, ${items.length} widths), sheets ≤ ${maxSheetLengthIn} in`;
    const facts = `${packed.sheets.length} sheets, ${packed.totalLengthIn.toFixed(1)} in of film`;
    const pdf = await timed(renderGangSheetPdf, input);
    const pngs = await timed(renderGangSheetPngs, input);
    rows.push({ benchmark: name, subject: "pack", value: `${packMs.toFixed(1)} ms`, against: facts, ratio: "" });
    rows.push({ benchmark: name, subject: "PDF, every sheet a page", value: `${pdf.ms.toFixed(0)} ms`, against: `target ${FILE_TARGET_MS} ms; pack ${packMs.toFixed(1)} ms`, ratio: `${(pdf.ms / FILE_TARGET_MS).toFixed(2)}× target` });
    rows.push({ benchmark: name, subject: "PNG, a file per sheet, 300 ppi", value: `${pngs.ms.toFixed(0)} ms`, against: `target ${FILE_TARGET_MS} ms; pack ${packMs.toFixed(1)} ms`, ratio: `${(pngs.ms / FILE_TARGET_MS).toFixed(2)}× target` });
    rows.push({ benchmark: name, subject: "longest wait between progress reports", value: `${Math.max(pdf.gapMs, pngs.gapMs).toFixed(0)} ms`, against: `target ${PROGRESS_TARGET_MS} ms`, ratio: `${(Math.max(pdf.gapMs, pngs.gapMs) / PROGRESS_TARGET_MS).toFixed(2)}× target` });
  }
  rows.push({ benchmark: "gang sheet files, demo tee order", subject: "ink of the art for print (once per export)", value: `${inkMs.toFixed(0)} ms`, against: `target ${FILE_TARGET_MS} ms per file`, ratio: `${(inkMs / FILE_TARGET_MS).toFixed(2)}× target` });
  return rows;
}
