import { normalizeDegrees } from "@/lib/units";
import {
  buildSilhouette,
  minEdgeBetween,
  polygonSpanAtX,
  type Silhouette,
  type SleeveFrame,
} from "./silhouette";
import {
  CATEGORY_INFO,
  isToteMeasurements,
  type GarmentCategory,
  type GarmentMeasurements,
  type GarmentSide,
  type Point,
  type Rect,
  type SizeGroup,
} from "./types";

export const PRINT_LOCATIONS = [
  "full-front",
  "full-back",
  "left-chest",
  "right-chest",
  "left-sleeve",
  "right-sleeve",
  "back-neck",
  "pouch",
  "tote-front",
] as const;
export type PrintLocation = (typeof PRINT_LOCATIONS)[number];

export const LOCATION_LABELS: Readonly<Record<PrintLocation, string>> = {
  "full-front": "Full front",
  "full-back": "Full back",
  "left-chest": "Left chest",
  "right-chest": "Right chest",
  "left-sleeve": "Left sleeve",
  "right-sleeve": "Right sleeve",
  "back-neck": "Back neck",
  pouch: "Pouch pocket",
  "tote-front": "Tote front",
};

/** What a location's default position is measured from. */
export type LocationAnchor = "center" | "left-chest" | "right-chest" | "left-sleeve" | "right-sleeve";

/**
 * How a placement is judged: "body" prints are checked against the side seams, collar and hem;
 * "area" prints (sleeves, pouch, tote) must stay inside their print area.
 */
export type FitRule = "body" | "area";

const TEE_LOCATIONS: readonly PrintLocation[] = [
  "full-front",
  "full-back",
  "left-chest",
  "right-chest",
  "left-sleeve",
  "right-sleeve",
  "back-neck",
];

const LOCATIONS_BY_CATEGORY: Readonly<Record<GarmentCategory, readonly PrintLocation[]>> = {
  "unisex-tee": TEE_LOCATIONS,
  "youth-tee": TEE_LOCATIONS,
  "fitted-tee": TEE_LOCATIONS,
  "long-sleeve-tee": TEE_LOCATIONS,
  crewneck: TEE_LOCATIONS,
  // The hood lies over the back neck, so no back-neck print on a hoodie.
  hoodie: ["full-front", "full-back", "left-chest", "right-chest", "left-sleeve", "right-sleeve", "pouch"],
  tank: ["full-front", "full-back", "left-chest", "right-chest", "back-neck"],
  tote: ["tote-front"],
  "infant-bodysuit": ["full-front", "full-back", "left-chest"],
};

export function locationsFor(category: GarmentCategory): readonly PrintLocation[] {
  return LOCATIONS_BY_CATEGORY[category];
}

// ---------------------------------------------------------------------------
// Trade numbers. Unless a line says otherwise these are common practice with no published
// source, or from memory and approximate, as marked. All in inches.

/** Keep art this far inside the side seam / armhole seam (common practice, no published source). */
export const SIDE_SEAM_CLEARANCE_IN = 2;
/**
 * Side-seam clearance per size group. Adults keep the full 2 in; smaller garments cannot spare it,
 * so the clearance shrinks (from memory, approximate).
 */
export const SIDE_SEAM_CLEARANCE_BY_GROUP: Readonly<Record<SizeGroup, number>> = {
  adult: SIDE_SEAM_CLEARANCE_IN,
  youth: 1.5,
  toddler: 1.25,
  infant: 1,
};
/** How far the top of the art may stray from a location's usual top before we say so (Chalkline default). */
export const TOP_TOLERANCE_IN = 1.5;
/** Keep art this far below the collar seam (common practice, no published source). */
export const COLLAR_CLEARANCE_IN = 0.5;
/** Keep art this far above the hem stitching, a rib band or a leg opening (common practice, no published source). */
export const HEM_CLEARANCE_IN = 1;
/** Keep hoodie front art this far above the pouch pocket (common practice, no published source). */
export const POCKET_CLEARANCE_IN = 1;
/** Margin inside the pouch pocket's edges for a pouch print (from memory, approximate). */
export const POUCH_MARGIN_IN = 0.75;
/** Margins on a sleeve print (from memory, approximate): from the sleeve's edges, from the shoulder point, from the hem or cuff. */
export const SLEEVE_EDGE_MARGIN_IN = 0.75;
export const SLEEVE_TOP_MARGIN_IN = 1;
export const SLEEVE_HEM_MARGIN_IN = 1;
/** Margins on a tote face (from memory, approximate): sides, below the top edge, above the bottom or gusset fold. */
export const TOTE_SIDE_MARGIN_IN = 1.5;
export const TOTE_TOP_MARGIN_IN = 2;
export const TOTE_BOTTOM_MARGIN_IN = 1.5;
/**
 * Adult full front / full back maxima grow on big garments: half an inch of width and height per
 * inch of chest beyond 24.5 in (about a unisex XL), up to a large-platen ceiling. Chalkline default,
 * no published source; the limits are always recomputed from the size's own chest width.
 */
