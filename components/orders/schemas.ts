/** Form schemas shared by the browser (field errors as you type) and the server actions (the real check). */
import { z } from "zod";
import { DECORATION_METHODS, JOB_STATUSES } from "@/lib/jobs";
import { printLocationsSchema, sizeRunSchema } from "@/lib/quotes";
import { isCalendarDay } from "@/lib/dates";

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `At most ${max} characters`)
    .transform((v) => (v === "" ? null : v))
    .nullable();

export const contactSchema = z.object({
  id: z.string().max(80).optional(),
  name: z.string().trim().min(1, "Enter the contact's name").max(120, "At most 120 characters"),
  email: z.string().trim().toLowerCase().email("Enter a valid e-mail address"),
  phone: optionalText(40),
});

export const clientFormSchema = z.object({
  name: z.string().trim().min(2, "Enter the client's name").max(160, "At most 160 characters"),
  notes: optionalText(2000),
  taxExempt: z.boolean(),
  contacts: z
    .array(contactSchema)
    .max(20, "At most 20 contacts")
    .refine((list) => new Set(list.map((c) => c.email)).size === list.length, { message: "Each contact needs a different e-mail address" }),
});

export type ClientFormValues = z.input<typeof clientFormSchema>;

const isoDate = z
  .string()
  .trim()
  .transform((v) => (v === "" ? null : v))
  .nullable()
  // A real calendar day: Date.parse rolls 2027-02-31 over to March instead of refusing it, and
  // PostgreSQL's date refuses both that and year 0000.
  .refine((v) => v === null || (/^\d{4}-\d{2}-\d{2}$/.test(v) && !v.startsWith("0000") && isCalendarDay(v)), "Enter a date as YYYY-MM-DD");


export const jobFormSchema = z
  .object({
    title: z.string().trim().min(2, "Give the job a title").max(160, "At most 160 characters"),
    clientId: z.string().min(1, "Pick a client").max(80),
    dueDate: isoDate,
    method: z.enum(DECORATION_METHODS, { message: "Pick a decoration method" }),
    blankId: z
      .string()
      .max(80)
      .transform((v) => (v === "" ? null : v))
      .nullable(),
    garmentColour: optionalText(80),
    printLocations: printLocationsSchema,
    dtfAreaIn2: z.number({ message: "Enter the area in square inches" }).positive("Must be more than 0").max(10_000, "At most 10,000 in²").nullable(),
    rush: z.boolean(),
    notes: optionalText(4000),
    sizeRun: sizeRunSchema,
  })
  .superRefine((v, ctx) => {
    if (v.method === "dtf" && v.dtfAreaIn2 === null) ctx.addIssue({ code: "custom", path: ["dtfAreaIn2"], message: "DTF jobs need the transfer area per garment" });
    if (v.sizeRun.every((r) => r.quantity === 0)) ctx.addIssue({ code: "custom", path: ["sizeRun"], message: "Enter at least one quantity" });
  });

export type JobFormValues = z.input<typeof jobFormSchema>;
export type JobFormOutput = z.output<typeof jobFormSchema>;

export const jobStatusSchema = z.enum(JOB_STATUSES, { message: "Unknown status" });

/** Field errors keyed by dotted path ("contacts.0.email"), for react-hook-form's setError. */
export function fieldErrorsByPath(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join(".") || "form";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}
