import "server-only";
import { once } from "node:events";
import { availableParallelism } from "node:os";
import { crc32, createDeflate } from "node:zlib";
import { PDFDocument, PDFName, PDFNumber, type PDFPage, type PDFRef } from "pdf-lib";
import sharp, { type Metadata, type OverlayOptions, type Sharp } from "sharp";
import { PDF_UNITS_PER_INCH, formatCount } from "@/lib/units";
import { drawClippedImage, embedRgbaPixelsAsync } from "./test-print";

/**
 * Print-ready gang sheet files: every packed sheet composited from the ORIGINAL art at print
 * resolution, as one transparent PNG per sheet (pHYs = ppi, W3C PNG specification) and as one
 * PDF with a page per sheet at true size (roll width × sheet length at 72 pt per inch, ISO 32000).
 *
 * Coordinates are inches from the sheet's top-left, x across the roll, y down its length,
 * as `packGangSheet` lays them out. A placement's width × height is as laid on the sheet;
 * `rotated` means the piece's own art is turned 90° clockwise to get there.
 *
 * Speed and memory: each distinct piece (item, pixel size, turn) is drawn once as RGBA for the
 * whole order and shared by every sheet; in the PDF it is one image drawn on every page that
 * holds it. PNG sheets are written in horizontal strips straight into zlib (filter type None,
 * a fast level), several sheets at once on the thread pool, so no sheet is ever held whole as
 * pixels. In a strip where no pieces touch (the packer keeps a gap between them) each piece's
 * rows are copied as they are; otherwise sharp composites the strip. A piece's raster is
 * dropped once every sheet that uses it is written. Sheets over MAX_SHEET_PIXELS are refused.
 */

export type GangArt = { png: Buffer } | { svg: string };

export interface GangSheetPlacementInput {
  itemId: string;
  x: number;
  y: number;
  widthIn: number;
  heightIn: number;
  rotated: boolean;
}

export interface GangSheetLayout {
  lengthIn: number;
  placements: GangSheetPlacementInput[];
}

export interface RenderGangSheetsInput {
  sheets: GangSheetLayout[];
  rollWidthIn: number;
  /** Print resolution, pixels per inch; default DEFAULT_GANG_PPI. */
  ppi?: number;
  /** Art per item id. */
  art: Record<string, GangArt>;
  /** Called with 0…1 as the work goes on, ending with 1. */
  onProgress?: (fraction: number) => void;
  /** Pixels per strip when writing PNG sheets; default STRIP_PIXELS (a tuning knob for tests). */
  stripPixels?: number;
}

/** One sheet, both files: kept for callers and tests that want a single sheet. */
export interface RenderGangSheetInput extends Omit<RenderGangSheetsInput, "sheets"> {
  sheet: GangSheetLayout;
}

export interface RenderGangSheetResult {
  png: Buffer;
  pdf: Uint8Array;
  widthPx: number;
  heightPx: number;
}

/** The usual DTF print resolution (common practice, no published source). */
export const DEFAULT_GANG_PPI = 300;
/** Highest ppi we render at (our own bound; DTF printers do not resolve more). */
export const MAX_GANG_PPI = 1200;
/** Largest sheet we render at all (our own bound; keeps the PNG under Node's 4 GB buffer limit even for noise). */
export const MAX_SHEET_PIXELS = 900_000_000;
/** Pixels per strip when writing a PNG (our own bound, 8 MB of RGBA: small enough to stay in cache-friendly chunks). */
export const STRIP_PIXELS = 2_000_000;
/** zlib level for PNG sheets: 3 is as fast as 1 on flat art and smaller (measured in `npm run bench`). */
const PNG_ZLIB_LEVEL = 3;
/** zlib level for the PDF's images (each distinct piece once, so a better ratio costs little). */
const PDF_ZLIB_LEVEL = 6;
/** Largest source raster we decode (our own bound, the same as the upload pixel cap times two). */
const MAX_SOURCE_PIXELS = 200_000_000;
/** ISO 32000-1 Annex C: page sides beyond 14,400 default units need UserUnit. */
const MAX_PAGE_UNITS = 14_400;
/** Slack for placements touching the sheet edge, inches (far below a printer's dot). */
const EDGE_EPS = 1e-6;

