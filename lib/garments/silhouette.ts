import { degToRad } from "@/lib/units";
import {
  CATEGORY_INFO,
  isToteMeasurements,
  type ApparelMeasurements,
  type GarmentCategory,
  type GarmentMeasurements,
  type GarmentSide,
  type Point,
  type ToteMeasurements,
} from "./types";

/*
 * Garment outlines in garment inches for one side (front or back).
 * Origin: the collar seam at center (front view: bottom of the front neckline; back view:
 * bottom of the back neckline). x grows to the viewer's right, y grows downward.
 * For a tote the origin is the center of the bag's top edge.
 *
 * Polygons are listed clockwise as seen on screen (y down), first point not repeated.
 */

/** Size charts measure chest width 1 in below the underarm (definition of the measurement). */
export const CHEST_BELOW_UNDERARM_IN = 1;
/** Shoulder seam drop per inch of run from HPS to shoulder point, about 17° (common practice, no published source). */
export const SHOULDER_SLOPE = 0.3;
/**
 * Vertical HPS-to-underarm depth as a share of body length plus a share of chest width.
 * Our own approximation (no published source): about 9.8 in on an adult M tee.
 */
export const ARMHOLE_DEPTH_PER_BODY_LENGTH = 0.2;
export const ARMHOLE_DEPTH_PER_CHEST = 0.2;
/** Tanks are cut with deeper armholes than sleeved tops (common practice, no published source). */
export const TANK_ARMHOLE_FACTOR = 1.15;
/**
 * How far the front armhole curves in from the shoulder point, as a share of shoulder width, so the
 * across-front is a little narrower than the shoulders (common practice, no published source).
 */
export const ARMHOLE_INSET_PER_SHOULDER = 0.07;
/** The back armhole is cut fuller than the front, so its curve dips in less (common practice, no published source). */
export const BACK_ARMHOLE_INSET_SHARE = 0.6;
/** Flat-lay drawing angles for the top line of a sleeve, below horizontal (our own drawing choice). */
export const SHORT_SLEEVE_ANGLE_DEG = 22;
export const LONG_SLEEVE_ANGLE_DEG = 35;
/** Short-sleeve opening width as a share of chest width (from memory, approximate). */
export const SHORT_SLEEVE_OPENING_PER_CHEST = 0.37;
/** Long-sleeve cuff width as a share of chest width, with a floor (from memory, approximate). */
export const CUFF_WIDTH_PER_CHEST = 0.19;
export const MIN_CUFF_WIDTH_IN = 2.5;
/** Length of a ribbed cuff on a long sleeve (from memory, approximate). */
export const CUFF_BAND_IN = 2.5;
/** Ribbed waistband height as a share of body length: about 2.5 in on an adult M (from memory, approximate). */
export const RIB_BAND_PER_BODY_LENGTH = 0.09;
/** How far the ribbed band pulls the hem in on each side, as a share of chest width (from memory, approximate). */
export const RIB_BAND_PULL_PER_CHEST = 0.035;
/** Waist shaping on a fitted tee, per side, as a share of chest width (from memory, approximate). */
export const FITTED_WAIST_PER_CHEST = 0.05;
/** Hood proportions (from memory, approximate): height from the HPS and half-width laid flat. */
export const HOOD_HEIGHT_PER_BODY_LENGTH = 0.47;
export const HOOD_HALF_WIDTH_PER_NECK = 0.72;
/** On the back view the hood is drawn over the body and covers the back collar by this much (our own drawing choice). */
export const HOOD_BACK_OVERLAP_IN = 0.75;
/** Pouch pocket proportions (from memory, approximate). */
export const POCKET_HEIGHT_PER_BODY_LENGTH = 0.25;
export const POCKET_TOP_HALF_PER_CHEST = 0.225;
export const POCKET_BOTTOM_HALF_PER_CHEST = 0.3;
/** Infant bodysuit bottom (from memory, approximate). */
export const LEG_OPENING_PER_BODY_LENGTH = 0.3;
export const SNAP_TAB_HALF_PER_CHEST = 0.17;
export const SNAP_TAB_HEIGHT_PER_BODY_LENGTH = 0.09;
/** Tote handles: spacing of the handle ends from center as a share of bag width (from memory, approximate). */
export const HANDLE_SPREAD_PER_WIDTH = 0.22;
/** Length of each handle end stitched inside the bag's top hem (from memory, approximate). */
export const HANDLE_STITCHED_END_IN = 1.5;

