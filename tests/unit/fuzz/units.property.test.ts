import fc from "fast-check";
import { describe, expect, it, vi } from "vitest";
import {
  EIGHTH_IN,
  cmToIn,
  degToRad,
  formatLength,
  inToCm,
  inToMm,
  inchesToScreenPx,
  mmToIn,
  normalizeDegrees,
  parseLength,
  pxPerInchFromCardWidth,
  radToDeg,
  screenPxToInches,
  snapToStep,
} from "@/lib/units";
import { reachCounter } from "./reach";

// Property runs share two cores with other work; give them room beyond the 5 s default.
vi.setConfig({ testTimeout: 30_000 });

/**
 * Least share of generated cases that must reach each guarded check (reach.ts). Each is set well
 * below the share measured over several seeds, noted beside it, so chance alone does not fail it.
 */
const SHARE = {
  ordered: 0.3, // measured 0.46 to 0.52 of the draws
  accepted: 0.1, // measured 0.18 to 0.2
  refused: 0.5, // measured 0.8 to 0.82
};

const length = fc.double({ min: -1e6, max: 1e6, noNaN: true });
const anyDouble = fc.double();
const closeRel = (a: number, b: number, rel = 1e-12) =>
  Math.abs(a - b) <= rel * Math.max(1, Math.abs(a), Math.abs(b));

describe("unit conversions", () => {
  it("round-trip in ↔ cm, in ↔ mm, deg ↔ rad and in ↔ screen px to within float rounding", () => {
    fc.assert(
      fc.property(length, fc.double({ min: 1, max: 1000, noNaN: true }), (x, pxPerInch) => {
        expect(closeRel(cmToIn(inToCm(x)), x)).toBe(true);
        expect(closeRel(inToCm(cmToIn(x)), x)).toBe(true);
        expect(closeRel(mmToIn(inToMm(x)), x)).toBe(true);
        expect(closeRel(radToDeg(degToRad(x)), x)).toBe(true);
        expect(closeRel(screenPxToInches(inchesToScreenPx(x, pxPerInch), pxPerInch), x)).toBe(true);
        // 1 in = 2.54 cm = 25.4 mm (NIST SP 811): ten millimetres to the centimetre, both ways.
        expect(closeRel(inToMm(x), 10 * inToCm(x))).toBe(true);
      }),
      { numRuns: 500 },
    );
  });

  it("keep the sign and the order of lengths", () => {
    const thousandths = fc.integer({ min: -1e9, max: 1e9 }).map((n) => n / 1000);
    const reach = reachCounter("sign and order");
    fc.assert(
      fc.property(thousandths, thousandths, (a, b) => {
        reach.generated();
        fc.pre(a < b);
        reach.reached("an ordered pair");
        expect(inToCm(a)).toBeLessThan(inToCm(b));
        expect(cmToIn(a)).toBeLessThan(cmToIn(b));
        expect(Math.sign(inToMm(a))).toBe(Math.sign(a));
      }),
      { seed: reach.seed },
    );
    // fast-check draws again after fc.pre rejects a pair, so every run reaches the check; the
    // share says how many draws that took.
    reach.expectShare("an ordered pair", SHARE.ordered);
  });
});

describe("normalizeDegrees", () => {
  it("lands in (-180, 180], equals the input modulo 360, and never gives -0", () => {
    fc.assert(
      fc.property(fc.double({ min: -1e7, max: 1e7, noNaN: true }), (deg) => {
        const d = normalizeDegrees(deg);
        expect(d).toBeGreaterThan(-180);
        expect(d).toBeLessThanOrEqual(180);
        expect(Object.is(d, -0)).toBe(false);
        const turns = (deg - d) / 360;
        expect(Math.abs(turns - Math.round(turns))).toBeLessThan(1e-6);
        expect(normalizeDegrees(d)).toBe(d);
      }),
      { numRuns: 500 },
    );
  });
});

describe("snapToStep", () => {
  it("lands on a multiple of the step within half a step, and snapping again changes nothing", () => {
    fc.assert(
      fc.property(length, fc.constantFrom(EIGHTH_IN, 0.25, 0.5, 1, 0.1, 0.0625), (x, step) => {
        const s = snapToStep(x, step);
        expect(Number.isFinite(s)).toBe(true);
        expect(Math.abs(s - x)).toBeLessThanOrEqual(step / 2 + 1e-9 * Math.max(1, Math.abs(x)));
        const k = s / step;
        expect(Math.abs(k - Math.round(k))).toBeLessThan(1e-6);
        expect(snapToStep(s, step)).toBe(s);
        expect(Object.is(s, -0)).toBe(false);
      }),
      { numRuns: 500 },
    );
  });

  it("leaves the value alone for a step that is not positive, and for a value that is not finite", () => {
    fc.assert(
      fc.property(anyDouble, fc.oneof(fc.double({ max: 0 }), fc.constant(Number.NaN)), (x, step) => {
        expect(Object.is(snapToStep(x, step), x)).toBe(true);
      }),
    );
  });
});

