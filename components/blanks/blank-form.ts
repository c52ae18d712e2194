import { z } from "zod";
import { type GarmentCategory, type GarmentMeasurements, type SizeGroup } from "@/lib/garments/types";
import { sizeRowSchemaFor } from "@/lib/garments/schemas";

/**
 * The blank editor's form, shared by the browser (react-hook-form) and the server action,
 * so both refuse the same things with the same words.
 */
export interface BlankFormValues {
  name: string;
  description: string;
  colours: { name: string; hex: string }[];
  sizes: { size: string; group: SizeGroup; measurements: Record<string, number> }[];
}

export const MAX_SIZE_ROWS = 40;
export const MAX_COLOURS = 40;

const HEX = /^#[0-9a-f]{6}$/i;

export const colourSchema = z.object({
  name: z
    .string()
    .trim()
    .min(1, { message: "Name the colour." })
    .max(40, { message: "Keep colour names under 40 characters." }),
  hex: z
    .string()
    .trim()
    .regex(HEX, { message: "Use a six-digit hex colour such as #1F2023." })
    .transform((v) => v.toUpperCase()),
});

/** Flags every repeat of a value (compared without case or surrounding spaces) at its own row. */
function uniqueBy<T>(pick: (item: T) => string, field: string, message: (value: string) => string) {
  return (items: T[], ctx: z.RefinementCtx) => {
    const seen = new Set<string>();
    items.forEach((item, i) => {
      const key = pick(item).trim().toLowerCase();
      if (key === "") return;
      if (seen.has(key))
        ctx.addIssue({ code: "custom", message: message(pick(item).trim()), path: [i, field] });
      seen.add(key);
    });
  };
}

/**
 * The chart row schema for a category, with one change: checks that compare two measurements
 * (neck narrower than chest, and so on) only speak once every number on the row is valid on its own,
 * so a typo gives one message instead of three.
 */
export function measurementsSchemaFor(category: GarmentCategory) {
  const full: z.ZodType<GarmentMeasurements, Record<string, number>> & { shape: z.ZodRawShape } =
    sizeRowSchemaFor(category).shape.measurements;
  return z.object(full.shape).pipe(full);
}

export function blankFormSchemaFor(category: GarmentCategory) {
  const sizeRow = sizeRowSchemaFor(category).extend({
    measurements: measurementsSchemaFor(category),
    size: z
      .string()
      .trim()
      .min(1, { message: "Give the size a name, such as M or 2T." })
      .max(12, { message: "Keep size names to 12 characters." }),
  });
  return z.object({
    name: z
      .string()
      .trim()
      .min(1, { message: "Give the blank a name." })
      .max(120, { message: "Keep the name under 120 characters." }),
    description: z.string().trim().max(1000, { message: "Keep the description under 1000 characters." }),
    colours: z
      .array(colourSchema)
      .min(1, { message: "Add at least one colour." })
      .max(MAX_COLOURS, { message: `A blank can list up to ${MAX_COLOURS} colours.` })
      .superRefine(
        uniqueBy(
          (c) => c.name,
          "name",
          (v) => `The colour ${v} is listed twice.`,
        ),
      ),
    sizes: z
      .array(sizeRow)
      .min(1, { message: "Add at least one size." })
      .max(MAX_SIZE_ROWS, { message: `A size chart can have up to ${MAX_SIZE_ROWS} sizes.` })
      .superRefine(
        uniqueBy(
          (row) => row.size,
          "size",
          (v) => `Size ${v} is listed twice.`,
        ),
      ),
  });
}

export type BlankFormOutput = z.output<ReturnType<typeof blankFormSchemaFor>>;

/** Zod issues keyed by dotted field path ("sizes.2.measurements.chestWidth"), for setError on the client. */
export function fieldErrorsOf(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join(".") || "root";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}
