/**
 * Dates and times as a shop reads them: in the shop's own locale (BCP 47, e.g. "en-US") and
 * time zone (IANA, e.g. "America/Chicago"), through the platform's Intl (ECMA-402). A locale or
 * zone Intl does not know falls back to en-US and UTC, and the text says "UTC" so it is never
 * silently wrong.
 */

export const DEFAULT_LOCALE = "en-US";
export const DEFAULT_TIME_ZONE = "UTC";

export type ShopClock = { locale?: string | null; timeZone?: string | null };

export function isKnownLocale(locale: string): boolean {
  try {
    return Intl.DateTimeFormat.supportedLocalesOf([locale]).length > 0;
  } catch {
    return false;
  }
}

export function isKnownTimeZone(timeZone: string): boolean {
  try {
    new Intl.DateTimeFormat("en-US", { timeZone });
    return true;
  } catch {
    return false;
  }
}

function clock(c: ShopClock): { locale: string; timeZone: string } {
  const locale = c.locale && isKnownLocale(c.locale) ? c.locale : DEFAULT_LOCALE;
  const timeZone = c.timeZone && isKnownTimeZone(c.timeZone) ? c.timeZone : DEFAULT_TIME_ZONE;
  return { locale, timeZone };
}

/**
 * A calendar date ("2026-12-18" from a date column, or a Date) as the shop writes it, e.g.
 * "Dec 18, 2026". A date column has no time zone, so it is shown as written, never shifted.
 */
export function formatShopDate(value: string | Date, c: ShopClock = {}): string {
  const { locale, timeZone } = clock(c);
  if (typeof value === "string") {
    const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(value);
    if (!m) return value;
    const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
    return new Intl.DateTimeFormat(locale, { dateStyle: "medium", timeZone: "UTC" }).format(d);
  }
  return new Intl.DateTimeFormat(locale, { dateStyle: "medium", timeZone }).format(value);
}

/** An instant as the shop's clock shows it, with the zone named: "Dec 4, 2026, 12:56 AM CST". */
export function formatShopDateTime(at: Date, c: ShopClock = {}): string {
  const { locale, timeZone } = clock(c);
  // ECMA-402 refuses timeZoneName beside dateStyle, so the parts are named one by one.
  return new Intl.DateTimeFormat(locale, { year: "numeric", month: "short", day: "numeric", hour: "numeric", minute: "2-digit", timeZone, timeZoneName: "short" }).format(at);
}

/** A time of day on the shop's clock: "3:04 PM". For "Saved at …" beside a form the user just sent. */
export function formatShopTime(at: Date, c: ShopClock = {}): string {
  const { locale, timeZone } = clock(c);
  return new Intl.DateTimeFormat(locale, { timeStyle: "short", timeZone }).format(at);
}

/**
 * The calendar day of an instant on the shop's clock as YYYY-MM-DD (ISO 8601), for file names:
 * it sorts, and reads the same in every locale.
 */
export function fileDateStamp(at: Date, c: ShopClock = {}): string {
  const { timeZone } = clock(c);
  const parts = new Intl.DateTimeFormat("en-CA", { year: "numeric", month: "2-digit", day: "2-digit", timeZone }).formatToParts(at);
  const get = (t: string) => parts.find((p) => p.type === t)?.value ?? "";
  return `${get("year")}-${get("month")}-${get("day")}`;
}

/** The day and time of an instant on the shop's clock, for file names: "2026-12-04-1530". */
export function fileTimeStamp(at: Date, c: ShopClock = {}): string {
  const { timeZone } = clock(c);
  const parts = new Intl.DateTimeFormat("en-CA", { hour: "2-digit", minute: "2-digit", hourCycle: "h23", timeZone }).formatToParts(at);
  const get = (t: string) => parts.find((p) => p.type === t)?.value ?? "";
  return `${fileDateStamp(at, c)}-${get("hour")}${get("minute")}`;
}

/** The browser's own locale and time zone, as a new shop starts with them. */
export function browserClock(): { locale: string; timeZone: string } {
  const o = Intl.DateTimeFormat().resolvedOptions();
  return { locale: o.locale, timeZone: o.timeZone };
}

/** "2027-02-28" is a day; "2027-02-31" is not (Date.parse would roll it over to March). */
export function isCalendarDay(v: string): boolean {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(v);
  if (!m) return false;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const at = new Date(Date.UTC(y, mo - 1, d));
  return at.getUTCFullYear() === y && at.getUTCMonth() === mo - 1 && at.getUTCDate() === d;
}
