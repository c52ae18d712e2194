/**
 * Quote pricing: a shop's price matrix, and the maths that turns a size run into quote lines.
 *
 * Pure: no React, no database, no Node APIs. Every amount is an integer number of cents
 * (minor units of a two-decimal currency). Percentages are applied with exact integer
 * arithmetic (BigInt), never with binary floating point, so 8.25 % of 200 ¢ is exactly
 * 16.5 ¢ and rounds to 17 ¢.
 *
 * Rules (our own choices; each is covered by tests/unit/pricing.test.ts):
 *
 *  - Quantity break: the largest break at or below the order's total quantity (all sizes
 *    together). Below the first break the quote is NOT refused: it is priced at the first
 *    break, `belowMinimum` is true, and a note line (total 0) says so. A caller that wants
 *    to refuse small orders checks `belowMinimum`.
 *  - Screen print: one price per garment, looked up by (break, number of locations, the
 *    HIGHEST colour count of any location). A 4-colour front with a 1-colour back is priced
 *    as "2 locations, 4 colours"; the shop's table is expected to build the cost of extra
 *    locations into its location axis. Setup fee = screens × fee per screen, where screens =
 *    total colours across all locations (4 + 1 = 5 screens). An underbase or flash white
 *    counts only if the shop includes it in the colour count.
 *  - DTF: a pressing price per garment by (break, locations), plus the transfers:
 *      mode "area":   per garment, round half up(transfer area in² × cents per in²);
 *      mode "length": the gang sheet, billed in whole inches (length rounded up) × cents per
 *                     inch of sheet. Without `gangSheetLengthIn`, the length is estimated
 *                     as total area ÷ roll width (no spacing or packing waste: pass the
 *                     packed length from lib/production/packing.ts for a real quote).
 *  - DTG, HTV, sublimation: a price per garment by (break, locations).
 *  - Size upcharges: each entry applies from its size upward in the size order, until the
 *    next entry takes over (they do not add up: with 2XL +200 and 3XL +300, a 4XL pays 300).
 *    One line per band. An entry whose size is not in the size order never applies.
 *  - Rush fee: rushFeePercent of the garments + decoration (+ transfers, gang sheet) + size
 *    upcharges. One-off setup fees (screens) are not rushed.
 *  - Tax: everything on the quote is taxable (garments, decoration, setup, upcharges, rush)
 *    unless `taxExempt` is set (resale or exempt-organisation certificate on file).
 *    tax = round half up(subtotal × taxRatePercent / 100).
 *  - Deposit = round half up(total × depositPercent / 100); balance = total − deposit.
 *  - Every charge line has totalCents = unitCents × quantity exactly; lines whose total would
 *    be 0 (free blanks, no setup fee, no rush) are left out.
 */
import { z } from "zod";
import { SHOP_CURRENCIES } from "./money";

// ---------------------------------------------------------------------------
// Limits (ours: generous bounds that keep every product far below 2^53)
// ---------------------------------------------------------------------------

/** Largest per-unit amount we accept anywhere: $100,000.00. */
export const MAX_UNIT_CENTS = 10_000_000;
/** Largest total garment count in one quote. */
export const MAX_QUOTE_QUANTITY = 1_000_000;
/** Largest DTF transfer area per garment, in² (a 60 × 60 in all-over is 3,600 in²). */
export const MAX_DTF_AREA_IN2 = 10_000;
/** Longest gang sheet, inches (a 100 yd roll is 3,600 in). */
export const MAX_GANG_SHEET_IN = 36_000;

// ---------------------------------------------------------------------------
// Methods
// ---------------------------------------------------------------------------

export const DECORATION_METHODS = ["screenPrint", "dtf", "dtg", "htv", "sublimation"] as const;
export type DecorationMethod = (typeof DECORATION_METHODS)[number];
export const decorationMethodSchema = z.enum(DECORATION_METHODS);

