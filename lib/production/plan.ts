/**
 * From a proof's placement and a job's size run to the inputs of size-run grading, and from a
 * chosen grading to the print size on every garment size.
 */
import { locationSpec } from "@/lib/garments/locations";
import type { GarmentCategory, GarmentMeasurements, SizeGroup } from "@/lib/garments/types";
import type { Placement } from "@/lib/placement/model";
import type { GradingSize } from "./grading";

export type ChartRow = { size: string; group: SizeGroup; measurements: GarmentMeasurements };

/**
 * Allowed width = the widest print that stays inside that size's print area (its maximum width,
 * and its maximum height at the art's proportions) and clear of the side seams.
 * Ideal width = the designed width, scaled by how the location's typical width for that size
 * compares with the size it was designed on, and never above the allowed width.
 */
export function gradingSizes(args: { category: GarmentCategory; chart: ChartRow[]; sizeRun: Array<{ size: string; quantity: number }>; placement: Placement; designedOn: string }): { sizes: GradingSize[]; missing: string[]; noRoom: string[] } {
  const base = args.chart.find((r) => r.size === args.designedOn) ?? args.chart[0]!;
  const baseSpec = locationSpec({ location: args.placement.location, category: args.category, group: base.group, measurements: base.measurements });
  const sizes: GradingSize[] = [];
  const missing: string[] = [];
  // Sizes whose chart leaves this location no room at all: grading needs an allowance above 0.
  const noRoom: string[] = [];
  for (const entry of args.sizeRun) {
    const row = args.chart.find((r) => r.size === entry.size);
    if (!row) {
      missing.push(entry.size);
      continue;
    }
    const spec = locationSpec({ location: args.placement.location, category: args.category, group: row.group, measurements: row.measurements });
    const ratio = baseSpec.typicalWidth > 0 ? spec.typicalWidth / baseSpec.typicalWidth : 1;
    const aspect = args.placement.widthIn / args.placement.heightIn;
    const allowed = Math.max(0, Math.min(spec.maxWidth, spec.maxHeight * aspect));
    if (!(allowed > 0)) {
      noRoom.push(entry.size);
      continue;
    }
    sizes.push({ size: entry.size, quantity: entry.quantity, allowedWidthIn: allowed, idealWidthIn: Math.min(allowed, args.placement.widthIn * ratio) });
  }
  return { sizes, missing, noRoom };
}

export type SizePrint = { size: string; quantity: number; widthIn: number; heightIn: number; belowCollarIn: number; offsetFromCenterIn: number; transfer: string };

/** Print size on every size, with transfer names T1, T2… from narrowest to widest. */
export function printsPerSize(args: { placement: Placement; sizeRun: Array<{ size: string; quantity: number }>; assignment: Record<string, number> | null }): SizePrint[] {
  const aspect = args.placement.widthIn / args.placement.heightIn;
  const widths = [...new Set(Object.values(args.assignment ?? {}))].sort((a, b) => a - b);
  return args.sizeRun.map((entry) => {
    const widthIn = args.assignment?.[entry.size] ?? args.placement.widthIn;
    const index = widths.indexOf(widthIn);
    return {
      size: entry.size,
      quantity: entry.quantity,
      widthIn,
      heightIn: widthIn / aspect,
      belowCollarIn: args.placement.belowCollarIn,
      offsetFromCenterIn: args.placement.offsetFromCenterIn,
      transfer: index >= 0 ? `T${index + 1} · ${widthIn.toFixed(2)} in` : `As designed · ${widthIn.toFixed(2)} in`,
    };
  });
}
