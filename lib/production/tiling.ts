/**
 * True-size tiled paper test prints.
 *
 * A decorator prints the design at 100% on an ordinary office printer, tapes the pages
 * together and holds the sheet against the garment. The art is cut into a grid of tiles;
 * each tile overlaps its right and lower neighbours by `overlapIn` so the pages can be
 * lined up and taped over the shared strip.
 *
 * Coordinates: inches. Art space has its origin at the art's top-left corner, x to the
 * right, y down. Page space has its origin at the page's top-left corner.
 *
 * A page's printable area (the page less its margins) may keep a label band along its lower
 * edge, as deep as the caller asks: no art is ever placed there, so the page's labels and
 * scale bars can be printed in it without covering the art. The art fills the rest, the art
 * area, from the printable area's top-left corner.
 *
 * Tile names are our own scheme: a letter for the row (A, B, … Z, AA, AB, …) and a number
 * for the column, so "B2" is the second row, second column as the taped sheet is seen.
 */

import { MM_PER_INCH } from "@/lib/units";

export type PaperId = "letter" | "a4" | "tabloid" | "a3";

export interface PaperSize {
  id: PaperId;
  label: string;
  /** Portrait width, inches. */
  widthIn: number;
  /** Portrait height, inches. */
  heightIn: number;
  /** Where the size comes from. */
  standard: string;
}

/** Office paper sizes, portrait. Millimetre sizes convert at 25.4 mm per inch (NIST SP 811). */
export const PAPER_SIZES: Readonly<Record<PaperId, PaperSize>> = {
  // ANSI/ASME Y14.1 size A: 8.5 × 11 in.
  letter: {
    id: "letter",
    label: "Letter (8.5 × 11 in)",
    widthIn: 8.5,
    heightIn: 11,
    standard: "ANSI/ASME Y14.1",
  },
  // ISO 216 A4: 210 × 297 mm.
  a4: {
    id: "a4",
    label: "A4 (210 × 297 mm)",
    widthIn: 210 / MM_PER_INCH,
    heightIn: 297 / MM_PER_INCH,
    standard: "ISO 216",
  },
  // ANSI/ASME Y14.1 size B: 11 × 17 in (tabloid in portrait, ledger in landscape).
  tabloid: {
    id: "tabloid",
    label: "Tabloid (11 × 17 in)",
    widthIn: 11,
    heightIn: 17,
    standard: "ANSI/ASME Y14.1",
  },
  // ISO 216 A3: 297 × 420 mm.
  a3: {
    id: "a3",
    label: "A3 (297 × 420 mm)",
    widthIn: 297 / MM_PER_INCH,
    heightIn: 420 / MM_PER_INCH,
    standard: "ISO 216",
  },
};

/** Unprintable border most office printers need, per side (common practice, no published source). */
export const DEFAULT_TILE_MARGIN_IN = 0.25;
/** Shared strip between neighbouring tiles for lining up and taping (common practice, no published source). */
export const DEFAULT_TILE_OVERLAP_IN = 0.5;
/** Most pages one test print may use (Chalkline's own limit: past this, print at a print shop instead). */
export const MAX_TILE_PAGES = 500;

/** Float slack when counting tiles, so 2.0000000000000004 steps count as 2 (far below a printer's dot). */
const COUNT_SLACK = 1e-9;

export type TileOrientation = "portrait" | "landscape";

export interface TileJoins {
  right?: string;
  below?: string;
  left?: string;
  above?: string;
}

export interface Tile {
  /** Position in print order (row by row, left to right), from 0. */
  index: number;
  /** Row from the top, from 0. */
  row: number;
  /** Column from the left of the taped sheet, from 0. */
  column: number;
  /** Our own name for the page, e.g. "B2". */
  label: string;
  /** The art-space rectangle this tile shows, inches. */
  artX: number;
  artY: number;
  artWidth: number;
  artHeight: number;
  /**
   * Where that rectangle is drawn, inches from the page's top-left. In a mirrored plan the
   * rectangle is drawn flipped left to right into [pageX, pageX + artWidth].
   */
  pageX: number;
  pageY: number;
  /** Labels of the neighbouring pages on the taped sheet. */
  joins: TileJoins;
}

export interface TilePlan {
  paperId: PaperId;
  orientation: TileOrientation;
  /** Whether the print is mirrored (for HTV and sublimation, printed wrong-reading). */
  mirrored: boolean;
  artWidthIn: number;
  artHeightIn: number;
  marginIn: number;
  overlapIn: number;
  /** Depth of the strip along the lower edge of the printable area kept free of art, inches. */
  labelBandIn: number;
  pageWidthIn: number;
  pageHeightIn: number;
  /** The page less its margins. */
  printableWidthIn: number;
  printableHeightIn: number;
  /** The part of the printable area the art may fill: all of it but the label band. */
  artAreaWidthIn: number;
  artAreaHeightIn: number;
  columns: number;
  rows: number;
  tiles: Tile[];
  pages: number;
}

