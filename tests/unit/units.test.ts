import { describe, expect, it } from "vitest";
import {
  CM_PER_INCH,
  CSS_PX_PER_INCH,
  EIGHTH_IN,
  EPSILON_IN,
  ID1_CARD_MM,
  MM_PER_INCH,
  PDF_UNITS_PER_INCH,
  cmToIn,
  degToRad,
  formatLength,
  inToCm,
  inToMm,
  inches,
  inchesToScreenPx,
  mmToIn,
  nearlyEqual,
  normalizeDegrees,
  parseLength,
  pxPerInchFromCardWidth,
  radToDeg,
  screenPxToInches,
  snapToStep,
} from "@/lib/units";

describe("constants", () => {
  it("match their standards", () => {
    expect(MM_PER_INCH).toBe(25.4); // NIST SP 811: 1 in = 25.4 mm exactly
    expect(CM_PER_INCH).toBe(2.54); // NIST SP 811
    expect(CSS_PX_PER_INCH).toBe(96); // CSS Values and Units Level 3: 1in = 96px
    expect(PDF_UNITS_PER_INCH).toBe(72); // ISO 32000: 1 unit = 1/72 in
    expect(ID1_CARD_MM).toEqual({ width: 85.6, height: 53.98 }); // ISO/IEC 7810 ID-1
    expect(EIGHTH_IN).toBe(0.125);
    expect(EPSILON_IN).toBeGreaterThan(0);
    expect(EPSILON_IN).toBeLessThan(0.001);
  });
});

describe("conversions", () => {
  it.each([
    [1, 2.54, 25.4],
    [11, 27.94, 279.4],
    [0.125, 0.3175, 3.175],
    [0, 0, 0],
  ])("%d in is %d cm and %d mm (NIST SP 811)", (inchesValue, cm, mm) => {
    expect(inToCm(inchesValue)).toBeCloseTo(cm, 10);
    expect(inToMm(inchesValue)).toBeCloseTo(mm, 10);
    expect(cmToIn(cm)).toBeCloseTo(inchesValue, 10);
    expect(mmToIn(mm)).toBeCloseTo(inchesValue, 10);
  });

  it.each([
    [0, 0],
    [90, Math.PI / 2],
    [180, Math.PI],
    [-45, -Math.PI / 4],
  ])("%d° is %d rad", (deg, rad) => {
    expect(degToRad(deg)).toBeCloseTo(rad, 12);
    expect(radToDeg(rad)).toBeCloseTo(deg, 10);
  });

  it("converts inches to screen pixels and back at a calibrated scale", () => {
    expect(inchesToScreenPx(inches(2), 96)).toBeCloseTo(192, 10);
    expect(screenPxToInches(192, 96)).toBeCloseTo(2, 10);
  });

  it.each([
    [0, 0],
    [190, -170],
    [-190, 170],
    [180, 180],
    [-180, 180],
    [360, 0],
    [725, 5],
  ])("normalizes %d° to %d°", (input, expected) => {
    expect(normalizeDegrees(input)).toBeCloseTo(expected, 10);
  });
});

describe("snapToStep and nearlyEqual", () => {
  it.each([
    [11.06, 0.125, 11],
    [11.07, 0.125, 11.125],
    [0.3, 0.1, 0.3],
    [-2.3, 0.5, -2.5],
    [5, 0, 5],
    [5.3, -1, 5.3],
  ])("snaps %d to step %d as %d", (value, step, expected) => {
    expect(snapToStep(value, step)).toBeCloseTo(expected, 12);
  });

  it("cleans binary noise from the snapped value", () => {
    expect(snapToStep(0.3, 0.1)).toBe(0.3);
  });

  it.each([
    [1, 1 + 1e-7, EPSILON_IN, true],
    [1, 1 + 1e-5, EPSILON_IN, false],
    [1, 1.05, 0.1, true],
  ])("nearlyEqual(%d, %d, %d) is %s", (a, b, eps, expected) => {
    expect(nearlyEqual(a, b, eps)).toBe(expected);
  });

  it("uses the shared tolerance by default", () => {
    expect(nearlyEqual(2, 2 + EPSILON_IN / 2)).toBe(true);
    expect(nearlyEqual(2, 2 + EPSILON_IN * 2)).toBe(false);
  });
});