interface PixelRect {
  left: number;
  top: number;
  width: number;
  height: number;
}

interface Job {
  index: number;
  key: string;
  itemId: string;
  rotated: boolean;
  rect: PixelRect;
  inches: GangSheetPlacementInput;
}

function requirePositive(value: number, what: string): void {
  if (!Number.isFinite(value) || value <= 0)
    throw new RangeError(`${what} must be a finite number more than 0 (got ${value}).`);
}

/** Pixel rectangle of a placement: edges rounded on their own, so neighbours never drift apart. */
function pixelRect(p: GangSheetPlacementInput, ppi: number, widthPx: number, heightPx: number): PixelRect {
  const left = Math.min(widthPx - 1, Math.max(0, Math.round(p.x * ppi)));
  const top = Math.min(heightPx - 1, Math.max(0, Math.round(p.y * ppi)));
  const right = Math.min(widthPx, Math.max(left + 1, Math.round((p.x + p.widthIn) * ppi)));
  const bottom = Math.min(heightPx, Math.max(top + 1, Math.round((p.y + p.heightIn) * ppi)));
  return { left, top, width: right - left, height: bottom - top };
}

/** The art drawn at `width` × `height` px (the piece's own orientation), RGBA 8-bit. */
async function rasterise(art: GangArt, width: number, height: number, itemId: string): Promise<Buffer> {
  let pipeline: Sharp;
  if ("png" in art) {
    pipeline = sharp(art.png, { limitInputPixels: MAX_SOURCE_PIXELS, failOn: "error" });
  } else {
    const svg = Buffer.from(art.svg, "utf8");
    let meta: Metadata;
    try {
      meta = await sharp(svg).metadata();
    } catch {
      throw new Error(`The SVG art for item "${itemId}" could not be read.`);
    }
    const scale = Math.max(width / (meta.width || width), height / (meta.height || height));
    pipeline = sharp(svg, {
      density: Math.min(100_000, Math.max(1, 72 * scale)),
      limitInputPixels: MAX_SOURCE_PIXELS,
    });
  }
  try {
    return await pipeline
      .resize(width, height, { fit: "fill" })
      .toColourspace("srgb")
      .ensureAlpha()
      .raw({ depth: "uchar" })
      .toBuffer();
  } catch {
    throw new Error(`The art for item "${itemId}" could not be drawn at ${width} x ${height} px.`);
  }
}

/** Fully transparent pixels get colour 0 too, as a sharp composite leaves them, so both render paths agree. */
function clearTransparent(rgba: Buffer): Buffer {
  for (let i = 3; i < rgba.length; i += 4) {
    if (rgba[i] === 0) {
      rgba[i - 3] = 0;
      rgba[i - 2] = 0;
      rgba[i - 1] = 0;
    }
  }
  return rgba;
}

/** The piece as laid on the sheet: rasterised in its own orientation, then turned 90° clockwise if rotated. */
async function pieceRaster(art: GangArt, job: Job): Promise<Buffer> {
  const { width, height } = job.rect;
  if (!job.rotated) return clearTransparent(await rasterise(art, width, height, job.itemId));
  const own = await rasterise(art, height, width, job.itemId);
  return clearTransparent(
    await sharp(own, { raw: { width: height, height: width, channels: 4 } })
      .rotate(90)
      .raw()
      .toBuffer(),
  );
}

function intersects(a: PixelRect, b: PixelRect): boolean {
  return (
    a.left < b.left + b.width &&
    b.left < a.left + a.width &&
    a.top < b.top + b.height &&
    b.top < a.top + a.height
  );
}

