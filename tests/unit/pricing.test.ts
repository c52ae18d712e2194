import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  DECORATION_METHODS,
  DEFAULT_PRICE_MATRIX,
  DEFAULT_SIZE_ORDER,
  PricingError,
  computeQuote,
  findQuantityBreak,
  formatCents,
  garmentCostFor,
  multiplyRoundHalfUp,
  parsePriceMatrix,
  percentOfCents,
  priceMatrixSchema,
  sizeRunTotal,
  tryComputeQuote,
  type PriceMatrix,
  type Quote,
  type QuoteInput,
} from "@/lib/pricing";

// The matrix and size runs below are invented for the tests (small round numbers so every
// expected value can be worked out by hand); each expected value has its sum beside it.

const TEST_MATRIX: PriceMatrix = {
  currency: "usd",
  depositPercent: 50,
  taxRatePercent: 8.25,
  rushFeePercent: 20,
  screenPrint: {
    quantityBreaks: [12, 24, 48],
    // [break][locations − 1][colours − 1]
    pricesCents: [
      [
        [500, 600, 700],
        [800, 950, 1100],
      ],
      [
        [400, 480, 560],
        [650, 780, 910],
      ],
      [
        [300, 360, 420],
        [520, 620, 720],
      ],
    ],
    setupFeePerScreenCents: 2000,
  },
  dtf: {
    mode: "area",
    centsPerSquareInch: 1.5,
    centsPerInchOfSheet: 100,
    rollWidthIn: 22,
    quantityBreaks: [1, 24],
    pricesCents: [
      [300, 500],
      [250, 400],
    ],
  },
  dtg: {
    quantityBreaks: [1, 12],
    pricesCents: [
      [900, 1400],
      [800, 1250],
    ],
  },
  htv: { quantityBreaks: [1], pricesCents: [[600, 1000]] },
  sublimation: { quantityBreaks: [6], pricesCents: [[1200]] },
  sizeUpcharges: [
    { fromSize: "2XL", cents: 200 },
    { fromSize: "3XL", cents: 300 },
  ],
  garmentCostCents: { default: 400, "heavy-tee": 550 },
};

const SIZE_ORDER = ["YS", "YM", "YL", "S", "M", "L", "XL", "2XL", "3XL", "4XL"];

function quote(overrides: Partial<QuoteInput>): Quote {
  return computeQuote({
    matrix: TEST_MATRIX,
    method: "htv",
    sizeRun: [{ size: "M", quantity: 1 }],
    sizeOrder: SIZE_ORDER,
    locations: 1,
    garmentCostCents: 0,
    rush: false,
    ...overrides,
  });
}

function line(q: Quote, key: string) {
  return q.lines.find((l) => l.key === key);
}

function pricingErrorCode(fn: () => unknown): string | undefined {
  try {
    fn();
  } catch (error) {
    if (error instanceof PricingError) return error.code;
    throw error;
  }
  return undefined;
}

describe("percentOfCents rounds half up, exactly", () => {
  it.each([
    { amount: 200, percent: 8.25, expected: 17 }, // 200 × 0.0825 = 16.5 → 17
    { amount: 199, percent: 8.25, expected: 16 }, // 16.4175 → 16
    { amount: 600, percent: 8.25, expected: 50 }, // 49.5 → 50
    { amount: 46208, percent: 8.25, expected: 3812 }, // 3812.16 → 3812
    { amount: 3000, percent: 4.35, expected: 131 }, // 130.5 → 131 (floating point says 130.49999999999997)
    { amount: 3000, percent: 1.15, expected: 35 }, // 34.5 → 35 (floating point says 34.49999999999999)
    { amount: 1, percent: 50, expected: 1 }, // 0.5 → 1
    { amount: 1083, percent: 50, expected: 542 }, // 541.5 → 542
    { amount: 0, percent: 8.25, expected: 0 },
    { amount: 12345, percent: 0, expected: 0 },
    { amount: 12345, percent: 100, expected: 12345 },
  ])("$percent % of $amount ¢ = $expected ¢", ({ amount, percent, expected }) => {
    expect(percentOfCents(amount, percent)).toBe(expected);
  });

  it("matches integer arithmetic for percentages with three decimals", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 1_000_000 }),
        fc.integer({ min: 0, max: 100_000 }),
        (amount, milli) => {
          // amount × (milli / 1000) / 100 = amount × milli / 100000, rounded half up.
          const expected = Math.floor((2 * amount * milli + 100_000) / 200_000);
          expect(percentOfCents(amount, milli / 1000)).toBe(expected);
        },
      ),
    );
  });

  it.each([
    { a: 12.5, b: 1.5, expected: 19 }, // 18.75 → 19
    { a: 10, b: 0.25, expected: 3 }, // 2.5 → 3
    { a: 1.005, b: 100, expected: 101 }, // 100.5 → 101 (floating point says 100.49999999999999)
    { a: 7, b: 0, expected: 0 },
  ])("multiplyRoundHalfUp($a, $b) = $expected", ({ a, b, expected }) => {
    expect(multiplyRoundHalfUp(a, b)).toBe(expected);
  });
});

