/**
 * Generators shared by the property tests under tests/unit/fuzz: garments a shop could save
 * (anything the size-chart schema accepts, not only the catalog), placements, and helpers that
 * look for NaN or Infinity anywhere in a result.
 */
import fc from "fast-check";
import { CATALOG } from "@/lib/garments/catalog";
import { PRINT_LOCATIONS, locationsFor, type PrintLocation } from "@/lib/garments/locations";
import { CATEGORY_INFO, GARMENT_CATEGORIES, SIZE_GROUPS, type ApparelMeasurements, type GarmentCategory, type GarmentMeasurements, type SizeGroup, type ToteMeasurements } from "@/lib/garments/types";
import { sizeRowSchemaFor } from "@/lib/garments/schemas";
import type { Placement } from "@/lib/placement/model";

/** A number in the open interval (lo, hi), never touching either end. */
function between(lo: number, hi: number): fc.Arbitrary<number> {
  return fc.double({ min: 0.001, max: 0.999, noNaN: true }).map((t) => lo + t * (hi - lo));
}

/** Apparel measurements anywhere inside the schema's bounds, built so every cross-field rule holds. */
export function apparelMeasurements(category: GarmentCategory): fc.Arbitrary<ApparelMeasurements> {
  const sleeved = CATEGORY_INFO[category].hasSleeves;
  return fc
    .record({
      chest: between(0.5, 60),
      body: fc.double({ min: 0, max: 1, noNaN: true }),
      neck: between(0, 1),
      shoulder: between(0, 1),
      front: between(0, 1),
      back: between(0, 1),
      sleeve: sleeved ? between(0, 40) : fc.constant(0),
    })
    .map(({ chest, body, neck, shoulder, front, back, sleeve }) => {
      const bodyLength = chest / 2 + body * (60 - chest / 2);
      const neckWidth = neck * Math.min(20, chest);
      const shoulderWidth = neckWidth + shoulder * (60 - neckWidth);
      return {
        chestWidth: chest,
        bodyLength,
        shoulderWidth,
        sleeveLength: sleeve,
        neckWidth,
        frontNeckDrop: front * Math.min(15, bodyLength),
        backNeckDrop: back * Math.min(10, bodyLength),
      };
    });
}

/** Tote measurements anywhere inside the schema's bounds. */
export const toteMeasurements: fc.Arbitrary<ToteMeasurements> = fc
  .record({
    width: between(0, 40),
    height: between(0, 40),
    handleLength: between(0, 60),
    handle: between(0, 1),
    gusset: fc.oneof(fc.constant(0), between(0, 1)),
  })
  .map(({ width, height, handleLength, handle, gusset }) => ({
    width,
    height,
    handleLength,
    handleWidth: handle * Math.min(4, width / 4),
    gusset: gusset * Math.min(15, 2 * height),
  }));

/** A catalog row with every measurement nudged by up to ±15 %: realistic, but not only the demo blanks. */
const nudgedCatalogRow = fc
  .record({
    blank: fc.constantFrom(...CATALOG),
    pick: fc.nat(),
    factors: fc.array(fc.double({ min: 0.85, max: 1.15, noNaN: true }), { minLength: 7, maxLength: 7 }),
  })
  .map(({ blank, pick, factors }) => {
    const row = blank.sizes[pick % blank.sizes.length]!;
    const entries = Object.entries(row.measurements).map(([k, v], i) => [k, (v as number) * factors[i]!]);
    return {
      category: blank.category,
      group: row.group,
      size: row.size,
      measurements: Object.fromEntries(entries) as unknown as GarmentMeasurements,
    };
  });

export type GeneratedGarment = {
  category: GarmentCategory;
  group: SizeGroup;
  size: string;
  measurements: GarmentMeasurements;
};

function isValidRow(g: GeneratedGarment): boolean {
  return sizeRowSchemaFor(g.category).safeParse({
    size: g.size,
    group: g.group,
    measurements: g.measurements,
  }).success;
}

/** One size of a garment of the given category, anywhere in the schema's range. */
export function garmentOf(category: GarmentCategory): fc.Arbitrary<GeneratedGarment> {
  return fc
    .record({
      group: fc.constantFrom(...SIZE_GROUPS),
      measurements: CATEGORY_INFO[category].isTote
        ? (toteMeasurements as fc.Arbitrary<GarmentMeasurements>)
        : apparelMeasurements(category),
    })
    .map(({ group, measurements }): GeneratedGarment => ({ category, group, size: "G", measurements }))
    .filter(isValidRow);
}

/** One size of a garment: anything the size chart schema accepts, half from the whole range, half near the catalog. */
export const garment: fc.Arbitrary<GeneratedGarment> = fc.oneof(
  fc.constantFrom(...GARMENT_CATEGORIES).chain(garmentOf),
  nudgedCatalogRow.filter(isValidRow),
);

/** Any finite number, with extra weight on the ranges a garment lives in. */
export const finite = fc.oneof(
  fc.double({ min: -100, max: 100, noNaN: true, noDefaultInfinity: true }),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer({ min: -200, max: 200 }).map((n) => n / 8),
);

/** A placement with any finite numbers in it: valid or not, on any location. */
export function placementOn(
  location: fc.Arbitrary<PrintLocation> = fc.constantFrom(...PRINT_LOCATIONS),
): fc.Arbitrary<Placement> {
  return fc.record({
    id: fc.constant("p"),
    location,
    artworkId: fc.constant(null),
    widthIn: finite,
    heightIn: finite,
    offsetFromCenterIn: finite,
    belowCollarIn: finite,
    rotationDeg: finite,
  });
}

/**
 * A placement the schema accepts (each side above 0 and at most 60 in, turned -180° to 180°) at
 * any finite position, so it goes past validation to the fit checks.
 */
export function sizedPlacementOn(
  location: fc.Arbitrary<PrintLocation> = fc.constantFrom(...PRINT_LOCATIONS),
): fc.Arbitrary<Placement> {
  const side = fc.oneof(
    fc.double({ min: 0.01, max: 60, noNaN: true }),
    fc.integer({ min: 1, max: 160 }).map((n) => n / 8),
  );
  return fc.record({
    id: fc.constant("p"),
    location,
    artworkId: fc.constant(null),
    widthIn: side,
    heightIn: side,
    offsetFromCenterIn: finite,
    belowCollarIn: finite,
    rotationDeg: fc.oneof(fc.constant(0), fc.double({ min: -180, max: 180, noNaN: true })),
  });
}

/** A garment and a placement on one of its own locations. */
export const garmentWithOfferedLocation = garment.chain((g) =>
  fc.constantFrom(...locationsFor(g.category)).map((location) => ({ g, location })),
);

/** Paths to every number in a value that is NaN or ±Infinity (empty when all are finite). */
export function nonFinitePaths(value: unknown, path = "$", out: string[] = []): string[] {
  if (typeof value === "number") {
    if (!Number.isFinite(value)) out.push(`${path}=${value}`);
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => nonFinitePaths(v, `${path}[${i}]`, out));
  } else if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value))
      if (typeof v !== "function") nonFinitePaths(v, `${path}.${k}`, out);
  }
  return out;
}
