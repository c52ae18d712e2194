/**
 * DTF gang sheet packing: laying a job's transfers out on a roll of fixed width.
 *
 * Coordinates are inches from the sheet's top-left corner; x runs across the roll, y down
 * its length. Every piece keeps `edgeMarginIn` from the roll's edges and from the sheet's
 * start and end, and `gapIn` from every other piece (room for the cutter).
 *
 * How gaps are handled: each piece is grown by one gap on its right and lower sides, and
 * the usable width (and length) by one gap. Grown pieces that merely touch leave exactly
 * one gap between the real pieces, and the extra gap at the far edge is never printed on.
 * So every packer below works on touching rectangles in a frame
 *   U = rollWidth − 2·margin + gap wide and  Lc = maxSheetLength − 2·margin + gap long,
 * and a grown piece at (px, py) is printed at (margin + px, margin + py).
 *
 * Packers:
 *  - "own": our own skyline packer. It keeps the outline of what is already placed and puts
 *    each piece where its far edge ends up nearest the sheet start (ties to the leftmost, or
 *    to the most contact with what is there), or where it buries the least empty area. It
 *    tries 5 piece orders × up to 4 rotation rules × those 3 scores, then spends a fixed,
 *    seeded budget of swaps and turns on the best one, and keeps the shortest layout.
 *  - "shelf": first-fit shelves in falling height: our simple baseline.
 *  - "maxrects": the reference library maxrects-packer (free-rectangle lists), in a bin the
 *    roll's width by the longest sheet, with its own padding and border doing gap and margin.
 *  - "potpack": the reference library potpack. It has no fixed width: it packs everything
 *    into one near-square box. Our adapter fills one near-square block at a time with as many
 *    pieces as keep potpack's box inside the roll width, then stacks the blocks down the
 *    roll. potpack never rotates; the adapter turns only pieces that fit no other way.
 *    `comparePackers` also reports potpack's own box for the whole job, as it comes.
 */

import type * as MaxRectsApi from "maxrects-packer";
// The package's "main" is a UMD file that Node's ES module loader (so vitest and tsx too)
// reads with no exports at all; its ES build is this file, which ships no typings of its
// own, so it is typed with the package's declarations below.
// @ts-expect-error: no declaration file for the ES build path
import * as maxrectsEsm from "maxrects-packer/dist/maxrects-packer.mjs";
import potpack, { type PotpackBox } from "potpack";

const { MaxRectsPacker } = maxrectsEsm as typeof MaxRectsApi;

export interface TransferItem {
  id: string;
  widthIn: number;
  heightIn: number;
  quantity: number;
}

export interface TransferPiece {
  /** Unique per piece: `${itemId}#${n}`, n from 1. */
  pieceId: string;
  itemId: string;
  widthIn: number;
  heightIn: number;
}

export type PackerAlgorithm = "best" | "own" | "shelf" | "maxrects" | "potpack";

export const PACKER_ALGORITHMS: readonly PackerAlgorithm[] = ["best", "own", "shelf", "maxrects", "potpack"];

/** Roll widths offered for DTF film, inches (common practice, no published source). */
export const ROLL_WIDTHS_IN = [11, 13, 22, 24] as const;
/** The usual DTF roll width, inches (common practice, no published source). */
export const DEFAULT_ROLL_WIDTH_IN = 22;
/** Space between pieces for cutting, inches (common practice, no published source). */
export const DEFAULT_GAP_IN = 0.25;
/** Clear strip along every edge of a sheet, inches (our own default). */
export const DEFAULT_EDGE_MARGIN_IN = 0.25;
/** Longest single gang sheet before a new one starts, inches (our own default: 10 ft). */
export const DEFAULT_MAX_SHEET_LENGTH_IN = 120;

/**
 * The packer the product uses: "best" packs with maxrects-packer, and on jobs of up to
 * OWN_FULL_SEARCH_MAX pieces also with our own skyline search, and keeps the shorter layout
 * (fewer sheets on a tie of length; maxrects on a full tie). Larger jobs get maxrects alone, so
 * "best" stays near maxrects' own time there and is never longer than its sheet (`npm run bench`
 * prints both). The result names the packer whose layout was kept. Deterministic: the same job
 * always packs the same way, in the browser's forecast and in the export alike.
 */
export const DEFAULT_PACKER: PackerAlgorithm = "best";

/** Pieces up to which our search also runs (our own limit: a few tens of milliseconds there). */
export const OWN_FULL_SEARCH_MAX = 150;

/**
 * A 50-piece order of the kind a DTF gang sheet holds (invented sizes, common practice,
 * no published source): full fronts, a youth front, name bars, left chests, sleeves, tags.
 */
