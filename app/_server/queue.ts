import "server-only";
import PgBoss from "pg-boss";

export const EXPORT_QUEUE = "chalkline-export";

/**
 * The PostgreSQL schema of the queue's tables: "pgboss", or CHALKLINE_QUEUE_SCHEMA, so that two
 * deployments sharing one database (a test's own app processes beside `npm test`'s) keep their
 * exports apart. Every app process and worker of one deployment must use the same.
 */
export function queueSchema(): string {
  const schema = process.env.CHALKLINE_QUEUE_SCHEMA || "pgboss";
  if (!/^[a-z_][a-z0-9_]{0,62}$/.test(schema)) throw new Error(`CHALKLINE_QUEUE_SCHEMA must be a lower-case SQL name (got "${schema}")`);
  return schema;
}

const globalForBoss = globalThis as unknown as { chalklineBoss?: Promise<PgBoss> };

/** One pg-boss client per server process, used to hand heavy exports to the worker. */
export function queue(): Promise<PgBoss> {
  globalForBoss.chalklineBoss ??= (async () => {
    const boss = new PgBoss({ connectionString: process.env.DATABASE_URL!, max: 2, schema: queueSchema() });
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