export interface TileOptions {
  artWidthIn: number;
  artHeightIn: number;
  paper: PaperSize | PaperId;
  marginIn?: number;
  overlapIn?: number;
  /** Depth of a strip along the lower edge of the printable area to keep free of art. Default 0. */
  labelBandIn?: number;
  /** Default "auto": whichever needs fewer pages, portrait on a tie. */
  orientation?: TileOrientation | "auto";
  /** Print mirrored (see `mirrorX`). Default false. */
  mirror?: boolean;
}

/** Row letters: A … Z, AA, AB, … (bijective base 26). */
export function rowLetters(row: number): string {
  let n = row + 1;
  let text = "";
  while (n > 0) {
    const rem = (n - 1) % 26;
    text = String.fromCharCode(65 + rem) + text;
    n = Math.floor((n - 1) / 26);
  }
  return text;
}

export function tileLabel(row: number, column: number): string {
  return `${rowLetters(row)}${column + 1}`;
}

/** How many tiles, each showing `room` of art and sharing `overlap` with the next, cover `length`. */
function tileCount(length: number, room: number, overlap: number): number {
  if (length <= room) return 1;
  return Math.ceil((length - overlap) / (room - overlap) - COUNT_SLACK);
}

function requireFinite(value: number, what: string, min: "positive" | "non-negative"): void {
  if (!Number.isFinite(value) || (min === "positive" ? value <= 0 : value < 0)) {
    const bound = min === "positive" ? "more than 0" : "0 or more";
    throw new RangeError(`${what} must be a finite number of inches, ${bound} (got ${value}).`);
  }
}

function resolvePaper(paper: PaperSize | PaperId): PaperSize {
  if (typeof paper === "string") {
    const found = (PAPER_SIZES as Record<string, PaperSize | undefined>)[paper];
    if (!found) throw new RangeError(`Unknown paper size "${paper}".`);
    return found;
  }
  return paper;
}

interface Layout {
  orientation: TileOrientation;
  pageWidthIn: number;
  pageHeightIn: number;
  printableWidthIn: number;
  printableHeightIn: number;
  artAreaWidthIn: number;
  artAreaHeightIn: number;
  columns: number;
  rows: number;
}

function layoutFor(
  paper: PaperSize,
  orientation: TileOrientation,
  art: { w: number; h: number },
  marginIn: number,
  overlapIn: number,
  labelBandIn: number,
): Layout {
  const pageWidthIn = orientation === "portrait" ? paper.widthIn : paper.heightIn;
  const pageHeightIn = orientation === "portrait" ? paper.heightIn : paper.widthIn;
  const printableWidthIn = pageWidthIn - 2 * marginIn;
  const printableHeightIn = pageHeightIn - 2 * marginIn;
  const artAreaWidthIn = printableWidthIn;
  const artAreaHeightIn = printableHeightIn - labelBandIn;
  return {
    orientation,
    pageWidthIn,
    pageHeightIn,
    printableWidthIn,
    printableHeightIn,
    artAreaWidthIn,
    artAreaHeightIn,
    columns: tileCount(art.w, artAreaWidthIn, overlapIn),
    rows: tileCount(art.h, artAreaHeightIn, overlapIn),
  };
}

/** Slice `index` of a length cut into `count` tiles: [start, start + size]. */
function slice(index: number, count: number, length: number, room: number, overlap: number) {
  if (count === 1) return { start: 0, size: length };
  const start = index * (room - overlap);
  // The last slice takes what is left; never more than a page holds (float slack only).
  const size = index === count - 1 ? Math.min(room, length - start) : room;
  return { start, size };
}

/**
 * Cuts the art into pages. Throws RangeError for art sizes that are not positive, margins
 * (with the label band) that leave no room for art, an overlap as big as the art area, or a
 * plan needing more than MAX_TILE_PAGES pages.
 */
