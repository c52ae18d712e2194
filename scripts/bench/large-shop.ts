/**
 * A large shop under load: 20,000 jobs, 60,000 proofs and 200,000 notes (db/large-shop.ts) seeded
 * into the bench's database, then its job list, board, a search that finds a job many pages down,
 * and the portal of one of its clients, each requested by autocannon at 10 connections, signed in
 * (the owner for the shop's pages, a client contact for the portal). Each row puts the p99 beside
 * the goal, p99 under 100 ms.
 */
import { performance } from "node:perf_hooks";
import autocannon, { type Result } from "autocannon";
import type { LargeShop } from "../../db/large-shop";
import { signInOverHttp } from "../lib/http-sign-in";
import type { Row } from "./table";

export const LARGE_LOAD = { connections: 10, durationS: 10, warmupS: 3, goalP99Ms: 100 } as const;

/** Seeds the large shop through the app's own code and bulk SQL (run while the stack is up, before the app starts). */
export async function prepareLargeShop(log: (line: string) => void): Promise<LargeShop> {
  const { LARGE_SHOP_SIZE, seedLargeShop } = await import("../../db/large-shop");
  const made = await seedLargeShop(LARGE_SHOP_SIZE, { log: (line) => log(`large: ${line}`) });
  log(`large: seeded in ${(made.ms / 1000).toFixed(1)} s`);
  return made;
}

async function probe(url: string, cookie: string, mustShow: string): Promise<number> {
  const response = await fetch(url, { headers: { cookie, "accept-encoding": "identity" }, redirect: "manual" });
  const body = await response.text();
  if (response.status !== 200 || !body.includes(mustShow)) throw new Error(`${url} answered ${response.status}${response.status === 200 ? ` without “${mustShow}”` : ""}`);
  return Buffer.byteLength(body);
}

function load(url: string, cookie: string, durationS: number): PromiseLike<Result> {
  return autocannon({ url, connections: LARGE_LOAD.connections, duration: durationS, pipelining: 1, timeout: 20, headers: { cookie } });
}

/**
 * The same pages' database work alone, in this process: the query functions each page calls, with
 * the page's own arguments, from 10 callers at once for a few seconds. What is left of a page's
 * p99 above this is rendering.
 */
async function measureQueriesAlone(shop: LargeShop): Promise<Map<string, { p99: number; p50: number; perSecond: number }>> {
  const { countJobsByStatus, listBoardColumns, listJobPage, listJobsForClients } = await import("../../db/queries/jobs");
  const { listClientNames } = await import("../../db/queries/clients");
  const { listSharedProofsForClients } = await import("../../db/queries/review");
  const { BOARD_COLUMN_SIZE, PORTAL_PAGE_SIZE, readJobListParams } = await import("../../lib/job-list");
  const shopId = shop.shop.id;
  const listPage = async (params: Record<string, string>) => {
    const counting = countJobsByStatus({ shopId });
    await Promise.all([counting, listJobPage({ shopId, query: readJobListParams(params), statusCounts: counting }), listClientNames({ shopId })]);
  };
  const work: Record<string, () => Promise<unknown>> = {
    "job list, page 1 (25 a page)": () => listPage({}),
    "board, newest 20 a status": () => Promise.all([countJobsByStatus({ shopId }), listBoardColumns({ shopId, perColumn: BOARD_COLUMN_SIZE })]),
    "search “12345”": () => listPage({ q: "12345" }),
    "client portal, page 1": async () => {
      const clientIds = [shop.contact.clientId];
      const { rows } = await listJobsForClients({ clientIds, page: 1, pageSize: PORTAL_PAGE_SIZE });
      await listSharedProofsForClients({ clientIds, jobIds: rows.map((j) => j.id) });
    },
  };
  const out = new Map<string, { p99: number; p50: number; perSecond: number }>();
  for (const [subject, run] of Object.entries(work)) {
    const times: number[] = [];
    const began = performance.now();
    const until = began + 4_000;
    await Promise.all(
      Array.from({ length: LARGE_LOAD.connections }, async () => {
        while (performance.now() < until) {
          const t0 = performance.now();
          await run();
          times.push(performance.now() - t0);
        }
      }),
    );
    times.sort((a, b) => a - b);
    const at = (q: number) => times[Math.min(times.length - 1, Math.floor(q * times.length))]!;
    out.set(subject, { p99: at(0.99), p50: at(0.5), perSecond: times.length / ((performance.now() - began) / 1000) });
  }
  return out;
}

