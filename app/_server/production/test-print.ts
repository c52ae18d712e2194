import "server-only";
import { promisify } from "node:util";
import { deflate, deflateSync } from "node:zlib";
import {
  PDFDocument,
  StandardFonts,
  clip,
  concatTransformationMatrix,
  drawObject,
  endPath,
  popGraphicsState,
  pushGraphicsState,
  rectangle,
  rgb,
  type PDFFont,
  type PDFPage,
  type PDFRef,
  type RGB,
} from "pdf-lib";
import sharp, { type Metadata, type Sharp } from "sharp";
import { planTiles, type PaperId, type Tile, type TileJoins, type TilePlan } from "@/lib/production/tiling";
import { CM_PER_INCH, PDF_UNITS_PER_INCH, formatLength } from "@/lib/units";
import { toWinAnsi } from "./spec-sheet";

/**
 * True-size tiled test prints as a PDF.
 *
 * Each page is the chosen paper in PDF points (72 per inch, ISO 32000). The tile's slice of
 * the art is drawn at true size (1 in of art = 72 pt) inside the page margins, clipped to
 * the tile, using the plan from `planTiles` (or its mirror for HTV and sublimation). Over the
 * art go only the guides that belong on it: the print area box, the collar line, and shaded
 * overlap strips with round targets that land on each other when the pages are taped.
 *
 * Every word and the scale bars (1 in and 5 cm) go into the label band the plan keeps free
 * of art below the art area, so the taped sheet shows the whole art uncovered: the page's
 * label and what to tape it to, the notes, the title (wrapped between words) and the
 * instruction to print at 100%.
 *
 * Everything is drawn inside the printable area: the margin is what office printers may not
 * reach, so nothing there can be relied on.
 */

export type TestPrintArt = { png: Buffer } | { svg: string };

export interface TestPrintInput {
  title: string;
  /** The art as a raster (any pixel size, alpha kept) or as SVG markup (stored, sanitised art). */
  art: TestPrintArt;
  artWidthIn: number;
  artHeightIn: number;
  paper: PaperId;
  marginIn?: number;
  overlapIn?: number;
  orientation?: "portrait" | "landscape" | "auto";
  /** Print wrong-reading (HTV, sublimation). */
  mirror?: boolean;
  /** Print area outline, relative to the art's top-left corner, inches. */
  printArea?: { widthIn: number; heightIn: number; offsetXIn: number; offsetYIn: number };
  /** y of the collar line from the art's top edge, inches (negative: above the art). */
  collarLineYIn?: number;
}

export interface TestPrintResult {
  pdf: Uint8Array;
  plan: TilePlan;
}

/** Resolution SVG art is drawn at for paper (our own choice: past what office printers resolve). */
export const SVG_TARGET_PPI = 250;
/** Most pixels one art raster may have in a test print (our own bound, ~160 MB of RGBA while drawing). */
export const MAX_ART_RASTER_PIXELS = 40_000_000;
/**
 * PNGs up to this many pixels go through pdf-lib's own embedPng as they are; bigger ones are
 * decoded by sharp (native, much faster than pdf-lib's JavaScript decoder), pixels unchanged.
 */
export const PNG_JS_EMBED_MAX_PIXELS = 8_000_000;
/** Largest art raster we decode at all (our own bound: twice the upload pixel cap). */
const MAX_SOURCE_PIXELS = 200_000_000;

/** 1 in in PDF points (ISO 32000: 72 units per inch). */
export const ONE_INCH_BAR_PT = PDF_UNITS_PER_INCH;
/** 5 cm in PDF points: 5 / 2.54 in (NIST SP 811) × 72. */
export const FIVE_CM_BAR_PT = (5 / CM_PER_INCH) * PDF_UNITS_PER_INCH;
/** Thickness of both scale bars, points (our own choice). */
export const SCALE_BAR_HEIGHT_PT = 4;

const PT = PDF_UNITS_PER_INCH;
const INK = rgb(0, 0, 0);
const MUTED = rgb(0.35, 0.35, 0.38);
const STRIP_COLOUR = rgb(0.25, 0.45, 0.85);
const PRINT_AREA_COLOUR = rgb(0.1, 0.35, 0.85);
const COLLAR_COLOUR = rgb(0.85, 0.15, 0.15);

// ---------------------------------------------------------------------------------------
// Images

