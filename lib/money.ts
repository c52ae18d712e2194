/**
 * Money as a shop reads and types it: the one place money becomes text. Amounts are kept in
 * whole cents (minor units of a two-decimal currency); display goes through the platform's
 * Intl.NumberFormat (ECMA-402) in the shop's locale, always with two decimals.
 */

export const SHOP_CURRENCIES = ["usd", "cad", "eur", "gbp", "aud", "nzd"] as const;
export type ShopCurrency = (typeof SHOP_CURRENCIES)[number];

export const CURRENCY_NAMES: Record<ShopCurrency, string> = {
  usd: "US dollar",
  cad: "Canadian dollar",
  eur: "Euro",
  gbp: "Pound sterling",
  aud: "Australian dollar",
  nzd: "New Zealand dollar",
};

export type MoneyStyle = { currency?: string | null; locale?: string | null };

const DEFAULT_LOCALE = "en-US";

function currencyFormat(style: MoneyStyle, display: "symbol" | "narrowSymbol" = "symbol"): Intl.NumberFormat {
  const currency = (style.currency ?? "usd").toUpperCase();
  const options: Intl.NumberFormatOptions = { style: "currency", currency, currencyDisplay: display, minimumFractionDigits: 2, maximumFractionDigits: 2 };
  try {
    return new Intl.NumberFormat(style.locale ?? DEFAULT_LOCALE, options);
  } catch {
    // A locale Intl does not know: fall back to en-US rather than fail a page.
    return new Intl.NumberFormat(DEFAULT_LOCALE, options);
  }
}

function assertCents(cents: number): void {
  if (!Number.isSafeInteger(cents)) throw new RangeError("Amount must be a whole number of cents");
}

/** Cents as money text: 123456 → "$1,234.56" (en-US, usd), "1.234,56 €" (de-DE, eur). */
export function formatMoney(cents: number, style: MoneyStyle = {}): string {
  assertCents(cents);
  return currencyFormat(style).format(cents / 100);
}

/** The currency's sign as the shop's locale writes it, for the prefix of a money field: "$", "€", "£". */
export function currencySymbol(style: MoneyStyle = {}): string {
  return currencyFormat(style, "narrowSymbol").formatToParts(0).find((p) => p.type === "currency")?.value ?? (style.currency ?? "usd").toUpperCase();
}

const INPUT_FORMAT = new Intl.NumberFormat("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2, useGrouping: false });

/**
 * An amount in major units as a money field holds it: always two decimals, no grouping and a
 * "." decimal point (the only one an HTML number field accepts): 4.5 → "4.50". Not a number → "".
 */
export function moneyInputValue(major: number): string {
  return Number.isFinite(major) ? INPUT_FORMAT.format(major) : "";
}

/** formatMoney with the currency code as its second argument, as the quote code calls it. */
export function formatCents(cents: number, currency: string = "usd", locale?: string | null): string {
  return formatMoney(cents, { currency, locale });
}
