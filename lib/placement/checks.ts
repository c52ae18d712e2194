import {
  COLLAR_CLEARANCE_IN,
  HEM_CLEARANCE_IN,
  LOCATION_LABELS,
  POCKET_CLEARANCE_IN,
  TOP_TOLERANCE_IN,
  locationSpec,
  locationsFor,
  type LocationSpec,
} from "@/lib/garments/locations";
import {
  buildSilhouette,
  polygonSpanAtX,
  polygonSpanAtY,
  polylineYAtX,
  type Silhouette,
} from "@/lib/garments/silhouette";
import {
  CATEGORY_INFO,
  type GarmentCategory,
  type GarmentMeasurements,
  type Point,
  type SizeGroup,
  type SizeRow,
} from "@/lib/garments/types";
import {
  EIGHTH_IN,
  EPSILON_IN,
  degToRad,
  formatLength,
  normalizeDegrees,
  pastLimit,
  shortOf,
  shownSteps,
  type LengthUnit,
} from "@/lib/units";
import { placementBounds, placementCorners, type Placement } from "./model";
import { fitProblems, type PlacementWarning, type PlacementWarningCode, type WarningSeverity } from "./flags";
import { placementSchema } from "./schema";

export { SIDE_SEAM_CLEARANCE_IN } from "@/lib/garments/locations";
export { pastLimit, shortOf, shownSteps } from "@/lib/units";

/** Below this turn, art looks accidentally crooked rather than deliberately angled (Chalkline default). */
export const SLIGHT_TILT_DEG = 2;
/** Below this offset, centered art looks accidentally nudged (Chalkline default: one eighth of an inch). */
export const SLIGHT_OFFSET_IN = EIGHTH_IN;

export * from "./flags";

/** Short reason phrases for the size-switch summary. */
const FIT_REASONS: Readonly<Partial<Record<PlacementWarningCode, string>>> = {
  "too-wide": "wider than the maximum",
  "too-tall": "taller than the maximum",
  "seam-clearance": "too close to the side seam",
  "off-garment": "off the garment",
  "collar-clearance": "too close to the collar",
  "hem-clearance": "too close to the hem",
  "pocket-clearance": "too close to the pouch pocket",
  "outside-print-area": "outside the print area",
};

export interface PreviousSize {
  size: string;
  group?: SizeGroup;
  measurements: GarmentMeasurements;
}

export interface CheckPlacementInput {
  placement: Placement;
  category: GarmentCategory;
  group: SizeGroup;
  measurements: GarmentMeasurements;
  size: string;
  /** The size the user switched from; adds a size-switch warning if the art fit there but not here. */
  previousSize?: PreviousSize;
  /** Unit for numbers in messages; details are always in inches. */
  unit?: LengthUnit;
}

const SEVERITY_ORDER: Readonly<Record<WarningSeverity, number>> = { error: 0, warning: 1, info: 2 };

export function checkPlacement(input: CheckPlacementInput): PlacementWarning[] {
  const parsed = placementSchema.safeParse(input.placement);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return [
      {
        code: "invalid-placement",
        severity: "error",
        message: issue ? issue.message : "This placement is not valid.",
        details: { field: issue ? issue.path.join(".") : "" },
      },
    ];
  }
  const warnings = checkOneSize({ ...input, placement: parsed.data });
  const previous = input.previousSize;
  if (previous && !warnings.some((w) => w.code === "location-not-offered")) {
    const before = checkOneSize({
      ...input,
      placement: parsed.data,
      group: previous.group ?? input.group,
      measurements: previous.measurements,
      size: previous.size,
    });
    const misfits = fitProblems(warnings);
    if (fitProblems(before).length === 0 && misfits.length > 0) {
      const reasons = [...new Set(misfits.map((w) => FIT_REASONS[w.code] ?? w.code))];
      warnings.push({
        code: "size-switch",
        severity: "warning",
        message: `This placement fits size ${previous.size} but not size ${input.size}: ${reasons.join(", ")}.`,
        details: {
          previousSize: previous.size,
          size: input.size,
          limits: [...new Set(misfits.map((w) => w.code))],
        },
      });
    }
  }
  return sortWarnings(warnings);
}

