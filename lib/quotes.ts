/**
 * From a job to a quote, and from a quote and its payments to what is still due.
 *
 * Pure: no React, no database. Amounts are integer cents (see lib/pricing.ts).
 */
import { z } from "zod";
import { PAYMENT_KIND_LABELS, type MoneyState, type PaymentKind } from "./money-states";
import { LOCATION_LABELS, PRINT_LOCATIONS, type PrintLocation } from "./garments/locations";
import type { DecorationMethod as JobMethod } from "./jobs";
import {
  DEFAULT_SIZE_ORDER,
  MAX_DTF_AREA_IN2,
  MAX_QUOTE_QUANTITY,
  tryComputeQuote,
  type DecorationMethod as PricingMethod,
  type PriceMatrix,
  type Quote,
  type QuoteResult,
  type SizeRunEntry,
} from "./pricing";

// ---------------------------------------------------------------------------
// Size runs
// ---------------------------------------------------------------------------

/** The size run grid's groups, smallest first. Youth and adult sit side by side in one grid. */
export const SIZE_GROUPS: ReadonlyArray<{ key: string; label: string; sizes: readonly string[] }> = [
  { key: "infant", label: "Infant", sizes: ["NB", "6M", "12M", "18M"] },
  { key: "toddler", label: "Toddler", sizes: ["2T", "3T", "4T", "5T"] },
  { key: "youth", label: "Youth", sizes: ["YXS", "YS", "YM", "YL", "YXL"] },
  { key: "adult", label: "Adult", sizes: ["XS", "S", "M", "L", "XL", "2XL", "3XL", "4XL", "5XL", "6XL"] },
  { key: "one-size", label: "One size", sizes: ["One size"] },
];

/**
 * Every size a job may list, in the order quotes and CSVs use. One-size items (totes, caps) come
 * first, so a size upcharge that runs "from 2XL up" never reaches them.
 */
export const JOB_SIZE_ORDER: readonly string[] = Object.freeze(["One size", ...DEFAULT_SIZE_ORDER]);

export const sizeRunSchema = z
  .array(
    z.object({
      size: z.enum(JOB_SIZE_ORDER as [string, ...string[]], { message: "Unknown size" }),
      quantity: z.number({ message: "Enter a whole number" }).int("Enter a whole number").min(0, "Cannot be negative").max(100_000, "At most 100,000 per size"),
    }),
  )
  .max(JOB_SIZE_ORDER.length)
  .refine((run) => new Set(run.map((r) => r.size)).size === run.length, { message: "A size is listed twice" });

/** Drops zero rows, merges nothing (sizes are unique), and sorts in size order: youth before adult. */
export function normaliseSizeRun(run: ReadonlyArray<SizeRunEntry>): SizeRunEntry[] {
  return run
    .filter((r) => r.quantity > 0)
    .map((r) => ({ size: r.size, quantity: r.quantity }))
    .sort((a, b) => JOB_SIZE_ORDER.indexOf(a.size) - JOB_SIZE_ORDER.indexOf(b.size));
}

/** Totals by size group and overall. */
export function sizeRunTotals(run: ReadonlyArray<SizeRunEntry>): { total: number; byGroup: Record<string, number> } {
  const byGroup: Record<string, number> = {};
  let total = 0;
  for (const group of SIZE_GROUPS) byGroup[group.key] = 0;
  for (const row of run) {
    const group = SIZE_GROUPS.find((g) => g.sizes.includes(row.size));
    if (group) byGroup[group.key]! += row.quantity;
    total += row.quantity;
  }
  return { total, byGroup };
}

// ---------------------------------------------------------------------------
// Jobs to quotes
// ---------------------------------------------------------------------------

export const printLocationSchema = z.object({
  location: z.enum(PRINT_LOCATIONS, { message: "Pick a print location" }),
  colours: z.number().int("Whole colours only").min(1, "At least 1 colour").max(12, "At most 12 colours"),
});

export const printLocationsSchema = z
  .array(printLocationSchema)
  .max(8, "At most 8 print locations")
  .refine((list) => new Set(list.map((l) => l.location)).size === list.length, { message: "Each location once" });