/** Splits 8-bit RGBA into RGB and alpha planes; alpha is null when every pixel is opaque. */
function splitRgba(rgba: Uint8Array, width: number, height: number): { colour: Buffer; alpha: Buffer | null } {
  const n = width * height;
  if (
    !Number.isInteger(width) ||
    !Number.isInteger(height) ||
    width < 1 ||
    height < 1 ||
    rgba.length < n * 4
  ) {
    throw new RangeError(`Pixel data does not match ${width} x ${height} RGBA.`);
  }
  const colour = Buffer.allocUnsafe(n * 3);
  const alpha = Buffer.allocUnsafe(n);
  let opaque = true;
  for (let i = 0, j = 0, k = 0; i < n; i += 1, j += 4, k += 3) {
    colour[k] = rgba[j]!;
    colour[k + 1] = rgba[j + 1]!;
    colour[k + 2] = rgba[j + 2]!;
    const a = rgba[j + 3]!;
    alpha[i] = a;
    if (a !== 255) opaque = false;
  }
  return { colour, alpha: opaque ? null : alpha };
}

/** Registers Flate-compressed RGB (and alpha as its soft mask) as an image XObject. */
function registerImage(doc: PDFDocument, width: number, height: number, colour: Buffer, alpha: Buffer | null): PDFRef {
  const ctx = doc.context;
  const base = {
    Type: "XObject",
    Subtype: "Image",
    Width: width,
    Height: height,
    BitsPerComponent: 8,
    Filter: "FlateDecode",
  };
  const smask = alpha ? ctx.register(ctx.stream(alpha, { ...base, ColorSpace: "DeviceGray" })) : undefined;
  return ctx.register(ctx.stream(colour, { ...base, ColorSpace: "DeviceRGB", ...(smask ? { SMask: smask } : {}) }));
}

/**
 * Puts 8-bit RGBA pixels (straight alpha, sRGB) into the PDF as an image XObject, colour in
 * one Flate stream and alpha as a soft mask (ISO 32000 §11.6.5.3; left out when every pixel is
 * opaque). Deflate is Node's own zlib, so print-size rasters embed quickly.
 */
export function embedRgbaPixels(doc: PDFDocument, rgba: Uint8Array, width: number, height: number): PDFRef {
  const { colour, alpha } = splitRgba(rgba, width, height);
  return registerImage(doc, width, height, deflateSync(colour), alpha ? deflateSync(alpha) : null);
}

const deflateAsync = promisify(deflate);

/**
 * As embedRgbaPixels, with the compression on libuv's thread pool, so several images (and the
 * event loop) go on at once. `level` is zlib's 1–9 (default 6).
 */
export async function embedRgbaPixelsAsync(doc: PDFDocument, rgba: Uint8Array, width: number, height: number, level = 6): Promise<PDFRef> {
  const { colour, alpha } = splitRgba(rgba, width, height);
  const [c, a] = await Promise.all([deflateAsync(colour, { level }), alpha ? deflateAsync(alpha, { level }) : Promise.resolve(null)]);
  return registerImage(doc, width, height, c, a);
}

/** Draws an image XObject with the matrix [a 0 0 d e f], clipped to a rectangle (all in points, PDF y up). */
export function drawClippedImage(
  page: PDFPage,
  image: PDFRef,
  matrix: { a: number; d: number; e: number; f: number },
  clipRect: { x: number; y: number; width: number; height: number },
): void {
  const name = page.node.newXObject("Image", image);
  page.pushOperators(
    pushGraphicsState(),
    rectangle(clipRect.x, clipRect.y, clipRect.width, clipRect.height),
    clip(),
    endPath(),
    concatTransformationMatrix(matrix.a, 0, 0, matrix.d, matrix.e, matrix.f),
    drawObject(name),
    popGraphicsState(),
  );
}

interface EmbeddedArt {
  ref: PDFRef;
  widthPx: number;
  heightPx: number;
}

async function rasterToPdf(doc: PDFDocument, image: Sharp): Promise<EmbeddedArt> {
  const { data, info } = await image
    .toColourspace("srgb")
    .ensureAlpha()
    .raw({ depth: "uchar" })
    .toBuffer({ resolveWithObject: true });
  return {
    ref: embedRgbaPixels(doc, data, info.width, info.height),
    widthPx: info.width,
    heightPx: info.height,
  };
}

/** Pixel size for art of w × h inches at `ppi`, lowered to stay within MAX_ART_RASTER_PIXELS. */
function rasterSize(widthIn: number, heightIn: number, ppi: number): { width: number; height: number } {
  let p = ppi;
  if (widthIn * heightIn * p * p > MAX_ART_RASTER_PIXELS)
    p = Math.sqrt(MAX_ART_RASTER_PIXELS / (widthIn * heightIn));
  return { width: Math.max(1, Math.round(widthIn * p)), height: Math.max(1, Math.round(heightIn * p)) };
}

