/**
 * Counts how many generated cases reach a property's check, so that a property whose check is
 * skipped for some inputs (a guard, an early return, a loop over a list that may be empty) cannot
 * pass by skipping it nearly every time.
 *
 * Make one counter per test, call `generated()` once per case and `reached(label)` when the case
 * reaches a check, then, after `fc.assert`, `expectShare(label, share)` for each label.
 */
import { expect } from "vitest";

export interface ReachCounter {
  generated(): void;
  reached(label: string): void;
  /** Fails unless at least `share` (0 to 1) of the generated cases reached `label`. */
  expectShare(label: string, share: number): void;
}

export function reachCounter(what: string): ReachCounter {
  let generated = 0;
  const reached = new Map<string, number>();
  return {
    generated() {
      generated++;
    },
    reached(label) {
      reached.set(label, (reached.get(label) ?? 0) + 1);
    },
    expectShare(label, share) {
      const count = reached.get(label) ?? 0;
      expect(generated, `${what}: no cases were generated`).toBeGreaterThan(0);
      expect(
        count / generated,
        `${what}: ${count} of ${generated} generated cases reached "${label}" (at least ${share} needed)`,
      ).toBeGreaterThanOrEqual(share);
    },
  };
}
