import fc from "fast-check";
import { describe, expect, it, vi } from "vitest";
import { locationSpec, locationsFor } from "@/lib/garments/locations";
import { buildSilhouette, pointInPolygon, polygonSpanAtY } from "@/lib/garments/silhouette";
import { GARMENT_SIDES } from "@/lib/garments/types";
import { FIT_CODES, checkAcrossSizes, checkPlacement } from "@/lib/placement/checks";
import { defaultPlacement, fitInBox, placementBounds, placementCorners } from "@/lib/placement/model";
import { placementSchema } from "@/lib/placement/schema";
import { EPSILON_IN } from "@/lib/units";
import {
  finite,
  garment,
  garmentWithOfferedLocation,
  nonFinitePaths,
  placementOn,
  sizedPlacementOn,
} from "./arbitraries";
import { reachCounter } from "./reach";

// Property runs share two cores with other work; give them room beyond the 5 s default.
vi.setConfig({ testTimeout: 30_000 });

const RUNS = { numRuns: 150 };

/**
 * Least share of generated cases that must reach each guarded check (reach.ts). Each is set well
 * below the share measured over several seeds, noted beside it, so chance alone does not fail it.
 */
const SHARE = {
  bodyEdge: 0.9, // measured 1.0
  roomForDefault: 0.4, // measured 0.58 to 0.65
  someWarning: 0.9, // measured 0.998 to 1.0
  warningsToOrder: 0.15, // measured 0.25 to 0.31 (0.04 to 0.05 before half the placements were sized)
  numericDetails: 0.2, // measured 0.32 to 0.35 (0.04 to 0.06 before half the placements were sized)
  eachSideOfALimit: 0.15, // measured 0.25 to 0.39 past the shown limit, 0.61 to 0.75 within it
  areaWithRoom: 0.4, // measured 0.6 to 0.64
};

describe("silhouettes of any chart row the schema accepts", () => {
  it("have only finite points, a hem below the HPS, and a body edge that spans the hem", () => {
    const reach = reachCounter("silhouettes");
    fc.assert(
      fc.property(garment, fc.constantFrom(...GARMENT_SIDES), (g, side) => {
        reach.generated();
        const s = buildSilhouette(g.category, g.measurements, side);
        expect(nonFinitePaths(s)).toEqual([]);
        expect(s.hemY).toBeGreaterThan(s.hps.right.y);
        expect(s.outline.length).toBeGreaterThan(2);
        const mid = (s.hps.right.y + s.hemY) / 2;
        const edge = s.bodyEdgeAt(mid);
        if (edge) {
          reach.reached("a body edge halfway down");
          expect(edge.right).toBeGreaterThanOrEqual(edge.left);
          expect(Number.isFinite(edge.left) && Number.isFinite(edge.right)).toBe(true);
        }
      }),
      { ...RUNS, seed: reach.seed },
    );
    reach.expectShare("a body edge halfway down", SHARE.bodyEdge);
  });
});

describe("locationSpec on any chart row the schema accepts", () => {
  it("gives finite limits, no negative sizes, typical within maximum, and a print area of the maximum size", () => {
    fc.assert(
      fc.property(garment, (g) => {
        for (const location of locationsFor(g.category)) {
          const spec = locationSpec({
            location,
            category: g.category,
            group: g.group,
            measurements: g.measurements,
          });
          expect(nonFinitePaths(spec), location).toEqual([]);
          expect(spec.maxWidth).toBeGreaterThanOrEqual(0);
          expect(spec.maxHeight).toBeGreaterThanOrEqual(0);
          expect(spec.typicalWidth).toBeGreaterThanOrEqual(0);
          expect(spec.typicalHeight).toBeGreaterThanOrEqual(0);
          expect(spec.typicalWidth).toBeLessThanOrEqual(spec.maxWidth + EPSILON_IN);
          expect(spec.typicalHeight).toBeLessThanOrEqual(spec.maxHeight + EPSILON_IN);
          expect(spec.printArea.width).toBeCloseTo(spec.maxWidth, 9);
          expect(spec.printArea.height).toBeCloseTo(spec.maxHeight, 9);
          expect(spec.axisRotationDeg).toBeGreaterThan(-180);
          expect(spec.axisRotationDeg).toBeLessThanOrEqual(180);
        }
      }),
      RUNS,
    );
  });
});