export function planTiles(options: TileOptions): TilePlan {
  const {
    artWidthIn,
    artHeightIn,
    marginIn = DEFAULT_TILE_MARGIN_IN,
    overlapIn = DEFAULT_TILE_OVERLAP_IN,
    labelBandIn = 0,
    orientation = "auto",
    mirror = false,
  } = options;
  const paper = resolvePaper(options.paper);
  requireFinite(artWidthIn, "The art width", "positive");
  requireFinite(artHeightIn, "The art height", "positive");
  requireFinite(paper.widthIn, "The paper width", "positive");
  requireFinite(paper.heightIn, "The paper height", "positive");
  requireFinite(marginIn, "The page margin", "non-negative");
  requireFinite(overlapIn, "The overlap", "non-negative");
  requireFinite(labelBandIn, "The label band", "non-negative");

  const shortSide = Math.min(paper.widthIn, paper.heightIn);
  const shortPrintable = shortSide - 2 * marginIn;
  if (shortPrintable <= 0) {
    throw new RangeError(
      `A ${marginIn} in margin on every side leaves no printable area on ${paper.label} paper.`,
    );
  }
  // The art area's shortest side in either orientation: the short side less margins and band.
  const shortArtArea = shortPrintable - labelBandIn;
  if (shortArtArea <= 0) {
    throw new RangeError(
      `A ${marginIn} in margin and a ${labelBandIn.toFixed(3)} in label band leave no room for art on ${paper.label} paper.`,
    );
  }
  if (overlapIn >= shortArtArea) {
    throw new RangeError(
      `The ${overlapIn} in overlap must be smaller than the printable area (${shortArtArea.toFixed(3)} in across${labelBandIn > 0 ? " above the label band" : ""}).`,
    );
  }

  const art = { w: artWidthIn, h: artHeightIn };
  let layout: Layout;
  if (orientation === "auto") {
    const portrait = layoutFor(paper, "portrait", art, marginIn, overlapIn, labelBandIn);
    const landscape = layoutFor(paper, "landscape", art, marginIn, overlapIn, labelBandIn);
    layout = landscape.columns * landscape.rows < portrait.columns * portrait.rows ? landscape : portrait;
  } else if (orientation === "portrait" || orientation === "landscape") {
    layout = layoutFor(paper, orientation, art, marginIn, overlapIn, labelBandIn);
  } else {
    throw new RangeError(`Orientation must be portrait, landscape or auto (got ${String(orientation)}).`);
  }

  const pages = layout.columns * layout.rows;
  if (pages > MAX_TILE_PAGES) {
    throw new RangeError(
      `This test print would need ${pages} pages, more than the ${MAX_TILE_PAGES} we allow; use larger paper or a smaller overlap.`,
    );
  }

  const { columns, rows } = layout;
  const tiles: Tile[] = [];
  for (let row = 0; row < rows; row++) {
    const ys = slice(row, rows, artHeightIn, layout.artAreaHeightIn, overlapIn);
    for (let column = 0; column < columns; column++) {
      const xs = slice(column, columns, artWidthIn, layout.artAreaWidthIn, overlapIn);
      const joins: TileJoins = {};
      if (column + 1 < columns) joins.right = tileLabel(row, column + 1);
      if (row + 1 < rows) joins.below = tileLabel(row + 1, column);
      if (column > 0) joins.left = tileLabel(row, column - 1);
      if (row > 0) joins.above = tileLabel(row - 1, column);
      tiles.push({
        index: row * columns + column,
        row,
        column,
        label: tileLabel(row, column),
        artX: xs.start,
        artY: ys.start,
        artWidth: xs.size,
        artHeight: ys.size,
        pageX: marginIn,
        pageY: marginIn,
        joins,
      });
    }
  }

  const plan: TilePlan = {
    paperId: paper.id,
    orientation: layout.orientation,
    mirrored: false,
    artWidthIn,
    artHeightIn,
    marginIn,
    overlapIn,
    labelBandIn,
    pageWidthIn: layout.pageWidthIn,
    pageHeightIn: layout.pageHeightIn,
    printableWidthIn: layout.printableWidthIn,
    printableHeightIn: layout.printableHeightIn,
    artAreaWidthIn: layout.artAreaWidthIn,
    artAreaHeightIn: layout.artAreaHeightIn,
    columns,
    rows,
    tiles,
    pages,
  };
  return mirror ? mirrorX(plan) : plan;
}

/**
 * The same test print, mirrored left to right (or back again).
 *
 * HTV and sublimation are printed wrong-reading, so the taped sheet must be the exact
 * reflection of the right-reading one. Reflect the whole taped sheet about its vertical
 * centre line: the page in column c lands in column (columns − 1 − c), keeping its art
 * rectangle, and its content is drawn flipped. So column 1 of a mirrored plan shows the
 * rightmost slice of the art. Each page's content also flips within the art area, so a
 * slice narrower than the art area moves from the left margin to the right:
 * pageX = margin + (art area width − artWidth). Rows and labels stay in place (labels name the
 * position on the sheet, not the slice of art), and neighbours keep their labels.
 *
 * This only moves existing tiles between positions, so mirrorX(mirrorX(plan)) equals plan
 * exactly, with no floating-point drift.
 */
