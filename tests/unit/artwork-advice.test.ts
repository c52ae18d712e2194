import { describe, expect, it } from "vitest";
import { classifyShape, fillPrintArea, suggestSize } from "@/lib/artwork/advice";
import { assessQuality, effectivePpi, gradePpi } from "@/lib/artwork/quality";

describe("effective PPI", () => {
  // Effective PPI = ink pixels ÷ placed inches; 300 ppi ideal and under 150 poor: common practice, no published source.
  it("grades a 3300 px wide ink area placed at 11 in as 300 ppi", () => {
    const ppi = effectivePpi({ inkWidthPx: 3300, inkHeightPx: 3300, widthIn: 11, heightIn: 11 });
    expect(ppi).toBe(300);
    expect(gradePpi(ppi, "dtf")).toBe("ideal");
  });

  it.each([
    [3300, 11, "ideal"],
    [3300, 14, "visible"],
    [1500, 11, "poor"],
    [1650, 11, "visible"],
  ] as const)("%i px at %f in is %s", (px, inches, grade) => {
    expect(gradePpi(effectivePpi({ inkWidthPx: px, inkHeightPx: px, widthIn: inches, heightIn: inches }), "screen-print")).toBe(grade);
  });

  it("uses the weaker direction when art is stretched", () => {
    expect(effectivePpi({ inkWidthPx: 3000, inkHeightPx: 1000, widthIn: 10, heightIn: 5 })).toBe(200);
  });

  it("states the largest size at 300 ppi", () => {
    const q = assessQuality({ isVector: false, inkWidthPx: 2400, inkHeightPx: 1200, widthIn: 11, heightIn: 5.5, method: "dtg" });
    expect(q.grade).toBe("visible");
    expect(q.largestIdealWidthIn).toBe(8);
    expect(q.message).toMatch(/8\.00 in wide/);
  });

  it("treats vector art as sharp at any size", () => {
    expect(assessQuality({ isVector: true, inkWidthPx: 100, inkHeightPx: 100, widthIn: 14, heightIn: 14, method: "htv" }).grade).toBe("vector");
  });
});

describe("shape and size advice (common practice, no published source)", () => {
  it.each([
    [3000, 1000, 0.9, false, "wide"],
    [1000, 1500, 0.9, false, "tall"],
    [1000, 1000, 0.785, true, "round"],
    [1000, 1000, 0.95, false, "square"],
    [1000, 1000, 0.3, false, "emblem"],
  ] as const)("%i × %i px with fill %f reads as %s", (w, h, fill, corners, shape) => {
    expect(classifyShape({ inkWidthPx: w, inkHeightPx: h, fillRatio: fill, cornersEmpty: corners })).toBe(shape);
  });

  it("sizes wide art by width at about 11 in on an adult front", () => {
    const a = suggestSize({ shape: "wide", aspect: 3, group: "adult", maxWidthIn: 11.25, maxHeightIn: 14 });
    expect(a.widthIn).toBeCloseTo(11);
    expect(a.heightIn).toBeCloseTo(11 / 3);
    expect(a.rule).toMatch(/sized by its width/);
  });

  it("sizes tall art by height at about 11 in, never over 14", () => {
    const a = suggestSize({ shape: "tall", aspect: 0.75, group: "adult", maxWidthIn: 11.25, maxHeightIn: 14 });
    expect(a.heightIn).toBeCloseTo(11);
    expect(a.widthIn).toBeCloseTo(8.25);
  });

  it("keeps emblem-like art at 9 in or less and round art at 10 to 11 in", () => {
    expect(suggestSize({ shape: "emblem", aspect: 1, group: "adult", maxWidthIn: 11.25, maxHeightIn: 14 }).widthIn).toBeLessThanOrEqual(9);
    const round = suggestSize({ shape: "round", aspect: 1, group: "adult", maxWidthIn: 11.25, maxHeightIn: 14 }).widthIn;
    expect(round).toBeGreaterThanOrEqual(10);
    expect(round).toBeLessThanOrEqual(11);
  });

  it("scales down for youth and toddler garments (youth about 9–10 in, toddler about 6–7 in, from memory)", () => {
    const youth = suggestSize({ shape: "wide", aspect: 3, group: "youth", maxWidthIn: 11, maxHeightIn: 12 }).widthIn;
    const toddler = suggestSize({ shape: "wide", aspect: 3, group: "toddler", maxWidthIn: 11, maxHeightIn: 12 }).widthIn;
    expect(youth).toBeGreaterThanOrEqual(9);
    expect(youth).toBeLessThanOrEqual(10);
    expect(toddler).toBeGreaterThanOrEqual(6);
    expect(toddler).toBeLessThanOrEqual(7);
  });

  it("never goes beyond the location's print area", () => {
    const a = suggestSize({ shape: "wide", aspect: 3, group: "adult", maxWidthIn: 9, maxHeightIn: 14 });
    expect(a.widthIn).toBeCloseTo(9);
    expect(a.limitedByArea).toBe(true);
    expect(a.rule).toMatch(/inside the print area/);
  });

  it("fills the print area by whichever side runs out first", () => {
    expect(fillPrintArea({ aspect: 1, maxWidthIn: 11.25, maxHeightIn: 14 })).toMatchObject({ widthIn: 11.25, heightIn: 11.25 });
    expect(fillPrintArea({ aspect: 0.5, maxWidthIn: 11.25, maxHeightIn: 14 })).toMatchObject({ widthIn: 7, heightIn: 14 });
  });
});