describe("sizeRunTotal", () => {
  it.each([
    { run: [], expected: 0 },
    { run: [{ size: "M", quantity: 12 }], expected: 12 },
    // 3 + 0 + 7 = 10
    {
      run: [
        { size: "S", quantity: 3 },
        { size: "M", quantity: 0 },
        { size: "L", quantity: 7 },
      ],
      expected: 10,
    },
    // the same size twice counts twice: 5 + 4 = 9
    {
      run: [
        { size: "L", quantity: 5 },
        { size: "L", quantity: 4 },
      ],
      expected: 9,
    },
  ])("$expected garments", ({ run, expected }) => {
    expect(sizeRunTotal(run)).toBe(expected);
  });

  it.each([-1, 1.5, Number.NaN])("refuses a quantity of %s", (quantity) => {
    expect(pricingErrorCode(() => sizeRunTotal([{ size: "M", quantity }]))).toBe("invalid-input");
  });
});

describe("quantity breaks", () => {
  it.each([
    { quantity: 1, index: 0, breakQuantity: 12, belowMinimum: true },
    { quantity: 11, index: 0, breakQuantity: 12, belowMinimum: true },
    { quantity: 12, index: 0, breakQuantity: 12, belowMinimum: false },
    { quantity: 23, index: 0, breakQuantity: 12, belowMinimum: false },
    { quantity: 24, index: 1, breakQuantity: 24, belowMinimum: false },
    { quantity: 47, index: 1, breakQuantity: 24, belowMinimum: false },
    { quantity: 48, index: 2, breakQuantity: 48, belowMinimum: false },
    { quantity: 5000, index: 2, breakQuantity: 48, belowMinimum: false },
  ])("findQuantityBreak([12, 24, 48], $quantity) → the $breakQuantity break", (c) => {
    expect(findQuantityBreak([12, 24, 48], c.quantity)).toEqual({
      index: c.index,
      breakQuantity: c.breakQuantity,
      belowMinimum: c.belowMinimum,
    });
  });

  // Screen print, 1 location, 1 colour, blanks free: unit price from the table's first column
  // (500 / 400 / 300 ¢ at 12 / 24 / 48), plus one screen at 2000 ¢.
  it.each([
    { quantity: 11, unit: 500, decoration: 5500, belowMinimum: true }, // 11 × 500, priced at the 12 break
    { quantity: 12, unit: 500, decoration: 6000, belowMinimum: false }, // 12 × 500
    { quantity: 23, unit: 500, decoration: 11500, belowMinimum: false }, // 23 × 500
    { quantity: 24, unit: 400, decoration: 9600, belowMinimum: false }, // 24 × 400
    { quantity: 48, unit: 300, decoration: 14400, belowMinimum: false }, // 48 × 300
  ])("screen print, $quantity pieces → $unit ¢ each", ({ quantity, unit, decoration, belowMinimum }) => {
    const q = quote({ method: "screenPrint", colours: [1], sizeRun: [{ size: "L", quantity }] });
    expect(line(q, "decoration")).toMatchObject({ quantity, unitCents: unit, totalCents: decoration });
    expect(line(q, "setup-screens")).toMatchObject({ quantity: 1, unitCents: 2000, totalCents: 2000 });
    expect(q.belowMinimum).toBe(belowMinimum);
    expect(q.breakQuantity).toBe(belowMinimum ? 12 : quantity >= 48 ? 48 : quantity >= 24 ? 24 : 12);
    const note = line(q, "note:below-minimum");
    if (belowMinimum) {
      expect(note).toMatchObject({ quantity, unitCents: 0, totalCents: 0, unit: "note" });
      expect(note?.label).toContain("12-piece minimum");
    } else {
      expect(note).toBeUndefined();
    }
  });

  it("totals the 12-piece boundary by hand", () => {
    const q = quote({ method: "screenPrint", colours: [1], sizeRun: [{ size: "L", quantity: 12 }] });
    // 6000 + 2000 = 8000; tax 8000 × 0.0825 = 660; total 8660; deposit 4330.
    expect(q).toMatchObject({
      subtotalCents: 8000,
      taxCents: 660,
      totalCents: 8660,
      depositCents: 4330,
      balanceCents: 4330,
    });
  });

  it("uses each method's own breaks (sublimation starts at 6)", () => {
    // 5 pieces < 6: priced at the 6 break, 5 × 1200 = 6000, with the note.
    const q = quote({ method: "sublimation", sizeRun: [{ size: "S", quantity: 5 }] });
    expect(line(q, "decoration")).toMatchObject({ quantity: 5, unitCents: 1200, totalCents: 6000 });
    expect(q.belowMinimum).toBe(true);
    expect(line(q, "note:below-minimum")?.label).toContain("6-piece");
  });
});

