import "server-only";
import { LRUCache } from "lru-cache";
import { markSeen, reviewPageStamp, seenWriteDue } from "@/db/queries/review";
import { KEPT_STATE_HEADER, RENDER_HEADER, type KeptPageKeys } from "@/lib/kept-pages";

/**
 * Review pages kept per link and state. A sent revision never changes, and between notes,
 * decisions and payments nothing on the page does either, so a page rendered once answers every
 * visit until `reviewPageStamp` (one query, the link's lookup included) says something changed.
 * Each process keeps its own pages; the stamp comes from the database, so a note posted through
 * another process is seen on the next visit here as well.
 */
type KeptPage = { status: number; html: string; headers: Array<[string, string]> };

const PASSED_HEADERS = ["content-type", "cache-control", "vary", "link"];

const kept = new LRUCache<string, KeptPage>({
  max: 2_000,
  // Bounded by size too: a page is about 30 KB.
  maxSize: 64 * 2 ** 20,
  sizeCalculation: (page) => page.html.length + 512,
  // A page nobody opened for a while makes room; the stamp, not the age, decides what is current.
  ttl: 30 * 60_000,
  updateAgeOnGet: true,
});
const inFlight = new Map<string, Promise<KeptPage>>();

async function render(keys: KeptPageKeys, token: string): Promise<KeptPage> {
  const response = await fetch(`${keys.selfUrl}/r/${token}`, {
    headers: { [RENDER_HEADER]: keys.render, accept: "text/html", "accept-encoding": "identity" },
    cache: "no-store",
    redirect: "manual",
  });
  const html = await response.text();
  const headers = PASSED_HEADERS.flatMap((name): Array<[string, string]> => {
    const value = response.headers.get(name);
    return value ? [[name, value]] : [];
  });
  return { status: response.status, html, headers };
}

function answer(page: KeptPage, keys: KeptPageKeys, nonce: string, state: "kept" | "rendered"): Response {
  const headers = new Headers(page.headers);
  headers.set(KEPT_STATE_HEADER, state);
  return new Response(page.html.replaceAll(keys.standIn, nonce), { status: page.status, headers });
}

/** The review page for a link, from the kept copy for its current state or rendered and kept now. */
export async function keptReviewPage(keys: KeptPageKeys, token: string, nonce: string): Promise<Response> {
  const { lookup, stamp, latestLetter } = await reviewPageStamp(token);
  // Missing, withdrawn and expired links, and links to a proof with nothing sent, render every time.
  if (lookup.state !== "ok" || !stamp || !latestLetter) return answer(await render(keys, token), keys, nonce, "rendered");
  const key = `${lookup.link.id}:${stamp}`;
  const page = kept.get(key);
  if (page) {
    // A render writes the view down itself; a kept answer does the same here.
    if (seenWriteDue(lookup.link, latestLetter)) await markSeen({ linkId: lookup.link.id, letter: latestLetter });
    return answer(page, keys, nonce, "kept");
  }
  let pending = inFlight.get(key);
  if (!pending) {
    pending = render(keys, token).finally(() => inFlight.delete(key));
    inFlight.set(key, pending);
  }
  const fresh = await pending;
  if (fresh.status === 200) kept.set(key, fresh);
  return answer(fresh, keys, nonce, "rendered");
}
