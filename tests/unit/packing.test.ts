import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  BENCH_MIX_50,
  DEFAULT_EDGE_MARGIN_IN,
  DEFAULT_GAP_IN,
  DEFAULT_MAX_SHEET_LENGTH_IN,
  DEFAULT_PACKER,
  OWN_FULL_SEARCH_MAX,
  DEFAULT_ROLL_WIDTH_IN,
  MIN_PIECE_SIDE_IN,
  PACKER_ALGORITHMS,
  ROLL_WIDTHS_IN,
  areaLowerBound,
  comparePackers,
  expandTransfers,
  packGangSheet,
  type GangSheetOptions,
  type GangSheetResult,
  type PackerAlgorithm,
  type TransferItem,
  type TransferPiece,
} from "@/lib/production/packing";
import { areaBoundIn, expectSoundLayout, maxrectsLayout, type Roll } from "./oracles/gang-sheet";

const EPS = 1e-6;

/**
 * How much longer than maxrects-packer our own packer may come out on one job (Chalkline's own
 * limit). Over 1,500 random mixes like those below it was longer on about 1 job in 90, by at most
 * 4.7%; on BENCH_MIX_50 it is shorter.
 */
const OWN_VS_MAXRECTS = 1.1;

function rollOf(opts: Partial<GangSheetOptions>): Roll {
  return {
    rollWidthIn: opts.rollWidthIn ?? DEFAULT_ROLL_WIDTH_IN,
    gapIn: opts.gapIn ?? DEFAULT_GAP_IN,
    edgeMarginIn: opts.edgeMarginIn ?? DEFAULT_EDGE_MARGIN_IN,
    maxSheetLengthIn: opts.maxSheetLengthIn ?? DEFAULT_MAX_SHEET_LENGTH_IN,
    allowRotation: opts.allowRotation ?? true,
  };
}

/** The test's own area bound, with room for float rounding in the sums (a length may equal it). */
function expectAtLeastAreaBound(lengthIn: number, pieces: readonly TransferPiece[], roll: Roll, who: string) {
  const bound = areaBoundIn(pieces, roll);
  expect(lengthIn, `${who}: ${lengthIn} in against an area bound of ${bound} in`).toBeGreaterThanOrEqual(
    bound * (1 - 1e-12),
  );
}