/** Samples per curve; enough for a smooth outline at full-screen zoom. */
const CURVE_SAMPLES = 24;

export interface SleeveFrame {
  /** Viewer's side: "right" is the sleeve drawn at x > 0. */
  viewerSide: "left" | "right";
  /** Shoulder point where the sleeve's top line starts. */
  origin: Point;
  /** Direction of the sleeve's top line, degrees clockwise from +x on screen. */
  angleDeg: number;
  /** Shoulder point to cuff along the top line. */
  length: number;
  /** Width of the sleeve opening, measured square to the top line. */
  cuffWidth: number;
  /** Ribbed cuff length at the end of the sleeve; 0 for a hemmed sleeve. */
  cuffBand: number;
}

export interface BodyEdge {
  left: number;
  right: number;
}

export interface Silhouette {
  category: GarmentCategory;
  side: GarmentSide;
  /** Closed outline of the body including sleeves. */
  outline: Point[];
  /** The collar seam of this side, from the left HPS through (0, 0) to the right HPS. Empty for a tote. */
  neckline: Point[];
  /** High points of the shoulder. For a tote: the top corners of the bag. */
  hps: { left: Point; right: Point };
  shoulderPoints: { left: Point; right: Point };
  underarmY: number;
  /** Height of the chest measurement (1 in below the underarm). For a tote: half the bag height. */
  chestLineY: number;
  hemY: number;
  /** Lowest height a body print may reach before hem stitching, a rib band or a leg opening starts. */
  lowerBoundaryY: number;
  /** Right-hand body edge (shoulder line, armhole seam, side seam), top to bottom; the left edge mirrors it. */
  bodyEdge: Point[];
  /** x of the body's edges at height y, not counting sleeves; null above the HPS or below the hem. */
  bodyEdgeAt: (y: number) => BodyEdge | null;
  sleeves?: Point[][];
  sleeveFrames?: SleeveFrame[];
  hood?: Point[];
  /** "behind": drawn before the body (front view); "over": drawn after it (back view). */
  hoodLayer?: "behind" | "over";
  pocket?: Point[];
  pocketTopY?: number;
  waistbandTopY?: number;
  legOpeningTopY?: number;
  /** Tote handles: [near face, far face]. Draw the far one behind the bag. */
  handles?: Point[][];
  /** Tote with a gusset: the fold line where the gusset tucks under the front face. */
  gussetFoldY?: number;
}

// ---------------------------------------------------------------------------
// Geometry helpers (pure, shared with the placement checks)

export function cubicPoints(p0: Point, p1: Point, p2: Point, p3: Point, segments = CURVE_SAMPLES): Point[] {
  const out: Point[] = [];
  for (let i = 0; i <= segments; i++) {
    const t = i / segments;
    const u = 1 - t;
    const a = u * u * u;
    const b = 3 * u * u * t;
    const c = 3 * u * t * t;
    const d = t * t * t;
    out.push({ x: a * p0.x + b * p1.x + c * p2.x + d * p3.x, y: a * p0.y + b * p1.y + c * p2.y + d * p3.y });
  }
  return out;
}

export function quadraticPoints(p0: Point, p1: Point, p2: Point, segments = CURVE_SAMPLES): Point[] {
  const out: Point[] = [];
  for (let i = 0; i <= segments; i++) {
    const t = i / segments;
    const u = 1 - t;
    out.push({
      x: u * u * p0.x + 2 * u * t * p1.x + t * t * p2.x,
      y: u * u * p0.y + 2 * u * t * p1.y + t * t * p2.y,
    });
  }
  return out;
}

