import fc from "fast-check";
import { describe, expect, it, vi } from "vitest";
import { CATALOG } from "@/lib/garments/catalog";
import { locationSpec, locationsFor } from "@/lib/garments/locations";
import { MAX_TRANSFER_WIDTHS, gradeSizeRun } from "@/lib/production/grading";
import { DEFAULT_PACKER, PACKER_ALGORITHMS, expandTransfers, packGangSheet } from "@/lib/production/packing";
import { gradingSizes, printsPerSize, type ChartRow } from "@/lib/production/plan";
import { MAX_TILE_PAGES, PAPER_SIZES, planTiles, tileCoverage, type PaperId } from "@/lib/production/tiling";
import { GARMENT_CATEGORIES } from "@/lib/garments/types";
import { expectSoundLayout } from "../oracles/gang-sheet";
import { expectTiledArt } from "../oracles/tiling";
import { garmentOf, nonFinitePaths } from "./arbitraries";
import { reachCounter } from "./reach";

// Property runs share two cores with other work; give them room beyond the 5 s default.
vi.setConfig({ testTimeout: 30_000 });

/**
 * Least share of generated cases that must reach each guarded check (reach.ts). Each is set well
 * below the share measured over several seeds, noted beside it, so chance alone does not fail it.
 */
const SHARE = {
  sizeRunEntry: 0.6, // measured 0.78 to 0.88
  gradedSize: 0.3, // measured 0.49 to 0.65
  noRoomSize: 0.1, // measured 0.25 to 0.27
  printRow: 0.7, // measured 0.87 to 0.91
  assignedRow: 0.35, // measured 0.55 to 0.61
  plannedTiles: 0.45, // measured 0.59 to 0.6
  refusedTiles: 0.25, // measured 0.4 to 0.41
  packedSheet: 0.3, // measured 0.45 to 0.51 (0.11 to 0.14 before half the jobs were valid throughout)
  refusedSheet: 0.2, // measured 0.37 to 0.39
};

/** A size chart of one category: catalog blanks, or up to six generated rows of the same category. */
const chart = fc.oneof(
  fc.constantFrom(...CATALOG).map((b) => ({
    category: b.category,
    rows: b.sizes.map((r): ChartRow => ({ size: r.size, group: r.group, measurements: r.measurements })),
  })),
  fc.constantFrom(...GARMENT_CATEGORIES).chain((category) =>
    fc.array(garmentOf(category), { minLength: 1, maxLength: 6 }).map((rows) => ({
      category,
      rows: rows.map((g, i): ChartRow => ({
        size: `S${i}`,
        group: g.group,
        measurements: g.measurements,
      })),
    })),
  ),
);

/** A chart, a placement on one of its locations, a size run over some of its sizes and some it lacks. */
const job = chart.chain(({ category, rows }) =>
  fc.record({
    category: fc.constant(category),
    rows: fc.constant(rows),
    location: fc.constantFrom(...locationsFor(category)),
    widthIn: fc.double({ min: 0.25, max: 16, noNaN: true }),
    aspect: fc.double({ min: 0.2, max: 5, noNaN: true }),
    designedOn: fc.constantFrom(...rows.map((r) => r.size), "not-a-size"),
    sizeRun: fc.uniqueArray(
      fc.record({
        size: fc.constantFrom(...rows.map((r) => r.size), "ZZ", "9XL"),
        quantity: fc.oneof(fc.constant(0), fc.integer({ min: 1, max: 500 })),
      }),
      { selector: (r) => r.size, maxLength: rows.length + 2 },
    ),
    k: fc.integer({ min: 1, max: MAX_TRANSFER_WIDTHS }),
  }),
);

function placementOf(j: {
  location: (typeof job extends fc.Arbitrary<infer J> ? J : never)["location"];
  widthIn: number;
  aspect: number;
}) {
  return {
    id: "p",
    location: j.location,
    artworkId: null,
    widthIn: j.widthIn,
    heightIn: j.widthIn / j.aspect,
    offsetFromCenterIn: 0,
    belowCollarIn: 3,
    rotationDeg: 0,
  };
}