describe("size upcharges", () => {
  // HTV, 1 location (600 ¢), blanks free. Run: S 5, L 5, XL 4, 2XL 3, 3XL 2, 4XL 1 = 20.
  const run = [
    { size: "S", quantity: 5 },
    { size: "L", quantity: 5 },
    { size: "XL", quantity: 4 },
    { size: "2XL", quantity: 3 },
    { size: "3XL", quantity: 2 },
    { size: "4XL", quantity: 1 },
  ];

  it("adds one line per band: 2XL alone, 3XL and up", () => {
    const q = quote({ sizeRun: run });
    // 2XL band (2XL only, 3XL starts its own): 3 × 200 = 600.
    expect(line(q, "upcharge:2XL")).toMatchObject({
      label: "Size upcharge: 2XL",
      quantity: 3,
      unitCents: 200,
      totalCents: 600,
    });
    // 3XL band runs to the end of the size order (3XL, 4XL): (2 + 1) × 300 = 900 — not 300 + 200.
    expect(line(q, "upcharge:3XL")).toMatchObject({
      label: "Size upcharge: 3XL and up",
      quantity: 3,
      unitCents: 300,
      totalCents: 900,
    });
    // 20 × 600 = 12000 decoration; + 600 + 900 = 13500.
    expect(q.subtotalCents).toBe(13500);
  });

  it("labels a band that stops before the end with its range", () => {
    const matrix = {
      ...TEST_MATRIX,
      sizeUpcharges: [
        { fromSize: "2XL", cents: 200 },
        { fromSize: "4XL", cents: 400 },
      ],
    };
    const q = quote({ matrix, sizeRun: run });
    // 2XL–3XL: 3 + 2 = 5 × 200 = 1000; 4XL (the last size, so a band of one): 1 × 400 = 400.
    expect(line(q, "upcharge:2XL")).toMatchObject({
      label: "Size upcharge: 2XL–3XL",
      quantity: 5,
      totalCents: 1000,
    });
    expect(line(q, "upcharge:4XL")).toMatchObject({
      label: "Size upcharge: 4XL",
      quantity: 1,
      totalCents: 400,
    });
  });

  it("charges nothing to youth and regular sizes", () => {
    const q = quote({
      sizeRun: [
        { size: "YS", quantity: 10 },
        { size: "XL", quantity: 10 },
      ],
    });
    expect(q.lines.filter((l) => l.key.startsWith("upcharge:"))).toEqual([]);
  });

  it("ignores an upcharge for a size the blank does not have", () => {
    // This blank stops at 2XL: the 3XL entry never applies, and 2XL becomes the last band.
    const q = quote({ sizeOrder: ["S", "M", "L", "XL", "2XL"], sizeRun: [{ size: "2XL", quantity: 4 }] });
    expect(q.lines.filter((l) => l.key.startsWith("upcharge:"))).toEqual([
      {
        key: "upcharge:2XL",
        label: "Size upcharge: 2XL",
        quantity: 4,
        unitCents: 200,
        totalCents: 800,
        unit: "garment",
      },
    ]);
  });

  it("refuses a size that is not in the size order", () => {
    expect(pricingErrorCode(() => quote({ sizeRun: [{ size: "7XL", quantity: 1 }] }))).toBe("unknown-size");
  });
});

