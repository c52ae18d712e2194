/**
 * The tests' own check of a tiled test print, written from what a tiled print must be and sharing
 * no code with lib/production/tiling.ts (its `tileCoverage` included).
 *
 * A plan is a grid: every tile in a column shows the same slice of the art across, every tile in a
 * row the same slice down. So the art is covered exactly when, along each axis, the slices (in art
 * order) start at 0, end at the art's edge and leave no gap between neighbours; here neighbours must
 * share exactly the overlap strip. Each slice fits the art area (the printable area less the label
 * band kept along its lower edge), and no fewer pages could do: c − 1 pages that share the overlap
 * reach at most (c − 1) × room − (c − 2) × overlap, where room is the art area's length.
 */
import { expect } from "vitest";
import type { Tile, TilePlan } from "@/lib/production/tiling";

/** Float slack in inches, far below a printer's dot. */
const TOLERANCE_IN = 1e-7;

interface Slice {
  start: number;
  size: number;
}

/** The one slice each column (or row) shows, in sheet order; fails if tiles in one column disagree. */
function slicesOf(plan: TilePlan, axis: "x" | "y"): Slice[] {
  const count = axis === "x" ? plan.columns : plan.rows;
  const slices: Array<Slice | undefined> = new Array<Slice | undefined>(count).fill(undefined);
  for (const t of plan.tiles) {
    const at = axis === "x" ? t.column : t.row;
    const slice = axis === "x" ? { start: t.artX, size: t.artWidth } : { start: t.artY, size: t.artHeight };
    expect(at).toBeGreaterThanOrEqual(0);
    expect(at).toBeLessThan(count);
    const seen = slices[at];
    if (seen) expect(slice, `${t.label}: every tile in one ${axis === "x" ? "column" : "row"}`).toEqual(seen);
    else slices[at] = slice;
  }
  return slices.map((s, i) => {
    if (!s) throw new Error(`no tile in ${axis === "x" ? "column" : "row"} ${i}`);
    return s;
  });
}

function expectAxis(slices: readonly Slice[], length: number, room: number, overlap: number, what: string) {
  const first = slices[0]!;
  const last = slices[slices.length - 1]!;
  expect(Math.abs(first.start), `${what}: first slice starts at the art's edge`).toBeLessThanOrEqual(
    TOLERANCE_IN,
  );
  expect(
    Math.abs(last.start + last.size - length),
    `${what}: last slice ends at the art's edge`,
  ).toBeLessThanOrEqual(TOLERANCE_IN);
  for (const s of slices) {
    expect(s.size, `${what}: slice size`).toBeGreaterThan(0);
    expect(s.size, `${what}: slice fits the art area`).toBeLessThanOrEqual(room + TOLERANCE_IN);
  }
  for (let i = 1; i < slices.length; i++) {
    const shared = slices[i - 1]!.start + slices[i - 1]!.size - slices[i]!.start;
    expect(
      Math.abs(shared - overlap),
      `${what}: slices ${i} and ${i + 1} share the overlap`,
    ).toBeLessThanOrEqual(TOLERANCE_IN);
  }
  if (slices.length > 1) {
    const fewer = slices.length - 1;
    const reach = fewer * room - (fewer - 1) * overlap;
    expect(reach, `${what}: ${fewer} page(s) would not reach across ${length} in`).toBeLessThan(length);
  }
}

/**
 * Checks a plan: a full grid of uniquely placed tiles whose slices cover the art with exactly the
 * overlap between neighbours, in as few pages as possible along each axis, each drawn inside its
 * page's art area (against the right margin when a mirrored slice is narrower than the page) and
 * never in the label band.
 */
export function expectTiledArt(plan: TilePlan): void {
  expect(plan.tiles).toHaveLength(plan.columns * plan.rows);
  expect(plan.pages).toBe(plan.columns * plan.rows);
  const positions = new Set(plan.tiles.map((t) => `${t.row}:${t.column}`));
  expect(positions.size).toBe(plan.tiles.length);

  const across = slicesOf(plan, "x");
  const down = slicesOf(plan, "y");
  // Right-reading, column 1 holds the art's left edge; mirrored, it holds the right edge.
  const m = plan.marginIn;
  // The art area, worked out here: the page less its margins, less the label band below.
  const roomAcross = plan.pageWidthIn - 2 * m;
  const roomDown = plan.pageHeightIn - 2 * m - plan.labelBandIn;
  expect(plan.labelBandIn).toBeGreaterThanOrEqual(0);
  expect(plan.printableWidthIn).toBeCloseTo(plan.pageWidthIn - 2 * m, 9);
  expect(plan.printableHeightIn).toBeCloseTo(plan.pageHeightIn - 2 * m, 9);
  expect(plan.artAreaWidthIn).toBeCloseTo(roomAcross, 9);
  expect(plan.artAreaHeightIn).toBeCloseTo(roomDown, 9);

  const inArtOrder = plan.mirrored ? [...across].reverse() : across;
  expectAxis(inArtOrder, plan.artWidthIn, roomAcross, plan.overlapIn, "across");
  expectAxis(down, plan.artHeightIn, roomDown, plan.overlapIn, "down");

  for (const t of plan.tiles) expectOnPage(t, m, roomAcross, roomDown, plan.mirrored);
}

function expectOnPage(t: Tile, m: number, roomAcross: number, roomDown: number, mirrored: boolean) {
  const x = mirrored ? m + roomAcross - t.artWidth : m;
  expect(Math.abs(t.pageX - x), `${t.label}: page x`).toBeLessThanOrEqual(TOLERANCE_IN);
  expect(Math.abs(t.pageY - m), `${t.label}: page y`).toBeLessThanOrEqual(TOLERANCE_IN);
  expect(t.pageX + t.artWidth).toBeLessThanOrEqual(m + roomAcross + TOLERANCE_IN);
  // Clear of the label band: the art ends where the band begins, or above it.
  expect(t.pageY + t.artHeight, `${t.label}: clear of the label band`).toBeLessThanOrEqual(
    m + roomDown + TOLERANCE_IN,
  );
}
