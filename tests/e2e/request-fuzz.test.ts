/**
 * Request fuzzing over HTTP, against the production build: generated bodies to every route that
 * reads one (next-auth's included, which cannot be called outside a request), and to every server
 * action through Next.js's own action endpoint (the `Next-Action` header, as the browser sends it),
 * so the framework's body parsing and error handling are part of what is tested. No answer may be
 * 5xx, and none may carry a stack trace, a server path or a database error.
 *
 * The signed-in caller is a throwaway second shop's owner; valid inputs aim at that shop's records.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { version as uploadSdkVersion } from "uploadthing/client";
import { getPool } from "@/db/client";
import { createShareLink } from "@/db/queries/review";
import { readAppSurface } from "@/tests/authz/app-surface";
import { buildAuthzFixture, type AuthzFixture } from "@/tests/authz/fixtures";
import { actionInput, hostileSegment, leaks, rawBody, type RawBody } from "@/tests/fuzz/hostile";
import { BASE_URL, fetchFrom, signInOverHttp } from "./support";

const repoRoot = fileURLToPath(new URL("../..", import.meta.url));
const SEED = Number(process.env.FUZZ_SEED ?? Date.now() % 2 ** 31);
const SCALE = Number(process.env.FUZZ_SCALE ?? 1);
const PER_ROUTE = Math.round(120 * SCALE);
const PER_ACTION = Math.round(60 * SCALE);

let f: AuthzFixture;
let cookie = "";
let linkToken = "";

type Problem = { target: string; input: string; what: string };
const problems: Problem[] = [];
let sent = 0;
let seq = 0;

function show(text: string): string {
  return text.length > 300 ? `${text.slice(0, 300)}… (${text.length} chars)` : text;
}

async function send(target: string, url: string, init: { method: string; headers: Record<string, string>; body?: string }, input: string): Promise<Response | null> {
  sent += 1;
  seq += 1;
  // Each request from another loopback address, so per-address limits do not hide the deeper checks.
  const from = `127.0.${100 + ((seq >> 8) % 100)}.${(seq % 250) + 1}`;
  let response: Response;
  try {
    response = await fetchFrom(from, `${BASE_URL}${url}`, init);
  } catch (error) {
    problems.push({ target, input, what: `the request failed: ${error instanceof Error ? error.message : String(error)}` });
    return null;
  }
  const text = await response.text();
  if (response.status >= 500) problems.push({ target, input, what: `answered ${response.status}: ${show(text)}` });
  const leak = leaks(text);
  if (leak) problems.push({ target, input, what: `leaked ${leak}` });
  return response;
}

function report(prefix: string): string[] {
  const distinct = new Map<string, Problem>();
  for (const p of problems.filter((q) => q.target.startsWith(prefix))) distinct.set(`${p.target} ${p.what.replace(/\d+/g, "#").slice(0, 80)}`, p);
  return [...distinct.values()].map((p) => `${p.target}: ${p.what}\n    input: ${p.input}`);
}

type BodyRoute = { label: string; method: string; url: () => string; base: () => unknown; headers?: () => Record<string, string> };

function bodyRoutes(): BodyRoute[] {
  return [
    { label: "PUT /api/me/calibration", method: "PUT", url: () => "/api/me/calibration", base: () => ({ deviceKey: `fuzz-${f.tag}-screen`, deviceLabel: "Fuzz screen", pxPerInch: 96 }) },
    { label: "POST /api/quotes/[quoteId]/accept", method: "POST", url: () => `/api/quotes/${f.ids.otherQuoteId}/accept`, base: () => ({ fullName: "Ada Fuzz", confirmed: true, link: linkToken }) },
    { label: "POST /api/quotes/[quoteId]/checkout", method: "POST", url: () => `/api/quotes/${f.ids.otherQuoteId}/checkout`, base: () => ({ kind: "deposit", link: linkToken }) },
    { label: "POST /api/review/link/[key]/comments", method: "POST", url: () => `/api/review/link/${linkToken}/comments`, base: () => ({ body: "Fuzzed note", side: "front", xIn: 1, yIn: 6, parentId: null }) },
    { label: "PATCH /api/review/proof/[key]/comments", method: "PATCH", url: () => `/api/review/proof/${f.ids.otherProofId}/comments`, base: () => ({ commentId: f.ids.commentId, resolved: true }) },
    { label: "POST /api/review/link/[key]/decision", method: "POST", url: () => `/api/review/link/${linkToken}/decision`, base: () => ({ decision: "changes-requested", letter: "A", fullName: "Ada Fuzz", comment: "Up an inch" }) },
    { label: "POST /api/stripe/webhook (unsigned)", method: "POST", url: () => "/api/stripe/webhook", base: () => ({ id: "evt_fuzz", type: "checkout.session.completed", data: { object: {} } }), headers: () => ({ "stripe-signature": "t=1,v1=00" }) },
    {
      label: "POST /api/uploadthing",
      method: "POST",
      url: () => "/api/uploadthing?actionType=upload&slug=artwork",
      base: () => ({ input: { shopSlug: f.other.slug, clientId: f.ids.otherClientId }, files: [{ name: "fuzz.png", size: 68, type: "image/png", lastModified: 0 }] }),
      headers: () => ({ "x-uploadthing-package": "@uploadthing/react", "x-uploadthing-version": uploadSdkVersion }),
    },
    // next-auth: the credentials callback (form and JSON), sign-out, the session update, and its log endpoint.
    { label: "POST /api/auth/callback/credentials", method: "POST", url: () => "/api/auth/callback/credentials", base: () => ({ csrfToken: "x", email: f.users.other.email, password: "wrong-password-here", json: "true" }) },
    { label: "POST /api/auth/signin/credentials", method: "POST", url: () => "/api/auth/signin/credentials", base: () => ({ csrfToken: "x", callbackUrl: "/home", json: "true" }) },
    { label: "POST /api/auth/signout", method: "POST", url: () => "/api/auth/signout", base: () => ({ csrfToken: "x", callbackUrl: "/", json: "true" }) },
    { label: "POST /api/auth/session", method: "POST", url: () => "/api/auth/session", base: () => ({ csrfToken: "x", data: { name: "x" } }) },
    { label: "POST /api/auth/_log", method: "POST", url: () => "/api/auth/_log", base: () => ({ level: "error", code: "x", message: "y" }) },
  ];
}

/** A JSON body also sent form-encoded when the route is next-auth's, which reads forms. */
function encode(route: BodyRoute, body: RawBody): { text: string; contentType: string | null } {
  if (!route.url().startsWith("/api/auth/") || body.contentType !== "application/json" || body.label === "raw") return body;
  try {
    const value = JSON.parse(body.text) as unknown;
    if (value && typeof value === "object" && !Array.isArray(value)) {
      const form = new URLSearchParams();
      for (const [k, v] of Object.entries(value)) form.append(k, typeof v === "string" ? v : JSON.stringify(v));
      return { text: form.toString(), contentType: "application/x-www-form-urlencoded" };
    }
  } catch {
    // Not JSON after all: send as it is.
  }
  return body;
}