export async function measureLargeShop({ baseUrl, shop, log }: { baseUrl: string; shop: LargeShop; log: (line: string) => void }): Promise<Row[]> {
  const owner = await signInOverHttp(shop.owner.email, shop.password, "127.0.0.1", baseUrl);
  const contact = await signInOverHttp(shop.contact.email, shop.password, "127.0.0.1", baseUrl);
  const base = `${baseUrl}/shops/${shop.shop.slug}/jobs`;
  // Job 12345 is far down every order of the list; the search must find it among 20,000.
  const pages: Array<{ subject: string; url: string; cookie: string; mustShow: string }> = [
    { subject: "job list, page 1 (25 a page)", url: base, cookie: owner, mustShow: 'data-testid="job-table"' },
    { subject: "board, newest 20 a status", url: `${base}?view=board`, cookie: owner, mustShow: 'data-testid="job-board"' },
    { subject: "search “12345”", url: `${base}?q=12345`, cookie: owner, mustShow: " 12345<" },
    { subject: "client portal, page 1", url: `${baseUrl}/portal`, cookie: contact, mustShow: 'href="/portal/jobs/' },
  ];
  // The app's lightest page (no database, no session) under the same load: the floor of any page here.
  pages.push({ subject: "for scale: /sign-up, no database", url: `${baseUrl}/sign-up`, cookie: "", mustShow: "<form" });
  log("large: the pages' queries alone, 10 callers at once, 4 s each…");
  const alone = await measureQueriesAlone(shop);
  const rows: Row[] = [];
  const bench = `large shop (${shop.counts.jobs.toLocaleString("en")} jobs, ${shop.counts.proofs.toLocaleString("en")} proofs, ${shop.counts.notes.toLocaleString("en")} notes), ${LARGE_LOAD.connections} conns × ${LARGE_LOAD.durationS} s`;
  for (const page of pages) {
    const bytes = await probe(page.url, page.cookie, page.mustShow);
    log(`large: ${page.subject}: warming ${LARGE_LOAD.warmupS} s, then ${LARGE_LOAD.durationS} s at ${LARGE_LOAD.connections} connections…`);
    await load(page.url, page.cookie, LARGE_LOAD.warmupS);
    const r = await load(page.url, page.cookie, LARGE_LOAD.durationS);
    const bad = r.non2xx + r.errors + r.timeouts;
    rows.push({
      benchmark: bench,
      subject: `${page.subject} (${(bytes / 1024).toFixed(0)} KB HTML), p99`,
      value: `${r.latency.p99.toFixed(0)} ms (p50 ${r.latency.p50.toFixed(0)} ms, ${(r.latency.totalCount / r.duration).toFixed(1)} req/s${bad ? `, ${bad} failed` : ""})`,
      against: `goal p99 < ${LARGE_LOAD.goalP99Ms} ms`,
      ratio: `${(r.latency.p99 / LARGE_LOAD.goalP99Ms).toFixed(2)}×`,
    });
    const db = alone.get(page.subject);
    if (db) {
      rows.push({
        benchmark: bench,
        subject: `${page.subject}: its queries alone (in process), p99`,
        value: `${db.p99.toFixed(1)} ms (p50 ${db.p50.toFixed(1)} ms, ${db.perSecond.toFixed(0)} pages' queries/s)`,
        against: `goal p99 < ${LARGE_LOAD.goalP99Ms} ms; whole page ${r.latency.p99.toFixed(0)} ms`,
        ratio: `${(db.p99 / LARGE_LOAD.goalP99Ms).toFixed(2)}×`,
      });
    }
  }
  return rows;
}