/** Checks every rule a gang sheet must keep, independently of how it was packed. */
function expectValidLayout(
  result: GangSheetResult,
  pieces: readonly TransferPiece[],
  opts: Partial<GangSheetOptions>,
) {
  const roll = opts.rollWidthIn ?? DEFAULT_ROLL_WIDTH_IN;
  const gap = opts.gapIn ?? DEFAULT_GAP_IN;
  const margin = opts.edgeMarginIn ?? DEFAULT_EDGE_MARGIN_IN;
  const maxLength = opts.maxSheetLengthIn ?? DEFAULT_MAX_SHEET_LENGTH_IN;
  const allowRotation = opts.allowRotation ?? true;
  const byId = new Map(pieces.map((p) => [p.pieceId, p]));
  const seen = new Set<string>();

  result.sheets.forEach((sheet, index) => {
    expect(sheet.index).toBe(index);
    expect(Number.isFinite(sheet.lengthIn)).toBe(true);
    expect(sheet.lengthIn).toBeGreaterThan(0);
    expect(sheet.lengthIn).toBeLessThanOrEqual(maxLength + EPS);
    expect(sheet.placements.length).toBeGreaterThan(0);
    for (const p of sheet.placements) {
      const piece = byId.get(p.pieceId)!;
      expect(piece).toBeDefined();
      expect(seen.has(p.pieceId)).toBe(false);
      seen.add(p.pieceId);
      expect(p.itemId).toBe(piece.itemId);
      if (!allowRotation) expect(p.rotated).toBe(false);
      expect([p.widthIn, p.heightIn]).toEqual(
        p.rotated ? [piece.heightIn, piece.widthIn] : [piece.widthIn, piece.heightIn],
      );
      for (const v of [p.x, p.y, p.widthIn, p.heightIn]) expect(Number.isFinite(v)).toBe(true);
      expect(p.x).toBeGreaterThanOrEqual(margin - EPS);
      expect(p.y).toBeGreaterThanOrEqual(margin - EPS);
      expect(p.x + p.widthIn).toBeLessThanOrEqual(roll - margin + EPS);
      expect(p.y + p.heightIn).toBeLessThanOrEqual(sheet.lengthIn - margin + EPS);
    }
    const list = sheet.placements;
    for (let i = 0; i < list.length; i++) {
      for (let j = i + 1; j < list.length; j++) {
        const a = list[i]!;
        const b = list[j]!;
        const apart =
          a.x + a.widthIn + gap <= b.x + EPS ||
          b.x + b.widthIn + gap <= a.x + EPS ||
          a.y + a.heightIn + gap <= b.y + EPS ||
          b.y + b.heightIn + gap <= a.y + EPS;
        if (!apart) throw new Error(`${a.pieceId} and ${b.pieceId} are closer than the ${gap} in gap`);
      }
    }
  });

  expect(seen.size).toBe(pieces.length);
  const total = result.sheets.reduce((sum, s) => sum + s.lengthIn, 0);
  expect(result.totalLengthIn).toBeCloseTo(total, 9);
  const used = pieces.reduce((sum, p) => sum + p.widthIn * p.heightIn, 0);
  expect(result.usedAreaIn2).toBeCloseTo(used, 6);
  expect(result.sheetAreaIn2).toBeCloseTo(roll * total, 6);
  expect(Number.isNaN(result.efficiency)).toBe(false);
  if (pieces.length > 0) {
    expect(result.efficiency).toBeCloseTo(used / (roll * total), 9);
    expect(result.efficiency).toBeGreaterThan(0);
    expect(result.efficiency).toBeLessThanOrEqual(1);
    expect(result.totalLengthIn).toBeGreaterThanOrEqual(areaBoundIn(pieces, rollOf(opts)) - EPS);
  }
  expectSoundLayout(result, pieces, rollOf(opts), result.algorithm);
}

function countsByItem(pieces: readonly { itemId: string }[]): Record<string, number> {
  const counts: Record<string, number> = {};
  for (const p of pieces) counts[p.itemId] = (counts[p.itemId] ?? 0) + 1;
  return counts;
}

describe("constants", () => {
  it("use the usual DTF figures", () => {
    expect([...ROLL_WIDTHS_IN]).toEqual([11, 13, 22, 24]); // common practice, no published source
    expect(DEFAULT_ROLL_WIDTH_IN).toBe(22); // common practice, no published source
    expect(DEFAULT_GAP_IN).toBe(0.25); // common practice, no published source
    expect(DEFAULT_EDGE_MARGIN_IN).toBe(0.25); // our own default
    expect(DEFAULT_MAX_SHEET_LENGTH_IN).toBe(120); // our own default
    expect(PACKER_ALGORITHMS).toEqual(["best", "own", "shelf", "maxrects", "potpack"]);
  });

  it("BENCH_MIX_50 holds 50 pieces", () => {
    expect(BENCH_MIX_50.reduce((sum, i) => sum + i.quantity, 0)).toBe(50);
    expect(expandTransfers(BENCH_MIX_50, 0)).toHaveLength(50);
  });
});

