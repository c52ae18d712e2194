/**
 * The print plan: for one print (a placement on a proof) and one job's size run, what goes on
 * every garment size. Width, height, distance from the collar (or the bag's top edge), distance
 * from centre, which transfer or screen it uses, how many to make with spares, and the checks.
 *
 * Every production surface reads this and nothing else: the production page's size-run view,
 * the spec sheet, the paper test print and the gang sheet. So their numbers cannot disagree.
 *
 * Sizes are of the art's ink (the trimmed art), never of an empty canvas around it.
 */
import { locationSpec, sideOf } from "@/lib/garments/locations";
import type { GarmentCategory, GarmentSide, SizeRow } from "@/lib/garments/types";
import type { DecorationMethod } from "@/lib/jobs";
import { FIT_CODES, checkPlacement, type PlacementWarning } from "@/lib/placement/checks";
import type { Placement } from "@/lib/placement/model";
import { EIGHTH_IN, formatLength, type LengthUnit } from "@/lib/units";
import { gradeSizeRun, type GradingResult } from "./grading";
import { gradingSizes } from "./plan";

/** What a method needs made per size: screens and film positives, transfers (and gang sheets), or nothing between file and garment. */
export type PrintTools = "screens" | "transfers" | "direct";

export function toolsFor(method: DecorationMethod): PrintTools {
  if (method === "screen-print") return "screens";
  if (method === "dtg") return "direct";
  return "transfers";
}

/** Whether the method presses a made piece (so a gang sheet applies). */
export const usesGangSheets = (method: DecorationMethod): boolean => toolsFor(method) === "transfers";

/**
 * Film positive margin on every side of the art, inches: room for registration marks and tape
 * around the image on a screen-print film (common practice, no published source; from memory).
 */
export const FILM_MARGIN_IN = 1;

/** Widths chosen by grading are rounded down to this step, the precision the plan shows (1/8 in). */
export const PLAN_STEP_IN = EIGHTH_IN;

/** Spares for one size: ceil(quantity × percent), with slack so 1000 × 0.7 % is still 7. */
export function sparesFor(quantity: number, sparePercent: number): number {
  if (!(quantity > 0) || !(sparePercent > 0)) return 0;
  return Math.ceil((quantity * sparePercent) / 100 - 1e-9);
}

export const floorToStep = (value: number, step: number = PLAN_STEP_IN): number => Math.floor(value / step + 1e-9) * step;

export interface PlanSize {
  size: string;
  quantity: number;
  spares: number;
  /** quantity + spares: the pieces (transfers) or prints to make. */
  toMake: number;
  /** Ink width and height on this size, inches. */
  widthIn: number;
  heightIn: number;
  /** Top of the ink below the collar seam at centre (or below the bag's top edge), inches. */
  topIn: number;
  /** Centre of the ink from the garment's centre line, inches (+ to the wearer's left on the front view). */
  fromCentreIn: number;
  /** T1, T2… (transfers or direct prints) or S1, S2… (screens), narrowest first. */
  group: string;
  /** The print area on this size, inches. */
  printArea: { widthIn: number; heightIn: number };
  /** Fit problems at this size (over the print area, too close to a seam, …); empty when it fits. */
  checks: PlacementWarning[];
  /** Width the suggested grading would give this size, when it differs from widthIn. */
  suggestedWidthIn: number | null;
}

export interface PlanGroup {
  name: string;
  widthIn: number;
  heightIn: number;
  sizes: string[];
  quantity: number;
  toMake: number;
  /** Screen print: the film positive for this screen size, art plus FILM_MARGIN_IN each side. */
  film: { widthIn: number; heightIn: number } | null;
}

export interface PrintPlan {
  placementId: string;
  location: Placement["location"];
  side: GarmentSide;
  /** What topIn is measured from. */
  topFrom: "collar" | "top edge";
  tools: PrintTools;
  /** "graded": a saved grading sets the widths; "designed": every size gets the width it was designed at. */
  basis: "graded" | "designed";
  designedOn: string;
  sparePercent: number;
  sizes: PlanSize[];
  groups: PlanGroup[];
  /** Sizes in the run that are not on the blank's chart. */
  missing: string[];
  /** Sizes whose chart leaves this location no room. */
  noRoom: string[];
  /** The grading the plan suggests (widths rounded down to 1/8 in), or null when no size can take the print. */
  suggestion: GradingResult | null;
  /** True when the saved (or designed) widths differ from the suggestion. */
  suggestionDiffers: boolean;
}