export function mirrorX(points: readonly Point[]): Point[] {
  return points.map((p) => ({ x: p.x === 0 ? 0 : -p.x, y: p.y }));
}

/** Shoelace area; positive when the polygon runs clockwise on screen (y down). */
export function signedArea(polygon: readonly Point[]): number {
  let sum = 0;
  for (let i = 0; i < polygon.length; i++) {
    const a = polygon[i]!;
    const b = polygon[(i + 1) % polygon.length]!;
    sum += a.x * b.y - b.x * a.y;
  }
  return sum / 2;
}

/** Leftmost and rightmost crossings of a horizontal line with a polygon's edges. */
export function polygonSpanAtY(polygon: readonly Point[], y: number): { minX: number; maxX: number } | null {
  let minX = Infinity;
  let maxX = -Infinity;
  for (let i = 0; i < polygon.length; i++) {
    const a = polygon[i]!;
    const b = polygon[(i + 1) % polygon.length]!;
    const lo = Math.min(a.y, b.y);
    const hi = Math.max(a.y, b.y);
    if (y < lo || y > hi) continue;
    if (a.y === b.y) {
      minX = Math.min(minX, a.x, b.x);
      maxX = Math.max(maxX, a.x, b.x);
    } else {
      const x = a.x + ((y - a.y) / (b.y - a.y)) * (b.x - a.x);
      minX = Math.min(minX, x);
      maxX = Math.max(maxX, x);
    }
  }
  return minX === Infinity ? null : { minX, maxX };
}

/** Topmost and bottommost crossings of a vertical line with a polygon's edges. */
export function polygonSpanAtX(polygon: readonly Point[], x: number): { minY: number; maxY: number } | null {
  const swapped = polygon.map((p) => ({ x: p.y, y: p.x }));
  const span = polygonSpanAtY(swapped, x);
  return span ? { minY: span.minX, maxY: span.maxX } : null;
}

/** Ray-casting point-in-polygon test (points on the boundary may go either way). */
export function pointInPolygon(point: Point, polygon: readonly Point[]): boolean {
  let inside = false;
  for (let i = 0, j = polygon.length - 1; i < polygon.length; j = i++) {
    const a = polygon[i]!;
    const b = polygon[j]!;
    if (a.y > point.y !== b.y > point.y && point.x < ((b.x - a.x) * (point.y - a.y)) / (b.y - a.y) + a.x) {
      inside = !inside;
    }
  }
  return inside;
}

/** x of a top-to-bottom polyline at height y (outermost where a segment is level); null outside its range. */
export function polylineXAtY(polyline: readonly Point[], y: number): number | null {
  let best: number | null = null;
  for (let i = 0; i + 1 < polyline.length; i++) {
    const a = polyline[i]!;
    const b = polyline[i + 1]!;
    const lo = Math.min(a.y, b.y);
    const hi = Math.max(a.y, b.y);
    if (y < lo || y > hi) continue;
    const x = a.y === b.y ? Math.max(a.x, b.x) : a.x + ((y - a.y) / (b.y - a.y)) * (b.x - a.x);
    best = best === null ? x : Math.max(best, x);
  }
  return best;
}

/** y of a left-to-right polyline at x (lowest where a segment is vertical); null outside its range. */
export function polylineYAtX(polyline: readonly Point[], x: number): number | null {
  let best: number | null = null;
  for (let i = 0; i + 1 < polyline.length; i++) {
    const a = polyline[i]!;
    const b = polyline[i + 1]!;
    const lo = Math.min(a.x, b.x);
    const hi = Math.max(a.x, b.x);
    if (x < lo || x > hi) continue;
    const y = a.x === b.x ? Math.max(a.y, b.y) : a.y + ((x - a.x) / (b.x - a.x)) * (b.y - a.y);
    best = best === null ? y : Math.max(best, y);
  }
  return best;
}

/** Edge of a mirror-symmetric body at height y, from its right-hand edge polyline. */
export function edgeAtY(bodyEdge: readonly Point[], y: number): BodyEdge | null {
  const x = polylineXAtY(bodyEdge, y);
  return x === null ? null : { left: -x, right: x };
}