export const BENCH_MIX_50: readonly TransferItem[] = [
  { id: "full-front", widthIn: 11, heightIn: 11, quantity: 8 },
  { id: "youth-front", widthIn: 8, heightIn: 9, quantity: 4 },
  { id: "name-bar", widthIn: 10, heightIn: 4, quantity: 6 },
  { id: "left-chest", widthIn: 3.5, heightIn: 3.5, quantity: 16 },
  { id: "sleeve", widthIn: 4, heightIn: 12, quantity: 6 },
  { id: "neck-tag", widthIn: 2, heightIn: 2, quantity: 10 },
];

export interface GangPlacement {
  pieceId: string;
  itemId: string;
  /** Top-left corner of the printed piece, inches from the sheet's top-left. */
  x: number;
  y: number;
  /** As laid on the sheet (after any turn). */
  widthIn: number;
  heightIn: number;
  /** Turned 90° from the piece's own width × height. */
  rotated: boolean;
}

export interface GangSheet {
  index: number;
  /** From the sheet's start to the end of its last piece plus the edge margin. */
  lengthIn: number;
  placements: GangPlacement[];
}

export interface GangSheetResult {
  algorithm: PackerAlgorithm;
  rollWidthIn: number;
  sheets: GangSheet[];
  totalLengthIn: number;
  /** Printed area of all pieces, in². */
  usedAreaIn2: number;
  /** Roll width × total length, in². */
  sheetAreaIn2: number;
  /** usedAreaIn2 / sheetAreaIn2 (0 for an empty job). */
  efficiency: number;
}

export interface GangSheetOptions {
  pieces: readonly TransferPiece[];
  rollWidthIn?: number;
  gapIn?: number;
  allowRotation?: boolean;
  maxSheetLengthIn?: number;
  edgeMarginIn?: number;
  algorithm?: PackerAlgorithm;
}

/** Float slack for fits (inches; far below anything a printer can place). */
const FIT_EPS = 1e-9;

/**
 * Smallest side a piece may have, inches (Chalkline's own limit): far below any transfer that is
 * cut, and a million times FIT_EPS, so the packers' fit checks are decided by sizes, not by slack.
 */
export const MIN_PIECE_SIDE_IN = 0.001;

function requireNumber(value: number, what: string, rule: "positive" | "non-negative"): void {
  if (!Number.isFinite(value) || (rule === "positive" ? value <= 0 : value < 0)) {
    const bound = rule === "positive" ? "more than 0" : "0 or more";
    throw new RangeError(`${what} must be a finite number, ${bound} (got ${value}).`);
  }
}

function inches(n: number): string {
  return `${Number(n.toFixed(3))} in`;
}

/**
 * One piece per printed transfer: the ordered quantity plus spares, ceil(quantity × spare%),
 * for misprints and weeding losses.
 */
export function expandTransfers(items: readonly TransferItem[], sparePercent = 0): TransferPiece[] {
  requireNumber(sparePercent, "The spare percentage", "non-negative");
  const seen = new Set<string>();
  const pieces: TransferPiece[] = [];
  for (const item of items) {
    if (typeof item.id !== "string" || item.id.trim() === "")
      throw new RangeError("Every transfer needs an id.");
    if (seen.has(item.id)) throw new RangeError(`Transfer ${item.id} is listed twice.`);
    seen.add(item.id);
    requireNumber(item.widthIn, `The width of transfer ${item.id}`, "positive");
    requireNumber(item.heightIn, `The height of transfer ${item.id}`, "positive");
    if (!Number.isInteger(item.quantity) || item.quantity < 0) {
      throw new RangeError(
        `The quantity of transfer ${item.id} must be a whole number, 0 or more (got ${item.quantity}).`,
      );
    }
    // Slack so that 1000 × 0.7% = 7.000000000000001 still means 7 spares.
    const spares = item.quantity === 0 ? 0 : Math.ceil((item.quantity * sparePercent) / 100 - 1e-9);
    const count = item.quantity + spares;
    for (let n = 1; n <= count; n++) {
      pieces.push({
        pieceId: `${item.id}#${n}`,
        itemId: item.id,
        widthIn: item.widthIn,
        heightIn: item.heightIn,
      });
    }
  }
  return pieces;
}

/**
 * A lower bound on the total roll length, inches. Two bounds, whichever is larger:
 *  - printed area ÷ usable width (rollWidth − 2·margin): pieces cannot overlap;
 *  - grown area Σ(w + gap)(h + gap) ÷ (rollWidth − 2·margin + gap), which counts the gaps;
 *    it holds when gap ≤ 2·margin (as with our defaults), since a sheet of length L offers
 *    grown pieces L − 2·margin + gap ≤ L of length.
 * With no margin and the gap counted against the full width this is the plain
 * "grown area ÷ roll width" figure, and never below it when gap ≤ 2·margin.
 */
