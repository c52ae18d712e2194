/** One line of the `npm run bench` table, and the small statistics the measurements share. */
export type Row = { benchmark: string; subject: string; value: string; against: string; ratio: string };

export function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

/** Nearest-rank percentile (p in 0..100) of the samples. */
export function percentile(values: number[], p: number): number {
  if (values.length === 0) return Number.NaN;
  const s = [...values].sort((a, b) => a - b);
  const rank = Math.min(s.length, Math.max(1, Math.ceil((p / 100) * s.length)));
  return s[rank - 1]!;
}

export function printTable(rows: Row[], heading: string): void {
  const keys = ["benchmark", "subject", "value", "against", "ratio"] as const;
  const titles: Row = { benchmark: "benchmark", subject: "subject", value: "measured", against: "side by side", ratio: "ratio" };
  const widths = Object.fromEntries(keys.map((k) => [k, Math.max(titles[k].length, ...rows.map((r) => r[k].length))])) as Record<keyof Row, number>;
  const line = (r: Row) => keys.map((k) => r[k].padEnd(widths[k])).join(" | ");
  console.log(`\n${heading}\n`);
  console.log(line(titles));
  console.log(keys.map((k) => "-".repeat(widths[k])).join("-|-"));
  for (const r of rows) console.log(line(r));
}
