/**
 * The print plan is the only source of per-size numbers. For generated jobs (catalog blanks, every
 * location they offer, size runs, saved gradings or none, spares, every method), every output
 * shows the same numbers at the precision it shows (1/8 in, Chalkline's formatLength), and the
 * suggested grading passes every fit check the editor shows.
 */
import fc from "fast-check";
import { describe, expect, it, vi } from "vitest";
import { specSheetLocation } from "@/app/_server/production/spec-sheet";
import { CATALOG } from "@/lib/garments/catalog";
import { locationSpec, locationsFor } from "@/lib/garments/locations";
import { DECORATION_METHODS } from "@/lib/jobs";
import { FIT_CODES, checkPlacement } from "@/lib/placement/checks";
import { defaultPlacement } from "@/lib/placement/model";
import { expandTransfers, packGangSheet } from "@/lib/production/packing";
import { gangItems, planForSize, planSizeText, planWithSuggestion, printPlan, type PrintPlanInput } from "@/lib/production/print-plan";
import { formatLength } from "@/lib/units";
import { reachCounter } from "./reach";

vi.setConfig({ testTimeout: 60_000 });

const eighths = (v: number) => formatLength(v, "in");

/** A catalog blank, a location it offers with room on the designed size, a size run and a placement there. */
const job = fc
  .record({
    blank: fc.constantFrom(...CATALOG),
    locationPick: fc.nat(),
    designedPick: fc.nat(),
    scale: fc.double({ min: 0.5, max: 1.4, noNaN: true }),
    aspect: fc.double({ min: 0.4, max: 2.5, noNaN: true }),
    method: fc.constantFrom(...DECORATION_METHODS),
    sparePercent: fc.constantFrom(0, 2, 5, 10, 12.5),
    quantities: fc.array(fc.oneof(fc.constant(0), fc.integer({ min: 1, max: 60 })), { minLength: 1, maxLength: 14 }),
    graded: fc.oneof(fc.constant(null), fc.array(fc.double({ min: 0.5, max: 16, noNaN: true }), { minLength: 1, maxLength: 14 })),
    k: fc.integer({ min: 1, max: 4 }),
  })
  .map((j) => {
    const locations = locationsFor(j.blank.category);
    const location = locations[j.locationPick % locations.length]!;
    const designed = j.blank.sizes[j.designedPick % j.blank.sizes.length]!;
    const spec = locationSpec({ location, category: j.blank.category, group: designed.group, measurements: designed.measurements });
    if (!(spec.typicalWidth > 0 && spec.typicalHeight > 0)) return null;
    const base = defaultPlacement(spec, j.aspect, "p");
    const placement = { ...base, artworkId: "art", widthIn: base.widthIn * j.scale, heightIn: base.heightIn * j.scale };
    const sizeRun = j.blank.sizes.slice(0, j.quantities.length).map((r, i) => ({ size: r.size, quantity: j.quantities[i]! }));
    const saved = j.graded ? { transferCount: j.k, assignment: Object.fromEntries(sizeRun.map((r, i) => [r.size, Math.round(j.graded![i % j.graded!.length]! * 8) / 8])) } : null;
    const input: PrintPlanInput = { method: j.method, category: j.blank.category, chart: j.blank.sizes, sizeRun, placement, designedOn: designed.size, saved, transferCount: j.k, sparePercent: j.sparePercent };
    return input;
  })
  .filter((j): j is PrintPlanInput => j !== null);

