/** The public JSON shape of a proof, with computed warnings. Pure: takes loaded rows, returns plain data. */
import { CATEGORY_INFO, type GarmentCategory, type GarmentMeasurements, type SizeGroup } from "@/lib/garments/types";
import { checkPlacement, type PlacementWarning } from "@/lib/placement/checks";
import type { Placement } from "@/lib/placement/model";

export type SizeChartRow = { size: string; group: SizeGroup; measurements: GarmentMeasurements };

export function warningsFor(args: { placement: Placement; category: GarmentCategory; sizeChart: SizeChartRow[]; size: string }): PlacementWarning[] {
  const row = args.sizeChart.find((r) => r.size === args.size);
  if (!row) return [{ code: "invalid-placement", severity: "error", message: `Size ${args.size} is not in this blank's size chart.` }];
  return checkPlacement({ placement: args.placement, category: args.category, group: row.group, measurements: row.measurements, size: row.size });
}

export function proofToJson(source: {
  proof: { id: string; name: string; revision: string; version: number; size: string; colourName: string; colourHex: string; updatedAt: Date };
  job: { id: string; title: string; clientName: string; method: string };
  blank: { id: string; name: string; category: GarmentCategory; sizeChart: SizeChartRow[] };
  placements: Placement[];
}) {
  const { proof, blank } = source;
  return {
    id: proof.id,
    name: proof.name,
    revision: proof.revision,
    version: proof.version,
    updatedAt: proof.updatedAt.toISOString(),
    job: { id: source.job.id, title: source.job.title, client: source.job.clientName, method: source.job.method },
    garment: {
      blankId: blank.id,
      style: blank.name,
      category: blank.category,
      categoryLabel: CATEGORY_INFO[blank.category].label,
      colour: { name: proof.colourName, hex: proof.colourHex },
      size: proof.size,
      sizes: blank.sizeChart.map((r) => r.size),
    },
    placements: source.placements.map((p) => ({
      id: p.id,
      location: p.location,
      artworkId: p.artworkId,
      widthIn: p.widthIn,
      heightIn: p.heightIn,
      offsetFromCenterIn: p.offsetFromCenterIn,
      belowCollarIn: p.belowCollarIn,
      rotationDeg: p.rotationDeg,
      warnings: warningsFor({ placement: p, category: blank.category, sizeChart: blank.sizeChart, size: proof.size }).map((w) => ({
        code: w.code,
        message: w.message,
        severity: w.severity,
      })),
    })),
  };
}

export type ProofJson = ReturnType<typeof proofToJson>;
