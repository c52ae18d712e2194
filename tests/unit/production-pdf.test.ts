import fc from "fast-check";
import type { PDFFont } from "pdf-lib";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import {
  DEFAULT_GANG_PPI,
  MAX_SHEET_PIXELS,
  STRIP_PIXELS,
  renderGangSheet,
  renderGangSheetPdf,
  renderGangSheetPngs,
  type RenderGangSheetInput,
} from "@/app/_server/production/gang-sheet";
import {
  DEFAULT_CAUTIONS,
  renderSpecSheetPdf,
  toWinAnsi,
  type SpecSheetInput,
} from "@/app/_server/production/spec-sheet";
import {
  FIVE_CM_BAR_PT,
  ONE_INCH_BAR_PT,
  SCALE_BAR_HEIGHT_PT,
  TITLE_MAX_LINES,
  joinInstruction,
  renderTestPrintPdf,
  titleLines,
  wrapAtWords,
  type TestPrintInput,
} from "@/app/_server/production/test-print";
import { planTiles, tileCoverage, type PaperId, type TilePlan } from "@/lib/production/tiling";
import { expectTiledArt } from "./oracles/tiling";

type PdfJs = typeof import("pdfjs-dist/legacy/build/pdf.mjs");
type PdfDoc = Awaited<ReturnType<PdfJs["getDocument"]>["promise"]>;
type PdfPage = Awaited<ReturnType<PdfDoc["getPage"]>>;

let pdfjs: PdfJs;

beforeAll(async () => {
  pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
});

async function openPdf(bytes: Uint8Array): Promise<PdfDoc> {
  // A copy: pdf.js may take ownership of the buffer it is given.
  return pdfjs.getDocument({
    data: bytes.slice(),
    verbosity: 0,
    isEvalSupported: false,
    disableFontFace: true,
    useSystemFonts: false,
  }).promise;
}

async function pages(doc: PdfDoc): Promise<PdfPage[]> {
  return Promise.all(Array.from({ length: doc.numPages }, (_, i) => doc.getPage(i + 1)));
}

async function pageText(page: PdfPage): Promise<string> {
  const content = await page.getTextContent();
  return content.items
    .map((item) => ("str" in item ? item.str : ""))
    .join(" ")
    .replace(/\s+/g, " ");
}

async function documentText(doc: PdfDoc): Promise<string> {
  return (await Promise.all((await pages(doc)).map(pageText))).join(" ");
}

// ---------------------------------------------------------------------------------------
// Reading what a page draws.
//
// How the scale bars and the art are found: we walk pdf.js's operator list the way a viewer
// does, keeping the current transformation matrix (ISO 32000 8.3.4: `cm` premultiplies the
// CTM; q/Q save and restore it), and map each filled path's bounding box and each image's
// unit square into page space. A 1 in bar drawn in any local coordinate system still comes
// out 72 pt long in page space, so the check does not depend on how pdf-lib writes it.

type Matrix = [number, number, number, number, number, number];
interface Box {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}
interface DrawnImage {
  ctm: Matrix;
  clip: Box | null;
  widthPx: number;
  heightPx: number;
}

function multiply(m: Matrix, n: Matrix): Matrix {
  // Point p goes through n first, then m (a `cm` of n with CTM m).
  return [
    m[0] * n[0] + m[2] * n[1],
    m[1] * n[0] + m[3] * n[1],
    m[0] * n[2] + m[2] * n[3],
    m[1] * n[2] + m[3] * n[3],
    m[0] * n[4] + m[2] * n[5] + m[4],
    m[1] * n[4] + m[3] * n[5] + m[5],
  ];
}

function mapBox(m: Matrix, b: Box): Box {
  const pts = [
    [b.x0, b.y0],
    [b.x1, b.y0],
    [b.x0, b.y1],
    [b.x1, b.y1],
  ].map(([x, y]) => [m[0] * x! + m[2] * y! + m[4], m[1] * x! + m[3] * y! + m[5]]);
  return {
    x0: Math.min(...pts.map((p) => p[0]!)),
    y0: Math.min(...pts.map((p) => p[1]!)),
    x1: Math.max(...pts.map((p) => p[0]!)),
    y1: Math.max(...pts.map((p) => p[1]!)),
  };
}

async function walk(page: PdfPage): Promise<{ filled: Box[]; images: DrawnImage[]; dashed: number }> {
  const { OPS } = pdfjs;
  const list = await page.getOperatorList();
  const fills = new Set<number>([OPS.fill, OPS.eoFill, OPS.fillStroke, OPS.eoFillStroke]);
  let state = { ctm: [1, 0, 0, 1, 0, 0] as Matrix, clip: null as Box | null };
  const stack: (typeof state)[] = [];
  let clipNext = false;
  const filled: Box[] = [];
  const images: DrawnImage[] = [];
  let dashed = 0;
  list.fnArray.forEach((fn, i) => {
    const args = list.argsArray[i] as unknown[];
    if (fn === OPS.save) stack.push({ ...state });
    else if (fn === OPS.restore) state = stack.pop() ?? state;
    else if (fn === OPS.transform) state = { ...state, ctm: multiply(state.ctm, args as Matrix) };
    else if (fn === OPS.clip || fn === OPS.eoClip) clipNext = true;
    else if (fn === OPS.setDash && Array.isArray(args[0]) && (args[0] as number[]).length > 0) dashed += 1;
    else if (fn === OPS.constructPath) {
      const [paintOp, , minMax] = args as [number, unknown, ArrayLike<number> | null];
      if (!minMax) return;
      const box = mapBox(state.ctm, { x0: minMax[0]!, y0: minMax[1]!, x1: minMax[2]!, y1: minMax[3]! });
      if (clipNext) {
        state = { ...state, clip: box };
        clipNext = false;
      }
      if (fills.has(paintOp)) filled.push(box);
    } else if (fn === OPS.paintImageXObject) {
      images.push({
        ctm: state.ctm,
        clip: state.clip,
        widthPx: args[1] as number,
        heightPx: args[2] as number,
      });
    }
  });
  return { filled, images, dashed };
}

const near = (a: number, b: number, eps = 0.01) => Math.abs(a - b) <= eps;

/** Filled rectangles exactly `length` pt long and one scale-bar thick. */
function barsOfLength(filled: Box[], length: number): Box[] {
  return filled.filter(
    (b) => near(b.x1 - b.x0, length, 0.005) && near(b.y1 - b.y0, SCALE_BAR_HEIGHT_PT, 0.005),
  );
}

async function renderPage(
  page: PdfPage,
  scale: number,
): Promise<{ data: Uint8ClampedArray; width: number; height: number }> {
  const { createCanvas } = await import("@napi-rs/canvas");
  const viewport = page.getViewport({ scale });
  const canvas = createCanvas(Math.ceil(viewport.width), Math.ceil(viewport.height));
  const context = canvas.getContext("2d");
  context.fillStyle = "#ffffff";
  context.fillRect(0, 0, canvas.width, canvas.height);
  await page.render({ canvas: canvas as never, canvasContext: context as never, viewport } as never).promise;
  return {
    data: context.getImageData(0, 0, canvas.width, canvas.height).data,
    width: canvas.width,
    height: canvas.height,
  };
}

