/**
 * Units and coordinate spaces for the true-scale editor.
 *
 * Everything the trade measures is kept in inches ("garment inches"). Pixels only
 * appear at the edges: stage pixels (the canvas's own space, before zoom) and
 * screen pixels (what the user's display shows, after calibration).
 */

declare const unitBrand: unique symbol;

/** A number tagged with the space it lives in, so inches and pixels cannot be mixed by accident. */
export type Branded<T, Tag extends string> = T & { readonly [unitBrand]: Tag };

export type Inches = Branded<number, "Inches">;
export type Centimeters = Branded<number, "Centimeters">;
export type Millimeters = Branded<number, "Millimeters">;
/** Canvas stage units, before the view's zoom is applied. */
export type StagePx = Branded<number, "StagePx">;
/** CSS pixels on the user's display. */
export type ScreenPx = Branded<number, "ScreenPx">;
export type Degrees = Branded<number, "Degrees">;
export type Radians = Branded<number, "Radians">;

export const inches = (n: number): Inches => n as Inches;
export const centimeters = (n: number): Centimeters => n as Centimeters;
export const millimeters = (n: number): Millimeters => n as Millimeters;
export const stagePx = (n: number): StagePx => n as StagePx;
export const screenPx = (n: number): ScreenPx => n as ScreenPx;
export const degrees = (n: number): Degrees => n as Degrees;
export const radians = (n: number): Radians => n as Radians;

/** NIST SP 811: 1 in = 25.4 mm exactly. */
export const MM_PER_INCH = 25.4;
/** NIST SP 811: 1 in = 2.54 cm exactly. */
export const CM_PER_INCH = 2.54;
/** CSS Values and Units Level 3: 1in = 96px. */
export const CSS_PX_PER_INCH = 96;
/** ISO 32000 (PDF): default user space unit is 1/72 in. */
export const PDF_UNITS_PER_INCH = 72;
/** ISO/IEC 7810 ID-1 card size, in millimetres. */
export const ID1_CARD_MM = { width: 85.6, height: 53.98 } as const;
/** One shared float tolerance for comparisons in inches (far below anything a press can hold). */
export const EPSILON_IN = 1e-6;
/** The finest step the trade usually quotes a print size in. */
export const EIGHTH_IN = 0.125;

export type LengthUnit = "in" | "cm";

export function inToCm(value: number): Centimeters {
  return centimeters(value * CM_PER_INCH);
}

export function cmToIn(value: number): Inches {
  return inches(value / CM_PER_INCH);
}

export function inToMm(value: number): Millimeters {
  return millimeters(value * MM_PER_INCH);
}

export function mmToIn(value: number): Inches {
  return inches(value / MM_PER_INCH);
}

export function degToRad(value: number): Radians {
  return radians((value * Math.PI) / 180);
}

export function radToDeg(value: number): Degrees {
  return degrees((value * 180) / Math.PI);
}

/** Garment inches to screen pixels at a calibrated scale. */
export function inchesToScreenPx(value: number, pxPerInch: number): ScreenPx {
  return screenPx(value * pxPerInch);
}

/** Screen pixels back to garment inches at a calibrated scale. */
export function screenPxToInches(value: number, pxPerInch: number): Inches {
  return inches(value / pxPerInch);
}

/** Wraps an angle into (-180, 180]. */
export function normalizeDegrees(value: number): Degrees {
  let d = value % 360;
  if (d <= -180) d += 360;
  if (d > 180) d -= 360;
  return degrees(d === 0 ? 0 : d);
}

/** Rounds to the nearest multiple of `step`; a non-positive step leaves the value alone. */
export function snapToStep(value: number, step: number): number {
  if (!(step > 0) || !Number.isFinite(value)) return value;
  const snapped = Math.round(value / step) * step;
  // Clear binary noise such as 0.30000000000000004 without changing real values.
  const cleaned = Number(snapped.toFixed(10));
  return cleaned === 0 ? 0 : cleaned;
}

export function nearlyEqual(a: number, b: number, eps: number = EPSILON_IN): boolean {
  return Math.abs(a - b) <= eps;
}