async function embedArt(
  doc: PDFDocument,
  art: TestPrintArt,
  widthIn: number,
  heightIn: number,
): Promise<EmbeddedArt> {
  if ("png" in art) {
    let meta: Metadata;
    try {
      meta = await sharp(art.png, { limitInputPixels: MAX_SOURCE_PIXELS }).metadata();
    } catch {
      throw new Error("The art PNG could not be read; it may be damaged.");
    }
    const w = meta.width ?? 0;
    const h = meta.height ?? 0;
    if (!w || !h) throw new Error("The art PNG has no pixels.");
    if (w * h > MAX_SOURCE_PIXELS)
      throw new Error(
        `The art PNG is ${w} x ${h} px, over the ${MAX_SOURCE_PIXELS / 1e6} megapixel limit for test prints.`,
      );
    if (w * h <= PNG_JS_EMBED_MAX_PIXELS && meta.format === "png") {
      try {
        const image = await doc.embedPng(art.png);
        return { ref: image.ref, widthPx: image.width, heightPx: image.height };
      } catch {
        // Fall through to the native decoder (unusual PNG flavours).
      }
    }
    let pipeline = sharp(art.png, { limitInputPixels: MAX_SOURCE_PIXELS, failOn: "error" });
    if (w * h > MAX_ART_RASTER_PIXELS) {
      const scale = Math.sqrt(MAX_ART_RASTER_PIXELS / (w * h));
      pipeline = pipeline.resize(Math.max(1, Math.floor(w * scale)), Math.max(1, Math.floor(h * scale)), {
        fit: "fill",
      });
    }
    try {
      return await rasterToPdf(doc, pipeline);
    } catch {
      throw new Error("The art PNG could not be decoded; it may be cut short or damaged.");
    }
  }

  const svg = Buffer.from(art.svg, "utf8");
  let meta: Metadata;
  try {
    meta = await sharp(svg).metadata();
  } catch {
    throw new Error("The art SVG could not be read.");
  }
  const target = rasterSize(widthIn, heightIn, SVG_TARGET_PPI);
  const mw = meta.width || target.width;
  const mh = meta.height || target.height;
  // librsvg draws at `density` dots per inch over a 72 dpi base; draw at least the target size, then resample to it exactly.
  let scale = Math.max(target.width / mw, target.height / mh);
  if (mw * mh * scale * scale > 4 * MAX_ART_RASTER_PIXELS)
    scale = Math.min(target.width / mw, target.height / mh);
  const density = Math.min(100_000, Math.max(1, 72 * scale));
  try {
    return await rasterToPdf(
      doc,
      sharp(svg, { density, limitInputPixels: 8 * MAX_ART_RASTER_PIXELS }).resize(
        target.width,
        target.height,
        { fit: "fill" },
      ),
    );
  } catch {
    throw new Error("The art SVG could not be drawn at print size.");
  }
}

// ---------------------------------------------------------------------------------------
// Page geometry

/** Tile mapping, art inches to page inches (top-left origin); mirrored plans flip x within the tile. */
function artToPage(plan: TilePlan, tile: Tile) {
  return {
    x: (ax: number) =>
      plan.mirrored ? tile.pageX + tile.artWidth - (ax - tile.artX) : tile.pageX + (ax - tile.artX),
    y: (ay: number) => tile.pageY + (ay - tile.artY),
  };
}

/** An art-space rectangle as a page rectangle in inches (top-left origin). */
function artRectToPage(plan: TilePlan, tile: Tile, x: number, y: number, w: number, h: number) {
  const map = artToPage(plan, tile);
  const x0 = map.x(x);
  const x1 = map.x(x + w);
  return { x: Math.min(x0, x1), y: map.y(y), width: Math.abs(x1 - x0), height: h };
}

/** Join instructions from a tile's neighbours, e.g. "Tape to A2 above, B3 to the right". */
export function joinInstruction(joins: TileJoins): string {
  const parts: string[] = [];
  if (joins.above) parts.push(`${joins.above} above`);
  if (joins.left) parts.push(`${joins.left} to the left`);
  if (joins.right) parts.push(`${joins.right} to the right`);
  if (joins.below) parts.push(`${joins.below} below`);
  return parts.length ? `Tape to ${parts.join(", ")}` : "Single page: nothing to tape";
}

interface PageCtx {
  page: PDFPage;
  plan: TilePlan;
  tile: Tile;
  fonts: { regular: PDFFont; bold: PDFFont };
  /** Page height in points, for turning top-down inches into PDF y. */
  heightPt: number;
}

const X = (inches: number) => inches * PT;

