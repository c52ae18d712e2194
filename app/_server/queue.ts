import "server-only";
import PgBoss from "pg-boss";

export const EXPORT_QUEUE = "chalkline-export";

const globalForBoss = globalThis as unknown as { chalklineBoss?: Promise<PgBoss> };

/** One pg-boss client per server process, used to hand heavy exports to the worker. */
export function queue(): Promise<PgBoss> {
  globalForBoss.chalklineBoss ??= (async () => {
    const boss = new PgBoss({ connectionString: process.env.DATABASE_URL!, max: 2, schema: "pgboss" });
    boss.on("error", (error) => console.error("[queue]", error.message));
    await boss.start();
    await boss.createQueue(EXPORT_QUEUE).catch(() => undefined);
    return boss;
  })().catch((error: unknown) => {
    globalForBoss.chalklineBoss = undefined;
    throw error;
  });
  return globalForBoss.chalklineBoss;
}

/** Each export is one queue job, never retried by the queue itself (a failed export says why and the person retries it). */
export const EXPORT_JOB_OPTIONS = { retryLimit: 0, expireInSeconds: 15 * 60 } as const;

export async function enqueueExport(exportId: string, boss?: PgBoss): Promise<void> {
  await (boss ?? (await queue())).send(EXPORT_QUEUE, { exportId }, EXPORT_JOB_OPTIONS);
}