describe("one print plan, every output", () => {
  it("the production page, the spec sheet, the test print and the gang sheet show the same numbers for every size", () => {
    const reach = reachCounter("print plan outputs");
    fc.assert(
      fc.property(job, (input) => {
        reach.generated();
        const plan = printPlan(input);
        const sheet = specSheetLocation({ label: "Print", proofName: null, plan });
        const items = gangItems([{ plan, artworkId: "art" }]);
        expect(sheet.perSize.map((r) => r.size)).toEqual(plan.sizes.map((s) => s.size));
        if (plan.sizes.length) reach.reached("a planned size");
        if (plan.sizes.some((s) => s.checks.length)) reach.reached("a flagged size");
        plan.sizes.forEach((s, i) => {
          const page = planSizeText(plan, s);
          const spec = sheet.perSize[i]!;
          const test = planForSize(input, plan, s.size)!;
          // Page and spec sheet: the same eighths for width, height, top and centre, the same count and group.
          expect(page.ink).toBe(`${eighths(spec.widthIn)} × ${eighths(spec.heightIn)}`);
          expect(eighths(spec.topIn)).toBe(eighths(s.topIn));
          expect(eighths(spec.fromCentreIn)).toBe(eighths(s.fromCentreIn));
          expect(spec.count).toBe(page.count);
          expect(spec.group.startsWith(s.group)).toBe(true);
          expect(spec.checks).toEqual(page.checks);
          // Test print: the art drawn at the plan's size for that size.
          expect(test.widthIn).toBe(s.widthIn);
          expect(test.heightIn).toBe(s.heightIn);
          expect(test.topIn).toBe(s.topIn);
          // Gang sheet: the size's transfer is cut at the size's width.
          if (plan.tools === "transfers" && s.toMake > 0) {
            const item = items.find((it) => it.id === `p@${s.group}`)!;
            expect(eighths(item.widthIn)).toBe(eighths(s.widthIn));
            expect(eighths(item.heightIn)).toBe(eighths(s.heightIn));
          }
        });
        // Pieces on the gang sheet add up to the size run plus the spares asked for.
        const pieces = items.reduce((n, it) => n + it.quantity, 0);
        if (plan.tools === "transfers") {
          reach.reached("a transfer job");
          expect(pieces).toBe(plan.sizes.reduce((n, s) => n + s.quantity + s.spares, 0));
          if (pieces > 0 && pieces < 400) {
            const packed = packGangSheet({ pieces: expandTransfers(items, 0), rollWidthIn: 24, maxSheetLengthIn: 600 });
            expect(packed.sheets.reduce((n, sh) => n + sh.placements.length, 0)).toBe(pieces);
          }
        } else expect(items).toEqual([]);
      }),
      { numRuns: 150, seed: reach.seed },
    );
    reach.expectShare("a planned size", 0.5);
    reach.expectShare("a transfer job", 0.3);
    reach.expectShare("a flagged size", 0.05);
  });

  it("a suggested size passes every fit check the editor shows on that size", () => {
    const reach = reachCounter("suggested grading");
    fc.assert(
      fc.property(job, (input) => {
        reach.generated();
        const plan = planWithSuggestion(input);
        if (!plan.suggestion) return;
        reach.reached("a suggestion");
        for (const s of plan.sizes) {
          const row = input.chart.find((r) => r.size === s.size)!;
          // The editor's own check of the print as it would sit on this size.
          const warnings = checkPlacement({
            placement: { ...input.placement, widthIn: s.widthIn, heightIn: s.heightIn, belowCollarIn: s.topIn },
            category: input.category,
            group: row.group,
            measurements: row.measurements,
            size: s.size,
          }).filter((w) => FIT_CODES.has(w.code) && w.severity !== "info");
          expect(warnings.map((w) => w.message)).toEqual([]);
          expect(s.checks).toEqual([]);
          // Never wider than the print area it is shown against, at the 1/8 in shown.
          expect(Math.round(s.widthIn * 8)).toBeLessThanOrEqual(Math.round(s.printArea.widthIn * 8));
          // On the 1/8 in grid (Chalkline's shown precision), so the press cuts what it reads.
          expect(Number.isInteger(Math.round(s.widthIn * 8 * 1e6) / 1e6)).toBe(true);
        }
      }),
      { numRuns: 150, seed: reach.seed },
    );
    reach.expectShare("a suggestion", 0.5);
  });
});
