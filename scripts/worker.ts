/**
 * The export worker: takes heavy exports (gang sheets, big PDFs) from the pg-boss queue in
 * PostgreSQL. Started beside the app by `npm start` and `npm test`; more can run on other machines,
 * and each export is taken by one of them.
 * Run with the react-server condition so server-only modules load, in node with tsx as a loader (the
 * `tsx` command kills a busy child on SIGTERM): `node --import tsx --conditions=react-server scripts/worker.ts`.
 *
 * SIGTERM or SIGINT: takes no new exports and finishes the ones in flight. One still running after
 * CHALKLINE_WORKER_DRAIN_SECONDS (25 by default, under the usual 30 s before a supervisor kills) is
 * put back in the queue for another worker, and the exit code says so.
 */
import PgBoss from "pg-boss";
import { runExport } from "../app/_server/production/run-export";
import { enqueueExport, EXPORT_QUEUE, queueSchema } from "../app/_server/queue";
import { requeueExport } from "../db/queries/production";

const url = process.env.DATABASE_URL;
if (!url) {
  console.error("[worker] DATABASE_URL is not set.");
  process.exit(1);
}
const drainSeconds = Number(process.env.CHALKLINE_WORKER_DRAIN_SECONDS ?? 25);
if (!Number.isFinite(drainSeconds) || drainSeconds < 0) {
  console.error(`[worker] CHALKLINE_WORKER_DRAIN_SECONDS must be a number of seconds (got "${process.env.CHALKLINE_WORKER_DRAIN_SECONDS}")`);
  process.exit(1);
}

const boss = new PgBoss({ connectionString: url, max: 3, schema: queueSchema() });
boss.on("error", (error) => console.error("[worker]", error.message));
await boss.start();
await boss.createQueue(EXPORT_QUEUE).catch(() => undefined);

/** Exports this process is working on, by id. */
const inFlight = new Map<string, Promise<void>>();
await boss.work<{ exportId: string }>(EXPORT_QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
  if (!job) return;
  const { exportId } = job.data;
  const started = Date.now();
  console.log(`[worker] export ${exportId}: started`);
  const run = runExport(exportId);
  inFlight.set(exportId, run);
  try {
    await run;
    console.log(`[worker] export ${exportId}: finished in ${Date.now() - started} ms`);
  } finally {
    inFlight.delete(exportId);
  }
});
console.log("[worker] waiting for exports");

let stopping = false;
async function stop(signal: NodeJS.Signals) {
  if (stopping) return;
  stopping = true;
  console.log(`[worker] ${signal}: taking no new exports; finishing ${inFlight.size} in flight (at most ${drainSeconds} s)`);
  await boss.offWork(EXPORT_QUEUE).catch(() => undefined);
  let timer: NodeJS.Timeout | undefined;
  const finished = await Promise.race([
    Promise.allSettled([...inFlight.values()]).then(() => true),
    new Promise<false>((resolve) => (timer = setTimeout(() => resolve(false), drainSeconds * 1000))),
  ]);
  clearTimeout(timer);
  let code = 0;
  if (!finished) {
    for (const exportId of inFlight.keys()) {
      try {
        if (await requeueExport({ exportId })) {
          await enqueueExport(exportId, boss);
          console.error(`[worker] export ${exportId}: not finished after ${drainSeconds} s; put back in the queue`);
        }
      } catch (error) {
        console.error(`[worker] export ${exportId}: could not be put back in the queue:`, error instanceof Error ? error.message : String(error));
      }
    }
    code = 1;
  }
  // Finished: the queue's own bookkeeping (the jobs marked complete) before the connections close.
  // Cut short: at once, so the unfinished run writes nothing more once its export is back in the queue.
  await boss.stop(finished ? { graceful: true, timeout: 2_000 } : { graceful: false }).catch(() => undefined);
  console.log("[worker] stopped");
  process.exit(code);
}
process.on("SIGINT", (signal) => void stop(signal));
process.on("SIGTERM", (signal) => void stop(signal));
