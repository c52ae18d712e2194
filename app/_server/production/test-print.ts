import "server-only";
import { deflateSync } from "node:zlib";
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
import { fitText, toWinAnsi, wrapText } from "./spec-sheet";

/**
 * True-size tiled test prints as a PDF.
 *
 * Each page is the chosen paper in PDF points (72 per inch, ISO 32000). The tile's slice of
 * the art is drawn at true size (1 in of art = 72 pt) inside the page margins, clipped to
 * the tile, using the plan from `planTiles` (or its mirror for HTV and sublimation). On top:
 * shaded overlap strips with round targets that land on each other when the pages are
 * taped, registration marks at the corners of the printable area, the page's label and what
 * to tape it to, two scale bars (1 in and 5 cm) and a footer saying to print at 100%.
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
const BAND = rgb(0.25, 0.45, 0.85);
const PRINT_AREA_COLOUR = rgb(0.1, 0.35, 0.85);
const COLLAR_COLOUR = rgb(0.85, 0.15, 0.15);
const WHITE = rgb(1, 1, 1);

// ---------------------------------------------------------------------------------------
// Images

/**
 * Puts 8-bit RGBA pixels (straight alpha, sRGB) into the PDF as an image XObject, colour in
 * one Flate stream and alpha as a soft mask (left out when every pixel is opaque). Deflate is
 * Node's own zlib, so print-size rasters embed quickly.
 */
export function embedRgbaPixels(doc: PDFDocument, rgba: Uint8Array, width: number, height: number): PDFRef {
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
  const ctx = doc.context;
  const base = {
    Type: "XObject",
    Subtype: "Image",
    Width: width,
    Height: height,
    BitsPerComponent: 8,
    Filter: "FlateDecode",
  };
  const smask = opaque
    ? undefined
    : ctx.register(ctx.stream(deflateSync(alpha), { ...base, ColorSpace: "DeviceGray" }));
  return ctx.register(
    ctx.stream(deflateSync(colour), { ...base, ColorSpace: "DeviceRGB", ...(smask ? { SMask: smask } : {}) }),
  );
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
      color: BAND,
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

/** Page-inch insets that keep the panels off the shaded strips (our own layout). */
function panelInsets(ctx: PageCtx): { left: number; top: number; bottom: number } {
  const { plan, tile } = ctx;
  const strip = (side: keyof TileJoins) => (tile.joins[side] && plan.overlapIn > 0 ? plan.overlapIn : 0);
  // In a mirrored plan the page is flipped, but the joins already name sheet positions, as drawn.
  return { left: 0.3 + strip("left"), top: 0.3 + strip("above"), bottom: strip("below") };
}

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
    if (collar !== undefined && collar >= tile.artY && collar <= tile.artY + tile.artHeight) {
      const y = Y(ctx, artToPage(plan, tile).y(collar));
      page.drawLine({
        start: { x: X(tile.pageX), y },
        end: { x: X(tile.pageX + tile.artWidth), y },
        thickness: 1,
        color: COLLAR_COLOUR,
        dashArray: [8, 3, 2, 3],
      });
      page.drawText("COLLAR LINE", {
        x: X(tile.pageX) + 4,
        y: y + 3,
        size: 6.5,
        font: ctx.fonts.bold,
        color: COLLAR_COLOUR,
      });
    }
  });
}

function drawRegistrationMarks(ctx: PageCtx): void {
  const { plan } = ctx;
  const m = plan.marginIn;
  const corners = [
    [m, m],
    [m + plan.printableWidthIn, m],
    [m, m + plan.printableHeightIn],
    [m + plan.printableWidthIn, m + plan.printableHeightIn],
  ] as const;
  for (const [x, y] of corners) target(ctx, x, y, 0.12, 0.2);
}

function panelBox(ctx: PageCtx, x: number, top: number, w: number, h: number): void {
  ctx.page.drawRectangle({
    x,
    y: ctx.heightPt - top - h,
    width: w,
    height: h,
    color: WHITE,
    opacity: 0.88,
    borderColor: MUTED,
    borderWidth: 0.5,
    borderOpacity: 0.9,
  });
}