export function areaLowerBound(
  pieces: readonly Pick<TransferPiece, "widthIn" | "heightIn">[],
  rollWidthIn: number,
  gapIn: number,
  edgeMarginIn = DEFAULT_EDGE_MARGIN_IN,
): number {
  requireNumber(rollWidthIn, "The roll width", "positive");
  requireNumber(gapIn, "The gap", "non-negative");
  requireNumber(edgeMarginIn, "The edge margin", "non-negative");
  const usable = rollWidthIn - 2 * edgeMarginIn;
  if (usable <= 0) throw new RangeError("The edge margins leave no usable roll width.");
  let printed = 0;
  let grown = 0;
  for (const p of pieces) {
    printed += p.widthIn * p.heightIn;
    grown += (p.widthIn + gapIn) * (p.heightIn + gapIn);
  }
  const byPrinted = printed / usable;
  const byGrown = gapIn <= 2 * edgeMarginIn ? grown / (usable + gapIn) : 0;
  return Math.max(byPrinted, byGrown);
}

// ---------------------------------------------------------------------------------------
// Shared frame

interface Frame {
  /** Usable width for grown pieces: rollWidth + gap − 2·margin. */
  width: number;
  /** Usable length for grown pieces: maxSheetLength + gap − 2·margin. */
  length: number;
  gap: number;
  margin: number;
  allowRotation: boolean;
}

/** A piece in the frame: its index into the job and its grown size as given. */
interface Grown {
  ref: number;
  w: number;
  h: number;
}

/** A grown piece put down at (x, y) in the frame; `rotated` swaps w and h. */
interface Spot {
  ref: number;
  x: number;
  y: number;
  rotated: boolean;
}

type SheetSpots = Spot[];

function fits(frame: Frame, w: number, h: number): boolean {
  return w <= frame.width + FIT_EPS && h <= frame.length + FIT_EPS;
}

// ---------------------------------------------------------------------------------------
// "own": skyline packer

interface Segment {
  x: number;
  y: number;
  w: number;
}

type SkylineScore = "lowest-top" | "least-waste" | "snug";
type RotationRule = "as-given" | "free" | "lying" | "standing";
type PieceOrder = "height" | "area" | "width" | "long-side" | "perimeter";

interface Candidate {
  x: number;
  y: number;
  w: number;
  h: number;
  rotated: boolean;
  primary: number;
  secondary: number;
}

/** A grown piece in the orientation it will be tried first. */
interface Oriented {
  g: Grown;
  w: number;
  h: number;
  rotated: boolean;
}

/** Highest outline under [x, x + w), and the empty area a piece there would bury. */
function restingHeight(segments: readonly Segment[], x: number, w: number): { y: number; waste: number } {
  let y = 0;
  const right = x + w;
  for (const s of segments) {
    if (s.x + s.w <= x + FIT_EPS || s.x >= right - FIT_EPS) continue;
    if (s.y > y) y = s.y;
  }
  let waste = 0;
  for (const s of segments) {
    const lo = Math.max(s.x, x);
    const hi = Math.min(s.x + s.w, right);
    if (hi > lo) waste += (hi - lo) * (y - s.y);
  }
  return { y, waste };
}

/** Length of the piece's bottom and sides that touches the outline, the roll edges or taller neighbours. */
function contactLength(
  segments: readonly Segment[],
  frame: Frame,
  x: number,
  y: number,
  w: number,
  h: number,
): number {
  let contact = 0;
  if (x <= FIT_EPS) contact += h;
  if (x + w >= frame.width - FIT_EPS) contact += h;
  for (const t of segments) {
    const lo = Math.max(t.x, x);
    const hi = Math.min(t.x + t.w, x + w);
    if (hi > lo && Math.abs(t.y - y) <= FIT_EPS) contact += hi - lo;
    if (t.y > y && Math.abs(t.x + t.w - x) <= FIT_EPS) contact += Math.min(t.y, y + h) - y;
    if (t.y > y && Math.abs(t.x - (x + w)) <= FIT_EPS) contact += Math.min(t.y, y + h) - y;
  }
  return contact;
}

/**
 * Best resting place for a w × h piece on the outline. Candidates: against the left end of
 * every outline step, and against its right end. Scores (lower is better):
 *  - lowest-top: the piece's far edge nearest the sheet start, then leftmost;
 *  - least-waste: the least empty area buried under the piece, then lowest top;
 *  - snug: lowest top, then the most contact with what is already there.
 */
