import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  MAX_TRANSFER_WIDTHS,
  bruteForceGrading,
  gradeSizeRun,
  type GradingResult,
  type GradingSize,
} from "@/lib/production/grading";

// Size runs below are invented for the tests (common practice, no published source); every
// expected value is worked out by hand in the comment beside it.

const RUN: GradingSize[] = [
  { size: "S", quantity: 10, allowedWidthIn: 10, idealWidthIn: 10 },
  { size: "M", quantity: 20, allowedWidthIn: 11, idealWidthIn: 11 },
  { size: "L", quantity: 20, allowedWidthIn: 12, idealWidthIn: 12 },
  { size: "XL", quantity: 10, allowedWidthIn: 13, idealWidthIn: 12 },
];

function recomputedShortfall(sizes: readonly GradingSize[], result: GradingResult): number {
  let total = 0;
  for (const s of sizes) {
    const w = result.assignment[s.size];
    if (w !== undefined) total += s.quantity * Math.max(0, s.idealWidthIn - w);
  }
  return total;
}

describe("gradeSizeRun on a four-size run", () => {
  it.each([
    // k = 1: one width = min(min allowed 10, max ideal 12) = 10;
    // shortfall = M 20×1 + L 20×2 + XL 10×2 = 80 (by hand).
    { k: 1, total: 80, groups: [{ widthIn: 10, sizes: ["S", "M", "L", "XL"], quantity: 60 }] },
    // k = 2: splits cost [S|M L XL] 0+30, [S M|L XL] 20+0, [S M L|XL] 60+0 → best 20 (by hand).
    {
      k: 2,
      total: 20,
      groups: [
        { widthIn: 10, sizes: ["S", "M"], quantity: 30 },
        { widthIn: 12, sizes: ["L", "XL"], quantity: 30 },
      ],
    },
    // k = 3: [S][M][L XL] leaves no shortfall; XL's group stops at max ideal 12, not its allowed 13.
    {
      k: 3,
      total: 0,
      groups: [
        { widthIn: 10, sizes: ["S"], quantity: 10 },
        { widthIn: 11, sizes: ["M"], quantity: 20 },
        { widthIn: 12, sizes: ["L", "XL"], quantity: 30 },
      ],
    },
    // k = 4: a fourth width cannot lower 0, so the fewest widths (3) are kept.
    {
      k: 4,
      total: 0,
      groups: [
        { widthIn: 10, sizes: ["S"], quantity: 10 },
        { widthIn: 11, sizes: ["M"], quantity: 20 },
        { widthIn: 12, sizes: ["L", "XL"], quantity: 30 },
      ],
    },
  ])("k = $k gives shortfall $total", ({ k, total, groups }) => {
    const result = gradeSizeRun(RUN, k);
    expect(result.totalShortfall).toBeCloseTo(total, 9);
    expect(result.groups).toEqual(groups);
    expect(result.uncovered).toEqual([]);
    expect(recomputedShortfall(RUN, result)).toBeCloseTo(total, 9);
    expect(bruteForceGrading(RUN, k).totalShortfall).toBeCloseTo(total, 9);
  });

  it("gives every size exactly one width", () => {
    const result = gradeSizeRun(RUN, 2);
    expect(result.assignment).toEqual({ S: 10, M: 10, L: 12, XL: 12 });
    const listed = result.groups.flatMap((g) => g.sizes).sort();
    expect(listed).toEqual(["L", "M", "S", "XL"]);
  });

  it("does not depend on the order the sizes are given in", () => {
    const shuffled = [RUN[2]!, RUN[0]!, RUN[3]!, RUN[1]!];
    expect(gradeSizeRun(shuffled, 2)).toEqual(gradeSizeRun(RUN, 2));
  });
});

