/**
 * Many processes, one database: two app processes (scripts/serve.ts on the production build) behind
 * Debian's nginx, two export workers, and every one of them connecting through Debian's pgbouncer in
 * transaction pooling mode. Over HTTP, through nginx and to each process directly: a session made on
 * one works on the other, a note posted through one is read through the other, a rate limit reached
 * through one holds on the other, and each export runs once across the two workers. SIGTERM: an app
 * process finishes the request it is reading before it exits while nginx answers through the other,
 * and a worker finishes the export it is running.
 *
 * The processes use a queue schema of their own (CHALKLINE_QUEUE_SCHEMA), so the worker `npm test`
 * runs beside its own app never takes their exports. Everything started here is stopped in afterAll.
 */
import { randomBytes } from "node:crypto";
import { readFileSync } from "node:fs";
import { request as httpRequest } from "node:http";
import { inArray, sql } from "drizzle-orm";
import { Client, Pool } from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, getPool } from "@/db/client";
import { exportJobs } from "@/db/schema";
import { portOpen } from "@/scripts/lib/ports";
import { startWorker, stopChild } from "@/scripts/lib/next";
import { manage, startScaleOut, type Managed, type ScaleOut } from "@/scripts/lib/scale-out";
import { shopFactory, type BuiltShop } from "@/tests/support/factory";
import { callAction } from "./actions-http";
import { fetchFrom, signInOverHttp, tryPasswordSignIn } from "./support";

const tag = randomBytes(3).toString("hex");
const queueSchema = `pgboss_scale_${tag}`;
const offset = Number(process.env.CHALKLINE_PORT_OFFSET ?? 0);
let scale: ScaleOut | undefined;

// Registered before the factory's, so it runs after the factory has deleted its shops (after-hooks
// run last-registered first): the processes stop, their queue schema goes, the pool closes.
const extraWorkers: Managed[] = [];
afterAll(async () => {
  for (const w of extraWorkers) await stopChild(w.child, 40_000);
  await scale?.stop();
  await db.execute(sql.raw(`drop schema if exists "${queueSchema}" cascade`));
  await getPool().end();
});

const shops = shopFactory("scale-out");
let s: BuiltShop;
let cookie: string;

const EXPORTS_FILE = "app/shops/[shop]/jobs/[jobId]/production/actions.ts";
// A DTF job, so it has gang sheets; the PNG of this size run (one sheet at 300 ppi) takes the worker seconds.
const RUN = [
  { size: "S", quantity: 4 },
  { size: "M", quantity: 6 },
  { size: "L", quantity: 4 },
];

/** Only the lines that say what the processes did, with their name, in the test's output. */
const echo = (line: string) => {
  if (/\[serve\]|\[worker\]|error|Error/.test(line)) console.log(`[scale-out] ${line}`);
};

beforeAll(async () => {
  s = await shops.build({ sent: true, job: { method: "dtf", sizeRun: RUN } });
  console.log(`[scale-out] tag ${tag}, shop ${s.shop.slug}, queue schema ${queueSchema}`);
  scale = await startScaleOut({
    // pgbouncer in front of the server itself, also in a run where the tests go through one.
    databaseUrl: process.env.CHALKLINE_DIRECT_DATABASE_URL ?? process.env.DATABASE_URL!,
    env: { CHALKLINE_QUEUE_SCHEMA: queueSchema, CHALKLINE_DRAIN_SECONDS: "30", CHALKLINE_WORKER_DRAIN_SECONDS: "60" },
    apps: 2,
    workers: 2,
    offset,
    log: (line) => console.log(`[scale-out] ${line}`),
    echo,
  });
  // Signed in on process A, directly.
  cookie = await signInOverHttp(s.owner.email, s.owner.password, "127.0.0.1", scale.apps[0]!.url);
});

const up = () => scale!;
const [A, B] = [() => up().apps[0]!, () => up().apps[1]!];
const through = () => up().nginx.url;

async function json<T>(response: Response): Promise<T> {
  return (await response.json()) as T;
}

function queueExport(args: Record<string, unknown>, base = through()): Promise<string> {
  return callAction<{ ok: boolean; data?: { exportId: string }; error?: string }>({
    file: EXPORTS_FILE,
    name: "requestExportAction",
    pagePath: `/shops/${s.shop.slug}/jobs/${s.job.id}/production`,
    args: [{ shopSlug: s.shop.slug, jobId: s.job.id, ...args }],
    cookie,
    baseUrl: base,
  }).then(({ status, result, text }) => {
    if (!result?.ok || !result.data) throw new Error(`queueing ${JSON.stringify(args)} answered ${status}: ${result?.error ?? text.slice(0, 300)}`);
    return result.data.exportId;
  });
}