describe("default placements", () => {
  it("fit their own size: valid, no fit problem and no print-area overhang wherever the location has room", () => {
    const reach = reachCounter("default placements");
    fc.assert(
      fc.property(
        garmentWithOfferedLocation,
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        ({ g, location }, aspect) => {
          reach.generated();
          const spec = locationSpec({
            location,
            category: g.category,
            group: g.group,
            measurements: g.measurements,
          });
          if (!(spec.typicalWidth > 0 && spec.typicalHeight > 0)) {
            expect(() => defaultPlacement(spec, aspect)).toThrow(RangeError);
            return;
          }
          reach.reached("a location with room");
          const p = defaultPlacement(spec, aspect);
          expect(placementSchema.safeParse(p).success).toBe(true);
          expect(p.widthIn).toBeLessThanOrEqual(spec.typicalWidth + EPSILON_IN);
          expect(p.heightIn).toBeLessThanOrEqual(spec.typicalHeight + EPSILON_IN);
          expect(p.widthIn / p.heightIn).toBeCloseTo(aspect, 6);
          const warnings = checkPlacement({
            placement: p,
            category: g.category,
            group: g.group,
            measurements: g.measurements,
            size: g.size,
          });
          const fit = warnings.filter((w) => FIT_CODES.has(w.code) && w.severity !== "info");
          expect(fit.map((w) => w.message)).toEqual([]);
        },
      ),
      { numRuns: 300, seed: reach.seed },
    );
    reach.expectShare("a location with room", SHARE.roomForDefault);
  });
});