describe("grading inputs from a proof (gradingSizes)", () => {
  it("puts every size-run entry in exactly one of sizes, missing or noRoom, with 0 < ideal ≤ allowed, all finite", () => {
    const reach = reachCounter("gradingSizes");
    fc.assert(
      fc.property(job, (j) => {
        reach.generated();
        const { sizes, missing, noRoom } = gradingSizes({
          category: j.category,
          chart: j.rows,
          sizeRun: j.sizeRun,
          placement: placementOf(j),
          designedOn: j.designedOn,
        });
        expect(nonFinitePaths(sizes)).toEqual([]);
        if (j.sizeRun.length > 0) reach.reached("a size-run entry");
        if (sizes.length > 0) reach.reached("a graded size");
        if (noRoom.length > 0) reach.reached("a size with no room");
        const chartSizes = new Set(j.rows.map((r) => r.size));
        for (const entry of j.sizeRun) {
          const inSizes = sizes.filter((s) => s.size === entry.size).length;
          const inMissing = missing.filter((s) => s === entry.size).length;
          const inNoRoom = noRoom.filter((s) => s === entry.size).length;
          expect(inSizes + inMissing + inNoRoom).toBe(1);
          expect(inMissing).toBe(chartSizes.has(entry.size) ? 0 : 1);
        }
        for (const size of noRoom) {
          const row = j.rows.find((r) => r.size === size)!;
          const spec = locationSpec({
            location: j.location,
            category: j.category,
            group: row.group,
            measurements: row.measurements,
          });
          // No room: no width, or no height (the art's proportions then need a width of 0).
          expect(Math.min(spec.maxWidth, spec.maxHeight)).toBe(0);
        }
        for (const s of sizes) {
          expect(s.allowedWidthIn).toBeGreaterThan(0);
          expect(s.idealWidthIn).toBeGreaterThan(0);
          expect(s.idealWidthIn).toBeLessThanOrEqual(s.allowedWidthIn);
          expect(s.quantity).toBe(j.sizeRun.find((e) => e.size === s.size)!.quantity);
        }
      }),
      { numRuns: 120, seed: reach.seed },
    );
    reach.expectShare("a size-run entry", SHARE.sizeRunEntry);
    reach.expectShare("a graded size", SHARE.gradedSize);
    reach.expectShare("a size with no room", SHARE.noRoomSize);
  });

  it("gives gradeSizeRun input it accepts, and grading assigns every ordered size exactly one width within its allowance", () => {
    const reach = reachCounter("grading from a proof");
    fc.assert(
      fc.property(job, (j) => {
        reach.generated();
        const { sizes } = gradingSizes({
          category: j.category,
          chart: j.rows,
          sizeRun: j.sizeRun,
          placement: placementOf(j),
          designedOn: j.designedOn,
        });
        if (sizes.length === 0) return;
        reach.reached("a graded size");
        const result = gradeSizeRun(sizes, j.k);
        expect(nonFinitePaths(result)).toEqual([]);
        expect(result.groups.length).toBeLessThanOrEqual(j.k);
        for (const s of sizes) {
          const inGroups = result.groups.filter((g) => g.sizes.includes(s.size)).length;
          if (s.quantity > 0) {
            expect(inGroups).toBe(1);
            expect(result.assignment[s.size]).toBeLessThanOrEqual(s.allowedWidthIn + 1e-9);
            expect(result.assignment[s.size]).toBeGreaterThan(0);
          } else {
            expect(inGroups + result.uncovered.filter((u) => u === s.size).length).toBe(1);
          }
        }
        expect(result.totalShortfall).toBeGreaterThanOrEqual(0);
      }),
      { numRuns: 120, seed: reach.seed },
    );
    reach.expectShare("a graded size", SHARE.gradedSize);
  });
});