describe("screen print setup fees", () => {
  it.each([
    // 24 pieces → the 24 break; 2 locations; the highest colour count picks the column.
    {
      colours: [3, 1],
      screens: 4,
      setup: 8000,
      unit: 910,
      label: "Screen print, 2 locations, up to 3 colours",
    }, // 4 × 2000; [1][1][2]
    {
      colours: [1, 1],
      screens: 2,
      setup: 4000,
      unit: 650,
      label: "Screen print, 2 locations, up to 1 colour",
    }, // 2 × 2000; [1][1][0]
    {
      colours: [2, 3],
      screens: 5,
      setup: 10000,
      unit: 910,
      label: "Screen print, 2 locations, up to 3 colours",
    }, // 5 × 2000
  ])("colours $colours → $screens screens", ({ colours, screens, setup, unit, label }) => {
    const q = quote({ method: "screenPrint", locations: 2, colours, sizeRun: [{ size: "M", quantity: 24 }] });
    expect(q.screens).toBe(screens);
    expect(line(q, "setup-screens")).toMatchObject({
      quantity: screens,
      unitCents: 2000,
      totalCents: setup,
      unit: "screen",
    });
    expect(line(q, "decoration")).toMatchObject({ label, unitCents: unit, totalCents: 24 * unit });
  });

  it("leaves the setup line out when the shop charges nothing per screen", () => {
    const matrix = { ...TEST_MATRIX, screenPrint: { ...TEST_MATRIX.screenPrint, setupFeePerScreenCents: 0 } };
    const q = quote({ matrix, method: "screenPrint", colours: [2], sizeRun: [{ size: "M", quantity: 12 }] });
    expect(line(q, "setup-screens")).toBeUndefined();
    expect(q.screens).toBe(2);
  });

  it.each([
    { locations: 2, colours: [3], code: "invalid-input" }, // one colour count for two locations
    { locations: 1, colours: undefined, code: "invalid-input" },
    { locations: 1, colours: [0], code: "invalid-input" },
    { locations: 1, colours: [4], code: "no-price" }, // the table stops at 3 colours
    { locations: 3, colours: [1, 1, 1], code: "no-price" }, // and at 2 locations
  ])("refuses $locations location(s) with colours $colours ($code)", ({ locations, colours, code }) => {
    expect(pricingErrorCode(() => quote({ method: "screenPrint", locations, colours }))).toBe(code);
  });
});

describe("a full screen print quote, by hand", () => {
  // 24 pieces: S 6, M 6, L 6, XL 4, 2XL 2. Front 3 colours, back 1 colour, blanks 400 ¢, rush.
  const input: Partial<QuoteInput> = {
    method: "screenPrint",
    locations: 2,
    colours: [3, 1],
    garmentCostCents: 400,
    rush: true,
    sizeRun: [
      { size: "S", quantity: 6 },
      { size: "M", quantity: 6 },
      { size: "L", quantity: 6 },
      { size: "XL", quantity: 4 },
      { size: "2XL", quantity: 2 },
    ],
  };

  it("lines, tax, deposit and balance", () => {
    const q = quote(input);
    expect(q.lines.map((l) => [l.key, l.quantity, l.unitCents, l.totalCents])).toEqual([
      ["garments", 24, 400, 9600], // 24 × 400
      ["decoration", 24, 910, 21840], // 24 × 910 (24 break, 2 locations, 3 colours)
      ["setup-screens", 4, 2000, 8000], // 3 + 1 screens × 2000
      ["upcharge:2XL", 2, 200, 400], // 2 × 200
      ["rush", 1, 6368, 6368], // 20 % × (9600 + 21840 + 400 = 31840) = 6368; setup is not rushed
    ]);
    expect(q).toMatchObject({
      subtotalCents: 46208, // 9600 + 21840 + 8000 + 400 + 6368
      taxableCents: 46208,
      taxCents: 3812, // 46208 × 0.0825 = 3812.16 → 3812
      totalCents: 50020, // 46208 + 3812
      depositCents: 25010, // 50 % of 50020
      balanceCents: 25010,
      totalQuantity: 24,
      breakQuantity: 24,
      belowMinimum: false,
      screens: 4,
    });
    expect(line(q, "rush")?.label).toBe("Rush fee (20%)");
  });

  it("tax exempt: no tax, deposit on the subtotal", () => {
    const q = quote({ ...input, taxExempt: true });
    // tax 0; total 46208; deposit 23104; balance 23104.
    expect(q).toMatchObject({
      taxableCents: 0,
      taxCents: 0,
      totalCents: 46208,
      depositCents: 23104,
      balanceCents: 23104,
    });
  });
});

