/**
 * Size advice from the trade's rules of thumb (common practice, no published source):
 * wide art is sized by width (about 11 in on an adult front); tall art by height (about 11 in, never
 * over 14); round or square art about 10 to 11 in; small emblem-like art about 9 in or less; and never
 * beyond the location's print area. Youth and toddler garments scale the advice down.
 */
import { locationSpec, type LocationSpec } from "@/lib/garments/locations";
import type { GarmentCategory, GarmentMeasurements, SizeGroup } from "@/lib/garments/types";
import { checkPlacement, fitProblems } from "@/lib/placement/checks";
import type { Placement } from "@/lib/placement/model";
import { floorToEighth, formatLength, type LengthUnit } from "@/lib/units";

export type ArtShape = "wide" | "tall" | "square" | "round" | "emblem";

/** Width ÷ height beyond which art reads as wide, or tall (our own cut-offs). */
export const WIDE_ASPECT = 1.25;
export const TALL_ASPECT = 0.8;
/** A disc fills π/4 ≈ 0.785 of its box; art filling 0.70–0.86 with empty corners reads as round. */
const ROUND_FILL = { min: 0.7, max: 0.86 } as const;
/** Square-ish art covering under this share of its box reads as a sparse emblem or badge (our own cut-off). */
const EMBLEM_FILL_MAX = 0.45;

export const SHAPE_LABELS: Record<ArtShape, string> = {
  wide: "Wide",
  tall: "Tall",
  square: "Square",
  round: "Round",
  emblem: "Emblem",
};

export function classifyShape(args: {
  inkWidthPx: number;
  inkHeightPx: number;
  fillRatio: number;
  cornersEmpty: boolean;
}): ArtShape {
  const aspect = args.inkWidthPx / args.inkHeightPx;
  if (aspect >= WIDE_ASPECT) return "wide";
  if (aspect <= TALL_ASPECT) return "tall";
  if (args.cornersEmpty && args.fillRatio >= ROUND_FILL.min && args.fillRatio <= ROUND_FILL.max)
    return "round";
  if (args.fillRatio < EMBLEM_FILL_MAX) return "emblem";
  return "square";
}

/** Adult-front targets in inches (common practice, no published source). */
export const ADULT_TARGETS = {
  wideWidth: 11,
  tallHeight: 11,
  tallMaxHeight: 14,
  squareSide: 10.5,
  emblemSide: 9,
} as const;

/**
 * How much smaller to go on smaller garments. Youth fronts top out about 9–10 in and toddler about
 * 6–7 in against about 11 in for adults (from memory, approximate); infant is our own smaller step.
 */
export const GROUP_SCALE: Record<SizeGroup, number> = { adult: 1, youth: 0.86, toddler: 0.6, infant: 0.45 };

export type SizeAdvice = {
  shape: ArtShape;
  widthIn: number;
  heightIn: number;
  rule: string;
  limitedByArea: boolean;
};

function fit(aspect: number, maxWidth: number, maxHeight: number) {
  const byWidth = { widthIn: maxWidth, heightIn: maxWidth / aspect };
  return byWidth.heightIn <= maxHeight ? byWidth : { widthIn: maxHeight * aspect, heightIn: maxHeight };
}

/**
 * Rounds a size down to the 1/8 in the editor shows, on the art's long side; the short side follows
 * the art's proportions. Never larger than the size given, so it stays inside whatever that fitted.
 */
export function floorSize(
  size: { widthIn: number; heightIn: number },
  aspect: number,
): { widthIn: number; heightIn: number } {
  if (aspect >= 1) {
    const widthIn = floorToEighth(size.widthIn);
    return { widthIn, heightIn: widthIn / aspect };
  }
  const heightIn = floorToEighth(size.heightIn);
  return { widthIn: heightIn * aspect, heightIn };
}

/** The suggested size for art of this shape and aspect on a location whose print area allows maxWidth × maxHeight. */
export function suggestSize(args: {
  shape: ArtShape;
  aspect: number;
  group: SizeGroup;
  maxWidthIn: number;
  maxHeightIn: number;
  unit?: LengthUnit;
}): SizeAdvice {
  const unit = args.unit ?? "in";
  const len = (inches: number) => formatLength(inches, unit);
  const k = GROUP_SCALE[args.group];
  const groupWord =
    args.group === "adult" ? "an adult front" : `a ${args.group} garment (scaled to ${Math.round(k * 100)}%)`;
  let target: { widthIn: number; heightIn: number };
  let rule: string;
  switch (args.shape) {
    case "wide":
      target = {
        widthIn: ADULT_TARGETS.wideWidth * k,
        heightIn: (ADULT_TARGETS.wideWidth * k) / args.aspect,
      };
      rule = `Wide art is sized by its width: about ${len(floorToEighth(ADULT_TARGETS.wideWidth * k))} on ${groupWord}.`;
      break;
    case "tall": {
      const h = Math.min(ADULT_TARGETS.tallHeight * k, ADULT_TARGETS.tallMaxHeight * k);
      target = { widthIn: h * args.aspect, heightIn: h };
      rule = `Tall art is sized by its height: about ${len(floorToEighth(h))} on ${groupWord}, never over ${len(floorToEighth(ADULT_TARGETS.tallMaxHeight * k))}.`;
      break;
    }
    case "emblem":
      target = fit(args.aspect, ADULT_TARGETS.emblemSide * k, ADULT_TARGETS.emblemSide * k);
      rule = `Emblem-like art stays compact: about ${len(floorToEighth(ADULT_TARGETS.emblemSide * k))} or less on ${groupWord}.`;
      break;
    default:
      target = fit(args.aspect, ADULT_TARGETS.squareSide * k, ADULT_TARGETS.squareSide * k);
      rule = `${args.shape === "round" ? "Round" : "Square"} art sits at about 10 to 11 in across on ${groupWord}; here ${len(floorToEighth(ADULT_TARGETS.squareSide * k))}.`;
  }
  const limited = target.widthIn > args.maxWidthIn + 1e-9 || target.heightIn > args.maxHeightIn + 1e-9;
  const final = limited
    ? fit(args.aspect, Math.min(target.widthIn, args.maxWidthIn), Math.min(target.heightIn, args.maxHeightIn))
    : target;
  // The print area is shown as the checks show its limits, so the two never disagree.
  if (limited)
    rule += ` Reduced to stay inside the print area (${formatLength(args.maxWidthIn, unit, { withUnit: false })} × ${len(args.maxHeightIn)}).`;
  const size = floorSize(final, args.aspect);
  return { shape: args.shape, widthIn: size.widthIn, heightIn: size.heightIn, rule, limitedByArea: limited };
}

