import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { fromPriceForm, priceFormSchema, toPriceForm } from "@/components/orders/price-form";
import { DEFAULT_PRICE_MATRIX, priceMatrixSchema } from "@/lib/pricing";
import { checkoutAmount, JOB_SIZE_ORDER, moneySummary, normaliseSizeRun, quoteJob, sizeRunSchema, sizeRunTable, sizeRunTotals, type JobForQuote } from "@/lib/quotes";

const job = (over: Partial<JobForQuote> = {}): JobForQuote => ({
  title: "Team tees",
  method: "screen-print",
  sizeRun: [
    { size: "YM", quantity: 10 },
    { size: "M", quantity: 12 },
    { size: "2XL", quantity: 2 },
  ],
  printLocations: [{ location: "full-front", colours: 2 }],
  dtfAreaIn2: null,
  rush: false,
  garmentName: null,
  garmentColour: null,
  blankId: null,
  ...over,
});

describe("size run totals", () => {
  it("adds youth and adult sizes into one total and per group", () => {
    expect(sizeRunTotals([{ size: "YS", quantity: 4 }, { size: "YL", quantity: 6 }, { size: "S", quantity: 5 }, { size: "3XL", quantity: 1 }, { size: "One size", quantity: 0 }])).toEqual({
      total: 16,
      byGroup: { infant: 0, toddler: 0, youth: 10, adult: 6, "one-size": 0 },
    });
  });

  it("drops empty sizes and puts youth before adult", () => {
    expect(normaliseSizeRun([{ size: "XL", quantity: 3 }, { size: "YS", quantity: 2 }, { size: "M", quantity: 0 }, { size: "2T", quantity: 1 }])).toEqual([
      { size: "2T", quantity: 1 },
      { size: "YS", quantity: 2 },
      { size: "XL", quantity: 3 },
    ]);
  });

  it("refuses unknown sizes, negatives, fractions and a size listed twice", () => {
    expect(sizeRunSchema.safeParse([{ size: "XXXL", quantity: 1 }]).success).toBe(false);
    expect(sizeRunSchema.safeParse([{ size: "M", quantity: -1 }]).success).toBe(false);
    expect(sizeRunSchema.safeParse([{ size: "M", quantity: 1.5 }]).success).toBe(false);
    expect(sizeRunSchema.safeParse([{ size: "M", quantity: 1 }, { size: "M", quantity: 2 }]).success).toBe(false);
    expect(sizeRunSchema.safeParse([{ size: "One size", quantity: 40 }]).success).toBe(true);
  });
});