export const DECORATION_METHOD_LABELS: Readonly<Record<DecorationMethod, string>> = {
  screenPrint: "Screen print",
  dtf: "DTF",
  dtg: "DTG",
  htv: "HTV",
  sublimation: "Sublimation",
};

/**
 * A full size order, smallest first: infant, toddler, youth, then adult.
 * Labels as lib/garments/catalog.ts uses them.
 */
const INFANT_SIZES = ["NB", "6M", "12M", "18M"];
const TODDLER_SIZES = ["2T", "3T", "4T", "5T"];
const YOUTH_SIZES = ["YXS", "YS", "YM", "YL", "YXL"];
const ADULT_SIZES = ["XS", "S", "M", "L", "XL", "2XL", "3XL", "4XL", "5XL", "6XL"];
export const DEFAULT_SIZE_ORDER: readonly string[] = Object.freeze([
  ...INFANT_SIZES,
  ...TODDLER_SIZES,
  ...YOUTH_SIZES,
  ...ADULT_SIZES,
]);

// ---------------------------------------------------------------------------
// Price matrix schema
// ---------------------------------------------------------------------------

const centsSchema = z.number().int().min(0).max(MAX_UNIT_CENTS);
const percentSchema = z.number().finite().min(0).max(100);

const quantityBreaksSchema = z
  .array(z.number().int().min(1).max(MAX_QUOTE_QUANTITY))
  .min(1)
  .refine((b) => b.every((q, i) => i === 0 || q > b[i - 1]!), {
    message: "Quantity breaks must be strictly ascending",
  });

/** [break][locations − 1] → cents per garment. */
const locationTableSchema = z.array(z.array(centsSchema).min(1)).min(1);

function tieredByLocationSchema() {
  return z
    .object({ quantityBreaks: quantityBreaksSchema, pricesCents: locationTableSchema })
    .superRefine((t, ctx) => {
      if (t.pricesCents.length !== t.quantityBreaks.length) {
        ctx.addIssue({
          code: "custom",
          path: ["pricesCents"],
          message: "One row of prices per quantity break",
        });
        return;
      }
      const width = t.pricesCents[0]!.length;
      t.pricesCents.forEach((row, i) => {
        if (row.length !== width) {
          ctx.addIssue({
            code: "custom",
            path: ["pricesCents", i],
            message: "Every break needs the same number of locations",
          });
        }
      });
    });
}

const screenPrintSchema = z
  .object({
    quantityBreaks: quantityBreaksSchema,
    /** [break][locations − 1][colours − 1] → cents per garment. */
    pricesCents: z.array(z.array(z.array(centsSchema).min(1)).min(1)).min(1),
    setupFeePerScreenCents: centsSchema,
  })
  .superRefine((t, ctx) => {
    if (t.pricesCents.length !== t.quantityBreaks.length) {
      ctx.addIssue({
        code: "custom",
        path: ["pricesCents"],
        message: "One table of prices per quantity break",
      });
      return;
    }
    const locations = t.pricesCents[0]!.length;
    const colours = t.pricesCents[0]![0]!.length;
    t.pricesCents.forEach((table, i) => {
      if (table.length !== locations) {
        ctx.addIssue({
          code: "custom",
          path: ["pricesCents", i],
          message: "Every break needs the same number of locations",
        });
      }
      table.forEach((row, j) => {
        if (row.length !== colours) {
          ctx.addIssue({
            code: "custom",
            path: ["pricesCents", i, j],
            message: "Every location needs the same number of colours",
          });
        }
      });
    });
  });