describe("prints per size (printsPerSize)", () => {
  it("gives one row per size in order, positive finite sizes with the designed aspect, and T1… narrowest first", () => {
    const reach = reachCounter("printsPerSize");
    fc.assert(
      fc.property(
        fc.record({
          widthIn: fc.double({ min: 0.25, max: 16, noNaN: true }),
          aspect: fc.double({ min: 0.2, max: 5, noNaN: true }),
          location: fc.constant("full-front" as const),
        }),
        fc.uniqueArray(
          fc.record({ size: fc.constantFrom("XS", "S", "M", "L", "XL", "2XL"), quantity: fc.nat(300) }),
          { selector: (r) => r.size },
        ),
        fc.option(
          fc.dictionary(fc.constantFrom("XS", "S", "M", "L", "XL"), fc.constantFrom(9, 10, 10.5, 11.25)),
          { nil: null },
        ),
        (p, sizeRun, assignment) => {
          reach.generated();
          const placement = placementOf(p);
          const prints = printsPerSize({ placement, sizeRun, assignment });
          expect(prints.map((r) => r.size)).toEqual(sizeRun.map((r) => r.size));
          const widths = [...new Set(Object.values(assignment ?? {}))].sort((a, b) => a - b);
          if (prints.length > 0) reach.reached("a print row");
          if (prints.some((row) => assignment?.[row.size] !== undefined)) reach.reached("a graded row");
          for (const row of prints) {
            expect(nonFinitePaths(row)).toEqual([]);
            expect(row.widthIn).toBeGreaterThan(0);
            expect(row.heightIn).toBeGreaterThan(0);
            expect(row.widthIn / row.heightIn).toBeCloseTo(p.aspect, 6);
            const assigned = assignment?.[row.size];
            if (assigned !== undefined)
              expect(row.transfer.startsWith(`T${widths.indexOf(assigned) + 1} · `)).toBe(true);
            else expect(row.transfer.startsWith("As designed")).toBe(true);
          }
        },
      ),
      { numRuns: 200, seed: reach.seed },
    );
    reach.expectShare("a print row", SHARE.printRow);
    reach.expectShare("a graded row", SHARE.assignedRow);
  });
});

describe("tiling on wild input", () => {
  const wild = fc.oneof(
    fc.double(),
    fc.double({ min: -1, max: 200, noNaN: true }),
    fc.constantFrom(0, -0, 1e-9, 1e9),
  );
  // Mostly plannable sizes, so both the plan and the refusal are exercised.
  const side = fc.oneof(
    { weight: 4, arbitrary: fc.double({ min: 0.1, max: 150, noNaN: true }) },
    { weight: 1, arbitrary: wild },
  );
  const small = fc.option(
    fc.oneof(
      { weight: 3, arbitrary: fc.double({ min: 0, max: 1.5, noNaN: true }) },
      { weight: 1, arbitrary: wild },
    ),
    { nil: undefined },
  );

  it("either plans at most MAX_TILE_PAGES pages with finite numbers that cover the art inside the printable area, or throws RangeError", () => {
    const reach = reachCounter("tiling on wild input");
    fc.assert(
      fc.property(
        side,
        side,
        fc.constantFrom<PaperId>(...(Object.keys(PAPER_SIZES) as PaperId[])),
        small,
        small,
        (w, h, paper, marginIn, overlapIn) => {
          reach.generated();
          let plan: ReturnType<typeof planTiles>;
          try {
            plan = planTiles({ artWidthIn: w, artHeightIn: h, paper, marginIn, overlapIn });
          } catch (error) {
            expect(error).toBeInstanceOf(RangeError);
            expect((error as Error).message).not.toMatch(/undefined/);
            reach.reached("a refusal");
            return;
          }
          reach.reached("a plan");
          expect(nonFinitePaths(plan)).toEqual([]);
          expect(plan.pages).toBe(plan.tiles.length);
          expect(plan.pages).toBeGreaterThan(0);
          expect(plan.pages).toBeLessThanOrEqual(MAX_TILE_PAGES);
          expectTiledArt(plan);
          const coverage = tileCoverage(plan);
          expect(coverage.coversArt && coverage.insideArt && coverage.insidePrintable).toBe(true);
          for (const o of [...coverage.horizontalOverlaps, ...coverage.verticalOverlaps])
            expect(o).toBeCloseTo(plan.overlapIn, 6);
        },
      ),
      { numRuns: 400, seed: reach.seed },
    );
    reach.expectShare("a plan", SHARE.plannedTiles);
    reach.expectShare("a refusal", SHARE.refusedTiles);
  });
});