describe("pricing a job", () => {
  it("a mixed youth and adult screen print run, worked by hand with the demo matrix (invented demo prices)", () => {
    const result = quoteJob(job(), DEFAULT_PRICE_MATRIX, { taxExempt: false });
    if (!result.ok) throw new Error(result.message);
    const q = result.quote;
    // 24 pieces → the 24 break: 1 location, 2 colours = 650 + 95 = 745 ¢.
    expect(q.breakQuantity).toBe(24);
    expect(q.lines.find((l) => l.key === "decoration")).toMatchObject({ quantity: 24, unitCents: 745, totalCents: 17_880 });
    expect(q.lines.find((l) => l.key === "garments")).toMatchObject({ quantity: 24, unitCents: 450, totalCents: 10_800 });
    expect(q.lines.find((l) => l.key === "setup-screens")).toMatchObject({ quantity: 2, unitCents: 2500, totalCents: 5000 });
    // Only the two 2XL pay the 2XL upcharge; youth sizes never do.
    expect(q.lines.filter((l) => l.key.startsWith("upcharge:"))).toEqual([expect.objectContaining({ key: "upcharge:2XL", quantity: 2, totalCents: 400 })]);
    // 34,080 ¢ × 8.25 % = 2,811.6 → 2,812 ¢; deposit 50 % of 36,892 = 18,446.
    expect(q.subtotalCents).toBe(34_080);
    expect(q.taxCents).toBe(2_812);
    expect(q.totalCents).toBe(36_892);
    expect(q.depositCents).toBe(18_446);
    expect(result.snapshot?.job.locations).toEqual([{ location: "full-front", label: "Full front", colours: 2 }]);
  });

  it("one-size totes never reach the 'from 2XL up' upcharges", () => {
    const result = quoteJob(job({ method: "dtf", sizeRun: [{ size: "One size", quantity: 40 }], printLocations: [{ location: "tote-front", colours: 1 }], dtfAreaIn2: 33.3 }), DEFAULT_PRICE_MATRIX, { taxExempt: false });
    if (!result.ok) throw new Error(result.message);
    expect(result.quote.lines.some((l) => l.key.startsWith("upcharge:"))).toBe(false);
    // 33.3 in² × 2 ¢ = 66.6 → 67 ¢ per tote.
    expect(result.quote.lines.find((l) => l.key === "dtf-transfers")).toMatchObject({ quantity: 40, unitCents: 67 });
    expect(JOB_SIZE_ORDER[0]).toBe("One size");
  });

  it("says in words why a job cannot be priced yet", () => {
    expect(quoteJob(job({ sizeRun: [] }), DEFAULT_PRICE_MATRIX, { taxExempt: false })).toMatchObject({ ok: false, message: "Add quantities to the size run first." });
    expect(quoteJob(job({ printLocations: [] }), DEFAULT_PRICE_MATRIX, { taxExempt: false })).toMatchObject({ ok: false, message: "Add at least one print location first." });
    expect(quoteJob(job({ method: "dtf" }), DEFAULT_PRICE_MATRIX, { taxExempt: false })).toMatchObject({ ok: false, message: expect.stringContaining("transfer area") });
    expect(quoteJob(job({ printLocations: [1, 2, 3, 4, 5].map((i) => ({ location: `loc-${i}`, colours: 1 })) }), DEFAULT_PRICE_MATRIX, { taxExempt: false })).toMatchObject({ ok: false, code: "no-price" });
  });

  it("a tax-exempt client pays no tax", () => {
    const result = quoteJob(job(), DEFAULT_PRICE_MATRIX, { taxExempt: true });
    expect(result.ok && result.quote.taxCents).toBe(0);
  });
});

describe("what is due", () => {
  const quote = { state: "accepted" as const, totalCents: 36_892, depositCents: 18_446 };

  it("walks from quote out to paid in full", () => {
    expect(moneySummary({ quote: null, payments: [] }).state).toBe("not-quoted");
    expect(moneySummary({ quote: { ...quote, state: "sent" }, payments: [] })).toMatchObject({ state: "quote-sent", payable: [] });
    expect(moneySummary({ quote, payments: [] })).toMatchObject({
      state: "awaiting-payment",
      balanceCents: 36_892,
      payable: [
        { kind: "deposit", amountCents: 18_446 },
        { kind: "full", amountCents: 36_892 },
      ],
    });
    expect(moneySummary({ quote, payments: [{ state: "paid", amountCents: 18_446 }, { state: "awaiting", amountCents: 18_446 }, { state: "lapsed", amountCents: 36_892 }] })).toMatchObject({
      state: "deposit-paid",
      paidCents: 18_446,
      balanceCents: 18_446,
      payable: [{ kind: "balance", amountCents: 18_446 }],
    });
    expect(moneySummary({ quote, payments: [{ state: "paid", amountCents: 18_446 }, { state: "paid", amountCents: 18_446 }] })).toMatchObject({ state: "paid-in-full", balanceCents: 0, overpaidCents: 0 });
  });

  it("offers no deposit when the shop asks for none (0 %) or for all of it (100 %)", () => {
    expect(moneySummary({ quote: { ...quote, depositCents: 0 }, payments: [] }).payable.map((p) => p.kind)).toEqual(["full"]);
    expect(moneySummary({ quote: { ...quote, depositCents: quote.totalCents }, payments: [] }).payable.map((p) => p.kind)).toEqual(["full"]);
  });

  it("an amount paid twice shows as overpaid, never as a negative balance", () => {
    const s = moneySummary({ quote, payments: [{ state: "paid", amountCents: 36_892 }, { state: "paid", amountCents: 18_446 }] });
    expect(s).toMatchObject({ balanceCents: 0, overpaidCents: 18_446, state: "paid-in-full" });
  });

  it("checkout amounts come from the summary, and refuse what is not open", () => {
    const open = moneySummary({ quote, payments: [] });
    expect(checkoutAmount(open, "deposit")).toEqual({ ok: true, amountCents: 18_446 });
    expect(checkoutAmount(open, "balance")).toMatchObject({ ok: false, message: expect.stringContaining("deposit or full amount") });
    expect(checkoutAmount(moneySummary({ quote: { ...quote, state: "sent" }, payments: [] }), "full")).toMatchObject({ ok: false, message: "Accept the quote before paying." });
    expect(checkoutAmount(moneySummary({ quote, payments: [{ state: "paid", amountCents: 36_892 }] }), "full")).toMatchObject({ ok: false });
  });
});