export type JobPrintLocation = z.infer<typeof printLocationSchema>;

const METHOD_TO_PRICING: Readonly<Record<JobMethod, PricingMethod>> = {
  "screen-print": "screenPrint",
  dtf: "dtf",
  dtg: "dtg",
  htv: "htv",
  sublimation: "sublimation",
};

export function pricingMethodFor(method: JobMethod): PricingMethod {
  return METHOD_TO_PRICING[method];
}

export interface JobForQuote {
  title: string;
  method: JobMethod;
  sizeRun: ReadonlyArray<SizeRunEntry>;
  printLocations: ReadonlyArray<{ location: string; colours: number }>;
  dtfAreaIn2: number | null;
  rush: boolean;
  garmentName: string | null;
  garmentColour: string | null;
  blankId: string | null;
}

/** What a sent quote keeps: the priced lines and the job as it was priced. */
export interface QuoteSnapshot {
  quote: Quote;
  job: {
    title: string;
    method: JobMethod;
    garmentName: string | null;
    garmentColour: string | null;
    locations: Array<{ location: string; label: string; colours: number }>;
    sizeRun: SizeRunEntry[];
    rush: boolean;
    taxExempt: boolean;
  };
}

function locationLabel(location: string): string {
  return (LOCATION_LABELS as Record<string, string>)[location] ?? location;
}

/** Prices a job with the shop's matrix. The result says in words why a job cannot be priced yet. */
export function quoteJob(job: JobForQuote, matrix: PriceMatrix, opts: { taxExempt: boolean }): QuoteResult & { snapshot?: QuoteSnapshot } {
  const sizeRun = normaliseSizeRun(job.sizeRun);
  if (sizeRun.length === 0) return { ok: false, code: "empty-size-run", message: "Add quantities to the size run first." };
  if (job.printLocations.length === 0) return { ok: false, code: "invalid-input", message: "Add at least one print location first." };
  if (job.method === "dtf" && (job.dtfAreaIn2 === null || !(job.dtfAreaIn2 > 0))) {
    return { ok: false, code: "invalid-input", message: "DTF jobs need the transfer area per garment (in²) to be priced." };
  }
  if (sizeRun.reduce((s, r) => s + r.quantity, 0) > MAX_QUOTE_QUANTITY) return { ok: false, code: "invalid-input", message: "Too many garments for one quote." };
  const method = pricingMethodFor(job.method);
  const result = tryComputeQuote({
    matrix,
    method,
    sizeRun,
    sizeOrder: JOB_SIZE_ORDER,
    locations: job.printLocations.length,
    colours: method === "screenPrint" ? job.printLocations.map((l) => l.colours) : undefined,
    dtfAreaIn2: job.method === "dtf" && job.dtfAreaIn2 ? Math.min(job.dtfAreaIn2, MAX_DTF_AREA_IN2) : undefined,
    garmentCostCents: job.blankId && Object.prototype.hasOwnProperty.call(matrix.garmentCostCents, job.blankId) ? matrix.garmentCostCents[job.blankId]! : matrix.garmentCostCents.default,
    rush: job.rush,
    taxExempt: opts.taxExempt,
  });
  if (!result.ok) return result;
  return {
    ...result,
    snapshot: {
      quote: result.quote,
      job: {
        title: job.title,
        method: job.method,
        garmentName: job.garmentName,
        garmentColour: job.garmentColour,
        locations: job.printLocations.map((l) => ({ location: l.location, label: locationLabel(l.location), colours: l.colours })),
        sizeRun,
        rush: job.rush,
        taxExempt: opts.taxExempt,
      },
    },
  };
}

// ---------------------------------------------------------------------------
// Payments
// ---------------------------------------------------------------------------

export { MONEY_STATES, MONEY_STATE_LABELS, PAYMENT_KIND_LABELS, type MoneyState, type PaymentKind } from "./money-states";

export interface MoneyInput {
  /** The newest quote that is sent or accepted (replaced quotes do not count). */
  quote: { state: "sent" | "accepted" | "replaced"; totalCents: number; depositCents: number } | null;
  payments: ReadonlyArray<{ state: "awaiting" | "paid" | "lapsed"; amountCents: number }>;
}