export const PLUS_GROWTH_START_CHEST_IN = 24.5;
export const PLUS_GROWTH_PER_CHEST_IN = 0.5;
export const PLUS_CEILING = { width: 14, height: 16 } as const;

interface GroupLimits {
  capWidth: number;
  capHeight: number;
  typicalWidth: number;
  typicalHeight: number;
  /** Usual distance of the art's top below the collar seam at center. */
  top: number;
  /** Usual x of the art's center (chest prints), toward the wearer's left. */
  offset: number;
}

type LimitTable = Readonly<Record<SizeGroup, GroupLimits>>;

/**
 * Full front. Adult: typical about 11 x 11, never over 11.25 wide x 14 high, top 3 to 3.5 below the
 * collar, default 3 (common practice, no published source). Youth: about 9 to 10 wide at most;
 * toddler about 6 to 7; infant smaller still (from memory, approximate).
 */
export const FULL_FRONT_LIMITS: LimitTable = {
  adult: { capWidth: 11.25, capHeight: 14, typicalWidth: 11, typicalHeight: 11, top: 3, offset: 0 },
  youth: { capWidth: 10, capHeight: 12, typicalWidth: 9, typicalHeight: 9, top: 2.5, offset: 0 },
  toddler: { capWidth: 7, capHeight: 8, typicalWidth: 6, typicalHeight: 6, top: 2, offset: 0 },
  infant: { capWidth: 5, capHeight: 5.5, typicalWidth: 4, typicalHeight: 4, top: 1.5, offset: 0 },
};

/** Full back: starts 2 to 3 below the back collar (common practice, no published source); sizes from memory, approximate. */
export const FULL_BACK_LIMITS: LimitTable = {
  adult: { capWidth: 12, capHeight: 15, typicalWidth: 11, typicalHeight: 13, top: 2.5, offset: 0 },
  youth: { capWidth: 10, capHeight: 12, typicalWidth: 9, typicalHeight: 10, top: 2, offset: 0 },
  toddler: { capWidth: 7, capHeight: 8, typicalWidth: 6, typicalHeight: 6, top: 1.75, offset: 0 },
  infant: { capWidth: 5, capHeight: 5.5, typicalWidth: 4, typicalHeight: 4, top: 1.25, offset: 0 },
};

/**
 * Left / right chest, from memory: adult 3.5 to 4.5 wide, centered about 4 in toward the wearer's
 * side of center front, top about 3 below the collar. Smaller groups scaled down (from memory, approximate).
 */
export const CHEST_LIMITS: LimitTable = {
  adult: { capWidth: 4.5, capHeight: 5, typicalWidth: 4, typicalHeight: 4, top: 3, offset: 4 },
  youth: { capWidth: 3.5, capHeight: 4, typicalWidth: 3, typicalHeight: 3, top: 2.5, offset: 3 },
  toddler: { capWidth: 3, capHeight: 3, typicalWidth: 2.5, typicalHeight: 2.5, top: 2, offset: 2.25 },
  infant: { capWidth: 2.5, capHeight: 2.5, typicalWidth: 2, typicalHeight: 2, top: 1.5, offset: 1.75 },
};

/**
 * Chest prints move in on narrow bodies: the center sits at most a fifth of the chest width from
 * center front, which gives the usual 4 in on a unisex M (our own rule, no published source).
 */
export const CHEST_OFFSET_PER_CHEST = 0.2;

