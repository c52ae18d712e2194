/**
 * First-load JavaScript of a route, from the build's manifests. Next 16 with Turbopack no longer
 * prints the per-route size table, so this sums what the served HTML of a route loads as scripts:
 * the root main files of `.next/build-manifest.json` plus every entry's chunks in the route's client
 * reference manifest (layouts, page and the boundaries the tree renders). The `noModule` polyfills
 * are left out (a current browser skips them). Chunks a page imports later (next/dynamic) are not
 * first load; the browser measurement in editor-drag.ts sees those.
 */
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import vm from "node:vm";
import { gzipSync } from "node:zlib";
import { repoRoot } from "../lib/proc";
import type { Row } from "./table";

const NEXT_DIR = path.join(repoRoot, ".next");

export type ScriptWeight = { files: string[]; rawBytes: number; gzipBytes: number };

type ClientManifest = { entryJSFiles?: Record<string, string[]> };

function readJson<T>(file: string): T {
  return JSON.parse(readFileSync(path.join(NEXT_DIR, file), "utf8")) as T;
}

/** `route` is the app path of the page entry, e.g. "/r/[token]/page" or "/(auth)/sign-up/page". */
export function routeScripts(route: string): string[] {
  const build = readJson<{ rootMainFiles: string[]; polyfillFiles: string[] }>("build-manifest.json");
  const file = path.join(NEXT_DIR, "server", "app", `${route.replace(/^\//, "")}_client-reference-manifest.js`);
  const sandbox: { __RSC_MANIFEST?: Record<string, ClientManifest> } = {};
  vm.runInNewContext(readFileSync(file, "utf8"), sandbox, { filename: file });
  const manifest = sandbox.__RSC_MANIFEST?.[route];
  if (!manifest?.entryJSFiles) throw new Error(`no client reference manifest for ${route} in ${path.relative(repoRoot, file)}`);
  const polyfills = new Set(build.polyfillFiles);
  const files = new Set<string>(build.rootMainFiles);
  for (const chunks of Object.values(manifest.entryJSFiles)) for (const chunk of chunks) files.add(chunk);
  return [...files].filter((f) => f.endsWith(".js") && !polyfills.has(f));
}

/** Raw bytes and gzip bytes (zlib level 6, what `next start` compresses with) of the files. */
export function weigh(files: string[]): ScriptWeight {
  let rawBytes = 0;
  let gzipBytes = 0;
  for (const f of files) {
    const bytes = readFileSync(path.join(NEXT_DIR, f));
    rawBytes += bytes.length;
    gzipBytes += gzipSync(bytes, { level: 6 }).length;
  }
  return { files, rawBytes, gzipBytes };
}

/**
 * Checks the method on a page the build prerendered: its stored HTML must name exactly the
 * scripts the manifests give. Returns a sentence when it does not.
 */
export function crossCheckPrerendered(route: string, htmlFile: string): string | null {
  const file = path.join(NEXT_DIR, "server", "app", htmlFile);
  // Under the per-request nonce CSP no page is prerendered; then there is no stored HTML to check against.
  if (!existsSync(file)) return null;
  const html = readFileSync(file, "utf8");
  const inHtml = new Set<string>();
  for (const m of html.matchAll(/<script[^>]*\bsrc="\/_next\/(static\/[^"]+\.js)"([^>]*)>/g)) if (!/noModule/i.test(m[2] ?? "")) inHtml.add(m[1]!);
  const fromManifest = new Set(routeScripts(route));
  const missing = [...inHtml].filter((f) => !fromManifest.has(f));
  const extra = [...fromManifest].filter((f) => !inHtml.has(f));
  if (!missing.length && !extra.length) return null;
  return `${htmlFile} loads ${inHtml.size} scripts, the manifests give ${fromManifest.size} (${missing.length} missing, ${extra.length} extra)`;
}

export const kb = (bytes: number) => (bytes / 1024).toFixed(1);

/** The routes measured, by their page entry in the build, each with its goal for JavaScript fetched until its canvas draws. */
export const MEASURED_ROUTES = [
  { key: "review", label: "review page /r/[token]", entry: "/r/[token]/page", goalKb: 170 },
  { key: "editor", label: "editor /shops/[shop]/proofs/[proofId]", entry: "/shops/[shop]/proofs/[proofId]/page", goalKb: 280 },
] as const;
export const BASELINE = { label: "/sign-up (smallest page)", entry: "/(auth)/sign-up/page", html: "sign-up.html", goalKb: 120 } as const;
/** A page of the same build with nothing of ours on it (app/dev/bare): what Next.js and React weigh alone. */
export const FLOOR = { label: "bare page /dev/bare (framework floor)", entry: "/dev/bare/page" } as const;

export function measureFirstLoadJs(log: (line: string) => void): Row[] {
  const smallest = weigh(routeScripts(BASELINE.entry));
  const floor = weigh(routeScripts(FLOOR.entry));
  const check = crossCheckPrerendered(BASELINE.entry, BASELINE.html);
  if (check) log(`first-load JS: the manifest method does not match the prerendered HTML: ${check}`);
  const bench = "first-load JS (build manifests, zlib gzip 6)";
  return [
    {
      benchmark: bench,
      subject: `${BASELINE.label} (goal ≤ ${BASELINE.goalKb} KB gzip)`,
      value: `${kb(smallest.rawBytes)} KB raw, ${kb(smallest.gzipBytes)} KB gzip (${smallest.files.length} files)`,
      against: `${FLOOR.label}: ${kb(floor.gzipBytes)} KB gzip${check ? " (method check failed, see log)" : ""}`,
      ratio: `${(smallest.gzipBytes / 1024 / BASELINE.goalKb).toFixed(2)}× goal, ${(smallest.gzipBytes / floor.gzipBytes).toFixed(2)}× floor`,
    },
    ...MEASURED_ROUTES.map((route) => {
      const w = weigh(routeScripts(route.entry));
      return {
        benchmark: bench,
        subject: route.label,
        value: `${kb(w.rawBytes)} KB raw, ${kb(w.gzipBytes)} KB gzip (${w.files.length} files)`,
        against: `${FLOOR.label}: ${kb(floor.gzipBytes)} KB gzip`,
        ratio: `${(w.gzipBytes / floor.gzipBytes).toFixed(2)}× floor`,
      };
    }),
  ];
}