/**
 * Arguments as the browser's encoder writes a plain-text action body: user strings that start with
 * "$" escaped as "$$", and the values JSON lacks as the references that stand for them. Maps, sets
 * and forms would go multipart, so they are sent as null here.
 */
function replyValue(value: unknown, depth = 0): unknown {
  // Past this the proxy refuses the body anyway (it reads 64 levels); keep the stack of this test small.
  if (depth > 200) return [[["deep"]]];
  if (typeof value === "string") return value.startsWith("$") ? `$${value}` : value;
  if (typeof value === "bigint") return `$n${value}`;
  if (value === undefined) return "$undefined";
  if (typeof value === "number") return Number.isNaN(value) ? "$NaN" : value === Infinity ? "$Infinity" : value === -Infinity ? "$-Infinity" : Object.is(value, -0) ? "$-0" : value;
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? null : `$D${value.toISOString()}`;
  if (value instanceof Map || value instanceof Set || value instanceof FormData) return null;
  if (Array.isArray(value)) return value.map((v) => replyValue(v, depth + 1));
  if (value && typeof value === "object") return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, replyValue(v, depth + 1)]));
  return value;
}
const replyText = (args: unknown[]) => JSON.stringify(replyValue(args));

type ManifestAction = { exportedName?: string; filename?: string; workers: Record<string, unknown> };

/** Action ids of the build, by "file#export", and a page each is served from. */
function buildActions(): Map<string, { id: string; page: string }> {
  const manifest = JSON.parse(readFileSync(path.join(repoRoot, ".next", "server", "server-reference-manifest.json"), "utf8")) as { node: Record<string, ManifestAction> };
  const found = new Map<string, { id: string; page: string }>();
  for (const [id, entry] of Object.entries(manifest.node)) {
    if (!entry.exportedName || !entry.filename) continue;
    const worker = Object.keys(entry.workers).find((w) => w.startsWith("app/") && w.endsWith("/page"));
    if (!worker) continue;
    found.set(`${entry.filename.replace(/^\.\//, "")}#${entry.exportedName}`, { id, page: worker });
  }
  return found;
}