describe("gradeSizeRun edge cases", () => {
  it("charges the unavoidable shortfall when ideal exceeds allowed", () => {
    // 4XL can take 12 in but we would like 14 in: width 12, shortfall 5 × 2 = 10 (by hand).
    const result = gradeSizeRun([{ size: "4XL", quantity: 5, allowedWidthIn: 12, idealWidthIn: 14 }], 1);
    expect(result.groups).toEqual([{ widthIn: 12, sizes: ["4XL"], quantity: 5 }]);
    expect(result.totalShortfall).toBeCloseTo(10, 9);
  });

  it("never goes wider than the widest ideal in a group", () => {
    // Allowed 14 and 15, ideals 9 and 10: width = min(14, 10) = 10, shortfall 0 (by hand).
    const result = gradeSizeRun(
      [
        { size: "L", quantity: 3, allowedWidthIn: 14, idealWidthIn: 9 },
        { size: "XL", quantity: 3, allowedWidthIn: 15, idealWidthIn: 10 },
      ],
      1,
    );
    expect(result.groups).toEqual([{ widthIn: 10, sizes: ["L", "XL"], quantity: 6 }]);
    expect(result.totalShortfall).toBe(0);
  });

  it("keeps tied sizes together", () => {
    const result = gradeSizeRun(
      [
        { size: "S", quantity: 4, allowedWidthIn: 10, idealWidthIn: 10 },
        { size: "M", quantity: 4, allowedWidthIn: 10, idealWidthIn: 10 },
        { size: "L", quantity: 4, allowedWidthIn: 12, idealWidthIn: 12 },
      ],
      2,
    );
    expect(result.groups).toEqual([
      { widthIn: 10, sizes: ["S", "M"], quantity: 8 },
      { widthIn: 12, sizes: ["L"], quantity: 4 },
    ]);
    expect(result.totalShortfall).toBe(0);
  });

  it("uses no more widths than there are sizes when k is larger", () => {
    const two: GradingSize[] = [
      { size: "S", quantity: 1, allowedWidthIn: 9, idealWidthIn: 9 },
      { size: "XL", quantity: 1, allowedWidthIn: 13, idealWidthIn: 13 },
    ];
    const result = gradeSizeRun(two, MAX_TRANSFER_WIDTHS);
    expect(result.groups.map((g) => g.widthIn)).toEqual([9, 13]);
    expect(result.totalShortfall).toBe(0);
  });

  it("lets a zero-quantity size ride along without narrowing the transfer", () => {
    // YS (none ordered) can take only 6 in; M needs 12 in. With k = 1 the width stays 12 and
    // YS has no transfer that fits; YM (13 in allowed) takes the 12 in transfer.
    const result = gradeSizeRun(
      [
        { size: "YS", quantity: 0, allowedWidthIn: 6, idealWidthIn: 6 },
        { size: "YM", quantity: 0, allowedWidthIn: 13, idealWidthIn: 8 },
        { size: "M", quantity: 10, allowedWidthIn: 12, idealWidthIn: 12 },
      ],
      1,
    );
    expect(result.groups).toEqual([{ widthIn: 12, sizes: ["M", "YM"], quantity: 10 }]);
    expect(result.assignment).toEqual({ M: 12, YM: 12 });
    expect(result.uncovered).toEqual(["YS"]);
    expect(result.totalShortfall).toBe(0);
  });

  it("returns no widths when nothing is ordered", () => {
    const result = gradeSizeRun([{ size: "M", quantity: 0, allowedWidthIn: 12, idealWidthIn: 12 }], 2);
    expect(result).toEqual({ groups: [], totalShortfall: 0, assignment: {}, uncovered: ["M"] });
  });

  it("uses the larger allowance when a narrow size is cheap to shortchange", () => {
    // One XS (allowed 8) among 30 L (allowed 12, ideal 12), k = 1: the width must fit XS, so 8 in
    // and shortfall 30 × 4 = 120; with k = 2 it drops to 0 (by hand).
    const run: GradingSize[] = [
      { size: "XS", quantity: 1, allowedWidthIn: 8, idealWidthIn: 8 },
      { size: "L", quantity: 30, allowedWidthIn: 12, idealWidthIn: 12 },
    ];
    expect(gradeSizeRun(run, 1).totalShortfall).toBeCloseTo(120, 9);
    expect(gradeSizeRun(run, 2).totalShortfall).toBe(0);
  });
});

