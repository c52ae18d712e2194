import {
  CATEGORY_INFO,
  type ApparelMeasurements,
  type GarmentCategory,
  type SizeGroup,
  type ToteMeasurements,
} from "@/lib/garments/types";

/** One measurement column of a size chart, in the order a chart reads. */
export interface ChartColumn {
  key: keyof ApparelMeasurements | keyof ToteMeasurements;
  label: string;
  /** How the measurement is taken, shown under the heading. */
  hint?: string;
  /** One sentence on how to take it from a garment laid flat. */
  how: string;
}

export const APPAREL_COLUMNS: readonly ChartColumn[] = [
  {
    key: "chestWidth",
    label: "Chest width",
    hint: "1 in below armhole",
    how: "Straight across the body, 1 in below the armholes.",
  },
  {
    key: "bodyLength",
    label: "Body length",
    hint: "from high point of shoulder",
    how: "From the high point of the shoulder, where the shoulder seam meets the collar, straight down to the hem.",
  },
  {
    key: "shoulderWidth",
    label: "Shoulder width",
    how: "Shoulder point to shoulder point; on a tank, outer strap edge to outer strap edge.",
  },
  {
    key: "sleeveLength",
    label: "Sleeve length",
    how: "Shoulder point to cuff along the top of the sleeve; 0 when sleeveless.",
  },
  {
    key: "neckWidth",
    label: "Neck width",
    how: "Collar seam to collar seam at the high points of the shoulder.",
  },
  {
    key: "frontNeckDrop",
    label: "Front neck drop",
    how: "From the line between the high points down to the front collar seam at centre.",
  },
  {
    key: "backNeckDrop",
    label: "Back neck drop",
    how: "From the line between the high points down to the back collar seam at centre.",
  },
];

export const TOTE_COLUMNS: readonly ChartColumn[] = [
  { key: "width", label: "Width", how: "Side edge to side edge across the bag, laid flat." },
  {
    key: "height",
    label: "Height",
    hint: "top edge to bottom fold",
    how: "From the top edge down to the bottom fold.",
  },
  {
    key: "handleLength",
    label: "Handle length",
    how: "The whole strap, including the ends stitched inside the top hem.",
  },
  { key: "handleWidth", label: "Handle width", how: "Across one strap." },
  {
    key: "gusset",
    label: "Gusset",
    hint: "0 for a flat bag",
    how: "Depth of the bottom panel when opened out; 0 for a flat bag.",
  },
];

export function columnsFor(category: GarmentCategory): readonly ChartColumn[] {
  return CATEGORY_INFO[category].isTote ? TOTE_COLUMNS : APPAREL_COLUMNS;
}

export const SIZE_GROUP_LABELS: Record<SizeGroup, string> = {
  adult: "Adult",
  youth: "Youth",
  toddler: "Toddler",
  infant: "Infant",
};

/** "XS–4XL" for a run of sizes, "One size" or the single size name for one row. */
export function sizeRange(sizes: readonly { size: string }[]): string {
  const first = sizes[0]?.size;
  const last = sizes[sizes.length - 1]?.size;
  if (!first || !last) return "No sizes";
  return first === last ? first : `${first}–${last}`;
}

/** The size a thumbnail shows: M when the run has one, otherwise the middle of the run. */
export function middleSizeIndex(sizes: readonly { size: string }[]): number {
  const m = sizes.findIndex((row) => row.size.trim().toUpperCase() === "M");
  return m >= 0 ? m : Math.max(0, Math.floor((sizes.length - 1) / 2));
}