// ---------------------------------------------------------------------------------------
// Sheets checked and laid out in pixels

interface SheetPixels {
  number: number;
  lengthIn: number;
  widthPx: number;
  heightPx: number;
  jobs: Job[];
}

interface Prepared {
  ppi: number;
  rollWidthIn: number;
  sheets: SheetPixels[];
}

function prepare(input: RenderGangSheetsInput): Prepared {
  const ppi = input.ppi ?? DEFAULT_GANG_PPI;
  requirePositive(ppi, "The resolution (ppi)");
  if (ppi > MAX_GANG_PPI)
    throw new RangeError(`The resolution must be at most ${MAX_GANG_PPI} ppi (got ${ppi}).`);
  requirePositive(input.rollWidthIn, "The roll width");
  if (input.sheets.length === 0) throw new RangeError("There are no sheets to draw.");
  const several = input.sheets.length > 1;
  const sheets = input.sheets.map((sheet, s): SheetPixels => {
    const where = several ? ` on sheet ${s + 1}` : "";
    requirePositive(sheet.lengthIn, `The length of sheet ${s + 1}`);
    const widthPx = Math.round(input.rollWidthIn * ppi);
    const heightPx = Math.round(sheet.lengthIn * ppi);
    if (widthPx < 1 || heightPx < 1)
      throw new RangeError("The sheet is smaller than one pixel at this resolution.");
    const total = widthPx * heightPx;
    if (total > MAX_SHEET_PIXELS) {
      throw new RangeError(
        `${several ? `Sheet ${s + 1}` : "This sheet"} would be ${formatCount(widthPx)} x ${formatCount(heightPx)} px (${Math.round(total / 1e6)} megapixels), over the ${MAX_SHEET_PIXELS / 1e6} megapixel limit. Split it into shorter sheets or lower the resolution.`,
      );
    }
    const jobs = sheet.placements.map((p, index): Job => {
      const name = `Placement ${index + 1} (${p.itemId})${where}`;
      requirePositive(p.widthIn, `The width of placement ${index + 1} (${p.itemId})${where}`);
      requirePositive(p.heightIn, `The height of placement ${index + 1} (${p.itemId})${where}`);
      if (!Number.isFinite(p.x) || !Number.isFinite(p.y)) throw new RangeError(`${name} has no position.`);
      if (
        p.x < -EDGE_EPS ||
        p.y < -EDGE_EPS ||
        p.x + p.widthIn > input.rollWidthIn + EDGE_EPS ||
        p.y + p.heightIn > sheet.lengthIn + EDGE_EPS
      ) {
        throw new RangeError(`${name} runs off the ${input.rollWidthIn} x ${sheet.lengthIn} in sheet.`);
      }
      if (!Object.hasOwn(input.art, p.itemId)) throw new Error(`No art was supplied for item "${p.itemId}".`);
      const rect = pixelRect(p, ppi, widthPx, heightPx);
      return {
        index,
        key: `${p.itemId}\u0000${rect.width}x${rect.height}\u0000${p.rotated ? 1 : 0}`,
        itemId: p.itemId,
        rotated: p.rotated,
        rect,
        inches: p,
      };
    });
    return { number: s + 1, lengthIn: sheet.lengthIn, widthPx, heightPx, jobs };
  });
  return { ppi, rollWidthIn: input.rollWidthIn, sheets };
}

/**
 * Distinct piece rasters for the whole order: each drawn once, on first use, and dropped when
 * the last sheet that holds it says it is done with it.
 */
class PieceStore {
  private readonly pending = new Map<string, Promise<Buffer>>();
  private readonly users = new Map<string, number>();

  constructor(
    private readonly art: Record<string, GangArt>,
    sheets: SheetPixels[],
  ) {
    for (const sheet of sheets)
      for (const key of new Set(sheet.jobs.map((j) => j.key))) this.users.set(key, (this.users.get(key) ?? 0) + 1);
  }