/** Back neck: a small area just below the back collar, up to about 3 in wide (from memory, approximate). */
export const BACK_NECK_LIMITS: LimitTable = {
  adult: { capWidth: 3, capHeight: 2, typicalWidth: 2.5, typicalHeight: 1, top: 0.75, offset: 0 },
  youth: { capWidth: 2.5, capHeight: 1.75, typicalWidth: 2, typicalHeight: 1, top: 0.75, offset: 0 },
  toddler: { capWidth: 2, capHeight: 1.5, typicalWidth: 1.75, typicalHeight: 0.75, top: 0.6, offset: 0 },
  infant: { capWidth: 1.75, capHeight: 1.25, typicalWidth: 1.5, typicalHeight: 0.75, top: 0.6, offset: 0 },
};

/**
 * Sleeves: width across the arm, height along it. Short sleeves about 3.5 wide at most (from memory);
 * long sleeves allow a down-the-sleeve print (from memory, approximate). `top` and `offset` are unused.
 */
export const SHORT_SLEEVE_LIMITS: LimitTable = {
  adult: { capWidth: 3.5, capHeight: 4, typicalWidth: 3, typicalHeight: 3, top: 0, offset: 0 },
  youth: { capWidth: 3, capHeight: 3.5, typicalWidth: 2.5, typicalHeight: 2.5, top: 0, offset: 0 },
  toddler: { capWidth: 2.5, capHeight: 2.5, typicalWidth: 2, typicalHeight: 2, top: 0, offset: 0 },
  infant: { capWidth: 2, capHeight: 2, typicalWidth: 1.5, typicalHeight: 1.5, top: 0, offset: 0 },
};
export const LONG_SLEEVE_LIMITS: LimitTable = {
  adult: { capWidth: 3.5, capHeight: 15, typicalWidth: 3, typicalHeight: 3, top: 0, offset: 0 },
  youth: { capWidth: 3, capHeight: 12, typicalWidth: 2.5, typicalHeight: 2.5, top: 0, offset: 0 },
  toddler: { capWidth: 2.5, capHeight: 8, typicalWidth: 2, typicalHeight: 2, top: 0, offset: 0 },
  infant: { capWidth: 2, capHeight: 5, typicalWidth: 1.5, typicalHeight: 1.5, top: 0, offset: 0 },
};

/** Pouch pocket print (from memory, approximate); also bounded by the pocket itself. */
export const POUCH_LIMITS: LimitTable = {
  adult: { capWidth: 10, capHeight: 5, typicalWidth: 7, typicalHeight: 3, top: 0, offset: 0 },
  youth: { capWidth: 8, capHeight: 4, typicalWidth: 6, typicalHeight: 2.5, top: 0, offset: 0 },
  toddler: { capWidth: 6, capHeight: 3, typicalWidth: 4, typicalHeight: 2, top: 0, offset: 0 },
  infant: { capWidth: 4, capHeight: 2, typicalWidth: 3, typicalHeight: 1.5, top: 0, offset: 0 },
};

/** Tote face: the bag minus its margins; typical art about 10 x 10 (from memory, approximate). */
export const TOTE_TYPICAL = { width: 10, height: 10 } as const;

// ---------------------------------------------------------------------------

export interface LocationSpec {
  location: PrintLocation;
  label: string;
  /** Which view the location is drawn on. Sleeves are drawn on the front view. */
  side: GarmentSide;
  anchor: LocationAnchor;
  fitRule: FitRule;
  maxWidth: number;
  maxHeight: number;
  typicalWidth: number;
  typicalHeight: number;
  /**
   * Usual y of the art's top edge (before any turn): inches below the collar seam at center, or for
   * a tote below the bag's top edge.
   */
  defaultBelowCollar: number;
  /** Usual x of the art's center. */
  defaultOffsetFromCenter: number;
  /** "top": art of other proportions keeps its top edge; "middle": it keeps its center. */
  verticalAlign: "top" | "middle";
  /**
   * Turn of the location's own axes in the drawing, degrees clockwise: 0 on the body; on a sleeve the
   * art's up points along the arm toward the shoulder.
   */
  axisRotationDeg: number;
  /** The largest allowed art rectangle, before turning by axisRotationDeg about its own center. */
  printArea: Rect;
  /** Side-seam clearance used for this size group (body locations). */
  sideSeamClearance: number;
}

export interface LocationSpecInput {
  location: PrintLocation;
  category: GarmentCategory;
  group: SizeGroup;
  measurements: GarmentMeasurements;
  /** A silhouette already built for this size and the location's side, to save rebuilding it. */
  silhouette?: Silhouette;
}