/** "app/shops/[shop]/jobs/[jobId]/page" → a path that reaches it: action requests only need the page to exist. */
function pagePath(worker: string): string {
  const segments = worker.split("/").slice(1, -1).filter((s) => !/^\(.*\)$/.test(s));
  const fills: Record<string, string> = { "[shop]": f.other.slug, "[jobId]": f.ids.otherJobId, "[proofId]": f.ids.otherProofId, "[clientId]": f.ids.otherClientId, "[blankId]": f.ids.otherBlankId, "[token]": "fuzz-token-0000000000000000" };
  return `/${segments.map((s) => fills[s] ?? s).join("/")}`;
}

beforeAll(async () => {
  f = await buildAuthzFixture();
  linkToken = (await createShareLink({ shopId: f.other.id, proofId: f.ids.otherProofId, permission: "approve", expiresAt: null, recipientEmail: null, recipientName: "Ada Fuzz", createdBy: f.users.other.id })).token;
  cookie = await signInOverHttp(f.users.other.email, f.passwords.other);
});

afterAll(async () => {
  await getPool().end();
});

describe(`request fuzzing over HTTP (seed ${SEED})`, () => {
  it("sends generated bodies to every route that reads one, signed in and not; none answers 5xx or leaks", async () => {
    for (const [n, route] of bodyRoutes().entries()) {
      const cases = fc.sample(fc.tuple(fc.boolean(), rawBody(route.base())), { numRuns: PER_ROUTE, seed: SEED + n });
      for (const [signedIn, body] of cases) {
        const { text, contentType } = encode(route, body);
        const headers: Record<string, string> = { ...(route.headers?.() ?? {}) };
        if (contentType) headers["content-type"] = contentType;
        if (signedIn) headers.cookie = cookie;
        await send(`route ${route.label}`, route.url(), { method: route.method, headers, body: text }, `${body.label} ${show(text)}`);
      }
    }
    expect(report("route")).toEqual([]);
  }, 900_000);

  it("requests next-auth's GET endpoints with generated paths and queries", async () => {
    const cases = fc.sample(fc.tuple(hostileSegment, hostileSegment, fc.constantFrom("signin", "callback", "providers", "csrf", "session", "error", "verify-request", "signout")), { numRuns: PER_ROUTE, seed: SEED + 50 });
    for (const [segment, query, action] of cases) {
      const e = (v: string) => encodeURIComponent(v.toWellFormed());
      const url = `/api/auth/${action}/${e(segment)}?error=${e(query)}&callbackUrl=${e(query)}`;
      await send("get next-auth", url, { method: "GET", headers: { cookie } }, url);
    }
    expect(report("get")).toEqual([]);
  }, 900_000);

  it("calls every server action through Next.js's action endpoint with generated arguments", async () => {
    const actions = buildActions();
    const surface = readAppSurface(repoRoot).actions;
    expect(surface.map((a) => `${a.file}#${a.name}`).filter((k) => !actions.has(k)), "actions the build does not list").toEqual([]);
    const origin = new URL(BASE_URL).origin;
    for (const [n, { file, name }] of surface.entries()) {
      const { id, page } = actions.get(`${file}#${name}`)!;
      const url = pagePath(page);
      const cases = fc.sample(fc.tuple(fc.boolean(), fc.oneof({ weight: 4, arbitrary: actionInput({ shopSlug: f.other.slug, jobId: f.ids.otherJobId, proofId: f.ids.otherProofId }).map((v) => replyText([v])) }, { weight: 1, arbitrary: rawBody(null).map((b) => b.text) })), { numRuns: PER_ACTION, seed: SEED + 100 + n });
      for (const [signedIn, text] of cases) {
        const headers: Record<string, string> = { "next-action": id, "content-type": "text/plain;charset=UTF-8", accept: "text/x-component", origin };
        if (signedIn) headers.cookie = cookie;
        await send(`action ${name}`, url, { method: "POST", headers, body: text }, show(text));
      }
    }
    expect(report("action")).toEqual([]);
  }, 900_000);

  it("sent a generated request for every case", () => {
    console.log(`[fuzz] seed ${SEED}: ${sent} requests over HTTP`);
    expect(sent).toBeGreaterThanOrEqual(bodyRoutes().length * PER_ROUTE);
  });
});