describe("gang sheets on wild input", () => {
  type Pick = <T, U>(valid: fc.Arbitrary<T>, wild: fc.Arbitrary<U>) => fc.Arbitrary<T | U>;
  /** Mostly a valid value, sometimes a wild one: every refusal gets exercised. */
  const mostly: Pick = (valid, wild) =>
    fc.oneof({ weight: 5, arbitrary: valid }, { weight: 1, arbitrary: wild });
  /** Only the valid value, for jobs that mostly reach a layout. */
  const validOnly: Pick = (valid, wild) => {
    void wild;
    return valid;
  };
  // Wild, but a roll a million inches wide is as far as it goes: beyond that the areas overflow to Infinity.
  const wildNumber = fc.oneof(
    fc.double({ min: -1e6, max: 1e6 }),
    fc.double({ min: -2, max: 3 }),
    fc.constantFrom(Number.NaN, Infinity, 0, 1e-7, 1e6),
  );
  const jobWith = (pick: Pick) =>
    fc.tuple(
      fc.array(
        fc.record({
          widthIn: pick(fc.double({ min: 0.25, max: 12, noNaN: true }), wildNumber),
          heightIn: pick(fc.double({ min: 0.25, max: 20, noNaN: true }), wildNumber),
          quantity: pick(fc.integer({ min: 1, max: 6 }), fc.constantFrom(-1, 0, 2.5, Number.NaN)),
        }),
        { maxLength: 5 },
      ),
      // Spares are bounded here: a spare percentage in the millions multiplies the pieces by ten thousand.
      pick(
        fc.integer({ min: 0, max: 20 }),
        fc.oneof(fc.double({ min: -5, max: 100 }), fc.constantFrom(Number.NaN, Infinity)),
      ),
      fc.record({
        rollWidthIn: pick(fc.constantFrom(11, 13, 22, 24), wildNumber),
        gapIn: pick(fc.constantFrom(0, 0.125, 0.25), wildNumber),
        edgeMarginIn: pick(fc.constantFrom(0, 0.25, 0.5), wildNumber),
        allowRotation: fc.boolean(),
        maxSheetLengthIn: pick(fc.integer({ min: 24, max: 200 }), wildNumber),
        algorithm: fc.constantFrom(DEFAULT_PACKER, ...PACKER_ALGORITHMS),
      }),
    );
  // Half the jobs may hold wild values anywhere (most are refused); the other half hold only valid
  // ones, so that layouts, not only refusals, are checked in numbers.
  const job = fc.oneof(jobWith(mostly), jobWith(validOnly));

  it("either lays every piece inside the roll width without overlaps and with finite numbers, or throws RangeError", () => {
    const reach = reachCounter("gang sheets on wild input");
    fc.assert(
      fc.property(job, ([items, spare, options]) => {
        reach.generated();
        let result: ReturnType<typeof packGangSheet>;
        let pieces: ReturnType<typeof expandTransfers>;
        try {
          pieces = expandTransfers(
            items.map((it, i) => ({ id: `t${i}`, ...it })),
            spare,
          );
          result = packGangSheet({ ...options, pieces });
        } catch (error) {
          expect(error).toBeInstanceOf(RangeError);
          expect((error as Error).message).not.toMatch(/undefined/);
          reach.reached("a refusal");
          return;
        }
        if (result.sheets.length > 0) reach.reached("a packed sheet");
        expect(nonFinitePaths(result)).toEqual([]);
        const placed = result.sheets.flatMap((sheet) => sheet.placements.map((p) => p.pieceId)).sort();
        expect(placed).toEqual(pieces.map((p) => p.pieceId).sort());
        for (const sheet of result.sheets) {
          expect(sheet.lengthIn).toBeGreaterThanOrEqual(0);
          const eps = 1e-9;
          sheet.placements.forEach((a, i) => {
            expect(a.widthIn).toBeGreaterThan(0);
            expect(a.heightIn).toBeGreaterThan(0);
            expect(a.x).toBeGreaterThanOrEqual(-eps);
            expect(a.y).toBeGreaterThanOrEqual(-eps);
            expect(a.x + a.widthIn).toBeLessThanOrEqual(result.rollWidthIn + eps);
            expect(a.y + a.heightIn).toBeLessThanOrEqual(sheet.lengthIn + eps);
            for (const b of sheet.placements.slice(i + 1)) {
              const apart =
                a.x + a.widthIn <= b.x + eps ||
                b.x + b.widthIn <= a.x + eps ||
                a.y + a.heightIn <= b.y + eps ||
                b.y + b.heightIn <= a.y + eps;
              expect(apart).toBe(true);
            }
          });
        }
        expect(result.efficiency).toBeGreaterThanOrEqual(0);
        expect(result.efficiency).toBeLessThanOrEqual(1 + 1e-9);
        expectSoundLayout(result, pieces, {
          rollWidthIn: result.rollWidthIn,
          gapIn: options.gapIn,
          edgeMarginIn: options.edgeMarginIn,
          maxSheetLengthIn: options.maxSheetLengthIn,
          allowRotation: options.allowRotation,
        });
      }),
      { numRuns: 600, seed: reach.seed },
    );
    reach.expectShare("a packed sheet", SHARE.packedSheet);
    reach.expectShare("a refusal", SHARE.refusedSheet);
  });
});

