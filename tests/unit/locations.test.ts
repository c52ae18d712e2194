import { describe, expect, it } from "vitest";
import { CATALOG, findBlank, findSizeRow } from "@/lib/garments/catalog";
import { LOCATION_LABELS, locationSpec, locationsFor, type PrintLocation } from "@/lib/garments/locations";
import { buildSilhouette, minEdgeBetween, pointInPolygon } from "@/lib/garments/silhouette";
import {
  GARMENT_CATEGORIES,
  isApparelMeasurements,
  type ApparelMeasurements,
  type GarmentCategory,
  type GarmentMeasurements,
  type Point,
  type SizeGroup,
} from "@/lib/garments/types";

// Limits the location specs must keep, written here rather than imported from the code they test.
// Trade values (common practice, no published source):
/** An adult tee's full front: at most about 11.25 in across and 14 in down. */
const ADULT_FULL_FRONT_MAX = { widthIn: 11.25, heightIn: 14 };
/** Keep art this far inside the side seam and armhole seam on adults. */
const SIDE_SEAM_CLEARANCE_IN = 2;
/** Keep hoodie front art this far above the pouch pocket. */
const POCKET_CLEARANCE_IN = 1;
// From memory, approximate:
/** Side-seam clearance per size group: adults keep the full 2 in, smaller garments less. */
const SIDE_SEAM_CLEARANCE_BY_GROUP: Readonly<Record<SizeGroup, number>> = {
  adult: SIDE_SEAM_CLEARANCE_IN,
  youth: 1.5,
  toddler: 1.25,
  infant: 1,
};
/** Youth left or right chest: at most about 3.5 in wide. */
const YOUTH_CHEST_MAX_WIDTH_IN = 3.5;
/** Tote face margins: 1.5 in at the sides, 2 in below the top edge, 1.5 in above the bottom or gusset fold. */
const TOTE_SIDE_MARGIN_IN = 1.5;
const TOTE_TOP_MARGIN_IN = 2;
const TOTE_BOTTOM_MARGIN_IN = 1.5;
// The product's own rule (Chalkline default, no published source): adult full fronts grow past a
// 24.5 in chest (about a unisex XL), up to a large-platen ceiling of 14 × 16 in.
const PLUS_GROWTH_START_CHEST_IN = 24.5;
const PLUS_CEILING = { width: 14, height: 16 };

type Case = [string, GarmentCategory, string, SizeGroup, GarmentMeasurements, PrintLocation];

const ALL: Case[] = CATALOG.flatMap((blank) =>
  blank.sizes.flatMap((row) =>
    locationsFor(blank.category).map((location): Case => [
      blank.id,
      blank.category,
      row.size,
      row.group,
      row.measurements,
      location,
    ]),
  ),
);

function row(blankId: string, size: string) {
  const r = findSizeRow(findBlank(blankId)!, size)!;
  return { group: r.group, measurements: r.measurements as ApparelMeasurements };
}

function spec(blankId: string, size: string, location: PrintLocation) {
  const blank = findBlank(blankId)!;
  const r = row(blankId, size);
  return locationSpec({ location, category: blank.category, ...r });
}

function rotatedCorners(rect: { x: number; y: number; width: number; height: number }, deg: number): Point[] {
  const c = { x: rect.x + rect.width / 2, y: rect.y + rect.height / 2 };
  const a = (deg * Math.PI) / 180;
  return [
    [-1, -1],
    [1, -1],
    [1, 1],
    [-1, 1],
  ].map(([sx, sy]) => {
    const x = (sx! * rect.width) / 2;
    const y = (sy! * rect.height) / 2;
    return { x: c.x + x * Math.cos(a) - y * Math.sin(a), y: c.y + x * Math.sin(a) + y * Math.cos(a) };
  });
}

describe("locationsFor", () => {
  it.each(GARMENT_CATEGORIES.map((c) => [c]))(
    "%s offers at least one location, each with a label",
    (category) => {
      const list = locationsFor(category);
      expect(list.length).toBeGreaterThan(0);
      for (const location of list) expect(LOCATION_LABELS[location]).toBeTruthy();
    },
  );

  it.each([
    ["tote", ["tote-front"]],
    ["hoodie", ["pouch", "full-front", "left-sleeve"]],
    ["tank", ["full-front", "back-neck"]],
  ] as const)("%s includes %o", (category, expected) => {
    for (const location of expected) expect(locationsFor(category)).toContain(location);
  });

  it("keeps sleeve prints off a tank and pouch prints off a tee", () => {
    expect(locationsFor("tank")).not.toContain("left-sleeve");
    expect(locationsFor("unisex-tee")).not.toContain("pouch");
  });

  it("refuses a location the garment does not offer", () => {
    const m = row("everyday-crew-tee", "M");
    expect(() => locationSpec({ location: "pouch", category: "unisex-tee", ...m })).toThrow(RangeError);
  });
});