export interface SizeCheck {
  size: string;
  group: SizeGroup;
  warnings: PlacementWarning[];
  /** No error or warning about fit at this size. */
  fits: boolean;
}

/** Checks one placement on every size of a chart, in chart order, with size-switch notes between neighbours. */
export function checkAcrossSizes(args: {
  placement: Placement;
  category: GarmentCategory;
  sizes: readonly SizeRow[];
  unit?: LengthUnit;
}): SizeCheck[] {
  return args.sizes.map((row, i) => {
    const prev = i > 0 ? args.sizes[i - 1] : undefined;
    const input: CheckPlacementInput = {
      placement: args.placement,
      category: args.category,
      group: row.group,
      measurements: row.measurements,
      size: row.size,
    };
    if (prev) input.previousSize = { size: prev.size, group: prev.group, measurements: prev.measurements };
    if (args.unit) input.unit = args.unit;
    const warnings = checkPlacement(input);
    return { size: row.size, group: row.group, warnings, fits: fitProblems(warnings).length === 0 };
  });
}

function sortWarnings(warnings: PlacementWarning[]): PlacementWarning[] {
  return warnings
    .map((w, i) => ({ w, i }))
    .sort((a, b) => SEVERITY_ORDER[a.w.severity] - SEVERITY_ORDER[b.w.severity] || a.i - b.i)
    .map(({ w }) => w);
}

// ---------------------------------------------------------------------------

interface Context {
  p: Placement;
  spec: LocationSpec;
  silhouette: Silhouette;
  corners: Point[];
  size: string;
  unit: LengthUnit;
}

function checkOneSize(input: CheckPlacementInput & { placement: Placement }): PlacementWarning[] {
  const { placement: p, category, group, measurements, size } = input;
  const unit = input.unit ?? "in";
  if (!locationsFor(category).includes(p.location)) {
    return [
      {
        code: "location-not-offered",
        severity: "error",
        message: `A ${CATEGORY_INFO[category].label.toLowerCase()} has no ${LOCATION_LABELS[p.location].toLowerCase()} print location.`,
        details: { location: p.location, category },
      },
    ];
  }
  const spec = locationSpec({ location: p.location, category, group, measurements });
  const silhouette = buildSilhouette(category, measurements, spec.side);
  const ctx: Context = { p, spec, silhouette, corners: placementCorners(p), size, unit };

  const out: PlacementWarning[] = [...sizeLimits(ctx)];
  if (spec.fitRule === "body") {
    const onGarment = seamClearance(ctx, out);
    if (onGarment) {
      out.push(...collarClearance(ctx), ...hemClearance(ctx), ...pocketClearance(ctx), ...usualTop(ctx));
    }
  } else {
    out.push(...outsideArea(ctx));
  }
  out.push(...slightOffset(ctx), ...slightTilt(ctx));
  return out;
}

function fmt(ctx: Context, inches: number): string {
  return formatLength(inches, ctx.unit);
}

// Every limit is judged at the precision the message shows it (1/8 in, or 0.1 cm): a value that
// reads the same as its limit is within it, so a warning never shows two equal numbers.
function past(ctx: Context, value: number, limit: number): boolean {
  return pastLimit(value, limit, ctx.unit);
}

function short(ctx: Context, value: number, limit: number): boolean {
  return shortOf(value, limit, ctx.unit);
}

/** A distance that reads as below zero: the art has crossed the line it was measured from. */
function readsNegative(ctx: Context, value: number): boolean {
  return shownSteps(value, ctx.unit) < 0;
}

function where(ctx: Context): string {
  return `${ctx.spec.label.toLowerCase()} on size ${ctx.size}`;
}

function sizeLimits(ctx: Context): PlacementWarning[] {
  const { p, spec } = ctx;
  const out: PlacementWarning[] = [];
  if (past(ctx, p.widthIn, spec.maxWidth)) {
    out.push({
      code: "too-wide",
      severity: "warning",
      message: `The art is ${fmt(ctx, p.widthIn)} wide; a ${where(ctx)} takes at most ${fmt(ctx, spec.maxWidth)}.`,
      details: { widthIn: p.widthIn, maxWidthIn: spec.maxWidth },
    });
  }
  if (past(ctx, p.heightIn, spec.maxHeight)) {
    out.push({
      code: "too-tall",
      severity: "warning",
      message: `The art is ${fmt(ctx, p.heightIn)} tall; a ${where(ctx)} takes at most ${fmt(ctx, spec.maxHeight)}.`,
      details: { heightIn: p.heightIn, maxHeightIn: spec.maxHeight },
    });
  }
  return out;
}

