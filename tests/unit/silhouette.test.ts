import { describe, expect, it } from "vitest";
import { CATALOG } from "@/lib/garments/catalog";
import {
  CHEST_BELOW_UNDERARM_IN,
  HANDLE_STITCHED_END_IN,
  buildSilhouette,
  pointInPolygon,
  polygonSpanAtY,
  signedArea,
  widthAt,
} from "@/lib/garments/silhouette";
import {
  CATEGORY_INFO,
  isApparelMeasurements,
  isToteMeasurements,
  type ApparelMeasurements,
  type GarmentCategory,
  type Point,
  type ToteMeasurements,
} from "@/lib/garments/types";

type ApparelCase = [string, GarmentCategory, string, ApparelMeasurements];

const APPAREL: ApparelCase[] = CATALOG.flatMap((blank) =>
  blank.sizes.flatMap((row): ApparelCase[] =>
    isApparelMeasurements(row.measurements) ? [[blank.id, blank.category, row.size, row.measurements]] : [],
  ),
);

const TOTES: [string, ToteMeasurements][] = CATALOG.flatMap((blank) =>
  blank.sizes.flatMap((row): [string, ToteMeasurements][] =>
    isToteMeasurements(row.measurements) ? [[blank.id, row.measurements]] : [],
  ),
);

const SIDES = ["front", "back"] as const;

function allPoints(s: ReturnType<typeof buildSilhouette>): Point[] {
  return [
    ...s.outline,
    ...s.neckline,
    ...s.bodyEdge,
    ...(s.hood ?? []),
    ...(s.pocket ?? []),
    ...(s.sleeves ?? []).flat(),
    ...(s.handles ?? []).flat(),
  ];
}

function polylineLength(points: readonly Point[]): number {
  let sum = 0;
  for (let i = 1; i < points.length; i++) {
    sum += Math.hypot(points[i]!.x - points[i - 1]!.x, points[i]!.y - points[i - 1]!.y);
  }
  return sum;
}

describe.each(SIDES)("apparel silhouettes, %s view", (side) => {
  it.each(APPAREL)("%s %s %s: body width at the chest line equals chest width", (_id, category, _size, m) => {
    // Definition of the measurement chart: chest width is the flat width 1 in below the underarm.
    const s = buildSilhouette(category, m, side);
    expect(s.chestLineY - s.underarmY).toBeCloseTo(CHEST_BELOW_UNDERARM_IN, 10);
    expect(widthAt(s, s.chestLineY)).toBeCloseTo(m.chestWidth, 6);
    // The outline has a vertex on each side seam at the chest line.
    for (const x of [-m.chestWidth / 2, m.chestWidth / 2]) {
      expect(s.outline.some((p) => Math.abs(p.x - x) < 1e-9 && Math.abs(p.y - s.chestLineY) < 1e-9)).toBe(
        true,
      );
    }
  });

  it.each(APPAREL)("%s %s %s: HPS to hem equals body length", (_id, category, _size, m) => {
    // Definition of the measurement chart: body length is measured from the HPS straight down to the hem.
    const s = buildSilhouette(category, m, side);
    expect(s.hemY - s.hps.right.y).toBeCloseTo(m.bodyLength, 10);
    expect(s.hemY - s.hps.left.y).toBeCloseTo(m.bodyLength, 10);
    const lowest = Math.max(...s.outline.map((p) => p.y));
    expect(lowest).toBeCloseTo(s.hemY, 10);
  });

  it.each(APPAREL)("%s %s %s: outline is mirror-symmetric about x = 0", (_id, category, _size, m) => {
    // Common practice, no published source: a blank is cut as mirrored halves.
    const s = buildSilhouette(category, m, side);
    for (const p of s.outline) {
      const twin = s.outline.find((q) => Math.abs(q.x + p.x) < 1e-9 && Math.abs(q.y - p.y) < 1e-9);
      expect(twin, `no mirror point for (${p.x}, ${p.y})`).toBeDefined();
    }
  });

  it.each(APPAREL)("%s %s %s: neck opening and HPS sit where the chart says", (_id, category, _size, m) => {
    // Definition of the coordinate system and of the chart's neck drop and neck width.
    const s = buildSilhouette(category, m, side);
    const drop = side === "front" ? m.frontNeckDrop : m.backNeckDrop;
    expect(s.hps.left.y).toBeCloseTo(-drop, 10);
    expect(s.hps.right.y).toBeCloseTo(-drop, 10);
    expect(s.hps.right.x - s.hps.left.x).toBeCloseTo(m.neckWidth, 10);
    const bottom = s.neckline.reduce((a, b) => (b.y > a.y ? b : a));
    expect(bottom.y).toBeCloseTo(0, 10);
    expect(bottom.x).toBeCloseTo(0, 10);
    expect(s.neckline[0]).toEqual(s.hps.left);
    expect(s.neckline[s.neckline.length - 1]).toEqual(s.hps.right);
  });

  it.each(APPAREL)(
    "%s %s %s: shoulder points sit half the shoulder width from center",
    (_id, category, _size, m) => {
      // Definition of the chart's shoulder width; the shoulder slopes down from the HPS (common practice).
      const s = buildSilhouette(category, m, side);
      expect(s.shoulderPoints.right.x - s.shoulderPoints.left.x).toBeCloseTo(m.shoulderWidth, 10);
      expect(s.shoulderPoints.right.y).toBeGreaterThan(s.hps.right.y);
      expect(s.underarmY).toBeGreaterThan(s.shoulderPoints.right.y);
    },
  );

  it.each(APPAREL)(
    "%s %s %s: every coordinate is finite and the outline runs clockwise",
    (_id, category, _size, m) => {
      const s = buildSilhouette(category, m, side);
      for (const p of allPoints(s)) {
        expect(Number.isFinite(p.x) && Number.isFinite(p.y)).toBe(true);
      }
      expect(signedArea(s.outline)).toBeGreaterThan(0);
      for (const sleeve of s.sleeves ?? []) expect(signedArea(sleeve)).toBeGreaterThan(0);
      if (s.hood) expect(signedArea(s.hood)).toBeGreaterThan(0);
      if (s.pocket) expect(signedArea(s.pocket)).toBeGreaterThan(0);
      expect(s.outline.length).toBeGreaterThan(40);
    },
  );

  it.each(APPAREL)(
    "%s %s %s: bodyEdgeAt is null off the body and symmetric on it",
    (_id, category, _size, m) => {
      const s = buildSilhouette(category, m, side);
      expect(s.bodyEdgeAt(s.hps.right.y - 0.01)).toBeNull();
      expect(s.bodyEdgeAt(s.hemY + 0.01)).toBeNull();
      for (let y = s.hps.right.y; y <= s.hemY; y += 0.5) {
        const edge = s.bodyEdgeAt(y)!;
        expect(edge.left).toBeCloseTo(-edge.right, 12);
        expect(edge.right).toBeGreaterThan(0);
      }
    },
  );
});