describe("expandTransfers", () => {
  const items: TransferItem[] = [
    { id: "front", widthIn: 11, heightIn: 11, quantity: 10 },
    { id: "chest", widthIn: 3.5, heightIn: 3.5, quantity: 3 },
    { id: "none", widthIn: 2, heightIn: 2, quantity: 0 },
  ];

  it.each([
    // By hand: spares = ceil(quantity × spare / 100).
    { spare: 0, front: 10, chest: 3 },
    { spare: 10, front: 11, chest: 4 }, // 10 × 10% = 1; 3 × 10% = 0.3 → 1
    { spare: 25, front: 13, chest: 4 }, // 2.5 → 3; 0.75 → 1
    { spare: 100, front: 20, chest: 6 },
  ])("adds ceil(quantity × $spare%) spares", ({ spare, front, chest }) => {
    const pieces = expandTransfers(items, spare);
    expect(countsByItem(pieces)).toEqual({ front, chest });
  });

  it("names pieces after their transfer and keeps its size", () => {
    const pieces = expandTransfers(items, 0);
    expect(pieces.slice(0, 2)).toEqual([
      { pieceId: "front#1", itemId: "front", widthIn: 11, heightIn: 11 },
      { pieceId: "front#2", itemId: "front", widthIn: 11, heightIn: 11 },
    ]);
    expect(new Set(pieces.map((p) => p.pieceId)).size).toBe(pieces.length);
  });

  it("does not round a float-noise spare count up", () => {
    // 1000 × 0.7 / 100 is 7.000000000000001 in floating point; it means 7 spares (by hand).
    expect(expandTransfers([{ id: "tag", widthIn: 2, heightIn: 2, quantity: 1000 }], 0.7)).toHaveLength(1007);
  });

  it.each([
    { name: "negative quantity", item: { id: "a", widthIn: 2, heightIn: 2, quantity: -1 }, spare: 0 },
    { name: "fractional quantity", item: { id: "a", widthIn: 2, heightIn: 2, quantity: 1.5 }, spare: 0 },
    { name: "zero width", item: { id: "a", widthIn: 0, heightIn: 2, quantity: 1 }, spare: 0 },
    { name: "NaN height", item: { id: "a", widthIn: 2, heightIn: NaN, quantity: 1 }, spare: 0 },
    { name: "blank id", item: { id: "", widthIn: 2, heightIn: 2, quantity: 1 }, spare: 0 },
    { name: "negative spare", item: { id: "a", widthIn: 2, heightIn: 2, quantity: 1 }, spare: -5 },
  ])("rejects $name", ({ item, spare }) => {
    expect(() => expandTransfers([item], spare)).toThrow(RangeError);
  });

  it("rejects a transfer listed twice", () => {
    const a = { id: "a", widthIn: 2, heightIn: 2, quantity: 1 };
    expect(() => expandTransfers([a, a], 0)).toThrow(/twice/);
  });
});

describe("areaLowerBound", () => {
  const twoSquares = expandTransfers([{ id: "sq", widthIn: 10, heightIn: 10, quantity: 2 }], 0);

  it("is grown area over the grown usable width", () => {
    // By hand: 2 × 10.25² = 210.125 in² over 22 − 0.5 + 0.25 = 21.75 in → 9.6609 in;
    // printed area 200 / 21.5 = 9.3023 in is the smaller of the two.
    expect(areaLowerBound(twoSquares, 22, 0.25, 0.25)).toBeCloseTo(210.125 / 21.75, 9);
  });

  it("is area over roll width with no gap and no margin", () => {
    expect(areaLowerBound(twoSquares, 22, 0, 0)).toBeCloseTo(200 / 22, 9); // by hand
  });

  it("falls back to printed area when the gap is wider than both margins", () => {
    // gap 1 > 2 × 0: grown area no longer bounds the length; 200 / 22 does (by hand).
    expect(areaLowerBound(twoSquares, 22, 1, 0)).toBeCloseTo(200 / 22, 9);
  });

  it("rejects a roll with no usable width", () => {
    expect(() => areaLowerBound(twoSquares, 1, 0.25, 0.5)).toThrow(RangeError);
  });
});

