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

export async function enqueueExport(exportId: string): Promise<void> {
  const boss = await queue();
  await boss.send(EXPORT_QUEUE, { exportId }, { retryLimit: 0, expireInSeconds: 15 * 60 });
}
