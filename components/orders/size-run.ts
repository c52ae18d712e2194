import { SIZE_GROUPS } from "@/lib/quotes";

/** Every size in grid order; the job form keeps one row per size, in this order. */
export const GRID_SIZES: readonly string[] = SIZE_GROUPS.flatMap((g) => g.sizes);

export function emptySizeRun(existing: ReadonlyArray<{ size: string; quantity: number }> = []) {
  const bySize = new Map(existing.map((r) => [r.size, r.quantity]));
  return GRID_SIZES.map((size) => ({ size, quantity: bySize.get(size) ?? 0 }));
}
