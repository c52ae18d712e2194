/**
 * Gang sheet packing: length and area efficiency of our packer against the reference packers on the
 * same fixed 50-transfer mix, the area lower bound, and time and length for 500 and 5,000 transfers.
 */
import { BENCH_MIX_50, comparePackers, DEFAULT_PACKER, expandTransfers, packGangSheet } from "../../lib/production/packing";
import { time } from "./cpu-timing";
import type { Row } from "./table";

export function measureGangSheets(): Row[] {
  const rows: Row[] = [];
  // Fixed 50-transfer mix on a 22 in roll, 0.25 in gaps, turning allowed.
  const pieces = expandTransfers(BENCH_MIX_50, 0);
  const comparison = comparePackers(pieces, { rollWidthIn: 22, gapIn: 0.25, allowRotation: true, maxSheetLengthIn: 600 });
  const own = comparison.rows.find((r) => r.algorithm === "own")!;
  for (const r of comparison.rows) {
    rows.push({
      benchmark: "gang sheet, 50 transfers, 22 in roll",
      subject: `${r.algorithm}${r.algorithm === DEFAULT_PACKER ? " (used)" : ""}`,
      value: `${r.totalLengthIn.toFixed(2)} in, ${(r.efficiency * 100).toFixed(1)}% of area`,
      against: `lower bound ${comparison.areaLowerBoundIn.toFixed(2)} in`,
      ratio: `${(r.totalLengthIn / comparison.areaLowerBoundIn).toFixed(3)}× bound; ${(r.totalLengthIn / own.totalLengthIn).toFixed(3)}× own`,
    });
  }
  const big = expandTransfers(
    BENCH_MIX_50.map((item) => ({ ...item, quantity: item.quantity * 10 })),
    0,
  );
  // The product's packer against maxrects-packer alone, timed side by side: goal at most 3× its
  // time and never a longer sheet; and 5,000 transfers in under 2 s.
  for (const times of [10, 100]) {
    const job = times === 10 ? big : expandTransfers(BENCH_MIX_50.map((item) => ({ ...item, quantity: item.quantity * times })), 0);
    const settings = { pieces: job, rollWidthIn: 22, gapIn: 0.25, allowRotation: true, maxSheetLengthIn: 600 };
    const used = packGangSheet(settings);
    const reference = packGangSheet({ ...settings, algorithm: "maxrects" });
    const packMs = time(() => packGangSheet(settings), 3);
    const refMs = time(() => packGangSheet({ ...settings, algorithm: "maxrects" }), 3);
    const goal = times === 10 ? `goal ≤ 3× time` : `goal < 2000 ms`;
    rows.push({
      benchmark: `gang sheet, ${job.length} transfers`,
      subject: `${DEFAULT_PACKER} packer (kept ${used.algorithm}'s layout): ${used.totalLengthIn.toFixed(2)} in`,
      value: `${packMs.toFixed(0)} ms`,
      against: `maxrects ${refMs.toFixed(0)} ms, ${reference.totalLengthIn.toFixed(2)} in; ${goal}`,
      ratio: `${(packMs / refMs).toFixed(2)}× time, ${(used.totalLengthIn / reference.totalLengthIn).toFixed(3)}× length`,
    });
  }
  return rows;
}