describe("tax and deposit rounding", () => {
  it("8.25 % landing on a half cent rounds up", () => {
    // HTV 1 piece, 1 location: 600. Tax 600 × 0.0825 = 49.5 → 50. Total 650, deposit 325.
    const q = quote({});
    expect(q).toMatchObject({
      subtotalCents: 600,
      taxCents: 50,
      totalCents: 650,
      depositCents: 325,
      balanceCents: 325,
    });
  });

  it("a half-cent deposit rounds up and the balance takes the rest", () => {
    // HTV 600 + blank 400 = 1000. Tax 82.5 → 83. Total 1083. Deposit 541.5 → 542; balance 541.
    const q = quote({ garmentCostCents: 400 });
    expect(q).toMatchObject({
      subtotalCents: 1000,
      taxCents: 83,
      totalCents: 1083,
      depositCents: 542,
      balanceCents: 541,
    });
  });

  it.each([
    { depositPercent: 0, deposit: 0, balance: 1083 },
    { depositPercent: 100, deposit: 1083, balance: 0 },
    { depositPercent: 33.33, deposit: 361, balance: 722 }, // 1083 × 0.3333 = 360.9639 → 361
  ])("deposit $depositPercent % of 1083", ({ depositPercent, deposit, balance }) => {
    const q = quote({ matrix: { ...TEST_MATRIX, depositPercent }, garmentCostCents: 400 });
    expect(q).toMatchObject({ totalCents: 1083, depositCents: deposit, balanceCents: balance });
  });
});

describe("DTF", () => {
  it("by area: transfers per garment rounded half up", () => {
    // 10 pieces, 1 location, 12.5 in² × 1.5 ¢ = 18.75 → 19 ¢ each.
    const q = quote({
      method: "dtf",
      dtfAreaIn2: 12.5,
      garmentCostCents: 400,
      sizeRun: [{ size: "M", quantity: 10 }],
    });
    expect(q.lines.map((l) => [l.key, l.quantity, l.unitCents, l.totalCents])).toEqual([
      ["garments", 10, 400, 4000], // 10 × 400
      ["decoration", 10, 300, 3000], // pressing, 1 break, 1 location
      ["dtf-transfers", 10, 19, 190], // 10 × 19
    ]);
    // 7190; tax 593.175 → 593; total 7783; deposit 3891.5 → 3892; balance 3891.
    expect(q).toMatchObject({
      subtotalCents: 7190,
      taxCents: 593,
      totalCents: 7783,
      depositCents: 3892,
      balanceCents: 3891,
    });
  });

  const lengthMatrix: PriceMatrix = { ...TEST_MATRIX, dtf: { ...TEST_MATRIX.dtf, mode: "length" } };

  it.each([
    { length: 56.2, billed: 57 }, // rounded up to whole inches
    { length: 57, billed: 57 },
    { length: 0.4, billed: 1 },
  ])("by length: a $length in gang sheet bills $billed in", ({ length, billed }) => {
    const q = quote({
      matrix: lengthMatrix,
      method: "dtf",
      locations: 2,
      gangSheetLengthIn: length,
      sizeRun: [{ size: "M", quantity: 30 }],
    });
    expect(line(q, "gang-sheet")).toMatchObject({
      quantity: billed,
      unitCents: 100,
      totalCents: billed * 100,
      unit: "inch",
    });
    expect(line(q, "dtf-transfers")).toBeUndefined();
    // pressing: 30 pieces → 24 break, 2 locations → 400 × 30 = 12000
    expect(line(q, "decoration")).toMatchObject({ unitCents: 400, totalCents: 12000 });
  });

  it("by length: the 56.2 in sheet totalled by hand", () => {
    const q = quote({
      matrix: lengthMatrix,
      method: "dtf",
      locations: 2,
      gangSheetLengthIn: 56.2,
      sizeRun: [{ size: "M", quantity: 30 }],
    });
    // 12000 + 5700 = 17700; tax 1460.25 → 1460; total 19160; deposit 9580.
    expect(q).toMatchObject({
      subtotalCents: 17700,
      taxCents: 1460,
      totalCents: 19160,
      depositCents: 9580,
      balanceCents: 9580,
    });
  });

  it("by length without a packed length: estimated from area ÷ roll width", () => {
    // 24 × 20 in² = 480 in² ÷ 22 in = 21.82 in → 22 in × 100 = 2200.
    const q = quote({
      matrix: lengthMatrix,
      method: "dtf",
      dtfAreaIn2: 20,
      sizeRun: [{ size: "M", quantity: 24 }],
    });
    expect(line(q, "gang-sheet")).toMatchObject({ quantity: 22, totalCents: 2200 });
    expect(line(q, "gang-sheet")?.label).toContain("estimated");
  });

  it("refuses an estimated sheet longer than the longest roll", () => {
    // 10 000 × 100 in² ÷ 22 in = 45 455 in > 36 000 in.
    const q = () =>
      quote({
        matrix: lengthMatrix,
        method: "dtf",
        dtfAreaIn2: 100,
        sizeRun: [{ size: "M", quantity: 10_000 }],
      });
    expect(pricingErrorCode(q)).toBe("invalid-input");
  });

  it("needs an area (area mode) or a length or area (length mode)", () => {
    expect(pricingErrorCode(() => quote({ method: "dtf" }))).toBe("invalid-input");
    expect(pricingErrorCode(() => quote({ matrix: lengthMatrix, method: "dtf" }))).toBe("invalid-input");
  });
});