function bestSpot(
  segments: readonly Segment[],
  frame: Frame,
  w: number,
  h: number,
  rotated: boolean,
  score: SkylineScore,
  best: Candidate | undefined,
): Candidate | undefined {
  if (w > frame.width + FIT_EPS) return best;
  for (const s of segments) {
    for (const x of [s.x, s.x + s.w - w]) {
      if (x < -FIT_EPS || x + w > frame.width + FIT_EPS) continue;
      const at = Math.max(0, x);
      const { y, waste } = restingHeight(segments, at, w);
      if (y + h > frame.length + FIT_EPS) continue;
      let primary: number;
      let secondary: number;
      if (score === "lowest-top") {
        primary = y + h;
        secondary = at;
      } else if (score === "least-waste") {
        primary = waste;
        secondary = y + h;
      } else {
        primary = y + h;
        secondary = -contactLength(segments, frame, at, y, w, h);
      }
      if (
        !best ||
        primary < best.primary - FIT_EPS ||
        (primary <= best.primary + FIT_EPS &&
          (secondary < best.secondary - FIT_EPS ||
            (secondary <= best.secondary + FIT_EPS && at < best.x - FIT_EPS)))
      ) {
        best = { x: at, y, w, h, rotated, primary, secondary };
      }
    }
  }
  return best;
}

function raise(segments: Segment[], x: number, w: number, top: number): Segment[] {
  const right = x + w;
  const next: Segment[] = [];
  for (const s of segments) {
    const sRight = s.x + s.w;
    if (sRight <= x + FIT_EPS || s.x >= right - FIT_EPS) {
      next.push(s);
      continue;
    }
    if (s.x < x - FIT_EPS) next.push({ x: s.x, y: s.y, w: x - s.x });
    if (sRight > right + FIT_EPS) next.push({ x: right, y: s.y, w: sRight - right });
  }
  next.push({ x, y: top, w });
  next.sort((a, b) => a.x - b.x);
  const merged: Segment[] = [];
  for (const s of next) {
    const last = merged[merged.length - 1];
    if (last && Math.abs(last.y - s.y) <= FIT_EPS) last.w = s.x + s.w - last.x;
    else merged.push({ ...s });
  }
  return merged;
}

function orient(frame: Frame, g: Grown, turned: boolean): Oriented {
  return turned ? { g, w: g.h, h: g.w, rotated: true } : { g, w: g.w, h: g.h, rotated: false };
}

function orientFor(rule: RotationRule, frame: Frame, g: Grown): Oriented {
  if (!frame.allowRotation) return orient(frame, g, false);
  const okGiven = fits(frame, g.w, g.h);
  const okTurned = fits(frame, g.h, g.w);
  if (!okGiven) return orient(frame, g, true);
  if (!okTurned || rule === "as-given" || rule === "free") return orient(frame, g, false);
  const lying = g.w < g.h;
  return orient(frame, g, rule === "lying" ? lying : !lying);
}

function orderKey(order: PieceOrder, w: number, h: number): [number, number] {
  switch (order) {
    case "height":
      return [h, w];
    case "width":
      return [w, h];
    case "area":
      return [w * h, Math.max(w, h)];
    case "long-side":
      return [Math.max(w, h), Math.min(w, h)];
    case "perimeter":
      return [w + h, Math.max(w, h)];
  }
}

/** Places pieces in the given order, each at its best resting place; what does not fit waits for the next sheet. */
function skylineLayout(
  items: readonly Oriented[],
  frame: Frame,
  free: boolean,
  score: SkylineScore,
): SheetSpots[] {
  const sheets: SheetSpots[] = [];
  let waiting = items;
  while (waiting.length > 0) {
    let segments: Segment[] = [{ x: 0, y: 0, w: frame.width }];
    const spots: Spot[] = [];
    const later: Oriented[] = [];
    for (const item of waiting) {
      let best = bestSpot(segments, frame, item.w, item.h, item.rotated, score, undefined);
      if (free && frame.allowRotation)
        best = bestSpot(segments, frame, item.h, item.w, !item.rotated, score, best);
      if (!best) {
        later.push(item);
        continue;
      }
      spots.push({ ref: item.g.ref, x: best.x, y: best.y, rotated: best.rotated });
      segments = raise(segments, best.x, best.w, best.y + best.h);
    }
    if (spots.length === 0) throw new Error("A piece that fits an empty sheet could not be placed.");
    sheets.push(spots);
    waiting = later;
  }
  return sheets;
}

/** Sum over sheets of the furthest grown-piece end; ranks candidate layouts like printed length does. */
function spotsLength(grown: readonly Grown[], sheets: readonly SheetSpots[]): number {
  let total = 0;
  for (const spots of sheets) {
    let end = 0;
    for (const s of spots) {
      const g = grown[s.ref]!;
      end = Math.max(end, s.y + (s.rotated ? g.w : g.h));
    }
    total += end;
  }
  return total;
}