export interface PrintPlanInput {
  method: DecorationMethod;
  category: GarmentCategory;
  chart: readonly SizeRow[];
  sizeRun: ReadonlyArray<{ size: string; quantity: number }>;
  placement: Placement;
  /** The size the proof was designed on. */
  designedOn: string;
  /** The grading saved for this print, if any. */
  saved: { transferCount: number; assignment: Record<string, number> } | null;
  /** How many widths the suggestion may use; defaults to the saved count, else 2. */
  transferCount?: number;
  sparePercent: number;
}

/** The print on one size at a given ink width: top-aligned prints keep their top, centred ones their centre. */
function sizedPlacement(placement: Placement, widthIn: number, middleAligned: boolean): Placement {
  const heightIn = widthIn / (placement.widthIn / placement.heightIn);
  const belowCollarIn = middleAligned ? placement.belowCollarIn + (placement.heightIn - heightIn) / 2 : placement.belowCollarIn;
  return { ...placement, widthIn, heightIn, belowCollarIn };
}

function fitChecks(placement: Placement, category: GarmentCategory, row: SizeRow): PlacementWarning[] {
  return checkPlacement({ placement, category, group: row.group, measurements: row.measurements, size: row.size }).filter((w) => FIT_CODES.has(w.code) && w.severity !== "info");
}

/**
 * The widest ink, on the 1/8 in grid, that passes every fit check at this size where the print
 * actually sits (its own top and offset, not the location's usual ones). Searches down from the
 * print area's bound; 0 when not even 1/8 in fits there.
 */
export function widestFit(placement: Placement, category: GarmentCategory, row: SizeRow, boundIn: number, middleAligned: boolean): number {
  const fits = (steps: number) => steps > 0 && fitChecks(sizedPlacement(placement, steps * PLAN_STEP_IN, middleAligned), category, row).length === 0;
  let hi = Math.floor(boundIn / PLAN_STEP_IN + 1e-9);
  if (hi <= 0) return 0;
  if (fits(hi)) return hi * PLAN_STEP_IN;
  // Bigger art only adds problems, so the fitting widths are a run from 1/8 in up: bisect its end.
  let lo = 0;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (fits(mid)) lo = mid;
    else hi = mid;
  }
  return lo * PLAN_STEP_IN;
}

/**
 * The suggested grading. Each size's allowance is the widest ink that passes every fit check
 * where the print sits (widestFit), so a suggested width is never flagged; widths are on the
 * 1/8 in grid the plan shows.
 */
export function suggestGrading(input: Pick<PrintPlanInput, "category" | "chart" | "sizeRun" | "placement" | "designedOn">, transferCount: number): { suggestion: GradingResult | null; missing: string[]; noRoom: string[] } {
  const { sizes, missing, noRoom } = gradingSizes({ ...input, chart: [...input.chart], sizeRun: [...input.sizeRun] });
  const middle = isMiddleAligned(input.placement, input.category, input.chart);
  const usable = [];
  for (const s of sizes) {
    const row = input.chart.find((r) => r.size === s.size)!;
    const allowedWidthIn = widestFit(input.placement, input.category, row, s.allowedWidthIn, middle);
    if (allowedWidthIn <= 0) noRoom.push(s.size);
    else usable.push({ ...s, allowedWidthIn, idealWidthIn: Math.min(s.idealWidthIn, allowedWidthIn) });
  }
  if (!usable.length) return { suggestion: null, missing, noRoom };
  const raw = gradeSizeRun(usable, transferCount);
  // Nothing ordered yet: no width to suggest.
  if (!raw.groups.length) return { suggestion: null, missing, noRoom };
  // The chosen widths are allowances (on the grid) or ideals: round down so none passes an allowance.
  const assignment: Record<string, number> = {};
  // Never below 1/8 in: every usable size's allowance is at least that, so it still fits.
  const onGrid = (w: number) => Math.max(PLAN_STEP_IN, floorToStep(w));
  for (const [size, width] of Object.entries(raw.assignment)) assignment[size] = onGrid(width);
  // A size not ordered now that no chosen width fits gets its own fitting width, so a reorder is never flagged.
  for (const s of usable) if (assignment[s.size] === undefined) assignment[s.size] = onGrid(s.idealWidthIn);
  const groups = raw.groups.map((g) => ({ ...g, widthIn: onGrid(g.widthIn) }));
  // Rounding down to the grid can leave an ordered size a little further from its ideal.
  let largestShortIn = 0;
  for (const s of usable) if (s.quantity > 0 && assignment[s.size] !== undefined) largestShortIn = Math.max(largestShortIn, s.idealWidthIn - assignment[s.size]!);
  return { suggestion: { ...raw, groups, assignment, largestShortIn }, missing, noRoom };
}