describe("rush and other methods", () => {
  it("DTG with rush", () => {
    // 12 pieces → 12 break, 1 location 800; blanks 400. Rush 20 % × (9600 + 4800) = 2880.
    const q = quote({
      method: "dtg",
      garmentCostCents: 400,
      rush: true,
      sizeRun: [{ size: "L", quantity: 12 }],
    });
    expect(line(q, "decoration")).toMatchObject({
      label: "DTG, 1 location",
      unitCents: 800,
      totalCents: 9600,
    });
    expect(line(q, "rush")).toMatchObject({ quantity: 1, unitCents: 2880, totalCents: 2880, unit: "order" });
    // 9600 + 4800 + 2880 = 17280; tax 1425.6 → 1426; total 18706; deposit 9353.
    expect(q).toMatchObject({
      subtotalCents: 17280,
      taxCents: 1426,
      totalCents: 18706,
      depositCents: 9353,
      balanceCents: 9353,
    });
  });

  it("leaves the blank line out for customer-supplied garments", () => {
    expect(line(quote({ garmentCostCents: 0 }), "garments")).toBeUndefined();
  });

  it("refuses more locations than the table has", () => {
    expect(
      pricingErrorCode(() =>
        quote({ method: "sublimation", locations: 2, sizeRun: [{ size: "M", quantity: 6 }] }),
      ),
    ).toBe("no-price");
  });

  it.each([
    { sizeRun: [], code: "empty-size-run" },
    { sizeRun: [{ size: "M", quantity: 0 }], code: "empty-size-run" },
    { sizeRun: [{ size: "M", quantity: -2 }], code: "invalid-input" },
    { sizeRun: [{ size: "M", quantity: 2.5 }], code: "invalid-input" },
  ])("refuses the size run $sizeRun ($code)", ({ sizeRun, code }) => {
    expect(pricingErrorCode(() => quote({ sizeRun }))).toBe(code);
  });

  it("tryComputeQuote returns the error instead of throwing", () => {
    const r = tryComputeQuote({
      matrix: TEST_MATRIX,
      method: "htv",
      sizeRun: [],
      sizeOrder: SIZE_ORDER,
      locations: 1,
      garmentCostCents: 0,
      rush: false,
    });
    expect(r).toMatchObject({ ok: false, code: "empty-size-run" });
  });
});

