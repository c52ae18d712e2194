import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  MAX_TRANSFER_WIDTHS,
  gradeSizeRun,
  type GradingResult,
  type GradingSize,
} from "@/lib/production/grading";
import { gradingGapText } from "@/lib/production/print-plan";
import { reachCounter } from "./fuzz/reach";

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

interface Oracle {
  /** The least total shortfall over every way of giving the ordered sizes at most k widths. */
  total: number;
  /** The fewest distinct widths that reach that least total (0 when nothing is ordered). */
  fewestWidths: number;
}

/**
 * Outside oracle, written here from the definition alone; it shares no code and no shortcut with
 * the module. Any choice of at most k widths, with one of them given to each ordered size, splits
 * those sizes into at most k groups (the sizes that share a width). So we try every split of the
 * ordered sizes into at most k groups, in any order, contiguous or not. Within one group the width
 * w must fit every member (w ≤ each allowance), and a member's cost quantity × max(0, ideal − w)
 * never rises as w grows, so the group's best width is its smallest allowance and its cost is
 * Σ quantity × max(0, ideal − smallest allowance). Exponential (Bell numbers): small runs only.
 */
function exhaustiveGrading(sizes: readonly GradingSize[], k: number): Oracle {
  const ordered = sizes.filter((s) => s.quantity > 0);
  if (ordered.length === 0) return { total: 0, fewestWidths: 0 };
  const found: Array<{ total: number; widths: number }> = [];
  const groups: GradingSize[][] = [];
  const place = (i: number) => {
    if (i === ordered.length) {
      let total = 0;
      for (const group of groups) {
        let smallestAllowance = Infinity;
        for (const s of group) smallestAllowance = Math.min(smallestAllowance, s.allowedWidthIn);
        for (const s of group) total += s.quantity * Math.max(0, s.idealWidthIn - smallestAllowance);
      }
      found.push({ total, widths: groups.length });
      return;
    }
    const s = ordered[i]!;
    for (const group of groups) {
      group.push(s);
      place(i + 1);
      group.pop();
    }
    if (groups.length < k) {
      groups.push([s]);
      place(i + 1);
      groups.pop();
    }
  };
  place(0);
  const total = Math.min(...found.map((f) => f.total));
  const tie = 1e-9 * Math.max(1, total);
  const fewestWidths = Math.min(...found.filter((f) => f.total <= total + tie).map((f) => f.widths));
  return { total, fewestWidths };
}

/**
 * Compares a grading result with the oracle: the same least shortfall, reached by the widths the
 * result actually hands out, with no more widths than needed; every width fits its sizes; and each
 * size with nothing ordered sits under the widest chosen width that fits it, or is uncovered.
 */