function isMiddleAligned(placement: Placement, category: GarmentCategory, chart: readonly SizeRow[]): boolean {
  const first = chart[0];
  if (!first) return false;
  return locationSpec({ location: placement.location, category, group: first.group, measurements: first.measurements }).verticalAlign === "middle";
}

const same = (a: number, b: number) => Math.abs(a - b) < 1e-9;

export function printPlan(input: PrintPlanInput): PrintPlan {
  const { placement, category, chart, method } = input;
  const tools = toolsFor(method);
  const aspect = placement.widthIn / placement.heightIn;
  const transferCount = input.transferCount ?? input.saved?.transferCount ?? 2;
  const { suggestion, missing, noRoom } = suggestGrading(input, transferCount);
  const basis: PrintPlan["basis"] = input.saved && Object.keys(input.saved.assignment).length ? "graded" : "designed";
  const middleAligned = isMiddleAligned(placement, category, chart);

  const rows: Array<Omit<PlanSize, "group">> = [];
  for (const entry of input.sizeRun) {
    const row = chart.find((r) => r.size === entry.size);
    if (!row || noRoom.includes(entry.size)) continue;
    const spec = locationSpec({ location: placement.location, category, group: row.group, measurements: row.measurements });
    const widthIn = basis === "graded" ? (input.saved!.assignment[entry.size] ?? placement.widthIn) : placement.widthIn;
    // Top-aligned prints keep their top edge; centred ones (sleeves, pouch, tote) keep their centre.
    const sized = sizedPlacement(placement, widthIn, middleAligned);
    const heightIn = sized.heightIn;
    const topIn = sized.belowCollarIn;
    const checks = fitChecks(sized, category, row);
    const suggested = suggestion?.assignment[entry.size];
    const spares = sparesFor(entry.quantity, input.sparePercent);
    rows.push({
      size: entry.size,
      quantity: entry.quantity,
      spares,
      toMake: entry.quantity + spares,
      widthIn,
      heightIn,
      topIn,
      fromCentreIn: placement.offsetFromCenterIn,
      printArea: { widthIn: spec.printArea.width, heightIn: spec.printArea.height },
      checks,
      suggestedWidthIn: suggested !== undefined && !same(suggested, widthIn) ? suggested : null,
    });
  }

  const widths = [...new Set(rows.map((r) => r.widthIn))].sort((a, b) => a - b);
  const prefix = tools === "screens" ? "S" : "T";
  const sizes: PlanSize[] = rows.map((r) => ({ ...r, group: `${prefix}${widths.indexOf(r.widthIn) + 1}` }));
  const groups: PlanGroup[] = widths.map((widthIn, i) => {
    const members = sizes.filter((s) => same(s.widthIn, widthIn));
    const heightIn = widthIn / aspect;
    return {
      name: `${prefix}${i + 1}`,
      widthIn,
      heightIn,
      sizes: members.map((m) => m.size),
      quantity: members.reduce((n, m) => n + m.quantity, 0),
      toMake: members.reduce((n, m) => n + m.toMake, 0),
      film: tools === "screens" ? { widthIn: widthIn + 2 * FILM_MARGIN_IN, heightIn: heightIn + 2 * FILM_MARGIN_IN } : null,
    };
  });
  const suggestionDiffers = !!suggestion && sizes.some((s) => s.suggestedWidthIn !== null);
  return {
    placementId: placement.id,
    location: placement.location,
    side: sideOf(placement.location),
    topFrom: category === "tote" ? "top edge" : "collar",
    tools,
    basis,
    designedOn: input.designedOn,
    sparePercent: input.sparePercent,
    sizes,
    groups,
    missing,
    noRoom,
    suggestion,
    suggestionDiffers,
  };
}