describe("price matrix", () => {
  it("the demo matrix is valid and frozen", () => {
    expect(priceMatrixSchema.safeParse(DEFAULT_PRICE_MATRIX).success).toBe(true);
    expect(Object.isFrozen(DEFAULT_PRICE_MATRIX.screenPrint.pricesCents[0]![0])).toBe(true);
  });

  it("the demo matrix never charges more for a bigger break, more colours cost more, more locations cost more", () => {
    const sp = DEFAULT_PRICE_MATRIX.screenPrint.pricesCents;
    for (let b = 0; b < sp.length; b++) {
      for (let l = 0; l < sp[b]!.length; l++) {
        for (let c = 0; c < sp[b]![l]!.length; c++) {
          const p = sp[b]![l]![c]!;
          if (b > 0) expect(p).toBeLessThanOrEqual(sp[b - 1]![l]![c]!);
          if (l > 0) expect(p).toBeGreaterThan(sp[b]![l - 1]![c]!);
          if (c > 0) expect(p).toBeGreaterThan(sp[b]![l]![c - 1]!);
        }
      }
    }
    for (const method of ["dtf", "dtg", "htv", "sublimation"] as const) {
      const t = DEFAULT_PRICE_MATRIX[method].pricesCents;
      for (let b = 1; b < t.length; b++)
        t[b]!.forEach((p, l) => expect(p).toBeLessThanOrEqual(t[b - 1]![l]!));
    }
  });

  it("the demo screen print table follows its formula", () => {
    // 12 break, 1 location, 1 colour: 850; 2 colours: 850 + 125 = 975;
    // 2 locations, 2 colours: 975 + round(975 × 0.7 = 682.5 → 683) = 1658.
    const sp = DEFAULT_PRICE_MATRIX.screenPrint.pricesCents;
    expect(sp[0]![0]![0]).toBe(850);
    expect(sp[0]![0]![1]).toBe(975);
    expect(sp[0]![1]![1]).toBe(1658);
  });

  it.each([
    { name: "descending breaks", patch: { htv: { quantityBreaks: [24, 12], pricesCents: [[1], [1]] } } },
    { name: "a missing break row", patch: { htv: { quantityBreaks: [1, 12], pricesCents: [[600]] } } },
    { name: "ragged location rows", patch: { dtg: { quantityBreaks: [1, 12], pricesCents: [[1, 2], [1]] } } },
    { name: "fractional cents", patch: { htv: { quantityBreaks: [1], pricesCents: [[600.5]] } } },
    { name: "negative cents", patch: { htv: { quantityBreaks: [1], pricesCents: [[-1]] } } },
    { name: "a tax rate over 100 %", patch: { taxRatePercent: 120 } },
    { name: "no default blank cost", patch: { garmentCostCents: { "heavy-tee": 550 } } },
    {
      name: "an upcharge size twice",
      patch: {
        sizeUpcharges: [
          { fromSize: "2XL", cents: 1 },
          { fromSize: "2XL", cents: 2 },
        ],
      },
    },
    { name: "a currency the shop cannot choose", patch: { currency: "jpy" } },
  ])("rejects $name", ({ patch }) => {
    const bad = { ...TEST_MATRIX, ...patch };
    expect(pricingErrorCode(() => parsePriceMatrix(bad))).toBe("invalid-matrix");
    expect(pricingErrorCode(() => quote({ matrix: bad as PriceMatrix }))).toBe("invalid-matrix");
  });

  it.each([
    { blankId: "heavy-tee", expected: 550 },
    { blankId: "unknown-blank", expected: 400 },
    { blankId: undefined, expected: 400 },
    { blankId: "toString", expected: 400 }, // not an inherited property
  ])("garmentCostFor($blankId) = $expected", ({ blankId, expected }) => {
    expect(garmentCostFor(TEST_MATRIX, blankId)).toBe(expected);
  });
});

describe("formatCents", () => {
  it.each([
    { cents: 0, expected: "$0.00" },
    { cents: 5, expected: "$0.05" },
    { cents: 99, expected: "$0.99" },
    { cents: 100, expected: "$1.00" },
    { cents: 123456, expected: "$1,234.56" },
    { cents: 100000000, expected: "$1,000,000.00" },
    { cents: -250, expected: "-$2.50" },
  ])("$cents ¢ → $expected", ({ cents, expected }) => {
    expect(formatCents(cents, "usd")).toBe(expected);
  });

  // Expected texts from ECMA-402 Intl.NumberFormat with Node's bundled CLDR data (the reference library).
  it("writes other currencies in the shop's locale, two decimals always", () => {
    expect(formatCents(123456, "eur")).toBe("€1,234.56");
    expect(formatCents(123456, "eur", "de-DE")).toBe("1.234,56\u00a0€");
    expect(formatCents(450, "gbp", "en-GB")).toBe("£4.50");
    expect(formatCents(1100, "cad", "en-CA")).toBe("$11.00");
  });
});

