import { describe, expect, it } from "vitest";
import { findBlank, findSizeRow } from "@/lib/garments/catalog";
import { locationSpec, type PrintLocation } from "@/lib/garments/locations";
import { signedArea } from "@/lib/garments/silhouette";
import type { ApparelMeasurements } from "@/lib/garments/types";
import { defaultPlacement, fitInBox, placementBounds, placementCenter, placementCorners, type Placement } from "@/lib/placement/model";
import { placementSchema } from "@/lib/placement/schema";

const BASE: Placement = {
  id: "p1",
  location: "full-front",
  artworkId: null,
  widthIn: 10,
  heightIn: 6,
  offsetFromCenterIn: 0,
  belowCollarIn: 3,
  rotationDeg: 0,
};

function teeSpec(location: PrintLocation, blankId = "everyday-crew-tee", size = "M") {
  const blank = findBlank(blankId)!;
  const row = findSizeRow(blank, size)!;
  return locationSpec({
    location,
    category: blank.category,
    group: row.group,
    measurements: row.measurements as ApparelMeasurements,
  });
}

describe("placementSchema", () => {
  it("accepts a plain placement and one with artwork", () => {
    expect(placementSchema.safeParse(BASE).success).toBe(true);
    expect(placementSchema.safeParse({ ...BASE, artworkId: "art-7", rotationDeg: -180 }).success).toBe(true);
  });

  it.each([
    [{ widthIn: 0 }, "Width must be more than 0 in."],
    [{ heightIn: -2 }, "Height must be more than 0 in."],
    [{ widthIn: 80 }, "Width can't be more than 60 in."],
    [{ rotationDeg: 181 }, "Rotation must be between -180° and 180°."],
    [{ location: "collar" }, "Choose a print location."],
    [{ id: "" }, "A placement needs an id."],
    [{ artworkId: "" }, "Artwork id can't be empty; use null for no artwork."],
    [{ offsetFromCenterIn: Number.NaN }, "Offset from center must be a number of inches."],
  ])("rejects %o", (patch, message) => {
    const result = placementSchema.safeParse({ ...BASE, ...patch });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.message).toBe(message);
  });
});

describe("placement geometry", () => {
  it("centers the art on its offset and hangs it from its top edge", () => {
    expect(placementCenter(BASE)).toEqual({ x: 0, y: 6 });
    expect(placementCenter({ ...BASE, offsetFromCenterIn: 4 })).toEqual({ x: 4, y: 6 });
  });

  it.each([
    [0, 10, 6],
    [90, 6, 10],
    [-90, 6, 10],
    [180, 10, 6],
    [45, 16 / Math.SQRT2, 16 / Math.SQRT2],
    [30, 10 * Math.cos(Math.PI / 6) + 6 * 0.5, 10 * 0.5 + 6 * Math.cos(Math.PI / 6)],
  ])("bounds at %d° are %d x %d and stay centered", (rotationDeg, width, height) => {
    const b = placementBounds({ ...BASE, rotationDeg });
    expect(b.width).toBeCloseTo(width, 10);
    expect(b.height).toBeCloseTo(height, 10);
    expect(b.x + b.width / 2).toBeCloseTo(0, 10);
    expect(b.y + b.height / 2).toBeCloseTo(6, 10);
  });

  it.each([0, 17, 90, -135])("corners at %d° run clockwise and fit the bounds", (rotationDeg) => {
    const p = { ...BASE, rotationDeg };
    const corners = placementCorners(p);
    const b = placementBounds(p);
    expect(signedArea(corners)).toBeCloseTo(p.widthIn * p.heightIn, 10);
    for (const c of corners) {
      expect(c.x).toBeGreaterThanOrEqual(b.x - 1e-9);
      expect(c.x).toBeLessThanOrEqual(b.x + b.width + 1e-9);
      expect(c.y).toBeGreaterThanOrEqual(b.y - 1e-9);
      expect(c.y).toBeLessThanOrEqual(b.y + b.height + 1e-9);
    }
  });

  it("turns clockwise on screen for positive degrees", () => {
    // Turned 90° clockwise, the art's top-left corner swings round to the upper right.
    const [topLeft] = placementCorners({ ...BASE, rotationDeg: 90 });
    expect(topLeft!.x).toBeCloseTo(3, 10);
    expect(topLeft!.y).toBeCloseTo(1, 10);
  });
});

describe("fitInBox and defaultPlacement", () => {
  it.each([
    [1, 11, 11],
    [2, 11, 5.5],
    [0.5, 5.5, 11],
    [11 / 14, 11 * (11 / 14), 11],
  ])("aspect %d fits an 11 x 11 box as %d x %d", (aspect, width, height) => {
    const size = fitInBox(aspect, 11, 11);
    expect(size.width).toBeCloseTo(width, 10);
    expect(size.height).toBeCloseTo(height, 10);
  });

  it.each([0, -1, Number.NaN])("rejects aspect %d", (aspect) => {
    expect(() => fitInBox(aspect, 11, 11)).toThrow(RangeError);
  });

  it("places square art on an adult M full front at 11 x 11, 3 in below the collar, centered", () => {
    const p = defaultPlacement(teeSpec("full-front"), 1, "front-1");
    expect(p).toEqual({
      id: "front-1",
      location: "full-front",
      artworkId: null,
      widthIn: 11,
      heightIn: 11,
      offsetFromCenterIn: 0,
      belowCollarIn: 3,
      rotationDeg: 0,
    });
    expect(placementSchema.safeParse(p).success).toBe(true);
  });

  it("keeps a top-aligned location's top edge for wide art", () => {
    const p = defaultPlacement(teeSpec("full-front"), 2);
    expect(p.belowCollarIn).toBeCloseTo(3, 10);
    expect(p.heightIn).toBeCloseTo(5.5, 10);
    expect(p.id).toBe("full-front");
  });

  it("keeps a middle-aligned location's center for wide art", () => {
    const blank = findBlank("market-canvas-tote")!;
    const spec = locationSpec({
      location: "tote-front",
      category: "tote",
      group: "adult",
      measurements: blank.sizes[0]!.measurements,
    });
    const square = defaultPlacement(spec, 1);
    const wide = defaultPlacement(spec, 2);
    expect(placementCenter(wide).y).toBeCloseTo(placementCenter(square).y, 10);
    expect(placementCenter(square).y).toBeCloseTo(spec.printArea.y + spec.printArea.height / 2, 10);
  });

  it("turns sleeve art to the sleeve's axis", () => {
    const spec = teeSpec("left-sleeve");
    const p = defaultPlacement(spec, 1);
    expect(p.rotationDeg).toBeCloseTo(spec.axisRotationDeg, 10);
    expect(p.rotationDeg).not.toBe(0);
    expect(p.offsetFromCenterIn).toBeCloseTo(spec.defaultOffsetFromCenter, 10);
  });
});
