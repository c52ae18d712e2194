import { ensurePostgres, stopPostgres, TEST_DB, type DbTarget } from "@/scripts/db";
import { testPortOffset } from "@/scripts/lib/stack";
import { BASE_URL } from "./support";

/**
 * The test PostgreSQL cluster that `npm test` started, found the way the stack finds it
 * (CHALKLINE_PORT_OFFSET moves its port and data folder). Null when the app's database is not
 * that cluster (TEST_DATABASE_URL points elsewhere): then nothing here may stop it.
 */
export function testCluster(): DbTarget | null {
  const offset = testPortOffset();
  const target: DbTarget = { ...TEST_DB, port: TEST_DB.port + offset, dataDir: TEST_DB.dataDir + (offset ? `-${offset}` : "") };
  if (process.env.TEST_DATABASE_URL) return null;
  // The server itself, also in a run whose tests reach it through pgbouncer (`npm test -- --via-pgbouncer`).
  const url = process.env.CHALKLINE_DIRECT_DATABASE_URL ?? process.env.DATABASE_URL;
  if (!url) return null;
  const { port, hostname } = new URL(url);
  return Number(port) === target.port && (hostname === "127.0.0.1" || hostname === "localhost") ? target : null;
}

const log = (line: string) => console.log(`[e2e db] ${line}`);

export async function stopCluster(target: DbTarget): Promise<void> {
  await stopPostgres({ dataDir: target.dataDir, log });
}

/** Starts the cluster again with the settings the stack used; fine when it already runs. */
export async function startCluster(target: DbTarget): Promise<void> {
  await ensurePostgres({ ...target, fast: true, envVar: "TEST_DATABASE_URL", log });
}

export async function health(): Promise<{ status: number; body: { status?: string; db?: string } }> {
  const response = await fetch(`${BASE_URL}/api/health`);
  return { status: response.status, body: (await response.json().catch(() => ({}))) as { status?: string; db?: string } };
}

/** Polls /api/health until it gives the wanted status. */
export async function waitForHealth(status: 200 | 503, timeoutMs = 30_000): Promise<{ status: number; body: { status?: string; db?: string } }> {
  const deadline = Date.now() + timeoutMs;
  let last = await health();
  while (last.status !== status) {
    if (Date.now() > deadline) throw new Error(`/api/health stayed at ${last.status} (${JSON.stringify(last.body)}) instead of ${status}`);
    await new Promise((resolve) => setTimeout(resolve, 250));
    last = await health();
  }
  return last;
}
