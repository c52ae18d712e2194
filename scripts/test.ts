/**
 * `npm test`: its own PostgreSQL database and fakes, vitest unit + component + integration tests
 * in a shuffled order, a production build, then end-to-end tests in Debian's Chromium against that
 * build. The demo rows the seed made are recorded first; a test that changes or deletes one fails
 * the run. Stops what it started.
 */
import { randomInt } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, rmSync } from "node:fs";
import path from "node:path";
import { buildApp, startNext, startWorker, stopChild, waitForHealth } from "./lib/next";
import { ensureDebianProgram } from "./lib/debian";
import { startPgbouncer, type Pgbouncer } from "./lib/pgbouncer";
import { repoRoot, run } from "./lib/proc";
import { changedSeededRows, recordSeededRows, type SeededRows } from "./lib/seeded-rows";
import { bringUpStack, testPortOffset } from "./lib/stack";
import { componentTestFiles } from "./lib/test-files";

const log = (line: string) => console.log(`[test] ${line}`);
const PORT = Number(process.env.TEST_PORT ?? 3100 + testPortOffset());
const CHROMIUM = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";
const reportDir = path.join(repoRoot, ".data", "test-reports");
const only = process.argv.slice(2).filter((a) => !a.startsWith("-"));
const skipE2e = process.argv.includes("--no-e2e");
// `npm test -- --via-pgbouncer`: the tests, the app and the worker reach the database through
// pgbouncer in transaction pooling mode (migrations, the seed and the seeded-row checks go direct).
const viaPgbouncer = process.argv.includes("--via-pgbouncer");

type Totals = { passed: number; failed: number; skipped: number };
const totals: Totals = { passed: 0, failed: 0, skipped: 0 };

async function ensureChromium(): Promise<void> {
  await ensureDebianProgram({ path: CHROMIUM, packages: ["chromium", "fonts-liberation"], what: "Chromium for the end-to-end tests", log });
}

/** The shuffle seed: TEST_SHUFFLE_SEED repeats an order, else a new one per run. */
function shuffleSeed(): string {
  const raw = process.env.TEST_SHUFFLE_SEED;
  if (raw === undefined || raw === "") return String(randomInt(1, 2 ** 31));
  if (!/^\d+$/.test(raw)) throw new Error(`TEST_SHUFFLE_SEED must be a whole number (got "${raw}")`);
  return raw;
}

async function vitest(projects: string[], env: Record<string, string>, label: string, extra: string[] = []): Promise<boolean> {
  const out = path.join(reportDir, `${label}.json`);
  rmSync(out, { force: true });
  const args = [
    path.join(repoRoot, "node_modules", "vitest", "vitest.mjs"),
    "run",
    ...projects.flatMap((p) => ["--project", p]),
    // A run limited to some files (`npm test -- tests/e2e/x.test.ts`) leaves the other projects
    // empty, and that is fine; a full run must find tests in every project.
    ...(only.length ? ["--passWithNoTests"] : []),
    "--reporter=default",
    "--reporter=json",
    `--outputFile.json=${out}`,
    ...extra,
    ...only,
  ];
  const result = await run(process.execPath, args, {
    cwd: repoRoot,
    env: { ...process.env, ...env },
    allowFailure: true,
    onLine: (line) => console.log(line),
  });
  if (existsSync(out)) {
    const report = JSON.parse(readFileSync(out, "utf8")) as { numPassedTests: number; numFailedTests: number; numPendingTests: number; numTodoTests: number };
    totals.passed += report.numPassedTests;
    totals.failed += report.numFailedTests;
    totals.skipped += report.numPendingTests + report.numTodoTests;
  } else if (result.code !== 0) {
    totals.failed += 1;
  }
  return result.code === 0;
}

// vitest passes a run in which one project is empty as long as another has tests, so an emptied
// tests/component would go unnoticed; a full run refuses to start without component tests.
if (only.length === 0 && componentTestFiles(repoRoot).length === 0) {
  console.error("[test] tests/component holds no *.test.tsx files: the component project would pass without testing anything.");
  process.exit(1);
}

mkdirSync(reportDir, { recursive: true });
let ok = true;
/**
 * Compares the seeded demo rows with the record taken after seeding: a changed or deleted seeded
 * row fails the run, after vitest and again after the end-to-end tests, naming each row.
 */