describe("formatLength", () => {
  it.each([
    [11.125, "11 1/8 in"],
    [11, "11 in"],
    [0.75, "3/4 in"],
    [11.5, "11 1/2 in"],
    [11.06, "11 in"],
    [11.07, "11 1/8 in"],
    [2.999, "3 in"],
    [0, "0 in"],
    [0.01, "0 in"],
    [-1.625, "-1 5/8 in"],
    [-0.01, "0 in"],
  ])("formats %d in to the nearest eighth as %s", (value, expected) => {
    expect(formatLength(value, "in")).toBe(expected);
  });

  it.each([
    [11.125, { decimal: true }, "11.13 in"],
    [11.5, { decimal: true }, "11.5 in"],
    [11, { decimal: true }, "11 in"],
    [0.0625, { decimal: true, digits: 3 }, "0.063 in"],
    [11.125, { withUnit: false }, "11 1/8"],
  ])("formats %d with %o as %s", (value, opts, expected) => {
    expect(formatLength(value, "in", opts)).toBe(expected);
  });

  it.each([
    [11.125, "28.3 cm"],
    [11, "27.9 cm"],
    [1, "2.5 cm"],
    [0, "0.0 cm"],
  ])("formats %d in as %s", (value, expected) => {
    expect(formatLength(value, "cm")).toBe(expected);
  });

  it("never prints NaN", () => {
    expect(formatLength(Number.NaN, "in")).not.toContain("NaN");
  });
});

describe("parseLength", () => {
  it.each([
    ["11", "in", 11],
    ["11.5", "in", 11.5],
    ["11 1/2", "in", 11.5],
    ["11-1/2", "in", 11.5],
    ["3/4", "in", 0.75],
    [" 3 / 4 ", "in", 0.75],
    ["28 cm", "in", 28 / 2.54],
    ["28cm", "in", 28 / 2.54],
    ["11in", "cm", 11],
    ["11 in", "cm", 11],
    ['11"', "cm", 11],
    ["11 1/8 inches", "cm", 11.125],
    ["28", "cm", 28 / 2.54],
    ["28,5", "cm", 28.5 / 2.54],
    ["280 mm", "in", 280 / 25.4],
    [".5", "in", 0.5],
    ["0", "in", 0],
  ] as const)("reads %s (default unit %s) as %d in", (text, unit, expected) => {
    const result = parseLength(text, unit);
    expect(result.ok).toBe(true);
    if (result.ok) expect(result.inches).toBeCloseTo(expected, 10);
  });

  it.each([
    ["", /enter a length/i],
    ["   ", /enter a length/i],
    ["abc", /isn't a length/i],
    ["11.5 1/2", /isn't a length/i],
    ["1/0", /can't be zero/i],
    ["11 5/4", /less than 1/i],
    ["-2", /zero or more/i],
    ["cm", /number before the unit/i],
    ["1" + "0".repeat(400), /too large/i],
  ])("rejects %j with a plain message", (text, message) => {
    const result = parseLength(text, "in");
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.message).toMatch(message);
  });

  it("accepts negatives when asked (offsets)", () => {
    const result = parseLength("-1 1/4", "in", { allowNegative: true });
    expect(result).toEqual({ ok: true, inches: -1.25 });
  });
});

describe("pxPerInchFromCardWidth", () => {
  it.each([
    // ISO/IEC 7810 ID-1 width 85.60 mm = 3.370 in; at 96 CSS px per inch the card is 323.53 px wide.
    [(85.6 / 25.4) * 96, 96],
    [(85.6 / 25.4) * 110, 110],
    [400, 400 / (85.6 / 25.4)],
  ])("a card matched at %d px gives %d px per inch", (px, expected) => {
    expect(pxPerInchFromCardWidth(px)).toBeCloseTo(expected, 9);
  });

  it.each([0, -10, Number.NaN, Number.POSITIVE_INFINITY])("rejects %d", (px) => {
    expect(() => pxPerInchFromCardWidth(px)).toThrow(RangeError);
  });
});
