import { describe, expect, it } from "vitest";
import { currencySymbol, formatMoney, moneyInputValue } from "@/lib/money";

// Expected texts are what ECMA-402 Intl.NumberFormat writes with the CLDR data in Node 20's ICU
// (reference library: the platform's Intl). ISO 4217 gives USD, EUR, GBP and CAD two minor digits.
describe("money text", () => {
  it.each([
    [450, { currency: "usd", locale: "en-US" }, "$4.50"],
    [1100, { currency: "usd", locale: "en-US" }, "$11.00"],
    [123456, { currency: "usd", locale: "en-US" }, "$1,234.56"],
    [-250, { currency: "usd", locale: "en-US" }, "-$2.50"],
    [123456, { currency: "gbp", locale: "en-GB" }, "£1,234.56"],
    [123456, { currency: "eur", locale: "de-DE" }, "1.234,56\u00a0€"],
    [123456, { currency: "eur", locale: "fr-FR" }, "1\u202f234,56\u00a0€"],
  ] as const)("%i cents in %o is %s", (cents, style, expected) => {
    expect(formatMoney(cents, style)).toBe(expected);
  });

  it("always shows two decimals, and refuses part of a cent", () => {
    expect(formatMoney(430)).toBe("$4.30");
    expect(() => formatMoney(4.5)).toThrow(/whole number of cents/);
  });

  it("falls back to en-US for a locale the platform does not know", () => {
    expect(formatMoney(850, { currency: "usd", locale: "xx-invalid-locale-tag-too-long-to-be-valid" })).toBe("$8.50");
  });

  it("gives a money field its sign and two decimals, with the only decimal point a number field takes", () => {
    expect(currencySymbol({ currency: "usd" })).toBe("$");
    expect(currencySymbol({ currency: "gbp", locale: "en-GB" })).toBe("£");
    expect(currencySymbol({ currency: "eur", locale: "de-DE" })).toBe("€");
    expect(moneyInputValue(4.5)).toBe("4.50");
    expect(moneyInputValue(1234.5)).toBe("1234.50");
    expect(moneyInputValue(Number.NaN)).toBe("");
  });
});