const dtfSchema = z
  .object({
    mode: z.enum(["area", "length"]),
    /** May be fractional (e.g. 1.5 ¢/in²); the per-garment result is rounded half up. */
    centsPerSquareInch: z.number().finite().min(0).max(10_000),
    centsPerInchOfSheet: centsSchema,
    rollWidthIn: z.number().finite().positive().max(120),
    quantityBreaks: quantityBreaksSchema,
    pricesCents: locationTableSchema,
  })
  .superRefine((t, ctx) => {
    if (t.pricesCents.length !== t.quantityBreaks.length) {
      ctx.addIssue({
        code: "custom",
        path: ["pricesCents"],
        message: "One row of prices per quantity break",
      });
      return;
    }
    const width = t.pricesCents[0]!.length;
    t.pricesCents.forEach((row, i) => {
      if (row.length !== width) {
        ctx.addIssue({
          code: "custom",
          path: ["pricesCents", i],
          message: "Every break needs the same number of locations",
        });
      }
    });
  });

export const priceMatrixSchema = z.object({
  currency: z.enum(SHOP_CURRENCIES),
  depositPercent: percentSchema,
  /** e.g. 8.25 for 8.25 %. */
  taxRatePercent: percentSchema,
  rushFeePercent: percentSchema,
  screenPrint: screenPrintSchema,
  dtf: dtfSchema,
  dtg: tieredByLocationSchema(),
  htv: tieredByLocationSchema(),
  sublimation: tieredByLocationSchema(),
  /** Each entry applies from `fromSize` upward in the size order, until the next entry. */
  sizeUpcharges: z
    .array(z.object({ fromSize: z.string().trim().min(1).max(16), cents: centsSchema }))
    .max(32)
    .refine((list) => new Set(list.map((u) => u.fromSize)).size === list.length, {
      message: "Each size may start one upcharge only",
    }),
  /** Blank cost per garment by blank id; `default` for blanks without their own entry. */
  garmentCostCents: z.object({ default: centsSchema }).catchall(centsSchema),
});

export type PriceMatrix = z.infer<typeof priceMatrixSchema>;
export type ScreenPrintPrices = PriceMatrix["screenPrint"];
export type DtfPrices = PriceMatrix["dtf"];
export type TieredPrices = PriceMatrix["dtg"];
export type SizeUpcharge = PriceMatrix["sizeUpcharges"][number];

// ---------------------------------------------------------------------------
// Demo matrix
// ---------------------------------------------------------------------------

/**
 * Screen print demo table. Invented numbers (demo only, no published source): a first
 * location at `first[break]` cents for one colour plus `perColour[break]` per extra colour,
 * and each further location at 70 % of the first location's price, rounded to the cent.
 */
function demoScreenPrintTable(): number[][][] {
  const first = [850, 650, 500, 430, 360]; // cents, 1 colour, breaks 12 / 24 / 48 / 72 / 144
  const perColour = [125, 95, 70, 60, 50]; // cents per extra colour
  return first.map((base, b) =>
    [1, 2, 3, 4].map((locations) =>
      [1, 2, 3, 4, 5, 6].map((colours) => {
        const one = base + (colours - 1) * perColour[b]!;
        return one + Math.round((locations - 1) * one * 0.7);
      }),
    ),
  );
}

/**
 * DEMO ONLY. Invented, plausible-looking numbers so a new shop sees a working quote; they
 * come from no survey or published price list, and every shop must replace them with its own.
 */
