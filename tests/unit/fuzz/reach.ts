/**
 * Counts how many generated cases reach a property's check, so that a property whose check is
 * skipped for some inputs (a guard, an early return, a loop over a list that may be empty) cannot
 * pass by skipping it nearly every time.
 *
 * Make one counter per test, pass `{ seed: reach.seed }` to `fc.assert`, call `generated()` once
 * per case and `reached(label)` when the case reaches a check, then, after `fc.assert`,
 * `expectShare(label, share)` for each label. The seed is drawn here so that a share that falls
 * short names it, as fast-check names it when the property itself fails; `FC_SEED=n` repeats one.
 */
import { expect } from "vitest";

export interface ReachCounter {
  /** The fast-check seed for this test's run. */
  readonly seed: number;
  generated(): void;
  reached(label: string): void;
  /** Fails unless at least `share` (0 to 1) of the generated cases reached `label`. */
  expectShare(label: string, share: number): void;
}

function drawSeed(): number {
  const fixed = process.env.FC_SEED;
  if (fixed !== undefined && fixed.trim() !== "" && Number.isSafeInteger(Number(fixed))) return Number(fixed);
  return Math.floor(Math.random() * 0x1_0000_0000) | 0;
}

export function reachCounter(what: string): ReachCounter {
  const seed = drawSeed();
  let generated = 0;
  const reached = new Map<string, number>();
  return {
    seed,
    generated() {
      generated++;
    },
    reached(label) {
      reached.set(label, (reached.get(label) ?? 0) + 1);
    },
    expectShare(label, share) {
      const count = reached.get(label) ?? 0;
      expect(generated, `${what} (seed ${seed}): no cases were generated`).toBeGreaterThan(0);
      expect(
        count / generated,
        `${what} (seed ${seed}): ${count} of ${generated} generated cases reached "${label}" (at least ${share} needed)`,
      ).toBeGreaterThanOrEqual(share);
    },
  };
}
