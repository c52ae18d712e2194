/**
 * Server throughput of a client review page (`/r/<token>`) against the app's lightest page
 * (`/sign-up`: no database, no session), under the same load. Under the per-request nonce CSP every
 * page renders on demand; a plain review-link visit is answered from the page kept for the link's
 * state (one query, then the stored HTML with this request's nonce). The same page with a query
 * (`?view=fresh`) is never kept, so it measures a full render side by side.
 */
import autocannon, { type Result } from "autocannon";
import type { Row } from "./table";

export const LOAD = { connections: 20, durationS: 10, warmupS: 3 } as const;
export const STATIC_ROUTE = "/sign-up";

async function probe(url: string): Promise<{ status: number; bytes: number; body: string; kept: string | null }> {
  const response = await fetch(url, { headers: { "accept-encoding": "identity" } });
  const body = await response.text();
  return { status: response.status, bytes: Buffer.byteLength(body), body, kept: response.headers.get("x-review-page") };
}

async function load(url: string, durationS: number): Promise<Result> {
  return autocannon({ url, connections: LOAD.connections, duration: durationS, pipelining: 1, timeout: 20 });
}

function summary(r: Result): { rps: number; p99: number; bad: number } {
  // Completed requests over the run's wall time; autocannon's per-second average drops partial seconds.
  return { rps: r.latency.totalCount / r.duration, p99: r.latency.p99, bad: r.non2xx + r.errors + r.timeouts };
}

export async function measureReviewLoad({ baseUrl, token, proofName, log }: { baseUrl: string; token: string; proofName: string; log: (line: string) => void }): Promise<Row[]> {
  const reviewUrl = `${baseUrl}/r/${token}`;
  const staticUrl = `${baseUrl}${STATIC_ROUTE}`;
  const renderedUrl = `${reviewUrl}?view=fresh`;
  // The first visit writes the link's view down (a new state), the second keeps that page.
  await probe(reviewUrl);
  await probe(reviewUrl);
  const review = await probe(reviewUrl);
  if (review.status !== 200 || !review.body.includes(proofName)) throw new Error(`the review page answered ${review.status} without the proof on it`);
  if (review.kept !== "kept") log(`load: the second visit to the review page was not answered from a kept page (x-review-page: ${review.kept ?? "absent"})`);
  const still = await probe(staticUrl);
  if (still.status !== 200) throw new Error(`${STATIC_ROUTE} answered ${still.status}`);

  log(`load: warming both pages for ${LOAD.warmupS} s each, then ${LOAD.durationS} s each at ${LOAD.connections} connections…`);
  await load(reviewUrl, LOAD.warmupS);
  await load(renderedUrl, LOAD.warmupS);
  await load(staticUrl, LOAD.warmupS);
  const dyn = summary(await load(reviewUrl, LOAD.durationS));
  const fixed = summary(await load(staticUrl, LOAD.durationS));
  const full = summary(await load(renderedUrl, LOAD.durationS));
  const bad = (n: number) => (n ? `, ${n} failed` : "");
  const kb = (n: number) => `${(n / 1024).toFixed(0)} KB`;
  const bench = `review page, ${LOAD.connections} conns × ${LOAD.durationS} s (autocannon)`;
  return [
    {
      benchmark: bench,
      subject: `/r/<token> throughput (kept page, ${kb(review.bytes)} HTML; goal ≥ 1.0× ${STATIC_ROUTE})`,
      value: `${dyn.rps.toFixed(1)} req/s${bad(dyn.bad)}`,
      against: `${STATIC_ROUTE} (${kb(still.bytes)}) ${fixed.rps.toFixed(1)} req/s${bad(fixed.bad)}`,
      ratio: `${(dyn.rps / fixed.rps).toFixed(3)}×`,
    },
    {
      benchmark: bench,
      subject: "/r/<token> p99 latency (goal ≤ 150 ms)",
      value: `${dyn.p99.toFixed(0)} ms`,
      against: `${STATIC_ROUTE} ${fixed.p99.toFixed(0)} ms`,
      ratio: `${(dyn.p99 / 150).toFixed(2)}× goal`,
    },
    {
      benchmark: bench,
      subject: "/r/<token>?view=fresh (rendered every time)",
      value: `${full.rps.toFixed(1)} req/s, p99 ${full.p99.toFixed(0)} ms${bad(full.bad)}`,
      against: `kept page ${dyn.rps.toFixed(1)} req/s`,
      ratio: `${(full.rps / fixed.rps).toFixed(3)}× ${STATIC_ROUTE}`,
    },
  ];
}
