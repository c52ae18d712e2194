import { describe, expect, it } from "vitest";
import { floorToEighth, formatLength, pastLimit, shortOf, shownSteps } from "@/lib/units";

// Display precision: inches to the nearest 1/8 in, centimetres to 0.1 cm (Chalkline's own formatLength).
// Centimetres from inches: NIST SP 811, 1 in = 2.54 cm exactly.

describe("shownSteps counts what formatLength shows", () => {
  it.each([
    [10, "in", 80],
    [9.98, "in", 80], // 79.84 eighths reads 10 in
    [9.9, "in", 79], // 79.2 eighths reads 9 7/8 in
    [4.3125, "in", 35], // exactly half an eighth rounds up, as formatLength does
    [-0.03, "in", 0],
    [-0.07, "in", -1],
    [11.25, "cm", 286], // 28.575 cm reads 28.6 cm
    [11.3, "cm", 287], // 28.702 cm reads 28.7 cm
    [0, "cm", 0],
  ] as const)("%d in in %s is %d steps", (value, unit, steps) => {
    expect(shownSteps(value, unit)).toBe(steps);
  });

  it.each([0.01, 0.0625, 0.2, 1.99, 2, 4.3125, 9.98, 11.3, 14.07, -0.07, -1.3])(
    "%d in: equal steps exactly when the text is equal",
    (value) => {
      for (const unit of ["in", "cm"] as const) {
        for (const other of [value - 0.05, value - 0.01, value, value + 0.01, value + 0.05]) {
          const sameText = formatLength(value, unit) === formatLength(other, unit);
          expect(shownSteps(value, unit) === shownSteps(other, unit), `${value} vs ${other} ${unit}`).toBe(
            sameText,
          );
        }
      }
    },
  );
});

describe("pastLimit and shortOf never fire on equal readings", () => {
  it.each([
    // [value, limit, unit, past, short]
    [10, 9.98, "in", false, false], // both read 10 in
    [10.07, 9.98, "in", true, false], // 10 1/8 in against 10 in
    [2, 2, "in", false, false],
    [1.95, 2, "in", false, false], // reads 2 in
    [1.9, 2, "in", false, true], // reads 1 7/8 in
    [11.26, 11.25, "cm", false, false], // both read 28.6 cm
    [11.3, 11.25, "cm", true, false], // 28.7 cm against 28.6 cm
    [0.04, 0, "in", false, false], // an overhang that reads 0 in is no overhang
  ] as const)("%d against %d (%s): past %s, short %s", (value, limit, unit, past, short) => {
    expect(pastLimit(value, limit, unit)).toBe(past);
    expect(shortOf(value, limit, unit)).toBe(short);
    if (past || short) expect(formatLength(value, unit)).not.toBe(formatLength(limit, unit));
  });
});

describe("floorToEighth", () => {
  it.each([
    [9.98, 9.875],
    [4.3125, 4.25],
    [10, 10],
    [10 - 1e-12, 10], // binary noise under a step still counts as that step
    [0.1, 0],
  ])("%d in rounds down to %d in", (value, expected) => {
    expect(floorToEighth(value)).toBe(expected);
  });
});
