/**
 * Small process helpers shared by the scripts in this folder.
 *
 * Everything here is dependency-free (node: built-ins only) so any script can
 * import it without pulling in the app.
 */
import { spawn, type SpawnOptions } from "node:child_process";
import { existsSync, readFileSync, realpathSync } from "node:fs";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";

/** Absolute path of the repository root (the folder that holds package.json). */
export const repoRoot: string = path.resolve(fileURLToPath(new URL("../..", import.meta.url)));

/** Absolute path inside the repository. */
export function repoPath(...parts: string[]): string {
  return path.join(repoRoot, ...parts);
}

/** True when the current process runs with uid 0. */
export function isRoot(): boolean {
  return typeof process.getuid === "function" && process.getuid() === 0;
}

export type LogFn = (line: string) => void;

/** Logger that writes `[prefix] line` to stderr (keeps stdout free for results). */
export function stderrLogger(prefix: string): LogFn {
  return (line: string) => {
    process.stderr.write(`[${prefix}] ${line}\n`);
  };
}

export function sleep(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

/**
 * True when the module whose `import.meta.url` is given is the script node/tsx
 * was started with (i.e. it should run its CLI).
 */
export function isMain(metaUrl: string): boolean {
  const entry = process.argv[1];
  if (!entry) return false;
  const self = fileURLToPath(metaUrl);
  const candidates = [path.resolve(entry)];
  try {
    candidates.push(realpathSync(entry));
  } catch {
    /* entry may not exist as a file (e.g. eval); ignore */
  }
  let selfReal = self;
  try {
    selfReal = realpathSync(self);
  } catch {
    /* ignore */
  }
  return candidates.some(
    (c) =>
      c === self ||
      c === selfReal ||
      pathToFileURL(c).href === metaUrl ||
      // `tsx scripts/foo` (without extension) resolves to scripts/foo.ts
      c + ".ts" === self,
  );
}

export interface RunOptions {
  /** Run the command as the `postgres` OS user (via `runuser`) when we are root. */
  asPostgres?: boolean;
  cwd?: string;
  env?: NodeJS.ProcessEnv;
  /** Called for each output line (stdout and stderr) as it arrives. */
  onLine?: LogFn;
  /** Do not throw on a non-zero exit code; inspect `code` instead. */
  allowFailure?: boolean;
  /** Kill the child (SIGTERM, then SIGKILL) after this many ms. */
  timeoutMs?: number;
  /** Written to the child's stdin, which is then closed. */
  input?: string;
}

export interface RunResult {
  code: number;
  signal: NodeJS.Signals | null;
  stdout: string;
  stderr: string;
  /** stdout and stderr interleaved in arrival order (last ~64 KB). */
  output: string;
}

/** Error thrown by {@link run} for a failed command; carries the output. */
export class RunError extends Error {
  constructor(
    message: string,
    readonly command: string,
    readonly result: RunResult | null,
  ) {
    super(message);
    this.name = "RunError";
  }
}

const MAX_CAPTURE = 64 * 1024;

function keepTail(s: string): string {
  return s.length > MAX_CAPTURE ? s.slice(s.length - MAX_CAPTURE) : s;
}

/** Quote an argv for display in error messages. */
export function formatCommand(cmd: string, args: readonly string[]): string {
  return [cmd, ...args]
    .map((a) => (/^[\w@%+=:,./-]+$/.test(a) ? a : `'${a.replace(/'/g, `'\\''`)}'`))
    .join(" ");
}

function findRunuser(): string {
  for (const p of ["/usr/sbin/runuser", "/sbin/runuser", "/usr/bin/runuser", "/bin/runuser"]) {
    if (existsSync(p)) return p;
  }
  return "runuser";
}

/**
 * Spawn a command (no shell) and resolve when it exits.
 * Throws a {@link RunError} with the captured output when the command cannot be
 * started or exits non-zero (unless `allowFailure`).
 */
export function run(cmd: string, args: readonly string[] = [], opts: RunOptions = {}): Promise<RunResult> {
  let file = cmd;
  let argv: string[] = [...args];
  let cwd = opts.cwd;
  if (opts.asPostgres && isRoot()) {
    file = findRunuser();
    argv = ["-u", "postgres", "--", cmd, ...args];
    // The postgres user usually cannot read root's cwd; pick a neutral one.
    cwd = cwd ?? "/";
  }
  const display = formatCommand(file, argv);
  const spawnOpts: SpawnOptions = {
    cwd,
    env: opts.env ?? process.env,
    stdio: [opts.input === undefined ? "ignore" : "pipe", "pipe", "pipe"],
  };

  return new Promise<RunResult>((resolve, reject) => {
    let stdout = "";
    let stderr = "";
    let output = "";
    const partial = { out: "", err: "" };
    let settled = false;
    let timer: NodeJS.Timeout | undefined;

    const child = spawn(file, argv, spawnOpts);

    const feed = (which: "out" | "err", chunk: Buffer) => {
      const text = chunk.toString("utf8");
      if (which === "out") stdout = keepTail(stdout + text);
      else stderr = keepTail(stderr + text);
      output = keepTail(output + text);
      if (opts.onLine) {
        const buf = partial[which] + text;
        const lines = buf.split(/\r?\n/);
        partial[which] = lines.pop() ?? "";
        for (const line of lines) if (line.trim() !== "") opts.onLine(line);
      }
    };
    child.stdout?.on("data", (c: Buffer) => feed("out", c));
    child.stderr?.on("data", (c: Buffer) => feed("err", c));
    if (opts.input !== undefined) {
      child.stdin?.on("error", () => {
        /* child closed stdin early; its exit status tells the story */
      });
      child.stdin?.end(opts.input);
    }

    if (opts.timeoutMs !== undefined) {
      timer = setTimeout(() => {
        child.kill("SIGTERM");
        setTimeout(() => child.kill("SIGKILL"), 5000).unref();
      }, opts.timeoutMs);
      timer.unref();
    }

    child.on("error", (err: NodeJS.ErrnoException) => {
      if (settled) return;
      settled = true;
      if (timer) clearTimeout(timer);
      const hint =
        err.code === "ENOENT"
          ? `command not found: ${file} (is it installed and on PATH?)`
          : `could not start ${file}: ${err.message}`;
      reject(new RunError(`${hint}\n  command: ${display}`, display, null));
    });

    child.on("close", (code, signal) => {
      if (settled) return;
      settled = true;
      if (timer) clearTimeout(timer);
      if (opts.onLine) {
        for (const rest of [partial.out, partial.err]) if (rest.trim() !== "") opts.onLine(rest);
      }
      const result: RunResult = { code: code ?? (signal ? 128 : 1), signal, stdout, stderr, output };
      if (result.code !== 0 && !opts.allowFailure) {
        const how = signal ? `was killed by ${signal}` : `exited with code ${result.code}`;
        const tail = lastLines(output, 40);
        reject(
          new RunError(
            `command ${how}: ${display}${tail ? `\n--- output (last lines) ---\n${tail}` : ""}`,
            display,
            result,
          ),
        );
        return;
      }
      resolve(result);
    });
  });
}

/** Last `n` non-empty-trailing lines of a text blob. */
export function lastLines(text: string, n: number): string {
  const lines = text.replace(/\s+$/, "").split(/\r?\n/);
  return lines.slice(-n).join("\n");
}

/** Last `n` lines of a file, or "" if it cannot be read. */
export function tailFile(file: string, n: number): string {
  try {
    return lastLines(readFileSync(file, "utf8"), n);
  } catch {
    return "";
  }
}

/**
 * True when `pid` refers to a live (non-zombie) process.
 * `expectComm` additionally requires /proc/<pid>/comm to match (Linux only;
 * elsewhere the check is skipped).
 */
export function pidAlive(pid: number, expectComm?: string): boolean {
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    process.kill(pid, 0);
  } catch (err) {
    // EPERM: exists but owned by someone else -> alive.
    if ((err as NodeJS.ErrnoException).code !== "EPERM") return false;
  }
  const procDir = `/proc/${pid}`;
  if (!existsSync("/proc/self")) return true; // no procfs: trust kill(0)
  try {
    const stat = readFileSync(`${procDir}/stat`, "utf8");
    // Format: "pid (comm) S ..." where comm may contain spaces/parens.
    const state = stat.slice(stat.lastIndexOf(")") + 2, stat.lastIndexOf(")") + 3);
    if (state === "Z" || state === "X") return false;
    if (expectComm) {
      const comm = readFileSync(`${procDir}/comm`, "utf8").trim();
      if (comm !== expectComm) return false;
    }
    return true;
  } catch {
    // Vanished between the checks.
    return false;
  }
}

/** Lookup helper: does `name` resolve to an executable on PATH? */
export function commandExists(name: string): boolean {
  const dirs = (process.env.PATH ?? "").split(path.delimiter).filter(Boolean);
  return dirs.some((d) => existsSync(path.join(d, name)));
}
