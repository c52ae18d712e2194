/**
 * `npm run bench`: figures measured side by side in one run, printed as one table.
 *  - gang sheet packing, the gang sheet files of the demo tee order and upload analysis (in this
 *    process, before anything else runs);
 *  - then, against a production build on the test stack it brings up and stops again:
 *    frame times of dragging 6000 × 6000 px art in the editor in headless Chromium, server
 *    throughput and p99 latency of a client review page against a prerendered page, and the
 *    first-load JavaScript of the review page and the editor, and the review page's wait on a
 *    throttled phone until the garment and art are drawn.
 * Each measurement lives in scripts/bench/; this file runs them in order and prints the table.
 */
import os from "node:os";
import { performance } from "node:perf_hooks";
import { DEMO_PASSWORD } from "../db/demo";
import { withApp } from "./bench/app";
import { launchChromium } from "./bench/browser";
import { measureEditorDrag } from "./bench/editor-drag";
import { createBenchFixture, type BenchFixture } from "./bench/fixtures";
import { measureFirstLoadJs } from "./bench/first-load-js";
import { measureGangFiles } from "./bench/gang-files";
import { measureGangSheets } from "./bench/gang-sheet";
import { measureLargeShop, prepareLargeShop } from "./bench/large-shop";
import { measurePageScripts } from "./bench/page-scripts";
import { measurePhoneLoad } from "./bench/phone-load";
import { measureReviewLoad } from "./bench/review-load";
import { printTable, type Row } from "./bench/table";
import { measureUploadAnalysis } from "./bench/upload-analysis";

const log = (line: string) => console.error(`[bench] ${line}`);
const began = performance.now();
const loadAtStart = os.loadavg()[0]!;
const rows: Row[] = [];

// `npm run bench -- --only=phone` (or drag, load, scripts, large) measures one part against the app, for work on it.
const only = process.argv.find((a) => a.startsWith("--only="))?.slice("--only=".length) ?? null;
const wants = (part: string) => only === null || only === part;

if (only === null) {
  rows.push(...measureGangSheets());
  rows.push(...(await measureGangFiles()));
  rows.push(...(await measureUploadAnalysis()));
  log(`packing and upload analysis done in ${((performance.now() - began) / 1000).toFixed(0)} s`);
}

let fixture: BenchFixture | undefined;
let large: Awaited<ReturnType<typeof prepareLargeShop>> | undefined;
let failure: unknown;
let appMs = 0;
try {
  await withApp(
    log,
    async () => {
      fixture = await createBenchFixture(log);
      if (wants("large")) large = await prepareLargeShop(log);
    },
    async ({ baseUrl }) => {
      const t0 = performance.now();
      const f = fixture!;
      if (wants("scripts")) rows.push(...measureFirstLoadJs(log));
      const browser = await launchChromium();
      try {
        if (wants("scripts")) rows.push(...(await measurePageScripts({ browser, baseUrl, fixture: f, password: DEMO_PASSWORD, log })));
        if (wants("drag")) rows.push(...(await measureEditorDrag({ browser, baseUrl, fixture: f, password: DEMO_PASSWORD, log })));
        if (wants("phone")) rows.push(...(await measurePhoneLoad({ browser, baseUrl, token: f.reviewToken, log })));
      } finally {
        await browser.close();
      }
      if (wants("load")) rows.push(...(await measureReviewLoad({ baseUrl, token: f.reviewToken, proofName: "Team tee", log })));
      if (wants("large")) rows.push(...(await measureLargeShop({ baseUrl, shop: large!, log })));
      appMs = performance.now() - t0;
    },
  );
} catch (error) {
  failure = error;
}

// Other work on the machine skews every figure; the 1-minute load average says how busy it was.
const machine = `${os.cpus().length} × ${os.cpus()[0]?.model ?? "cpu"}, ${Math.round(os.totalmem() / 2 ** 30)} GiB, Node ${process.version}`;
printTable(rows, `Chalkline benchmarks on ${machine}; load average ${loadAtStart.toFixed(2)} at start, ${os.loadavg()[0]!.toFixed(2)} at end`);
if (fixture) console.log(`\nEditor and review figures use a ${fixture.previewPx.width} × ${fixture.previewPx.height} px preview of a 6000 × 6000 px PNG (${(fixture.pngBytes / 2 ** 20).toFixed(1)} MB); measurements against the app took ${(appMs / 1000).toFixed(0)} s.`);
log(`whole run ${((performance.now() - began) / 1000).toFixed(0)} s`);
if (failure) {
  console.error(`\n[bench] the app measurements did not finish: ${failure instanceof Error ? (failure.stack ?? failure.message) : String(failure)}`);
  process.exit(1);
}
process.exit(0);