function uniqueSorted(values: number[]): number[] {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted.filter((v, i) => i === 0 || v - sorted[i - 1]! > 1e-12);
}

function edgeName(silhouette: Silhouette, y: number): string {
  if (y < silhouette.shoulderPoints.right.y) return "shoulder seam";
  if (y < silhouette.underarmY) return "armhole seam";
  return "side seam";
}

/**
 * Side-seam clearance: the art's distance to the body edge at every height it covers, measured
 * across. Exact, because both outlines are piecewise linear and the gap is smallest at a corner
 * of one of them. Returns false when the art is off the garment (and says so).
 */
function seamClearance(ctx: Context, out: PlacementWarning[]): boolean {
  const { silhouette, corners, spec } = ctx;
  const artTop = Math.min(...corners.map((c) => c.y));
  const artBottom = Math.max(...corners.map((c) => c.y));
  const yFrom = Math.max(artTop, silhouette.hps.right.y);
  const yTo = Math.min(artBottom, silhouette.hemY);
  const offGarment: PlacementWarning = {
    code: "off-garment",
    severity: "error",
    message: `The art sits entirely off the garment on size ${ctx.size}.`,
  };
  if (yFrom > yTo) {
    out.push(offGarment);
    return false;
  }
  const breaks = uniqueSorted([
    yFrom,
    yTo,
    ...corners.map((c) => c.y).filter((y) => y > yFrom && y < yTo),
    ...silhouette.bodyEdge.map((p) => p.y).filter((y) => y > yFrom && y < yTo),
  ]);
  // Overlap with the body is also sampled between corners, where a thin sliver could hide.
  let overlaps = false;
  const midpoints = breaks.slice(1).map((y, i) => (y + breaks[i]!) / 2);
  for (const y of [...breaks, ...midpoints]) {
    const span = polygonSpanAtY(corners, y);
    const edge = silhouette.bodyEdgeAt(y);
    if (span && edge && Math.min(span.maxX, edge.right) - Math.max(span.minX, edge.left) > EPSILON_IN) {
      overlaps = true;
      break;
    }
  }
  let min = Infinity;
  let minY = yFrom;
  for (const y of breaks) {
    const span = polygonSpanAtY(corners, y);
    const edge = silhouette.bodyEdgeAt(y);
    if (!span || !edge) continue;
    const clearance = Math.min(edge.right - span.maxX, span.minX - edge.left);
    if (clearance < min) {
      min = clearance;
      minY = y;
    }
  }
  if (!overlaps) {
    out.push(offGarment);
    return false;
  }
  const need = spec.sideSeamClearance;
  if (short(ctx, min, need)) {
    const seam = edgeName(silhouette, minY);
    const crosses = readsNegative(ctx, min);
    const message = !crosses
      ? `Only ${fmt(ctx, min)} between the art and the ${seam} on size ${ctx.size}; keep at least ${fmt(ctx, need)}.`
      : `The art runs ${fmt(ctx, -min)} over the ${seam} on size ${ctx.size}; keep it at least ${fmt(ctx, need)} inside the seam.`;
    out.push({
      code: "seam-clearance",
      severity: crosses ? "error" : "warning",
      message,
      details: { clearanceIn: min, minClearanceIn: need, atYIn: minY, seam },
    });
  }
  return true;
}

