import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { fillPrintArea, placeSuggestedSize, suggestSize, type ArtShape } from "@/lib/artwork/advice";
import { CATALOG } from "@/lib/garments/catalog";
import { locationSpec, locationsFor } from "@/lib/garments/locations";
import { FIT_CODES, checkPlacement } from "@/lib/placement/checks";
import { defaultPlacement, type Placement } from "@/lib/placement/model";
import { reachCounter } from "./fuzz/reach";

/**
 * The editor's "Suggested size" and "Fill print area" buttons must offer a size the editor's own
 * checks accept at the size shown, and never read wider or taller than the print area.
 * Display precision: 1/8 in and 0.1 cm (Chalkline's own formatLength); a print area's shown width
 * is its maximum rounded the same way.
 */
const eighths = (inches: number) => Math.round(inches * 8);
const tenthsOfCm = (inches: number) => Math.round(Number((inches * 2.54).toFixed(1)) * 10);

const SHAPES: ArtShape[] = ["wide", "tall", "square", "round", "emblem"];

/** A blank and size straight from the catalog, a location its category offers. */
const catalogCase = fc
  .record({ blank: fc.constantFrom(...CATALOG), row: fc.nat(), loc: fc.nat() })
  .map(({ blank, row, loc }) => {
    const sizeRow = blank.sizes[row % blank.sizes.length]!;
    const offered = locationsFor(blank.category);
    return { blank, sizeRow, location: offered[loc % offered.length]! };
  });

/** Art proportions from 1:10 to 10:1, with the usual round numbers drawn often. */
const aspect = fc.oneof(
  fc.double({ min: Math.log(0.1), max: Math.log(10), noNaN: true }).map(Math.exp),
  fc.constantFrom(1, 1.25, 0.8, 4 / 3, 0.75, 3, 1 / 3),
);

/** Where the print is before the button is pressed: the usual spot, or moved and turned by hand. */
const moved = fc.oneof(
  fc.constant({ dx: 0, dy: 0, turn: 0 }),
  fc.record({
    dx: fc.double({ min: -10, max: 10, noNaN: true }),
    dy: fc.double({ min: -10, max: 10, noNaN: true }),
    turn: fc.double({ min: -45, max: 45, noNaN: true }),
  }),
);

describe("suggested sizes pass the editor's own checks", () => {
  it("for catalog blanks and sizes, offered locations and any art proportions", () => {
    const reach = reachCounter("suggested sizes");
    fc.assert(
      fc.property(
        catalogCase,
        aspect,
        fc.constantFrom(...SHAPES),
        moved,
        fc.constantFrom("in" as const, "cm" as const),
        ({ blank, sizeRow, location }, ratio, shape, move, unit) => {
          reach.generated();
          const { group, measurements } = sizeRow;
          const spec = locationSpec({ location, category: blank.category, group, measurements });
          const start: Placement =
            spec.typicalWidth > 0 && spec.typicalHeight > 0
              ? defaultPlacement(spec, ratio, "p")
              : {
                  id: "p",
                  location,
                  artworkId: null,
                  widthIn: 1,
                  heightIn: 1 / ratio,
                  offsetFromCenterIn: spec.defaultOffsetFromCenter,
                  belowCollarIn: spec.defaultBelowCollar,
                  rotationDeg: spec.axisRotationDeg,
                };
          const before: Placement = {
            ...start,
            offsetFromCenterIn: start.offsetFromCenterIn + move.dx,
            belowCollarIn: start.belowCollarIn + move.dy,
            rotationDeg: Math.max(-180, Math.min(180, start.rotationDeg + move.turn)),
          };
          const advice = suggestSize({
            shape,
            aspect: ratio,
            group,
            maxWidthIn: spec.maxWidth,
            maxHeightIn: spec.maxHeight,
            unit,
          });
          const fill = fillPrintArea({
            aspect: ratio,
            maxWidthIn: spec.maxWidth,
            maxHeightIn: spec.maxHeight,
            unit,
          });
          for (const [name, size] of [
            ["suggested", advice],
            ["fill", fill],
          ] as const) {
            const placed = placeSuggestedSize({
              placement: before,
              size,
              category: blank.category,
              group,
              measurements,
              sizeLabel: sizeRow.size,
            });
            if (!(size.widthIn > 0 && size.heightIn > 0)) {
              // Only a print area under 1/8 in on the art's long side has nothing to suggest.
              expect(placed, name).toBeNull();
              const longRoom =
                ratio >= 1
                  ? Math.min(spec.maxWidth, spec.maxHeight * ratio)
                  : Math.min(spec.maxHeight, spec.maxWidth / ratio);
              expect(longRoom).toBeLessThan(0.125 + 1e-9);
              continue;
            }
            reach.reached(`a ${name} size to place`);
            expect(placed, name).not.toBeNull();
            const p = placed!.placement;
            // Rounded down to 1/8 in on the long side; the short side keeps the art's proportions.
            const long = ratio >= 1 ? p.widthIn : p.heightIn;
            expect(Math.abs(long * 8 - Math.round(long * 8)), name).toBeLessThan(1e-9);
            expect(p.widthIn / p.heightIn).toBeCloseTo(ratio, 9);
            expect(p.widthIn).toBeLessThanOrEqual(spec.maxWidth + 1e-9);
            expect(p.heightIn).toBeLessThanOrEqual(spec.maxHeight + 1e-9);
            // Its shown size never reads past the print area's shown size, in either unit.
            expect(eighths(p.widthIn)).toBeLessThanOrEqual(eighths(spec.maxWidth));
            expect(eighths(p.heightIn)).toBeLessThanOrEqual(eighths(spec.maxHeight));
            expect(tenthsOfCm(p.widthIn)).toBeLessThanOrEqual(tenthsOfCm(spec.maxWidth));
            expect(tenthsOfCm(p.heightIn)).toBeLessThanOrEqual(tenthsOfCm(spec.maxHeight));
            // No fit warning at all from the checks the editor shows for this size.
            for (const shownIn of ["in", "cm"] as const) {
              const warnings = checkPlacement({
                placement: p,
                category: blank.category,
                group,
                measurements,
                size: sizeRow.size,
                unit: shownIn,
              });
              const misfits = warnings.filter((w) => FIT_CODES.has(w.code));
              expect(
                misfits.map((w) => w.message),
                `${name} ${blank.id} ${sizeRow.size} ${location} ${shownIn}`,
              ).toEqual([]);
            }
            // In place keeps the print's offset and turn; the usual spot straightens it to the location's axis.
            const kept = placed!.where === "in-place";
            if (kept)
              expect([p.offsetFromCenterIn, p.rotationDeg]).toEqual([
                before.offsetFromCenterIn,
                before.rotationDeg,
              ]);
            else expect(p.rotationDeg).toBe(spec.axisRotationDeg);
            reach.reached(`${name}: ${kept ? "kept where it was" : "moved to the usual spot"}`);
          }
        },
      ),
      { numRuns: 600, seed: reach.seed },
    );
    // Shares measured over several seeds, set well below them so chance alone does not fail it.
    for (const name of ["suggested", "fill"]) {
      reach.expectShare(`a ${name} size to place`, 0.9); // measured 1.0 (every catalog location has room)
      reach.expectShare(`${name}: kept where it was`, 0.5); // measured 0.83 to 0.88
      reach.expectShare(`${name}: moved to the usual spot`, 0.06); // measured 0.11 to 0.17
    }
  });
});

