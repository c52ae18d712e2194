/**
 * The tests' own yardsticks for gang sheets, sharing no code with lib/production/packing.ts:
 *  - `areaBoundIn`: a lower bound on the roll length, from areas alone;
 *  - `maxrectsLayout`: the same job packed by the maxrects-packer package, called directly here;
 *  - `expectSoundLayout`: pieces inside the roll, apart by the gap, none overlapping, each once.
 */
import type * as MaxRectsApi from "maxrects-packer";
import type { Rectangle as RectangleClass } from "maxrects-packer/dist/geom/Rectangle";
// The package's "main" is a UMD file that Node's ES module loader reads with no exports; its ES
// build ships no typings of its own, so it is typed with the package's declarations.
// @ts-expect-error: no declaration file for the ES build path
import * as maxrectsEsm from "maxrects-packer/dist/maxrects-packer.mjs";
import { expect } from "vitest";

const { MaxRectsPacker, Rectangle } = maxrectsEsm as typeof MaxRectsApi & {
  Rectangle: typeof RectangleClass;
};

export interface Piece {
  pieceId: string;
  itemId: string;
  widthIn: number;
  heightIn: number;
}

export interface Laid {
  pieceId: string;
  x: number;
  y: number;
  widthIn: number;
  heightIn: number;
  rotated: boolean;
}

export interface Layout {
  sheets: ReadonlyArray<{ lengthIn: number; placements: readonly Laid[] }>;
  totalLengthIn: number;
}

export interface Roll {
  rollWidthIn: number;
  gapIn: number;
  edgeMarginIn: number;
  maxSheetLengthIn: number;
  allowRotation: boolean;
}

/**
 * A lower bound on the total roll length, from areas.
 *
 * Printed pieces never overlap and stay within the usable width W − 2m of every sheet, and within
 * L − 2m of each sheet's length L: so Σ L ≥ Σ w·h / (W − 2m).
 * Grow each piece by the gap g on its right and lower sides: pieces at least g apart give grown
 * pieces that do not overlap, inside a strip W − 2m + g wide and L − 2m + g long per sheet. When
 * g ≤ 2m that length is at most L, so Σ L ≥ Σ (w + g)(h + g) / (W − 2m + g), which is never below
 * the plain "pieces with their gaps over the roll width", Σ (w + g)(h + g) / W.
 */
export function areaBoundIn(pieces: readonly Piece[], roll: Roll): number {
  const usable = roll.rollWidthIn - 2 * roll.edgeMarginIn;
  let printed = 0;
  let grown = 0;
  for (const p of pieces) {
    printed += p.widthIn * p.heightIn;
    grown += (p.widthIn + roll.gapIn) * (p.heightIn + roll.gapIn);
  }
  const byPrinted = printed / usable;
  const byGrown = roll.gapIn <= 2 * roll.edgeMarginIn ? grown / (usable + roll.gapIn) : 0;
  return Math.max(byPrinted, byGrown);
}

/**
 * The job packed by maxrects-packer itself: one bin per sheet, the roll's width by the longest
 * sheet, the gap as its padding and the edge margin as its border; every sheet ends one margin past
 * its lowest piece. Throws if the package leaves a piece out.
 */
export function maxrectsLayout(pieces: readonly Piece[], roll: Roll): Layout {
  const packer = new MaxRectsPacker(roll.rollWidthIn, roll.maxSheetLengthIn, roll.gapIn, {
    smart: false,
    pot: false,
    square: false,
    allowRotation: roll.allowRotation,
    border: roll.edgeMarginIn,
  });
  packer.addArray(
    pieces.map((p) => {
      const r = new Rectangle(p.widthIn, p.heightIn);
      r.data = { pieceId: p.pieceId };
      return r;
    }),
  );
  const sheets = packer.bins
    .filter((bin) => bin.rects.length > 0)
    .map((bin) => {
      const placements = bin.rects.map((r): Laid => {
        if (r.oversized) throw new Error(`maxrects-packer could not fit ${JSON.stringify(r.data)}`);
        return {
          pieceId: (r.data as { pieceId: string }).pieceId,
          x: r.x,
          y: r.y,
          widthIn: r.width,
          heightIn: r.height,
          rotated: Boolean(r.rot),
        };
      });
      const end = Math.max(...placements.map((p) => p.y + p.heightIn));
      return { lengthIn: end + roll.edgeMarginIn, placements };
    });
  const placed = sheets.reduce((n, s) => n + s.placements.length, 0);
  if (placed !== pieces.length)
    throw new Error(`maxrects-packer placed ${placed} of ${pieces.length} pieces`);
  return { sheets, totalLengthIn: sheets.reduce((sum, s) => sum + s.lengthIn, 0) };
}