/** Gap between the art's top and the collar seam, across the neck opening. */
function collarClearance(ctx: Context): PlacementWarning[] {
  const { silhouette, corners } = ctx;
  const neck = silhouette.neckline;
  if (neck.length < 2) return [];
  const neckHalf = silhouette.hps.right.x;
  const xFrom = Math.max(Math.min(...corners.map((c) => c.x)), -neckHalf);
  const xTo = Math.min(Math.max(...corners.map((c) => c.x)), neckHalf);
  if (xFrom > xTo) return [];
  const xs = uniqueSorted([
    xFrom,
    xTo,
    ...corners.map((c) => c.x).filter((x) => x > xFrom && x < xTo),
    ...neck.map((p) => p.x).filter((x) => x > xFrom && x < xTo),
  ]);
  let min = Infinity;
  for (const x of xs) {
    const span = polygonSpanAtX(corners, x);
    const neckY = polylineYAtX(neck, x);
    if (!span || neckY === null) continue;
    min = Math.min(min, span.minY - neckY);
  }
  if (!Number.isFinite(min) || !short(ctx, min, COLLAR_CLEARANCE_IN)) return [];
  if (readsNegative(ctx, min)) {
    return [
      {
        code: "collar-clearance",
        severity: "error",
        message: `The art runs ${fmt(ctx, -min)} into the neckline on size ${ctx.size}.`,
        details: { clearanceIn: min, minClearanceIn: COLLAR_CLEARANCE_IN },
      },
    ];
  }
  return [
    {
      code: "collar-clearance",
      severity: "warning",
      message: `The top of the art is only ${fmt(ctx, min)} below the collar seam; keep at least ${fmt(ctx, COLLAR_CLEARANCE_IN)}.`,
      details: { clearanceIn: min, minClearanceIn: COLLAR_CLEARANCE_IN },
    },
  ];
}

function lowerBoundaryName(silhouette: Silhouette): string {
  if (silhouette.waistbandTopY !== undefined) return "ribbed waistband";
  if (silhouette.legOpeningTopY !== undefined) return "leg openings";
  return "hem";
}

function hemClearance(ctx: Context): PlacementWarning[] {
  const { silhouette, corners } = ctx;
  const artBottom = Math.max(...corners.map((c) => c.y));
  if (past(ctx, artBottom - silhouette.hemY, 0)) {
    return [
      {
        code: "hem-clearance",
        severity: "error",
        message: `The art runs ${fmt(ctx, artBottom - silhouette.hemY)} past the hem on size ${ctx.size}.`,
        details: {
          clearanceIn: silhouette.hemY - artBottom,
          minClearanceIn: HEM_CLEARANCE_IN,
          boundary: "hem",
        },
      },
    ];
  }
  const boundary = lowerBoundaryName(silhouette);
  const clearance = silhouette.lowerBoundaryY - artBottom;
  if (!short(ctx, clearance, HEM_CLEARANCE_IN)) return [];
  const onto = readsNegative(ctx, clearance);
  const message = !onto
    ? `The art ends ${fmt(ctx, clearance)} above the ${boundary} on size ${ctx.size}; keep at least ${fmt(ctx, HEM_CLEARANCE_IN)}.`
    : `The art runs ${fmt(ctx, -clearance)} onto the ${boundary} on size ${ctx.size}; keep at least ${fmt(ctx, HEM_CLEARANCE_IN)} above it.`;
  return [
    {
      code: "hem-clearance",
      severity: onto ? "error" : "warning",
      message,
      details: { clearanceIn: clearance, minClearanceIn: HEM_CLEARANCE_IN, boundary },
    },
  ];
}

function pocketClearance(ctx: Context): PlacementWarning[] {
  const { silhouette, corners } = ctx;
  const pocket = silhouette.pocket;
  const pocketTop = silhouette.pocketTopY;
  if (!pocket || pocketTop === undefined) return [];
  const pocketHalf = Math.max(...pocket.map((p) => Math.abs(p.x)));
  const artLeft = Math.min(...corners.map((c) => c.x));
  const artRight = Math.max(...corners.map((c) => c.x));
  if (artRight <= -pocketHalf || artLeft >= pocketHalf) return [];
  const artBottom = Math.max(...corners.map((c) => c.y));
  const clearance = pocketTop - artBottom;
  if (!short(ctx, clearance, POCKET_CLEARANCE_IN)) return [];
  const onto = readsNegative(ctx, clearance);
  const message = !onto
    ? `The art ends ${fmt(ctx, clearance)} above the pouch pocket on size ${ctx.size}; keep at least ${fmt(ctx, POCKET_CLEARANCE_IN)}.`
    : `The art runs ${fmt(ctx, -clearance)} onto the pouch pocket on size ${ctx.size}; keep at least ${fmt(ctx, POCKET_CLEARANCE_IN)} above it.`;
  return [
    {
      code: "pocket-clearance",
      severity: onto ? "error" : "warning",
      message,
      details: { clearanceIn: clearance, minClearanceIn: POCKET_CLEARANCE_IN, pocketTopIn: pocketTop },
    },
  ];
}