describe("every catalog size and location", () => {
  it.each(ALL)(
    "%s %s %s (%s) %s: finite, positive limits with the typical size inside them",
    (_id, category, _size, group, measurements, location) => {
      const s = locationSpec({ location, category, group, measurements });
      for (const value of [
        s.maxWidth,
        s.maxHeight,
        s.typicalWidth,
        s.typicalHeight,
        s.defaultBelowCollar,
        s.defaultOffsetFromCenter,
        s.axisRotationDeg,
        s.printArea.x,
        s.printArea.y,
        s.printArea.width,
        s.printArea.height,
      ]) {
        expect(Number.isFinite(value)).toBe(true);
      }
      expect(s.maxWidth).toBeGreaterThan(0);
      expect(s.maxHeight).toBeGreaterThan(0);
      expect(s.typicalWidth).toBeLessThanOrEqual(s.maxWidth);
      expect(s.typicalHeight).toBeLessThanOrEqual(s.maxHeight);
      expect(s.printArea.width).toBeCloseTo(s.maxWidth, 10);
      expect(s.printArea.height).toBeCloseTo(s.maxHeight, 10);
    },
  );

  const bodyCases = ALL.filter(
    ([, category, , , , location]) =>
      category !== "tote" && !location.includes("sleeve") && location !== "pouch",
  );

  it.each(bodyCases)(
    "%s %s %s (%s) %s: print area keeps the side-seam clearance at every height",
    (_id, category, _size, group, measurements, location) => {
      // Common practice, no published source: keep SIDE_SEAM_CLEARANCE_IN (2 in) from the body edge on adults.
      const s = locationSpec({ location, category, group, measurements });
      const sil = buildSilhouette(category, measurements, s.side);
      const narrowest = minEdgeBetween(sil.bodyEdge, s.printArea.y, s.printArea.y + s.printArea.height)!;
      const outerEdge = Math.max(Math.abs(s.printArea.x), Math.abs(s.printArea.x + s.printArea.width));
      expect(narrowest - outerEdge).toBeGreaterThanOrEqual(SIDE_SEAM_CLEARANCE_BY_GROUP[group] - 1e-9);
      expect(s.printArea.y + s.printArea.height).toBeLessThan(sil.lowerBoundaryY);
    },
  );

  const areaCases = ALL.filter(([, , , , , location]) => location.includes("sleeve") || location === "pouch");

  it.each(areaCases)(
    "%s %s %s (%s) %s: print area lies inside its sleeve or pocket",
    (_id, category, _size, group, measurements, location) => {
      const s = locationSpec({ location, category, group, measurements });
      const sil = buildSilhouette(category, measurements, "front");
      const container =
        location === "pouch" ? sil.pocket! : sil.sleeves![location === "left-sleeve" ? 1 : 0]!;
      for (const corner of rotatedCorners(s.printArea, s.axisRotationDeg)) {
        expect(pointInPolygon(corner, container)).toBe(true);
      }
    },
  );
});