describe("gradeSizeRun input errors", () => {
  const ok: GradingSize = { size: "M", quantity: 1, allowedWidthIn: 12, idealWidthIn: 11 };
  it.each([
    { name: "empty run", sizes: [], k: 1, message: /empty/ },
    { name: "k of 0", sizes: [ok], k: 0, message: /1 or more/ },
    { name: "fractional k", sizes: [ok], k: 1.5, message: /whole number/ },
    { name: "negative quantity", sizes: [{ ...ok, quantity: -1 }], k: 1, message: /0 or more/ },
    { name: "fractional quantity", sizes: [{ ...ok, quantity: 1.5 }], k: 1, message: /whole number/ },
    { name: "NaN allowed width", sizes: [{ ...ok, allowedWidthIn: NaN }], k: 1, message: /allowed width/ },
    {
      name: "infinite ideal width",
      sizes: [{ ...ok, idealWidthIn: Infinity }],
      k: 1,
      message: /ideal width/,
    },
    { name: "zero allowed width", sizes: [{ ...ok, allowedWidthIn: 0 }], k: 1, message: /above 0/ },
    { name: "duplicate size", sizes: [ok, ok], k: 1, message: /twice/ },
    { name: "blank size name", sizes: [{ ...ok, size: " " }], k: 1, message: /name/ },
  ])("rejects $name", ({ sizes, k, message }) => {
    expect(() => gradeSizeRun(sizes, k)).toThrow(RangeError);
    expect(() => gradeSizeRun(sizes, k)).toThrow(message);
    expect(() => bruteForceGrading(sizes, k)).toThrow(RangeError);
  });
});

describe("gradeSizeRun properties", () => {
  const width = fc.oneof(
    fc.integer({ min: 32, max: 128 }).map((e) => e / 8), // eighths from 4 to 16 in: many ties
    fc.double({ min: 1, max: 20, noNaN: true, noDefaultInfinity: true }),
  );
  const run = fc
    .array(
      fc.record({
        quantity: fc.oneof(fc.constant(0), fc.integer({ min: 1, max: 60 })),
        allowedWidthIn: width,
        idealWidthIn: width,
      }),
      { minLength: 1, maxLength: 7 },
    )
    .map((rows) => rows.map((r, i) => ({ size: `size-${i}`, ...r })));
  const k = fc.integer({ min: 1, max: MAX_TRANSFER_WIDTHS });

  it("matches the exhaustive search on small runs", () => {
    fc.assert(
      fc.property(run, k, (sizes, kk) => {
        const dp = gradeSizeRun(sizes, kk);
        const brute = bruteForceGrading(sizes, kk);
        expect(Math.abs(dp.totalShortfall - brute.totalShortfall)).toBeLessThanOrEqual(
          1e-9 * Math.max(1, brute.totalShortfall),
        );
      }),
      { numRuns: 400 },
    );
  }, 30_000);

  it("keeps every width inside every member's allowance and covers every ordered size once", () => {
    fc.assert(
      fc.property(run, k, (sizes, kk) => {
        const result = gradeSizeRun(sizes, kk);
        expect(result.groups.length).toBeLessThanOrEqual(kk);
        expect(Number.isNaN(result.totalShortfall)).toBe(false);
        expect(result.totalShortfall).toBeGreaterThanOrEqual(0);
        const bySize = new Map(sizes.map((s) => [s.size, s]));
        const seen = new Set<string>();
        for (const g of result.groups) {
          expect(Number.isFinite(g.widthIn)).toBe(true);
          expect(g.widthIn).toBeGreaterThan(0);
          for (const name of g.sizes) {
            expect(seen.has(name)).toBe(false);
            seen.add(name);
            expect(g.widthIn).toBeLessThanOrEqual(bySize.get(name)!.allowedWidthIn);
            expect(result.assignment[name]).toBe(g.widthIn);
          }
          const qty = g.sizes.reduce((sum, name) => sum + bySize.get(name)!.quantity, 0);
          expect(g.quantity).toBe(qty);
        }
        for (const s of sizes) {
          if (s.quantity > 0) expect(seen.has(s.size)).toBe(true);
          else expect(seen.has(s.size) !== result.uncovered.includes(s.size)).toBe(true);
        }
        expect(result.totalShortfall).toBeCloseTo(recomputedShortfall(sizes, result), 9);
      }),
      { numRuns: 400 },
    );
  }, 30_000);

  it("never gets worse as more widths are allowed", () => {
    fc.assert(
      fc.property(run, (sizes) => {
        let previous = Infinity;
        for (let kk = 1; kk <= MAX_TRANSFER_WIDTHS; kk++) {
          const total = gradeSizeRun(sizes, kk).totalShortfall;
          expect(total).toBeLessThanOrEqual(previous + 1e-9);
          previous = total;
        }
      }),
      { numRuns: 200 },
    );
  }, 30_000);
});
