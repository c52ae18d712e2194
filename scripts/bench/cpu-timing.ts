import { performance } from "node:perf_hooks";
import { median } from "./table";

/** Median wall time of `runs` calls, in ms. */
export function time(fn: () => unknown, runs: number): number {
  const samples: number[] = [];
  for (let i = 0; i < runs; i += 1) {
    const t = performance.now();
    fn();
    samples.push(performance.now() - t);
  }
  return median(samples);
}

export async function timeAsync(fn: () => Promise<unknown>, runs: number): Promise<number> {
  const samples: number[] = [];
  for (let i = 0; i < runs; i += 1) {
    const t = performance.now();
    await fn();
    samples.push(performance.now() - t);
  }
  return median(samples);
}
