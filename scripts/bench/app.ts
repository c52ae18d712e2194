/**
 * The app under measurement: the test stack (its own PostgreSQL, migrations, demo data, fakes;
 * CHALKLINE_PORT_OFFSET moves it all), a production build when the current one is stale, and
 * `next start`. Everything started here is stopped again, on success, on error and on Ctrl+C.
 */
import { createServer, Server } from "node:net";
import { postgresStatus, stopPostgres, TEST_DB } from "../db";
import { TEST_MAIL } from "../fakes/smtp";
import { TEST_STRIPE } from "../fakes/stripe";
import { TEST_UPLOADS } from "../fakes/uploadthing";
import { buildApp, buildIsFresh, startNext, stopChild, waitForHealth } from "../lib/next";
import { sleep } from "../lib/proc";
import { bringUpStack, testPortOffset, type Stack } from "../lib/stack";

export type RunningApp = { baseUrl: string; stack: Stack };

const PORT_WAIT_S = Number(process.env.BENCH_PORT_WAIT_S ?? 300);

function portIsFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const server = createServer();
    server.once("error", () => resolve(false));
    server.listen(port, "127.0.0.1", () => server.close(() => resolve(true)));
  });
}

/**
 * The test fakes sit 100 ports apart, so with a port offset their ports can coincide with another
 * checkout's fakes at a neighbouring offset. Waits (a few minutes at most) for those ports to be
 * free instead of failing half-way through bringing the stack up.
 */
async function waitForFreePorts(ports: Array<{ port: number; what: string }>, log: (line: string) => void): Promise<void> {
  const deadline = Date.now() + PORT_WAIT_S * 1000;
  let told = false;
  for (;;) {
    const busy: string[] = [];
    for (const p of ports) if (!(await portIsFree(p.port))) busy.push(`${p.what} ${p.port}`);
    if (!busy.length) return;
    if (Date.now() > deadline) throw new Error(`ports still in use after ${PORT_WAIT_S} s: ${busy.join(", ")} (another checkout's stack?)`);
    if (!told) log(`waiting for ports held by another process: ${busy.join(", ")} (up to ${PORT_WAIT_S} s)…`);
    told = true;
    await sleep(5_000);
  }
}

/**
 * Runs `bringUp`, and when it fails, closes the listening servers it opened in this process.
 * bringUpStack starts its fakes in-process and leaves them listening if a later step fails, which
 * would block a retry on its own ports.
 */
async function closingServersOnFailure<T>(bringUp: () => Promise<T>): Promise<T> {
  const opened: Server[] = [];
  const listen = Server.prototype.listen;
  Server.prototype.listen = function (this: Server, ...args: unknown[]) {
    opened.push(this);
    return (listen as (...a: unknown[]) => Server).apply(this, args);
  } as typeof listen;
  try {
    return await bringUp();
  } catch (error) {
    await Promise.all(opened.map((server) => new Promise<void>((resolve) => (server.listening ? server.close(() => resolve()) : resolve()))));
    throw error;
  } finally {
    Server.prototype.listen = listen;
  }
}

export async function withApp<T>(log: (line: string) => void, prepare: (stack: Stack) => Promise<void>, fn: (app: RunningApp) => Promise<T>): Promise<T> {
  const offset = testPortOffset();
  const port = Number(process.env.BENCH_PORT ?? 3100 + offset);
  const pgTarget = { ...TEST_DB, port: TEST_DB.port + offset, dataDir: TEST_DB.dataDir + (offset ? `-${offset}` : "") };
  let app: ReturnType<typeof startNext> | undefined;
  let stack: Stack | undefined;
  let pgWasRunning = true;
  let stopping: Promise<void> | undefined;
  const stop = () =>
    (stopping ??= (async () => {
      if (app) await stopChild(app);
      // The bench's own database connections (fixtures) before the database itself.
      if (stack) {
        const { getPool } = await import("../../db/client");
        await getPool()
          .end()
          .catch(() => undefined);
        await stack.shutdown();
      } else if (!pgWasRunning && (await postgresStatus(pgTarget, "TEST_DATABASE_URL")).running) {
        // bringUpStack failed after starting PostgreSQL; it does not stop what it started then.
        await stopPostgres({ dataDir: pgTarget.dataDir, log: (line) => log(`db: ${line}`) });
      }
    })());
  const onSignal = (signal: NodeJS.Signals) => {
    log(`${signal}: stopping what the bench started…`);
    void stop().finally(() => process.exit(130));
  };
  process.once("SIGINT", onSignal);
  process.once("SIGTERM", onSignal);
  const ports = [
    { port: TEST_MAIL.smtpPort + offset, what: "mail fake SMTP" },
    { port: TEST_MAIL.httpPort + offset, what: "mail fake API" },
    { port: TEST_UPLOADS.port + offset, what: "uploads fake" },
    { port: TEST_STRIPE.port + offset, what: "payments fake" },
    { port, what: "app" },
  ];
  try {
    const deadline = Date.now() + PORT_WAIT_S * 1000;
    for (;;) {
      await waitForFreePorts(ports, log);
      pgWasRunning = (await postgresStatus(pgTarget, "TEST_DATABASE_URL")).running;
      try {
        stack = await closingServersOnFailure(() => bringUpStack({ mode: "test", port }));
        break;
      } catch (error) {
        // A neighbour took one of the ports between the check and the listen: undo, wait, try again.
        const message = error instanceof Error ? error.message : String(error);
        if (!/already in use/.test(message) || Date.now() > deadline) throw error;
        log(`${message} Retrying shortly…`);
        await stop();
        stopping = undefined;
        await sleep(5_000);
      }
    }
    process.env.DATABASE_URL = stack.databaseUrl;
    if (buildIsFresh()) log("the production build in .next is newer than the sources; not rebuilding");
    else await buildApp(stack.env, log);
    await prepare(stack);
    app = startNext({ dev: false, port, env: stack.env, quiet: true });
    const baseUrl = `http://localhost:${port}`;
    await waitForHealth(baseUrl, 90_000, app);
    log(`app (next start) answering on ${baseUrl}`);
    return await fn({ baseUrl, stack });
  } finally {
    process.off("SIGINT", onSignal);
    process.off("SIGTERM", onSignal);
    await stop();
  }
}