function pixel(
  img: { data: ArrayLike<number>; width: number },
  x: number,
  y: number,
  channels = 4,
): number[] {
  const i = (Math.round(y) * img.width + Math.round(x)) * channels;
  return Array.from({ length: channels }, (_, c) => img.data[i + c]!);
}

const isRed = ([r, g, b]: number[]) => r! > 200 && g! < 60 && b! < 60;
const isBlue = ([r, g, b]: number[]) => r! < 60 && g! < 60 && b! > 200;

/** Left half red, right half blue (an art raster whose left and right can be told apart). */
async function redBluePng(width: number, height: number): Promise<Buffer> {
  const half = Math.floor(width / 2);
  const red = await sharp({ create: { width: half, height, channels: 4, background: "#ff0000" } })
    .png()
    .toBuffer();
  return sharp({ create: { width, height, channels: 4, background: "#0000ff" } })
    .composite([{ input: red, left: 0, top: 0 }])
    .png()
    .toBuffer();
}

async function solidPng(colour: string, width = 8, height = 8): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 4, background: colour } })
    .png()
    .toBuffer();
}

/** A plan rebuilt from the PDF alone: which slice of the art each page's image shows, and where. */
function planFromPdf(plan: TilePlan, drawn: DrawnImage[][], pageHeightPt: number): TilePlan {
  const W = plan.artWidthIn;
  const H = plan.artHeightIn;
  const tiles = plan.tiles.map((tile, i) => {
    const image = drawn[i]![0]!;
    const clip = image.clip!;
    const [a, , , d, e, f] = image.ctm;
    // Unit square (u, v) of the image → page (a·u + e, d·v + f); art x = u·W, art y = (1 − v)·H.
    const ux = [(clip.x0 - e) / a, (clip.x1 - e) / a].sort((p, q) => p - q);
    const vy = [(clip.y0 - f) / d, (clip.y1 - f) / d].sort((p, q) => p - q);
    return {
      ...tile,
      artX: ux[0]! * W,
      artWidth: (ux[1]! - ux[0]!) * W,
      artY: (1 - vy[1]!) * H,
      artHeight: (vy[1]! - vy[0]!) * H,
      pageX: clip.x0 / 72,
      pageY: (pageHeightPt - clip.y1) / 72,
    };
  });
  return { ...plan, tiles };
}

// ---------------------------------------------------------------------------------------

