/**
 * Debian's nginx as a load balancer on loopback, for tests and local scale-out runs: a config of our
 * own in a folder of its own (pid, logs and temp files there too), never the system service.
 * Round-robin over the app ports; each app sees the client in X-Forwarded-For (trust 127.0.0.1 in
 * TRUSTED_PROXIES) and the Host the client asked for.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { chmodSync, mkdirSync, mkdtempSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { ensureDebianProgram } from "./debian";
import { waitForPort } from "./ports";
import { isRoot, run, tailFile, type LogFn } from "./proc";

export const NGINX = process.env.NGINX_PATH ?? "/usr/sbin/nginx";

export type NginxOptions = { port: number; upstreams: number[]; dir?: string; log: LogFn };
export type Nginx = { url: string; port: number; dir: string; child: ChildProcess; accessLog: string; stop: () => Promise<void> };

/** The whole config: one upstream of the app ports, one loopback server in front of it. */
export function nginxConfig(opts: { port: number; upstreams: number[]; dir: string; user: string | null }): string {
  const at = (name: string) => path.join(opts.dir, name);
  return `# Written by scripts/lib/nginx.ts; nginx runs in the foreground with everything in ${opts.dir}.
${opts.user ? `user ${opts.user};\n` : ""}daemon off;
master_process on;
worker_processes 1;
pid ${at("nginx.pid")};
error_log ${at("error.log")} notice;
events { worker_connections 512; }
http {
  # Which app process answered each request, beside what was asked.
  log_format upstreams '$remote_addr [$time_local] "$request" $status upstream=$upstream_addr';
  access_log ${at("access.log")} upstreams;
  client_body_temp_path ${at("body")};
  proxy_temp_path ${at("proxy")};
  fastcgi_temp_path ${at("fastcgi")};
  uwsgi_temp_path ${at("uwsgi")};
  scgi_temp_path ${at("scgi")};
  client_max_body_size 64m;
  upstream chalkline_app {
${opts.upstreams.map((p) => `    server 127.0.0.1:${p} max_fails=1 fail_timeout=5s;`).join("\n")}
  }
  server {
    listen 127.0.0.1:${opts.port};
    location / {
      proxy_pass http://chalkline_app;
      proxy_http_version 1.1;
      proxy_set_header Connection "";
      proxy_set_header Host $http_host;
      proxy_set_header X-Forwarded-For $proxy_add_x_forwarded_for;
      proxy_set_header X-Forwarded-Proto $scheme;
      # An app process that is stopping refuses connections: the request goes to the next one.
      proxy_next_upstream error timeout http_502 http_503;
      proxy_read_timeout 120s;
    }
  }
}
`;
}

export async function startNginx(opts: NginxOptions): Promise<Nginx> {
  const bin = await ensureDebianProgram({ path: NGINX, packages: ["nginx"], what: "the load balancer (nginx)", log: opts.log });
  const dir = opts.dir ?? mkdtempSync(path.join(os.tmpdir(), "chalkline-nginx-"));
  mkdirSync(dir, { recursive: true });
  // nginx's workers (nobody when the master is root) reach their temp folders under this one.
  chmodSync(dir, 0o755);
  const user = isRoot() ? "nobody nogroup" : null;
  const conf = path.join(dir, "nginx.conf");
  writeFileSync(conf, nginxConfig({ port: opts.port, upstreams: opts.upstreams, dir, user }));
  const test = await run(bin, ["-t", "-p", dir, "-c", conf, "-e", path.join(dir, "error.log")], { allowFailure: true });
  if (test.code !== 0) throw new Error(`nginx refused its config ${conf}:\n${test.output}`);
  const child = spawn(bin, ["-p", dir, "-c", conf, "-e", path.join(dir, "error.log")], { stdio: ["ignore", "ignore", "pipe"] });
  child.stderr?.on("data", (chunk: Buffer) => opts.log(`nginx: ${chunk.toString().trim()}`));
  try {
    await waitForPort(opts.port, 10_000, child);
  } catch (error) {
    child.kill("SIGKILL");
    throw new Error(`${error instanceof Error ? error.message : String(error)}\n${tailFile(path.join(dir, "error.log"), 20)}`, { cause: error });
  }
  opts.log(`nginx on 127.0.0.1:${opts.port} → ${opts.upstreams.map((p) => `127.0.0.1:${p}`).join(", ")} (config and logs in ${dir})`);
  return {
    url: `http://127.0.0.1:${opts.port}`,
    port: opts.port,
    dir,
    child,
    accessLog: path.join(dir, "access.log"),
    // SIGQUIT: nginx's graceful stop (finish the requests it has, then exit).
    stop: () => stopProcess(child, "SIGQUIT", 10_000),
  };
}

/** Sends `signal`, waits for the exit, and kills it after `graceMs`. */
export async function stopProcess(child: ChildProcess, signal: NodeJS.Signals, graceMs: number): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  await new Promise<void>((resolve) => {
    const timer = setTimeout(() => child.kill("SIGKILL"), graceMs);
    child.once("exit", () => {
      clearTimeout(timer);
      resolve();
    });
    child.kill(signal);
  });
}