export interface MoneySummary {
  state: MoneyState;
  totalCents: number;
  paidCents: number;
  /** What is still owed on the accepted quote (never below 0). */
  balanceCents: number;
  /** Paid beyond the quote total (a second checkout paid twice, or a smaller new quote). */
  overpaidCents: number;
  /** Payments the client may start now. */
  payable: Array<{ kind: PaymentKind; amountCents: number }>;
}

/** Paid payments add up; awaiting and lapsed ones never count. */
export function moneySummary({ quote, payments }: MoneyInput): MoneySummary {
  const paidCents = payments.filter((p) => p.state === "paid").reduce((s, p) => s + p.amountCents, 0);
  if (!quote || quote.state === "replaced") {
    return { state: "not-quoted", totalCents: 0, paidCents, balanceCents: 0, overpaidCents: paidCents, payable: [] };
  }
  const totalCents = quote.totalCents;
  const balanceCents = Math.max(0, totalCents - paidCents);
  const overpaidCents = Math.max(0, paidCents - totalCents);
  if (quote.state === "sent") return { state: "quote-sent", totalCents, paidCents, balanceCents, overpaidCents, payable: [] };
  if (balanceCents === 0) return { state: "paid-in-full", totalCents, paidCents, balanceCents, overpaidCents, payable: [] };
  if (paidCents === 0) {
    const payable: MoneySummary["payable"] = [];
    if (quote.depositCents > 0 && quote.depositCents < totalCents) payable.push({ kind: "deposit", amountCents: quote.depositCents });
    payable.push({ kind: "full", amountCents: totalCents });
    return { state: "awaiting-payment", totalCents, paidCents, balanceCents, overpaidCents, payable };
  }
  return { state: "deposit-paid", totalCents, paidCents, balanceCents, overpaidCents, payable: [{ kind: "balance", amountCents: balanceCents }] };
}

/** The amount a new checkout of `kind` must charge now, or why it cannot start. */
export function checkoutAmount(summary: MoneySummary, kind: PaymentKind): { ok: true; amountCents: number } | { ok: false; message: string } {
  if (summary.state === "not-quoted" || summary.state === "quote-sent") return { ok: false, message: "Accept the quote before paying." };
  if (summary.state === "paid-in-full") return { ok: false, message: "This job is paid in full. Nothing is due." };
  const option = summary.payable.find((p) => p.kind === kind);
  if (!option) {
    const offered = summary.payable.map((p) => PAYMENT_KIND_LABELS[p.kind].toLowerCase()).join(" or ");
    return { ok: false, message: `That payment is not open for this job; you can pay the ${offered}.` };
  }
  return { ok: true, amountCents: option.amountCents };
}

// ---------------------------------------------------------------------------
// CSV
// ---------------------------------------------------------------------------

/** Rows for a size-run CSV: one row per job, one column per size that any job uses, then the total. */
export function sizeRunTable(jobs: ReadonlyArray<{ title: string; client: string; status: string; dueDate: string | null; sizeRun: ReadonlyArray<SizeRunEntry> }>): { fields: string[]; data: Array<Array<string | number>> } {
  const used = new Set(jobs.flatMap((j) => j.sizeRun.filter((r) => r.quantity > 0).map((r) => r.size)));
  const sizes = JOB_SIZE_ORDER.filter((s) => used.has(s));
  const fields = ["Job", "Client", "Status", "Due", ...sizes, "Total"];
  const data = jobs.map((j) => {
    const bySize = new Map(j.sizeRun.map((r) => [r.size, r.quantity]));
    const cells = sizes.map((s) => bySize.get(s) ?? 0);
    return [j.title, j.client, j.status, j.dueDate ?? "", ...cells, cells.reduce((a, b) => a + b, 0)];
  });
  return { fields, data };
}

export const PRINT_LOCATION_OPTIONS: ReadonlyArray<{ value: PrintLocation; label: string }> = PRINT_LOCATIONS.map((value) => ({ value, label: LOCATION_LABELS[value] }));
