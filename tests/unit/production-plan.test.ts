import { describe, expect, it } from "vitest";
import { CATALOG } from "@/lib/garments/catalog";
import { gradeSizeRun } from "@/lib/production/grading";
import { gradingSizes, printsPerSize } from "@/lib/production/plan";
import type { Placement } from "@/lib/placement/model";

const tee = CATALOG.find((b) => b.id === "everyday-crew-tee")!;
const front: Placement = { id: "f", location: "full-front", artworkId: null, widthIn: 11, heightIn: 11, offsetFromCenterIn: 0, belowCollarIn: 3, rotationDeg: 0 };
const run = [
  { size: "XS", quantity: 2 },
  { size: "M", quantity: 10 },
  { size: "4XL", quantity: 1 },
  { size: "YM", quantity: 3 },
];

describe("grading inputs from a proof", () => {
  // Limits per size come from the print locations (common practice, no published source).
  it("reads each size's allowance from its print area and leaves out sizes the blank does not have", () => {
    const { sizes, missing } = gradingSizes({ category: tee.category, chart: tee.sizes, sizeRun: run, placement: front, designedOn: "M" });
    expect(missing).toEqual(["YM"]);
    const xs = sizes.find((s) => s.size === "XS")!;
    const big = sizes.find((s) => s.size === "4XL")!;
    expect(xs.allowedWidthIn).toBeLessThanOrEqual(big.allowedWidthIn);
    expect(sizes.every((s) => s.idealWidthIn <= s.allowedWidthIn + 1e-9)).toBe(true);
    expect(sizes.find((s) => s.size === "M")!.idealWidthIn).toBeCloseTo(11);
  });

  it("turns a grading into prints per size with transfer names narrowest first", () => {
    const { sizes } = gradingSizes({ category: tee.category, chart: tee.sizes, sizeRun: run, placement: front, designedOn: "M" });
    const graded = gradeSizeRun(sizes, 2);
    const prints = printsPerSize({ placement: front, sizeRun: run.filter((r) => r.size !== "YM"), assignment: graded.assignment });
    expect(prints.every((p) => p.heightIn === p.widthIn)).toBe(true);
    expect(prints.find((p) => p.size === "M")!.transfer).toMatch(/^T\d/);
    expect(prints.every((p) => p.belowCollarIn === 3)).toBe(true);
  });
});