/** Narrowest half-width of the body between two heights (exact for the piecewise-linear edge). */
export function minEdgeBetween(bodyEdge: readonly Point[], yTop: number, yBottom: number): number | null {
  const ys = [yTop, yBottom, ...bodyEdge.map((p) => p.y).filter((y) => y > yTop && y < yBottom)];
  let min: number | null = null;
  for (const y of ys) {
    const x = polylineXAtY(bodyEdge, y);
    if (x === null) return null;
    min = min === null ? x : Math.min(min, x);
  }
  return min;
}

// ---------------------------------------------------------------------------
// Proportions derived from the chart

/** Vertical depth from the HPS down to the underarm (see the constants above for the approximation). */
export function armholeDepth(category: GarmentCategory, m: ApparelMeasurements): number {
  const base = ARMHOLE_DEPTH_PER_BODY_LENGTH * m.bodyLength + ARMHOLE_DEPTH_PER_CHEST * m.chestWidth;
  const depth = category === "tank" ? base * TANK_ARMHOLE_FACTOR : base;
  const shoulderDrop = SHOULDER_SLOPE * Math.max(0, m.shoulderWidth / 2 - m.neckWidth / 2);
  // Keep the underarm clearly below the shoulder point and the chest line clearly above the hem.
  const min = shoulderDrop + 1.5;
  const max = m.bodyLength - CHEST_BELOW_UNDERARM_IN - 2;
  return Math.min(Math.max(depth, min), Math.max(max, min));
}

/** Crew-style neck curve from the left HPS through (0, bottomY) to the right HPS. */
function neckCurve(neckHalf: number, hpsY: number, bottomY: number): Point[] {
  const drop = bottomY - hpsY;
  const right = cubicPoints(
    { x: 0, y: bottomY },
    { x: 0.55 * neckHalf, y: bottomY },
    { x: neckHalf, y: hpsY + 0.5 * drop },
    { x: neckHalf, y: hpsY },
  );
  const left = mirrorX(right).reverse();
  return [...left, ...right.slice(1)];
}

function along(origin: Point, angleRad: number, distance: number): Point {
  return { x: origin.x + distance * Math.cos(angleRad), y: origin.y + distance * Math.sin(angleRad) };
}

/** Closes a right half (top to bottom) into a clockwise outline with its mirror and a top edge. */
function closeSymmetric(rightHalf: readonly Point[], topEdgeLeftToRight: readonly Point[]): Point[] {
  const left = mirrorX(rightHalf).reverse();
  return [...rightHalf, ...left, ...topEdgeLeftToRight];
}

function reverseMirror(polygon: readonly Point[]): Point[] {
  return mirrorX(polygon).reverse();
}

// ---------------------------------------------------------------------------

export function buildSilhouette(
  category: GarmentCategory,
  measurements: GarmentMeasurements,
  side: GarmentSide,
): Silhouette {
  if (CATEGORY_INFO[category].isTote) {
    if (!isToteMeasurements(measurements)) throw new TypeError("A tote needs tote measurements.");
    return buildTote(measurements, side);
  }
  if (isToteMeasurements(measurements)) throw new TypeError(`A ${category} needs apparel measurements.`);
  return buildApparel(category, measurements, side);
}