export interface FormatLengthOptions {
  /** Show a decimal instead of eighths (inches only; cm is always decimal). */
  decimal?: boolean;
  /** Decimal places: default 2 for decimal inches, 1 for cm. Trailing zeros are trimmed for inches. */
  digits?: number;
  /** Append the unit ("in" or "cm"); default true. */
  withUnit?: boolean;
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

function formatEighths(value: number): string {
  const sign = value < 0 ? "-" : "";
  const totalEighths = Math.round(Math.abs(value) / EIGHTH_IN);
  // Past 2^53 eighths no fraction is left to show (and Infinity would send gcd round forever).
  if (!Number.isSafeInteger(totalEighths)) return String(Math.round(value));
  if (totalEighths === 0) return "0";
  const whole = Math.floor(totalEighths / 8);
  const rest = totalEighths % 8;
  if (rest === 0) return `${sign}${whole}`;
  const d = gcd(rest, 8);
  const fraction = `${rest / d}/${8 / d}`;
  return whole === 0 ? `${sign}${fraction}` : `${sign}${whole} ${fraction}`;
}

function formatDecimal(value: number, digits: number, trim: boolean): string {
  let text = value.toFixed(digits);
  // toFixed writes 1e21 and up with an exponent, whose zeros are not trailing decimals.
  if (trim && text.includes(".") && !text.includes("e")) text = text.replace(/\.?0+$/, "");
  if (/^-0(\.0*)?$/.test(text)) text = text.slice(1);
  return text;
}

/**
 * Formats a length given in inches: `11 1/8 in` (nearest eighth), `11.13 in` with
 * `decimal`, or `28.3 cm`.
 */
export function formatLength(value: number, unit: LengthUnit, opts: FormatLengthOptions = {}): string {
  const withUnit = opts.withUnit ?? true;
  if (!Number.isFinite(value)) return withUnit ? `— ${unit}` : "—";
  let text: string;
  if (unit === "cm") {
    const cm = value * CM_PER_INCH;
    // Past about 7e307 in, the centimetres overflow to Infinity: show the same dash.
    if (!Number.isFinite(cm)) return withUnit ? `— ${unit}` : "—";
    text = formatDecimal(cm, opts.digits ?? 1, false);
  } else if (opts.decimal) {
    text = formatDecimal(value, opts.digits ?? 2, true);
  } else {
    text = formatEighths(value);
  }
  return withUnit ? `${text} ${unit}` : text;
}

/**
 * A length as the user reads it: a whole number of the unit's display steps, rounded exactly as
 * formatLength rounds (inches to the nearest 1/8 in, centimetres to 0.1 cm). Two lengths with the
 * same steps read the same on screen.
 */
export function shownSteps(valueIn: number, unit: LengthUnit): number {
  if (!Number.isFinite(valueIn)) return valueIn;
  if (unit === "cm") {
    const cm = valueIn * CM_PER_INCH;
    if (!Number.isFinite(cm)) return cm;
    // formatLength writes cm with toFixed(1); read its digits back so the two can never disagree.
    const steps = Math.round(Number(cm.toFixed(1)) * 10);
    return steps === 0 ? 0 : steps;
  }
  const steps = Math.round(Math.abs(valueIn) / EIGHTH_IN);
  return valueIn < 0 && steps !== 0 ? -steps : steps;
}

/**
 * True when `valueIn` is past (above) `limitIn` as both are shown in `unit`: equal readings are never
 * past, so a warning built on this always shows two different numbers.
 */
export function pastLimit(valueIn: number, limitIn: number, unit: LengthUnit): boolean {
  return shownSteps(valueIn, unit) > shownSteps(limitIn, unit);
}

/** True when `valueIn` falls short of (below) `limitIn` as both are shown in `unit`. */
export function shortOf(valueIn: number, limitIn: number, unit: LengthUnit): boolean {
  return shownSteps(valueIn, unit) < shownSteps(limitIn, unit);
}

/** Rounds a length in inches down to the display step of inches (1/8 in); only float noise (under 1e-9 of a step) rounds up. */
export function floorToEighth(valueIn: number): number {
  if (!Number.isFinite(valueIn)) return valueIn;
  // A value a hair under a step (binary noise such as 9.999999999) still counts as that step.
  const steps = Math.floor(valueIn / EIGHTH_IN + 1e-9);
  const out = steps * EIGHTH_IN;
  return out === 0 ? 0 : out;
}

export type ParseLengthResult = { ok: true; inches: number } | { ok: false; message: string };

export interface ParseLengthOptions {
  /** Accept a leading minus sign (for offsets); lengths are zero or more by default. */
  allowNegative?: boolean;
}

const UNIT_SUFFIXES: ReadonlyArray<{ pattern: RegExp; unit: LengthUnit | "mm" }> = [
  { pattern: /\s*(?:cm|centimet(?:er|re)s?)$/, unit: "cm" },
  { pattern: /\s*(?:mm|millimet(?:er|re)s?)$/, unit: "mm" },
  { pattern: /\s*(?:in|inch|inches|"|″|'')$/, unit: "in" },
];

const DECIMAL = /^(?:\d+(?:\.\d*)?|\.\d+)$/;
const FRACTION = /^(\d+)\s*\/\s*(\d+)$/;
const MIXED = /^(\d+)(?:\s+|\s*-\s*)(\d+)\s*\/\s*(\d+)$/;

/**
 * Reads a length typed by a person. Accepts `11`, `11.5`, `11 1/2`, `11-1/2`, `3/4`,
 * `28 cm`, `28cm`, `280 mm`, `11in`, `11"`. Without a suffix the number is read in `unit`.
 */
export function parseLength(
  text: string,
  unit: LengthUnit,
  opts: ParseLengthOptions = {},
): ParseLengthResult {
  let rest = text.trim().toLowerCase().replace(/,/g, ".");
  if (rest === "") return { ok: false, message: "Enter a length, for example 11 1/2 or 28 cm." };

  let readAs: LengthUnit | "mm" = unit;
  for (const suffix of UNIT_SUFFIXES) {
    if (suffix.pattern.test(rest)) {
      rest = rest.replace(suffix.pattern, "").trim();
      readAs = suffix.unit;
      break;
    }
  }

  let negative = false;
  if (rest.startsWith("-") || rest.startsWith("−")) {
    negative = true;
    rest = rest.slice(1).trim();
  }
  if (rest === "") return { ok: false, message: "Put a number before the unit, for example 11 in." };

  let amount: number;
  const mixed = MIXED.exec(rest);
  const fraction = FRACTION.exec(rest);
  if (DECIMAL.test(rest)) {
    amount = Number(rest);
  } else if (mixed) {
    const [, whole, top, bottom] = mixed;
    const num = Number(top);
    const den = Number(bottom);
    if (den === 0) return { ok: false, message: "The bottom number of a fraction can't be zero." };
    if (num >= den) {
      return { ok: false, message: "In a mixed number like 11 1/2, the fraction part must be less than 1." };
    }
    amount = Number(whole) + num / den;
  } else if (fraction) {
    const [, top, bottom] = fraction;
    const den = Number(bottom);
    if (den === 0) return { ok: false, message: "The bottom number of a fraction can't be zero." };
    amount = Number(top) / den;
  } else {
    return {
      ok: false,
      message: `"${text.trim()}" isn't a length we can read; try 11, 11.5, 11 1/2, 3/4 or 28 cm.`,
    };
  }

  if (negative) {
    if (!opts.allowNegative) return { ok: false, message: "Enter a length of zero or more." };
    amount = -amount;
  }

  const inchesValue =
    readAs === "cm" ? amount / CM_PER_INCH : readAs === "mm" ? amount / MM_PER_INCH : amount;
  if (!Number.isFinite(inchesValue)) return { ok: false, message: "That number is too large to use." };
  return { ok: true, inches: inchesValue === 0 ? 0 : inchesValue };
}

/** Width of an ID-1 card in inches (85.60 mm). */
export const ID1_CARD_WIDTH_IN = ID1_CARD_MM.width / MM_PER_INCH;

/**
 * Screen calibration: the user stretched an on-screen rectangle until it matched the
 * 85.60 mm width of an ID-1 card held against the display. Returns CSS px per real inch.
 */
export function pxPerInchFromCardWidth(cardWidthCssPx: number): number {
  if (!Number.isFinite(cardWidthCssPx) || cardWidthCssPx <= 0) {
    throw new RangeError("The card width on screen must be a positive number of pixels.");
  }
  return cardWidthCssPx / ID1_CARD_WIDTH_IN;
}

const COUNT = new Intl.NumberFormat("en-US", { maximumFractionDigits: 0 });

/** A whole count with thousands grouped: 66000 → "66,000" (pixel sizes, megapixels). */
export function formatCount(n: number): string {
  return COUNT.format(n);
}
