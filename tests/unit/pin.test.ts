import { describe, expect, it } from "vitest";
import { describePin, isPinKey, movePin, PIN_BIG_STEP_IN, PIN_STEP_IN } from "@/lib/review/pin";

describe("pin steps", () => {
  it("are an eighth of an inch, and a whole inch with Shift", () => {
    expect(PIN_STEP_IN).toBe(0.125); // the trade's finest usual step, EIGHTH_IN in lib/units.ts
    expect(PIN_BIG_STEP_IN).toBe(1); // our own choice
  });
});

describe("movePin", () => {
  // Expected values: the start plus or minus one step, worked by hand.
  it.each([
    ["ArrowRight", false, 0.125, 6],
    ["ArrowLeft", false, -0.125, 6],
    ["ArrowUp", false, 0, 5.875],
    ["ArrowDown", false, 0, 6.125],
    ["ArrowRight", true, 1, 6],
    ["ArrowLeft", true, -1, 6],
    ["ArrowUp", true, 0, 5],
    ["ArrowDown", true, 0, 7],
  ] as const)("%s (Shift %s) from (0, 6) goes to (%d, %d)", (key, big, x, y) => {
    const moved = movePin({ x: 0, y: 6 }, key, big);
    expect(moved.x).toBeCloseTo(x, 10);
    expect(moved.y).toBeCloseTo(y, 10);
  });

  it("adds up without binary noise", () => {
    let pin = { x: 0.1, y: 6 + 1 / 3 };
    for (let i = 0; i < 3; i++) pin = movePin(pin, "ArrowRight", false);
    expect(pin.x).toBe(0.475); // 0.1 + 3 × 0.125
    expect(pin.y).toBeCloseTo(6 + 1 / 3, 9);
  });

  it.each([
    ["ArrowLeft", -5, 3],
    ["ArrowRight", 5, 3],
    ["ArrowUp", 0, 0],
    ["ArrowDown", 0, 10],
  ] as const)("stays inside the bounds on %s", (key, x, y) => {
    const bounds = { x: -5, y: 0, width: 10, height: 10 };
    const start = { x: key === "ArrowLeft" ? -4.5 : key === "ArrowRight" ? 4.5 : 0, y: key === "ArrowUp" ? 0.5 : key === "ArrowDown" ? 9.5 : 3 };
    const moved = movePin(start, key, true, bounds);
    expect(moved.x).toBeCloseTo(x, 10);
    expect(moved.y).toBeCloseTo(y, 10);
  });

  it("knows its keys", () => {
    expect(isPinKey("ArrowUp")).toBe(true);
    expect(isPinKey("Enter")).toBe(false);
  });
});

describe("describePin", () => {
  // Expected text: formatLength's nearest eighth (lib/units.ts), worked by hand.
  it.each([
    [0, 6.5, "in", false, "Pin at 0 in from centre, 6 1/2 in below the collar"],
    [1.25, 3, "in", false, "Pin at 1 1/4 in right of centre, 3 in below the collar"],
    [-2, 8, "in", false, "Pin at 2 in left of centre, 8 in below the collar"],
    [0.03, -0.5, "in", false, "Pin at 0 in from centre, 1/2 in above the collar"],
    [0, -0.02, "in", false, "Pin at 0 in from centre, 0 in below the collar"],
    [1, 2, "cm", false, "Pin at 2.5 cm right of centre, 5.1 cm below the collar"], // 2.54 cm, 5.08 cm
    [0, 4, "in", true, "Pin at 0 in from centre, 4 in below the top edge"],
  ] as const)("(%d, %d) in %s, tote %s: %s", (x, y, unit, tote, text) => {
    expect(describePin({ x, y }, unit, { tote })).toBe(text);
  });
});