function Y(ctx: PageCtx, inchesFromTop: number): number {
  return ctx.heightPt - inchesFromTop * PT;
}

/** Runs `draw` with the graphics clipped to the tile's rectangle on the page. */
function withTileClip(ctx: PageCtx, draw: () => void): void {
  const { tile } = ctx;
  ctx.page.pushOperators(
    pushGraphicsState(),
    rectangle(X(tile.pageX), Y(ctx, tile.pageY + tile.artHeight), X(tile.artWidth), X(tile.artHeight)),
    clip(),
    endPath(),
  );
  draw();
  ctx.page.pushOperators(popGraphicsState());
}

/** A crosshair circle centred on (x, y) page inches. */
function target(ctx: PageCtx, x: number, y: number, radiusIn: number, armIn: number, color: RGB = INK): void {
  const cx = X(x);
  const cy = Y(ctx, y);
  ctx.page.drawCircle({ x: cx, y: cy, size: radiusIn * PT, borderColor: color, borderWidth: 0.5 });
  ctx.page.drawLine({
    start: { x: cx - armIn * PT, y: cy },
    end: { x: cx + armIn * PT, y: cy },
    thickness: 0.5,
    color,
  });
  ctx.page.drawLine({
    start: { x: cx, y: cy - armIn * PT },
    end: { x: cx, y: cy + armIn * PT },
    thickness: 0.5,
    color,
  });
}

/** Shades the strips this page shares with its neighbours; returns the alignment targets to draw on top. */
function drawOverlapBands(
  ctx: PageCtx,
  byLabel: Map<string, Tile>,
): Array<{ x: number; y: number; radius: number }> {
  const { plan, tile } = ctx;
  const targets: Array<{ x: number; y: number; radius: number }> = [];
  if (plan.overlapIn <= 0) return targets;
  const sides: Array<"left" | "right" | "above" | "below"> = ["left", "right", "above", "below"];
  for (const side of sides) {
    const label = tile.joins[side];
    const other = label ? byLabel.get(label) : undefined;
    if (!other) continue;
    let band: { x: number; y: number; w: number; h: number };
    if (side === "left" || side === "right") {
      const x0 = Math.max(tile.artX, other.artX);
      const x1 = Math.min(tile.artX + tile.artWidth, other.artX + other.artWidth);
      if (x1 - x0 <= 1e-9) continue;
      band = { x: x0, y: tile.artY, w: x1 - x0, h: tile.artHeight };
    } else {
      const y0 = Math.max(tile.artY, other.artY);
      const y1 = Math.min(tile.artY + tile.artHeight, other.artY + other.artHeight);
      if (y1 - y0 <= 1e-9) continue;
      band = { x: tile.artX, y: y0, w: tile.artWidth, h: y1 - y0 };
    }
    const r = artRectToPage(plan, tile, band.x, band.y, band.w, band.h);
    ctx.page.drawRectangle({
      x: X(r.x),
      y: Y(ctx, r.y + r.height),
      width: X(r.width),
      height: X(r.height),
      color: STRIP_COLOUR,
      opacity: 0.14,
    });
    // Targets on the strip's centre line, at art positions both neighbours share, so they land on each other.
    const map = artToPage(plan, tile);
    const spots =
      side === "left" || side === "right"
        ? [0.25, 0.75].map((f) => ({ ax: band.x + band.w / 2, ay: band.y + band.h * f }))
        : [0.25, 0.75].map((f) => ({ ax: band.x + band.w * f, ay: band.y + band.h / 2 }));
    const radius = Math.min(0.1, Math.min(band.w, band.h) * 0.4);
    for (const s of spots) targets.push({ x: map.x(s.ax), y: map.y(s.ay), radius });
  }
  return targets;
}

/** The print area box and the collar line, drawn over the tile's slice of the art (clipped to it). */
function drawGuides(ctx: PageCtx, input: TestPrintInput): void {
  const { plan, tile, page } = ctx;
  const area = input.printArea;
  const collar = input.collarLineYIn;
  if (!area && collar === undefined) return;
  withTileClip(ctx, () => {
    if (area) {
      const r = artRectToPage(plan, tile, area.offsetXIn, area.offsetYIn, area.widthIn, area.heightIn);
      page.drawRectangle({
        x: X(r.x),
        y: Y(ctx, r.y + r.height),
        width: X(r.width),
        height: X(r.height),
        borderColor: PRINT_AREA_COLOUR,
        borderWidth: 1,
        borderDashArray: [6, 4],
      });
    }
    // The line alone: its name is in the label band's key, never written over the art.
    if (collar !== undefined && collar >= tile.artY && collar <= tile.artY + tile.artHeight) {
      const y = Y(ctx, artToPage(plan, tile).y(collar));
      page.drawLine({
        start: { x: X(tile.pageX), y },
        end: { x: X(tile.pageX + tile.artWidth), y },
        thickness: 1,
        color: COLLAR_COLOUR,
        dashArray: [8, 3, 2, 3],
      });
    }
  });
}

