import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { snapHandleBox, type HandleBox } from "@/canvas/transform-snap";
import { MIN_HANDLE_SIDE_IN, snapArtSize } from "@/lib/editor/snap";

// 1/8 in: the step drags already snap to (the editor's own rule, "Drag snaps to the center line and to 1/8 in").
const STEP = 0.125;
const onStep = (inches: number) => Math.abs(inches / STEP - Math.round(inches / STEP)) < 1e-9;

describe("snapArtSize", () => {
  it.each([
    // before, after, proportional, expected; numbers chosen by hand
    [
      { widthIn: 12, heightIn: 10 },
      { widthIn: 12.039, heightIn: 10.0325 },
      true,
      { widthIn: 12, heightIn: 10 },
    ],
    [
      { widthIn: 12, heightIn: 10 },
      { widthIn: 12.07, heightIn: 10.0583 },
      true,
      { widthIn: 12.125, heightIn: 12.125 / 1.2 },
    ],
    // Tall art snaps its height (the long side); the width follows 2:3.
    [
      { widthIn: 4, heightIn: 6 },
      { widthIn: 5.05, heightIn: 7.58 },
      true,
      { widthIn: 7.625 * (2 / 3), heightIn: 7.625 },
    ],
    // Free handles: a side the handle did not touch keeps its exact length.
    [
      { widthIn: 4.31, heightIn: 3.03 },
      { widthIn: 5.2, heightIn: 3.03 },
      false,
      { widthIn: 5.25, heightIn: 3.03 },
    ],
    [
      { widthIn: 4.31, heightIn: 3.03 },
      { widthIn: 5.2, heightIn: 2.4 },
      false,
      { widthIn: 5.25, heightIn: 2.375 },
    ],
    // Never below the smallest side a handle leaves (our own 1/4 in floor), even on the short side.
    [{ widthIn: 4, heightIn: 1 }, { widthIn: 0.4, heightIn: 0.1 }, true, { widthIn: 1, heightIn: 0.25 }],
    [
      { widthIn: 2, heightIn: 2 },
      { widthIn: 0.01, heightIn: 2 },
      false,
      { widthIn: MIN_HANDLE_SIDE_IN, heightIn: 2 },
    ],
  ])("%o resized to %o (proportional %s) snaps to %o", (before, after, proportional, expected) => {
    const out = snapArtSize({ before, after, proportional });
    expect(out.widthIn).toBeCloseTo(expected.widthIn, 9);
    expect(out.heightIn).toBeCloseTo(expected.heightIn, 9);
  });

  it("gives the same object back when the size did not change (a turn)", () => {
    const before = { widthIn: 4.31, heightIn: 3.03 };
    expect(snapArtSize({ before, after: { ...before }, proportional: true })).toBe(before);
  });

  it("keeps proportions exactly and puts the long side on the 1/8 in grid, for any resize", () => {
    const side = fc.double({ min: 0.3, max: 40, noNaN: true });
    fc.assert(
      fc.property(side, side, fc.double({ min: 0.05, max: 4, noNaN: true }), (w, h, k) => {
        const out = snapArtSize({
          before: { widthIn: w, heightIn: h },
          after: { widthIn: w * k, heightIn: h * k },
          proportional: true,
        });
        expect(out.widthIn / out.heightIn).toBeCloseTo(w / h, 9);
        expect(onStep(w >= h ? out.widthIn : out.heightIn)).toBe(true);
        expect(Math.min(out.widthIn, out.heightIn)).toBeGreaterThanOrEqual(MIN_HANDLE_SIDE_IN - 1e-9);
        // Within half a step of what was asked on the long side, unless the floor lifted it.
        const asked = w >= h ? w * k : h * k;
        const got = w >= h ? out.widthIn : out.heightIn;
        if (Math.min(w, h) * k >= MIN_HANDLE_SIDE_IN + STEP)
          expect(Math.abs(got - asked)).toBeLessThanOrEqual(STEP / 2 + 1e-9);
      }),
      { numRuns: 300 },
    );
  });
});