function drawLabelPanel(ctx: PageCtx, input: TestPrintInput): void {
  const { plan, tile, fonts } = ctx;
  const inset = panelInsets(ctx);
  const left = X(plan.marginIn + inset.left);
  const top = X(plan.marginIn + inset.top);
  const width = Math.min(X(3.9), X(plan.printableWidthIn - 0.6));
  const inner = width - 16;
  const lines: Array<{ text: string; size: number; bold?: boolean; color?: RGB }> = [];
  const push = (text: string, size: number, opts: { bold?: boolean; color?: RGB } = {}) => {
    for (const line of wrapText(text, opts.bold ? fonts.bold : fonts.regular, size, inner))
      lines.push({ text: line, size, ...opts });
  };
  push(joinInstruction(tile.joins), 8.5, { bold: true });
  if (plan.overlapIn > 0 && plan.pages > 1) {
    push(
      `Neighbouring pages share a ${formatLength(plan.overlapIn, "in")} shaded strip: lay one over the other so the round targets meet.`,
      7,
    );
  }
  if (plan.mirrored) push("MIRRORED (wrong-reading) for HTV or sublimation.", 7.5, { bold: true });
  if (input.printArea) push("Blue dashed box: print area.", 7, { color: PRINT_AREA_COLOUR });
  if (input.collarLineYIn !== undefined) {
    push("Red dashed line: collar line.", 7, { color: COLLAR_COLOUR });
    if (tile.row === 0 && input.collarLineYIn < 0) {
      push(
        `The collar line is ${formatLength(-input.collarLineYIn, "in")} above the top of the art (off this sheet).`,
        7,
        { color: COLLAR_COLOUR },
      );
    }
    if (tile.row === plan.rows - 1 && input.collarLineYIn > plan.artHeightIn) {
      push(
        `The collar line is ${formatLength(input.collarLineYIn - plan.artHeightIn, "in")} below the bottom of the art (off this sheet).`,
        7,
        { color: COLLAR_COLOUR },
      );
    }
  }
  const labelSize = 22;
  const height = 8 + labelSize + 4 + lines.reduce((h, l) => h + l.size * 1.3, 0) + 6;
  panelBox(ctx, left, top, width, height);
  const labelText = toWinAnsi(tile.label);
  ctx.page.drawText(labelText, {
    x: left + 8,
    y: ctx.heightPt - top - 6 - labelSize * 0.8,
    size: labelSize,
    font: fonts.bold,
    color: INK,
  });
  const labelW = fonts.bold.widthOfTextAtSize(labelText, labelSize);
  const where = fitText(
    `Row ${tile.label.replace(/\d+$/, "")}, column ${tile.column + 1} - page ${tile.index + 1} of ${plan.pages} (${plan.rows} x ${plan.columns})`,
    fonts.regular,
    7.5,
    Math.max(10, inner - labelW - 8),
  );
  ctx.page.drawText(where, {
    x: left + 8 + labelW + 8,
    y: ctx.heightPt - top - 6 - labelSize * 0.55,
    size: 7.5,
    font: fonts.regular,
    color: MUTED,
  });
  let y = top + 8 + labelSize + 4;
  for (const line of lines) {
    y += line.size * 1.3;
    ctx.page.drawText(line.text, {
      x: left + 8,
      y: ctx.heightPt - y + line.size * 0.25,
      size: line.size,
      font: line.bold ? fonts.bold : fonts.regular,
      color: line.color ?? INK,
    });
  }
}

/** The two scale bars, bottom-left of the printable area; both are single filled rectangles of exact length. */
function drawScalePanel(ctx: PageCtx): void {
  const { plan, fonts, page } = ctx;
  const width = FIVE_CM_BAR_PT + 46;
  const height = 70;
  const inset = panelInsets(ctx);
  const left = X(plan.marginIn + inset.left);
  const top = X(plan.marginIn + plan.printableHeightIn - inset.bottom) - 0.32 * PT - height - 6;
  panelBox(ctx, left, top, width, height);
  page.drawText("Check the scale: these bars must measure", {
    x: left + 8,
    y: ctx.heightPt - top - 12,
    size: 7,
    font: fonts.bold,
    color: INK,
  });
  const bar = (barTop: number, length: number, step: number, endLabel: string) => {
    const x0 = left + 8;
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
    page.drawText("0", { x: x0 - 1.8, y: yBar - 12, size: 6.5, font: fonts.regular, color: INK });
    const w = fonts.regular.widthOfTextAtSize(endLabel, 6.5);
    page.drawText(endLabel, {
      x: x0 + length - w / 2,
      y: yBar - 12,
      size: 6.5,
      font: fonts.regular,
      color: INK,
    });
  };
  bar(top + 20, ONE_INCH_BAR_PT, ONE_INCH_BAR_PT / 4, "1 in");
  bar(top + 44, FIVE_CM_BAR_PT, FIVE_CM_BAR_PT / 5, "5 cm");
}

function drawFooter(ctx: PageCtx, title: string): void {
  const { plan, tile, fonts, page } = ctx;
  const left = X(plan.marginIn + 0.05);
  const width = X(plan.printableWidthIn - 0.1);
  const top = X(plan.marginIn + plan.printableHeightIn - panelInsets(ctx).bottom) - 0.3 * PT;
  panelBox(ctx, left, top, width, 0.25 * PT);
  const instruction = "Print at 100% / Actual size - do not fit to page";
  const pageText = `Page ${tile.index + 1} of ${plan.pages} (${tile.label})`;
  const size = 7.5;
  const fixedW =
    fonts.bold.widthOfTextAtSize(instruction, size) +
    fonts.regular.widthOfTextAtSize(`${pageText}  |  `, size);
  const titleText = fitText(
    title,
    fonts.regular,
    size,
    Math.max(20, width - 16 - fixedW - fonts.regular.widthOfTextAtSize("  |  ", size)),
  );
  const first = `${titleText}  |  ${pageText}  |  `;
  const y = ctx.heightPt - top - 0.25 * PT + 6;
  page.drawText(first, { x: left + 8, y, size, font: fonts.regular, color: INK });
  page.drawText(instruction, {
    x: left + 8 + fonts.regular.widthOfTextAtSize(first, size),
    y,
    size,
    font: fonts.bold,
    color: INK,
  });
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
  const plan = planTiles({
    artWidthIn: input.artWidthIn,
    artHeightIn: input.artHeightIn,
    paper: input.paper,
    marginIn: input.marginIn,
    overlapIn: input.overlapIn,
    orientation: input.orientation,
    mirror: input.mirror,
  });
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
    drawLabelPanel(ctx, input);
    drawScalePanel(ctx);
    drawFooter(ctx, title);
    // Marks last, so no panel ever hides one.
    for (const t of targets) target(ctx, t.x, t.y, t.radius, t.radius * 1.6, BAND);
    drawRegistrationMarks(ctx);
  }
  return { pdf: await doc.save(), plan };
}