/** Which view a location is drawn on. Sleeve prints are shown on the front view. */
export function sideOf(location: PrintLocation): GarmentSide {
  return location === "full-back" || location === "back-neck" ? "back" : "front";
}

function anchorOf(location: PrintLocation): LocationAnchor {
  switch (location) {
    case "left-chest":
    case "right-chest":
    case "left-sleeve":
    case "right-sleeve":
      return location;
    default:
      return "center";
  }
}

function plusGrowth(group: SizeGroup, chestWidth: number): number {
  if (group !== "adult") return 0;
  return Math.max(0, chestWidth - PLUS_GROWTH_START_CHEST_IN) * PLUS_GROWTH_PER_CHEST_IN;
}

export function locationSpec(input: LocationSpecInput): LocationSpec {
  const { location, category, group, measurements } = input;
  if (!locationsFor(category).includes(location)) {
    throw new RangeError(
      `A ${CATEGORY_INFO[category].label.toLowerCase()} has no ${LOCATION_LABELS[location].toLowerCase()} print location.`,
    );
  }
  const side = sideOf(location);
  const silhouette =
    input.silhouette && input.silhouette.side === side
      ? input.silhouette
      : buildSilhouette(category, measurements, side);
  const clearance = SIDE_SEAM_CLEARANCE_BY_GROUP[group];
  const base = {
    location,
    label: LOCATION_LABELS[location],
    side,
    anchor: anchorOf(location),
    sideSeamClearance: clearance,
  };

  if (location === "tote-front") {
    if (!isToteMeasurements(measurements)) throw new TypeError("A tote print needs tote measurements.");
    return { ...base, ...toteArea(silhouette, measurements.width) };
  }
  if (isToteMeasurements(measurements)) throw new TypeError(`A ${category} needs apparel measurements.`);

  switch (location) {
    case "left-sleeve":
    case "right-sleeve":
      return {
        ...base,
        ...sleeveArea(
          silhouette,
          location,
          CATEGORY_INFO[category].longSleeves ? LONG_SLEEVE_LIMITS[group] : SHORT_SLEEVE_LIMITS[group],
        ),
      };
    case "pouch":
      return { ...base, ...pouchArea(silhouette, POUCH_LIMITS[group]) };
    default: {
      const table =
        location === "full-front"
          ? FULL_FRONT_LIMITS
          : location === "full-back"
            ? FULL_BACK_LIMITS
            : location === "back-neck"
              ? BACK_NECK_LIMITS
              : CHEST_LIMITS;
      const limits = table[group];
      const grows = location === "full-front" || location === "full-back";
      const growth = grows ? plusGrowth(group, measurements.chestWidth) : 0;
      const chestOffset = Math.min(limits.offset, CHEST_OFFSET_PER_CHEST * measurements.chestWidth);
      const offset = location === "left-chest" ? chestOffset : location === "right-chest" ? -chestOffset : 0;
      return {
        ...base,
        ...bodyArea({
          silhouette,
          limits,
          capWidth: grows
            ? Math.min(limits.capWidth + growth, Math.max(limits.capWidth, PLUS_CEILING.width))
            : limits.capWidth,
          capHeight: grows
            ? Math.min(limits.capHeight + growth, Math.max(limits.capHeight, PLUS_CEILING.height))
            : limits.capHeight,
          offset,
          clearance,
        }),
      };
    }
  }
}

type AreaFields = Omit<LocationSpec, "location" | "label" | "side" | "anchor" | "sideSeamClearance">;

/** Lowest y a body print may reach on this silhouette. */
export function bodyPrintBottomLimit(silhouette: Silhouette): number {
  let limit = silhouette.lowerBoundaryY - HEM_CLEARANCE_IN;
  if (silhouette.pocketTopY !== undefined)
    limit = Math.min(limit, silhouette.pocketTopY - POCKET_CLEARANCE_IN);
  return limit;
}

