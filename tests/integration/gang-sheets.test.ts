/**
 * Every sheet of a gang sheet, made by the worker from the job's print plan: the PDF holds a page
 * per packed sheet, the PNG makes one file per sheet, each can be read back, and the pieces on all
 * sheets add up to the size run plus the spares the job asks for. The sheet count and lengths are
 * those the packer gives the page. Each test builds its own shop (tests/support/factory.ts).
 */
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { loadJobPrints } from "@/app/_server/production/plans";
import { runExport } from "@/app/_server/production/run-export";
import { createExport, exportFile, findExport, listExportFiles, saveJobSizes } from "@/db/queries/production";
import { expandTransfers, packGangSheet } from "@/lib/production/packing";
import { gangItems } from "@/lib/production/print-plan";
import { PDF_UNITS_PER_INCH } from "@/lib/units";
import { shopFactory, type BuiltShop } from "../support/factory";

const shops = shopFactory("gang-sheets");

type PdfJs = typeof import("pdfjs-dist/legacy/build/pdf.mjs");
let pdfjs: PdfJs;

/** A 37-garment run in eight sizes, as a team order comes in. */
const RUN = [
  { size: "XS", quantity: 2 },
  { size: "S", quantity: 6 },
  { size: "M", quantity: 10 },
  { size: "L", quantity: 8 },
  { size: "XL", quantity: 5 },
  { size: "2XL", quantity: 3 },
];
/** Sheets of at most 40 in on a 22 in roll, 1/4 in apart, turning allowed: several sheets for this run. */
const SETTINGS = { rollWidthIn: 22, gapIn: 0.25, allowRotation: true, maxSheetLengthIn: 40 };

/** Images drawn on each page of a PDF (ISO 32000 Do operators, as pdf.js lists them). */
async function imagesPerPage(bytes: Uint8Array): Promise<{ heightsIn: number[]; images: number[] }> {
  const doc = await pdfjs.getDocument({ data: new Uint8Array(bytes), verbosity: 0 }).promise;
  const heightsIn: number[] = [];
  const images: number[] = [];
  for (let n = 1; n <= doc.numPages; n++) {
    const page = await doc.getPage(n);
    heightsIn.push(page.getViewport({ scale: 1 }).height / PDF_UNITS_PER_INCH);
    const list = await page.getOperatorList();
    images.push(list.fnArray.filter((fn) => fn === pdfjs.OPS.paintImageXObject).length);
  }
  return { heightsIn, images };
}