// ---------------------------------------------------------------------------------------
// The label band
//
// Everything a page says (its label, what to tape it to, the notes, the title, the print-at-100%
// instruction and the scale bars) goes into the label band: a strip along the lower edge of the
// printable area that the plan keeps free of art. How deep the band is follows from what it must
// hold on the plan's widest-worded page; the plan is made with that band, so no label is ever
// printed over the art.

/** Space between the art area and the band's first line, points (our own choice). */
const BAND_GAP_PT = 6;
/** Space below the band's last line, points (our own choice). */
const BAND_FOOT_PT = 2;
/** Space between the band's columns, points (our own choice). */
const COLUMN_GAP_PT = 14;
/** Narrowest the band's text column may be before the band stacks its columns (our own choice). */
const MIN_TEXT_COLUMN_PT = 150;
/** Most lines a title takes; past that it ends with "..." after a whole word (our own choice). */
export const TITLE_MAX_LINES = 4;
/** Band depths are rounded up to 1/32 in, so plans come out in round numbers (our own choice). */
const BAND_STEP_IN = 1 / 32;
/** Line pitch as a multiple of the font size (common practice, no published source). */
const LEADING = 1.25;
/**
 * Baseline below a line's top, as a multiple of the font size: Helvetica's ascender is 718/1000
 * and its descender 207/1000 (Adobe's Helvetica AFM), so the glyphs stay inside the line's pitch.
 */
const BASELINE = 0.95;
/** Tile label size, points (our own choice). */
const LABEL_SIZE_PT = 22;
/** The scale-bar block: heading line, then the 1 in and 5 cm bars one below the other (our own layout). */
const SCALE_HEADING = "Check the scale: these bars must measure";
const SCALE_HEADING_SIZE_PT = 7;
const SCALE_FIRST_BAR_TOP_PT = 13;
const SCALE_BAR_PITCH_PT = 24;
/** A bar's end labels: baseline below the bar's lower edge, points (our own choice). */
const SCALE_LABEL_DROP_PT = 12;
const SCALE_LABEL_SIZE_PT = 6.5;
const SCALE_BLOCK_HEIGHT_PT =
  SCALE_FIRST_BAR_TOP_PT + SCALE_BAR_PITCH_PT + SCALE_BAR_HEIGHT_PT + SCALE_LABEL_DROP_PT + 3;
/** Left of the bars inside their block, leaving room for the "0" set half over the bar's start. */
const SCALE_BAR_INSET_PT = 3;

const PRINT_AT_FULL_SIZE = "Print at 100% / Actual size - do not fit to page";

/** Tokens that read as separators ("·", "|", "-", …): kept at the end of the line before them. */
const SEPARATOR = /^[\u00b7|/:;,.\-]+$/;

/**
 * Breaks text into lines no wider than `maxWidth` points, only between words. A separator such
 * as the "·" in "Job · Full front" stays with the word before it, so no line starts with one. A
 * word wider than a whole line is cut, with a hyphen at the end of each piece but the last.
 */
export function wrapAtWords(text: string, font: PDFFont, size: number, maxWidth: number): string[] {
  const width = (t: string) => font.widthOfTextAtSize(t, size);
  const units: string[] = [];
  for (const word of toWinAnsi(text).trim().split(" ").filter(Boolean)) {
    if (units.length > 0 && SEPARATOR.test(word)) units[units.length - 1] += ` ${word}`;
    else units.push(word);
  }
  const lines: string[] = [];
  let line = "";
  for (let unit of units) {
    const candidate = line ? `${line} ${unit}` : unit;
    if (width(candidate) <= maxWidth) {
      line = candidate;
      continue;
    }
    if (line) lines.push(line);
    line = "";
    while (width(unit) > maxWidth && unit.length > 1) {
      const piece = (n: number) =>
        unit.slice(0, n).endsWith("-") ? unit.slice(0, n) : `${unit.slice(0, n)}-`;
      let cut = unit.length - 1;
      while (cut > 1 && width(piece(cut)) > maxWidth) cut -= 1;
      lines.push(piece(cut).trimStart());
      unit = unit.slice(cut).trimStart();
    }
    line = unit;
  }
  if (line) lines.push(line);
  return lines;
}

