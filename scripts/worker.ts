/**
 * The export worker: takes heavy exports (gang sheets, big PDFs) from the pg-boss queue in
 * PostgreSQL. Started beside the app by `npm start` and `npm test`; more can run on other machines.
 * Run with the react-server condition so server-only modules load: `tsx --conditions=react-server scripts/worker.ts`.
 */
import PgBoss from "pg-boss";
import { runExport } from "../app/_server/production/run-export";
import { EXPORT_QUEUE } from "../app/_server/queue";

const url = process.env.DATABASE_URL;
if (!url) {
  console.error("[worker] DATABASE_URL is not set.");
  process.exit(1);
}

const boss = new PgBoss({ connectionString: url, max: 3, schema: "pgboss" });
boss.on("error", (error) => console.error("[worker]", error.message));
await boss.start();
await boss.createQueue(EXPORT_QUEUE).catch(() => undefined);
await boss.work<{ exportId: string }>(EXPORT_QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
  if (job) await runExport(job.data.exportId);
});
console.log("[worker] waiting for exports");

async function stop() {
  await boss.stop({ graceful: true, timeout: 5_000 }).catch(() => undefined);
  process.exit(0);
}
process.on("SIGINT", () => void stop());
process.on("SIGTERM", () => void stop());
