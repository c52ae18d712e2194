/**
 * Debian programs the scripts run (chromium, nginx, pgbouncer): found where Debian puts them, or
 * installed with apt-get when missing and running as root, else a clear message saying how.
 */
import { existsSync } from "node:fs";
import { isRoot, run, type LogFn } from "./proc";

export async function ensureDebianProgram(opts: { path: string; packages: string[]; what: string; log: LogFn }): Promise<string> {
  if (existsSync(opts.path)) return opts.path;
  if (!isRoot()) {
    throw new Error(`${opts.what} is missing at ${opts.path}. Install it with: sudo apt-get install -y ${opts.packages.join(" ")}`);
  }
  opts.log(`installing Debian's ${opts.packages.join(", ")} for ${opts.what}…`);
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  await run("apt-get", ["update"], { env, onLine: () => {} });
  await run("apt-get", ["install", "-y", "--no-install-recommends", ...opts.packages], { env, onLine: () => {} });
  if (!existsSync(opts.path)) throw new Error(`apt-get installed ${opts.packages.join(" ")} but ${opts.path} is still missing`);
  return opts.path;
}