  get(job: Job): Promise<Buffer> {
    let raster = this.pending.get(job.key);
    if (!raster) {
      raster = pieceRaster(this.art[job.itemId]!, job);
      this.pending.set(job.key, raster);
    }
    return raster;
  }

  /** The sheet no longer needs its pieces. */
  release(sheet: SheetPixels): void {
    for (const key of new Set(sheet.jobs.map((j) => j.key))) {
      const left = (this.users.get(key) ?? 1) - 1;
      this.users.set(key, left);
      if (left <= 0) this.pending.delete(key);
    }
  }
}

/** Runs `work` over `items` with at most `limit` at once, in order of start. */
async function eachLimited<T>(items: readonly T[], limit: number, work: (item: T, index: number) => Promise<void>): Promise<void> {
  let next = 0;
  const runners = Array.from({ length: Math.max(1, Math.min(limit, items.length)) }, async () => {
    while (next < items.length) {
      const i = next;
      next += 1;
      await work(items[i]!, i);
    }
  });
  await Promise.all(runners);
}

/** Sheets or pieces worked on at once: the thread pool does the heavy part, so two per core. */
const PARALLEL = Math.max(2, Math.min(8, 2 * availableParallelism()));

function progressReporter(onProgress: ((f: number) => void) | undefined) {
  let last = 0;
  return (f: number) => {
    const value = Math.min(1, Math.max(last, f));
    last = value;
    onProgress?.(value);
  };
}

// ---------------------------------------------------------------------------------------
// PDF: a page per sheet

/**
 * The whole order as one PDF: a page per sheet at true size, in order. Each distinct piece is
 * one image, drawn on every page where it lies.
 */
export async function renderGangSheetPdf(input: RenderGangSheetsInput): Promise<Uint8Array> {
  const prepared = prepare(input);
  const progress = progressReporter(input.onProgress);
  progress(0);
  const doc = await PDFDocument.create();
  doc.setCreator("Chalkline");
  doc.setProducer("Chalkline");
  const count = prepared.sheets.length;
  doc.setTitle(`Gang sheet${count > 1 ? `s, ${count} sheets` : ""} on a ${prepared.rollWidthIn} in roll`);

  // Every distinct piece, drawn and compressed once, several at a time on the thread pool.
  const distinct = new Map<string, Job>();
  for (const sheet of prepared.sheets) for (const job of sheet.jobs) if (!distinct.has(job.key)) distinct.set(job.key, job);
  const pieces = [...distinct.values()];
  const weight = pieces.reduce((n, j) => n + j.rect.width * j.rect.height, 0) || 1;
  const refs = new Map<string, PDFRef>();
  let done = 0;
  await eachLimited(pieces, PARALLEL, async (job) => {
    const raster = await pieceRaster(input.art[job.itemId]!, job);
    refs.set(job.key, await embedRgbaPixelsAsync(doc, raster, job.rect.width, job.rect.height, PDF_ZLIB_LEVEL));
    done += job.rect.width * job.rect.height;
    progress((0.85 * done) / weight);
  });

  for (const sheet of prepared.sheets) {
    const trueW = prepared.rollWidthIn * PDF_UNITS_PER_INCH;
    const trueH = sheet.lengthIn * PDF_UNITS_PER_INCH;
    const userUnit = Math.max(1, Math.ceil(Math.max(trueW, trueH) / MAX_PAGE_UNITS));
    const page: PDFPage = doc.addPage([trueW / userUnit, trueH / userUnit]);
    if (userUnit > 1) page.node.set(PDFName.of("UserUnit"), PDFNumber.of(userUnit));
    const unit = PDF_UNITS_PER_INCH / userUnit;
    const pageH = trueH / userUnit;
    for (const job of sheet.jobs) {
      const { x, y, widthIn, heightIn } = job.inches;
      drawClippedImage(
        page,
        refs.get(job.key)!,
        { a: widthIn * unit, d: heightIn * unit, e: x * unit, f: pageH - (y + heightIn) * unit },
        { x: x * unit, y: pageH - (y + heightIn) * unit, width: widthIn * unit, height: heightIn * unit },
      );
    }
  }
  progress(0.9);
  const pdf = await doc.save({ useObjectStreams: false });
  progress(1);
  return pdf;
}

