import fc from "fast-check";
import { describe, expect, it, vi } from "vitest";
import { PRINT_LOCATIONS } from "@/lib/garments/locations";
import { DECORATION_METHODS } from "@/lib/jobs";
import { DEFAULT_PRICE_MATRIX } from "@/lib/pricing";
import {
  JOB_SIZE_ORDER,
  SIZE_GROUPS,
  checkoutAmount,
  moneySummary,
  normaliseSizeRun,
  printLocationsSchema,
  quoteJob,
  sizeRunSchema,
  sizeRunTable,
  sizeRunTotals,
  type PaymentKind,
} from "@/lib/quotes";
import { nonFinitePaths } from "./arbitraries";
import { reachCounter } from "./reach";

// Property runs share two cores with other work; give them room beyond the 5 s default.
vi.setConfig({ testTimeout: 30_000 });

/**
 * Least share of generated cases that must reach each guarded check (reach.ts). Each is set well
 * below the share measured over several seeds, noted beside it, so chance alone does not fail it.
 */
const SHARE = {
  sizeInRun: 0.6, // measured 0.85 to 0.93 of 100 runs
  jobRow: 0.6, // measured 0.8 to 0.85 of 100 runs
  priced: 0.1, // measured 0.19 to 0.23 (the rest are refused: nothing ordered, no location, no DTF area…)
  payable: 0.08, // measured 0.17 to 0.19
  offered: 0.03, // measured 0.08 to 0.11
  refused: 0.6, // measured 0.89 to 0.92
};

const sizeRun = fc.uniqueArray(
  fc.record({
    size: fc.constantFrom(...JOB_SIZE_ORDER),
    quantity: fc.oneof(fc.constant(0), fc.integer({ min: 1, max: 100_000 })),
  }),
  { selector: (r) => r.size, maxLength: 12 },
);
const locations = fc.uniqueArray(
  fc.record({ location: fc.constantFrom(...PRINT_LOCATIONS), colours: fc.integer({ min: 1, max: 12 }) }),
  { selector: (l) => l.location, maxLength: 8 },
);

describe("size runs", () => {
  it("normaliseSizeRun keeps only ordered sizes, in size order, with the same total", () => {
    fc.assert(
      fc.property(sizeRun, (run) => {
        const n = normaliseSizeRun(run);
        expect(n.every((r) => r.quantity > 0)).toBe(true);
        const order = n.map((r) => JOB_SIZE_ORDER.indexOf(r.size));
        expect(order).toEqual([...order].sort((a, b) => a - b));
        expect(n.reduce((s, r) => s + r.quantity, 0)).toBe(run.reduce((s, r) => s + r.quantity, 0));
        expect(normaliseSizeRun(n)).toEqual(n);
      }),
    );
  });

  it("sizeRunTotals adds up to the total, and every known size lands in exactly one group", () => {
    const reach = reachCounter("sizeRunTotals");
    fc.assert(
      fc.property(sizeRun, (run) => {
        reach.generated();
        if (run.length > 0) reach.reached("a size in the run");
        const { total, byGroup } = sizeRunTotals(run);
        expect(total).toBe(run.reduce((s, r) => s + r.quantity, 0));
        expect(Object.values(byGroup).reduce((a, b) => a + b, 0)).toBe(total);
        for (const r of run) expect(SIZE_GROUPS.filter((g) => g.sizes.includes(r.size)).length).toBe(1);
      }),
      { seed: reach.seed },
    );
    reach.expectShare("a size in the run", SHARE.sizeInRun);
  });

  it("sizeRunTable has a column per size used, rows as wide as the header, and a total per row", () => {
    const reach = reachCounter("sizeRunTable");
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            title: fc.string(),
            client: fc.string(),
            status: fc.constant("drafting"),
            dueDate: fc.option(fc.constant("2027-01-01"), { nil: null }),
            sizeRun,
          }),
          { maxLength: 5 },
        ),
        (jobs) => {
          reach.generated();
          if (jobs.length > 0) reach.reached("a job row");
          const { fields, data } = sizeRunTable(jobs);
          expect(data.length).toBe(jobs.length);
          data.forEach((row, i) => {
            expect(row.length).toBe(fields.length);
            expect(row[row.length - 1]).toBe(jobs[i]!.sizeRun.reduce((s, r) => s + r.quantity, 0));
          });
        },
      ),
      { seed: reach.seed },
    );
    reach.expectShare("a job row", SHARE.jobRow);
  });
});