describe("gang sheets at the edge of the roll", () => {
  it.each(PACKER_ALGORITHMS)(
    "%s places a piece that fits the usable width within float noise, as every packer does",
    (algorithm) => {
      // 22 in roll, 0.25 in margins: 21.5 in usable; the piece is over by 5e-10 in, inside the shared tolerance.
      const pieces = [
        { pieceId: "a#1", itemId: "a", widthIn: 21.5 + 5e-10, heightIn: 3 },
        { pieceId: "b#1", itemId: "b", widthIn: 3, heightIn: 21.5 + 5e-10 },
      ];
      for (const allowRotation of [false, true]) {
        const result = packGangSheet({
          pieces,
          rollWidthIn: 22,
          edgeMarginIn: 0.25,
          gapIn: 0.25,
          allowRotation,
          maxSheetLengthIn: 24,
          algorithm,
        });
        expect(
          result.sheets
            .flatMap((s) => s.placements)
            .map((p) => p.pieceId)
            .sort(),
        ).toEqual(["a#1", "b#1"]);
      }
    },
  );
});

describe("location limits feed grading sensibly", () => {
  it("every catalog size with room at a location gets an allowance equal to the widest art of its proportions inside the print area", () => {
    for (const blank of CATALOG) {
      for (const location of locationsFor(blank.category)) {
        const chartRows = blank.sizes.map((r) => ({
          size: r.size,
          group: r.group,
          measurements: r.measurements,
        }));
        const placement = placementOf({ location, widthIn: 3, aspect: 1 });
        const { sizes } = gradingSizes({
          category: blank.category,
          chart: chartRows,
          sizeRun: chartRows.map((r) => ({ size: r.size, quantity: 1 })),
          placement,
          designedOn: chartRows[0]!.size,
        });
        for (const s of sizes) {
          const row = chartRows.find((r) => r.size === s.size)!;
          const spec = locationSpec({
            location,
            category: blank.category,
            group: row.group,
            measurements: row.measurements,
          });
          // Square art (aspect 1): the print area's shorter side bounds it.
          expect(s.allowedWidthIn).toBeCloseTo(Math.min(spec.maxWidth, spec.maxHeight), 9);
        }
      }
    }
  });
});