function buildApparel(category: GarmentCategory, m: ApparelMeasurements, side: GarmentSide): Silhouette {
  const info = CATEGORY_INFO[category];
  const neckHalf = m.neckWidth / 2;
  const neckDrop = side === "front" ? m.frontNeckDrop : m.backNeckDrop;
  const hpsY = -neckDrop;
  const hemY = m.bodyLength - neckDrop;
  const shoulderHalf = m.shoulderWidth / 2;
  const chestHalf = m.chestWidth / 2;

  const hpsRight: Point = { x: neckHalf, y: hpsY };
  const shoulderDrop = SHOULDER_SLOPE * Math.max(0, shoulderHalf - neckHalf);
  const shoulderPoint: Point = { x: shoulderHalf, y: hpsY + shoulderDrop };
  const underarmY = hpsY + armholeDepth(category, m);
  const underarm: Point = { x: chestHalf, y: underarmY };
  const chestLineY = underarmY + CHEST_BELOW_UNDERARM_IN;

  // Armhole seam: down and in from the shoulder point, then out to the underarm.
  const h = underarmY - shoulderPoint.y;
  const armhole =
    category === "tank"
      ? cubicPoints(
          shoulderPoint,
          { x: shoulderHalf, y: shoulderPoint.y + 0.5 * h },
          { x: shoulderHalf + 0.25 * (chestHalf - shoulderHalf), y: underarmY },
          underarm,
        )
      : (() => {
          const inset =
            ARMHOLE_INSET_PER_SHOULDER * m.shoulderWidth * (side === "back" ? BACK_ARMHOLE_INSET_SHARE : 1);
          return cubicPoints(
            shoulderPoint,
            { x: shoulderHalf - inset, y: shoulderPoint.y + 0.45 * h },
            { x: shoulderHalf - inset, y: underarmY },
            underarm,
          );
        })();

  // Side seam from the underarm to the hem; always straight through the chest line.
  const sideSeam: Point[] = [underarm, { x: chestHalf, y: chestLineY }];
  let waistbandTopY: number | undefined;
  let legOpeningTopY: number | undefined;
  if (category === "fitted-tee") {
    const waist = FITTED_WAIST_PER_CHEST * m.chestWidth;
    const run = hemY - chestLineY;
    sideSeam.push(
      ...cubicPoints(
        { x: chestHalf, y: chestLineY },
        { x: chestHalf - 1.3 * waist, y: chestLineY + run / 3 },
        { x: chestHalf - 1.3 * waist, y: chestLineY + (2 * run) / 3 },
        { x: chestHalf - 0.3 * waist, y: hemY },
      ).slice(1),
    );
  } else if (info.hasRibBands) {
    const band = RIB_BAND_PER_BODY_LENGTH * m.bodyLength;
    const pull = RIB_BAND_PULL_PER_CHEST * m.chestWidth;
    waistbandTopY = hemY - band;
    sideSeam.push(
      { x: chestHalf, y: waistbandTopY },
      { x: chestHalf - pull, y: waistbandTopY + Math.min(0.4, band / 3) },
      { x: chestHalf - pull, y: hemY },
    );
  } else if (info.hasSnapTab) {
    legOpeningTopY = hemY - LEG_OPENING_PER_BODY_LENGTH * m.bodyLength;
    const tabHalf = SNAP_TAB_HALF_PER_CHEST * m.chestWidth;
    const tabTopY = hemY - SNAP_TAB_HEIGHT_PER_BODY_LENGTH * m.bodyLength;
    // Leg opening: a quarter ellipse scooped in from the side seam to the top of the snap tab.
    const rx = chestHalf - tabHalf;
    const ry = tabTopY - legOpeningTopY;
    for (let i = 0; i <= CURVE_SAMPLES; i++) {
      const s = (i / CURVE_SAMPLES) * (Math.PI / 2);
      sideSeam.push({ x: chestHalf - rx * Math.sin(s), y: tabTopY - ry * Math.cos(s) });
    }
    sideSeam.push({ x: tabHalf, y: hemY });
  } else {
    sideSeam.push({ x: chestHalf, y: hemY });
  }

  const bodyEdge: Point[] = [hpsRight, ...armhole, ...sideSeam.slice(1)];
  const outerNeck = neckCurve(neckHalf, hpsY, hpsY + m.backNeckDrop);
  const neckline = neckCurve(neckHalf, hpsY, 0);

  let rightHalf: Point[];
  let sleeves: Point[][] | undefined;
  let sleeveFrames: SleeveFrame[] | undefined;
  if (info.hasSleeves) {
    const angleDeg = info.longSleeves ? LONG_SLEEVE_ANGLE_DEG : SHORT_SLEEVE_ANGLE_DEG;
    const angle = degToRad(angleDeg);
    const cuffWidth = info.longSleeves
      ? Math.max(CUFF_WIDTH_PER_CHEST * m.chestWidth, MIN_CUFF_WIDTH_IN)
      : SHORT_SLEEVE_OPENING_PER_CHEST * m.chestWidth;
    const cuffTop = along(shoulderPoint, angle, m.sleeveLength);
    const cuffBottom = along(cuffTop, angle + Math.PI / 2, cuffWidth);
    const rightSleeve = [shoulderPoint, cuffTop, cuffBottom, underarm, ...armhole.slice(1, -1).reverse()];
    sleeves = [reverseMirror(rightSleeve), rightSleeve];
    const cuffBand = info.longSleeves ? Math.min(CUFF_BAND_IN, m.sleeveLength / 4) : 0;
    sleeveFrames = [
      {
        viewerSide: "left",
        origin: { x: -shoulderPoint.x, y: shoulderPoint.y },
        angleDeg: 180 - angleDeg,
        length: m.sleeveLength,
        cuffWidth,
        cuffBand,
      },
      { viewerSide: "right", origin: shoulderPoint, angleDeg, length: m.sleeveLength, cuffWidth, cuffBand },
    ];
    rightHalf = [hpsRight, shoulderPoint, cuffTop, cuffBottom, underarm, ...sideSeam.slice(1)];
  } else {
    rightHalf = [hpsRight, ...armhole, ...sideSeam.slice(1)];
  }
  const outline = closeSymmetric(rightHalf, outerNeck.slice(1, -1));

  const result: Silhouette = {
    category,
    side,
    outline,
    neckline,
    hps: { left: { x: -neckHalf, y: hpsY }, right: hpsRight },
    shoulderPoints: { left: { x: -shoulderPoint.x, y: shoulderPoint.y }, right: shoulderPoint },
    underarmY,
    chestLineY,
    hemY,
    lowerBoundaryY: waistbandTopY ?? legOpeningTopY ?? hemY,
    bodyEdge,
    bodyEdgeAt: (y: number) => edgeAtY(bodyEdge, y),
  };
  if (sleeves && sleeveFrames) {
    result.sleeves = sleeves;
    result.sleeveFrames = sleeveFrames;
  }
  if (waistbandTopY !== undefined) result.waistbandTopY = waistbandTopY;
  if (legOpeningTopY !== undefined) result.legOpeningTopY = legOpeningTopY;

  if (info.hasHood) {
    result.hood = hoodShape(m, side, hpsY, outerNeck);
    result.hoodLayer = side === "front" ? "behind" : "over";
  }
  if (info.hasPouch && side === "front" && waistbandTopY !== undefined) {
    const pocket = pocketShape(m, waistbandTopY);
    result.pocket = pocket.polygon;
    result.pocketTopY = pocket.topY;
  }
  return result;
}