function bodyArea(args: {
  silhouette: Silhouette;
  limits: GroupLimits;
  capWidth: number;
  capHeight: number;
  offset: number;
  clearance: number;
}): AreaFields {
  const { silhouette, limits, capWidth, capHeight, offset, clearance } = args;
  const top = limits.top;
  const maxHeight = clampNonNegative(Math.min(capHeight, bodyPrintBottomLimit(silhouette) - top));
  const narrowest = minEdgeBetween(silhouette.bodyEdge, top, top + maxHeight) ?? 0;
  const room = narrowest - clearance - Math.abs(offset);
  const maxWidth = clampNonNegative(Math.min(capWidth, 2 * room));
  return {
    fitRule: "body",
    maxWidth,
    maxHeight,
    typicalWidth: Math.min(limits.typicalWidth, maxWidth),
    typicalHeight: Math.min(limits.typicalHeight, maxHeight),
    defaultBelowCollar: top,
    defaultOffsetFromCenter: offset,
    verticalAlign: "top",
    axisRotationDeg: 0,
    printArea: { x: offset - maxWidth / 2, y: top, width: maxWidth, height: maxHeight },
  };
}

function clampNonNegative(n: number): number {
  return n > 0 ? n : 0;
}

function centeredArea(args: {
  center: Point;
  maxWidth: number;
  maxHeight: number;
  typicalWidth: number;
  typicalHeight: number;
  axisRotationDeg: number;
  fitRule: FitRule;
}): AreaFields {
  const { center, maxWidth, maxHeight, typicalWidth, typicalHeight, axisRotationDeg, fitRule } = args;
  return {
    fitRule,
    maxWidth,
    maxHeight,
    typicalWidth,
    typicalHeight,
    defaultBelowCollar: center.y - typicalHeight / 2,
    defaultOffsetFromCenter: center.x,
    verticalAlign: "middle",
    axisRotationDeg,
    printArea: {
      x: center.x - maxWidth / 2,
      y: center.y - maxHeight / 2,
      width: maxWidth,
      height: maxHeight,
    },
  };
}

function toteArea(silhouette: Silhouette, width: number): AreaFields {
  const maxWidth = clampNonNegative(width - 2 * TOTE_SIDE_MARGIN_IN);
  const bottom = silhouette.lowerBoundaryY - TOTE_BOTTOM_MARGIN_IN;
  const maxHeight = clampNonNegative(bottom - TOTE_TOP_MARGIN_IN);
  return centeredArea({
    center: { x: 0, y: TOTE_TOP_MARGIN_IN + maxHeight / 2 },
    maxWidth,
    maxHeight,
    typicalWidth: Math.min(TOTE_TYPICAL.width, maxWidth),
    typicalHeight: Math.min(TOTE_TYPICAL.height, maxHeight),
    axisRotationDeg: 0,
    fitRule: "area",
  });
}

function pouchArea(silhouette: Silhouette, limits: GroupLimits): AreaFields {
  const pocket = silhouette.pocket;
  const topY = silhouette.pocketTopY;
  const bottomY = silhouette.waistbandTopY;
  const corner = pocket?.[0];
  if (!pocket || topY === undefined || bottomY === undefined || !corner) {
    throw new RangeError("This garment has no pouch pocket.");
  }
  // The pocket is narrowest along its top edge; the hand openings flare out below it.
  const maxWidth = clampNonNegative(Math.min(limits.capWidth, 2 * (corner.x - POUCH_MARGIN_IN)));
  const maxHeight = clampNonNegative(Math.min(limits.capHeight, bottomY - topY - 2 * POUCH_MARGIN_IN));
  return centeredArea({
    center: { x: 0, y: (topY + bottomY) / 2 },
    maxWidth,
    maxHeight,
    typicalWidth: Math.min(limits.typicalWidth, maxWidth),
    typicalHeight: Math.min(limits.typicalHeight, maxHeight),
    axisRotationDeg: 0,
    fitRule: "area",
  });
}

/** Sleeve frame coordinates: u along the top line from the shoulder point, v across toward the underarm. */
function toSleeveLocal(frame: SleeveFrame, p: Point): Point {
  const a = (frame.angleDeg * Math.PI) / 180;
  const dx = p.x - frame.origin.x;
  const dy = p.y - frame.origin.y;
  const u = dx * Math.cos(a) + dy * Math.sin(a);
  // v is measured toward the underarm; the left-hand sleeve's frame is mirrored.
  const sign = frame.viewerSide === "right" ? 1 : -1;
  const v = sign * (-dx * Math.sin(a) + dy * Math.cos(a));
  return { x: u, y: v };
}

const SLEEVE_GRID_STEP_IN = 0.125;