/** The largest size that fits the print area, keeping proportions, rounded down to 1/8 in. */
export function fillPrintArea(args: {
  aspect: number;
  maxWidthIn: number;
  maxHeightIn: number;
  unit?: LengthUnit;
}): { widthIn: number; heightIn: number; rule: string } {
  const unit = args.unit ?? "in";
  const f = fit(args.aspect, args.maxWidthIn, args.maxHeightIn);
  const by = f.widthIn >= args.maxWidthIn - 1e-9 ? "width" : "height";
  return {
    ...floorSize(f, args.aspect),
    rule: `Fills the print area by its ${by}: ${formatLength(args.maxWidthIn, unit, { withUnit: false })} × ${formatLength(args.maxHeightIn, unit)} at most.`,
  };
}

/**
 * Where the art of a given size sits on the location's usual spot: the usual top (or centre) and
 * offset, straightened to the location's own axis, and kept inside the print area.
 */
export function usualSpot(
  spec: LocationSpec,
  size: { widthIn: number; heightIn: number },
): Pick<Placement, "widthIn" | "heightIn" | "offsetFromCenterIn" | "belowCollarIn" | "rotationDeg"> {
  const { widthIn, heightIn } = size;
  if (spec.verticalAlign === "top") {
    return {
      widthIn,
      heightIn,
      offsetFromCenterIn: spec.defaultOffsetFromCenter,
      belowCollarIn: spec.defaultBelowCollar,
      rotationDeg: spec.axisRotationDeg,
    };
  }
  const area = spec.printArea;
  const cx = area.x + area.width / 2;
  const cy = area.y + area.height / 2;
  const a = (spec.axisRotationDeg * Math.PI) / 180;
  const cos = Math.cos(a);
  const sin = Math.sin(a);
  // The usual centre, in the print area's own axes, slid back inside the area if the art would poke out.
  const dx = spec.defaultOffsetFromCenter - cx;
  const dy = spec.defaultBelowCollar + spec.typicalHeight / 2 - cy;
  const clamp = (v: number, half: number) => Math.max(-half, Math.min(half, v));
  const u = clamp(dx * cos + dy * sin, Math.max(0, (area.width - widthIn) / 2));
  const v = clamp(-dx * sin + dy * cos, Math.max(0, (area.height - heightIn) / 2));
  const centreX = cx + u * cos - v * sin;
  const centreY = cy + u * sin + v * cos;
  return {
    widthIn,
    heightIn,
    offsetFromCenterIn: centreX,
    belowCollarIn: centreY - heightIn / 2,
    rotationDeg: spec.axisRotationDeg,
  };
}

export interface PlacedSize {
  placement: Placement;
  /** "in-place": resized where it was; "usual-spot": moved to the location's usual spot to fit. */
  where: "in-place" | "usual-spot";
}

export interface PlaceSizeInput {
  placement: Placement;
  size: { widthIn: number; heightIn: number };
  category: GarmentCategory;
  group: SizeGroup;
  measurements: GarmentMeasurements;
  /** The size label the checks name. */
  sizeLabel: string;
}

/**
 * Puts a suggested size on a print: where the art is, when it fits there at that size (no fit
 * warning), or else on the location's usual spot, where a size inside the print area always fits.
 * Null when the size has no room (under 1/8 in) or the garment has no such location.
 */
export function placeSuggestedSize(input: PlaceSizeInput): PlacedSize | null {
  const { placement, size } = input;
  if (!(size.widthIn > 0 && size.heightIn > 0)) return null;
  let spec: LocationSpec;
  try {
    spec = locationSpec({
      location: placement.location,
      category: input.category,
      group: input.group,
      measurements: input.measurements,
    });
  } catch {
    return null;
  }
  // Limits are judged at the precision shown, which differs between units: the art must fit as
  // read in either, so switching units never brings up a warning.
  const fits = (p: Placement) =>
    (["in", "cm"] as const).every(
      (unit) =>
        fitProblems(
          checkPlacement({
            placement: p,
            category: input.category,
            group: input.group,
            measurements: input.measurements,
            size: input.sizeLabel,
            unit,
          }),
        ).length === 0,
    );
  // In place: a print that sits by its top keeps its top (as typing a width does); one that sits by its middle keeps its middle.
  const belowCollarIn =
    spec.verticalAlign === "top"
      ? placement.belowCollarIn
      : placement.belowCollarIn + placement.heightIn / 2 - size.heightIn / 2;
  const inPlace = { ...placement, widthIn: size.widthIn, heightIn: size.heightIn, belowCollarIn };
  if (fits(inPlace)) return { placement: inPlace, where: "in-place" };
  return { placement: { ...placement, ...usualSpot(spec, size) }, where: "usual-spot" };
}
