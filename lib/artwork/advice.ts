/**
 * Size advice from the trade's rules of thumb (common practice, no published source):
 * wide art is sized by width (about 11 in on an adult front); tall art by height (about 11 in, never
 * over 14); round or square art about 10 to 11 in; small emblem-like art about 9 in or less; and never
 * beyond the location's print area. Youth and toddler garments scale the advice down.
 */
import type { SizeGroup } from "@/lib/garments/types";

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

export function classifyShape(args: { inkWidthPx: number; inkHeightPx: number; fillRatio: number; cornersEmpty: boolean }): ArtShape {
  const aspect = args.inkWidthPx / args.inkHeightPx;
  if (aspect >= WIDE_ASPECT) return "wide";
  if (aspect <= TALL_ASPECT) return "tall";
  if (args.cornersEmpty && args.fillRatio >= ROUND_FILL.min && args.fillRatio <= ROUND_FILL.max) return "round";
  if (args.fillRatio < EMBLEM_FILL_MAX) return "emblem";
  return "square";
}

/** Adult-front targets in inches (common practice, no published source). */
export const ADULT_TARGETS = { wideWidth: 11, tallHeight: 11, tallMaxHeight: 14, squareSide: 10.5, emblemSide: 9 } as const;

/**
 * How much smaller to go on smaller garments. Youth fronts top out about 9–10 in and toddler about
 * 6–7 in against about 11 in for adults (from memory, approximate); infant is our own smaller step.
 */
export const GROUP_SCALE: Record<SizeGroup, number> = { adult: 1, youth: 0.86, toddler: 0.6, infant: 0.45 };

export type SizeAdvice = { shape: ArtShape; widthIn: number; heightIn: number; rule: string; limitedByArea: boolean };

function fit(aspect: number, maxWidth: number, maxHeight: number) {
  const byWidth = { widthIn: maxWidth, heightIn: maxWidth / aspect };
  return byWidth.heightIn <= maxHeight ? byWidth : { widthIn: maxHeight * aspect, heightIn: maxHeight };
}

const round8 = (v: number) => Math.floor(v * 8 + 1e-9) / 8;

/** The suggested size for art of this shape and aspect on a location whose print area allows maxWidth × maxHeight. */
export function suggestSize(args: { shape: ArtShape; aspect: number; group: SizeGroup; maxWidthIn: number; maxHeightIn: number }): SizeAdvice {
  const k = GROUP_SCALE[args.group];
  const groupWord = args.group === "adult" ? "an adult front" : `a ${args.group} garment (scaled to ${Math.round(k * 100)}%)`;
  let target: { widthIn: number; heightIn: number };
  let rule: string;
  switch (args.shape) {
    case "wide":
      target = { widthIn: ADULT_TARGETS.wideWidth * k, heightIn: (ADULT_TARGETS.wideWidth * k) / args.aspect };
      rule = `Wide art is sized by its width: about ${round8(ADULT_TARGETS.wideWidth * k)} in on ${groupWord}.`;
      break;
    case "tall": {
      const h = Math.min(ADULT_TARGETS.tallHeight * k, ADULT_TARGETS.tallMaxHeight * k);
      target = { widthIn: h * args.aspect, heightIn: h };
      rule = `Tall art is sized by its height: about ${round8(h)} in on ${groupWord}, never over ${round8(ADULT_TARGETS.tallMaxHeight * k)} in.`;
      break;
    }
    case "emblem":
      target = fit(args.aspect, ADULT_TARGETS.emblemSide * k, ADULT_TARGETS.emblemSide * k);
      rule = `Emblem-like art stays compact: about ${round8(ADULT_TARGETS.emblemSide * k)} in or less on ${groupWord}.`;
      break;
    default:
      target = fit(args.aspect, ADULT_TARGETS.squareSide * k, ADULT_TARGETS.squareSide * k);
      rule = `${args.shape === "round" ? "Round" : "Square"} art sits at about 10 to 11 in across on ${groupWord}; here ${round8(ADULT_TARGETS.squareSide * k)} in.`;
  }
  const limited = target.widthIn > args.maxWidthIn + 1e-9 || target.heightIn > args.maxHeightIn + 1e-9;
  const final = limited ? fit(args.aspect, Math.min(target.widthIn, args.maxWidthIn), Math.min(target.heightIn, args.maxHeightIn)) : target;
  if (limited) rule += ` Reduced to stay inside the print area (${round8(args.maxWidthIn)} × ${round8(args.maxHeightIn)} in).`;
  return { shape: args.shape, widthIn: final.widthIn, heightIn: final.heightIn, rule, limitedByArea: limited };
}

/** The largest size that fits the print area, keeping proportions. */
export function fillPrintArea(args: { aspect: number; maxWidthIn: number; maxHeightIn: number }): { widthIn: number; heightIn: number; rule: string } {
  const f = fit(args.aspect, args.maxWidthIn, args.maxHeightIn);
  const by = f.widthIn >= args.maxWidthIn - 1e-9 ? "width" : "height";
  return { ...f, rule: `Fills the print area by its ${by}: ${args.maxWidthIn.toFixed(2).replace(/\.?0+$/, "")} × ${args.maxHeightIn.toFixed(2).replace(/\.?0+$/, "")} in at most.` };
}
