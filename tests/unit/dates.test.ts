import { describe, expect, it } from "vitest";
import { fileDateStamp, fileTimeStamp, formatShopDate, formatShopDateTime, formatShopTime, isCalendarDay, isKnownLocale, isKnownTimeZone } from "@/lib/dates";

// Expected strings are what ECMA-402 Intl with the CLDR data in Node 20's ICU writes for these
// locales (reference library: the platform's Intl). 2026-12-04T00:56:27Z is 18:56 on Dec 3 in
// Chicago (CST, UTC−6 in December: IANA tz database).
const AT = new Date("2026-12-04T00:56:27.419Z");

describe("dates in the shop's clock", () => {
  it.each([
    ["en-US", "America/Chicago", "Dec 3, 2026, 6:56 PM CST"],
    ["en-US", "UTC", "Dec 4, 2026, 12:56 AM UTC"],
  ])("%s in %s writes %s", (locale, timeZone, expected) => {
    expect(formatShopDateTime(AT, { locale, timeZone }).replace(/\u202f/g, " ")).toBe(expected);
  });

  it("writes a date column as written, never shifted by a time zone", () => {
    expect(formatShopDate("2026-12-18", { locale: "en-US", timeZone: "Pacific/Kiritimati" })).toBe("Dec 18, 2026");
    expect(formatShopDate("2026-12-18", { locale: "en-GB" })).toBe("18 Dec 2026");
  });

  it("an instant's date follows the shop's zone (Dec 3 in Chicago, Dec 4 in UTC)", () => {
    expect(formatShopDate(AT, { locale: "en-US", timeZone: "America/Chicago" })).toBe("Dec 3, 2026");
    expect(formatShopDate(AT, { locale: "en-US", timeZone: "UTC" })).toBe("Dec 4, 2026");
  });

  it("falls back to en-US and UTC for a locale or zone the platform does not know, and says UTC", () => {
    expect(isKnownTimeZone("Mars/Olympus_Mons")).toBe(false);
    expect(isKnownTimeZone("America/Chicago")).toBe(true);
    expect(isKnownLocale("en-GB")).toBe(true);
    expect(formatShopDateTime(AT, { locale: "en-US", timeZone: "Mars/Olympus_Mons" })).toContain("UTC");
  });

  it("stamps file names with the shop's own day and time, ISO 8601 order (sorts in any locale)", () => {
    expect(fileDateStamp(AT, { timeZone: "America/Chicago" })).toBe("2026-12-03");
    expect(fileDateStamp(AT, { timeZone: "UTC" })).toBe("2026-12-04");
    expect(fileTimeStamp(AT, { timeZone: "America/Chicago" })).toBe("2026-12-03-1856");
    expect(fileTimeStamp(AT, { timeZone: "UTC" })).toBe("2026-12-04-0056");
  });

  it("writes a time of day on the shop's clock", () => {
    expect(formatShopTime(AT, { locale: "en-US", timeZone: "America/Chicago" }).replace(/\u202f/g, " ")).toBe("6:56 PM");
    expect(formatShopTime(AT, { locale: "en-GB", timeZone: "Europe/London" })).toBe("00:56");
  });

  // Gregorian calendar rules: February has 28 days, 29 in a leap year (2028 is one, 2027 is not).
  it.each([
    ["2027-02-28", true],
    ["2027-02-29", false],
    ["2028-02-29", true],
    ["2027-02-31", false],
    ["2027-13-01", false],
    ["27-02-01", false],
  ])("%s is a calendar day: %s", (v, ok) => {
    expect(isCalendarDay(v)).toBe(ok);
  });
});