// ---------------------------------------------------------------------------------------
// PNG: a file per sheet, written in strips

function chunk(type: string, data: Buffer): Buffer {
  const head = Buffer.alloc(8);
  head.writeUInt32BE(data.length, 0);
  head.write(type, 4, "latin1");
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(data, crc32(head.subarray(4, 8))) >>> 0, 0);
  return Buffer.concat([head, data, crc]);
}

/** W3C PNG, 8-bit RGBA, filter type 0 (None) on every row, zlib on the thread pool. */
class StripPngEncoder {
  private readonly deflate = createDeflate({ level: PNG_ZLIB_LEVEL, chunkSize: 1 << 20 });
  private readonly compressed: Buffer[] = [];

  constructor(
    private readonly width: number,
    private readonly height: number,
    private readonly ppi: number,
  ) {
    this.deflate.on("data", (b: Buffer) => this.compressed.push(b));
  }

  /** Adds rows already laid out as PNG scanlines: a filter byte (0) then width × 4 bytes each. */
  async write(scanlines: Buffer): Promise<void> {
    if (!this.deflate.write(scanlines)) await once(this.deflate, "drain");
  }

  async finish(): Promise<Buffer> {
    const ended = once(this.deflate, "end");
    this.deflate.end();
    await ended;
    const ihdr = Buffer.alloc(13);
    ihdr.writeUInt32BE(this.width, 0);
    ihdr.writeUInt32BE(this.height, 4);
    ihdr[8] = 8; // bit depth
    ihdr[9] = 6; // colour type: truecolour with alpha
    const phys = Buffer.alloc(9);
    const perMetre = Math.round(this.ppi / 0.0254); // pixels per metre, unit 1 (W3C PNG pHYs)
    phys.writeUInt32BE(perMetre, 0);
    phys.writeUInt32BE(perMetre, 4);
    phys[8] = 1;
    const idat: Buffer[] = [];
    const all = Buffer.concat(this.compressed);
    this.compressed.length = 0;
    const step = 1 << 24;
    for (let i = 0; i < all.length; i += step) idat.push(chunk("IDAT", all.subarray(i, i + step)));
    if (idat.length === 0) idat.push(chunk("IDAT", Buffer.alloc(0)));
    return Buffer.concat([
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
      chunk("IHDR", ihdr),
      chunk("pHYs", phys),
      ...idat,
      chunk("IEND", Buffer.alloc(0)),
    ]);
  }
}