function hoodShape(m: ApparelMeasurements, side: GarmentSide, hpsY: number, outerNeck: Point[]): Point[] {
  const neckHalf = m.neckWidth / 2;
  const hoodHeight = HOOD_HEIGHT_PER_BODY_LENGTH * m.bodyLength;
  const hoodHalf = Math.max(HOOD_HALF_WIDTH_PER_NECK * m.neckWidth, neckHalf + 1.5);
  const topY = hpsY - hoodHeight;
  // Right side of the hood from its crown down to the right HPS.
  const right = cubicPoints(
    { x: 0, y: topY },
    { x: hoodHalf, y: topY },
    { x: hoodHalf + 0.3, y: hpsY - 0.25 * hoodHeight },
    { x: neckHalf, y: hpsY },
  );
  const left = mirrorX(right).reverse();
  const over = [...left, ...right.slice(1)];
  // Bottom edge, right to left: along the neck seam behind the body, or lapping over the back collar.
  const bottom =
    side === "front"
      ? outerNeck.slice(1, -1).reverse()
      : neckCurve(neckHalf, hpsY, HOOD_BACK_OVERLAP_IN).slice(1, -1).reverse();
  return [...over, ...bottom];
}

function pocketShape(m: ApparelMeasurements, waistbandTopY: number): { polygon: Point[]; topY: number } {
  const height = POCKET_HEIGHT_PER_BODY_LENGTH * m.bodyLength;
  const topY = waistbandTopY - height;
  const topHalf = POCKET_TOP_HALF_PER_CHEST * m.chestWidth;
  const bottomHalf = POCKET_BOTTOM_HALF_PER_CHEST * m.chestWidth;
  // Hand opening: from the top corner down and out to the bottom corner, bowing in.
  const rightOpening = quadraticPoints(
    { x: topHalf, y: topY },
    { x: topHalf + 0.1 * (bottomHalf - topHalf), y: topY + 0.7 * height },
    { x: bottomHalf, y: waistbandTopY },
    12,
  );
  const leftOpening = mirrorX(rightOpening).reverse();
  // Clockwise: down the right opening, along the bottom, up the left opening, then along the top.
  return { polygon: [...rightOpening, ...leftOpening], topY };
}