function sleeveArea(
  silhouette: Silhouette,
  location: "left-sleeve" | "right-sleeve",
  limits: GroupLimits,
): AreaFields {
  // The wearer's left sleeve is on the viewer's right of the front view.
  const viewerSide = location === "left-sleeve" ? "right" : "left";
  const index = silhouette.sleeveFrames?.findIndex((f) => f.viewerSide === viewerSide) ?? -1;
  const frame = silhouette.sleeveFrames?.[index];
  const polygon = silhouette.sleeves?.[index];
  if (!frame || !polygon) throw new RangeError("This garment has no sleeves.");

  const local = polygon.map((p) => toSleeveLocal(frame, p));
  const uStart = SLEEVE_TOP_MARGIN_IN;
  const uEnd = frame.length - frame.cuffBand - SLEEVE_HEM_MARGIN_IN;
  const steps = Math.max(0, Math.floor((uEnd - uStart) / SLEEVE_GRID_STEP_IN + 1e-9));
  const grid: { u: number; lo: number; hi: number }[] = [];
  for (let i = 0; i <= steps; i++) {
    const u = uStart + i * SLEEVE_GRID_STEP_IN;
    const span = polygonSpanAtX(local, u);
    if (span) grid.push({ u, lo: span.minY + SLEEVE_EDGE_MARGIN_IN, hi: span.maxY - SLEEVE_EDGE_MARGIN_IN });
  }

  // The area keeps at least the typical width where the sleeve allows it, then runs as far along
  // the arm as it can (a long sleeve tapers, so a wider area would be a shorter one); ties go to
  // the wider area, then to the one nearest the shoulder.
  const widest = grid.reduce((w, cell) => Math.max(w, Math.min(cell.hi - cell.lo, limits.capWidth)), 0);
  const target = Math.min(limits.typicalWidth, widest);
  let best = { width: 0, height: -1, u0: 0, u1: 0, lo: 0, hi: 0 };
  for (let i = 0; i < grid.length; i++) {
    let lo = -Infinity;
    let hi = Infinity;
    for (let j = i; j < grid.length; j++) {
      const cell = grid[j]!;
      lo = Math.max(lo, cell.lo);
      hi = Math.min(hi, cell.hi);
      const width = Math.min(hi - lo, limits.capWidth);
      const height = cell.u - grid[i]!.u;
      if (width < target - 1e-9 || width <= 0 || height > limits.capHeight + 1e-9) break;
      const taller = height > best.height + 1e-9;
      const wider = Math.abs(height - best.height) <= 1e-9 && width > best.width + 1e-9;
      if (taller || wider) best = { width, height, u0: grid[i]!.u, u1: cell.u, lo, hi };
    }
  }

  const maxWidth = best.width;
  const maxHeight = Math.max(best.height, 0);
  const typicalWidth = Math.min(limits.typicalWidth, maxWidth);
  const typicalHeight = Math.min(limits.typicalHeight, maxHeight);
  // Long sleeves: the usual print sits at the top of the area, near the shoulder; short sleeves: centered.
  const uCenter = CATEGORY_INFO[silhouette.category].longSleeves
    ? best.u0 + typicalHeight / 2
    : (best.u0 + best.u1) / 2;
  const areaCenter = fromSleeveLocal(frame, { x: (best.u0 + best.u1) / 2, y: (best.lo + best.hi) / 2 });
  const artCenter = fromSleeveLocal(frame, { x: uCenter, y: (best.lo + best.hi) / 2 });
  // Turning the art by (sleeve angle - 90°) points its up along the arm toward the shoulder, on either sleeve.
  const axisRotationDeg = frame.angleDeg - 90;

  const area = centeredArea({
    center: areaCenter,
    maxWidth: clampNonNegative(maxWidth),
    maxHeight: clampNonNegative(maxHeight),
    typicalWidth: clampNonNegative(typicalWidth),
    typicalHeight: clampNonNegative(typicalHeight),
    axisRotationDeg: normalizeDegrees(axisRotationDeg),
    fitRule: "area",
  });
  return {
    ...area,
    defaultBelowCollar: artCenter.y - area.typicalHeight / 2,
    defaultOffsetFromCenter: artCenter.x,
  };
}

function fromSleeveLocal(frame: SleeveFrame, p: Point): Point {
  const a = (frame.angleDeg * Math.PI) / 180;
  const sign = frame.viewerSide === "right" ? 1 : -1;
  const v = sign * p.y;
  return {
    x: frame.origin.x + p.x * Math.cos(a) - v * Math.sin(a),
    y: frame.origin.y + p.x * Math.sin(a) + v * Math.cos(a),
  };
}
