
/** Garment kinds the editor can draw. */
export const GARMENT_CATEGORIES = [
  "unisex-tee",
  "youth-tee",
  "fitted-tee",
  "long-sleeve-tee",
  "crewneck",
  "hoodie",
  "tank",
  "tote",
  "infant-bodysuit",
] as const;
export type GarmentCategory = (typeof GARMENT_CATEGORIES)[number];

export const SIZE_GROUPS = ["adult", "youth", "toddler", "infant"] as const;
export type SizeGroup = (typeof SIZE_GROUPS)[number];

export const GARMENT_SIDES = ["front", "back"] as const;
export type GarmentSide = (typeof GARMENT_SIDES)[number];

/**
 * Flat measurements of one size, in inches, as a size chart lists them.
 * - chestWidth: flat across, 1 in below the underarm.
 * - bodyLength: from the high point of the shoulder (HPS) straight down to the hem
 *   (for a bodysuit, to the bottom of the snap tab).
 * - shoulderWidth: shoulder point to shoulder point (for a tank, outer strap edge to outer strap edge).
 * - sleeveLength: shoulder point to cuff along the top of the sleeve; 0 for sleeveless.
 * - neckWidth: seam to seam at the HPS.
 * - frontNeckDrop / backNeckDrop: from the line between the HPS points down to the collar seam at center.
 */
export interface ApparelMeasurements {
  chestWidth: number;
  bodyLength: number;
  shoulderWidth: number;
  sleeveLength: number;
  neckWidth: number;
  frontNeckDrop: number;
  backNeckDrop: number;
}

/** Flat tote measurements, in inches. Height is from the bag's top edge to its bottom fold. */
export interface ToteMeasurements {
  width: number;
  height: number;
  handleLength: number;
  handleWidth: number;
  /** Bottom gusset depth; 0 for a flat bag. Half of it folds under the front face. */
  gusset: number;
}

export type GarmentMeasurements = ApparelMeasurements | ToteMeasurements;

export interface SizeRow<M extends GarmentMeasurements = GarmentMeasurements> {
  size: string;
  group: SizeGroup;
  measurements: M;
}

export interface Point {
  x: number;
  y: number;
}

export interface Rect {
  x: number;
  y: number;
  width: number;
  height: number;
}

export function isToteMeasurements(m: GarmentMeasurements): m is ToteMeasurements {
  return "handleLength" in m;
}

export function isApparelMeasurements(m: GarmentMeasurements): m is ApparelMeasurements {
  return "chestWidth" in m;
}

export interface CategoryInfo {
  /** Label shown in the UI. */
  label: string;
  hasSleeves: boolean;
  longSleeves: boolean;
  hasHood: boolean;
  hasPouch: boolean;
  isTote: boolean;
  /** Ribbed band at the hem and cuffs. */
  hasRibBands: boolean;
  /** Snap tab and leg openings at the bottom. */
  hasSnapTab: boolean;
}

export const CATEGORY_INFO: Readonly<Record<GarmentCategory, CategoryInfo>> = {
  "unisex-tee": {
    label: "Unisex tee",
    hasSleeves: true,
    longSleeves: false,
    hasHood: false,
    hasPouch: false,
    isTote: false,
    hasRibBands: false,
    hasSnapTab: false,
  },
  "youth-tee": {
    label: "Youth & toddler tee",
    hasSleeves: true,
    longSleeves: false,
    hasHood: false,
    hasPouch: false,
    isTote: false,
    hasRibBands: false,
    hasSnapTab: false,
  },
  "fitted-tee": {
    label: "Fitted tee",
    hasSleeves: true,
    longSleeves: false,
    hasHood: false,
    hasPouch: false,
    isTote: false,
    hasRibBands: false,
    hasSnapTab: false,
  },
  "long-sleeve-tee": {
    label: "Long-sleeve tee",
    hasSleeves: true,
    longSleeves: true,
    hasHood: false,
    hasPouch: false,
    isTote: false,
    hasRibBands: false,
    hasSnapTab: false,
  },
  crewneck: {
    label: "Crewneck sweatshirt",
    hasSleeves: true,
    longSleeves: true,
    hasHood: false,
    hasPouch: false,
    isTote: false,
    hasRibBands: true,
    hasSnapTab: false,
  },
  hoodie: {
    label: "Pullover hoodie",
    hasSleeves: true,
    longSleeves: true,
    hasHood: true,
    hasPouch: true,
    isTote: false,
    hasRibBands: true,
    hasSnapTab: false,
  },
  tank: {
    label: "Tank",
    hasSleeves: false,
    longSleeves: false,
    hasHood: false,
    hasPouch: false,
    isTote: false,
    hasRibBands: false,
    hasSnapTab: false,
  },
  tote: {
    label: "Tote bag",
    hasSleeves: false,
    longSleeves: false,
    hasHood: false,
    hasPouch: false,
    isTote: true,
    hasRibBands: false,
    hasSnapTab: false,
  },
  "infant-bodysuit": {
    label: "Infant bodysuit",
    hasSleeves: true,
    longSleeves: false,
    hasHood: false,
    hasPouch: false,
    isTote: false,
    hasRibBands: false,
    hasSnapTab: true,
  },
};

// Upper limits below are sanity bounds of our own choosing (no published source): comfortably
// above the largest blanks on the market, low enough to catch a typo such as 200 for 20.