describe("renderTestPrintPdf", () => {
  let smallArt: Buffer;
  beforeAll(async () => {
    smallArt = await redBluePng(60, 40);
  });

  const base = (over: Partial<TestPrintInput>): TestPrintInput => ({
    title: "Test job",
    art: { png: smallArt },
    artWidthIn: 6,
    artHeightIn: 4,
    paper: "letter",
    ...over,
  });

  it.each([
    // ANSI/ASME Y14.1 size A: 8.5 × 11 in; ISO 32000: 72 units per inch → 612 × 792 pt.
    { paper: "letter" as PaperId, orientation: "portrait" as const, w: 612, h: 792 },
    { paper: "letter" as PaperId, orientation: "landscape" as const, w: 792, h: 612 },
    // ISO 216 A4: 210 × 297 mm; NIST SP 811: 25.4 mm per inch → 595.28 × 841.89 pt.
    { paper: "a4" as PaperId, orientation: "portrait" as const, w: 595.28, h: 841.89 },
    // ANSI/ASME Y14.1 size B: 11 × 17 in → 792 × 1224 pt.
    { paper: "tabloid" as PaperId, orientation: "portrait" as const, w: 792, h: 1224 },
    // ISO 216 A3: 297 × 420 mm → 841.89 × 1190.55 pt.
    { paper: "a3" as PaperId, orientation: "portrait" as const, w: 841.89, h: 1190.55 },
  ])("$paper $orientation pages are $w × $h pt", async ({ paper, orientation, w, h }) => {
    const { pdf, plan } = await renderTestPrintPdf(
      base({ paper, orientation, artWidthIn: 14, artHeightIn: 18 }),
    );
    const doc = await openPdf(pdf);
    expect(doc.numPages).toBe(plan.pages);
    expect(plan.pages).toBeGreaterThan(1);
    for (const page of await pages(doc)) {
      const [x0, y0, x1, y1] = page.view;
      expect(Math.abs(x1! - x0! - w)).toBeLessThanOrEqual(0.01);
      expect(Math.abs(y1! - y0! - h)).toBeLessThanOrEqual(0.01);
      const viewport = page.getViewport({ scale: 1 });
      expect(Math.abs(viewport.width - w)).toBeLessThanOrEqual(0.01);
      expect(Math.abs(viewport.height - h)).toBeLessThanOrEqual(0.01);
    }
  });

  it("draws a 1 in bar (72 pt, ISO 32000) and a 5 cm bar (5 / 2.54 × 72 pt, NIST SP 811) on every page, inside the printable area", async () => {
    expect(ONE_INCH_BAR_PT).toBe(72);
    expect(FIVE_CM_BAR_PT).toBeCloseTo(141.732, 3);
    const { pdf, plan } = await renderTestPrintPdf(base({ artWidthIn: 20, artHeightIn: 14, paper: "a4" }));
    const doc = await openPdf(pdf);
    for (const page of await pages(doc)) {
      const { filled } = await walk(page);
      const inch = barsOfLength(filled, 72);
      const cm5 = barsOfLength(filled, (5 / 2.54) * 72);
      expect(inch).toHaveLength(1);
      expect(cm5).toHaveLength(1);
      const m = plan.marginIn * 72;
      for (const bar of [...inch, ...cm5]) {
        expect(bar.x0).toBeGreaterThanOrEqual(m);
        expect(bar.y0).toBeGreaterThanOrEqual(m);
        expect(bar.x1).toBeLessThanOrEqual(plan.pageWidthIn * 72 - m);
        expect(bar.y1).toBeLessThanOrEqual(plan.pageHeightIn * 72 - m);
      }
    }
  });

  it("puts one tile on each page: the plan is planTiles' own with a label band, and the page count matches it", async () => {
    const options = {
      artWidthIn: 18,
      artHeightIn: 24,
      paper: "letter" as PaperId,
      overlapIn: 0.5,
      marginIn: 0.25,
      orientation: "portrait" as const,
    };
    const { pdf, plan } = await renderTestPrintPdf(base(options));
    expect(plan.labelBandIn).toBeGreaterThan(0);
    expect(plan).toEqual(planTiles({ ...options, labelBandIn: plan.labelBandIn }));
    expect(plan.pages).toBe(9);
    const doc = await openPdf(pdf);
    expect(doc.numPages).toBe(plan.pages);
    const texts = await Promise.all((await pages(doc)).map(pageText));
    texts.forEach((text, i) => {
      const tile = plan.tiles[i]!;
      expect(text).toContain(tile.label);
      expect(text).toContain(joinInstruction(tile.joins));
      expect(text).toContain(`Page ${i + 1} of 9`);
      expect(text).toContain("Print at 100% / Actual size - do not fit to page");
    });
    // The middle page of a 3 × 3 sheet.
    expect(texts[4]).toContain("B2");
    expect(texts[4]).toContain("Tape to A2 above, B1 to the left, B3 to the right, C2 below");
    expect(texts[0]).toContain("Tape to A2 to the right, B1 below");
  });

  it("draws each tile's slice at true size; the slices read back from the PDF cover the art with the stated overlap", async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.record({
          artWidthIn: fc.double({ min: 1, max: 30, noNaN: true }),
          artHeightIn: fc.double({ min: 1, max: 30, noNaN: true }),
          paper: fc.constantFrom<PaperId>("letter", "a4"),
          overlapIn: fc.constantFrom(0, 0.25, 0.5, 1),
          mirror: fc.boolean(),
        }),
        async (options) => {
          const { pdf, plan } = await renderTestPrintPdf(base(options));
          expect(plan).toEqual(planTiles({ ...options, labelBandIn: plan.labelBandIn }));
          const doc = await openPdf(pdf);
          expect(doc.numPages).toBe(plan.pages);
          const drawn: DrawnImage[][] = [];
          for (const page of await pages(doc)) {
            const { images } = await walk(page);
            expect(images).toHaveLength(1);
            const [a, b, c, d] = images[0]!.ctm;
            // True size: the whole art is W × 72 by H × 72 pt; mirrored plans draw it flipped (negative width).
            expect(Math.abs(a)).toBeCloseTo(plan.artWidthIn * 72, 6);
            expect(d).toBeCloseTo(plan.artHeightIn * 72, 6);
            expect(Math.sign(a)).toBe(plan.mirrored ? -1 : 1);
            expect([b, c]).toEqual([0, 0]);
            drawn.push(images);
          }
          const fromPdf = planFromPdf(plan, drawn, plan.pageHeightIn * 72);
          fromPdf.tiles.forEach((t, i) => {
            const want = plan.tiles[i]!;
            for (const key of ["artX", "artY", "artWidth", "artHeight", "pageX", "pageY"] as const) {
              expect(Math.abs(t[key] - want[key])).toBeLessThan(1e-3);
            }
          });
          // pdf.js reads path coordinates as 32-bit floats (about 1e-5 pt off), so each slice read back
          // is grown by 1e-4 in (0.007 pt, far below a printer's dot) before checking that they cover the art.
          const tol = 1e-4;
          const coverage = tileCoverage({
            ...fromPdf,
            tiles: fromPdf.tiles.map((t) => ({
              ...t,
              artX: t.artX - tol,
              artY: t.artY - tol,
              artWidth: t.artWidth + 2 * tol,
              artHeight: t.artHeight + 2 * tol,
            })),
          });
          const { horizontalOverlaps, verticalOverlaps } = tileCoverage(fromPdf);
          expect(coverage.coversArt).toBe(true);
          expect(tileCoverage(plan).insidePrintable).toBe(true);
          expectTiledArt(plan);
          for (const o of [...horizontalOverlaps, ...verticalOverlaps])
            expect(o).toBeCloseTo(options.overlapIn, 3);
        },
      ),
      { numRuns: 12, seed: 20260501 },
    );
  });

  it.each([
    { mirror: false, left: "red", right: "blue" },
    { mirror: true, left: "blue", right: "red" },
  ])("mirror $mirror: the left side of the art on the page is $left", async ({ mirror, left, right }) => {
    const { pdf, plan } = await renderTestPrintPdf(base({ mirror }));
    expect(plan.pages).toBe(1);
    const tile = plan.tiles[0]!;
    const doc = await openPdf(pdf);
    const img = await renderPage(await doc.getPage(1), 1);
    expect([img.width, img.height]).toEqual([612, 792]);
    const y = (tile.pageY + 2) * 72;
    const colour = (p: number[]) => (isRed(p) ? "red" : isBlue(p) ? "blue" : "other");
    expect(colour(pixel(img, (tile.pageX + 1.5) * 72, y))).toBe(left);
    expect(colour(pixel(img, (tile.pageX + 4.5) * 72, y))).toBe(right);
    // True size on the raster too: at 72 px per inch the 6 in art is 432 px wide.
    const row = Array.from({ length: img.width }, (_, x) => colour(pixel(img, x, y)) !== "other");
    const first = row.indexOf(true);
    const last = row.lastIndexOf(true);
    expect(Math.abs(last - first + 1 - 432)).toBeLessThanOrEqual(2);
    expect(Math.abs(first - tile.pageX * 72)).toBeLessThanOrEqual(1.5);
  });

  it("rasterises SVG art at about 250 ppi and draws the print area and collar line dashed", async () => {
    const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="200" height="100" viewBox="0 0 200 100"><rect width="100" height="100" fill="#ff0000"/><rect x="100" width="100" height="100" fill="#0000ff"/></svg>`;
    const { pdf, plan } = await renderTestPrintPdf(
      base({
        art: { svg },
        artWidthIn: 4,
        artHeightIn: 2,
        printArea: { widthIn: 5, heightIn: 6, offsetXIn: -0.5, offsetYIn: -1 },
        collarLineYIn: -2.5,
      }),
    );
    const doc = await openPdf(pdf);
    const page = await doc.getPage(1);
    const { images, dashed } = await walk(page);
    expect(images).toHaveLength(1);
    const ppi = images[0]!.widthPx / plan.artWidthIn;
    expect(ppi).toBeGreaterThanOrEqual(200);
    expect(ppi).toBeLessThanOrEqual(300);
    expect(images[0]!.heightPx / plan.artHeightIn).toBeCloseTo(ppi, 0);
    expect(dashed).toBeGreaterThanOrEqual(1);
    const text = await pageText(page);
    expect(text).toContain("print area");
    expect(text).toContain("The collar line is 2 1/2 in above the top of the art");
    const img = await renderPage(page, 1);
    const tile = plan.tiles[0]!;
    expect(isRed(pixel(img, (tile.pageX + 1) * 72, (tile.pageY + 1.5) * 72))).toBe(true);
    expect(isBlue(pixel(img, (tile.pageX + 3) * 72, (tile.pageY + 1.5) * 72))).toBe(true);
  });

  it("sanitises the title, and refuses what the plan refuses", async () => {
    const { pdf } = await renderTestPrintPdf(base({ title: "Team “Hawks” → front 🦅 ×2" }));
    const text = await documentText(await openPdf(pdf));
    expect(text).toContain('Team "Hawks" -> front x2');
    await expect(renderTestPrintPdf(base({ artWidthIn: 400, artHeightIn: 400 }))).rejects.toThrow(RangeError);
    await expect(renderTestPrintPdf(base({ art: { png: Buffer.from("not a png") } }))).rejects.toThrow(
      /could not be read/,
    );
  });
});

// ---------------------------------------------------------------------------------------

const SIZES = ["YS", "YM", "YL", "S", "M", "L", "XL", "2XL", "3XL", "4XL", "5XL"];

function location(heading: string, rows: Array<Omit<SpecSheetInput["locations"][number]["perSize"][number], "count" | "checks">>): SpecSheetInput["locations"][number] {
  return { heading, topFrom: "collar", tools: "transfers", groups: [], suggestion: null, perSize: rows.map((r) => ({ ...r, count: "1", checks: [] })) };
}

function specInput(over: Partial<SpecSheetInput> = {}): SpecSheetInput {
  return {
    shopName: "Harbour Lane Print Co",
    jobTitle: "Maple Street 5K volunteer tees",
    clientName: "Maple Street Running Club",
    dueDate: "2026-05-14",
    method: "DTF",
    garment: { style: "Cotton tee, unisex", colourName: "Heather navy", colourHex: "#2b3a55" },
    sizeRun: SIZES.map((size, i) => ({ size, quantity: i + 2 })),
    locations: [
      location("Full front", SIZES.map((size, i) => ({
          size,
          widthIn: 8 + i * 0.4,
          heightIn: 10.5,
          topIn: 3,
          fromCentreIn: 0,
          group: i < 3 ? "T1 8.5 in" : "T2 11 in",
        }))),
    ],
    thumbnails: [],
    approval: null,
    ...over,
  };
}

describe("renderSpecSheetPdf", () => {
  it("is Letter (612 × 792 pt, ANSI/ASME Y14.1 at 72 pt per inch) with the title, every size, the total and the 16 CFR 1120 caution", async () => {
    const pdf = await renderSpecSheetPdf(specInput());
    const doc = await openPdf(pdf);
    for (const page of await pages(doc)) {
      expect(page.view[2]! - page.view[0]!).toBeCloseTo(612, 2);
      expect(page.view[3]! - page.view[1]!).toBeCloseTo(792, 2);
    }
    const text = await documentText(doc);
    expect(text).toContain("Maple Street 5K volunteer tees");
    for (const size of SIZES) expect(text).toMatch(new RegExp(`(^| )${size}( |$)`));
    // 2 + 3 + … + 12 = 77 pieces.
    expect(text).toContain("77");
    expect(text).toContain("16 CFR 1120");
    expect(text).toContain("2T to 12");
    expect(text).toContain("NOT APPROVED YET");
    // Sizes to the nearest 1/8 in, with decimals: 8 + 3 × 0.4 = 9.2 in → 9 1/4 in.
    expect(text).toContain("9 1/4 x 10 1/2 in");
    expect(text).toContain("9.2 x 10.5 in");
    expect(text).toContain("T2 11 in");
  });

  it("shows the approval record instead of the banner once approved", async () => {
    const pdf = await renderSpecSheetPdf(
      specInput({ approval: { name: "Robin Vale", at: "2026-04-30 14:05", revision: "R3" } }),
    );
    const text = await documentText(await openPdf(pdf));
    expect(text).toContain("APPROVED");
    expect(text).not.toContain("NOT APPROVED YET");
    expect(text).toContain("Robin Vale");
    expect(text).toContain("R3");
  });

  it("flows long tables onto more Letter pages and keeps every row", async () => {
    const many = Array.from({ length: 40 }, (_, i) => `Z${i + 1}`);
    const pdf = await renderSpecSheetPdf(
      specInput({
        sizeRun: many.map((size) => ({ size, quantity: 1 })),
        locations: ["Full front", "Full back", "Left sleeve"].map((label) =>
          location(label, many.map((size) => ({
            size,
            widthIn: 10,
            heightIn: 12,
            topIn: 3.5,
            fromCentreIn: -4,
            group: "S1",
          }))),
        ),
      }),
    );
    const doc = await openPdf(pdf);
    expect(doc.numPages).toBeGreaterThanOrEqual(4);
    for (const page of await pages(doc)) expect(page.view).toEqual([0, 0, 612, 792]);
    const text = await documentText(doc);
    for (const size of many)
      expect(text.match(new RegExp(`(^| )${size}( |$)`, "g"))!.length).toBeGreaterThanOrEqual(4);
    expect(text).toContain(`Page ${doc.numPages} of ${doc.numPages}`);
    expect(text).toContain("continued");
    expect(text).toContain("4 in left");
  });

  it("does not throw on client text with arrows, emoji, curly quotes or CJK, and prints ASCII stand-ins", async () => {
    const pdf = await renderSpecSheetPdf(
      specInput({
        jobTitle: "Front → back “final” 🎉👍🏽 design",
        clientName: "Zoë’s Café 東京 🇯🇵",
        garment: { style: "Tee — heavy ✓", colourName: "Ink ✕ blue", colourHex: "not a colour" },
        cautions: ["Keep ≥ 3 in from seams… ‘always’"],
        locations: [
          location("Left chest ★", [{ size: "M", widthIn: 3.5, heightIn: 3.5, topIn: 3, fromCentreIn: 4, group: "T1 → press 15 s" }]),
        ],
      }),
    );
    const text = await documentText(await openPdf(pdf));
    expect(text).toContain('Front -> back "final" design');
    expect(text).toContain("Zoë's Café ?");
    expect(text).toContain("Keep >= 3 in from seams... 'always'");
    expect(text).not.toContain("16 CFR 1120");
  });

  it("embeds readable thumbnails and survives unreadable ones", async () => {
    const pdf = await renderSpecSheetPdf(
      specInput({
        thumbnails: [
          { label: "Front mock-up", png: await solidPng("#22aa44", 400, 300) },
          { label: "Broken", png: Buffer.from("nope") },
        ],
      }),
    );
    const doc = await openPdf(pdf);
    let images = 0;
    for (const page of await pages(doc)) images += (await walk(page)).images.length;
    expect(images).toBe(1);
    const text = await documentText(doc);
    expect(text).toContain("Front mock-up");
    expect(text).toContain("Image could not be read");
  });

  it("uses DEFAULT_CAUTIONS when none are given", async () => {
    expect(DEFAULT_CAUTIONS.some((c) => c.includes("16 CFR 1120"))).toBe(true);
    expect(DEFAULT_CAUTIONS.some((c) => /ventilat/i.test(c))).toBe(true);
    expect(DEFAULT_CAUTIONS.some((c) => /burn/i.test(c))).toBe(true);
  });
});

describe("toWinAnsi", () => {
  it.each([
    ["A → B", "A -> B"],
    ["10 × 12", "10 x 12"],
    ["“quoted” ‘single’", "\"quoted\" 'single'"],
    ["en – em —", "en - em -"],
    ["wait…", "wait..."],
    ["party 🎉 time", "party time"],
    ["thumbs 👍🏽", "thumbs "],
    ["Zoë Café Ñandú", "Zoë Café Ñandú"],
    ["Łódź Őrs", "Lódz Ors"],
    ["ﬁne ｆｕｌｌ", "fine full"],
    ["東京", "?"],
    ["line\nbreak\ttab", "line break tab"],
    ["€5 ™ © ½", "€5 ™ © ½"],
  ])("%j → %j", (input, expected) => {
    expect(toWinAnsi(input)).toBe(expected);
  });

  it("gives text the standard Helvetica can always show (WinAnsiEncoding, ISO 32000-1 Annex D)", async () => {
    const { PDFDocument, StandardFonts } = await import("pdf-lib");
    const doc = await PDFDocument.create();
    const font = await doc.embedFont(StandardFonts.Helvetica);
    await fc.assert(
      fc.property(fc.string({ unit: "grapheme", maxLength: 40 }), (s) => {
        expect(() => font.encodeText(toWinAnsi(s))).not.toThrow();
      }),
      { numRuns: 300, seed: 7 },
    );
    const all =
      Array.from({ length: 0x250 }, (_, i) => String.fromCodePoint(i + 0x20)).join("") +
      "€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ→✓🎉";
    expect(() => font.encodeText(toWinAnsi(all))).not.toThrow();
  });
});

// ---------------------------------------------------------------------------------------

/** Chunks of a PNG file, in order (W3C PNG: 8-byte signature, then length, type, data, CRC). */
function pngChunks(png: Buffer): Array<{ type: string; data: Buffer }> {
  const chunks: Array<{ type: string; data: Buffer }> = [];
  let at = 8;
  while (at < png.length) {
    const length = png.readUInt32BE(at);
    const type = png.toString("latin1", at + 4, at + 8);
    chunks.push({ type, data: png.subarray(at + 8, at + 8 + length) });
    at += 12 + length;
  }
  return chunks;
}

function physOf(png: Buffer): { x: number; y: number; unit: number } {
  const phys = pngChunks(png).find((c) => c.type === "pHYs")!;
  return { x: phys.data.readUInt32BE(0), y: phys.data.readUInt32BE(4), unit: phys.data[8]! };
}

async function rawOf(png: Buffer) {
  const { data, info } = await sharp(png).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
  return { data, width: info.width, height: info.height };
}

describe("renderGangSheet", () => {
  let sheet: RenderGangSheetInput;
  beforeAll(async () => {
    sheet = {
      rollWidthIn: 4,
      sheet: {
        lengthIn: 3,
        placements: [
          { itemId: "red", x: 0.5, y: 0.5, widthIn: 1, heightIn: 1, rotated: false },
          { itemId: "halves", x: 2.5, y: 1, widthIn: 1, heightIn: 2, rotated: true },
          { itemId: "vector", x: 0.5, y: 2, widthIn: 1, heightIn: 0.5, rotated: false },
        ],
      },
      art: {
        red: { png: await solidPng("#ff0000", 37, 23) },
        halves: { png: await redBluePng(200, 100) },
        vector: {
          svg: `<svg xmlns="http://www.w3.org/2000/svg" width="20" height="10"><rect width="20" height="10" fill="#0000ff"/></svg>`,
        },
      },
    };
  });

  it("is (roll width × ppi) × (length × ppi) px with pHYs 11811 px/m at 300 ppi (W3C PNG; 300 / 0.0254)", async () => {
    expect(DEFAULT_GANG_PPI).toBe(300);
    const out = await renderGangSheet(sheet);
    expect([out.widthPx, out.heightPx]).toEqual([1200, 900]);
    const meta = await sharp(out.png).metadata();
    expect([meta.width, meta.height]).toEqual([1200, 900]);
    expect(meta.hasAlpha).toBe(true);
    expect(physOf(out.png)).toEqual({ x: 11811, y: 11811, unit: 1 });
    expect(Math.round(meta.density!)).toBe(300);
  });

  it("puts each piece's own colour where it was placed, at print resolution, and leaves the rest transparent", async () => {
    const img = await rawOf((await renderGangSheet(sheet)).png);
    const at = (x: number, y: number) => pixel(img, x, y);
    expect(at(50, 50)[3]).toBe(0);
    // The red 1 in square at (0.5, 0.5) in covers px 150…449 at 300 ppi.
    expect(at(149, 300)[3]).toBe(0);
    expect(at(150, 300)).toEqual([255, 0, 0, 255]);
    expect(at(449, 449)).toEqual([255, 0, 0, 255]);
    expect(at(450, 300)[3]).toBe(0);
    // SVG piece at (0.5, 2) in, 1 × 0.5 in.
    expect(at(300, 675)).toEqual([0, 0, 255, 255]);
    // Turned 90° clockwise: the art's left (red) half is now on top.
    expect(isRed(at(900, 450))).toBe(true);
    expect(isBlue(at(900, 750))).toBe(true);
    expect(at(740, 600)[3]).toBe(0);
  });

  it("writes a one-page PDF at true size with each piece drawn where it lies", async () => {
    const out = await renderGangSheet(sheet);
    const doc = await openPdf(out.pdf);
    expect(doc.numPages).toBe(1);
    const page = await doc.getPage(1);
    // 4 × 3 in at 72 pt per inch (ISO 32000).
    expect(page.view).toEqual([0, 0, 288, 216]);
    const { images } = await walk(page);
    expect(images).toHaveLength(3);
    expect(images[0]!.ctm).toEqual([72, 0, 0, 72, 36, 216 - 1.5 * 72]);
    expect([images[0]!.widthPx, images[0]!.heightPx]).toEqual([300, 300]);
    expect(images[1]!.ctm).toEqual([72, 0, 0, 144, 2.5 * 72, 0]);
    const img = await renderPage(page, 1);
    expect(isRed(pixel(img, 72, 72))).toBe(true);
    expect(isBlue(pixel(img, 72, 2.25 * 72))).toBe(true);
  });

  it("writes the same pixels whatever the strip height, composites touching pieces, and reports progress up to 1", async () => {
    const busy: RenderGangSheetInput = {
      ...sheet,
      sheet: {
        lengthIn: 3,
        placements: [
          ...sheet.sheet.placements,
          // Two pieces that overlap (composited by sharp) and a half-transparent one.
          { itemId: "red", x: 1.7, y: 0.2, widthIn: 0.6, heightIn: 0.6, rotated: false },
          { itemId: "vector", x: 2, y: 0.5, widthIn: 0.8, heightIn: 0.4, rotated: true },
          { itemId: "glass", x: 1.6, y: 1.2, widthIn: 0.7, heightIn: 1.1, rotated: false },
        ],
      },
      art: { ...sheet.art, glass: { png: await solidPng("#33cc6680", 16, 16) } },
    };
    const whole = await renderGangSheet({ ...busy, stripPixels: 1200 * 900 });
    const steps: number[] = [];
    const strips = await renderGangSheet({ ...busy, stripPixels: 1200 * 70, onProgress: (f) => steps.push(f) });
    expect([strips.widthPx, strips.heightPx]).toEqual([1200, 900]);
    expect(physOf(strips.png)).toEqual({ x: 11811, y: 11811, unit: 1 });
    const a = await rawOf(whole.png);
    const b = await rawOf(strips.png);
    expect(b.data.length).toBe(a.data.length);
    // Opaque and clear pixels match exactly; sharp's compositing may move a half-transparent one by 1/255.
    let worst = 0;
    let mismatchedOpaque = 0;
    for (let i = 0; i < a.data.length; i += 4) {
      for (let c = 0; c < 4; c++) worst = Math.max(worst, Math.abs(a.data[i + c]! - b.data[i + c]!));
      if (a.data[i + 3] === 255 && !a.data.subarray(i, i + 4).equals(b.data.subarray(i, i + 4)))
        mismatchedOpaque += 1;
    }
    expect(worst).toBeLessThanOrEqual(1);
    expect(mismatchedOpaque).toBe(0);
    // The overlap: the later piece (vector, blue) is on top where both lie, as sharp composites in order.
    expect(isBlue(pixel(b, 2.1 * 300, 0.6 * 300))).toBe(true);
    expect(pixel(b, (1.6 + 0.35) * 300, (1.2 + 0.5) * 300)[3]).toBeCloseTo(128, -1);
    expect(steps.length).toBeGreaterThan(5);
    expect(steps.at(-1)).toBe(1);
    for (let i = 1; i < steps.length; i++) expect(steps[i]!).toBeGreaterThanOrEqual(steps[i - 1]!);
  });

  it("draws every sheet of an order: a PDF page per sheet at its own length, and a PNG per sheet", async () => {
    const order = {
      rollWidthIn: 4,
      ppi: 100,
      art: sheet.art,
      sheets: [
        { lengthIn: 3, placements: [{ itemId: "red", x: 0.5, y: 0.5, widthIn: 1, heightIn: 1, rotated: false }, { itemId: "red", x: 2, y: 0.5, widthIn: 1, heightIn: 1, rotated: false }] },
        { lengthIn: 2, placements: [{ itemId: "vector", x: 0, y: 0, widthIn: 2, heightIn: 1, rotated: false }] },
        { lengthIn: 1.5, placements: [{ itemId: "red", x: 3, y: 0.5, widthIn: 1, heightIn: 1, rotated: false }, { itemId: "halves", x: 0, y: 0, widthIn: 2, heightIn: 1, rotated: false }] },
      ],
    };
    const pdfSteps: number[] = [];
    const doc = await openPdf(await renderGangSheetPdf({ ...order, onProgress: (f) => pdfSteps.push(f) }));
    expect(doc.numPages).toBe(3);
    const drawn: number[] = [];
    for (let n = 1; n <= 3; n += 1) {
      const page = await doc.getPage(n);
      // 4 in × the sheet's length at 72 pt per inch (ISO 32000).
      expect(page.view).toEqual([0, 0, 288, order.sheets[n - 1]!.lengthIn * 72]);
      drawn.push((await walk(page)).images.length);
    }
    // Every piece on every sheet is drawn: the pieces add up to the order.
    expect(drawn).toEqual([2, 1, 2]);
    expect(pdfSteps.at(-1)).toBe(1);

    const pngs = await renderGangSheetPngs(order);
    expect(pngs).toHaveLength(3);
    const sizes = await Promise.all(pngs.map(async (png) => { const m = await sharp(png).metadata(); return [m.width, m.height]; }));
    expect(sizes).toEqual([[400, 300], [400, 200], [400, 150]]);
    for (const png of pngs) expect(physOf(png)).toEqual({ x: 3937, y: 3937, unit: 1 }); // 100 / 0.0254, rounded
    const third = await rawOf(pngs[2]!);
    expect(pixel(third, 350, 100)).toEqual([255, 0, 0, 255]);
    expect(isRed(pixel(third, 50, 50))).toBe(true);
    expect(isBlue(pixel(third, 150, 50))).toBe(true);
    expect(pixel(third, 250, 20)[3]).toBe(0);
  });

  it("names the sheet when a later sheet has a placement off it", async () => {
    await expect(
      renderGangSheetPngs({
        rollWidthIn: 4,
        art: sheet.art,
        sheets: [
          { lengthIn: 2, placements: [] },
          { lengthIn: 2, placements: [{ itemId: "red", x: 3.5, y: 0, widthIn: 1, heightIn: 1, rotated: false }] },
        ],
      }),
    ).rejects.toThrow(/Placement 1 \(red\) on sheet 2 runs off the 4 x 2 in sheet/);
  });

  it("guards memory: strips of a few megapixels, refusal above the hard cap, before any drawing", async () => {
    expect(STRIP_PIXELS).toBeLessThanOrEqual(4_000_000);
    const steps: number[] = [];
    // 24 × 2,000 in at 300 ppi = 4.32 gigapixels.
    await expect(
      renderGangSheet({ rollWidthIn: 24, sheet: { lengthIn: 2000, placements: [] }, art: {}, onProgress: (f) => steps.push(f) }),
    ).rejects.toThrow(/megapixel limit/);
    // Refused before any work: not even the first progress step was reported.
    expect(steps).toEqual([]);
    expect(MAX_SHEET_PIXELS).toBeLessThan(1_000_000_000);
  });

  it("uses UserUnit for pages past 14,400 units (ISO 32000-1 Annex C) and keeps true size", async () => {
    const out = await renderGangSheet({
      rollWidthIn: 22,
      ppi: 4,
      sheet: {
        lengthIn: 250,
        placements: [{ itemId: "red", x: 1, y: 200, widthIn: 10, heightIn: 10, rotated: false }],
      },
      art: { red: sheet.art.red! },
    });
    const page = await (await openPdf(out.pdf)).getPage(1);
    expect(page.userUnit).toBe(2);
    const viewport = page.getViewport({ scale: 1 });
    expect(viewport.width).toBeCloseTo(22 * 72, 6);
    expect(viewport.height).toBeCloseTo(250 * 72, 6);
    expect([out.widthPx, out.heightPx]).toEqual([88, 1000]);
  });

  it("refuses missing art and placements off the sheet", async () => {
    await expect(renderGangSheet({ ...sheet, art: { red: sheet.art.red! } })).rejects.toThrow(
      /No art was supplied for item "halves"/,
    );
    await expect(
      renderGangSheet({
        ...sheet,
        sheet: {
          lengthIn: 3,
          placements: [{ itemId: "red", x: 3.5, y: 0, widthIn: 1, heightIn: 1, rotated: false }],
        },
      }),
    ).rejects.toThrow(RangeError);
  });
});

// ---------------------------------------------------------------------------------------
// Labels off the art.
//
// The art's rectangle on a page is read from the PDF itself: the clip the art image is drawn
// through. Text boxes come from pdf.js's text content (ISO 32000 9.4.4: each run's text matrix
// gives its baseline origin and size, and pdf.js reports the run's advance width); each box runs
// from a quarter of the size below the baseline to a full size above it, more than any
// Helvetica glyph reaches (ascender 718, descender 207 per 1000 em, Adobe's Helvetica AFM).

type TextBox = Box & { str: string };

async function textBoxes(page: PdfPage): Promise<TextBox[]> {
  const content = await page.getTextContent();
  return content.items.flatMap((item) => {
    if (!("str" in item) || item.str.trim() === "") return [];
    const [, , c, d, e, f] = item.transform as Matrix;
    const size = Math.hypot(c, d);
    return [{ str: item.str, x0: e, x1: e + item.width, y0: f - 0.25 * size, y1: f + size }];
  });
}

/** Whether two boxes share any area (touching edges, within `slack` pt, do not count). */
function overlaps(a: Box, b: Box, slack = 0.01): boolean {
  return a.x0 < b.x1 - slack && b.x0 < a.x1 - slack && a.y0 < b.y1 - slack && b.y0 < a.y1 - slack;
}

function inside(inner: Box, outer: Box, slack = 0.01): boolean {
  return (
    inner.x0 >= outer.x0 - slack &&
    inner.y0 >= outer.y0 - slack &&
    inner.x1 <= outer.x1 + slack &&
    inner.y1 <= outer.y1 + slack
  );
}

/**
 * The strips a page shares with its neighbours, inside its art rectangle (PDF y up): each is
 * `overlap` deep along the edge facing that neighbour on the taped sheet, as tiling says.
 */
function sharedStrips(art: Box, joins: TilePlan["tiles"][number]["joins"], overlapPt: number): Box[] {
  if (overlapPt <= 0) return [];
  const strips: Box[] = [];
  if (joins.left) strips.push({ ...art, x1: art.x0 + overlapPt });
  if (joins.right) strips.push({ ...art, x0: art.x1 - overlapPt });
  if (joins.above) strips.push({ ...art, y0: art.y1 - overlapPt });
  if (joins.below) strips.push({ ...art, y1: art.y0 + overlapPt });
  return strips;
}

describe("test print labels stay off the art", () => {
  let art: Buffer;
  beforeAll(async () => {
    art = await solidPng("#00a050", 40, 40);
  });

  const TITLE = "Maple Street 5K volunteer tees · Full front · size XS · T1";

  // Paper sizes: Letter 8.5 × 11 in and Tabloid 11 × 17 in (ANSI/ASME Y14.1 sizes A and B); A4 210 × 297 mm
  // and A3 297 × 420 mm (ISO 216). Margins 0.25 in and overlap 0.5 in unless a row says otherwise (our defaults).
  it.each([
    { name: "Letter, 11 × 14 in, print area and collar line", paper: "letter", artWidthIn: 11, artHeightIn: 14, guides: true },
    // Exactly a Letter page's printable area (8.5 − 0.5 by 11 − 0.5): the art that the old panels covered most.
    { name: "Letter, 8 × 10.5 in", paper: "letter", artWidthIn: 8, artHeightIn: 10.5 },
    { name: "Letter, 4 × 3 in, one page", paper: "letter", artWidthIn: 4, artHeightIn: 3 },
    { name: "Letter, 20 × 30 in, mirrored", paper: "letter", artWidthIn: 20, artHeightIn: 30, mirror: true },
    { name: "Letter, 12 × 9 in, no overlap", paper: "letter", artWidthIn: 12, artHeightIn: 9, overlapIn: 0 },
    { name: "Letter, 5 × 5 in, 2.5 in margins (labels stacked)", paper: "letter", artWidthIn: 5, artHeightIn: 5, marginIn: 2.5 },
    { name: "A4, 20 × 20 in, mirrored, print area", paper: "a4", artWidthIn: 20, artHeightIn: 20, mirror: true, guides: true },
    { name: "A4, 8 × 11 in", paper: "a4", artWidthIn: 8, artHeightIn: 11 },
    { name: "Tabloid, 16 × 24 in", paper: "tabloid", artWidthIn: 16, artHeightIn: 24 },
    { name: "A3, 12 × 16 in, 1 in overlap", paper: "a3", artWidthIn: 12, artHeightIn: 16, overlapIn: 1 },
  ] as Array<Partial<TestPrintInput> & { name: string; paper: PaperId; guides?: boolean }>)(
    "$name: no word or scale bar on the art, and nothing filled on it but the shared strips",
    async ({ name, guides, ...options }) => {
      void name;
      const { pdf, plan } = await renderTestPrintPdf({
        title: TITLE,
        art: { png: art },
        ...options,
        ...(guides
          ? {
              printArea: { widthIn: 12, heightIn: 16, offsetXIn: -0.5, offsetYIn: 1 },
              collarLineYIn: 2,
            }
          : {}),
      } as TestPrintInput);
      expect(plan.labelBandIn).toBeGreaterThan(0);
      expect(tileCoverage(plan).insidePrintable).toBe(true);
      const doc = await openPdf(pdf);
      expect(doc.numPages).toBe(plan.pages);
      const m = plan.marginIn * 72;
      const printable: Box = { x0: m, y0: m, x1: plan.pageWidthIn * 72 - m, y1: plan.pageHeightIn * 72 - m };
      const all = await pages(doc);
      for (const [i, page] of all.entries()) {
        const tile = plan.tiles[i]!;
        const { filled, images } = await walk(page);
        expect(images).toHaveLength(1);
        const artBox = images[0]!.clip!;
        // The art is where the plan put it, at true size (72 pt per inch, ISO 32000).
        expect(artBox.x1 - artBox.x0).toBeCloseTo(tile.artWidth * 72, 3);
        expect(artBox.y1 - artBox.y0).toBeCloseTo(tile.artHeight * 72, 3);

        const texts = await textBoxes(page);
        expect(texts.map((t) => t.str).join(" ")).toContain(tile.label);
        for (const t of texts) {
          expect(overlaps(t, artBox), `page ${tile.label}: "${t.str}" over the art`).toBe(false);
          expect(inside(t, printable), `page ${tile.label}: "${t.str}" in the printable area`).toBe(true);
        }
        const bars = [...barsOfLength(filled, 72), ...barsOfLength(filled, (5 / 2.54) * 72)];
        expect(bars).toHaveLength(2);
        for (const bar of bars) expect(overlaps(bar, artBox), `page ${tile.label}: scale bar`).toBe(false);

        const strips = sharedStrips(artBox, tile.joins, plan.overlapIn * 72);
        for (const box of filled) {
          if (!overlaps(box, artBox)) continue;
          expect(
            strips.some((s) => inside(box, s)),
            `page ${tile.label}: a filled shape at ${JSON.stringify(box)} on the art is not a shared strip`,
          ).toBe(true);
        }
      }
    },
  );

  it("gives an art as big as a whole printable area a second page rather than printing over it", async () => {
    // Letter portrait's printable area is 8 × 10.5 in (ANSI/ASME Y14.1, 0.25 in margins); once the band
    // is taken, 10.5 in down needs ceil((10.5 − 0.5) / (10.5 − band − 0.5)) = 2 rows.
    const { plan } = await renderTestPrintPdf({
      title: TITLE,
      art: { png: art },
      artWidthIn: 8,
      artHeightIn: 10.5,
      paper: "letter",
      orientation: "portrait",
    });
    expect(plan.artAreaHeightIn).toBeCloseTo(10.5 - plan.labelBandIn, 9);
    expect([plan.columns, plan.rows]).toEqual([1, 2]);
  });

  // The raster check: art of one solid colour, rendered by pdf.js at 144 px per inch (scale 2 of
  // 72 pt per inch, ISO 32000). Every pixel inside the art's rectangle must be the art's own colour,
  // except in the shared strips, which are tinted on purpose and carry the round targets.
  it.each([
    { name: "Letter, 6 × 4 in, one page", paper: "letter" as PaperId, artWidthIn: 6, artHeightIn: 4 },
    { name: "Letter, 11 × 14 in, 4 pages", paper: "letter" as PaperId, artWidthIn: 11, artHeightIn: 14 },
    { name: "A4, 8 × 10.5 in, mirrored", paper: "a4" as PaperId, artWidthIn: 8, artHeightIn: 10.5, mirror: true },
  ])("$name: every art pixel outside the shared strips is the art's colour", async (options) => {
    const colour = [0, 160, 80];
    const { pdf, plan } = await renderTestPrintPdf({ title: TITLE, art: { png: art }, ...options });
    const doc = await openPdf(pdf);
    const scale = 2;
    const px = (inches: number) => inches * 72 * scale;
    const ov = px(plan.overlapIn);
    // Edges are anti-aliased: stay 2 px (1/72 in) inside the art and clear of the strips.
    const edge = 2;
    for (const [i, page] of (await pages(doc)).entries()) {
      const tile = plan.tiles[i]!;
      const img = await renderPage(page, scale);
      const x0 = px(tile.pageX) + edge + (tile.joins.left ? ov : 0);
      const x1 = px(tile.pageX + tile.artWidth) - edge - (tile.joins.right ? ov : 0);
      const y0 = px(tile.pageY) + edge + (tile.joins.above ? ov : 0);
      const y1 = px(tile.pageY + tile.artHeight) - edge - (tile.joins.below ? ov : 0);
      let checked = 0;
      const wrong: string[] = [];
      for (let y = Math.ceil(y0); y < y1; y++) {
        for (let x = Math.ceil(x0); x < x1; x++) {
          checked += 1;
          const p = pixel(img, x, y);
          if (p.slice(0, 3).some((v, c) => Math.abs(v - colour[c]!) > 3) && wrong.length < 5)
            wrong.push(`(${x}, ${y}) is ${p.join(",")}`);
        }
      }
      expect(checked).toBeGreaterThan(1000);
      expect(wrong, `page ${tile.label}`).toEqual([]);
      // The labels are on the page all the same: dark pixels in the band below the art area.
      let dark = 0;
      for (let y = Math.ceil(px(plan.marginIn + plan.artAreaHeightIn)); y < px(plan.pageHeightIn - plan.marginIn); y++)
        for (let x = 0; x < img.width; x++) if (pixel(img, x, y).slice(0, 3).every((v) => v < 60)) dark += 1;
      expect(dark, `page ${tile.label}: labels in the band`).toBeGreaterThan(500);
    }
  });
});

describe("test print titles", () => {
  let fonts: { regular: PDFFont; bold: PDFFont };
  beforeAll(async () => {
    const { PDFDocument, StandardFonts } = await import("pdf-lib");
    const doc = await PDFDocument.create();
    fonts = {
      regular: await doc.embedFont(StandardFonts.Helvetica),
      bold: await doc.embedFont(StandardFonts.HelveticaBold),
    };
  });
  const widthOf = (t: string, size = 7.5) => fonts.regular.widthOfTextAtSize(t, size);

  it.each([
    { title: "Maple Street 5K volunteer tees · Full front · size XS · T1", width: 90 },
    { title: "Maple Street 5K volunteer tees · Full front · size XS · T1", width: 150 },
    { title: "Harbour Lane spring open day staff and volunteers · Left chest · size 3XL · T2", width: 60 },
  ])("wraps $title at $width pt only between words, and no line starts with a separator", ({ title, width }) => {
    const lines = wrapAtWords(title, fonts.regular, 7.5, width);
    expect(lines.length).toBeGreaterThan(1);
    expect(lines.join(" ")).toBe(title);
    for (const line of lines) {
      expect(widthOf(line)).toBeLessThanOrEqual(width);
      expect(line).not.toMatch(/^·/);
    }
  });

  it("cuts a word longer than a line with a hyphen, and only that word", () => {
    const word = "Pneumonoultramicroscopicsilicovolcanoconiosis";
    const title = `Crew ${word} tees · size M`;
    const lines = wrapAtWords(title, fonts.regular, 7.5, 60);
    expect(lines[0]).toBe("Crew");
    expect(lines.filter((l) => l.endsWith("-")).length).toBeGreaterThan(1);
    // Put back together: a piece ending in "-" runs on into the next line, any other line ends at a space.
    const rebuilt = lines.map((l, i) => (i === lines.length - 1 ? l : l.endsWith("-") ? l.slice(0, -1) : `${l} `));
    expect(rebuilt.join("")).toBe(title);
    for (const line of lines) expect(widthOf(line)).toBeLessThanOrEqual(60);
    // Only the long word was cut: every other word is whole on one line.
    for (const w of ["Crew", "tees", "size", "M"]) expect(lines.some((l) => l.split(" ").includes(w))).toBe(true);
  });

  it(`stops after ${TITLE_MAX_LINES} lines with "..." after a whole word`, () => {
    const title = Array.from({ length: 60 }, (_, i) => `word${i + 1}`).join(" ");
    const lines = titleLines(title, fonts.regular, 7.5, 150);
    expect(lines).toHaveLength(TITLE_MAX_LINES);
    const shown = lines.join(" ");
    expect(shown).toMatch(/word\d+\.\.\.$/);
    const before = shown.replace(/\.\.\.$/, "");
    expect(title.startsWith(before)).toBe(true);
    expect(title[before.length]).toBe(" ");
    for (const line of lines) expect(widthOf(line)).toBeLessThanOrEqual(150);
  });

  it("prints a long title whole, over several lines broken between words", async () => {
    const title =
      "Maple Street 5K volunteer tees for the spring harbour open day and the autumn river run · Full front · size XS · T1";
    const { pdf } = await renderTestPrintPdf({
      title,
      art: { png: await solidPng("#00a050") },
      artWidthIn: 6,
      artHeightIn: 4,
      paper: "a4",
    });
    const page = await (await openPdf(pdf)).getPage(1);
    const runs = (await textBoxes(page)).map((t) => t.str);
    expect(runs).not.toContain(title);
    const titleRuns = runs.filter((r) => title.includes(r) && r.length > 10);
    expect(titleRuns.length).toBeGreaterThan(1);
    expect(titleRuns.join(" ")).toBe(title);
  });
});
