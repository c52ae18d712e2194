import type { GarmentCategory, GarmentMeasurements, SizeGroup } from "@/lib/garments/types";
import { checkPlacement, type PlacementWarning } from "@/lib/placement/checks";
import type { Placement } from "@/lib/placement/model";
import type { LengthUnit } from "@/lib/units";

type Row = { size: string; group: SizeGroup; measurements: GarmentMeasurements };

/**
 * The checks for every print at the size being looked at, by placement id: what the inspector lists
 * and the canvas marks, computed once so the two always agree.
 */
export function placementWarnings(args: {
  placements: readonly Placement[];
  category: GarmentCategory;
  row: Row;
  /** The size looked at before, for the "no longer fits" note. */
  previous?: Row | undefined;
  unit: LengthUnit;
}): Record<string, PlacementWarning[]> {
  const { row, previous } = args;
  const out: Record<string, PlacementWarning[]> = {};
  for (const p of args.placements) {
    out[p.id] = checkPlacement({
      placement: p,
      category: args.category,
      group: row.group,
      measurements: row.measurements,
      size: row.size,
      unit: args.unit,
      previousSize: previous
        ? { size: previous.size, group: previous.group, measurements: previous.measurements }
        : undefined,
    });
  }
  return out;
}