describe("checkPlacement on finite input", () => {
  it("never throws on any finite numbers (up to ±Number.MAX_VALUE), and its messages never read NaN", () => {
    const reach = reachCounter("checkPlacement on finite input");
    fc.assert(
      fc.property(
        garment,
        // Half with any finite numbers, half past validation, so the fit checks' messages are read too.
        fc.oneof(placementOn(), sizedPlacementOn()),
        fc.constantFrom("in" as const, "cm" as const),
        (g, placement, unit) => {
          reach.generated();
          const warnings = checkPlacement({
            placement,
            category: g.category,
            group: g.group,
            measurements: g.measurements,
            size: g.size,
            unit,
          });
          if (warnings.length > 0) reach.reached("some warning");
          if (warnings.length > 1) reach.reached("two or more warnings to order");
          for (const w of warnings) {
            expect(w.message.length).toBeGreaterThan(0);
            expect(w.message).not.toMatch(/NaN|Infinity|undefined/);
          }
          // Errors come first, then warnings, then hints.
          const order = warnings.map((w) => ({ error: 0, warning: 1, info: 2 })[w.severity]);
          expect(order).toEqual([...order].sort((a, b) => a - b));
        },
      ),
      { numRuns: 400, seed: reach.seed },
    );
    reach.expectShare("some warning", SHARE.someWarning);
    reach.expectShare("two or more warnings to order", SHARE.warningsToOrder);
  });

  it("reports only finite numbers in its details for positions within a mile of the collar", () => {
    const mile = fc.double({ min: -63_360, max: 63_360, noNaN: true });
    const reach = reachCounter("details within a mile");
    fc.assert(
      fc.property(garment, fc.oneof(placementOn(), sizedPlacementOn()), mile, mile, (g, placement, x, y) => {
        reach.generated();
        const warnings = checkPlacement({
          placement: { ...placement, offsetFromCenterIn: x, belowCollarIn: y },
          category: g.category,
          group: g.group,
          measurements: g.measurements,
          size: g.size,
        });
        if (warnings.some((w) => w.details && Object.values(w.details).some((v) => typeof v === "number")))
          reach.reached("a warning with numbers in its details");
        for (const w of warnings) expect(nonFinitePaths(w.details ?? {})).toEqual([]);
      }),
      { numRuns: 300, seed: reach.seed },
    );
    reach.expectShare("a warning with numbers in its details", SHARE.numericDetails);
  });

  it("reports art moved wholly away from the garment: off-garment on the body, outside-print-area elsewhere", () => {
    fc.assert(
      fc.property(
        garmentWithOfferedLocation,
        fc.double({ min: 0.5, max: 12, noNaN: true }),
        fc.double({ min: 0.5, max: 12, noNaN: true }),
        fc.constantFrom([1, 0], [-1, 0], [0, 1], [0, -1]),
        ({ g, location }, widthIn, heightIn, [dx, dy]) => {
          const spec = locationSpec({
            location,
            category: g.category,
            group: g.group,
            measurements: g.measurements,
          });
          const far = 200;
          const placement = {
            id: "p",
            location,
            artworkId: null,
            widthIn,
            heightIn,
            offsetFromCenterIn: dx! * far,
            belowCollarIn: dy! * far,
            rotationDeg: spec.axisRotationDeg,
          };
          const codes = checkPlacement({
            placement,
            category: g.category,
            group: g.group,
            measurements: g.measurements,
            size: g.size,
          }).map((w) => w.code);
          expect(codes).toContain(spec.fitRule === "body" ? "off-garment" : "outside-print-area");
        },
      ),
      RUNS,
    );
  });

  it("reports too-wide and too-tall exactly when the art reads past the location's maximum", () => {
    // Limits are judged at the precision shown: the nearest 1/8 in (Chalkline's own formatLength).
    const eighths = (inches: number) => Math.round(inches * 8);
    // Half the sides are a multiple of the maximum; half sit within 3/8 in of the maximum as shown,
    // off the 1/16 in rounding edges by a hair, so equal readings and one-step-over readings both come up.
    const sideAgainstLimit: fc.Arbitrary<(max: number) => number> = fc.oneof(
      fc.double({ min: 0.05, max: 3, noNaN: true }).map((f) => (max: number) => max * f),
      fc
        .record({
          k: fc.integer({ min: -6, max: 6 }),
          hair: fc.double({ min: -0.03, max: 0.03, noNaN: true }),
        })
        .map(
          ({ k, hair }) =>
            (max: number) =>
              eighths(max) / 8 + k / 16 + hair,
        ),
    );
    const reach = reachCounter("size limits");
    fc.assert(
      fc.property(
        garmentWithOfferedLocation,
        sideAgainstLimit,
        sideAgainstLimit,
        ({ g, location }, width, height) => {
          reach.generated();
          const spec = locationSpec({
            location,
            category: g.category,
            group: g.group,
            measurements: g.measurements,
          });
          const widthIn = Math.min(60, Math.max(0.01, width(spec.maxWidth)));
          const heightIn = Math.min(60, Math.max(0.01, height(spec.maxHeight)));
          const placement = {
            id: "p",
            location,
            artworkId: null,
            widthIn,
            heightIn,
            offsetFromCenterIn: spec.defaultOffsetFromCenter,
            belowCollarIn: spec.defaultBelowCollar,
            rotationDeg: spec.axisRotationDeg,
          };
          const codes = checkPlacement({
            placement,
            category: g.category,
            group: g.group,
            measurements: g.measurements,
            size: g.size,
          }).map((w) => w.code);
          const wide = eighths(widthIn) > eighths(spec.maxWidth);
          const tall = eighths(heightIn) > eighths(spec.maxHeight);
          expect(codes.includes("too-wide")).toBe(wide);
          expect(codes.includes("too-tall")).toBe(tall);
          reach.reached(wide ? "too wide" : "not too wide");
          reach.reached(tall ? "too tall" : "not too tall");
        },
      ),
      { ...RUNS, seed: reach.seed },
    );
    for (const label of ["too wide", "not too wide", "too tall", "not too tall"])
      reach.expectShare(label, SHARE.eachSideOfALimit);
  });

  it("reports area art that pokes out of its print area, and stays quiet about art inside it", () => {
    const reach = reachCounter("area art");
    fc.assert(
      fc.property(
        garmentWithOfferedLocation.filter(
          ({ g, location }) =>
            locationSpec({ location, category: g.category, group: g.group, measurements: g.measurements })
              .fitRule === "area",
        ),
        fc.double({ min: 0.1, max: 0.95, noNaN: true }),
        fc.double({ min: 0.1, max: 0.95, noNaN: true }),
        // At least 0.07 in, so the overhang reads as 1/8 in or more (the display's precision).
        fc.double({ min: 0.07, max: 2, noNaN: true }),
        ({ g, location }, fw, fh, poke) => {
          reach.generated();
          const spec = locationSpec({
            location,
            category: g.category,
            group: g.group,
            measurements: g.measurements,
          });
          fc.pre(spec.maxWidth > 0.1 && spec.maxHeight > 0.1);
          reach.reached("an area with room");
          const widthIn = spec.maxWidth * fw;
          const heightIn = spec.maxHeight * fh;
          const cx = spec.printArea.x + spec.printArea.width / 2;
          const cy = spec.printArea.y + spec.printArea.height / 2;
          const inside = {
            id: "p",
            location,
            artworkId: null,
            widthIn,
            heightIn,
            offsetFromCenterIn: cx,
            belowCollarIn: cy - heightIn / 2,
            rotationDeg: spec.axisRotationDeg,
          };
          const input = { category: g.category, group: g.group, measurements: g.measurements, size: g.size };
          expect(checkPlacement({ ...input, placement: inside }).map((w) => w.code)).not.toContain(
            "outside-print-area",
          );
          // Slide the art along its own width axis past the area's edge.
          const shift = spec.maxWidth / 2 - widthIn / 2 + poke;
          const a = (spec.axisRotationDeg * Math.PI) / 180;
          const out = {
            ...inside,
            offsetFromCenterIn: cx + shift * Math.cos(a),
            belowCollarIn: inside.belowCollarIn + shift * Math.sin(a),
          };
          const warning = checkPlacement({ ...input, placement: out }).find(
            (w) => w.code === "outside-print-area",
          );
          expect(warning).toBeDefined();
          expect(warning!.details!.overhangIn as number).toBeCloseTo(poke, 6);
        },
      ),
      { ...RUNS, seed: reach.seed },
    );
    // fast-check draws again after fc.pre rejects a case, so RUNS cases always reach the check;
    // the share says how many draws that took.
    reach.expectShare("an area with room", SHARE.areaWithRoom);
  });

  it("across a size run gives one result per size, in chart order, and fits only without fit problems", () => {
    fc.assert(
      fc.property(fc.array(garment, { minLength: 1, maxLength: 5 }), placementOn(), (rows, placement) => {
        const category = rows[0]!.category;
        const sizes = rows
          .filter((r) => r.category === category)
          .map((r, i) => ({ size: `S${i}`, group: r.group, measurements: r.measurements }));
        const result = checkAcrossSizes({ placement, category, sizes });
        expect(result.map((r) => r.size)).toEqual(sizes.map((s) => s.size));
        for (const r of result)
          expect(r.fits).toBe(!r.warnings.some((w) => FIT_CODES.has(w.code) && w.severity !== "info"));
      }),
      { numRuns: 100 },
    );
  });
});