function expectMatchesOracle(sizes: readonly GradingSize[], k: number, result: GradingResult): void {
  const oracle = exhaustiveGrading(sizes, k);
  const tolerance = 1e-9 * Math.max(1, oracle.total);
  expect(Math.abs(result.totalShortfall - oracle.total)).toBeLessThanOrEqual(tolerance);
  expect(Math.abs(recomputedShortfall(sizes, result) - oracle.total)).toBeLessThanOrEqual(tolerance);
  expect(result.groups.length).toBe(oracle.fewestWidths);
  const widths = result.groups.map((g) => g.widthIn);
  expect(new Set(widths).size).toBe(widths.length);
  for (const s of sizes) {
    const w = result.assignment[s.size];
    if (s.quantity > 0) {
      expect(w).toBeDefined();
      expect(w!).toBeLessThanOrEqual(s.allowedWidthIn);
      continue;
    }
    const fitting = widths.filter((x) => x <= s.allowedWidthIn);
    if (fitting.length === 0) {
      expect(result.uncovered).toContain(s.size);
      expect(w).toBeUndefined();
    } else {
      expect(w).toBe(Math.max(...fitting));
      expect(result.uncovered).not.toContain(s.size);
    }
  }
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
    // The furthest any size prints from its ideal: k = 1 leaves L and XL 2 in short; k = 2 leaves M 1 in (by hand).
    expect(result.largestShortIn).toBeCloseTo(k === 1 ? 2 : k === 2 ? 1 : 0, 9);
    expect(result.groups).toEqual(groups);
    expect(result.uncovered).toEqual([]);
    expect(recomputedShortfall(RUN, result)).toBeCloseTo(total, 9);
    expect(exhaustiveGrading(RUN, k).total).toBeCloseTo(total, 9); // the oracle agrees with the hand value
    expectMatchesOracle(RUN, k, result);
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
    expect(result).toEqual({ groups: [], totalShortfall: 0, largestShortIn: 0, assignment: {}, uncovered: ["M"] });
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

describe("gradeSizeRun against the test's own exhaustive search, on hand-made runs", () => {
  // Invented runs (common practice, no published source); each total is worked by hand beside it
  // and must be what both the module and the oracle give.
  const SPREAD: GradingSize[] = [
    { size: "S", quantity: 5, allowedWidthIn: 10, idealWidthIn: 10 },
    { size: "M", quantity: 1, allowedWidthIn: 11, idealWidthIn: 11 },
    { size: "L", quantity: 20, allowedWidthIn: 12, idealWidthIn: 12 },
    { size: "XL", quantity: 2, allowedWidthIn: 14, idealWidthIn: 14 },
  ];
  it.each([
    // One width must fit S: 10 in. M 1×1 + L 20×2 + XL 2×4 = 49 (by hand).
    { name: "spread, k = 1", sizes: SPREAD, k: 1, total: 49, widths: 1 },
    // Splits by allowance: [S|M L XL] 0 + (L 20×1 + XL 2×3) = 26; [S M|L XL] 1×1 + 2×2 = 5;
    // [S M L|XL] 1 + 20×2 = 41. Best 5; a split out of allowance order, e.g. {S, L}{M, XL},
    // costs L 20×2 = 40 and more (by hand).
    { name: "spread, k = 2", sizes: SPREAD, k: 2, total: 5, widths: 2 },
    // [S M][L][XL] = 1; [S][M][L XL] = 2×2 = 4; [S][M L][XL] = 20×1 = 20. Best 1 (by hand).
    { name: "spread, k = 3", sizes: SPREAD, k: 3, total: 1, widths: 3 },
    // Four widths, one per size: 0 (by hand).
    { name: "spread, k = 4", sizes: SPREAD, k: 4, total: 0, widths: 4 },
    // Ideal above allowance: 5 × (14 − 12) = 10, whatever k is (by hand).
    {
      name: "ideal over allowance",
      sizes: [{ size: "4XL", quantity: 5, allowedWidthIn: 12, idealWidthIn: 14 }],
      k: 3,
      total: 10,
      widths: 1,
    },
    // XS (8 in) and 30 L (12 in): one width 8 costs 30 × 4 = 120; two widths cost 0 (by hand).
    {
      name: "one narrow size, k = 1",
      sizes: [
        { size: "XS", quantity: 1, allowedWidthIn: 8, idealWidthIn: 8 },
        { size: "L", quantity: 30, allowedWidthIn: 12, idealWidthIn: 12 },
      ],
      k: 1,
      total: 120,
      widths: 1,
    },
    // Equal allowances need one width: 0 with k = 2, and the fewest widths is 2, not 3 (by hand).
    {
      name: "tied allowances",
      sizes: [
        { size: "S", quantity: 4, allowedWidthIn: 10, idealWidthIn: 10 },
        { size: "M", quantity: 4, allowedWidthIn: 10, idealWidthIn: 10 },
        { size: "L", quantity: 4, allowedWidthIn: 12, idealWidthIn: 12 },
      ],
      k: 3,
      total: 0,
      widths: 2,
    },
    // Nothing ordered among YS (6 in), YM (13 in) and M (12 in ideal 12): width 12, 0 shortfall;
    // YS has no transfer that fits (by hand).
    {
      name: "a ride-along size",
      sizes: [
        { size: "YS", quantity: 0, allowedWidthIn: 6, idealWidthIn: 6 },
        { size: "YM", quantity: 0, allowedWidthIn: 13, idealWidthIn: 8 },
        { size: "M", quantity: 10, allowedWidthIn: 12, idealWidthIn: 12 },
      ],
      k: 1,
      total: 0,
      widths: 1,
    },
    // Nothing ordered at all: no widths, 0 (by hand).
    {
      name: "nothing ordered",
      sizes: [{ size: "M", quantity: 0, allowedWidthIn: 12, idealWidthIn: 12 }],
      k: 2,
      total: 0,
      widths: 0,
    },
  ])("$name: shortfall $total with $widths widths", ({ sizes, k, total, widths }) => {
    const oracle = exhaustiveGrading(sizes, k);
    expect(oracle.total).toBeCloseTo(total, 9);
    expect(oracle.fewestWidths).toBe(widths);
    const result = gradeSizeRun(sizes, k);
    expect(result.totalShortfall).toBeCloseTo(total, 9);
    expectMatchesOracle(sizes, k, result);
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

  it("matches the test's own exhaustive search on small runs", () => {
    const reach = reachCounter("grading against the oracle");
    fc.assert(
      fc.property(run, k, (sizes, kk) => {
        reach.generated();
        if (sizes.some((s) => s.quantity > 0)) reach.reached("a run that orders something");
        expectMatchesOracle(sizes, kk, gradeSizeRun(sizes, kk));
      }),
      { numRuns: 400, seed: reach.seed },
    );
    // Runs with nothing ordered compare trivially (0 = 0), so most generated runs must order
    // something: about 0.83 of them did over several seeds (fast-check favours short runs, and each
    // size is unordered half the time); at least 0.7 leaves room for chance.
    reach.expectShare("a run that orders something", 0.7);
  }, 30_000);

  it("keeps every width inside every member's allowance and covers every ordered size once", () => {
    const reach = reachCounter("grading result shape");
    fc.assert(
      fc.property(run, k, (sizes, kk) => {
        reach.generated();
        const result = gradeSizeRun(sizes, kk);
        if (result.groups.length > 0) reach.reached("a run given some width");
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
      { numRuns: 400, seed: reach.seed },
    );
    // The loop over groups checks nothing when nothing is ordered: as above, at least 0.7 of the
    // runs must give some width (about 0.83 did over several seeds).
    reach.expectShare("a run given some width", 0.7);
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

describe("the suggestion in plain words", () => {
  it("says how far the furthest size prints from its best width, rounded up to the 1/8 in", () => {
    expect(gradingGapText(0)).toBe("every size prints at its best print size");
    expect(gradingGapText(1e-12)).toBe("every size prints at its best print size");
    expect(gradingGapText(0.1)).toBe("every size prints within 1/8 in of its best print size");
    expect(gradingGapText(0.125)).toBe("every size prints within 1/8 in of its best print size");
    expect(gradingGapText(1)).toBe("every size prints within 1 in of its best print size");
    expect(gradingGapText(1.3)).toBe("every size prints within 1 3/8 in of its best print size");
  });
});