describe("full front (common practice, no published source)", () => {
  it("adult M unisex tee: about 11 x 11 typical, 11.25 x 14 at most, top 3 in below the collar", () => {
    const s = spec("everyday-crew-tee", "M", "full-front");
    expect(s.typicalWidth).toBeCloseTo(11, 10);
    expect(s.typicalHeight).toBeCloseTo(11, 10);
    expect(s.maxWidth).toBeCloseTo(11.25, 10);
    expect(s.maxHeight).toBeCloseTo(14, 10);
    expect(s.defaultBelowCollar).toBeCloseTo(3, 10);
    expect(s.defaultOffsetFromCenter).toBe(0);
    expect(s.anchor).toBe("center");
    expect(s.side).toBe("front");
    expect(s.printArea).toEqual({ x: -5.625, y: 3, width: 11.25, height: 14 });
  });

  const adultRows = CATALOG.filter((b) => b.category !== "tote").flatMap((b) =>
    b.sizes
      .filter((r) => r.group === "adult")
      .map((r) => [b.id, r.size, b.category, r.measurements as ApparelMeasurements] as const),
  );

  it.each(adultRows)(
    "%s %s: adult full front starts 3 to 3.5 in below the collar",
    (_id, _size, category, measurements) => {
      const s = locationSpec({ location: "full-front", category, group: "adult", measurements });
      expect(s.defaultBelowCollar).toBeGreaterThanOrEqual(3);
      expect(s.defaultBelowCollar).toBeLessThanOrEqual(3.5);
    },
  );

  it.each(adultRows.filter(([, , , m]) => m.chestWidth <= PLUS_GROWTH_START_CHEST_IN))(
    "%s %s: never over 11.25 x 14 in below plus sizes",
    (_id, _size, category, measurements) => {
      const s = locationSpec({ location: "full-front", category, group: "adult", measurements });
      expect(s.maxWidth).toBeLessThanOrEqual(ADULT_FULL_FRONT_MAX.widthIn);
      expect(s.maxHeight).toBeLessThanOrEqual(ADULT_FULL_FRONT_MAX.heightIn);
    },
  );

  it("3XL gets more room than S, and never past the large-platen ceiling", () => {
    const small = spec("everyday-crew-tee", "S", "full-front");
    const big = spec("everyday-crew-tee", "3XL", "full-front");
    expect(big.maxWidth).toBeGreaterThan(small.maxWidth);
    expect(big.maxHeight).toBeGreaterThan(small.maxHeight);
    expect(big.maxWidth).toBeLessThanOrEqual(PLUS_CEILING.width);
    expect(big.maxHeight).toBeLessThanOrEqual(PLUS_CEILING.height);
  });

  it("recomputes limits from the measurements, not the size label", () => {
    const m = row("everyday-crew-tee", "M");
    const base = locationSpec({ location: "full-front", category: "unisex-tee", ...m });
    const wider = locationSpec({
      location: "full-front",
      category: "unisex-tee",
      group: "adult",
      measurements: { ...m.measurements, chestWidth: 28, shoulderWidth: 24 },
    });
    const narrower = locationSpec({
      location: "full-front",
      category: "unisex-tee",
      group: "adult",
      measurements: { ...m.measurements, chestWidth: 16, shoulderWidth: 15 },
    });
    expect(wider.maxWidth).toBeGreaterThan(base.maxWidth);
    expect(narrower.maxWidth).toBeLessThan(base.maxWidth);
  });

  it.each([
    // Youth about 9 to 10 in wide at most; toddler about 6 to 7; infant smaller still (from memory, approximate).
    ["schoolyard-tee", 10, 8],
    ["little-steps-tee", 7, 5.5],
    ["cradle-bodysuit", 5, 4],
  ])("%s: full front at most %d in wide, at least %d in on every size", (blankId, most, least) => {
    for (const r of findBlank(blankId)!.sizes) {
      const s = spec(blankId, r.size, "full-front");
      expect(s.maxWidth).toBeLessThanOrEqual(most);
      expect(s.maxWidth).toBeGreaterThanOrEqual(least);
    }
  });

  it.each(findBlank("campfire-pullover-hoodie")!.sizes.map((r) => [r.size]))(
    "hoodie %s: full front ends above the pouch pocket with clearance",
    (size) => {
      const r = row("campfire-pullover-hoodie", size);
      const s = locationSpec({ location: "full-front", category: "hoodie", ...r });
      const sil = buildSilhouette("hoodie", r.measurements, "front");
      expect(s.printArea.y + s.maxHeight).toBeLessThanOrEqual(sil.pocketTopY! - POCKET_CLEARANCE_IN + 1e-9);
    },
  );

  it("hoodie M full front is shorter than the same-size tee's because of the pocket", () => {
    expect(spec("campfire-pullover-hoodie", "M", "full-front").maxHeight).toBeLessThan(
      spec("everyday-crew-tee", "M", "full-front").maxHeight,
    );
  });
});