export const DEFAULT_PRICE_MATRIX: PriceMatrix = deepFreeze<PriceMatrix>({
  currency: "usd",
  depositPercent: 50,
  taxRatePercent: 8.25,
  rushFeePercent: 25,
  screenPrint: {
    quantityBreaks: [12, 24, 48, 72, 144],
    pricesCents: demoScreenPrintTable(),
    setupFeePerScreenCents: 2500,
  },
  dtf: {
    mode: "area",
    centsPerSquareInch: 2,
    centsPerInchOfSheet: 125,
    rollWidthIn: 22,
    quantityBreaks: [1, 12, 24, 48, 96],
    // pressing, cents per garment for 1 / 2 / 3 locations
    pricesCents: [
      [500, 850, 1200],
      [400, 700, 1000],
      [350, 600, 850],
      [300, 525, 750],
      [250, 450, 650],
    ],
  },
  dtg: {
    quantityBreaks: [1, 12, 24, 48, 72],
    pricesCents: [
      [1400, 2300, 3100],
      [1150, 1900, 2600],
      [1000, 1650, 2250],
      [900, 1500, 2050],
      [800, 1350, 1850],
    ],
  },
  htv: {
    quantityBreaks: [1, 12, 24, 48],
    pricesCents: [
      [900, 1500, 2000],
      [700, 1200, 1650],
      [600, 1050, 1450],
      [500, 900, 1250],
    ],
  },
  sublimation: {
    quantityBreaks: [1, 12, 24, 48, 96],
    pricesCents: [
      [1800, 2800],
      [1500, 2400],
      [1300, 2100],
      [1150, 1850],
      [1000, 1650],
    ],
  },
  sizeUpcharges: [
    { fromSize: "2XL", cents: 200 },
    { fromSize: "3XL", cents: 300 },
    { fromSize: "4XL", cents: 400 },
    { fromSize: "5XL", cents: 500 },
  ],
  garmentCostCents: { default: 450 },
});

function deepFreeze<T>(value: T): T {
  if (typeof value === "object" && value !== null) {
    for (const v of Object.values(value)) deepFreeze(v);
    Object.freeze(value);
  }
  return value;
}

/** Parses an unknown value (stored JSON, a form) into a price matrix; throws PricingError. */
export function parsePriceMatrix(value: unknown): PriceMatrix {
  const parsed = priceMatrixSchema.safeParse(value);
  if (!parsed.success)
    throw new PricingError("invalid-matrix", `Price matrix is not valid: ${describeIssues(parsed.error)}`);
  return parsed.data;
}

/** Blank cost per garment for a blank id, falling back to the matrix's `default`. */
export function garmentCostFor(matrix: PriceMatrix, blankId?: string | null): number {
  if (blankId && Object.prototype.hasOwnProperty.call(matrix.garmentCostCents, blankId)) {
    return matrix.garmentCostCents[blankId]!;
  }
  return matrix.garmentCostCents.default;
}

// ---------------------------------------------------------------------------
// Errors
// ---------------------------------------------------------------------------

export type PricingErrorCode =
  "invalid-matrix" | "invalid-input" | "unknown-size" | "empty-size-run" | "no-price";

export class PricingError extends Error {
  constructor(
    readonly code: PricingErrorCode,
    message: string,
  ) {
    super(message);
    this.name = "PricingError";
  }
}

function describeIssues(error: z.ZodError): string {
  return error.issues
    .slice(0, 5)
    .map((i) => `${i.path.length ? i.path.join(".") : "(root)"}: ${i.message}`)
    .join("; ");
}

// ---------------------------------------------------------------------------
// Exact money arithmetic
// ---------------------------------------------------------------------------

/** Decimal inputs (percentages, in², ¢/in²) are taken to 6 decimal places. */
const SCALE = 1_000_000n;

function scaled(x: number): bigint {
  return BigInt(Math.round(x * 1_000_000));
}

/** floor((2n + d) / 2d): n / d rounded half up, for n ≥ 0, d > 0. */
function divRoundHalfUp(n: bigint, d: bigint): number {
  return Number((2n * n + d) / (2n * d));
}

/**
 * `percent` % of a non-negative whole number of cents, rounded half up to the cent, exactly.
 * percentOfCents(200, 8.25) = 17 (16.5 ¢); percentOfCents(3000, 4.35) = 131 (130.5 ¢, where
 * floating point gives 130.49999…).
 */
export function percentOfCents(amountCents: number, percent: number): number {
  assertWholeCents(amountCents, "amount");
  if (!Number.isFinite(percent) || percent < 0)
    throw new PricingError("invalid-input", "Percent must be a non-negative number");
  return divRoundHalfUp(BigInt(amountCents) * scaled(percent), 100n * SCALE);
}

