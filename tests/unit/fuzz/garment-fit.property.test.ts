import fc from "fast-check";
import { describe, expect, it, vi } from "vitest";
import { locationSpec, locationsFor } from "@/lib/garments/locations";
import { buildSilhouette, pointInPolygon, polygonSpanAtY } from "@/lib/garments/silhouette";
import { GARMENT_SIDES } from "@/lib/garments/types";
import { FIT_CODES, checkAcrossSizes, checkPlacement } from "@/lib/placement/checks";
import {
  defaultPlacement,
  fitInBox,
  placementBounds,
  placementCorners,
  placementSchema,
} from "@/lib/placement/model";
import { EPSILON_IN } from "@/lib/units";
import { finite, garment, garmentWithOfferedLocation, nonFinitePaths, placementOn } from "./arbitraries";

// Property runs share two cores with other work; give them room beyond the 5 s default.
vi.setConfig({ testTimeout: 30_000 });

const RUNS = { numRuns: 150 };

describe("silhouettes of any chart row the schema accepts", () => {
  it("have only finite points, a hem below the HPS, and a body edge that spans the hem", () => {
    fc.assert(
      fc.property(garment, fc.constantFrom(...GARMENT_SIDES), (g, side) => {
        const s = buildSilhouette(g.category, g.measurements, side);
        expect(nonFinitePaths(s)).toEqual([]);
        expect(s.hemY).toBeGreaterThan(s.hps.right.y);
        expect(s.outline.length).toBeGreaterThan(2);
        const mid = (s.hps.right.y + s.hemY) / 2;
        const edge = s.bodyEdgeAt(mid);
        if (edge) {
          expect(edge.right).toBeGreaterThanOrEqual(edge.left);
          expect(Number.isFinite(edge.left) && Number.isFinite(edge.right)).toBe(true);
        }
      }),
      RUNS,
    );
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
    fc.assert(
      fc.property(
        garmentWithOfferedLocation,
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        ({ g, location }, aspect) => {
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
      { numRuns: 300 },
    );
  });
});

describe("checkPlacement on finite input", () => {
  it("never throws on any finite numbers (up to ±Number.MAX_VALUE), and its messages never read NaN", () => {
    fc.assert(
      fc.property(
        garment,
        placementOn(),
        fc.constantFrom("in" as const, "cm" as const),
        (g, placement, unit) => {
          const warnings = checkPlacement({
            placement,
            category: g.category,
            group: g.group,
            measurements: g.measurements,
            size: g.size,
            unit,
          });
          for (const w of warnings) {
            expect(w.message.length).toBeGreaterThan(0);
            expect(w.message).not.toMatch(/NaN|Infinity|undefined/);
          }
          // Errors come first, then warnings, then hints.
          const order = warnings.map((w) => ({ error: 0, warning: 1, info: 2 })[w.severity]);
          expect(order).toEqual([...order].sort((a, b) => a - b));
        },
      ),
      { numRuns: 400 },
    );
  });

  it("reports only finite numbers in its details for positions within a mile of the collar", () => {
    const mile = fc.double({ min: -63_360, max: 63_360, noNaN: true });
    fc.assert(
      fc.property(garment, placementOn(), mile, mile, (g, placement, x, y) => {
        const warnings = checkPlacement({
          placement: { ...placement, offsetFromCenterIn: x, belowCollarIn: y },
          category: g.category,
          group: g.group,
          measurements: g.measurements,
          size: g.size,
        });
        for (const w of warnings) expect(nonFinitePaths(w.details ?? {})).toEqual([]);
      }),
      { numRuns: 300 },
    );
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

  it("reports too-wide and too-tall exactly when the art passes the location's maximum", () => {
    fc.assert(
      fc.property(
        garmentWithOfferedLocation,
        fc.double({ min: 0.05, max: 3, noNaN: true }),
        fc.double({ min: 0.05, max: 3, noNaN: true }),
        ({ g, location }, fw, fh) => {
          const spec = locationSpec({
            location,
            category: g.category,
            group: g.group,
            measurements: g.measurements,
          });
          const widthIn = Math.min(60, Math.max(0.01, spec.maxWidth * fw));
          const heightIn = Math.min(60, Math.max(0.01, spec.maxHeight * fh));
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
          expect(codes.includes("too-wide")).toBe(widthIn > spec.maxWidth + EPSILON_IN);
          expect(codes.includes("too-tall")).toBe(heightIn > spec.maxHeight + EPSILON_IN);
        },
      ),
      RUNS,
    );
  });

  it("reports area art that pokes out of its print area, and stays quiet about art inside it", () => {
    fc.assert(
      fc.property(
        garmentWithOfferedLocation.filter(
          ({ g, location }) =>
            locationSpec({ location, category: g.category, group: g.group, measurements: g.measurements })
              .fitRule === "area",
        ),
        fc.double({ min: 0.1, max: 0.95, noNaN: true }),
        fc.double({ min: 0.1, max: 0.95, noNaN: true }),
        fc.double({ min: 0.05, max: 2, noNaN: true }),
        ({ g, location }, fw, fh, poke) => {
          const spec = locationSpec({
            location,
            category: g.category,
            group: g.group,
            measurements: g.measurements,
          });
          fc.pre(spec.maxWidth > 0.1 && spec.maxHeight > 0.1);
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
      RUNS,
    );
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