/** The title in at most `maxLines` lines; a longer one ends with "..." after its last whole word that fits. */
export function titleLines(
  title: string,
  font: PDFFont,
  size: number,
  maxWidth: number,
  maxLines = TITLE_MAX_LINES,
): string[] {
  const lines = wrapAtWords(title, font, size, maxWidth);
  if (lines.length <= maxLines) return lines;
  const kept = lines.slice(0, maxLines);
  const fits = (t: string) => font.widthOfTextAtSize(`${t}...`, size) <= maxWidth;
  let last = kept[maxLines - 1]!.replace(/-$/, "");
  while (!fits(last) && last.includes(" ")) last = last.slice(0, last.lastIndexOf(" "));
  // Only a piece of a word cut with a hyphen has no space left to back up to.
  while (!fits(last) && last.length > 1) last = last.slice(0, -1);
  kept[maxLines - 1] = `${last}...`;
  return kept;
}

interface BandText {
  text: string;
  size: number;
  font: "regular" | "bold";
  color: RGB;
  /** Left of the text, points from the band's left edge. */
  x: number;
  /** Top of the text's line, points below the band's top edge. */
  top: number;
}

interface BandLayout {
  /** Depth the band needs for all of it, points. */
  heightPt: number;
  texts: BandText[];
  /** Top-left of the scale-bar block, points from the band's top-left corner. */
  scale: { x: number; top: number };
}

type Fonts = { regular: PDFFont; bold: PDFFont };
type Line = Omit<BandText, "x" | "top">;

/** Lines one under another from `top`; returns where the next line would go. */
function stack(lines: readonly Line[], x: number, top: number, into: BandText[]): number {
  let y = top;
  for (const line of lines) {
    into.push({ ...line, x, top: y });
    y += line.size * LEADING;
  }
  return y;
}

function widest(lines: readonly Line[], fonts: Fonts): number {
  return Math.max(0, ...lines.map((l) => fonts[l.font].widthOfTextAtSize(l.text, l.size)));
}

function scaleBlockWidth(fonts: Fonts): number {
  const endLabel = fonts.regular.widthOfTextAtSize("5 cm", SCALE_LABEL_SIZE_PT);
  return Math.max(
    fonts.bold.widthOfTextAtSize(SCALE_HEADING, SCALE_HEADING_SIZE_PT),
    SCALE_BAR_INSET_PT + FIVE_CM_BAR_PT + endLabel / 2 + 1,
  );
}