/** a × b rounded half up to a whole number, for non-negative decimals (6 places). */
export function multiplyRoundHalfUp(a: number, b: number): number {
  if (!Number.isFinite(a) || !Number.isFinite(b) || a < 0 || b < 0) {
    throw new PricingError("invalid-input", "Both factors must be non-negative numbers");
  }
  return divRoundHalfUp(scaled(a) * scaled(b), SCALE * SCALE);
}

function assertWholeCents(v: number, what: string): void {
  if (!Number.isSafeInteger(v) || v < 0)
    throw new PricingError("invalid-input", `${what} must be a whole, non-negative number of cents`);
}

// ---------------------------------------------------------------------------
// Size runs and quantity breaks
// ---------------------------------------------------------------------------

export interface SizeRunEntry {
  size: string;
  quantity: number;
}

/** Total garments in a size run. Quantities must be whole and non-negative. */
export function sizeRunTotal(sizeRun: ReadonlyArray<SizeRunEntry>): number {
  let total = 0;
  for (const entry of sizeRun) {
    if (!Number.isSafeInteger(entry.quantity) || entry.quantity < 0) {
      throw new PricingError("invalid-input", `Quantity for ${entry.size} must be a whole number, 0 or more`);
    }
    total += entry.quantity;
  }
  return total;
}

export interface QuantityBreakLookup {
  /** Index into the method's quantityBreaks / pricesCents. */
  index: number;
  /** The break's minimum quantity. */
  breakQuantity: number;
  /** True when the quantity is below the first break (priced at the first break). */
  belowMinimum: boolean;
}

/** The largest break at or below `quantity`; below the first break, the first break. */
export function findQuantityBreak(quantityBreaks: readonly number[], quantity: number): QuantityBreakLookup {
  if (quantityBreaks.length === 0)
    throw new PricingError("invalid-matrix", "A method has no quantity breaks");
  let index = -1;
  for (let i = 0; i < quantityBreaks.length; i++) {
    if (quantityBreaks[i]! <= quantity) index = i;
  }
  if (index < 0) return { index: 0, breakQuantity: quantityBreaks[0]!, belowMinimum: true };
  return { index, breakQuantity: quantityBreaks[index]!, belowMinimum: false };
}

// ---------------------------------------------------------------------------
// Quotes
// ---------------------------------------------------------------------------

export const quoteOptionsSchema = z.object({
  method: decorationMethodSchema,
  sizeRun: z
    .array(
      z.object({
        size: z.string().trim().min(1).max(16),
        quantity: z.number().int().min(0).max(MAX_QUOTE_QUANTITY),
      }),
    )
    .min(1)
    .max(64),
  sizeOrder: z.array(z.string().trim().min(1).max(16)).min(1).max(64),
  locations: z.number().int().min(1).max(32),
  colours: z.array(z.number().int().min(1).max(32)).max(32).optional(),
  dtfAreaIn2: z.number().finite().positive().max(MAX_DTF_AREA_IN2).optional(),
  gangSheetLengthIn: z.number().finite().positive().max(MAX_GANG_SHEET_IN).optional(),
  garmentCostCents: centsSchema,
  rush: z.boolean(),
  taxExempt: z.boolean().optional(),
});

/** What a route handler validates from a form; `computeQuote` adds the shop's matrix. */
export type QuoteOptions = z.infer<typeof quoteOptionsSchema>;

export interface QuoteInput {
  matrix: PriceMatrix;
  method: DecorationMethod;
  sizeRun: ReadonlyArray<SizeRunEntry>;
  /** The full size order of the blank, smallest first (youth before adult). */
  sizeOrder: readonly string[];
  /** Print locations per garment. */
  locations: number;
  /** Screen print: colours per location (length = locations). Ignored by other methods. */
  colours?: readonly number[];
  /** DTF: total transfer area per garment, in². */
  dtfAreaIn2?: number;
  /** DTF, length mode: the packed gang sheet length for the whole order, inches. */
  gangSheetLengthIn?: number;
  /** Blank cost per garment (see `garmentCostFor`); 0 for customer-supplied garments. */
  garmentCostCents: number;
  rush: boolean;
  /** No tax (resale or exempt-organisation certificate on file). */
  taxExempt?: boolean;
}