/** One size's print, for a test print: from the plan when the size is in the run, else planned alone. */
export function planForSize(input: PrintPlanInput, plan: PrintPlan, size: string): PlanSize | undefined {
  const inRun = plan.sizes.find((s) => s.size === size);
  if (inRun) return inRun;
  const saved = plan.basis === "graded" ? input.saved : null;
  return printPlan({ ...input, saved, sizeRun: [{ size, quantity: 0 }] }).sizes[0];
}

/** The plan with the suggested grading applied (what "apply the suggestion" saves). */
export function planWithSuggestion(input: PrintPlanInput): PrintPlan {
  const first = printPlan(input);
  if (!first.suggestion) return first;
  return printPlan({ ...input, saved: { transferCount: input.transferCount ?? input.saved?.transferCount ?? 2, assignment: first.suggestion.assignment } });
}

/** One size's numbers as every output prints them, so a page and a file can only say the same thing. */
export function planSizeText(plan: Pick<PrintPlan, "topFrom">, s: PlanSize, unit: LengthUnit = "in") {
  const f = (v: number) => formatLength(v, unit);
  return {
    size: s.size,
    count: s.spares > 0 ? `${s.quantity} + ${s.spares} spare${s.spares === 1 ? "" : "s"}` : String(s.quantity),
    ink: `${f(s.widthIn)} × ${f(s.heightIn)}`,
    top: `${f(s.topIn)} below ${plan.topFrom === "collar" ? "collar" : "top edge"}`,
    fromCentre: Math.abs(s.fromCentreIn) < 1e-9 ? "centred" : `${f(Math.abs(s.fromCentreIn))} ${s.fromCentreIn > 0 ? "right" : "left"} of centre, as seen`,
    group: s.group,
    checks: s.checks.map((c) => c.message),
  };
}

/** Pieces for the gang sheet: one item per print and transfer width, with spares already counted. */
export function gangItems(plans: ReadonlyArray<{ plan: PrintPlan; artworkId: string }>): Array<{ id: string; artworkId: string; widthIn: number; heightIn: number; quantity: number; label: string }> {
  const items: Array<{ id: string; artworkId: string; widthIn: number; heightIn: number; quantity: number; label: string }> = [];
  for (const { plan, artworkId } of plans) {
    if (plan.tools !== "transfers") continue;
    for (const g of plan.groups) {
      if (g.toMake <= 0) continue;
      items.push({ id: `${plan.placementId}@${g.name}`, artworkId, widthIn: g.widthIn, heightIn: g.heightIn, quantity: g.toMake, label: `${g.name} · ${g.sizes.join(", ")}` });
    }
  }
  return items;
}

/**
 * A heading from parts that never says a word twice: a part repeating a word keeps only its new
 * words, and a part left with nothing but "view" or "side" is dropped. "Full front" + "front view" +
 * "Team tee" gives "Full front · Team tee"; "Left sleeve" + "front view" gives
 * "Left sleeve · front view".
 */
/**
 * The suggestion's cost in plain words: how far the furthest ordered size prints from its best
 * width, rounded up to the 1/8 in the plan works in, so "within 1/8 in" is never an understatement.
 */
export function gradingGapText(largestShortIn: number): string {
  const gap = Math.ceil(largestShortIn / PLAN_STEP_IN - 1e-6) * PLAN_STEP_IN;
  if (gap <= 0) return "every size prints at its best print size";
  return `every size prints within ${formatLength(gap, "in")} of its best print size`;
}

export function printHeading(parts: ReadonlyArray<string | null | undefined>): string {
  const seen = new Set<string>();
  const out: string[] = [];
  for (const part of parts) {
    const text = (part ?? "").trim();
    if (!text) continue;
    const words = text.split(/\s+/);
    const fresh = words.filter((w) => !seen.has(w.toLowerCase()));
    // A part whose key word is already said ("front view" after "Full front") adds nothing.
    const keep = fresh.length === words.length ? text : fresh.length && fresh.some((w) => !["view", "side"].includes(w.toLowerCase())) ? fresh.join(" ") : "";
    for (const w of words) seen.add(w.toLowerCase());
    if (keep) out.push(keep);
  }
  return out.join(" · ");
}
