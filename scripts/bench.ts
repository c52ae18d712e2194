/**
 * `npm run bench`: figures measured side by side in one run, printed as one table.
 * Today: gang sheet packing (length and area efficiency of our packer against the reference
 * packers on the same fixed 50-transfer mix, the area lower bound, and time for 500 transfers)
 * and upload analysis against sharp's bare decode and resize of the same file.
 */
import { performance } from "node:perf_hooks";
import os from "node:os";
import sharp from "sharp";
import { BENCH_MIX_50, comparePackers, expandTransfers, packGangSheet, DEFAULT_PACKER } from "../lib/production/packing";

type Row = { benchmark: string; subject: string; value: string; against: string; ratio: string };
const rows: Row[] = [];

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

function time(fn: () => unknown, runs: number): number {
  const samples: number[] = [];
  for (let i = 0; i < runs; i += 1) {
    const t = performance.now();
    fn();
    samples.push(performance.now() - t);
  }
  return median(samples);
}

async function timeAsync(fn: () => Promise<unknown>, runs: number): Promise<number> {
  const samples: number[] = [];
  for (let i = 0; i < runs; i += 1) {
    const t = performance.now();
    await fn();
    samples.push(performance.now() - t);
  }
  return median(samples);
}

// Gang sheet: fixed 50-transfer mix on a 22 in roll, 0.25 in gaps, turning allowed.
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

// Upload analysis of a 24-megapixel PNG against sharp's bare decode and resize of the same file.
const { analyzeArtwork } = await import("../app/_server/artwork/analyze");
const w = 6000;
const h = 4000;
const noise = Buffer.alloc(w * h * 4);
for (let i = 0; i < noise.length; i += 4) {
  const x = (i / 4) % w;
  const y = Math.floor(i / 4 / w);
  noise[i] = (x * 7) & 255;
  noise[i + 1] = (y * 5) & 255;
  noise[i + 2] = ((x + y) * 3) & 255;
  noise[i + 3] = x > 300 && x < w - 300 && y > 200 && y < h - 200 ? 255 : 0;
}
const png = await sharp(noise, { raw: { width: w, height: h, channels: 4 } }).png({ compressionLevel: 3 }).toBuffer();
const bareMs = await timeAsync(() => sharp(png, { limitInputPixels: false }).resize(2048, 2048, { fit: "inside" }).webp().toBuffer(), 3);
const analysisMs = await timeAsync(() => analyzeArtwork(png, { name: "bench.png", type: "image/png" }), 3);
rows.push({ benchmark: "upload analysis, 24 MP PNG", subject: "full analysis", value: `${analysisMs.toFixed(0)} ms`, against: `sharp decode+resize ${bareMs.toFixed(0)} ms`, ratio: `${(analysisMs / bareMs).toFixed(2)}×` });

const widths = { benchmark: 0, subject: 0, value: 0, against: 0, ratio: 0 };
for (const r of rows) for (const k of Object.keys(widths) as Array<keyof Row>) widths[k] = Math.max(widths[k], r[k].length, k.length);
const line = (r: Row) => (Object.keys(widths) as Array<keyof Row>).map((k) => r[k].padEnd(widths[k])).join(" | ");
console.log(`\nChalkline benchmarks on ${os.cpus().length} × ${os.cpus()[0]?.model ?? "cpu"}, ${Math.round(os.totalmem() / 2 ** 30)} GiB, Node ${process.version}\n`);
console.log(line({ benchmark: "benchmark", subject: "subject", value: "measured", against: "side by side", ratio: "ratio" }));
console.log((Object.keys(widths) as Array<keyof Row>).map((k) => "-".repeat(widths[k])).join("-|-"));
for (const r of rows) console.log(line(r));
