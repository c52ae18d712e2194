/**
 * The starting state of a new proof, worked out from its job: the job's blank and colour, the size
 * in the middle of the size run, and one placement per print location at that location's usual
 * size and spot. Pure: the caller reads the job, blank and art, and stores what this returns.
 */
import { LOCATION_LABELS, locationSpec, locationsFor, type PrintLocation } from "@/lib/garments/locations";
import { CATEGORY_INFO, type GarmentCategory, type GarmentMeasurements, type SizeGroup } from "@/lib/garments/types";
import { defaultPlacement, type Placement } from "@/lib/placement/model";

export type PlanBlank = {
  id: string;
  name: string;
  category: GarmentCategory;
  colours: ReadonlyArray<{ name: string; hex: string }>;
  sizeChart: ReadonlyArray<{ size: string; group: SizeGroup; measurements: GarmentMeasurements }>;
};

export type PlanArt = { id: string; inkWidthPx: number; inkHeightPx: number };

export type NewProofInput = {
  blank: PlanBlank;
  /** The colour asked for (by name); the job's colour when the maker kept it. */
  colourName: string | null;
  sizeRun: ReadonlyArray<{ size: string; quantity: number }>;
  locations: ReadonlyArray<{ location: string }>;
  /** Art for each location (null: none yet); a location without an entry gets the first art given. */
  art: ReadonlyArray<{ location: string; artwork: PlanArt | null }>;
  /** Makes placement ids (random in the product, fixed in tests). */
  newId: (location: PrintLocation, index: number) => string;
};

export type NewProofPlan = {
  size: string;
  colourName: string;
  colourHex: string;
  placements: Placement[];
  /** Plain-words notes on what could not be carried over from the job (a location this garment lacks). */
  notes: string[];
};

/**
 * The size that holds the middle garment of the run, counting pieces in the blank's own size order
 * (a run of 2 S, 10 M and 8 L starts at M). Sizes the blank does not have are passed over; with no
 * usable run, the middle of the blank's chart.
 */
export function middleSize(chart: ReadonlyArray<{ size: string }>, sizeRun: ReadonlyArray<{ size: string; quantity: number }>): string {
  if (chart.length === 0) throw new RangeError("This blank has no sizes in its chart.");
  const order = new Map(chart.map((row, i) => [row.size, i]));
  const run = sizeRun.filter((r) => r.quantity > 0 && order.has(r.size)).sort((a, b) => order.get(a.size)! - order.get(b.size)!);
  const total = run.reduce((sum, r) => sum + r.quantity, 0);
  if (total === 0) return chart[Math.floor((chart.length - 1) / 2)]!.size;
  // The piece at position ceil(total / 2), counting from 1: the lower middle for an even count.
  const middle = Math.ceil(total / 2);
  let seen = 0;
  for (const r of run) {
    seen += r.quantity;
    if (seen >= middle) return r.size;
  }
  return run[run.length - 1]!.size;
}

/** The colour by name (any case), or the blank's first colour. */
export function pickColour(blank: PlanBlank, name: string | null): { name: string; hex: string; matched: boolean } {
  const wanted = name?.trim().toLowerCase();
  const found = wanted ? blank.colours.find((c) => c.name.toLowerCase() === wanted) : undefined;
  if (found) return { name: found.name, hex: found.hex, matched: true };
  const first = blank.colours[0];
  if (!first) throw new RangeError(`${blank.name} has no colours to choose from.`);
  return { name: first.name, hex: first.hex, matched: false };
}

export function planNewProof(input: NewProofInput): NewProofPlan {
  const { blank } = input;
  const notes: string[] = [];
  const size = middleSize(blank.sizeChart, input.sizeRun);
  const row = blank.sizeChart.find((r) => r.size === size)!;
  const colour = pickColour(blank, input.colourName);
  if (input.colourName && !colour.matched) notes.push(`${blank.name} does not come in ${input.colourName}; the proof starts in ${colour.name}.`);

  const offered = locationsFor(blank.category);
  const fallbackArt = input.art.find((a) => a.artwork)?.artwork ?? null;
  const placements: Placement[] = [];
  const seen = new Set<string>();
  for (const { location } of input.locations) {
    if (seen.has(location)) continue;
    seen.add(location);
    if (!(offered as readonly string[]).includes(location)) {
      const label = (LOCATION_LABELS as Record<string, string>)[location] ?? location;
      notes.push(`A ${CATEGORY_INFO[blank.category].label.toLowerCase()} has no ${label.toLowerCase()} print location, so it was left off.`);
      continue;
    }
    const loc = location as PrintLocation;
    const chosen = input.art.find((a) => a.location === location);
    const art = chosen ? chosen.artwork : fallbackArt;
    const spec = locationSpec({ location: loc, category: blank.category, group: row.group, measurements: row.measurements });
    // Art keeps its own proportions inside the location's usual box; without art, the box itself.
    const aspect = art && art.inkWidthPx > 0 && art.inkHeightPx > 0 ? art.inkWidthPx / art.inkHeightPx : spec.typicalWidth / spec.typicalHeight;
    const placement = defaultPlacement(spec, aspect, input.newId(loc, placements.length));
    placements.push({ ...placement, artworkId: art?.id ?? null });
  }
  return { size, colourName: colour.name, colourHex: colour.hex, placements, notes };
}

/** A free proof name for a job: the wanted one, or the same with " 2", " 3"… after it. */
export function uniqueProofName(wanted: string, taken: ReadonlyArray<string>): string {
  const base = wanted.trim() || "Proof";
  const used = new Set(taken.map((t) => t.toLowerCase()));
  if (!used.has(base.toLowerCase())) return base;
  for (let n = 2; ; n += 1) {
    const candidate = `${base} ${n}`;
    if (!used.has(candidate.toLowerCase())) return candidate;
  }
}