function usualTop(ctx: Context): PlacementWarning[] {
  const { spec, p } = ctx;
  const top = placementBounds(p).y;
  const usual = spec.defaultBelowCollar;
  const label = spec.label.toLowerCase();
  if (short(ctx, top, usual - TOP_TOLERANCE_IN)) {
    return [
      {
        code: "top-too-high",
        severity: "warning",
        message: `The top of the art is ${fmt(ctx, top)} below the collar; a ${label} usually starts about ${fmt(ctx, usual)} below.`,
        details: { topIn: top, usualTopIn: usual, toleranceIn: TOP_TOLERANCE_IN },
      },
    ];
  }
  if (past(ctx, top, usual + TOP_TOLERANCE_IN)) {
    return [
      {
        code: "top-too-low",
        severity: "info",
        message: `The top of the art is ${fmt(ctx, top)} below the collar; a ${label} usually starts about ${fmt(ctx, usual)} below.`,
        details: { topIn: top, usualTopIn: usual, toleranceIn: TOP_TOLERANCE_IN },
      },
    ];
  }
  return [];
}

/** For sleeves, pouch and tote: how far the turned art reaches past its print area. */
function outsideArea(ctx: Context): PlacementWarning[] {
  const { spec, corners } = ctx;
  const area = spec.printArea;
  const center = { x: area.x + area.width / 2, y: area.y + area.height / 2 };
  const a = degToRad(spec.axisRotationDeg);
  const cos = Math.cos(a);
  const sin = Math.sin(a);
  let over = 0;
  for (const c of corners) {
    const dx = c.x - center.x;
    const dy = c.y - center.y;
    const lx = dx * cos + dy * sin;
    const ly = -dx * sin + dy * cos;
    over = Math.max(over, Math.abs(lx) - area.width / 2, Math.abs(ly) - area.height / 2);
  }
  if (!past(ctx, over, 0)) return [];
  return [
    {
      code: "outside-print-area",
      severity: "warning",
      message: `The art reaches ${fmt(ctx, over)} past the ${where(ctx)} print area.`,
      details: { overhangIn: over },
    },
  ];
}

function slightOffset(ctx: Context): PlacementWarning[] {
  const { spec, p } = ctx;
  if (spec.anchor !== "center") return [];
  const off = Math.abs(p.offsetFromCenterIn - spec.defaultOffsetFromCenter);
  if (off <= EPSILON_IN || off >= SLIGHT_OFFSET_IN - EPSILON_IN) return [];
  const amount = formatLength(off, ctx.unit, { decimal: true, digits: ctx.unit === "cm" ? 2 : 3 });
  return [
    {
      code: "slightly-off-center",
      severity: "warning",
      message: `The art is ${amount} off center, which looks like a slip; center it or move it on purpose.`,
      details: {
        offsetIn: p.offsetFromCenterIn - spec.defaultOffsetFromCenter,
        thresholdIn: SLIGHT_OFFSET_IN,
      },
    },
  ];
}

function slightTilt(ctx: Context): PlacementWarning[] {
  const { spec, p } = ctx;
  const turn = normalizeDegrees(p.rotationDeg - spec.axisRotationDeg);
  if (Math.abs(turn) <= 1e-6 || Math.abs(turn) >= SLIGHT_TILT_DEG) return [];
  return [
    {
      code: "slight-tilt",
      severity: "warning",
      message: `The art is turned ${Math.abs(turn).toFixed(1)}°, which looks accidental; straighten it or turn it further.`,
      details: { turnDeg: turn, thresholdDeg: SLIGHT_TILT_DEG },
    },
  ];
}
