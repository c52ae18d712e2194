import "server-only";
import { once } from "node:events";
import { crc32, createDeflate } from "node:zlib";
import { PDFDocument, PDFName, PDFNumber, type PDFRef } from "pdf-lib";
import sharp, { type Metadata, type OverlayOptions, type Sharp } from "sharp";
import { PDF_UNITS_PER_INCH } from "@/lib/units";
import { drawClippedImage, embedRgbaPixels } from "./test-print";

/**
 * Print-ready gang sheet files: the packed sheet composited from the ORIGINAL art at print
 * resolution, as a transparent PNG (pHYs = ppi, W3C PNG specification) and as a PDF of the
 * same sheet at true size (one page, roll width × sheet length at 72 pt per inch, ISO 32000).
 *
 * Coordinates are inches from the sheet's top-left, x across the roll, y down its length,
 * as `packGangSheet` lays them out. A placement's width × height is as laid on the sheet;
 * `rotated` means the piece's own art is turned 90° clockwise to get there.
 *
 * Memory: each distinct piece (item, pixel size, turn) is decoded once as RGBA. Sheets up to
 * SINGLE_PASS_MAX_PIXELS go through one sharp composite, which libvips streams to the PNG
 * encoder. Bigger sheets are drawn in horizontal strips fed to a streaming PNG encoder, with
 * piece rasters dropped once the strips have passed them: in a strip where no pieces touch
 * (the packer keeps a gap between them) each piece's rows are copied as they are, otherwise
 * sharp composites the strip. The two paths agree exactly on opaque and fully transparent
 * pixels; sharp's compositing may move a half-transparent pixel by 1/255. Sheets over
 * MAX_SHEET_PIXELS are refused.
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

export interface RenderGangSheetInput {
  sheet: { lengthIn: number; placements: GangSheetPlacementInput[] };
  rollWidthIn: number;
  /** Print resolution, pixels per inch; default DEFAULT_GANG_PPI. */
  ppi?: number;
  /** Art per item id. */
  art: Record<string, GangArt>;
  /** Called with 0…1 as the work goes on, ending with 1. */
  onProgress?: (fraction: number) => void;
  /** Sheets with more pixels than this are drawn in strips; default SINGLE_PASS_MAX_PIXELS (a tuning knob for tests). */
  singlePassMaxPixels?: number;
  /** Pixels per strip in strip mode; default STRIP_PIXELS (a tuning knob for tests). */
  stripPixels?: number;
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
/** Above this the sheet is drawn in strips (our own bound, 400 megapixels = 1.6 GB of RGBA if held whole). */
export const SINGLE_PASS_MAX_PIXELS = 400_000_000;
/** Largest sheet we render at all (our own bound; keeps the PNG under Node's 4 GB buffer limit even for noise). */
export const MAX_SHEET_PIXELS = 900_000_000;
/** Pixels per strip in strip mode (our own bound, 128 MB of RGBA). */
export const STRIP_PIXELS = 32_000_000;
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
// Streaming PNG encoder (strip mode): W3C PNG, 8-bit RGBA, filter type 1 (Sub) on every row.

function chunk(type: string, data: Buffer): Buffer {
  const head = Buffer.alloc(8);
  head.writeUInt32BE(data.length, 0);
  head.write(type, 4, "latin1");
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(data, crc32(head.subarray(4, 8))) >>> 0, 0);
  return Buffer.concat([head, data, crc]);
}

class StripPngEncoder {
  private readonly deflate = createDeflate({ level: 6, chunkSize: 1 << 20 });
  private readonly compressed: Buffer[] = [];

  constructor(
    private readonly width: number,
    private readonly height: number,
    private readonly ppi: number,
  ) {
    this.deflate.on("data", (b: Buffer) => this.compressed.push(b));
  }