/** Re-reads the exports every 250 ms until none is queued or running. */
async function settled(ids: string[]) {
  for (;;) {
    const rows = await db.select({ id: exportJobs.id, state: exportJobs.state, attempts: exportJobs.attempts, message: exportJobs.message }).from(exportJobs).where(inArray(exportJobs.id, ids));
    if (rows.length === ids.length && rows.every((r) => r.state === "done" || r.state === "failed")) return rows;
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
}

const startedLine = (id: string) => new RegExp(`export ${id}: started`);
const finishedLine = (id: string) => new RegExp(`export ${id}: finished`);
/** The first line of `m` matching `pattern`; fails at once if `m` exits without writing one. */
const lineOf = (m: Managed, pattern: RegExp) =>
  Promise.race([m.log.next(pattern), m.exited.then((code) => Promise.reject(new Error(`${m.name} exited (${code}) before writing ${pattern}:\n${m.log.lines.slice(-15).join("\n")}`)))]);
const count = (w: Managed, pattern: RegExp) => w.log.lines.filter((l) => pattern.test(l)).length;

/** A POST whose body arrives in two parts: the second only when `finish()` is called. */
function slowPost(url: string, headers: Record<string, string>, body: string) {
  const target = new URL(url);
  const bytes = Buffer.from(body);
  const half = Math.floor(bytes.length / 2);
  let finish!: () => void;
  const answered = new Promise<{ status: number; connection: string | undefined; body: string }>((resolve, reject) => {
    const req = httpRequest({ host: target.hostname, port: target.port, path: target.pathname, method: "POST", agent: false, headers: { ...headers, "content-length": String(bytes.length) } }, (res) => {
      const chunks: Buffer[] = [];
      res.on("data", (c: Buffer) => chunks.push(c));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, connection: res.headers.connection, body: Buffer.concat(chunks).toString("utf8") }));
      res.on("error", reject);
    });
    req.on("error", reject);
    req.write(bytes.subarray(0, half));
    finish = () => req.end(bytes.subarray(half));
  });
  // Awaited by the test; a test that fails before then must not leave the rejection unhandled.
  answered.catch(() => undefined);
  return { answered, finish: () => finish() };
}

