import { spawn, type ChildProcess, type SpawnOptions } from "node:child_process";
import { existsSync, readdirSync, statSync } from "node:fs";
import path from "node:path";
import { repoRoot, run, sleep } from "./proc";

const NEXT_BIN = path.join(repoRoot, "node_modules", "next", "dist", "bin", "next");
/**
 * The app and the worker run in node itself with tsx as a loader, never under the tsx command: on
 * SIGTERM that wrapper gives its child 60 ms to say it caught the signal and kills it otherwise, so
 * a worker busy drawing a gang sheet would die mid-export instead of finishing it.
 */
const TSX_LOADER = ["--import", "tsx"];
const SOURCES = ["app", "components", "canvas", "db", "lib", "public", "fonts", "next.config.ts", "proxy.ts", "tailwind.config.ts", "postcss.config.mjs", "package-lock.json", "tsconfig.json"];

function newestMtime(entry: string): number {
  const full = path.join(repoRoot, entry);
  if (!existsSync(full)) return 0;
  const stat = statSync(full);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const child of readdirSync(full)) newest = Math.max(newest, newestMtime(path.join(entry, child)));
  return newest;
}

/** True when .next holds a production build newer than every source file. */
export function buildIsFresh(): boolean {
  const buildId = path.join(repoRoot, ".next", "BUILD_ID");
  if (!existsSync(buildId)) return false;
  const built = statSync(buildId).mtimeMs;
  return SOURCES.every((entry) => newestMtime(entry) <= built);
}

export async function buildApp(env: Record<string, string>, log: (line: string) => void): Promise<void> {
  log("building the app (next build)…");
  await run(process.execPath, [NEXT_BIN, "build"], {
    cwd: repoRoot,
    env: { ...process.env, ...env, NEXT_TELEMETRY_DISABLED: "1" },
    onLine: (line) => log(`  ${line}`),
  });
}

/** The app: Next.js behind scripts/serve.ts, which works out each request's client address. */
/** Where a child's output goes: this terminal, nowhere (errors still shown), or pipes the caller reads. */
export type ChildOutput = "inherit" | "quiet" | "pipe";
const stdioFor = (output: ChildOutput): SpawnOptions["stdio"] => (output === "pipe" ? ["ignore", "pipe", "pipe"] : output === "quiet" ? ["ignore", "ignore", "inherit"] : "inherit");

export function startNext(opts: { dev: boolean; port: number; env: Record<string, string>; quiet?: boolean; output?: ChildOutput }): ChildProcess {
  // CHALKLINE_SERVER_NODE_ARGS="--cpu-prof --cpu-prof-dir=…" profiles the server (Node refuses --cpu-prof in NODE_OPTIONS).
  const nodeArgs = (process.env.CHALKLINE_SERVER_NODE_ARGS ?? "").split(/\s+/).filter(Boolean);
  const args = [...nodeArgs, ...TSX_LOADER, path.join(repoRoot, "scripts", "serve.ts"), ...(opts.dev ? ["--dev"] : []), "-p", String(opts.port), "-H", process.env.HOST ?? "127.0.0.1"];
  return spawn(process.execPath, args, {
    cwd: repoRoot,
    env: { ...process.env, ...opts.env, NEXT_TELEMETRY_DISABLED: "1" },
    stdio: stdioFor(opts.output ?? (opts.quiet ? "quiet" : "inherit")),
  });
}

export async function waitForHealth(url: string, timeoutMs: number, child?: ChildProcess): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child && child.exitCode !== null) throw new Error(`the app exited with code ${child.exitCode} before it was ready`);
    try {
      const response = await fetch(`${url}/api/health`);
      if (response.ok) return;
    } catch {
      // not listening yet
    }
    await sleep(500);
  }
  throw new Error(`the app did not answer ${url}/api/health within ${Math.round(timeoutMs / 1000)} s`);
}

/** SIGTERM (the app and the worker finish what they have in flight), SIGKILL after `graceMs`. */
export async function stopChild(child: ChildProcess, graceMs = 8_000): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  await new Promise<void>((resolve) => {
    const timer = setTimeout(() => {
      child.kill("SIGKILL");
    }, graceMs);
    child.once("exit", () => {
      clearTimeout(timer);
      resolve();
    });
    child.kill("SIGTERM");
  });
}

/** The export worker, a separate process reading jobs from PostgreSQL. */
export function startWorker(env: Record<string, string>, quiet: boolean | ChildOutput = false): ChildProcess {
  return spawn(process.execPath, [...TSX_LOADER, "--conditions=react-server", path.join(repoRoot, "scripts", "worker.ts")], {
    cwd: repoRoot,
    env: { ...process.env, ...env },
    stdio: stdioFor(typeof quiet === "string" ? quiet : quiet ? "quiet" : "inherit"),
  });
}