describe("quoteJob on any job the job form accepts", () => {
  const job = fc.record({
    title: fc.string({ maxLength: 40 }),
    method: fc.constantFrom(...DECORATION_METHODS),
    sizeRun,
    printLocations: locations,
    dtfAreaIn2: fc.option(fc.double({ min: 0, max: 20_000, noNaN: true }), { nil: null }),
    rush: fc.boolean(),
    garmentName: fc.option(fc.string({ maxLength: 20 }), { nil: null }),
    garmentColour: fc.constant(null),
    blankId: fc.option(fc.constantFrom("default", "nope", "__proto__", "constructor"), { nil: null }),
  });

  it("never throws; a priced quote has whole non-negative cents that add up, and its snapshot matches the job", () => {
    const reach = reachCounter("quoteJob");
    fc.assert(
      fc.property(job, fc.boolean(), (j, taxExempt) => {
        reach.generated();
        expect(sizeRunSchema.safeParse(j.sizeRun).success).toBe(true);
        expect(printLocationsSchema.safeParse(j.printLocations).success).toBe(true);
        const result = quoteJob(j, DEFAULT_PRICE_MATRIX, { taxExempt });
        if (!result.ok) {
          expect(result.message.length).toBeGreaterThan(0);
          return;
        }
        reach.reached("a priced quote");
        const q = result.quote;
        expect(nonFinitePaths(q)).toEqual([]);
        for (const cents of [q.subtotalCents, q.taxCents, q.totalCents, q.depositCents, q.balanceCents]) {
          expect(Number.isInteger(cents)).toBe(true);
          expect(cents).toBeGreaterThanOrEqual(0);
        }
        expect(q.totalCents).toBe(q.subtotalCents + q.taxCents);
        expect(q.depositCents + q.balanceCents).toBe(q.totalCents);
        if (taxExempt) expect(q.taxCents).toBe(0);
        expect(q.totalQuantity).toBe(j.sizeRun.reduce((s, r) => s + r.quantity, 0));
        expect(result.snapshot!.job.sizeRun).toEqual(normaliseSizeRun(j.sizeRun));
        expect(result.snapshot!.job.locations.map((l) => l.location)).toEqual(
          j.printLocations.map((l) => l.location),
        );
      }),
      { numRuns: 300, seed: reach.seed },
    );
    reach.expectShare("a priced quote", SHARE.priced);
  });
});

describe("what is due", () => {
  const payments = fc.array(
    fc.record({
      state: fc.constantFrom("awaiting" as const, "paid" as const, "lapsed" as const),
      amountCents: fc.integer({ min: 1, max: 1_000_000 }),
    }),
    { maxLength: 5 },
  );
  const quote = fc.option(
    fc.integer({ min: 1, max: 1_000_000 }).chain((totalCents) =>
      fc.record({
        state: fc.constantFrom("sent" as const, "accepted" as const, "replaced" as const),
        totalCents: fc.constant(totalCents),
        depositCents: fc.integer({ min: 0, max: totalCents }),
      }),
    ),
    { nil: null },
  );

  it("balance and overpaid are never negative and reconcile with the total; only paid payments count", () => {
    const reach = reachCounter("moneySummary");
    fc.assert(
      fc.property(quote, payments, (q, ps) => {
        reach.generated();
        const s = moneySummary({ quote: q, payments: ps });
        if (s.payable.length > 0) reach.reached("something payable");
        const paid = ps.filter((p) => p.state === "paid").reduce((a, p) => a + p.amountCents, 0);
        expect(s.paidCents).toBe(paid);
        expect(s.balanceCents).toBeGreaterThanOrEqual(0);
        expect(s.overpaidCents).toBeGreaterThanOrEqual(0);
        expect(s.totalCents - s.paidCents).toBe(s.balanceCents - s.overpaidCents);
        for (const p of s.payable) {
          expect(p.amountCents).toBeGreaterThan(0);
          expect(p.amountCents).toBeLessThanOrEqual(s.balanceCents);
        }
        if (!q || q.state !== "accepted") expect(s.payable).toEqual([]);
      }),
      { numRuns: 300, seed: reach.seed },
    );
    reach.expectShare("something payable", SHARE.payable);
  });

  it("checkoutAmount charges exactly what is payable, and refuses every other kind with a reason", () => {
    const reach = reachCounter("checkoutAmount");
    fc.assert(
      fc.property(
        quote,
        payments,
        fc.constantFrom<PaymentKind>("deposit", "full", "balance"),
        (q, ps, kind) => {
          reach.generated();
          const s = moneySummary({ quote: q, payments: ps });
          const r = checkoutAmount(s, kind);
          const offered = s.payable.find((p) => p.kind === kind);
          reach.reached(offered ? "a payable kind" : "a kind not payable");
          if (offered) expect(r).toEqual({ ok: true, amountCents: offered.amountCents });
          else {
            expect(r.ok).toBe(false);
            if (!r.ok) expect(r.message).not.toMatch(/undefined|NaN/);
          }
        },
      ),
      { numRuns: 300, seed: reach.seed },
    );
    reach.expectShare("a payable kind", SHARE.offered);
    reach.expectShare("a kind not payable", SHARE.refused);
  });
});