describe("packGangSheet on small jobs", () => {
  const twoSquares = expandTransfers([{ id: "sq", widthIn: 10, heightIn: 10, quantity: 2 }], 0);

  it.each(["own", "shelf", "maxrects"] as const)("%s puts two 10 in squares side by side", (algorithm) => {
    // By hand: 0.25 + 10 + 0.25 + 10 = 20.5 ≤ 21.75 in across; length 0.25 + 10 + 0.25 = 10.5 in.
    const result = packGangSheet({ pieces: twoSquares, algorithm });
    expect(result.sheets).toHaveLength(1);
    expect(result.totalLengthIn).toBeCloseTo(10.5, 9);
    expect(result.efficiency).toBeCloseTo(200 / (22 * 10.5), 9);
    expectValidLayout(result, twoSquares, {});
  });

  it("potpack stacks them, since it aims for a square box, not the roll width", () => {
    // potpack (reference library): start width max(ceil(√(2 × 10.25² / 0.95)), 10.25) = 15, so the
    // second square goes below the first: 2 × 10.25 − 0.25 gap + 2 × 0.25 margin = 20.75 in (by hand).
    const result = packGangSheet({ pieces: twoSquares, algorithm: "potpack" });
    expect(result.totalLengthIn).toBeCloseTo(20.75, 9);
    expectValidLayout(result, twoSquares, {});
  });

  it("returns an empty result for no pieces", () => {
    const result = packGangSheet({ pieces: [] });
    expect(result).toMatchObject({
      sheets: [],
      totalLengthIn: 0,
      usedAreaIn2: 0,
      sheetAreaIn2: 0,
      efficiency: 0,
    });
  });

  it.each(PACKER_ALGORITHMS)("%s turns a wide piece to fit a narrow roll", (algorithm) => {
    // 12 × 4 in on an 11 in roll: usable 10.5 in, so only turned (4 across) fits.
    const pieces = expandTransfers([{ id: "bar", widthIn: 12, heightIn: 4, quantity: 2 }], 0);
    const opts = { pieces, rollWidthIn: 11, algorithm, allowRotation: true };
    const result = packGangSheet(opts);
    for (const p of result.sheets.flatMap((s) => s.placements)) {
      expect(p.rotated).toBe(true);
      expect([p.widthIn, p.heightIn]).toEqual([4, 12]);
    }
    expectValidLayout(result, pieces, opts);
  });

  it("names the piece that needs turning when rotation is off", () => {
    const pieces = expandTransfers([{ id: "name-bar", widthIn: 12, heightIn: 4, quantity: 1 }], 0);
    const call = () => packGangSheet({ pieces, rollWidthIn: 11, allowRotation: false });
    expect(call).toThrow(RangeError);
    expect(call).toThrow(/name-bar#1.*wider.*Allow rotation/);
  });

  it("names a piece too wide for the roll either way", () => {
    const pieces = expandTransfers([{ id: "jumbo", widthIn: 12, heightIn: 12, quantity: 1 }], 0);
    expect(() => packGangSheet({ pieces, rollWidthIn: 11 })).toThrow(/jumbo#1.*wider.*even turned/);
  });

  it("names a piece longer than the longest sheet", () => {
    const pieces = expandTransfers([{ id: "banner", widthIn: 10, heightIn: 50, quantity: 1 }], 0);
    // 50 in across would not fit a 22 in roll either, so turning cannot help.
    expect(() => packGangSheet({ pieces, maxSheetLengthIn: 40 })).toThrow(/banner#1.*longer/);
  });

  it.each([
    { name: "zero roll width", opts: { rollWidthIn: 0 } },
    { name: "negative gap", opts: { gapIn: -0.1 } },
    { name: "NaN sheet length", opts: { maxSheetLengthIn: NaN } },
    { name: "margins wider than the roll", opts: { rollWidthIn: 11, edgeMarginIn: 6 } },
    { name: "unknown packer", opts: { algorithm: "tightest" as PackerAlgorithm } },
  ])("rejects $name", ({ opts }) => {
    const pieces = expandTransfers([{ id: "a", widthIn: 2, heightIn: 2, quantity: 1 }], 0);
    expect(() => packGangSheet({ pieces, ...opts })).toThrow(RangeError);
  });

  it("refuses pieces too small for its fit checks instead of stacking them on one spot", () => {
    // Found by the wild-input property test: two 1.5e-323 × 0.25 in pieces on a 1.5e-323 in roll
    // with no gap or margin were both laid at (0, 0), sharing all their area (efficiency 2).
    // Our packers compare sizes with 1e-9 in of float slack, so sides far below that cannot be
    // told apart; a piece must be at least MIN_PIECE_SIDE_IN (0.001 in, our own limit) each way.
    const tiny = expandTransfers([{ id: "t0", widthIn: 1.5e-323, heightIn: 0.25, quantity: 2 }], 0);
    const opts = {
      rollWidthIn: 1.5e-323,
      gapIn: 0,
      edgeMarginIn: 0,
      allowRotation: false,
      maxSheetLengthIn: 24,
    };
    for (const algorithm of PACKER_ALGORITHMS) {
      const call = () => packGangSheet({ ...opts, pieces: tiny, algorithm });
      expect(call).toThrow(RangeError);
      expect(call).toThrow(/t0#1.*at least 0\.001 in/);
    }
    expect(MIN_PIECE_SIDE_IN).toBe(0.001); // our own limit
    const small = expandTransfers([{ id: "dot", widthIn: 0.001, heightIn: 0.001, quantity: 3 }], 0);
    const result = packGangSheet({ pieces: small, gapIn: 0, edgeMarginIn: 0 });
    expectValidLayout(result, small, { gapIn: 0, edgeMarginIn: 0 });
  });

  it("rejects a piece id used twice", () => {
    const piece = { pieceId: "a#1", itemId: "a", widthIn: 2, heightIn: 2 };
    expect(() => packGangSheet({ pieces: [piece, piece] })).toThrow(/twice/);
  });
});

describe("BENCH_MIX_50", () => {
  const pieces = expandTransfers(BENCH_MIX_50, 0);

  it.each(PACKER_ALGORITHMS)(
    "%s packs it within every rule",
    (algorithm) => {
      for (const opts of [
        {},
        { allowRotation: false },
        { rollWidthIn: 13 },
        { rollWidthIn: 24, gapIn: 0.5 },
      ]) {
        const full = { ...opts, pieces, algorithm };
        expectValidLayout(packGangSheet(full), pieces, full);
      }
    },
    30_000,
  );

  it("starts new sheets at the longest sheet length", () => {
    for (const algorithm of PACKER_ALGORITHMS) {
      const opts = { pieces, algorithm, maxSheetLengthIn: 40 };
      const result = packGangSheet(opts);
      expect(result.sheets.length).toBeGreaterThanOrEqual(3); // ≥ 99.6 in of lower bound over 40 in sheets
      expectValidLayout(result, pieces, opts);
    }
  }, 30_000);

  it("counts spares per transfer", () => {
    const withSpares = expandTransfers(BENCH_MIX_50, 10);
    // By hand, ceil(10%): 8→+1, 4→+1, 6→+1, 16→+2, 6→+1, 10→+1.
    expect(countsByItem(withSpares)).toEqual({
      "full-front": 9,
      "youth-front": 5,
      "name-bar": 7,
      "left-chest": 18,
      sleeve: 7,
      "neck-tag": 11,
    });
    const result = packGangSheet({ pieces: withSpares });
    expectValidLayout(result, withSpares, {});
    expect(countsByItem(result.sheets.flatMap((s) => s.placements))).toEqual(countsByItem(withSpares));
  });

  it("reports length and efficiency per packer, each at least the area bound, ours near maxrects-packer", () => {
    // Defaults: 22 in roll, 0.25 in gap and margin, rotation on, 120 in sheets.
    // Area bound, by hand: Σ(w + 0.25)(h + 0.25) = 8 × 11.25² + 4 × 8.25 × 9.25 + 6 × 10.25 × 4.25
    // + 16 × 3.75² + 6 × 4.25 × 12.25 + 10 × 2.25² = 1012.5 + 305.25 + 261.375 + 225 + 312.375
    // + 50.625 = 2167.125 in² over 22 − 2 × 0.25 + 0.25 = 21.75 in = 99.64 in
    // (and over the whole 22 in roll, 98.51 in, which it is never below).
    const roll = rollOf({});
    expect(areaBoundIn(pieces, roll)).toBeCloseTo(2167.125 / 21.75, 9);
    expect(areaBoundIn(pieces, roll)).toBeGreaterThan(2167.125 / 22);
    const comparison = comparePackers(pieces);
    expect(comparison.areaLowerBoundIn).toBeCloseTo(2167.125 / 21.75, 9);
    const rows = Object.fromEntries(comparison.rows.map((r) => [r.algorithm, r]));
    expect(Object.keys(rows)).toEqual([...PACKER_ALGORITHMS]);
    // maxrects-packer on the same job, called by the test itself, is a sound layout; the product's
    // "maxrects" row is that package's length, and ours is at most OWN_VS_MAXRECTS times it.
    const reference = maxrectsLayout(pieces, roll);
    expectSoundLayout(reference, pieces, roll, "maxrects-packer");
    expect(rows.maxrects!.totalLengthIn).toBeCloseTo(reference.totalLengthIn, 9);
    expect(rows.own!.totalLengthIn).toBeLessThanOrEqual(OWN_VS_MAXRECTS * reference.totalLengthIn);
    for (const r of comparison.rows) {
      expect(r.efficiency).toBeGreaterThan(0.5);
      expect(r.efficiency).toBeLessThanOrEqual(1);
      expect(r.overLowerBound).toBeGreaterThanOrEqual(0);
      expect(r.totalLengthIn).toBeGreaterThanOrEqual(comparison.areaLowerBoundIn);
      expectAtLeastAreaBound(r.totalLengthIn, pieces, roll, r.algorithm);
    }
    // potpack's own near-square box for all 50 grown pieces, ignoring the roll (as it comes).
    expect(comparison.potpackBoxIn.widthIn).toBeGreaterThan(DEFAULT_ROLL_WIDTH_IN);
  });
});

const randomItem = fc.record({
  widthIn: fc.oneof(
    fc.integer({ min: 1, max: 20 }).map((n) => n / 2),
    fc.double({ min: 0.5, max: 10, noNaN: true, noDefaultInfinity: true }),
  ),
  heightIn: fc.oneof(
    fc.integer({ min: 1, max: 40 }).map((n) => n / 2),
    fc.double({ min: 0.5, max: 20, noNaN: true, noDefaultInfinity: true }),
  ),
  quantity: fc.integer({ min: 1, max: 8 }),
});
const randomMix = fc
  .array(randomItem, { minLength: 1, maxLength: 6 })
  .map((rows) => rows.map((r, i): TransferItem => ({ id: `t${i}`, ...r })));
const randomOptions = fc.record({
  rollWidthIn: fc.constantFrom(...ROLL_WIDTHS_IN),
  gapIn: fc.constantFrom(0, 0.125, 0.25, 0.5),
  edgeMarginIn: fc.constantFrom(0, 0.25, 0.5),
  allowRotation: fc.boolean(),
  maxSheetLengthIn: fc.integer({ min: 30, max: 150 }),
});

describe("packGangSheet properties", () => {
  it.each(PACKER_ALGORITHMS)(
    "%s keeps every rule on random mixes",
    (algorithm) => {
      fc.assert(
        fc.property(randomMix, fc.integer({ min: 0, max: 20 }), randomOptions, (mix, spare, options) => {
          const pieces = expandTransfers(mix, spare);
          const opts = { ...options, pieces, algorithm };
          const result = packGangSheet(opts);
          expectValidLayout(result, pieces, opts);
          expectAtLeastAreaBound(result.totalLengthIn, pieces, rollOf(opts), algorithm);
        }),
        { numRuns: algorithm === "own" ? 60 : 120 },
      );
    },
    60_000,
  );

  it("own is never below the area bound nor longer than OWN_VS_MAXRECTS times maxrects-packer's layout", () => {
    fc.assert(
      fc.property(randomMix, fc.integer({ min: 0, max: 20 }), randomOptions, (mix, spare, options) => {
        const pieces = expandTransfers(mix, spare);
        const roll = rollOf(options);
        const ours = packGangSheet({ ...options, pieces, algorithm: "own" });
        const reference = maxrectsLayout(pieces, roll);
        expectSoundLayout(reference, pieces, roll, "maxrects-packer");
        expectAtLeastAreaBound(ours.totalLengthIn, pieces, roll, "own");
        expect(
          ours.totalLengthIn,
          `own ${ours.totalLengthIn} in against maxrects-packer ${reference.totalLengthIn} in`,
        ).toBeLessThanOrEqual(OWN_VS_MAXRECTS * reference.totalLengthIn);
        // The product's "maxrects" packer is that package, given the job the same way.
        expect(packGangSheet({ ...options, pieces, algorithm: "maxrects" }).totalLengthIn).toBeCloseTo(
          reference.totalLengthIn,
          9,
        );
      }),
      { numRuns: 60 },
    );
  }, 60_000);

  it("gives the same layout for the same job", () => {
    const pieces = expandTransfers(BENCH_MIX_50, 5);
    for (const algorithm of PACKER_ALGORITHMS) {
      expect(packGangSheet({ pieces, algorithm })).toEqual(packGangSheet({ pieces, algorithm }));
    }
  }, 30_000);
});

describe("which packer the product uses", () => {
  it("keeps the shorter of maxrects-packer and our search, and says which", () => {
    // "best" may never be longer than either packer alone, on BENCH_MIX_50 and on held-out random
    // mixes (seed 7, 40 mixes, 22 in and 13 in rolls; a different seed from the one used while
    // developing the packer). Measured when "best" was set: on BENCH_MIX_50 ours 106.25 in
    // against maxrects 106.75 in, so "best" keeps ours there.
    const bench = expandTransfers(BENCH_MIX_50, 0);
    const used = packGangSheet({ pieces: bench });
    expect(DEFAULT_PACKER).toBe("best");
    expect(used.algorithm).toBe("own");
    expect(used.totalLengthIn).toBeLessThanOrEqual(packGangSheet({ pieces: bench, algorithm: "maxrects" }).totalLengthIn);

    const mixes = fc.sample(randomMix, { seed: 7, numRuns: 40 });
    for (const mix of mixes) {
      const pieces = expandTransfers(mix, 0);
      for (const rollWidthIn of [22, 13]) {
        const best = packGangSheet({ pieces, rollWidthIn });
        const own = packGangSheet({ pieces, rollWidthIn, algorithm: "own" }).totalLengthIn;
        const maxrects = packGangSheet({ pieces, rollWidthIn, algorithm: "maxrects" }).totalLengthIn;
        expect(best.totalLengthIn).toBeLessThanOrEqual(Math.min(own, maxrects) + 1e-9);
        expect(["own", "maxrects"]).toContain(best.algorithm);
      }
    }
  }, 60_000);

  it(`leaves a job of more than ${OWN_FULL_SEARCH_MAX} pieces to maxrects-packer`, () => {
    // BENCH_MIX_50 × 4 = 200 pieces, past the limit of our search.
    const pieces = expandTransfers(BENCH_MIX_50.map((i) => ({ ...i, quantity: i.quantity * 4 })), 0);
    const best = packGangSheet({ pieces });
    expect(best.algorithm).toBe("maxrects");
    expect(best.totalLengthIn).toBe(packGangSheet({ pieces, algorithm: "maxrects" }).totalLengthIn);
  });
});