async function sheetPng(sheet: SheetPixels, ppi: number, store: PieceStore, stripPixels: number, onRows: (rows: number) => void): Promise<Buffer> {
  const { widthPx, heightPx, jobs } = sheet;
  const stride = widthPx * 4;
  const line = stride + 1;
  const encoder = new StripPngEncoder(widthPx, heightPx, ppi);
  const stripRows = Math.max(1, Math.floor(stripPixels / widthPx));
  // Pieces that touch another are composited by sharp; the rest are copied row by row.
  const touching = new Set<Job>();
  for (let i = 0; i < jobs.length; i += 1)
    for (let j = i + 1; j < jobs.length; j += 1)
      if (intersects(jobs[i]!.rect, jobs[j]!.rect)) {
        touching.add(jobs[i]!);
        touching.add(jobs[j]!);
      }
  const byTop = [...jobs].sort((a, b) => a.rect.top - b.rect.top);
  let first = 0;
  for (let y0 = 0; y0 < heightPx; y0 += stripRows) {
    const rows = Math.min(stripRows, heightPx - y0);
    const y1 = y0 + rows;
    while (first < byTop.length && byTop[first]!.rect.top + byTop[first]!.rect.height <= y0) first += 1;
    const here: Job[] = [];
    for (let k = first; k < byTop.length && byTop[k]!.rect.top < y1; k += 1) {
      const job = byTop[k]!;
      if (job.rect.top + job.rect.height > y0) here.push(job);
    }
    // A fresh buffer each strip: zlib may still be reading the last one.
    const scanlines = Buffer.alloc(rows * line);
    const parts = await Promise.all(
      here.map(async (job) => ({ job, raster: await store.get(job), r0: Math.max(y0, job.rect.top), r1: Math.min(y1, job.rect.top + job.rect.height) })),
    );
    if (parts.some((p) => touching.has(p.job))) {
      const overlays: OverlayOptions[] = parts.map(({ job, raster, r0, r1 }) => {
        const pieceStride = job.rect.width * 4;
        return {
          input: raster.subarray((r0 - job.rect.top) * pieceStride, (r1 - job.rect.top) * pieceStride),
          raw: { width: job.rect.width, height: r1 - r0, channels: 4 },
          left: job.rect.left,
          top: r0 - y0,
        };
      });
      const strip = await sharp({
        create: { width: widthPx, height: rows, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } },
        limitInputPixels: false,
      })
        .composite(overlays)
        .raw()
        .toBuffer();
      for (let r = 0; r < rows; r += 1) strip.copy(scanlines, r * line + 1, r * stride, (r + 1) * stride);
    } else {
      // Pieces that do not touch, over a transparent sheet: the result is each piece's own pixels.
      for (const { job, raster, r0, r1 } of parts) {
        const pieceStride = job.rect.width * 4;
        for (let r = r0; r < r1; r += 1) {
          const from = (r - job.rect.top) * pieceStride;
          raster.copy(scanlines, (r - y0) * line + 1 + job.rect.left * 4, from, from + pieceStride);
        }
      }
    }
    await encoder.write(scanlines);
    onRows(rows);
  }
  return encoder.finish();
}

/** One PNG per sheet, in order, several sheets at once. */
export async function renderGangSheetPngs(input: RenderGangSheetsInput): Promise<Buffer[]> {
  const prepared = prepare(input);
  const progress = progressReporter(input.onProgress);
  progress(0);
  const store = new PieceStore(input.art, prepared.sheets);
  const totalRows = prepared.sheets.reduce((n, s) => n + s.heightPx, 0);
  let rowsDone = 0;
  const out: Buffer[] = new Array(prepared.sheets.length);
  await eachLimited(prepared.sheets, PARALLEL, async (sheet, i) => {
    out[i] = await sheetPng(sheet, prepared.ppi, store, input.stripPixels ?? STRIP_PIXELS, (rows) => {
      rowsDone += rows;
      progress((0.98 * rowsDone) / totalRows);
    });
    store.release(sheet);
  });
  progress(1);
  return out;
}

/** One sheet as both files (the PNG and a one-page PDF). */
export async function renderGangSheet(input: RenderGangSheetInput): Promise<RenderGangSheetResult> {
  const { sheet, onProgress, ...rest } = input;
  const prepared = prepare({ ...rest, sheets: [sheet] });
  const both = { ...rest, sheets: [sheet] };
  const [pngs, pdf] = [
    await renderGangSheetPngs({ ...both, onProgress: (f) => onProgress?.(f * 0.7) }),
    await renderGangSheetPdf({ ...both, onProgress: (f) => onProgress?.(0.7 + f * 0.3) }),
  ];
  return { png: pngs[0]!, pdf, widthPx: prepared.sheets[0]!.widthPx, heightPx: prepared.sheets[0]!.heightPx };
}