describe("the usual spot holds any size inside the print area", () => {
  // Every catalog row and offered location, a spread of proportions, each side at its largest.
  const cases = CATALOG.flatMap((blank) =>
    blank.sizes.flatMap((row) =>
      locationsFor(blank.category).map((location) => [blank.id, row.size, location, blank, row] as const),
    ),
  );
  it.each(cases)(
    "%s %s %s: the largest fill at the usual spot has no fit warning",
    (_id, _size, location, blank, row) => {
      const spec = locationSpec({
        location,
        category: blank.category,
        group: row.group,
        measurements: row.measurements,
      });
      for (const ratio of [0.1, 0.5, 0.8, 1, 1.25, 2, 10]) {
        const fill = fillPrintArea({ aspect: ratio, maxWidthIn: spec.maxWidth, maxHeightIn: spec.maxHeight });
        // A print turned and pushed far off: the in-place size cannot fit, so it goes to the usual spot.
        const far: Placement = {
          id: "p",
          location,
          artworkId: null,
          widthIn: 1,
          heightIn: 1,
          offsetFromCenterIn: 40,
          belowCollarIn: 40,
          rotationDeg: 45,
        };
        const p = placeSuggestedSize({
          placement: far,
          size: fill,
          category: blank.category,
          group: row.group,
          measurements: row.measurements,
          sizeLabel: row.size,
        })!.placement;
        expect(p.rotationDeg).toBe(spec.axisRotationDeg);
        const warnings = checkPlacement({
          placement: p,
          category: blank.category,
          group: row.group,
          measurements: row.measurements,
          size: row.size,
        });
        expect(
          warnings.filter((w) => FIT_CODES.has(w.code)).map((w) => w.message),
          String(ratio),
        ).toEqual([]);
      }
    },
  );
});

describe("examples from the demo tee (Everyday Crew Tee, Chalkline's own demo chart)", () => {
  const tee = CATALOG.find((b) => b.id === "everyday-crew-tee")!;
  const row = (size: string) => tee.sizes.find((r) => r.size === size)!;
  it.each([
    // [size, location, shape, aspect, expected width]; 1/8 in steps: Chalkline's own formatLength.
    ["XS", "full-front", "wide", 3, 9.875], // the area's 9.997 in rounds down to 9 7/8 in, never up to 10
    ["M", "left-chest", "square", 1, 4.25], // the area's 4.312 in rounds down to 4 1/4 in
    ["M", "full-front", "wide", 3, 11], // the trade's 11 in target is already on the 1/8 in grid (common practice)
  ] as const)("%s %s, %s art: suggests %d in wide", (size, location, shape, ratio, width) => {
    const r = row(size);
    const spec = locationSpec({
      location,
      category: tee.category,
      group: r.group,
      measurements: r.measurements,
    });
    const advice = suggestSize({
      shape,
      aspect: ratio,
      group: r.group,
      maxWidthIn: spec.maxWidth,
      maxHeightIn: spec.maxHeight,
    });
    expect(advice.widthIn).toBe(width);
    expect(advice.heightIn).toBeCloseTo(width / ratio, 9);
  });

  it("names the print area as the checks name its limit", () => {
    const r = row("XS");
    const spec = locationSpec({
      location: "full-front",
      category: tee.category,
      group: r.group,
      measurements: r.measurements,
    });
    const advice = suggestSize({
      shape: "wide",
      aspect: 3,
      group: r.group,
      maxWidthIn: spec.maxWidth,
      maxHeightIn: spec.maxHeight,
    });
    expect(advice.rule).toContain("Reduced to stay inside the print area (10 × 14 in).");
    const wide = checkPlacement({
      placement: { ...defaultPlacement(spec, 3, "p"), widthIn: 10.25, heightIn: 10.25 / 3 },
      category: tee.category,
      group: r.group,
      measurements: r.measurements,
      size: "XS",
    }).find((w) => w.code === "too-wide")!;
    expect(wide.message).toBe("The art is 10 1/4 in wide; a full front on size XS takes at most 10 in.");
  });
});