/** Half-perimeter of an ellipse (a standard closed-form approximation, well within a tenth of an inch here). */
function halfEllipseLength(a: number, b: number): number {
  return (Math.PI / 2) * (3 * (a + b) - Math.sqrt((3 * a + b) * (a + 3 * b)));
}

/** Rise of a half-ellipse handle with half-spread `a` whose arc is `length` long. */
export function handleRise(a: number, length: number): number {
  if (length <= halfEllipseLength(a, 0)) return 0;
  let lo = 0;
  let hi = length;
  for (let i = 0; i < 60; i++) {
    const mid = (lo + hi) / 2;
    if (halfEllipseLength(a, mid) < length) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

function handleLoop(a: number, rise: number, width: number): Point[] {
  const outer: Point[] = [];
  const inner: Point[] = [];
  const half = width / 2;
  for (let i = 0; i <= CURVE_SAMPLES; i++) {
    const s = Math.PI - (i / CURVE_SAMPLES) * Math.PI;
    outer.push({ x: (a + half) * Math.cos(s), y: -(rise + half) * Math.sin(s) });
    inner.push({ x: (a - half) * Math.cos(s), y: -Math.max(rise - half, 0) * Math.sin(s) });
  }
  return [...outer, ...inner.reverse()];
}

function buildTote(m: ToteMeasurements, side: GarmentSide): Silhouette {
  const half = m.width / 2;
  const outline: Point[] = [
    { x: -half, y: 0 },
    { x: half, y: 0 },
    { x: half, y: m.height },
    { x: -half, y: m.height },
  ];
  const bodyEdge: Point[] = [
    { x: half, y: 0 },
    { x: half, y: m.height },
  ];
  const spread = HANDLE_SPREAD_PER_WIDTH * m.width;
  const visible = Math.max(m.handleLength - 2 * HANDLE_STITCHED_END_IN, 0);
  const rise = handleRise(spread, visible);
  // The far handle is drawn a little higher so it shows behind the near one (our own drawing choice).
  const handles = [
    handleLoop(spread, rise, m.handleWidth),
    handleLoop(spread, rise + 0.75 * m.handleWidth, m.handleWidth),
  ];
  const result: Silhouette = {
    category: "tote",
    side,
    outline,
    neckline: [],
    hps: { left: { x: -half, y: 0 }, right: { x: half, y: 0 } },
    shoulderPoints: { left: { x: -half, y: 0 }, right: { x: half, y: 0 } },
    underarmY: 0,
    chestLineY: m.height / 2,
    hemY: m.height,
    lowerBoundaryY: m.gusset > 0 ? m.height - m.gusset / 2 : m.height,
    bodyEdge,
    bodyEdgeAt: (y: number) => edgeAtY(bodyEdge, y),
    handles,
  };
  if (m.gusset > 0) result.gussetFoldY = m.height - m.gusset / 2;
  return result;
}

/** Flat width across the body at height y (across-front on the front view), not counting sleeves. */
export function widthAt(silhouette: Silhouette, y: number): number | null {
  const edge = silhouette.bodyEdgeAt(y);
  return edge ? edge.right - edge.left : null;
}