describe("formatLength", () => {
  it("never throws and never prints NaN or Infinity, for any number at all", () => {
    fc.assert(
      fc.property(
        anyDouble,
        fc.constantFrom("in" as const, "cm" as const),
        fc.boolean(),
        fc.integer({ min: 0, max: 6 }),
        (x, unit, decimal, digits) => {
          for (const text of [
            formatLength(x, unit),
            formatLength(x, unit, { decimal, digits }),
            formatLength(x, unit, { withUnit: false }),
          ]) {
            expect(text).not.toMatch(/NaN|Infinity|undefined/);
            expect(text.length).toBeGreaterThan(0);
          }
        },
      ),
      { numRuns: 1000 },
    );
  });

  it("huge finite lengths print as the number they are, instead of overflowing the eighths or losing exponent zeros", () => {
    for (const x of [2.4e307, -Number.MAX_VALUE, 1e300, -1.5e200, 2 ** 60]) {
      expect(formatLength(x, "in")).toBe(`${String(Math.round(x))} in`);
      const decimal = formatLength(x, "in", { decimal: true, withUnit: false });
      expect(Math.abs(Number(decimal) - x)).toBeLessThanOrEqual(Math.abs(x) * 1e-15);
    }
    expect(formatLength(Number.MAX_VALUE, "cm")).toBe("— cm");
  });

  it("round-trips through parseLength: eighths to the nearest eighth, decimals to their digits, cm to 0.05 mm", () => {
    fc.assert(
      fc.property(fc.double({ min: -5000, max: 5000, noNaN: true }), (x) => {
        const eighths = parseLength(formatLength(x, "in"), "in", { allowNegative: true });
        expect(eighths.ok).toBe(true);
        if (eighths.ok)
          expect(eighths.inches).toBeCloseTo((Math.sign(x) * Math.round(Math.abs(x) * 8)) / 8, 9);

        const decimal = parseLength(formatLength(x, "in", { decimal: true, digits: 4 }), "in", {
          allowNegative: true,
        });
        expect(decimal.ok).toBe(true);
        if (decimal.ok) expect(Math.abs(decimal.inches - x)).toBeLessThanOrEqual(0.00005 + 1e-9);

        const cm = parseLength(formatLength(x, "cm", { digits: 3 }), "in", { allowNegative: true });
        expect(cm.ok).toBe(true);
        if (cm.ok) expect(Math.abs(cm.inches - x) * 2.54).toBeLessThanOrEqual(0.0005 + 1e-9);
      }),
      { numRuns: 500 },
    );
  });
});

describe("parseLength", () => {
  const typed = fc.oneof(
    fc.string({ unit: "grapheme", maxLength: 30 }),
    fc.string({ unit: fc.constantFrom(..."0123456789 ./-−,'\"″incmCMINm"), maxLength: 20 }),
    fc
      .tuple(
        fc.nat(1e6),
        fc.nat(64),
        fc.integer({ min: 0, max: 64 }),
        fc.constantFrom("", " in", "cm", " mm", '"', " inches"),
      )
      .map(([w, n, d, u]) => `${w} ${n}/${d}${u}`),
  );

  it("never throws on any text; an accepted length is a finite number, zero or more unless negatives are allowed", () => {
    const reach = reachCounter("parseLength");
    fc.assert(
      fc.property(
        typed,
        fc.constantFrom("in" as const, "cm" as const),
        fc.boolean(),
        (text, unit, allowNegative) => {
          reach.generated();
          const r = parseLength(text, unit, { allowNegative });
          reach.reached(r.ok ? "an accepted length" : "a refusal");
          if (r.ok) {
            expect(Number.isFinite(r.inches)).toBe(true);
            expect(Object.is(r.inches, -0)).toBe(false);
            if (!allowNegative) expect(r.inches).toBeGreaterThanOrEqual(0);
          } else {
            expect(r.message.length).toBeGreaterThan(0);
          }
        },
      ),
      { numRuns: 1000, seed: reach.seed },
    );
    reach.expectShare("an accepted length", SHARE.accepted);
    reach.expectShare("a refusal", SHARE.refused);
  });

  it("reads the same length in cm as 2.54 times the inches (NIST SP 811)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 100_000 }).map((n) => n / 100),
        (x) => {
          const asIn = parseLength(`${x} in`, "cm");
          const asCm = parseLength(`${x * 2.54} cm`, "in");
          expect(asIn.ok && asCm.ok).toBe(true);
          if (asIn.ok && asCm.ok) expect(asCm.inches).toBeCloseTo(asIn.inches, 9);
        },
      ),
    );
  });
});

describe("pxPerInchFromCardWidth", () => {
  it("is positive and finite for any positive finite card width, proportional to it, and refuses the rest", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-3, max: 1e6, noNaN: true }), (px) => {
        const ppi = pxPerInchFromCardWidth(px);
        expect(ppi).toBeGreaterThan(0);
        expect(Number.isFinite(ppi)).toBe(true);
        expect(closeRel(pxPerInchFromCardWidth(2 * px), 2 * ppi)).toBe(true);
      }),
    );
    fc.assert(
      fc.property(fc.oneof(fc.double({ max: 0 }), fc.constant(Number.NaN), fc.constant(Infinity)), (px) => {
        expect(() => pxPerInchFromCardWidth(px)).toThrow(RangeError);
      }),
    );
  });
});