describe("gang sheets with several sheets", () => {
  let s: BuiltShop;
  let expected: { pieces: number; lengthsIn: number[] };

  beforeAll(async () => {
    pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
    s = await shops.build({ job: { method: "dtf", sizeRun: RUN } });
    await saveJobSizes({ jobId: s.job.id, sizes: RUN, sparePercent: 10 });
    // What the production page forecasts, from the same plan and packer.
    const { prints } = (await loadJobPrints({ shopId: s.shop.id, jobId: s.job.id }))!;
    const items = gangItems(prints.map((p) => ({ plan: p.plan, artworkId: p.artwork!.id })));
    const packed = packGangSheet({ pieces: expandTransfers(items, 0), ...SETTINGS });
    expected = { pieces: items.reduce((n, i) => n + i.quantity, 0), lengthsIn: packed.sheets.map((sh) => sh.lengthIn) };
  });

  it("counts the size run plus spares per size (10 % of 2, 6, 10, 8, 5, 3 rounded up is 1 each), over several sheets", () => {
    expect(expected.pieces).toBe(34 + 6);
    expect(expected.lengthsIn.length).toBeGreaterThan(1);
  });

  it("puts every sheet in the PDF as a page of its own length, holding every piece", async () => {
    const id = await createExport({ shopId: s.shop.id, jobId: s.job.id, kind: "gang-sheet-pdf", params: SETTINGS, requestedBy: s.owner.id });
    await runExport(id);
    const row = await findExport({ shopId: s.shop.id, exportId: id });
    expect(row?.state, row?.message ?? "").toBe("done");
    // The file says what it holds and when it was made: location, sizes, then the shop's date and time.
    expect(row!.fileName).toMatch(/-gang-sheet-[a-z-]+-sizes-[a-z0-9]+-to-[a-z0-9]+-\d{4}-\d{2}-\d{2}-\d{4}\.pdf$/);
    expect(row!.subject?.locations.length).toBeGreaterThan(0);
    expect(row!.subject?.sizes.length).toBe(6);
    expect(row!.summary).toMatchObject({ pieces: expected.pieces, sheetLengthsIn: expected.lengthsIn, rollWidthIn: 22 });
    const file = await exportFile({ shopId: s.shop.id, exportId: id });
    const { heightsIn, images } = await imagesPerPage(new Uint8Array(file!.result!));
    expect(heightsIn.length).toBe(expected.lengthsIn.length);
    heightsIn.forEach((h, i) => expect(h).toBeCloseTo(expected.lengthsIn[i]!, 6));
    expect(images.reduce((a, b) => a + b, 0)).toBe(expected.pieces);
  });

  it("makes one PNG per sheet, each readable by its number, at 300 ppi on the 22 in roll", async () => {
    const id = await createExport({ shopId: s.shop.id, jobId: s.job.id, kind: "gang-sheet-png", params: SETTINGS, requestedBy: s.owner.id });
    // One read at a time: reads in flight together can answer out of order and look like progress going back.
    const seen: number[] = [];
    let watching = true;
    const watcher = (async () => {
      while (watching) {
        const row = await findExport({ shopId: s.shop.id, exportId: id });
        if (row) seen.push(row.progress);
        await new Promise((resolve) => setTimeout(resolve, 50));
      }
    })();
    await runExport(id);
    watching = false;
    await watcher;
    const files = await listExportFiles({ shopId: s.shop.id, exportId: id });
    const count = expected.lengthsIn.length;
    expect(files.map((f) => f.n)).toEqual(Array.from({ length: count }, (_, i) => i + 1));
    expect(files.map((f) => f.fileName)).toEqual(files.map((f) => expect.stringMatching(new RegExp(`-gang-sheet-.+-\\d{4}-\\d{2}-\\d{2}-\\d{4}-${f.n}-of-${count}\\.png$`))));
    for (const f of files) {
      const file = await exportFile({ shopId: s.shop.id, exportId: id, n: f.n });
      expect(file?.mime).toBe("image/png");
      expect(file!.result!.length).toBe(f.bytes);
      const meta = await sharp(file!.result!, { limitInputPixels: false }).metadata();
      // 22 in × 300 ppi across; the sheet's own length × 300 ppi down (W3C PNG pHYs gives the ppi).
      expect(meta.width).toBe(6600);
      expect(meta.height).toBe(Math.round(expected.lengthsIn[f.n - 1]! * 300));
      expect(meta.density).toBeCloseTo(300, 0);
    }
    // No file past the last sheet, and none for another shop.
    expect(await exportFile({ shopId: s.shop.id, exportId: id, n: count + 1 })).toBeUndefined();
    const other = await shops.build();
    expect(await exportFile({ shopId: other.shop.id, exportId: id, n: 2 })).toBeUndefined();
    // Progress only goes forward.
    for (let i = 1; i < seen.length; i++) expect(seen[i]!).toBeGreaterThanOrEqual(seen[i - 1]!);
  });

  it("replaces the files of an earlier try when the export is run again", async () => {
    const id = await createExport({ shopId: s.shop.id, jobId: s.job.id, kind: "gang-sheet-png", params: SETTINGS, requestedBy: s.owner.id });
    await runExport(id);
    await runExport(id);
    const files = await listExportFiles({ shopId: s.shop.id, exportId: id });
    expect(files.length).toBe(expected.lengthsIn.length);
  });

  it("refuses a gang sheet for a screen-print job, saying why, and keeps the job", async () => {
    const screen = await shops.build({ job: { method: "screen-print", sizeRun: RUN } });
    const id = await createExport({ shopId: screen.shop.id, jobId: screen.job.id, kind: "gang-sheet-pdf", params: SETTINGS, requestedBy: screen.owner.id });
    await runExport(id);
    const row = await findExport({ shopId: screen.shop.id, exportId: id });
    expect(row?.state).toBe("failed");
    expect(row?.message).toMatch(/screen print job prints without transfers/i);
    expect(await listExportFiles({ shopId: screen.shop.id, exportId: id })).toEqual([]);
    expect((await loadJobPrints({ shopId: screen.shop.id, jobId: screen.job.id }))?.sizeRun.length).toBe(RUN.length);
  });
});
