/**
 * Several app processes and export workers on one PostgreSQL: pgbouncer (transaction pooling) in
 * front of the database, the app processes (scripts/serve.ts on the same production build) behind
 * nginx, the workers beside them, every one of them connecting through pgbouncer. What
 * `tests/e2e/scale-out.test.ts` runs; each process gets the settings a real deployment gives it.
 */
import type { ChildProcess } from "node:child_process";
import { waitForHealth, startNext, startWorker, stopChild } from "./next";
import { startNginx, type Nginx } from "./nginx";
import { startPgbouncer, type Pgbouncer } from "./pgbouncer";
import type { LogFn } from "./proc";

/** Loopback ports of a scale-out run, moved by CHALKLINE_PORT_OFFSET like every test port. */
export function scaleOutPorts(offset: number, apps: number) {
  return { nginx: 3180 + offset, apps: Array.from({ length: apps }, (_, i) => 3181 + i + offset), pgbouncer: 54338 + offset };
}

/** A child's output, line by line, kept and waited on. */
export class ProcessLog {
  readonly lines: string[] = [];
  private waiters: Array<{ pattern: RegExp; resolve: (line: string) => void }> = [];

  constructor(
    readonly name: string,
    child: ChildProcess,
    echo?: LogFn,
  ) {
    for (const stream of [child.stdout, child.stderr]) {
      let partial = "";
      stream?.on("data", (chunk: Buffer) => {
        const parts = (partial + chunk.toString("utf8")).split("\n");
        partial = parts.pop() ?? "";
        for (const line of parts) this.push(line, echo);
      });
      stream?.on("end", () => {
        if (partial) this.push(partial, echo);
        partial = "";
      });
    }
  }

  private push(line: string, echo?: LogFn) {
    this.lines.push(line);
    echo?.(`${this.name}: ${line}`);
    this.waiters = this.waiters.filter((w) => {
      if (!w.pattern.test(line)) return true;
      w.resolve(line);
      return false;
    });
  }

  /** Index of the first line matching `pattern`, or -1. */
  indexOf(pattern: RegExp): number {
    return this.lines.findIndex((line) => pattern.test(line));
  }

  /** The first line matching `pattern`, already written or yet to come. */
  next(pattern: RegExp): Promise<string> {
    const seen = this.lines.find((line) => pattern.test(line));
    if (seen !== undefined) return Promise.resolve(seen);
    return new Promise((resolve) => this.waiters.push({ pattern, resolve }));
  }
}

export type Managed = { name: string; child: ChildProcess; log: ProcessLog; exited: Promise<number | null> };
export type ScaleOut = {
  bouncer: Pgbouncer;
  nginx: Nginx;
  apps: Array<Managed & { port: number; url: string }>;
  workers: Managed[];
  /** What each process was given, beside the caller's environment. */
  env: Record<string, string>;
  stop: () => Promise<void>;
};

export function manage(name: string, child: ChildProcess, echo?: LogFn): Managed {
  const log = new ProcessLog(name, child, echo);
  const exited = new Promise<number | null>((resolve) => child.once("exit", (code) => resolve(code)));
  return { name, child, log, exited };
}

/**
 * Starts pgbouncer in front of `databaseUrl`, `apps` app processes behind nginx and `workers`
 * workers, all with DATABASE_URL through pgbouncer. `env` is what every process gets (secrets,
 * service keys, CHALKLINE_QUEUE_SCHEMA…). Whatever started is stopped again if a later step fails.
 */
export async function startScaleOut(opts: { databaseUrl: string; env: Record<string, string>; apps: number; workers: number; offset: number; log: LogFn; echo?: LogFn }): Promise<ScaleOut> {
  const ports = scaleOutPorts(opts.offset, opts.apps);
  const started: Array<() => Promise<void>> = [];
  const stop = async () => {
    for (const close of started.reverse()) await close().catch((error: unknown) => opts.log(`stopping: ${error instanceof Error ? error.message : String(error)}`));
    started.length = 0;
  };
  try {
    const bouncer = await startPgbouncer({ port: ports.pgbouncer, serverUrl: opts.databaseUrl, log: opts.log });
    started.push(bouncer.stop);
    const publicUrl = `http://127.0.0.1:${ports.nginx}`;
    const env: Record<string, string> = {
      ...opts.env,
      DATABASE_URL: bouncer.urlFor(opts.databaseUrl),
      // Every process names the address people use: the load balancer's.
      NEXTAUTH_URL: publicUrl,
      APP_URL: publicUrl,
      // nginx on this machine is the one proxy whose X-Forwarded-For is believed.
      TRUSTED_PROXIES: "127.0.0.1",
    };
    const apps = ports.apps.map((port, i) => {
      const child = startNext({ dev: false, port, env: { ...env, PORT: String(port) }, output: "pipe" });
      const app = { ...manage(`app ${String.fromCharCode(65 + i)}`, child, opts.echo), port, url: `http://127.0.0.1:${port}` };
      started.push(() => stopChild(child, 40_000));
      return app;
    });
    const workers = Array.from({ length: opts.workers }, (_, i) => {
      const child = startWorker(env, "pipe");
      started.push(() => stopChild(child, 40_000));
      return manage(`worker ${i + 1}`, child, opts.echo);
    });
    await Promise.all(apps.map((app) => waitForHealth(app.url, 90_000, app.child)));
    await Promise.all(workers.map((w) => Promise.race([w.log.next(/waiting for exports/), w.exited.then((code) => Promise.reject(new Error(`${w.name} exited (${code}) before it was ready:\n${w.log.lines.slice(-20).join("\n")}`)))])));
    const nginx = await startNginx({ port: ports.nginx, upstreams: ports.apps, log: opts.log });
    started.push(nginx.stop);
    return { bouncer, nginx, apps, workers, env, stop };
  } catch (error) {
    await stop();
    throw error;
  }
}
