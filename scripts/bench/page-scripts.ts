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
import type { Row } from "./table";

export type PageScripts = { files: number; transferredBytes: number; decodedBytes: number; encodings: string[] };

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
  let transferredBytes = 0;
  let decodedBytes = 0;
  const encodings = new Set<string>();
  for (const response of responses) {
    const sizes = await response.request().sizes();
    transferredBytes += sizes.responseBodySize;
    decodedBytes += (await response.body()).length;
    encodings.add((await response.headerValue("content-encoding")) ?? "none");
  }
  await page.close();
  return { files: responses.length, transferredBytes, decodedBytes, encodings: [...encodings] };
}

export async function measurePageScripts({ browser, baseUrl, fixture, password }: { browser: Browser; baseUrl: string; fixture: BenchFixture; password: string }): Promise<Row[]> {
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
      const manifest = weigh(routeScripts(route.entry));
      rows.push({
        benchmark: "JS fetched on first visit (Chromium, cache off)",
        subject: `${route.label}, until the canvas has drawn`,
        value: `${kb(s.decodedBytes)} KB decoded, ${kb(s.transferredBytes)} KB transferred (${s.files} files, ${s.encodings.join("/")})`,
        against: `manifest first load ${kb(manifest.gzipBytes)} KB gzip`,
        ratio: `${(s.transferredBytes / manifest.gzipBytes).toFixed(2)}× manifest`,
      });
    } finally {
      await context.close();
    }
  }
  return rows;
}