export type QuoteLineUnit = "garment" | "screen" | "inch" | "order" | "note";

export interface QuoteLine {
  /** Stable id: "garments", "decoration", "dtf-transfers", "gang-sheet", "upcharge:<size>", "setup-screens", "rush", "note:below-minimum". */
  key: string;
  label: string;
  quantity: number;
  unitCents: number;
  /** Always unitCents × quantity. */
  totalCents: number;
  /** What `quantity` counts. Note lines carry no charge. */
  unit: QuoteLineUnit;
}

export interface Quote {
  currency: PriceMatrix["currency"];
  method: DecorationMethod;
  lines: QuoteLine[];
  subtotalCents: number;
  /** The part of the subtotal tax applies to (all of it, or 0 when tax exempt). */
  taxableCents: number;
  taxCents: number;
  totalCents: number;
  depositCents: number;
  balanceCents: number;
  totalQuantity: number;
  /** The quantity break used for pricing. */
  breakQuantity: number;
  belowMinimum: boolean;
  /** Screens burned (screen print only; 0 otherwise). */
  screens: number;
}

function fail(message: string): never {
  throw new PricingError("invalid-input", message);
}

function charge(
  key: string,
  label: string,
  quantity: number,
  unitCents: number,
  unit: QuoteLineUnit,
): QuoteLine {
  return { key, label, quantity, unitCents, totalCents: quantity * unitCents, unit };
}

function plural(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}

function formatInches(n: number): string {
  return String(Math.round(n * 100) / 100);
}

function lookup<T>(row: readonly T[] | undefined, i: number, what: string): T {
  const v = row?.[i];
  if (v === undefined) throw new PricingError("no-price", `The price matrix has no price for ${what}`);
  return v;
}

interface SizeBand {
  fromSize: string;
  cents: number;
  start: number;
  end: number; // inclusive index in the size order
}

function upchargeBands(upcharges: readonly SizeUpcharge[], sizeOrder: readonly string[]): SizeBand[] {
  const known = upcharges
    .map((u) => ({ fromSize: u.fromSize, cents: u.cents, start: sizeOrder.indexOf(u.fromSize) }))
    .filter((u) => u.start >= 0)
    .sort((a, b) => a.start - b.start);
  return known.map((u, i) => ({
    ...u,
    end: i + 1 < known.length ? known[i + 1]!.start - 1 : sizeOrder.length - 1,
  }));
}

function bandLabel(band: SizeBand, sizeOrder: readonly string[]): string {
  if (band.start === band.end) return `Size upcharge: ${band.fromSize}`;
  if (band.end === sizeOrder.length - 1) return `Size upcharge: ${band.fromSize} and up`;
  return `Size upcharge: ${band.fromSize}–${sizeOrder[band.end]}`;
}

/**
 * Prices one decorated size run. Throws PricingError (code + readable message) on input the
 * matrix cannot price; `tryComputeQuote` returns the error instead.
 */