async function checkSeededRows(seeded: SeededRows, after: string, strict: boolean, already: Set<string>): Promise<boolean> {
  const changed = await changedSeededRows(stack.databaseUrl, seeded);
  const fresh = changed.filter((line) => !already.has(line));
  for (const line of changed) already.add(line);
  if (!fresh.length) {
    log(`seeded demo rows after ${after}: ${changed.length ? "no further changes" : `all ${seeded.count} as seeded`}`);
    return true;
  }
  if (strict) {
    console.error(`[test] FAILED: the ${after} changed ${fresh.length} seeded demo row(s); a test must make its own rows (tests/support/factory.ts):`);
    for (const line of fresh) console.error(`[test]   ${line}`);
    totals.failed += 1;
    return false;
  }
  console.warn(`[test] warning: the ${after} changed ${fresh.length} seeded demo row(s) (not failing the run until the end-to-end tests own their data):`);
  for (const line of fresh) console.warn(`[test]   ${line}`);
  return true;
}

const stack = await bringUpStack({ mode: "test", port: PORT });
let bouncer: Pgbouncer | undefined;
let app: ReturnType<typeof startNext> | undefined;
let worker: ReturnType<typeof startWorker> | undefined;
try {
  const seeded = await recordSeededRows(stack.databaseUrl);
  const reported = new Set<string>();
  log(`recorded ${seeded.count} seeded demo rows in ${seeded.tables.size} tables; a test that changes or deletes one fails the run`);
  // One fuzz seed for the whole run, printed so a red run can be repeated with FUZZ_SEED=<seed>.
  const fuzzSeed = process.env.FUZZ_SEED ?? String(Date.now() % 2 ** 31);
  log(`fuzz seed ${fuzzSeed} (repeat with FUZZ_SEED=${fuzzSeed})`);
  // Unit, component and integration tests run in an order shuffled by this seed, files and tests alike.
  const shuffle = shuffleSeed();
  log(`shuffle seed ${shuffle} (repeat the order with TEST_SHUFFLE_SEED=${shuffle})`);
  const testEnv: Record<string, string> = { ...stack.env, CHALKLINE_TEST: "1", FUZZ_SEED: fuzzSeed, CHALKLINE_DIRECT_DATABASE_URL: stack.databaseUrl };
  if (viaPgbouncer) {
    bouncer = await startPgbouncer({ port: 54337 + testPortOffset(), serverUrl: stack.databaseUrl, log });
    testEnv.DATABASE_URL = bouncer.urlFor(stack.databaseUrl);
    log(`every test, the app and the worker connect through pgbouncer: ${testEnv.DATABASE_URL}`);
  }
  log("unit, component and integration tests");
  ok = (await vitest(["unit", "component", "integration"], testEnv, "vitest", ["--sequence.shuffle", `--sequence.seed=${shuffle}`])) && ok;
  ok = (await checkSeededRows(seeded, "unit, component and integration tests", true, reported)) && ok;

  if (!skipE2e) {
    await ensureChromium();
    await buildApp(testEnv, log);
    app = startNext({ dev: false, port: PORT, env: testEnv, quiet: true });
    worker = startWorker(testEnv, true);
    await waitForHealth(`http://localhost:${PORT}`, 90_000, app);
    // End-to-end tests still run in file order.
    log(`end-to-end tests in ${CHROMIUM} against http://localhost:${PORT}, in file order`);
    ok = (await vitest(["e2e"], { ...testEnv, E2E_BASE_URL: `http://localhost:${PORT}`, CHROMIUM_PATH: CHROMIUM }, "e2e")) && ok;
    ok = (await checkSeededRows(seeded, "end-to-end tests", true, reported)) && ok;
  }
} catch (error) {
  ok = false;
  totals.failed += 1;
  console.error(`[test] ${error instanceof Error ? error.message : String(error)}`);
} finally {
  if (app) await stopChild(app);
  if (worker) await stopChild(worker);
  if (bouncer) await bouncer.stop();
  await stack.shutdown();
}

console.log(`\nAll suites: ${totals.passed} passed, ${totals.failed} failed${totals.skipped ? `, ${totals.skipped} skipped` : ""}`);
console.log(`${totals.passed} passed, ${totals.failed} failed`);
process.exit(ok && totals.failed === 0 ? 0 : 1);