describe("size-run CSV", () => {
  it("has one column per size used, in size order, and round-trips through a CSV parser (papaparse, RFC 4180 quoting)", () => {
    const table = sizeRunTable([
      { title: 'Tees, "home" kit', client: "Eastfield", status: "Drafting", dueDate: "2027-03-12", sizeRun: [{ size: "M", quantity: 10 }, { size: "YS", quantity: 4 }] },
      { title: "Totes", client: "Larkspur", status: "With client", dueDate: null, sizeRun: [{ size: "One size", quantity: 40 }] },
    ]);
    expect(table.fields).toEqual(["Job", "Client", "Status", "Due", "One size", "YS", "M", "Total"]);
    const csv = Papa.unparse(table, { newline: "\r\n" });
    expect(csv.split("\r\n")[1]).toBe('"Tees, ""home"" kit",Eastfield,Drafting,2027-03-12,0,4,10,14');
    const parsed = Papa.parse<string[]>(csv, { skipEmptyLines: true });
    expect(parsed.data[2]).toEqual(["Totes", "Larkspur", "With client", "", "40", "0", "0", "40"]);
  });
});

describe("price matrix form", () => {
  it("shows money in dollars and gives back the same matrix in cents", () => {
    const form = toPriceForm(DEFAULT_PRICE_MATRIX);
    expect(form.screenPrint.setupFeePerScreenCents).toBe(25);
    expect(form.dtg.pricesCents[0]![0]).toBe(14);
    expect(fromPriceForm(form)).toEqual(DEFAULT_PRICE_MATRIX);
    expect(priceFormSchema.parse(form)).toEqual(priceMatrixSchema.parse(DEFAULT_PRICE_MATRIX));
  });

  it("rounds typed dollars to the cent and names an emptied cell", () => {
    const form = toPriceForm(DEFAULT_PRICE_MATRIX);
    form.dtg.pricesCents[0]![0] = 15.505;
    expect(priceFormSchema.parse(form).dtg.pricesCents[0]![0]).toBe(1551);
    form.htv.pricesCents[1]![2] = Number.NaN;
    const bad = priceFormSchema.safeParse(form);
    expect(bad.success).toBe(false);
    expect(bad.error?.issues[0]).toMatchObject({ path: ["htv", "pricesCents", 1, 2], message: "Enter a number" });
  });

  it("refuses quantity breaks out of order", () => {
    const form = toPriceForm(DEFAULT_PRICE_MATRIX);
    form.dtg.quantityBreaks = [1, 24, 12, 48, 72];
    const bad = priceFormSchema.safeParse(form);
    expect(bad.success).toBe(false);
    expect(bad.error?.issues.some((i) => i.message === "Quantity breaks must be strictly ascending")).toBe(true);
  });
});