/** Float slack in inches for touching edges (far below anything a printer can place). */
const SLACK_IN = 1e-9;

/** How far two intervals overlap (negative when apart). */
function depth(a0: number, a1: number, b0: number, b1: number): number {
  return Math.min(a1, b1) - Math.max(a0, b0);
}

/**
 * Checks a layout from its numbers alone: every piece laid exactly once at its own size (turned
 * only when turning is allowed); inside the roll's width and the sheet's length, a margin in from
 * every edge; no two pieces on a sheet sharing any area (an overlap counts even when it is smaller
 * than the slack, if it is a real share of the smaller piece); and every two pieces at least the
 * gap apart across or along the roll.
 */
export function expectSoundLayout(
  layout: Layout,
  pieces: readonly Piece[],
  roll: Roll,
  who = "layout",
): void {
  const byId = new Map(pieces.map((p) => [p.pieceId, p]));
  const seen = new Set<string>();
  const m = roll.edgeMarginIn;
  for (const [index, sheet] of layout.sheets.entries()) {
    const where = `${who}, sheet ${index + 1}`;
    expect(sheet.lengthIn, where).toBeLessThanOrEqual(roll.maxSheetLengthIn + SLACK_IN);
    for (const p of sheet.placements) {
      const piece = byId.get(p.pieceId);
      expect(piece, `${where}: ${p.pieceId} is a piece of the job`).toBeDefined();
      expect(seen.has(p.pieceId), `${where}: ${p.pieceId} laid once`).toBe(false);
      seen.add(p.pieceId);
      if (!roll.allowRotation) expect(p.rotated, `${where}: ${p.pieceId} not turned`).toBe(false);
      const size = p.rotated ? [piece!.heightIn, piece!.widthIn] : [piece!.widthIn, piece!.heightIn];
      expect([p.widthIn, p.heightIn], `${where}: ${p.pieceId} at its own size`).toEqual(size);
      expect(p.x, `${where}: ${p.pieceId} left margin`).toBeGreaterThanOrEqual(m - SLACK_IN);
      expect(p.y, `${where}: ${p.pieceId} top margin`).toBeGreaterThanOrEqual(m - SLACK_IN);
      expect(p.x + p.widthIn, `${where}: ${p.pieceId} right margin`).toBeLessThanOrEqual(
        roll.rollWidthIn - m + SLACK_IN,
      );
      expect(p.y + p.heightIn, `${where}: ${p.pieceId} end margin`).toBeLessThanOrEqual(
        sheet.lengthIn - m + SLACK_IN,
      );
    }
    const list = sheet.placements;
    for (let i = 0; i < list.length; i++) {
      for (let j = i + 1; j < list.length; j++) {
        const a = list[i]!;
        const b = list[j]!;
        const across = depth(a.x, a.x + a.widthIn, b.x, b.x + b.widthIn);
        const along = depth(a.y, a.y + a.heightIn, b.y, b.y + b.heightIn);
        const shared =
          across > 1e-9 * Math.min(a.widthIn, b.widthIn) && along > 1e-9 * Math.min(a.heightIn, b.heightIn);
        if (shared)
          throw new Error(`${where}: ${a.pieceId} and ${b.pieceId} overlap (${across} × ${along} in)`);
        // Apart means a clear strip of at least the gap across the roll or along it.
        if (across > -roll.gapIn + SLACK_IN && along > -roll.gapIn + SLACK_IN)
          throw new Error(
            `${where}: ${a.pieceId} and ${b.pieceId} are closer than the ${roll.gapIn} in gap (${-across}, ${-along} in apart)`,
          );
      }
    }
  }
  expect(seen.size, `${who}: every piece laid`).toBe(pieces.length);
  const total = layout.sheets.reduce((sum, s) => sum + s.lengthIn, 0);
  expect(
    Math.abs(layout.totalLengthIn - total),
    `${who}: total length is the sum of the sheets`,
  ).toBeLessThanOrEqual(1e-9 * Math.max(1, total));
}
