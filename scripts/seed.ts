/**
 * Seeds the demo into an empty database. The seed goes through the product's own queries, which
 * are server-only modules, so it runs in a child process under the react-server condition with the
 * database URL in its environment.
 */
import path from "node:path";
import { isMain, repoRoot, run } from "./lib/proc";

export async function runSeed(url: string): Promise<{ seeded: boolean }> {
  const result = await run(process.execPath, [path.join(repoRoot, "node_modules", "tsx", "dist", "cli.mjs"), "--conditions=react-server", path.join(repoRoot, "scripts", "seed.ts"), "--child"], {
    cwd: repoRoot,
    env: { ...process.env, DATABASE_URL: url, DATABASE_POOL_MAX: "2" },
    timeoutMs: 300_000,
  });
  const line = result.stdout.split("\n").find((l) => l.startsWith("seed-result "));
  if (!line) throw new Error(`The demo seed printed no result:\n${result.output.slice(-2000)}`);
  return JSON.parse(line.slice("seed-result ".length)) as { seeded: boolean };
}

if (isMain(import.meta.url)) {
  if (!process.env.DATABASE_URL) {
    console.error("DATABASE_URL is not set. Run `npm start`, which seeds the demo database itself.");
    process.exit(1);
  }
  if (process.argv.includes("--child")) {
    const { seedDemo } = await import("../db/seed");
    const result = await seedDemo();
    console.log(`seed-result ${JSON.stringify(result)}`);
    process.exit(0);
  } else {
    const result = await runSeed(process.env.DATABASE_URL);
    console.log(result.seeded ? "Demo data seeded." : "Database already has data; demo seed skipped.");
  }
}
