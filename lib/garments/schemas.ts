/**
 * zod schemas of blanks: measurements, sizes and their groups, as the blank forms, the editor's
 * document and the server read them. Kept apart from the types so a page that only draws a
 * garment (the review link) loads no validator.
 */
import { z } from "zod";
import { CATEGORY_INFO, GARMENT_CATEGORIES, GARMENT_SIDES, SIZE_GROUPS, type GarmentCategory } from "./types";

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
