/**
 * Debian's pgbouncer in transaction pooling mode in front of a PostgreSQL server, for tests and
 * local scale-out runs: a config of our own in a folder of its own (pid and log there too), never
 * the system service. Clients connect as they would to the server (same user and database names);
 * pgbouncer trusts loopback clients and logs in to the server as they do, which suits the local
 * clusters of scripts/db.ts (trust authentication for their superuser on 127.0.0.1).
 *
 * Transaction pooling hands each transaction a server connection of its own, so nothing that
 * lives in a session may be relied on: no named prepared statements, no SET without LOCAL, no
 * session advisory locks, no LISTEN. Migrations take a session advisory lock and go to the server
 * directly.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { chmodSync, chownSync, mkdirSync, mkdtempSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { ensureDebianProgram } from "./debian";
import { stopProcess } from "./nginx";
import { waitForPort } from "./ports";
import { isRoot, run, tailFile, type LogFn } from "./proc";

export const PGBOUNCER = process.env.PGBOUNCER_PATH ?? "/usr/sbin/pgbouncer";

export type PgbouncerOptions = { port: number; serverUrl: string; dir?: string; poolSize?: number; log: LogFn };
export type Pgbouncer = { port: number; dir: string; child: ChildProcess; logFile: string; urlFor: (serverUrl: string) => string; stop: () => Promise<void> };

export function pgbouncerConfig(opts: { port: number; serverHost: string; serverPort: number; dir: string; poolSize: number; user: string }): string {
  const at = (name: string) => path.join(opts.dir, name);
  return `; Written by scripts/lib/pgbouncer.ts; pgbouncer runs in the foreground with everything in ${opts.dir}.
[databases]
* = host=${opts.serverHost} port=${opts.serverPort}

[pgbouncer]
listen_addr = 127.0.0.1
listen_port = ${opts.port}
unix_socket_dir =
pidfile = ${at("pgbouncer.pid")}
logfile = ${at("pgbouncer.log")}
auth_type = trust
auth_file = ${at("userlist.txt")}
pool_mode = transaction
; The admin console (database "pgbouncer": SHOW STATS, SHOW CLIENTS) for the same user.
admin_users = ${opts.user}
default_pool_size = ${opts.poolSize}
max_client_conn = 400
; node-postgres sends none of these, other clients (psql, JDBC) may.
ignore_startup_parameters = extra_float_digits,options
server_reset_query =
log_connections = 0
log_disconnections = 0
`;
}

/** The same URL with host and port moved to pgbouncer. */
export function throughPgbouncer(serverUrl: string, port: number): string {
  const url = new URL(serverUrl);
  url.hostname = "127.0.0.1";
  url.port = String(port);
  return url.toString();
}

export async function startPgbouncer(opts: PgbouncerOptions): Promise<Pgbouncer> {
  const bin = await ensureDebianProgram({ path: PGBOUNCER, packages: ["pgbouncer"], what: "the connection pooler (pgbouncer)", log: opts.log });
  const server = new URL(opts.serverUrl);
  const user = decodeURIComponent(server.username || "postgres");
  const dir = opts.dir ?? mkdtempSync(path.join(os.tmpdir(), "chalkline-pgbouncer-"));
  mkdirSync(dir, { recursive: true });
  const conf = path.join(dir, "pgbouncer.ini");
  writeFileSync(conf, pgbouncerConfig({ port: opts.port, serverHost: server.hostname, serverPort: Number(server.port || 5432), dir, poolSize: opts.poolSize ?? 20, user }));
  // auth_type = trust still needs each user named in the auth file; the password field is unused.
  writeFileSync(path.join(dir, "userlist.txt"), `"${user.replace(/"/g, '""')}" ""\n`);
  const args = [conf];
  if (isRoot()) {
    // pgbouncer refuses to run as root: it switches to the postgres user, who owns its folder.
    const uid = Number((await run("id", ["-u", "postgres"])).stdout.trim());
    const gid = Number((await run("id", ["-g", "postgres"])).stdout.trim());
    for (const file of [dir, conf, path.join(dir, "userlist.txt")]) chownSync(file, uid, gid);
    chmodSync(dir, 0o755);
    args.unshift("-u", "postgres");
  }
  const child = spawn(bin, args, { stdio: ["ignore", "ignore", "pipe"] });
  child.stderr?.on("data", (chunk: Buffer) => {
    for (const line of chunk.toString().split("\n")) if (/ (ERROR|FATAL|WARNING) /.test(line)) opts.log(`pgbouncer: ${line.trim()}`);
  });
  const logFile = path.join(dir, "pgbouncer.log");
  try {
    await waitForPort(opts.port, 10_000, child);
  } catch (error) {
    child.kill("SIGKILL");
    throw new Error(`${error instanceof Error ? error.message : String(error)}\n${tailFile(logFile, 20)}`, { cause: error });
  }
  opts.log(`pgbouncer (transaction pooling) on 127.0.0.1:${opts.port} → ${server.hostname}:${server.port} (config and log in ${dir})`);
  return {
    port: opts.port,
    dir,
    child,
    logFile,
    urlFor: (serverUrl) => throughPgbouncer(serverUrl, opts.port),
    // SIGTERM: immediate shutdown (its clients are gone by then).
    stop: () => stopProcess(child, "SIGTERM", 5_000),
  };
}
