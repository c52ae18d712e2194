import { z } from "zod";

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

function inchesField(label: string, max: number) {
  return z
    .number({ error: `${label} must be a number of inches.` })
    .refine(Number.isFinite, { message: `${label} must be a finite number.` })
    .refine((v) => v > 0, { message: `${label} must be more than 0 in.` })
    .refine((v) => v <= max, { message: `${label} can't be more than ${max} in.` });
}

export const apparelMeasurementsSchema = z
  .object({
    chestWidth: inchesField("Chest width", 60),
    bodyLength: inchesField("Body length", 60),
    shoulderWidth: inchesField("Shoulder width", 60),
    sleeveLength: z
      .number({ error: "Sleeve length must be a number of inches." })
      .refine(Number.isFinite, { message: "Sleeve length must be a finite number." })
      .refine((v) => v >= 0, { message: "Sleeve length can't be negative; use 0 for sleeveless." })
      .refine((v) => v <= 40, { message: "Sleeve length can't be more than 40 in." }),
    neckWidth: inchesField("Neck width", 20),
    frontNeckDrop: inchesField("Front neck drop", 15),
    backNeckDrop: inchesField("Back neck drop", 10),
  })
  .refine((m) => m.frontNeckDrop < m.bodyLength, {
    message: "Front neck drop must be less than body length.",
    path: ["frontNeckDrop"],
  })
  .refine((m) => m.backNeckDrop < m.bodyLength, {
    message: "Back neck drop must be less than body length.",
    path: ["backNeckDrop"],
  })
  .refine((m) => m.neckWidth < m.shoulderWidth, {
    message: "Neck width must be less than shoulder width.",
    path: ["neckWidth"],
  })
  .refine((m) => m.neckWidth < m.chestWidth, {
    message: "Neck width must be less than chest width.",
    path: ["neckWidth"],
  })
  // A body shorter than half its chest width is not a garment shape we can draw (our own bound).
  .refine((m) => m.bodyLength >= m.chestWidth / 2, {
    message: "Body length must be at least half the chest width.",
    path: ["bodyLength"],
  });

/** Same as the apparel schema, plus: sleeved garments need a sleeve length, sleeveless ones must have 0. */
export function apparelMeasurementsSchemaFor(category: GarmentCategory) {
  const info = CATEGORY_INFO[category];
  return apparelMeasurementsSchema.refine(
    (m) => (info.hasSleeves ? m.sleeveLength > 0 : m.sleeveLength === 0),
    {
      message: info.hasSleeves
        ? `A ${info.label.toLowerCase()} needs a sleeve length of more than 0 in.`
        : `A ${info.label.toLowerCase()} has no sleeves; set sleeve length to 0.`,
      path: ["sleeveLength"],
    },
  );
}

export const toteMeasurementsSchema = z
  .object({
    width: inchesField("Bag width", 40),
    height: inchesField("Bag height", 40),
    handleLength: inchesField("Handle length", 60),
    handleWidth: inchesField("Handle width", 4),
    gusset: z
      .number({ error: "Gusset must be a number of inches." })
      .refine(Number.isFinite, { message: "Gusset must be a finite number." })
      .refine((v) => v >= 0, { message: "Gusset can't be negative; use 0 for a flat bag." })
      .refine((v) => v <= 15, { message: "Gusset can't be more than 15 in." }),
  })
  .refine((m) => m.gusset / 2 < m.height, {
    message: "Half the gusset must be less than the bag height.",
    path: ["gusset"],
  })
  .refine((m) => m.handleWidth * 4 < m.width, {
    message: "Handles must be narrower than a quarter of the bag width.",
    path: ["handleWidth"],
  });

export const sizeGroupSchema = z.enum(SIZE_GROUPS);
export const garmentCategorySchema = z.enum(GARMENT_CATEGORIES);
export const garmentSideSchema = z.enum(GARMENT_SIDES);

/** Schema for one size-chart row of a given category. */
export function sizeRowSchemaFor(category: GarmentCategory) {
  return z.object({
    size: z.string().trim().min(1, { message: "Give the size a name, such as M or 2T." }),
    group: sizeGroupSchema,
    measurements: CATEGORY_INFO[category].isTote
      ? toteMeasurementsSchema
      : apparelMeasurementsSchemaFor(category),
  });
}
