/**
 * Server throughput of a client review page (`/r/<token>`, rendered on demand from the database)
 * against the app's lightest page (`/sign-up`: no database, no session), under the same load. Under the
 * per-request nonce CSP every page renders on demand, so this is the floor any page of the app can reach.
 */
import autocannon, { type Result } from "autocannon";
import type { Row } from "./table";

export const LOAD = { connections: 20, durationS: 10, warmupS: 3 } as const;
export const STATIC_ROUTE = "/sign-up";

async function probe(url: string): Promise<{ status: number; bytes: number; body: string }> {
  const response = await fetch(url, { headers: { "accept-encoding": "identity" } });
  const body = await response.text();
  return { status: response.status, bytes: Buffer.byteLength(body), body };
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
  const review = await probe(reviewUrl);
  if (review.status !== 200 || !review.body.includes(proofName)) throw new Error(`the review page answered ${review.status} without the proof on it`);
  const still = await probe(staticUrl);
  if (still.status !== 200) throw new Error(`${STATIC_ROUTE} answered ${still.status}`);

  log(`load: warming both pages for ${LOAD.warmupS} s each, then ${LOAD.durationS} s each at ${LOAD.connections} connections…`);
  await load(reviewUrl, LOAD.warmupS);
  await load(staticUrl, LOAD.warmupS);
  const dyn = summary(await load(reviewUrl, LOAD.durationS));
  const fixed = summary(await load(staticUrl, LOAD.durationS));
  const bad = (n: number) => (n ? `, ${n} failed` : "");
  const kb = (n: number) => `${(n / 1024).toFixed(0)} KB`;
  const bench = `review page, ${LOAD.connections} conns × ${LOAD.durationS} s (autocannon)`;
  return [
    {
      benchmark: bench,
      subject: `/r/<token> throughput (SSR, ${kb(review.bytes)} HTML)`,
      value: `${dyn.rps.toFixed(1)} req/s${bad(dyn.bad)}`,
      against: `${STATIC_ROUTE} (${kb(still.bytes)}) ${fixed.rps.toFixed(1)} req/s${bad(fixed.bad)}`,
      ratio: `${(dyn.rps / fixed.rps).toFixed(3)}×`,
    },
    {
      benchmark: bench,
      subject: "/r/<token> p99 latency",
      value: `${dyn.p99.toFixed(0)} ms`,
      against: `${STATIC_ROUTE} ${fixed.p99.toFixed(0)} ms`,
      ratio: `${(dyn.p99 / Math.max(fixed.p99, 1)).toFixed(2)}×`,
    },
  ];
}