describe("garment-specific shapes", () => {
  const sleeved = APPAREL.filter(([, category]) => CATEGORY_INFO[category].hasSleeves && category !== "tank");

  it.each(sleeved)(
    "%s %s %s: across-front is a little narrower than the shoulders",
    (_id, category, _size, m) => {
      // Common practice, no published source: the front armhole scoops in below the shoulder point.
      const s = buildSilhouette(category, m, "front");
      const midArmhole = (s.shoulderPoints.right.y + s.underarmY) / 2;
      const across = widthAt(s, midArmhole)!;
      expect(across).toBeLessThan(m.shoulderWidth);
      expect(across).toBeGreaterThan(m.shoulderWidth - 3);
      // The back is cut fuller across than the front.
      expect(
        widthAt(buildSilhouette(category, m, "back"), midArmhole + m.frontNeckDrop - m.backNeckDrop)!,
      ).toBeGreaterThan(across);
    },
  );

  it.each(sleeved)(
    "%s %s %s: two sleeves, each as long as the chart's sleeve length",
    (_id, category, _size, m) => {
      // Definition of the chart's sleeve length: shoulder point to cuff along the top of the sleeve.
      const s = buildSilhouette(category, m, "front");
      expect(s.sleeves).toHaveLength(2);
      for (const sleeve of s.sleeves!) {
        const origin = sleeve.find((p) => Math.abs(Math.abs(p.x) - m.shoulderWidth / 2) < 1e-9)!;
        const cuff = sleeve.reduce((a, b) => (Math.abs(b.x) > Math.abs(a.x) ? b : a));
        const topLength = Math.max(...sleeve.map((p) => Math.hypot(p.x - origin.x, p.y - origin.y)));
        expect(topLength).toBeGreaterThan(m.sleeveLength - 1e-9);
        expect(Math.abs(cuff.x)).toBeGreaterThan(m.chestWidth / 2);
      }
      for (const frame of s.sleeveFrames!) expect(frame.length).toBe(m.sleeveLength);
    },
  );

  it.each(APPAREL.filter(([, c]) => CATEGORY_INFO[c].longSleeves))(
    "%s %s %s: long sleeves hang below the chest line",
    (_id, category, _size, m) => {
      const s = buildSilhouette(category, m, "front");
      const lowest = Math.max(...s.sleeves![1]!.map((p) => p.y));
      expect(lowest).toBeGreaterThan(s.chestLineY);
    },
  );

  it.each(APPAREL.filter(([, c]) => c === "tank"))(
    "%s %s %s: tank has no sleeves and narrow straps",
    (_id, category, _size, m) => {
      const s = buildSilhouette(category, m, "front");
      expect(s.sleeves).toBeUndefined();
      const strap = (m.shoulderWidth - m.neckWidth) / 2;
      expect(strap).toBeGreaterThan(1);
      expect(strap).toBeLessThan(3);
      // Wide armholes: the outline never reaches past the chest width.
      expect(Math.max(...s.outline.map((p) => p.x))).toBeCloseTo(m.chestWidth / 2, 10);
    },
  );

  it.each(APPAREL.filter(([, c]) => c === "hoodie"))(
    "%s %s %s: hood behind on the front, over the back; pouch on the front",
    (_id, category, _size, m) => {
      const front = buildSilhouette(category, m, "front");
      const back = buildSilhouette(category, m, "back");
      expect(front.hoodLayer).toBe("behind");
      expect(back.hoodLayer).toBe("over");
      expect(Math.min(...front.hood!.map((p) => p.y))).toBeLessThan(front.hps.right.y - 8);
      expect(Math.max(...back.hood!.map((p) => p.y))).toBeGreaterThan(0);
      expect(back.pocket).toBeUndefined();
      const pocket = front.pocket!;
      expect(front.pocketTopY).toBeCloseTo(Math.min(...pocket.map((p) => p.y)), 10);
      expect(front.pocketTopY!).toBeGreaterThan(front.chestLineY);
      expect(Math.max(...pocket.map((p) => p.y))).toBeCloseTo(front.waistbandTopY!, 10);
      for (const p of pocket) {
        const edge = front.bodyEdgeAt(p.y)!;
        expect(Math.abs(p.x)).toBeLessThan(edge.right);
      }
    },
  );

  it.each(APPAREL.filter(([, c]) => c === "infant-bodysuit"))(
    "%s %s %s: bodysuit narrows to a snap tab",
    (_id, category, _size, m) => {
      const s = buildSilhouette(category, m, "front");
      const tab = s.bodyEdgeAt(s.hemY)!;
      expect(tab.right - tab.left).toBeGreaterThan(1.5);
      expect(tab.right - tab.left).toBeLessThan(m.chestWidth / 2);
      expect(s.legOpeningTopY!).toBeGreaterThan(s.chestLineY);
      expect(s.lowerBoundaryY).toBe(s.legOpeningTopY);
    },
  );

  it.each(TOTES)("%s: tote is a rectangle with two handle loops above it", (_id, m) => {
    const s = buildSilhouette("tote", m, "front");
    expect(s.outline).toHaveLength(4);
    const xs = s.outline.map((p) => p.x);
    const ys = s.outline.map((p) => p.y);
    expect(Math.max(...xs) - Math.min(...xs)).toBeCloseTo(m.width, 10);
    expect(Math.max(...ys) - Math.min(...ys)).toBeCloseTo(m.height, 10);
    expect(s.neckline).toEqual([]);
    expect(s.handles).toHaveLength(2);
    for (const loop of s.handles!) {
      expect(signedArea(loop)).toBeGreaterThan(0);
      expect(Math.max(...loop.map((p) => p.y))).toBeLessThanOrEqual(1e-9);
    }
    // The near handle's centerline arc is the handle length less the stitched ends (from memory, approximate).
    const near = s.handles![0]!;
    const half = near.length / 2;
    const outer = near.slice(0, half);
    const inner = near.slice(half).reverse();
    const center = outer.map((p, i) => ({ x: (p.x + inner[i]!.x) / 2, y: (p.y + inner[i]!.y) / 2 }));
    expect(polylineLength(center)).toBeCloseTo(m.handleLength - 2 * HANDLE_STITCHED_END_IN, 0);
    expect(s.bodyEdgeAt(m.height / 2)).toEqual({ left: -m.width / 2, right: m.width / 2 });
    if (m.gusset > 0) expect(s.gussetFoldY).toBeCloseTo(m.height - m.gusset / 2, 10);
  });

  it("refuses measurements of the wrong kind", () => {
    const [, tote] = TOTES[0]!;
    const [, , , tee] = APPAREL[0]!;
    expect(() => buildSilhouette("unisex-tee", tote, "front")).toThrow(TypeError);
    expect(() => buildSilhouette("tote", tee, "front")).toThrow(TypeError);
  });
});

describe("geometry helpers", () => {
  const square: Point[] = [
    { x: 0, y: 0 },
    { x: 2, y: 0 },
    { x: 2, y: 2 },
    { x: 0, y: 2 },
  ];

  it("measures clockwise-on-screen area as positive", () => {
    expect(signedArea(square)).toBeCloseTo(4, 12);
    expect(signedArea([...square].reverse())).toBeCloseTo(-4, 12);
  });

  it.each([
    [{ x: 1, y: 1 }, true],
    [{ x: 3, y: 1 }, false],
    [{ x: 1, y: -0.5 }, false],
  ])("point %o inside the square: %s", (p, inside) => {
    expect(pointInPolygon(p, square)).toBe(inside);
  });

  it.each([
    [1, { minX: 0, maxX: 2 }],
    [0, { minX: 0, maxX: 2 }],
    [3, null],
  ])("span of the square at y = %d", (y, span) => {
    expect(polygonSpanAtY(square, y)).toEqual(span);
  });
});