describe("quote invariants (fast-check)", () => {
  const matrixArb = fc
    .record({
      taxRatePercent: fc.integer({ min: 0, max: 15_000 }).map((n) => n / 1000),
      depositPercent: fc.integer({ min: 0, max: 10_000 }).map((n) => n / 100),
      rushFeePercent: fc.integer({ min: 0, max: 10_000 }).map((n) => n / 100),
      dtfMode: fc.constantFrom("area" as const, "length" as const),
      centsPerSquareInch: fc.integer({ min: 0, max: 1000 }).map((n) => n / 100),
    })
    .map((r): PriceMatrix => ({
      ...DEFAULT_PRICE_MATRIX,
      taxRatePercent: r.taxRatePercent,
      depositPercent: r.depositPercent,
      rushFeePercent: r.rushFeePercent,
      dtf: { ...DEFAULT_PRICE_MATRIX.dtf, mode: r.dtfMode, centsPerSquareInch: r.centsPerSquareInch },
    }));

  const inputArb = fc
    .record({
      matrix: matrixArb,
      method: fc.constantFrom(...DECORATION_METHODS),
      sizeRun: fc.array(
        fc.record({
          size: fc.constantFrom(...DEFAULT_SIZE_ORDER),
          quantity: fc.integer({ min: 0, max: 400 }),
        }),
        { minLength: 1, maxLength: 8 },
      ),
      locations: fc.integer({ min: 1, max: 4 }),
      colours: fc.array(fc.integer({ min: 1, max: 6 }), { minLength: 4, maxLength: 4 }),
      // ≤ 200 in² × ≤ 3200 pieces ÷ 22 in stays under the longest sheet the module accepts.
      dtfAreaIn2: fc.integer({ min: 1, max: 20_000 }).map((n) => n / 100),
      gangSheetLengthIn: fc.option(
        fc.integer({ min: 1, max: 200_000 }).map((n) => n / 100),
        { nil: undefined },
      ),
      garmentCostCents: fc.integer({ min: 0, max: 5000 }),
      rush: fc.boolean(),
      taxExempt: fc.boolean(),
    })
    .filter((r) => sizeRunTotal(r.sizeRun) > 0)
    .map((r): QuoteInput => {
      const width =
        r.method === "screenPrint"
          ? r.matrix.screenPrint.pricesCents[0]!.length
          : r.matrix[r.method].pricesCents[0]!.length;
      const locations = Math.min(r.locations, width);
      return { ...r, sizeOrder: DEFAULT_SIZE_ORDER, locations, colours: r.colours.slice(0, locations) };
    });

  it("totals are whole, non-negative cents that add up", () => {
    fc.assert(
      fc.property(inputArb, (input) => {
        const q = computeQuote(input);
        const amounts = [
          q.subtotalCents,
          q.taxableCents,
          q.taxCents,
          q.totalCents,
          q.depositCents,
          q.balanceCents,
        ];
        for (const l of q.lines) amounts.push(l.quantity, l.unitCents, l.totalCents);
        for (const a of amounts) {
          expect(Number.isSafeInteger(a)).toBe(true);
          expect(a).toBeGreaterThanOrEqual(0);
        }
        for (const l of q.lines) expect(l.totalCents).toBe(l.unitCents * l.quantity);
        expect(q.subtotalCents).toBe(q.lines.reduce((s, l) => s + l.totalCents, 0));
        expect(q.totalCents).toBe(q.subtotalCents + q.taxCents);
        expect(q.depositCents + q.balanceCents).toBe(q.totalCents);
        expect(q.depositCents).toBeLessThanOrEqual(q.totalCents);
        expect(q.taxCents).toBeLessThanOrEqual(q.subtotalCents);
        expect(q.totalQuantity).toBe(sizeRunTotal(input.sizeRun));
        if (input.taxExempt) expect(q.taxCents).toBe(0);
        if (!input.rush) expect(q.lines.some((l) => l.key === "rush")).toBe(false);
      }),
      { numRuns: 500 },
    );
  });

  it("the same input always gives the same quote", () => {
    fc.assert(
      fc.property(inputArb, (input) => {
        expect(computeQuote(input)).toEqual(computeQuote(structuredClone(input)));
      }),
      { numRuns: 100 },
    );
  });
});