  /** Adds whole rows of RGBA pixels, top to bottom. */
  async write(rgba: Buffer, rows: number): Promise<void> {
    const stride = this.width * 4;
    const out = Buffer.allocUnsafe(rows * (stride + 1));
    for (let r = 0; r < rows; r += 1) {
      // Sub filter: each byte minus the same byte of the pixel to its left, mod 256.
      const src = r * stride;
      const dst = r * (stride + 1);
      out[dst] = 1;
      for (let i = 0; i < 4; i += 1) out[dst + 1 + i] = rgba[src + i]!;
      for (let i = 4; i < stride; i += 1) out[dst + 1 + i] = (rgba[src + i]! - rgba[src + i - 4]!) & 255;
    }
    if (!this.deflate.write(out)) await once(this.deflate, "drain");
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

// ---------------------------------------------------------------------------------------

/**
 * Renders a packed gang sheet at print resolution. Throws RangeError for bad sizes, a
 * placement off the sheet, or a sheet over MAX_SHEET_PIXELS, and Error for missing or
 * unreadable art.
 */
export async function renderGangSheet(input: RenderGangSheetInput): Promise<RenderGangSheetResult> {
  const ppi = input.ppi ?? DEFAULT_GANG_PPI;
  requirePositive(ppi, "The resolution (ppi)");
  if (ppi > MAX_GANG_PPI)
    throw new RangeError(`The resolution must be at most ${MAX_GANG_PPI} ppi (got ${ppi}).`);
  requirePositive(input.rollWidthIn, "The roll width");
  requirePositive(input.sheet.lengthIn, "The sheet length");
  const widthPx = Math.round(input.rollWidthIn * ppi);
  const heightPx = Math.round(input.sheet.lengthIn * ppi);
  if (widthPx < 1 || heightPx < 1)
    throw new RangeError("The sheet is smaller than one pixel at this resolution.");
  const total = widthPx * heightPx;
  if (total > MAX_SHEET_PIXELS) {
    throw new RangeError(
      `This sheet would be ${widthPx.toLocaleString("en-US")} x ${heightPx.toLocaleString("en-US")} px (${Math.round(total / 1e6)} megapixels), over the ${MAX_SHEET_PIXELS / 1e6} megapixel limit. Split it into shorter sheets or lower the resolution.`,
    );
  }

  const jobs: Job[] = input.sheet.placements.map((p, index) => {
    requirePositive(p.widthIn, `The width of placement ${index + 1} (${p.itemId})`);
    requirePositive(p.heightIn, `The height of placement ${index + 1} (${p.itemId})`);
    if (!Number.isFinite(p.x) || !Number.isFinite(p.y))
      throw new RangeError(`Placement ${index + 1} (${p.itemId}) has no position.`);
    if (
      p.x < -EDGE_EPS ||
      p.y < -EDGE_EPS ||
      p.x + p.widthIn > input.rollWidthIn + EDGE_EPS ||
      p.y + p.heightIn > input.sheet.lengthIn + EDGE_EPS
    ) {
      throw new RangeError(
        `Placement ${index + 1} (${p.itemId}) runs off the ${input.rollWidthIn} x ${input.sheet.lengthIn} in sheet.`,
      );
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

  const progress = (f: number) => input.onProgress?.(Math.min(1, Math.max(0, f)));
  progress(0);

  // The PDF: one page at true size, each distinct piece embedded once and drawn where it lies.
  const doc = await PDFDocument.create();
  doc.setCreator("Chalkline");
  doc.setProducer("Chalkline");
  doc.setTitle(`Gang sheet ${input.rollWidthIn} x ${Number(input.sheet.lengthIn.toFixed(3))} in`);
  const trueW = input.rollWidthIn * PDF_UNITS_PER_INCH;
  const trueH = input.sheet.lengthIn * PDF_UNITS_PER_INCH;
  const userUnit = Math.max(1, Math.ceil(Math.max(trueW, trueH) / MAX_PAGE_UNITS));
  const page = doc.addPage([trueW / userUnit, trueH / userUnit]);
  if (userUnit > 1) page.node.set(PDFName.of("UserUnit"), PDFNumber.of(userUnit));
  const unit = PDF_UNITS_PER_INCH / userUnit;
  const pageH = trueH / userUnit;
  const drawInPdf = (job: Job, ref: PDFRef) => {
    const { x, y, widthIn, heightIn } = job.inches;
    drawClippedImage(
      page,
      ref,
      { a: widthIn * unit, d: heightIn * unit, e: x * unit, f: pageH - (y + heightIn) * unit },
      { x: x * unit, y: pageH - (y + heightIn) * unit, width: widthIn * unit, height: heightIn * unit },
    );
  };

  const refs = new Map<string, PDFRef>();
  const rasters = new Map<string, Buffer>();
  const singlePass = total <= (input.singlePassMaxPixels ?? SINGLE_PASS_MAX_PIXELS);
  let png: Buffer;

  if (singlePass) {
    const distinct = new Map<string, Job>();
    for (const job of jobs) if (!distinct.has(job.key)) distinct.set(job.key, job);
    let done = 0;
    for (const [key, job] of distinct) {
      const raster = await pieceRaster(input.art[job.itemId]!, job);
      rasters.set(key, raster);
      refs.set(key, embedRgbaPixels(doc, raster, job.rect.width, job.rect.height));
      done += 1;
      progress((0.6 * done) / distinct.size);
    }
    png = await sharp({
      create: { width: widthPx, height: heightPx, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } },
      limitInputPixels: false,
    })
      .composite(
        jobs.map((job) => ({
          input: rasters.get(job.key)!,
          raw: { width: job.rect.width, height: job.rect.height, channels: 4 as const },
          left: job.rect.left,
          top: job.rect.top,
        })),
      )
      .png({ compressionLevel: 6 })
      .withMetadata({ density: ppi })
      .toBuffer();
    rasters.clear();
    progress(0.9);
  } else {
    const encoder = new StripPngEncoder(widthPx, heightPx, ppi);
    const stripRows = Math.max(1, Math.floor((input.stripPixels ?? STRIP_PIXELS) / widthPx));
    // Last strip each distinct piece is needed in, so its raster can be dropped after it.
    const lastRow = new Map<string, number>();
    for (const job of jobs)
      lastRow.set(job.key, Math.max(lastRow.get(job.key) ?? 0, job.rect.top + job.rect.height));
    for (let y0 = 0; y0 < heightPx; y0 += stripRows) {
      const rows = Math.min(stripRows, heightPx - y0);
      const y1 = y0 + rows;
      const here = jobs.filter((j) => j.rect.top < y1 && j.rect.top + j.rect.height > y0);
      const parts: Array<{ job: Job; raster: Buffer; r0: number; r1: number }> = [];
      for (const job of here) {
        let raster = rasters.get(job.key);
        if (!raster) {
          raster = await pieceRaster(input.art[job.itemId]!, job);
          rasters.set(job.key, raster);
          refs.set(job.key, embedRgbaPixels(doc, raster, job.rect.width, job.rect.height));
        }
        parts.push({
          job,
          raster,
          r0: Math.max(y0, job.rect.top),
          r1: Math.min(y1, job.rect.top + job.rect.height),
        });
      }
      const overlapping = parts.some((p, i) =>
        parts.some((q, j) => j > i && intersects(p.job.rect, q.job.rect)),
      );
      let strip: Buffer;
      if (!overlapping) {
        // Pieces that do not touch, over a transparent sheet: the result is each piece's own pixels, so copy rows.
        strip = Buffer.alloc(widthPx * rows * 4);
        for (const { job, raster, r0, r1 } of parts) {
          const stride = job.rect.width * 4;
          for (let r = r0; r < r1; r += 1) {
            const from = (r - job.rect.top) * stride;
            raster.copy(strip, ((r - y0) * widthPx + job.rect.left) * 4, from, from + stride);
          }
        }
      } else {
        const overlays: OverlayOptions[] = parts.map(({ job, raster, r0, r1 }) => {
          const stride = job.rect.width * 4;
          return {
            input: raster.subarray((r0 - job.rect.top) * stride, (r1 - job.rect.top) * stride),
            raw: { width: job.rect.width, height: r1 - r0, channels: 4 },
            left: job.rect.left,
            top: r0 - y0,
          };
        });
        strip = await sharp({
          create: { width: widthPx, height: rows, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } },
          limitInputPixels: false,
        })
          .composite(overlays)
          .raw()
          .toBuffer();
      }
      await encoder.write(strip, rows);
      for (const [key, last] of lastRow) if (last <= y1) rasters.delete(key);
      progress((0.9 * y1) / heightPx);
    }
    png = await encoder.finish();
  }

  for (const job of jobs) drawInPdf(job, refs.get(job.key)!);
  const pdf = await doc.save();
  progress(1);
  return { png, pdf, widthPx, heightPx };
}