describe("other locations (common practice or from memory, as noted)", () => {
  it("left chest on an adult M: 3.5 to 4.5 wide, centered 4 in toward the wearer's left, top 3 below the collar", () => {
    const s = spec("everyday-crew-tee", "M", "left-chest");
    expect(s.typicalWidth).toBeGreaterThanOrEqual(3.5);
    expect(s.typicalWidth).toBeLessThanOrEqual(4.5);
    expect(s.maxWidth).toBeLessThanOrEqual(4.5);
    // Front view: the wearer's left is the viewer's right.
    expect(s.defaultOffsetFromCenter).toBeCloseTo(4, 10);
    expect(s.defaultBelowCollar).toBeCloseTo(3, 10);
    expect(spec("everyday-crew-tee", "M", "right-chest").defaultOffsetFromCenter).toBeCloseTo(-4, 10);
  });

  it("left chest on youth is smaller and closer to center than on adults", () => {
    const adult = spec("everyday-crew-tee", "M", "left-chest");
    const youth = spec("schoolyard-tee", "YM", "left-chest");
    expect(youth.maxWidth).toBeLessThan(adult.maxWidth);
    expect(youth.typicalWidth).toBeLessThan(adult.typicalWidth);
    expect(youth.defaultOffsetFromCenter).toBeLessThan(adult.defaultOffsetFromCenter);
    expect(youth.maxWidth).toBeLessThanOrEqual(YOUTH_CHEST_MAX_WIDTH_IN);
  });

  it.each(
    CATALOG.filter((b) => locationsFor(b.category).includes("full-back")).flatMap((b) =>
      b.sizes.filter((r) => r.group === "adult").map((r) => [b.id, r.size]),
    ),
  )("%s %s: full back starts 2 to 3 in below the back collar", (blankId, size) => {
    const s = spec(blankId, size, "full-back");
    expect(s.side).toBe("back");
    expect(s.defaultBelowCollar).toBeGreaterThanOrEqual(2);
    expect(s.defaultBelowCollar).toBeLessThanOrEqual(3);
  });

  it("back neck is a small area just below the back collar", () => {
    const s = spec("everyday-crew-tee", "M", "back-neck");
    expect(s.side).toBe("back");
    expect(s.maxWidth).toBeLessThanOrEqual(3);
    expect(s.defaultBelowCollar).toBeGreaterThan(0);
    expect(s.defaultBelowCollar).toBeLessThanOrEqual(1);
  });

  it("short-sleeve prints are at most about 3.5 in wide (from memory) and drawn on the front view", () => {
    for (const r of findBlank("everyday-crew-tee")!.sizes) {
      const left = spec("everyday-crew-tee", r.size, "left-sleeve");
      const right = spec("everyday-crew-tee", r.size, "right-sleeve");
      expect(left.maxWidth).toBeLessThanOrEqual(3.5);
      expect(left.side).toBe("front");
      // The wearer's left sleeve is on the viewer's right of the front view.
      expect(left.defaultOffsetFromCenter).toBeGreaterThan(0);
      expect(right.defaultOffsetFromCenter).toBeCloseTo(-left.defaultOffsetFromCenter, 10);
      expect(right.axisRotationDeg).toBeCloseTo(-left.axisRotationDeg, 10);
      expect(left.defaultBelowCollar).toBeCloseTo(right.defaultBelowCollar, 10);
    }
  });

  it("long sleeves allow a longer print than short sleeves", () => {
    expect(spec("allday-long-sleeve", "M", "left-sleeve").maxHeight).toBeGreaterThan(
      spec("everyday-crew-tee", "M", "left-sleeve").maxHeight,
    );
  });

  it.each(CATALOG.filter((b) => b.category === "tote").map((b) => [b.id, b.sizes[0]!.measurements]))(
    "%s: tote front is the bag minus its margins (from memory, approximate)",
    (_blankId, m) => {
      const s = locationSpec({ location: "tote-front", category: "tote", group: "adult", measurements: m });
      if (isApparelMeasurements(m)) throw new Error("expected a tote");
      expect(s.maxWidth).toBeCloseTo(m.width - 2 * TOTE_SIDE_MARGIN_IN, 10);
      expect(s.maxHeight).toBeCloseTo(
        m.height - m.gusset / 2 - TOTE_TOP_MARGIN_IN - TOTE_BOTTOM_MARGIN_IN,
        10,
      );
      expect(s.printArea.y).toBeCloseTo(TOTE_TOP_MARGIN_IN, 10);
      expect(s.printArea.x).toBeCloseTo(-s.maxWidth / 2, 10);
    },
  );

  it.each(
    CATALOG.filter((b) => b.category !== "tote").map((b) => [b.id, b.sizes[0]!.group, b.category] as const),
  )(
    "%s (%s): side-seam clearance is 2 in on adults and smaller on small garments (from memory, approximate)",
    (blankId, group, category) => {
      const r = findBlank(blankId)!.sizes[0]!;
      const s = locationSpec({ location: "full-front", category, group, measurements: r.measurements });
      expect(s.sideSeamClearance).toBe(SIDE_SEAM_CLEARANCE_BY_GROUP[group]);
    },
  );

  it("side-seam clearances shrink from adult to infant, and the adult full front is capped at 11.25 in", () => {
    expect(SIDE_SEAM_CLEARANCE_BY_GROUP.adult).toBe(2);
    expect(SIDE_SEAM_CLEARANCE_BY_GROUP.infant).toBeLessThan(SIDE_SEAM_CLEARANCE_BY_GROUP.youth);
    // A wide adult body below the plus-size growth still stops at the cap.
    const m = row("everyday-crew-tee", "M");
    const s = locationSpec({
      location: "full-front",
      category: "unisex-tee",
      group: "adult",
      measurements: { ...m.measurements, chestWidth: PLUS_GROWTH_START_CHEST_IN },
    });
    expect(s.maxWidth).toBeCloseTo(ADULT_FULL_FRONT_MAX.widthIn, 10);
  });
});
