/**
 * Gang sheet packing: length and area efficiency of our packer against the reference packers on the
 * same fixed 50-transfer mix, the area lower bound, and time for 500 transfers.
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
  const packMs = time(() => packGangSheet({ pieces: big, rollWidthIn: 22, gapIn: 0.25, allowRotation: true, maxSheetLengthIn: 600 }), 3);
  const refMs = time(() => packGangSheet({ pieces: big, rollWidthIn: 22, gapIn: 0.25, allowRotation: true, maxSheetLengthIn: 600, algorithm: "maxrects" }), 3);
  rows.push({ benchmark: "gang sheet, 500 transfers", subject: `${DEFAULT_PACKER} packer time`, value: `${packMs.toFixed(0)} ms`, against: `maxrects ${refMs.toFixed(0)} ms`, ratio: `${(packMs / refMs).toFixed(2)}×` });
  return rows;
}