const PIECE_ORDERS: readonly PieceOrder[] = ["height", "area", "width", "long-side", "perimeter"];
const SKYLINE_SCORES: readonly SkylineScore[] = ["lowest-top", "least-waste", "snug"];
/**
 * Extra layouts the improvement pass tries for a job of up to 50 pieces; larger jobs get
 * proportionally fewer (our own budget: a few tens of milliseconds for a typical order).
 */
const IMPROVE_BUDGET = 300;

/** Small deterministic pseudo-random sequence (mulberry32) so the same job always packs the same way. */
function sequence(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

interface Trial {
  items: Oriented[];
  free: boolean;
  score: SkylineScore;
  sheets: SheetSpots[];
  length: number;
}

function better(
  a: { length: number; sheets: SheetSpots[] },
  b: { length: number; sheets: SheetSpots[] } | undefined,
) {
  return (
    !b ||
    a.length < b.length - FIT_EPS ||
    (a.length <= b.length + FIT_EPS && a.sheets.length < b.sheets.length)
  );
}

/** "best": maxrects-packer and our search side by side; the shorter layout, and which packer made it. */
function packBest(n: Normalised): { spots: SheetSpots[]; used: PackerAlgorithm } {
  const reference = packMaxRects(n.pieces, n.grown, n.frame, n.rollWidthIn, n.maxSheetLengthIn);
  const count = n.grown.length;
  // On a large job maxrects-packer alone: ours costs several of its runs per layout there and,
  // in our trials, no longer comes out shorter (500 pieces of BENCH_MIX_50: 1054 in against 1050 in).
  if (count > OWN_FULL_SEARCH_MAX) return { spots: reference, used: "maxrects" };
  const ours = packOwn(n.grown, n.frame);
  const a = spotsLength(n.grown, ours);
  const b = spotsLength(n.grown, reference);
  const oursWins = a < b - FIT_EPS || (a <= b + FIT_EPS && ours.length < reference.length);
  return oursWins ? { spots: ours, used: "own" } : { spots: reference, used: "maxrects" };
}

function packOwn(grown: readonly Grown[], frame: Frame): SheetSpots[] {
  const rules: RotationRule[] = frame.allowRotation
    ? ["as-given", "free", "lying", "standing"]
    : ["as-given"];
  let best: Trial | undefined;
  for (const rule of rules) {
    for (const order of PIECE_ORDERS) {
      const items = grown.map((g) => orientFor(rule, frame, g));
      items.sort((a, b) => {
        const ka = orderKey(order, a.w, a.h);
        const kb = orderKey(order, b.w, b.h);
        return kb[0] - ka[0] || kb[1] - ka[1] || a.g.ref - b.g.ref;
      });
      for (const score of SKYLINE_SCORES) {
        const sheets = skylineLayout(items, frame, rule === "free", score);
        const trial = { items, free: rule === "free", score, sheets, length: spotsLength(grown, sheets) };
        if (better(trial, best)) best = trial;
      }
    }
  }
  if (!best) return [];

  // Improvement pass: swap two pieces in the order, or turn one, and keep the change when
  // the layout gets no longer (equal length lets the search move along a plateau).
  const n = best.items.length;
  const next = sequence(n * 7919 + 17);
  const rounds = n < 2 ? 0 : Math.floor(IMPROVE_BUDGET / Math.max(1, Math.ceil(n / 50)));
  let current = best;
  for (let r = 0; r < rounds; r++) {
    const items = current.items.slice();
    const i = Math.floor(next() * n);
    if (frame.allowRotation && !current.free && next() < 0.3) {
      const it = items[i]!;
      const turned = orient(frame, it.g, !it.rotated);
      if (!fits(frame, turned.w, turned.h)) continue;
      items[i] = turned;
    } else {
      const j = Math.floor(next() * n);
      if (i === j) continue;
      [items[i], items[j]] = [items[j]!, items[i]!];
    }
    const sheets = skylineLayout(items, frame, current.free, current.score);
    const trial = {
      items,
      free: current.free,
      score: current.score,
      sheets,
      length: spotsLength(grown, sheets),
    };
    if (trial.length <= current.length + FIT_EPS && trial.sheets.length <= current.sheets.length) {
      current = trial;
      if (better(trial, best)) best = trial;
    }
  }
  return best.sheets;
}

// ---------------------------------------------------------------------------------------
// "shelf": first-fit shelves, tallest first

function packShelf(grown: readonly Grown[], frame: Frame): SheetSpots[] {
  // Lay each piece on its long side when turning is allowed, so shelves stay low.
  const items = grown.map((g) => orientFor("lying", frame, g));
  items.sort((a, b) => b.h - a.h || b.w - a.w || a.g.ref - b.g.ref);
  const sheets: SheetSpots[] = [];
  let waiting = items;
  while (waiting.length > 0) {
    const shelves: Array<{ y: number; h: number; used: number }> = [];
    let bottom = 0;
    const spots: Spot[] = [];
    const later: typeof items = [];
    for (const item of waiting) {
      const shelf = shelves.find((s) => s.used + item.w <= frame.width + FIT_EPS && item.h <= s.h + FIT_EPS);
      if (shelf) {
        spots.push({ ref: item.g.ref, x: shelf.used, y: shelf.y, rotated: item.rotated });
        shelf.used += item.w;
      } else if (bottom + item.h <= frame.length + FIT_EPS) {
        shelves.push({ y: bottom, h: item.h, used: item.w });
        spots.push({ ref: item.g.ref, x: 0, y: bottom, rotated: item.rotated });
        bottom += item.h;
      } else {
        later.push(item);
      }
    }
    if (spots.length === 0) throw new Error("A piece that fits an empty sheet could not be placed.");
    sheets.push(spots);
    waiting = later;
  }
  return sheets;
}

// ---------------------------------------------------------------------------------------
// "maxrects": adapter around maxrects-packer

function packMaxRects(
  pieces: readonly TransferPiece[],
  grown: readonly Grown[],
  frame: Frame,
  rollWidthIn: number,
  maxSheetLengthIn: number,
): SheetSpots[] {
  const packer = new MaxRectsPacker(rollWidthIn, maxSheetLengthIn, frame.gap, {
    smart: false,
    pot: false,
    square: false,
    allowRotation: frame.allowRotation,
    border: frame.margin,
  });
  // The library's addArray sorts by longest side, falling, then adds one by one; its typings
  // do not export the rectangle class addArray expects, so we sort the same way (stable) and add.
  const order = pieces
    .map((p, ref) => ({ p, ref }))
    .sort((a, b) => Math.max(b.p.widthIn, b.p.heightIn) - Math.max(a.p.widthIn, a.p.heightIn));
  // Our fit check allows FIT_EPS of float noise and the library compares exactly, so a side that
  // is over the usable roll width or sheet length by no more than that is handed over at it.
  const limits = [rollWidthIn - 2 * frame.margin, maxSheetLengthIn - 2 * frame.margin];
  const snap = (side: number) => limits.find((l) => side > l && side <= l + FIT_EPS) ?? side;
  for (const { p, ref } of order) packer.add(snap(p.widthIn), snap(p.heightIn), { ref });
  const sheets: SheetSpots[] = [];
  let placed = 0;
  for (const bin of packer.bins) {
    const spots: Spot[] = [];
    for (const r of bin.rects) {
      if (r.oversized) throw new Error("maxrects-packer could not fit a piece that fits the sheet.");
      const ref = (r.data as { ref: number }).ref;
      const g = grown[ref]!;
      const rotated = Boolean(r.rot);
      // The library reports the border-offset corner; take the margin off to get frame coordinates.
      spots.push({ ref, x: r.x - frame.margin, y: r.y - frame.margin, rotated });
      if (Math.abs((rotated ? g.h : g.w) - (r.width + frame.gap)) > 1e-7) {
        throw new Error("maxrects-packer returned a piece at an unexpected size.");
      }
    }
    placed += spots.length;
    if (spots.length > 0) sheets.push(spots);
  }
  if (placed !== pieces.length) {
    throw new Error(`maxrects-packer placed ${placed} of ${pieces.length} pieces.`);
  }
  return sheets;
}

// ---------------------------------------------------------------------------------------
// "potpack": adapter around potpack (near-square blocks stacked down the roll)

interface Block {
  boxes: Array<PotpackBox & { ref: number; rotated: boolean }>;
  w: number;
  h: number;
}

function potpackBlock(items: ReadonlyArray<{ ref: number; w: number; h: number; rotated: boolean }>): Block {
  const boxes = items.map((i) => ({ ref: i.ref, w: i.w, h: i.h, rotated: i.rotated }));
  const stats = potpack(boxes);
  return { boxes, w: stats.w, h: stats.h };
}

function packPotpack(grown: readonly Grown[], frame: Frame): SheetSpots[] {
  const items = grown.map((g) => {
    const o = orientFor("as-given", frame, g);
    return { ref: g.ref, w: o.w, h: o.h, rotated: o.rotated };
  });
  items.sort((a, b) => b.h - a.h || b.w - a.w || a.ref - b.ref);

  const blocks: Block[] = [];
  let batch: typeof items = [];
  let current: Block | undefined;
  for (const item of items) {
    const trial = potpackBlock([...batch, item]);
    if (fits(frame, trial.w, trial.h)) {
      batch.push(item);
      current = trial;
    } else {
      if (current) blocks.push(current);
      batch = [item];
      current = potpackBlock(batch);
    }
  }
  if (current) blocks.push(current);

  const sheets: SheetSpots[] = [];
  let spots: Spot[] = [];
  let offset = 0;
  for (const block of blocks) {
    if (spots.length > 0 && offset + block.h > frame.length + FIT_EPS) {
      sheets.push(spots);
      spots = [];
      offset = 0;
    }
    for (const b of block.boxes)
      spots.push({ ref: b.ref, x: b.x ?? 0, y: offset + (b.y ?? 0), rotated: b.rotated });
    offset += block.h;
  }
  if (spots.length > 0) sheets.push(spots);
  return sheets;
}

// ---------------------------------------------------------------------------------------
// Entry points

interface Normalised {
  pieces: readonly TransferPiece[];
  rollWidthIn: number;
  gapIn: number;
  allowRotation: boolean;
  maxSheetLengthIn: number;
  edgeMarginIn: number;
  frame: Frame;
  grown: Grown[];
}

function normalise(options: GangSheetOptions): Normalised {
  const {
    pieces,
    rollWidthIn = DEFAULT_ROLL_WIDTH_IN,
    gapIn = DEFAULT_GAP_IN,
    allowRotation = true,
    maxSheetLengthIn = DEFAULT_MAX_SHEET_LENGTH_IN,
    edgeMarginIn = DEFAULT_EDGE_MARGIN_IN,
  } = options;
  requireNumber(rollWidthIn, "The roll width", "positive");
  requireNumber(gapIn, "The gap between pieces", "non-negative");
  requireNumber(maxSheetLengthIn, "The longest sheet length", "positive");
  requireNumber(edgeMarginIn, "The edge margin", "non-negative");
  if (rollWidthIn - 2 * edgeMarginIn <= 0) {
    throw new RangeError(
      `A ${inches(edgeMarginIn)} edge margin leaves no usable width on a ${inches(rollWidthIn)} roll.`,
    );
  }
  if (maxSheetLengthIn - 2 * edgeMarginIn <= 0) {
    throw new RangeError(
      `A ${inches(edgeMarginIn)} edge margin leaves no usable length on a ${inches(maxSheetLengthIn)} sheet.`,
    );
  }
  const frame: Frame = {
    // Same operation order as maxrects-packer's first free rectangle, so both agree on what fits.
    width: rollWidthIn + gapIn - edgeMarginIn * 2,
    length: maxSheetLengthIn + gapIn - edgeMarginIn * 2,
    gap: gapIn,
    margin: edgeMarginIn,
    allowRotation,
  };
  const usableWidth = rollWidthIn - 2 * edgeMarginIn;
  const usableLength = maxSheetLengthIn - 2 * edgeMarginIn;
  const seen = new Set<string>();
  const grown: Grown[] = pieces.map((p, ref) => {
    const name = p.itemId && p.itemId !== p.pieceId ? `${p.pieceId} (${p.itemId})` : p.pieceId;
    if (typeof p.pieceId !== "string" || p.pieceId === "") throw new RangeError("Every piece needs an id.");
    if (seen.has(p.pieceId)) throw new RangeError(`Piece ${p.pieceId} is listed twice.`);
    seen.add(p.pieceId);
    requireNumber(p.widthIn, `The width of piece ${name}`, "positive");
    requireNumber(p.heightIn, `The height of piece ${name}`, "positive");
    if (p.widthIn < MIN_PIECE_SIDE_IN || p.heightIn < MIN_PIECE_SIDE_IN) {
      throw new RangeError(
        `Piece ${name} (${p.widthIn} in × ${p.heightIn} in) is too small to lay out; each side must be at least ${inches(MIN_PIECE_SIDE_IN)}.`,
      );
    }
    const w = p.widthIn + gapIn;
    const h = p.heightIn + gapIn;
    const size = `${inches(p.widthIn)} × ${inches(p.heightIn)}`;
    const wideGiven = w > frame.width + FIT_EPS;
    const wideTurned = h > frame.width + FIT_EPS;
    if (wideGiven && (wideTurned || !allowRotation)) {
      const hint = !wideTurned && !allowRotation ? " Allow rotation to lay it lengthwise." : "";
      const turned = allowRotation ? ", even turned 90°" : "";
      throw new RangeError(
        `Piece ${name} (${size}) is wider than the ${inches(usableWidth)} usable width of a ${inches(rollWidthIn)} roll${turned}.${hint}`,
      );
    }
    if (!fits(frame, w, h) && !(allowRotation && fits(frame, h, w))) {
      throw new RangeError(
        `Piece ${name} (${size}) is longer than the ${inches(usableLength)} usable length of a ${inches(maxSheetLengthIn)} sheet.`,
      );
    }
    return { ref, w, h };
  });
  return { pieces, rollWidthIn, gapIn, allowRotation, maxSheetLengthIn, edgeMarginIn, frame, grown };
}

function toResult(
  n: Normalised,
  algorithm: PackerAlgorithm,
  sheetsSpots: readonly SheetSpots[],
): GangSheetResult {
  const sheets: GangSheet[] = sheetsSpots.map((spots, index) => {
    const placements = spots.map((s): GangPlacement => {
      const p = n.pieces[s.ref]!;
      const widthIn = s.rotated ? p.heightIn : p.widthIn;
      const heightIn = s.rotated ? p.widthIn : p.heightIn;
      return {
        pieceId: p.pieceId,
        itemId: p.itemId,
        x: n.edgeMarginIn + s.x,
        y: n.edgeMarginIn + s.y,
        widthIn,
        heightIn,
        rotated: s.rotated,
      };
    });
    const end = placements.reduce((m, p) => Math.max(m, p.y + p.heightIn), 0);
    return { index, lengthIn: Math.min(n.maxSheetLengthIn, end + n.edgeMarginIn), placements };
  });
  const totalLengthIn = sheets.reduce((sum, s) => sum + s.lengthIn, 0);
  const usedAreaIn2 = n.pieces.reduce((sum, p) => sum + p.widthIn * p.heightIn, 0);
  const sheetAreaIn2 = n.rollWidthIn * totalLengthIn;
  return {
    algorithm,
    rollWidthIn: n.rollWidthIn,
    sheets,
    totalLengthIn,
    usedAreaIn2,
    sheetAreaIn2,
    efficiency: sheetAreaIn2 > 0 ? usedAreaIn2 / sheetAreaIn2 : 0,
  };
}

/**
 * Packs pieces onto gang sheets of a fixed roll width. Throws RangeError for bad options,
 * for a piece wider than the roll in every allowed orientation, and for a piece longer than
 * the longest sheet.
 */
export function packGangSheet(options: GangSheetOptions): GangSheetResult {
  const n = normalise(options);
  const algorithm = options.algorithm ?? DEFAULT_PACKER;
  if (n.pieces.length === 0) return toResult(n, algorithm, []);
  let spots: SheetSpots[];
  switch (algorithm) {
    case "best": {
      const best = packBest(n);
      return toResult(n, best.used, best.spots);
    }
    case "own":
      spots = packOwn(n.grown, n.frame);
      break;
    case "shelf":
      spots = packShelf(n.grown, n.frame);
      break;
    case "maxrects":
      spots = packMaxRects(n.pieces, n.grown, n.frame, n.rollWidthIn, n.maxSheetLengthIn);
      break;
    case "potpack":
      spots = packPotpack(n.grown, n.frame);
      break;
    default:
      throw new RangeError(`Unknown packer "${String(algorithm)}".`);
  }
  return toResult(n, algorithm, spots);
}

export interface PackerComparisonRow {
  algorithm: PackerAlgorithm;
  sheets: number;
  totalLengthIn: number;
  efficiency: number;
  /** How far past the area lower bound, as a fraction (0.1 = 10% longer). */
  overLowerBound: number;
}

export interface PackerComparison {
  areaLowerBoundIn: number;
  rows: PackerComparisonRow[];
  /** potpack's own near-square box for the whole job (grown pieces), ignoring the roll width. */
  potpackBoxIn: { widthIn: number; heightIn: number };
}

/** Runs every packer on the same job, for the benchmark. */
export function comparePackers(
  pieces: readonly TransferPiece[],
  options: Omit<GangSheetOptions, "pieces" | "algorithm"> = {},
): PackerComparison {
  const n = normalise({ ...options, pieces });
  const areaLowerBoundIn = areaLowerBound(pieces, n.rollWidthIn, n.gapIn, n.edgeMarginIn);
  const rows = PACKER_ALGORITHMS.map((algorithm): PackerComparisonRow => {
    const result = packGangSheet({ ...options, pieces, algorithm });
    return {
      algorithm,
      sheets: result.sheets.length,
      totalLengthIn: result.totalLengthIn,
      efficiency: result.efficiency,
      overLowerBound: areaLowerBoundIn > 0 ? result.totalLengthIn / areaLowerBoundIn - 1 : 0,
    };
  });
  const raw = pieces.map((p) => ({ w: p.widthIn + n.gapIn, h: p.heightIn + n.gapIn }));
  const stats = raw.length > 0 ? potpack(raw) : { w: 0, h: 0 };
  return { areaLowerBoundIn, rows, potpackBoxIn: { widthIn: stats.w, heightIn: stats.h } };
}