describe("placement geometry", () => {
  const valid = fc.record({
    id: fc.constant("p"),
    location: fc.constant("full-front" as const),
    artworkId: fc.constant(null),
    widthIn: fc.double({ min: 0.01, max: 60, noNaN: true }),
    heightIn: fc.double({ min: 0.01, max: 60, noNaN: true }),
    offsetFromCenterIn: fc.double({ min: -100, max: 100, noNaN: true }),
    belowCollarIn: fc.double({ min: -100, max: 100, noNaN: true }),
    rotationDeg: fc.double({ min: -180, max: 180, noNaN: true }),
  });

  it("the bounds hold every corner, touch the extreme ones, and have non-negative size", () => {
    fc.assert(
      fc.property(valid, (p) => {
        const b = placementBounds(p);
        const corners = placementCorners(p);
        expect(b.width).toBeGreaterThanOrEqual(0);
        expect(b.height).toBeGreaterThanOrEqual(0);
        for (const c of corners) {
          expect(c.x).toBeGreaterThanOrEqual(b.x - 1e-9);
          expect(c.x).toBeLessThanOrEqual(b.x + b.width + 1e-9);
          expect(c.y).toBeGreaterThanOrEqual(b.y - 1e-9);
          expect(c.y).toBeLessThanOrEqual(b.y + b.height + 1e-9);
        }
        expect(Math.min(...corners.map((c) => c.x))).toBeCloseTo(b.x, 9);
        expect(Math.max(...corners.map((c) => c.y))).toBeCloseTo(b.y + b.height, 9);
        // The turned art keeps its area (a rotation is rigid), and its centre sits inside it.
        const span = polygonSpanAtY(corners, p.belowCollarIn + p.heightIn / 2);
        expect(span).not.toBeNull();
        expect(
          pointInPolygon({ x: p.offsetFromCenterIn, y: p.belowCollarIn + p.heightIn / 2 }, corners),
        ).toBe(true);
      }),
      { numRuns: 300 },
    );
  });

  it("fitInBox keeps the aspect and stays inside the box, touching it on one side", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 100, noNaN: true }),
        fc.double({ min: 0.01, max: 100, noNaN: true }),
        fc.double({ min: 0.01, max: 100, noNaN: true }),
        (aspect, w, h) => {
          const size = fitInBox(aspect, w, h);
          expect(size.width).toBeLessThanOrEqual(w * (1 + 1e-12));
          expect(size.height).toBeLessThanOrEqual(h * (1 + 1e-12));
          expect(size.width / size.height).toBeCloseTo(aspect, 6);
          expect(Math.abs(size.width - w) < 1e-9 * w || Math.abs(size.height - h) < 1e-9 * h).toBe(true);
        },
      ),
      { numRuns: 300 },
    );
  });

  it("fitInBox refuses any aspect that is not a positive finite number", () => {
    fc.assert(
      fc.property(
        fc.oneof(fc.constant(Number.NaN), fc.constant(Infinity), fc.double({ max: 0 })),
        finite,
        finite,
        (aspect, w, h) => {
          expect(() => fitInBox(aspect, w, h)).toThrow(RangeError);
        },
      ),
      { numRuns: 50 },
    );
  });
});