/** Where everything in one page's band goes; the same layout measures the band and draws it. */
function layoutBand(
  plan: TilePlan,
  tile: Tile,
  input: TestPrintInput,
  title: string,
  fonts: Fonts,
): BandLayout {
  const width = X(plan.printableWidthIn);
  const scaleWidth = scaleBlockWidth(fonts);
  if (width < scaleWidth) {
    throw new RangeError(
      `The printable area is ${plan.printableWidthIn.toFixed(2)} in across, too narrow for the 5 cm scale bar; use a smaller margin.`,
    );
  }
  const plain = (text: string, size: number, color: RGB = INK): Line => ({
    text,
    size,
    font: "regular",
    color,
  });
  const bold = (text: string, size: number, color: RGB = INK): Line => ({ text, size, font: "bold", color });

  const nameLines: Line[] = [
    bold(toWinAnsi(tile.label), LABEL_SIZE_PT),
    plain(`Row ${tile.label.replace(/\d+$/, "")}, column ${tile.column + 1}`, 7, MUTED),
    plain(`Page ${tile.index + 1} of ${plan.pages} (${plan.rows} x ${plan.columns})`, 7, MUTED),
  ];
  const nameWidth = widest(nameLines, fonts);

  const threeColumns = width - nameWidth - scaleWidth - 2 * COLUMN_GAP_PT >= MIN_TEXT_COLUMN_PT;
  const textWidth = threeColumns ? width - nameWidth - scaleWidth - 2 * COLUMN_GAP_PT : width;
  const wrapped = (line: Line): Line[] =>
    wrapAtWords(line.text, fonts[line.font], line.size, textWidth).map((text) => ({ ...line, text }));

  const notes: Line[] = [...wrapped(bold(joinInstruction(tile.joins), 8.5))];
  if (plan.overlapIn > 0 && plan.pages > 1) {
    notes.push(
      ...wrapped(
        plain(
          `Neighbouring pages share a ${formatLength(plan.overlapIn, "in")} shaded strip: lay one over the other so the round targets meet.`,
          7,
        ),
      ),
    );
  }
  if (plan.mirrored) notes.push(...wrapped(bold("MIRRORED (wrong-reading) for HTV or sublimation.", 7.5)));
  if (input.printArea) notes.push(...wrapped(plain("Blue dashed box: print area.", 7, PRINT_AREA_COLOUR)));
  if (input.collarLineYIn !== undefined) {
    notes.push(...wrapped(plain("Red dashed line: collar line.", 7, COLLAR_COLOUR)));
    if (tile.row === 0 && input.collarLineYIn < 0) {
      notes.push(
        ...wrapped(
          plain(
            `The collar line is ${formatLength(-input.collarLineYIn, "in")} above the top of the art (off this sheet).`,
            7,
            COLLAR_COLOUR,
          ),
        ),
      );
    }
    if (tile.row === plan.rows - 1 && input.collarLineYIn > plan.artHeightIn) {
      notes.push(
        ...wrapped(
          plain(
            `The collar line is ${formatLength(input.collarLineYIn - plan.artHeightIn, "in")} below the bottom of the art (off this sheet).`,
            7,
            COLLAR_COLOUR,
          ),
        ),
      );
    }
  }
  notes.push(...titleLines(title, fonts.regular, 7.5, textWidth).map((text) => plain(text, 7.5)));
  notes.push(...wrapped(bold(PRINT_AT_FULL_SIZE, 7.5)));

  const texts: BandText[] = [];
  if (threeColumns) {
    const nameBottom = stack(nameLines, 0, BAND_GAP_PT, texts);
    const notesBottom = stack(notes, nameWidth + COLUMN_GAP_PT, BAND_GAP_PT, texts);
    const scale = { x: width - scaleWidth, top: BAND_GAP_PT };
    const bottom = Math.max(nameBottom, notesBottom, scale.top + SCALE_BLOCK_HEIGHT_PT);
    return { heightPt: bottom + BAND_FOOT_PT, texts, scale };
  }
  // Too narrow for three columns side by side: the name, then the notes, then the scale bars.
  const nameBottom = stack(nameLines, 0, BAND_GAP_PT, texts);
  const notesBottom = stack(notes, 0, nameBottom + 4, texts);
  const scale = { x: 0, top: notesBottom + 6 };
  return { heightPt: scale.top + SCALE_BLOCK_HEIGHT_PT + BAND_FOOT_PT, texts, scale };
}

/** Band depth a plan's pages need, inches, rounded up to BAND_STEP_IN. */
function bandDepthFor(plan: TilePlan, input: TestPrintInput, title: string, fonts: Fonts): number {
  let deepest = 0;
  for (const tile of plan.tiles)
    deepest = Math.max(deepest, layoutBand(plan, tile, input, title, fonts).heightPt);
  return Math.ceil(deepest / PT / BAND_STEP_IN - 1e-9) * BAND_STEP_IN;
}

/**
 * The tile plan with a label band deep enough for every page's labels. A deeper band can change
 * the plan (more pages, longer tile names, the other orientation), which can ask for a deeper
 * band again; the band only ever grows, so this settles in a few rounds.
 */
function planWithLabelBand(input: TestPrintInput, title: string, fonts: Fonts): TilePlan {
  let band = 0;
  for (let round = 0; round < 12; round++) {
    const plan = planTiles({
      artWidthIn: input.artWidthIn,
      artHeightIn: input.artHeightIn,
      paper: input.paper,
      marginIn: input.marginIn,
      overlapIn: input.overlapIn,
      orientation: input.orientation,
      mirror: input.mirror,
      labelBandIn: band,
    });
    const need = bandDepthFor(plan, input, title, fonts);
    if (need <= band) return plan;
    band = need;
  }
  throw new Error("The test print's labels did not settle on a band depth.");
}

