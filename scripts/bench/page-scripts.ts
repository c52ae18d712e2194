/**
 * What a first visit to a page fetches as JavaScript in Chromium, measured on the wire: every
 * script response until the canvas has drawn its art and the network has been quiet for a moment,
 * so chunks loaded on demand (the Konva canvas) count too. Bytes are response bodies as
 * transferred (gzip from `next start`) and as decoded.
 */
import type { Browser, BrowserContext, Response } from "playwright-core";
import { benchContext, signIn, waitForArt } from "./browser";
import type { BenchFixture } from "./fixtures";
import { kb, MEASURED_ROUTES, routeScripts, weigh } from "./first-load-js";
import { PROOF_DRAWN_MARK } from "../../lib/perf-marks";
import type { Row } from "./table";

export type PageScripts = {
  files: number;
  transferredBytes: number;
  decodedBytes: number;
  encodings: string[];
  /** Script bodies as transferred that had arrived when the page said the proof was drawn (PROOF_DRAWN_MARK), if it said so. */
  beforeDrawn: { files: number; transferredBytes: number; atMs: number } | null;
  /** Each script fetched, by its path, with its transferred body size. */
  each: Array<{ path: string; transferredBytes: number }>;
};

export async function scriptsOnFirstLoad(context: BrowserContext, pathname: string): Promise<PageScripts> {
  const page = await context.newPage();
  // A first visit: nothing from the HTTP cache, even for chunks the sign-in page already fetched.
  const cdp = await context.newCDPSession(page);
  await cdp.send("Network.enable");
  await cdp.send("Network.setCacheDisabled", { cacheDisabled: true });
  const responses: Response[] = [];
  page.on("response", (response) => {
    if (response.request().resourceType() === "script") responses.push(response);
  });
  await page.goto(pathname, { waitUntil: "load" });
  await waitForArt(page);
  await page.waitForLoadState("networkidle");
  // The browser's own resource timing: which scripts had arrived by the page's mark.
  const beforeDrawn = await page.evaluate((markName) => {
    const mark = performance.getEntriesByName(markName, "mark")[0];
    if (!mark) return null;
    const scripts = (performance.getEntriesByType("resource") as PerformanceResourceTiming[]).filter((r) => r.initiatorType === "script" || r.name.endsWith(".js"));
    const arrived = scripts.filter((r) => r.responseEnd <= mark.startTime);
    return { files: arrived.length, transferredBytes: arrived.reduce((n, r) => n + r.encodedBodySize, 0), atMs: mark.startTime };
  }, PROOF_DRAWN_MARK);
  let transferredBytes = 0;
  let decodedBytes = 0;
  const encodings = new Set<string>();
  const each: PageScripts["each"] = [];
  for (const response of responses) {
    const sizes = await response.request().sizes();
    transferredBytes += sizes.responseBodySize;
    each.push({ path: new URL(response.url()).pathname, transferredBytes: sizes.responseBodySize });
    decodedBytes += (await response.body()).length;
    encodings.add((await response.headerValue("content-encoding")) ?? "none");
  }
  await page.close();
  return { files: responses.length, transferredBytes, decodedBytes, encodings: [...encodings], beforeDrawn, each };
}

export async function measurePageScripts({ browser, baseUrl, fixture, password, log }: { browser: Browser; baseUrl: string; fixture: BenchFixture; password: string; log: (line: string) => void }): Promise<Row[]> {
  const paths: Record<(typeof MEASURED_ROUTES)[number]["key"], { path: string; signedIn: boolean }> = {
    review: { path: `/r/${fixture.reviewToken}`, signedIn: false },
    editor: { path: `/shops/${fixture.shopSlug}/proofs/${fixture.proofId}?zoom=1`, signedIn: true },
  };
  const rows: Row[] = [];
  for (const route of MEASURED_ROUTES) {
    const target = paths[route.key];
    const context = await benchContext(browser, baseUrl);
    try {
      if (target.signedIn) await signIn(await context.newPage(), fixture.designerEmail, password);
      const s = await scriptsOnFirstLoad(context, target.path);
      const manifestFiles = routeScripts(route.entry);
      const manifest = weigh(manifestFiles);
      const onDemand = s.each.filter((f) => !manifestFiles.some((m) => f.path.endsWith(m)));
      log(`scripts: ${route.label} loaded ${onDemand.length} script(s) beyond its first load: ${onDemand.map((f) => `${f.path.split("/").pop()} ${kb(f.transferredBytes)} KB`).join(", ") || "none"}`);
      rows.push({
        benchmark: "JS fetched on first visit (Chromium, cache off)",
        subject: `${route.label}, until the canvas has drawn (goal ≤ ${route.goalKb} KB)`,
        value: `${kb(s.decodedBytes)} KB decoded, ${kb(s.transferredBytes)} KB transferred (${s.files} files, ${s.encodings.join("/")})`,
        against: `manifest first load ${kb(manifest.gzipBytes)} KB gzip`,
        ratio: `${(s.transferredBytes / 1024 / route.goalKb).toFixed(2)}× goal`,
      });
      if (s.beforeDrawn) {
        rows.push({
          benchmark: "JS fetched on first visit (Chromium, cache off)",
          subject: `${route.label}, until the proof is drawn (the page's mark, ${s.beforeDrawn.atMs.toFixed(0)} ms)`,
          value: `${kb(s.beforeDrawn.transferredBytes)} KB transferred (${s.beforeDrawn.files} files)`,
          against: `until the canvas has drawn ${kb(s.transferredBytes)} KB`,
          ratio: `${(s.beforeDrawn.transferredBytes / 1024 / route.goalKb).toFixed(2)}× goal`,
        });
      }
    } finally {
      await context.close();
    }
  }
  return rows;
}