describe("two app processes and two workers on one database, through nginx and pgbouncer", () => {
  it("a session made on process A works on process B and through nginx", async () => {
    for (const base of [B().url, through()]) {
      const session = await json<{ user?: { email?: string } }>(await fetchFrom("127.0.0.1", `${base}/api/auth/session`, { headers: { cookie } }));
      expect(session.user?.email, base).toBe(s.owner.email);
      const page = await fetchFrom("127.0.0.1", `${base}/shops/${s.shop.slug}/jobs`, { headers: { cookie } });
      expect(page.status, base).toBe(200);
      expect(await page.text()).toContain(s.job.title);
    }
  });

  it("a note posted through process A is read through process B and through nginx", async () => {
    const note = `Raise the print 1/2 in, scale-out ${tag}`;
    const path = `/api/review/proof/${s.proof.id}/comments`;
    const posted = await fetchFrom("127.0.0.1", `${A().url}${path}`, {
      method: "POST",
      headers: { cookie, "content-type": "application/json" },
      body: JSON.stringify({ body: note, side: "front", xIn: 1, yIn: 6, parentId: null }),
    });
    expect(posted.status, await posted.clone().text()).toBe(201);
    for (const base of [B().url, through()]) {
      const state = await json<{ comments: Array<{ body: string }> }>(await fetchFrom("127.0.0.1", `${base}${path}`, { headers: { cookie } }));
      expect(state.comments.map((c) => c.body), base).toContain(note);
    }
  });

  it("a sign-in limit reached through process A holds on process B and through nginx, for that client only", async () => {
    const attacker = "127.0.62.1";
    const nobody = `nobody-${tag}@scale-out.test`;
    for (let i = 0; i < 10; i += 1) expect((await tryPasswordSignIn(nobody, `guess-${i}`, attacker, A().url)).status).toBe(401);
    expect((await tryPasswordSignIn(nobody, "guess-b", attacker, B().url)).status).toBe(429);
    // nginx passes the client on in X-Forwarded-For, and the app believes it from 127.0.0.1 only.
    expect((await tryPasswordSignIn(nobody, "guess-n", attacker, through())).status).toBe(429);
    expect((await tryPasswordSignIn(nobody, "guess-other", "127.0.62.2", through())).status).toBe(401);
  });

  it("counts limit points taken at once by many connections through pgbouncer, and the app processes see the count", async () => {
    // The store's statements must not be named prepared statements: through a transaction pooler
    // concurrent ones land on other server connections ("does not exist", "already exists").
    const { LIMITS } = await import("@/app/_server/rate-limit");
    const { consumeLimit } = await import("@/db/queries/limits");
    const pooled = new Pool({ connectionString: up().env.DATABASE_URL, max: 8 });
    try {
      const subjects = ["127.0.63.1", "127.0.63.2", "127.0.63.3", "127.0.63.4"];
      const answers = await Promise.all(Array.from({ length: 40 }, (_, i) => consumeLimit({ rule: LIMITS.signInAddress, subject: subjects[i % 4]!, pool: pooled })));
      expect(answers.filter((a) => a.allowed)).toHaveLength(40);
    } finally {
      await pooled.end();
    }
    const nobody = `nobody-${tag}@scale-out.test`;
    expect((await tryPasswordSignIn(nobody, "guess", "127.0.63.1", A().url)).status).toBe(429);
    expect((await tryPasswordSignIn(nobody, "guess", "127.0.63.4", B().url)).status).toBe(429);
  });

  it("runs each export exactly once across the two workers, queued through both app processes", async () => {
    const kinds = [
      { kind: "spec-sheet" },
      { kind: "gang-sheet-pdf", rollWidthIn: 22, gapIn: 0.25, allowRotation: true, maxSheetLengthIn: 60 },
    ];
    const ids: string[] = [];
    // Through nginx, which takes turns: each app process queues some of them.
    for (let i = 0; i < 6; i += 1) ids.push(await queueExport(kinds[i % 2]!));
    const rows = await settled(ids);
    // The row is done a moment before its worker says so.
    await Promise.all(ids.map((id) => Promise.race(up().workers.map((w) => w.log.next(finishedLine(id))))));
    for (const row of rows) {
      expect(row, row.message ?? "").toMatchObject({ state: "done", attempts: 1 });
      const [w1, w2] = up().workers;
      expect(count(w1!, startedLine(row.id)) + count(w2!, startedLine(row.id)), row.id).toBe(1);
      expect(count(w1!, finishedLine(row.id)) + count(w2!, finishedLine(row.id)), row.id).toBe(1);
    }
    console.log(`[scale-out] ${ids.length} exports: ${up().workers.map((w) => `${w.name} ran ${ids.filter((id) => count(w, startedLine(id)) === 1).length}`).join(", ")}`);
    // nginx took turns: both app processes queued some of them.
    const queuedBy = readFileSync(up().nginx.accessLog, "utf8")
      .split("\n")
      .filter((l) => l.includes(`"POST /shops/${s.shop.slug}/jobs/`))
      .map((l) => /upstream=127\.0\.0\.1:(\d+)/.exec(l)?.[1]);
    expect(new Set(queuedBy)).toEqual(new Set([String(A().port), String(B().port)]));
  });

  it("SIGTERM: process A finishes the request it is reading before it exits, refuses new connections, and nginx answers through B", async () => {
    const note = `Slow note sent while A stops, ${tag}`;
    const path = `/api/review/proof/${s.proof.id}/comments`;
    const slow = slowPost(`${A().url}${path}`, { cookie, "content-type": "application/json" }, JSON.stringify({ body: note, side: "back", xIn: -1, yIn: 5, parentId: null }));
    // Once A has answered a later request, it has read the slow request's headers.
    expect((await fetchFrom("127.0.0.1", `${A().url}/api/health`)).status).toBe(200);

    A().child.kill("SIGTERM");
    const draining = await lineOf(A(), /SIGTERM: no new connections; finishing \d+ request/);
    expect(draining).toMatch(/finishing 1 request\(s\) in flight/);
    expect(await portOpen(A().port)).toBe(false);
    for (let i = 0; i < 4; i += 1) expect((await fetch(`${through()}/api/health`)).status).toBe(200);
    expect(A().child.exitCode).toBeNull();

    slow.finish();
    const answer = await slow.answered;
    expect(answer.status, answer.body).toBe(201);
    expect(answer.connection).toBe("close");
    expect(await A().exited).toBe(0);
    expect(A().log.indexOf(/every request answered/)).toBeGreaterThan(A().log.indexOf(/SIGTERM/));

    const state = await json<{ comments: Array<{ body: string }> }>(await fetchFrom("127.0.0.1", `${B().url}${path}`, { headers: { cookie } }));
    expect(state.comments.map((c) => c.body)).toContain(note);
  });

  it("SIGTERM: a worker finishes the export it is running before it exits, and the other takes the next one", async () => {
    const id = await queueExport({ kind: "gang-sheet-png", rollWidthIn: 22, gapIn: 0.25, allowRotation: true, maxSheetLengthIn: 60 });
    const workers = up().workers;
    const runner = await Promise.race(workers.map((w) => w.log.next(startedLine(id)).then(() => w)));
    runner.child.kill("SIGTERM");
    expect(await lineOf(runner, /SIGTERM: taking no new exports/)).toMatch(/finishing 1 in flight/);
    expect(await runner.exited).toBe(0);
    const order = [startedLine(id), /SIGTERM/, finishedLine(id), /\[worker\] stopped/].map((p) => runner.log.indexOf(p));
    expect(order.every((at, i) => at >= 0 && (i === 0 || at > order[i - 1]!)), runner.log.lines.slice(-12).join("\n")).toBe(true);
    const [row] = await settled([id]);
    expect(row, row!.message ?? "").toMatchObject({ state: "done", attempts: 1 });
    console.log(`[scale-out] ${runner.log.lines.find((l) => finishedLine(id).test(l))}`);

    const other = workers.find((w) => w !== runner)!;
    const next = await queueExport({ kind: "spec-sheet" });
    await lineOf(other, finishedLine(next));
    expect((await settled([next]))[0]).toMatchObject({ state: "done", attempts: 1 });
  });

  it("SIGTERM: a worker that cannot finish an export within its drain time puts it back, and another worker makes it", async () => {
    // The last worker stops (it is idle), so the export waits for the worker started next.
    for (const w of up().workers) if (w.child.exitCode === null) {
      w.child.kill("SIGTERM");
      expect(await w.exited).toBe(0);
    }
    const id = await queueExport({ kind: "gang-sheet-png", rollWidthIn: 22, gapIn: 0.25, allowRotation: true, maxSheetLengthIn: 60 });
    const hasty = manage("worker 3", startWorker({ ...up().env, CHALKLINE_WORKER_DRAIN_SECONDS: "0" }, "pipe"), echo);
    extraWorkers.push(hasty);
    await lineOf(hasty, startedLine(id));
    // Running: the worker has marked it so.
    for (;;) {
      const [row] = await db.select({ state: exportJobs.state }).from(exportJobs).where(inArray(exportJobs.id, [id]));
      if (row?.state === "running") break;
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    hasty.child.kill("SIGTERM");
    await lineOf(hasty, new RegExp(`export ${id}: not finished after 0 s; put back in the queue`));
    expect(await hasty.exited).toBe(1);
    expect(hasty.log.indexOf(finishedLine(id))).toBe(-1);

    const next = manage("worker 4", startWorker(up().env, "pipe"), echo);
    extraWorkers.push(next);
    await lineOf(next, finishedLine(id));
    // Two runs: the first cut short and put back, the second to the end.
    const [row] = await settled([id]);
    expect(row, row!.message ?? "").toMatchObject({ state: "done", attempts: 2 });
  });

  it("every process reached the database through pgbouncer", async () => {
    // pgbouncer's admin console: its own counts of what went through it.
    const admin = new Client({ connectionString: `postgres://${new URL(up().env.DATABASE_URL!).username}@127.0.0.1:${up().bouncer.port}/pgbouncer` });
    await admin.connect();
    try {
      const stats = (await admin.query("SHOW STATS")).rows as Array<{ database: string; total_xact_count: string }>;
      const database = new URL(up().env.DATABASE_URL!).pathname.slice(1);
      const xacts = Number(stats.find((r) => r.database === database)?.total_xact_count ?? 0);
      console.log(`[scale-out] pgbouncer counted ${xacts} transactions on ${database}`);
      expect(xacts).toBeGreaterThan(100);
      // The queue's clients (pg-boss names its connections) of the worker left and app B are among its clients.
      const clients = (await admin.query("SHOW CLIENTS")).rows as Array<{ database: string; application_name: string }>;
      expect(clients.filter((c) => c.database === database && c.application_name === "pgboss").length).toBeGreaterThan(0);
    } finally {
      await admin.end();
    }
  });
});