/** The 1 in and 5 cm scale bars; each is a single filled rectangle of exact length. */
function drawScaleBlock(ctx: PageCtx, left: number, top: number): void {
  const { fonts, page } = ctx;
  page.drawText(SCALE_HEADING, {
    x: left,
    y: ctx.heightPt - top - SCALE_HEADING_SIZE_PT * BASELINE,
    size: SCALE_HEADING_SIZE_PT,
    font: fonts.bold,
    color: INK,
  });
  const bar = (barTop: number, length: number, step: number, endLabel: string) => {
    const x0 = left + SCALE_BAR_INSET_PT;
    const yBar = ctx.heightPt - barTop - SCALE_BAR_HEIGHT_PT;
    page.drawRectangle({ x: x0, y: yBar, width: length, height: SCALE_BAR_HEIGHT_PT, color: INK });
    for (let t = 0; t <= length + 1e-6; t += step) {
      const end = t === 0 || Math.abs(t - length) < 1e-6;
      page.drawLine({
        start: { x: x0 + t, y: yBar },
        end: { x: x0 + t, y: yBar - (end ? 5 : 2.5) },
        thickness: 0.5,
        color: INK,
      });
    }
    const labelY = yBar - SCALE_LABEL_DROP_PT;
    page.drawText("0", {
      x: x0 - 1.8,
      y: labelY,
      size: SCALE_LABEL_SIZE_PT,
      font: fonts.regular,
      color: INK,
    });
    const w = fonts.regular.widthOfTextAtSize(endLabel, SCALE_LABEL_SIZE_PT);
    page.drawText(endLabel, {
      x: x0 + length - w / 2,
      y: labelY,
      size: SCALE_LABEL_SIZE_PT,
      font: fonts.regular,
      color: INK,
    });
  };
  bar(top + SCALE_FIRST_BAR_TOP_PT, ONE_INCH_BAR_PT, ONE_INCH_BAR_PT / 4, "1 in");
  bar(top + SCALE_FIRST_BAR_TOP_PT + SCALE_BAR_PITCH_PT, FIVE_CM_BAR_PT, FIVE_CM_BAR_PT / 5, "5 cm");
}

/** Draws the page's label band below the art area. */
function drawLabelBand(ctx: PageCtx, input: TestPrintInput, title: string): void {
  const { plan, tile, fonts } = ctx;
  const band = layoutBand(plan, tile, input, title, fonts);
  const left = X(plan.marginIn);
  const top = X(plan.marginIn + plan.artAreaHeightIn);
  for (const t of band.texts) {
    ctx.page.drawText(t.text, {
      x: left + t.x,
      y: ctx.heightPt - (top + t.top + t.size * BASELINE),
      size: t.size,
      font: fonts[t.font],
      color: t.color,
    });
  }
  drawScaleBlock(ctx, left + band.scale.x, top + band.scale.top);
}

// ---------------------------------------------------------------------------------------

function requireGuide(value: number | undefined, what: string): void {
  if (value !== undefined && !Number.isFinite(value))
    throw new RangeError(`${what} must be a finite number of inches (got ${value}).`);
}

/**
 * Renders a tiled true-size test print. Throws RangeError for sizes the plan refuses (see
 * `planTiles`) and Error for art that cannot be read.
 */
export async function renderTestPrintPdf(input: TestPrintInput): Promise<TestPrintResult> {
  if (input.printArea) {
    const a = input.printArea;
    requireGuide(a.widthIn, "The print area width");
    requireGuide(a.heightIn, "The print area height");
    requireGuide(a.offsetXIn, "The print area offset");
    requireGuide(a.offsetYIn, "The print area offset");
  }
  requireGuide(input.collarLineYIn, "The collar line");

  const title = toWinAnsi(input.title).trim() || "Test print";
  const doc = await PDFDocument.create();
  doc.setTitle(`${title} - test print`);
  doc.setCreator("Chalkline");
  doc.setProducer("Chalkline");
  const fonts = {
    regular: await doc.embedFont(StandardFonts.Helvetica),
    bold: await doc.embedFont(StandardFonts.HelveticaBold),
  };
  const plan = planWithLabelBand(input, title, fonts);
  const art = await embedArt(doc, input.art, plan.artWidthIn, plan.artHeightIn);
  const byLabel = new Map(plan.tiles.map((t) => [t.label, t]));
  const widthPt = plan.pageWidthIn * PT;
  const heightPt = plan.pageHeightIn * PT;

  for (const tile of plan.tiles) {
    const page = doc.addPage([widthPt, heightPt]);
    const ctx: PageCtx = { page, plan, tile, fonts, heightPt };
    const map = artToPage(plan, tile);
    // Unit square of the image → the whole art at true size; a negative width flips it for a mirrored plan.
    drawClippedImage(
      page,
      art.ref,
      {
        a: (plan.mirrored ? -1 : 1) * plan.artWidthIn * PT,
        d: plan.artHeightIn * PT,
        e: X(map.x(0)),
        f: Y(ctx, map.y(plan.artHeightIn)),
      },
      {
        x: X(tile.pageX),
        y: Y(ctx, tile.pageY + tile.artHeight),
        width: X(tile.artWidth),
        height: X(tile.artHeight),
      },
    );
    drawGuides(ctx, input);
    const targets = drawOverlapBands(ctx, byLabel);
    for (const t of targets) target(ctx, t.x, t.y, t.radius, t.radius * 1.6, STRIP_COLOUR);
    drawLabelBand(ctx, input, title);
  }
  return { pdf: await doc.save(), plan };
}