export function computeQuote(input: QuoteInput): Quote {
  const matrix = parsePriceMatrix(input.matrix);
  const { method, sizeOrder } = input;
  if (!DECORATION_METHODS.includes(method)) fail(`Unknown decoration method: ${String(method)}`);

  // Size order and size run.
  if (sizeOrder.length === 0) fail("The size order is empty");
  if (new Set(sizeOrder).size !== sizeOrder.length) fail("The size order lists a size twice");
  const bySize = new Map<string, number>();
  for (const entry of input.sizeRun) {
    if (!sizeOrder.includes(entry.size))
      throw new PricingError("unknown-size", `Size ${entry.size} is not in the size order`);
    if (!Number.isSafeInteger(entry.quantity) || entry.quantity < 0)
      fail(`Quantity for ${entry.size} must be a whole number, 0 or more`);
    bySize.set(entry.size, (bySize.get(entry.size) ?? 0) + entry.quantity);
  }
  const totalQuantity = sizeRunTotal(input.sizeRun);
  if (totalQuantity === 0) throw new PricingError("empty-size-run", "The size run has no garments");
  if (totalQuantity > MAX_QUOTE_QUANTITY) fail(`At most ${MAX_QUOTE_QUANTITY} garments per quote`);

  const { locations } = input;
  if (!Number.isSafeInteger(locations) || locations < 1) fail("Locations must be a whole number, 1 or more");
  assertWholeCents(input.garmentCostCents, "Garment cost");
  if (input.garmentCostCents > MAX_UNIT_CENTS) fail("Garment cost is too large");

  const lines: QuoteLine[] = [];
  const rushable: QuoteLine[] = [];
  const add = (line: QuoteLine, rush: boolean) => {
    if (line.totalCents <= 0) return;
    lines.push(line);
    if (rush) rushable.push(line);
  };

  add(charge("garments", "Blank garments", totalQuantity, input.garmentCostCents, "garment"), true);

  const methodLabel = DECORATION_METHOD_LABELS[method];
  const locationsText = plural(locations, "location", "locations");
  let screens = 0;
  let brk: QuantityBreakLookup;

  if (method === "screenPrint") {
    const sp = matrix.screenPrint;
    const colours = input.colours;
    if (!colours || colours.length !== locations) fail("Screen print needs a colour count for each location");
    for (const c of colours)
      if (!Number.isSafeInteger(c) || c < 1) fail("Colour counts must be whole numbers, 1 or more");
    const maxColours = Math.max(...colours);
    screens = colours.reduce((s, c) => s + c, 0);
    brk = findQuantityBreak(sp.quantityBreaks, totalQuantity);
    const table = sp.pricesCents[brk.index];
    const row = lookup(table, locations - 1, `screen print on ${locationsText}`);
    const unit = lookup(row, maxColours - 1, `screen print with ${plural(maxColours, "colour", "colours")}`);
    const colourText =
      locations === 1
        ? plural(maxColours, "colour", "colours")
        : `up to ${plural(maxColours, "colour", "colours")}`;
    add(
      charge("decoration", `${methodLabel}, ${locationsText}, ${colourText}`, totalQuantity, unit, "garment"),
      true,
    );
    add(
      charge(
        "setup-screens",
        `Setup fee: ${plural(screens, "screen", "screens")}`,
        screens,
        sp.setupFeePerScreenCents,
        "screen",
      ),
      false,
    );
  } else if (method === "dtf") {
    const dtf = matrix.dtf;
    brk = findQuantityBreak(dtf.quantityBreaks, totalQuantity);
    const unit = lookup(dtf.pricesCents[brk.index], locations - 1, `DTF pressing on ${locationsText}`);
    add(charge("decoration", `DTF pressing, ${locationsText}`, totalQuantity, unit, "garment"), true);
    const area = input.dtfAreaIn2;
    if (area !== undefined && (!Number.isFinite(area) || area <= 0 || area > MAX_DTF_AREA_IN2))
      fail("Transfer area must be a positive number of in²");
    if (dtf.mode === "area") {
      if (area === undefined) fail("DTF by area needs the transfer area per garment (in²)");
      const perGarment = multiplyRoundHalfUp(area, dtf.centsPerSquareInch);
      add(
        charge(
          "dtf-transfers",
          `DTF transfers, ${formatInches(area)} in² per garment`,
          totalQuantity,
          perGarment,
          "garment",
        ),
        true,
      );
    } else {
      let length = input.gangSheetLengthIn;
      if (length !== undefined && (!Number.isFinite(length) || length <= 0 || length > MAX_GANG_SHEET_IN)) {
        fail("Gang sheet length must be a positive number of inches");
      }
      let estimated = false;
      if (length === undefined) {
        if (area === undefined)
          fail("DTF by length needs the gang sheet length, or the transfer area per garment to estimate it");
        length = (area * totalQuantity) / dtf.rollWidthIn;
        estimated = true;
        if (length > MAX_GANG_SHEET_IN) fail("The estimated gang sheet is too long");
      }
      // Whole inches, rounded up; the small tolerance keeps 57.0000000001 (float noise) at 57.
      const billed = Math.max(1, Math.ceil(length - 1e-9));
      const label = `Gang sheet, ${formatInches(dtf.rollWidthIn)} in roll, ${billed} in${estimated ? " (estimated from area)" : ""}`;
      add(charge("gang-sheet", label, billed, dtf.centsPerInchOfSheet, "inch"), true);
    }
  } else {
    const tier = matrix[method];
    brk = findQuantityBreak(tier.quantityBreaks, totalQuantity);
    const unit = lookup(tier.pricesCents[brk.index], locations - 1, `${methodLabel} on ${locationsText}`);
    add(charge("decoration", `${methodLabel}, ${locationsText}`, totalQuantity, unit, "garment"), true);
  }

  // Size upcharges, one line per band, in size order.
  for (const band of upchargeBands(matrix.sizeUpcharges, sizeOrder)) {
    let count = 0;
    for (let i = band.start; i <= band.end; i++) count += bySize.get(sizeOrder[i]!) ?? 0;
    add(charge(`upcharge:${band.fromSize}`, bandLabel(band, sizeOrder), count, band.cents, "garment"), true);
  }

  // Rush: on everything per garment, not on one-off setup.
  if (input.rush) {
    const base = rushable.reduce((s, l) => s + l.totalCents, 0);
    const fee = percentOfCents(base, matrix.rushFeePercent);
    add(charge("rush", `Rush fee (${matrix.rushFeePercent}%)`, 1, fee, "order"), false);
  }

  if (brk.belowMinimum) {
    lines.push({
      key: "note:below-minimum",
      label: `Below the ${brk.breakQuantity}-piece minimum: priced at the ${brk.breakQuantity}-piece break`,
      quantity: totalQuantity,
      unitCents: 0,
      totalCents: 0,
      unit: "note",
    });
  }

  const subtotalCents = lines.reduce((s, l) => s + l.totalCents, 0);
  const taxableCents = input.taxExempt ? 0 : subtotalCents;
  const taxCents = percentOfCents(taxableCents, matrix.taxRatePercent);
  const totalCents = subtotalCents + taxCents;
  const depositCents = percentOfCents(totalCents, matrix.depositPercent);
  return {
    currency: matrix.currency,
    method,
    lines,
    subtotalCents,
    taxableCents,
    taxCents,
    totalCents,
    depositCents,
    balanceCents: totalCents - depositCents,
    totalQuantity,
    breakQuantity: brk.breakQuantity,
    belowMinimum: brk.belowMinimum,
    screens,
  };
}

export type QuoteResult = { ok: true; quote: Quote } | { ok: false; code: PricingErrorCode; message: string };

/** `computeQuote` that returns its error instead of throwing (for forms that quote as you type). */
export function tryComputeQuote(input: QuoteInput): QuoteResult {
  try {
    return { ok: true, quote: computeQuote(input) };
  } catch (error) {
    if (error instanceof PricingError) return { ok: false, code: error.code, message: error.message };
    throw error;
  }
}

// ---------------------------------------------------------------------------
// Display
// ---------------------------------------------------------------------------

/** Money text comes from lib/money.ts only; re-exported here for the quote code's callers. */
export { formatCents } from "./money";