describe("snapHandleBox (Konva boundBoxFunc boxes: stage px, radians)", () => {
  const S = 20; // stage px per inch
  const box = (x: number, y: number, wIn: number, hIn: number, rotation = 0): HandleBox => ({
    x,
    y,
    width: wIn * S,
    height: hIn * S,
    rotation,
  });
  const corner = (b: HandleBox, fx: number, fy: number) => ({
    x: b.x + fx * b.width * Math.cos(b.rotation) - fy * b.height * Math.sin(b.rotation),
    y: b.y + fx * b.width * Math.sin(b.rotation) + fy * b.height * Math.cos(b.rotation),
  });

  it("bottom-right handle: snaps the size and keeps the top-left corner still", () => {
    const oldBox = box(100, 50, 12, 10);
    const newBox = box(100, 50, 12.039, 10.0325);
    const out = snapHandleBox({ oldBox, newBox, scale: S, proportional: true });
    expect(out.width / S).toBeCloseTo(12, 9);
    expect(out.height / S).toBeCloseTo(10, 9);
    expect(out.x).toBeCloseTo(100, 9);
    expect(out.y).toBeCloseTo(50, 9);
  });

  it.each([0, Math.PI / 6, -Math.PI / 2.5])(
    "top-left handle on art turned %f rad: the bottom-right corner stays put",
    (rotation) => {
      const oldBox = box(100, 50, 8, 4, rotation);
      const fixed = corner(oldBox, 1, 1);
      // Grow by 0.53 in across, 0.265 in down, pivoting on the bottom-right corner.
      const grown = { ...box(0, 0, 8.53, 4.265, rotation) };
      const start = {
        x: fixed.x - (grown.width * Math.cos(rotation) - grown.height * Math.sin(rotation)),
        y: fixed.y - (grown.width * Math.sin(rotation) + grown.height * Math.cos(rotation)),
      };
      const newBox = { ...grown, ...start };
      const out = snapHandleBox({ oldBox, newBox, scale: S, proportional: true });
      expect(out.width / S).toBeCloseTo(8.5, 9);
      expect(out.height / S).toBeCloseTo(4.25, 9);
      const after = corner(out, 1, 1);
      expect(after.x).toBeCloseTo(fixed.x, 6);
      expect(after.y).toBeCloseTo(fixed.y, 6);
      expect(out.rotation).toBe(rotation);
    },
  );

  it("scaling from the middle (Alt) keeps the middle still", () => {
    const oldBox = box(100, 100, 6, 6);
    const middle = corner(oldBox, 0.5, 0.5);
    const newBox = box(middle.x - 3.2 * S, middle.y - 3.2 * S, 6.4, 6.4);
    const out = snapHandleBox({ oldBox, newBox, scale: S, proportional: true });
    expect(out.width / S).toBeCloseTo(6.375, 9);
    const after = corner(out, 0.5, 0.5);
    expect(after.x).toBeCloseTo(middle.x, 6);
    expect(after.y).toBeCloseTo(middle.y, 6);
  });

  it("a free side handle snaps only the side it moves", () => {
    const oldBox = box(10, 10, 4.31, 3.03);
    const newBox = box(10, 10, 5.2, 3.03);
    const out = snapHandleBox({ oldBox, newBox, scale: S, proportional: false });
    expect(out.width / S).toBeCloseTo(5.25, 9);
    expect(out.height / S).toBeCloseTo(3.03, 9);
    expect([out.x, out.y]).toEqual([10, 10]);
  });

  it("a turn passes through untouched", () => {
    const oldBox = box(10, 10, 4.31, 3.03, 0);
    const newBox = { ...box(12, 8, 4.31, 3.03), rotation: 0.3 };
    expect(snapHandleBox({ oldBox, newBox, scale: S, proportional: true })).toBe(newBox);
  });
});