export function mirrorX(plan: TilePlan): TilePlan {
  const mirrored = !plan.mirrored;
  const byPosition = new Map(plan.tiles.map((t) => [`${t.row}:${t.column}`, t]));
  const tiles = plan.tiles.map((target): Tile => {
    const source = byPosition.get(`${target.row}:${plan.columns - 1 - target.column}`)!;
    return {
      ...target,
      artX: source.artX,
      artY: source.artY,
      artWidth: source.artWidth,
      artHeight: source.artHeight,
      pageX: mirrored ? plan.marginIn + (plan.artAreaWidthIn - source.artWidth) : plan.marginIn,
      pageY: source.pageY,
      joins: { ...target.joins },
    };
  });
  return { ...plan, mirrored, tiles };
}

export interface TileCoverage {
  /** The union of the tiles' art rectangles contains the whole art. */
  coversArt: boolean;
  /** Every art rectangle lies inside the art. */
  insideArt: boolean;
  /** Every tile is drawn inside its page's art area: the printable area, clear of the label band. */
  insidePrintable: boolean;
  /** Art overlap (inches) between each tile and its right-hand neighbour on the sheet. */
  horizontalOverlaps: number[];
  /** Art overlap (inches) between each tile and the neighbour below it. */
  verticalOverlaps: number[];
}

const COVER_EPS = 1e-7;

function intervalOverlap(a0: number, a1: number, b0: number, b1: number): number {
  return Math.min(a1, b1) - Math.max(a0, b0);
}

/**
 * Checks a plan: whether the tiles' art rectangles cover the art (on the grid of every
 * rectangle edge, each cell's centre must fall in some tile; a union of rectangles covers a
 * cell of that grid wholly or not at all), whether the tiles stay inside the art and the
 * art area, and how much neighbouring tiles overlap.
 */
export function tileCoverage(plan: TilePlan): TileCoverage {
  const W = plan.artWidthIn;
  const H = plan.artHeightIn;
  const clampSort = (values: number[], max: number) =>
    [...new Set(values.map((v) => Math.min(max, Math.max(0, v))))].sort((a, b) => a - b);
  const xs = clampSort([0, W, ...plan.tiles.flatMap((t) => [t.artX, t.artX + t.artWidth])], W);
  const ys = clampSort([0, H, ...plan.tiles.flatMap((t) => [t.artY, t.artY + t.artHeight])], H);
  let coversArt = true;
  for (let i = 0; i + 1 < xs.length && coversArt; i++) {
    const x0 = xs[i]!;
    const x1 = xs[i + 1]!;
    if (x1 - x0 <= COVER_EPS) continue;
    const cx = (x0 + x1) / 2;
    for (let j = 0; j + 1 < ys.length; j++) {
      const y0 = ys[j]!;
      const y1 = ys[j + 1]!;
      if (y1 - y0 <= COVER_EPS) continue;
      const cy = (y0 + y1) / 2;
      const hit = plan.tiles.some(
        (t) => cx >= t.artX && cx <= t.artX + t.artWidth && cy >= t.artY && cy <= t.artY + t.artHeight,
      );
      if (!hit) {
        coversArt = false;
        break;
      }
    }
  }

  const insideArt = plan.tiles.every(
    (t) =>
      t.artX >= -COVER_EPS &&
      t.artY >= -COVER_EPS &&
      t.artX + t.artWidth <= W + COVER_EPS &&
      t.artY + t.artHeight <= H + COVER_EPS &&
      t.artWidth > 0 &&
      t.artHeight > 0,
  );
  const m = plan.marginIn;
  const insidePrintable = plan.tiles.every(
    (t) =>
      t.pageX >= m - COVER_EPS &&
      t.pageY >= m - COVER_EPS &&
      t.pageX + t.artWidth <= m + plan.artAreaWidthIn + COVER_EPS &&
      t.pageY + t.artHeight <= m + plan.artAreaHeightIn + COVER_EPS,
  );

  const at = new Map(plan.tiles.map((t) => [`${t.row}:${t.column}`, t]));
  const horizontalOverlaps: number[] = [];
  const verticalOverlaps: number[] = [];
  for (const t of plan.tiles) {
    const right = at.get(`${t.row}:${t.column + 1}`);
    if (right)
      horizontalOverlaps.push(
        intervalOverlap(t.artX, t.artX + t.artWidth, right.artX, right.artX + right.artWidth),
      );
    const below = at.get(`${t.row + 1}:${t.column}`);
    if (below)
      verticalOverlaps.push(
        intervalOverlap(t.artY, t.artY + t.artHeight, below.artY, below.artY + below.artHeight),
      );
  }
  return { coversArt, insideArt, insidePrintable, horizontalOverlaps, verticalOverlaps };
}
