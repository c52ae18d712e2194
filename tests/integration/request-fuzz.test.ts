/**
 * Request fuzzing, called directly: every export of every "use server" module and every route
 * handler that reads a body, handed generated input (mutations of a valid input, hostile JSON,
 * deep and wide values, broken and non-JSON bodies) against the real PostgreSQL and the local
 * fakes. Nothing may throw or answer 5xx, and no answer may carry a stack trace, a server path or
 * a database error. The signed-in caller is the owner of a throwaway second shop, and valid
 * inputs point at that shop's records, so whatever a mutation lets through changes only them.
 *
 * FUZZ_SEED=n repeats a run; FUZZ_SCALE=k multiplies the number of inputs.
 */
import path from "node:path";
import { fileURLToPath } from "node:url";
import fc from "fast-check";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getStripe, webhookSecret } from "@/app/_server/payments";
import { findBlank } from "@/db/queries/blanks";
import { findClient } from "@/db/queries/clients";
import { getProofDocument } from "@/db/queries/proofs";
import { createExport, markExport } from "@/db/queries/production";
import { addComment } from "@/db/queries/review";
import { createInvitation } from "@/db/queries/shops";
import { DEFAULT_PRICE_MATRIX } from "@/lib/pricing";
import { readAppSurface } from "@/tests/authz/app-surface";
import { addTeamMember, authzBaseOf, blankFormValues, buildAuthzFixture, buildShopRecords, jobFormInput, LIBRARY_TEE, type AuthzFixture, type FixtureUser, type ShopRecords } from "@/tests/authz/fixtures";
import { actionInput, boundaryCases, hostileSegment, leaks, rawBody, type RawBody } from "@/tests/fuzz/hostile";
import { shopFactory } from "@/tests/support/factory";
import { noteOnFailure } from "@/tests/support/failure-notes";

const session = vi.hoisted(() => ({ user: null as null | { id: string; email: string; name: string | null } }));
vi.mock("@/app/_server/auth", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/app/_server/auth")>()),
  getSessionUser: async () => session.user,
}));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));
// Server actions run outside a request here, so they would all share the "unknown" address; each
// call comes from an address of its own instead, as each route call does (see nextIp).
const actionAddresses = vi.hoisted(() => ({ seq: 0 }));
vi.mock("@/app/_server/client-address", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/app/_server/client-address")>()),
  actionClientAddress: async () => {
    actionAddresses.seq += 1;
    return `203.0.${(actionAddresses.seq >> 8) & 255}.${actionAddresses.seq & 255}`;
  },
}));
vi.mock("@/app/_server/queue", () => ({
  EXPORT_QUEUE: "chalkline-export",
  queue: () => {
    throw new Error("no queue in integration tests");
  },
  enqueueExport: async () => {},
}));

const repoRoot = fileURLToPath(new URL("../..", import.meta.url));
const SEED = Number(process.env.FUZZ_SEED ?? Date.now() % 2 ** 31);
const SCALE = Number(process.env.FUZZ_SCALE ?? 1);
/** Inputs per server action and per route method; 24 actions and 8 route methods make over 10,000. */
const PER_ACTION = Math.round(360 * SCALE);
const PER_ROUTE = Math.round(400 * SCALE);
const PER_GET = Math.round(60 * SCALE);
noteOnFailure("fuzz seed", `${SEED} (repeat with FUZZ_SEED=${SEED})`);

/** Generated inputs per server action: the sign-up and invitation actions get a third (each valid one makes an account). */
const runsFor = (name: string) => (name === "signUpAction" || name === "acceptInvitationAction" ? Math.round(PER_ACTION / 3) : PER_ACTION);

// Our shop (owner, designer, production, the client who signs in) is one of this file's own; the
// second shop the fuzzer works in joins its cleanup.
const shopsMade = shopFactory("request-fuzz");

let f: AuthzFixture;
const baseInputs = new Map<string, unknown>();
let other: FixtureUser;

/**
 * A fresh working set of the second shop for one target, so no earlier target's fuzz cases (a job
 * saved without print locations, a revoked link, a replaced art) can make its valid input fail.
 */
type FuzzState = ShopRecords & { invite: string; failedExport: string; commentId: string; memberId: string; openInvitationId: string };
let state: FuzzState;
let freshCount = 0;

async function freshState(): Promise<FuzzState> {
  freshCount += 1;
  const tag = `${f.tag}-${freshCount}`;
  const records = await buildShopRecords({ shopId: f.other.id, ownerId: other.id, tag });
  const invite = (await createInvitation({ shopId: f.other.id, email: `fuzz-joiner-${tag}@example.test`, role: "production", invitedBy: other.id })).token;
  const failedExport = await createExport({ shopId: f.other.id, jobId: records.jobId, kind: "spec-sheet", params: {}, requestedBy: other.id });
  await markExport(failedExport, { state: "failed", message: "Failed for the fuzzer." });
  const commentId = (await addComment({ proofId: records.proofId, revisionLetter: "A", parentId: null, side: "front", xIn: 0, yIn: 5, body: "Fuzz note", authorName: "Odile Marsh", authorRole: "shop", authorUserId: other.id, shareLinkId: null })).id;
  // A member of the team (joined as production) and an open invitation, for the team actions.
  const { memberId } = await addTeamMember({ shopId: f.other.id, ownerId: other.id, email: `fuzz-crew-${tag}@example.test`, name: "Fen Ashby", role: "production" });
  const openInvitationId = (await createInvitation({ shopId: f.other.id, email: `fuzz-pending-${tag}@example.test`, role: "designer", invitedBy: other.id })).invitationId;
  return { ...records, invite, failedExport, commentId, memberId, openInvitationId };
}

type Problem = { target: string; input: string; what: string };
const problems: Problem[] = [];
const counts = { actions: 0, routes: 0, gets: 0 };
/** Accepted answers per target: proof that generated input got past the schemas to the database. */
const accepted = new Map<string, number>();
const accept = (target: string) => accepted.set(target, (accepted.get(target) ?? 0) + 1);
/** Valid inputs that were refused: each runs on a fresh working set, so any entry here is a bug. */
const validRefused: string[] = [];

function show(value: unknown): string {
  let text: string;
  try {
    text = typeof value === "string" ? value : (JSON.stringify(value, (_k, v: unknown) => (typeof v === "bigint" ? `${v}n` : v)) ?? String(value));
  } catch {
    text = String(value);
  }
  return text.length > 300 ? `${text.slice(0, 300)}… (${text.length} chars)` : text;
}

/** Who calls: mostly the second shop's owner (deep paths), sometimes nobody or our client. */
type Caller = "other" | "anon" | "client";
const caller: fc.Arbitrary<Caller> = fc.oneof({ weight: 8, arbitrary: fc.constant("other" as const) }, { weight: 1, arbitrary: fc.constant("anon" as const) }, { weight: 1, arbitrary: fc.constant("client" as const) });
function signInAs(who: Caller) {
  session.user = who === "other" ? other : who === "client" ? f.users.client : null;
}

// ---------------------------------------------------------------------------------------------
// Valid inputs, one per server action, all aimed at the second shop
// ---------------------------------------------------------------------------------------------

async function actionBases(s: FuzzState): Promise<Record<string, unknown>> {
  const shopSlug = f.other.slug;
  const blank = (await findBlank({ shopId: f.other.id, blankId: s.blankId }))!;
  const client = (await findClient({ shopId: f.other.id, clientId: s.clientId }))!;
  const proof = (await getProofDocument({ shopId: f.other.id, proofId: s.proofId }))!;
  const job = { shopSlug, ...jobFormInput("Fuzzed relay tees", s.clientId) };

  return {
    signUpAction: { shopName: "Fuzz Print Works", name: "Sol Reyes", email: `fuzz-${f.tag}@example.test`, password: "a-long-enough-password" },
    acceptInvitationAction: { token: s.invite, name: "Nia Ferro", password: "a-long-enough-password" },
    replaceArtworkAction: { shopSlug, oldId: s.artworkId, newId: s.spareArtworkId },
    duplicateBlankAction: { shopSlug, blankId: LIBRARY_TEE },
    updateBlankAction: {
      shopSlug,
      blankId: s.blankId,
      values: blankFormValues(blank, "Fuzzed"),

    },
    createClientAction: { shopSlug, name: "Fuzz Kayak Club", notes: "", taxExempt: false, contacts: [{ name: "Kit Vale", email: `kit-${f.tag}@kayak.test`, phone: "" }] },
    updateClientAction: {
      shopSlug,
      clientId: s.clientId,
      name: client.name,
      notes: "",
      taxExempt: false,
      contacts: client.contacts.map((c) => ({ id: c.id, name: c.name, email: c.email, phone: c.phone ?? "" })),
    },
    setClientArchivedAction: { shopSlug, clientId: s.clientId, archived: false },
    saveJobAction: { ...job, jobId: s.jobId },
    setJobStatusAction: { shopSlug, jobId: s.jobId, status: "drafting" },
    sendQuoteAction: { shopSlug, jobId: s.jobId, message: "Fuzzed quote" },
    saveSizeRunAction: { shopSlug, jobId: s.jobId, sizes: [{ size: "S", quantity: 8 }, { size: "M", quantity: 12 }], sparePercent: 5 },
    saveGradingAction: { shopSlug, jobId: s.jobId, placementId: proof.placements[0]?.id ?? "fuzz-placement", transferCount: 1, assignment: { S: 10, M: 10.5 }, totalShortfall: 0 },
    requestExportAction: { kind: "test-print", shopSlug, jobId: s.jobId, proofId: proof.proof.id, placementId: proof.placements[0]?.id ?? "fuzz-placement", size: "M", paper: "letter", mirror: false, outline: true },
    retryExportAction: { shopSlug, exportId: s.failedExport },
    savePricesAction: { shopSlug, matrix: DEFAULT_PRICE_MATRIX },
    saveShopClockAction: { shopSlug, locale: "en-US", timeZone: "America/Chicago" },
    createProofAction: { shopSlug, jobId: s.jobId, name: null, blankId: null, colourName: null, art: [{ location: "full-front", artworkId: s.artworkId }] },
    duplicateProofAction: { shopSlug, proofId: s.proofId, name: null, blankId: null, colourName: null },
    archiveProofAction: { shopSlug, proofId: s.proofId, archived: true },
    saveProofAction: {
      shopSlug,
      proofId: s.proofId,
      baseVersion: proof.proof.version,
      doc: { size: proof.proof.size, colourName: proof.proof.colourName, colourHex: proof.proof.colourHex, placements: proof.placements },
    },
    shareProofAction: { shopSlug, proofId: s.proofId, permission: "comment", expiresInDays: 7, recipientEmail: `fuzz-${f.tag}@client.test`, recipientName: "Ada Fuzz", message: "Have a look" },
    listShareLinksAction: { shopSlug, proofId: s.proofId },
    revokeShareLinkAction: { shopSlug, linkId: s.linkId },
    inviteMemberAction: { shopSlug, email: `crew-${f.tag}@example.test`, role: "designer" },
    changeMemberRoleAction: { shopSlug, memberId: s.memberId, role: "designer" },
    removeMemberAction: { shopSlug, memberId: s.memberId },
    withdrawInvitationAction: { shopSlug, invitationId: s.openInvitationId },
  };
}

/** An error's name, message (without drizzle's echo of the query) and cause, with where it came from. */
function describeError(error: unknown): string {
  if (!(error instanceof Error)) return show(error);
  const cause = error.cause instanceof Error ? ` (cause: ${error.cause.message})` : "";
  const frame = error.stack?.split("\n").find((l) => l.includes("/work/") && !l.includes("node_modules"))?.trim() ?? "";
  return `${error.name}: ${error.message.split("\nparams:")[0]!.slice(0, 200)}${cause} ${frame}`;
}

type Result = { ok?: unknown; error?: unknown; message?: unknown };

/** One server action call: it must answer { ok } (or end in Next's redirect/not-found signal). */
async function callAction(target: string, fn: (input: unknown) => Promise<unknown>, input: unknown): Promise<void> {
  counts.actions += 1;
  let result: unknown;
  try {
    result = await fn(input);
  } catch (error) {
    const digest = (error as { digest?: unknown } | null)?.digest;
    if (typeof digest === "string" && digest.startsWith("NEXT_REDIRECT")) return void accept(target.replace(/ as \w+$/, ""));
    if (typeof digest === "string" && digest.startsWith("NEXT_HTTP_ERROR_FALLBACK")) return;
    problems.push({ target, input: show(input), what: `threw ${describeError(error)}` });
    return;
  }
  const r = result as Result | null;
  if (target.endsWith(" as other") && input === baseInputs.get(target.replace(/^action (\w+) as other$/, "$1")) && r?.ok !== true) {
    console.log(`[fuzz] the valid input of ${target} was refused: ${show(result)}`);
    validRefused.push(`${target}: ${show(result)}`);
  }
  if (!r || typeof r !== "object" || typeof r.ok !== "boolean") {
    problems.push({ target, input: show(input), what: `answered ${show(result)}` });
    return;
  }
  if (r.ok === true) accept(target.replace(/ as \w+$/, ""));
  if (r.ok === false && typeof r.error !== "string" && typeof r.message !== "string") problems.push({ target, input: show(input), what: `refused without a message: ${show(result)}` });
  const leak = leaks(show(result).length > 0 ? JSON.stringify(result, (_k, v: unknown) => (typeof v === "bigint" ? String(v) : v)) : "");
  if (leak) problems.push({ target, input: show(input), what: `leaked ${leak}` });
}

// ---------------------------------------------------------------------------------------------
// Route handlers that read a body
// ---------------------------------------------------------------------------------------------

type Handler = (request: NextRequest, context: { params: Promise<Record<string, string | string[]>> }) => Promise<Response>;
type BodyRoute = {
  label: string;
  file: string;
  method: "POST" | "PUT" | "PATCH";
  url: () => string;
  params: () => Record<string, string>;
  base: () => unknown;
  headers?: () => Record<string, string>;
  /** Signs each body as the payment service would. */
  signed?: true;
};

let seq = 0;
/** A fresh documentation-range address per request, so per-address limits do not hide the body checks. */
function nextIp(): string {
  seq += 1;
  return `198.51.${(seq >> 8) & 255}.${seq & 255}`;
}

async function load(file: string): Promise<Record<string, Handler>> {
  return (await import(/* @vite-ignore */ path.join(repoRoot, file))) as Record<string, Handler>;
}

async function callRoute(target: string, handler: Handler, url: string, method: string, params: Record<string, string>, body: RawBody | null, headers: Record<string, string>): Promise<void> {
  const init: { method: string; headers: Record<string, string>; body?: string } = { method, headers: { "x-chalkline-client-address": nextIp(), ...headers } };
  if (body) {
    init.body = body.text;
    if (body.contentType) init.headers["content-type"] = body.contentType;
  }
  const input = body ? `${body.label} ${show(body.text)}` : url;
  let response: Response;
  try {
    response = await handler(new NextRequest(url, init), { params: Promise.resolve(params) });
  } catch (error) {
    const digest = (error as { digest?: unknown } | null)?.digest;
    if (typeof digest === "string" && digest.startsWith("NEXT_HTTP_ERROR_FALLBACK;404")) return;
    problems.push({ target, input, what: `threw ${describeError(error)}` });
    return;
  }
  const text = await response.text();
  if (body?.label === "valid" && response.status >= 300) {
    console.log(`[fuzz] the valid body of ${target} got ${response.status}: ${show(text)}`);
    validRefused.push(`${target}: ${response.status} ${show(text)}`);
  }
  if (response.status < 300) accept(target.replace(/ as \w+$/, ""));
  if (response.status >= 500) problems.push({ target, input, what: `answered ${response.status}: ${show(text)}` });
  const leak = leaks(text);
  if (leak) problems.push({ target, input, what: `leaked ${leak}` });
  if (response.status === 400 && (response.headers.get("content-type") ?? "").includes("json")) {
    const parsed = JSON.parse(text) as { error?: unknown; message?: unknown };
    if (typeof parsed.error !== "string" && typeof parsed.message !== "string") problems.push({ target, input, what: `400 without a message: ${show(text)}` });
  }
}

const ORIGIN = "http://localhost:3100";

function bodyRoutes(): BodyRoute[] {
  const note = { body: "Fuzzed note", side: "front", xIn: 1, yIn: 6, parentId: null, authorName: "Ada Fuzz" };
  return [
    { label: "PUT /api/me/calibration", file: "app/api/me/calibration/route.ts", method: "PUT", url: () => `${ORIGIN}/api/me/calibration`, params: () => ({}), base: () => ({ deviceKey: `fuzz-${f.tag}-screen`, deviceLabel: "Fuzz screen", pxPerInch: 96 }) },
    {
      label: "POST /api/quotes/[quoteId]/accept",
      file: "app/api/quotes/[quoteId]/accept/route.ts",
      method: "POST",
      url: () => `${ORIGIN}/api/quotes/${state.quoteId}/accept`,
      params: () => ({ quoteId: state.quoteId }),
      base: () => ({ fullName: "Ada Fuzz", confirmed: true, link: state.linkToken }),
    },
    {
      label: "POST /api/quotes/[quoteId]/checkout",
      file: "app/api/quotes/[quoteId]/checkout/route.ts",
      method: "POST",
      url: () => `${ORIGIN}/api/quotes/${state.quoteId}/checkout`,
      params: () => ({ quoteId: state.quoteId }),
      base: () => ({ kind: "deposit", link: state.linkToken }),
    },
    {
      label: "POST /api/review/link/[key]/comments",
      file: "app/api/review/[kind]/[key]/comments/route.ts",
      method: "POST",
      url: () => `${ORIGIN}/api/review/link/${state.linkToken}/comments`,
      params: () => ({ kind: "link", key: state.linkToken }),
      base: () => note,
    },
    {
      label: "PATCH /api/review/proof/[key]/comments",
      file: "app/api/review/[kind]/[key]/comments/route.ts",
      method: "PATCH",
      url: () => `${ORIGIN}/api/review/proof/${state.proofId}/comments`,
      params: () => ({ kind: "proof", key: state.proofId }),
      base: () => ({ commentId: state.commentId, resolved: true }),
    },
    {
      label: "POST /api/review/link/[key]/decision",
      file: "app/api/review/[kind]/[key]/decision/route.ts",
      method: "POST",
      url: () => `${ORIGIN}/api/review/link/${state.linkToken}/decision`,
      params: () => ({ kind: "link", key: state.linkToken }),
      base: () => ({ decision: "changes-requested", letter: "A", fullName: "Ada Fuzz", comment: "Move it up an inch" }),
    },
    {
      label: "POST /api/stripe/webhook (signed)",
      file: "app/api/stripe/webhook/route.ts",
      method: "POST",
      url: () => `${ORIGIN}/api/stripe/webhook`,
      params: () => ({}),
      signed: true,
      base: () => ({
        id: `evt_fuzz_${f.tag}`,
        object: "event",
        type: "checkout.session.completed",
        created: 1_800_000_000,
        data: { object: { id: `cs_fuzz_${f.tag}`, object: "checkout.session", payment_status: "paid", amount_total: 1234, client_reference_id: "no-such-payment", metadata: { paymentId: "no-such-payment" }, payment_intent: "pi_fuzz", customer_details: { email: "payer@example.test" } } },
      }),
    },
    {
      label: "POST /api/uploadthing",
      file: "app/api/uploadthing/route.ts",
      method: "POST",
      url: () => `${ORIGIN}/api/uploadthing?actionType=upload&slug=artwork`,
      params: () => ({}),
      headers: () => ({ "x-uploadthing-package": "@uploadthing/react", "x-uploadthing-version": "7.7.4" }),
      base: () => ({ input: { shopSlug: f.other.slug, clientId: state.clientId }, files: [{ name: "fuzz.png", size: 68, type: "image/png", lastModified: 0 }] }),
    },
  ];
}

/** GET routes: the path segments and query are the input. */
function getRoutes(): Array<{ label: string; file: string; build: (s: string) => { url: string; params: Record<string, string> } }> {
  // A client can send any bytes; lone surrogates become U+FFFD as a browser would send them.
  const e = (s: string) => encodeURIComponent(s.toWellFormed());
  return [
    { label: "GET /api/artworks/[id]/[variant]", file: "app/api/artworks/[id]/[variant]/route.ts", build: (s) => ({ url: `${ORIGIN}/api/artworks/${e(s)}/preview`, params: { id: s, variant: "preview" } }) },
    { label: "GET /api/artworks/[id]/[variant] (variant)", file: "app/api/artworks/[id]/[variant]/route.ts", build: (s) => ({ url: `${ORIGIN}/api/artworks/${state.artworkId}/${e(s)}`, params: { id: state.artworkId, variant: s } }) },
    { label: "GET /api/exports/[id]", file: "app/api/exports/[id]/route.ts", build: (s) => ({ url: `${ORIGIN}/api/exports/${e(s)}`, params: { id: s } }) },
    { label: "GET /api/exports/[id]/file", file: "app/api/exports/[id]/file/route.ts", build: (s) => ({ url: `${ORIGIN}/api/exports/${e(s)}/file`, params: { id: s } }) },
    { label: "GET /api/proofs/[id]", file: "app/api/proofs/[id]/route.ts", build: (s) => ({ url: `${ORIGIN}/api/proofs/${e(s)}`, params: { id: s } }) },
    { label: "GET /shops/[shop]/jobs/size-runs", file: "app/shops/[shop]/jobs/size-runs/route.ts", build: (s) => ({ url: `${ORIGIN}/shops/${e(s)}/jobs/size-runs`, params: { shop: s } }) },
    {
      label: "GET /shops/[shop]/jobs/size-runs (filters)",
      file: "app/shops/[shop]/jobs/size-runs/route.ts",
      build: (s) => ({ url: `${ORIGIN}/shops/${f.other.slug}/jobs/size-runs?q=${e(s)}&status=${e(s)}&client=${e(s)}&from=${e(s)}&sort=${e(s)}&page=${e(s)}`, params: { shop: f.other.slug } }),
    },
    { label: "GET /api/me/calibration", file: "app/api/me/calibration/route.ts", build: (s) => ({ url: `${ORIGIN}/api/me/calibration?device=${e(s)}`, params: {} }) },
    { label: "GET /api/review/[kind]/[key]/comments", file: "app/api/review/[kind]/[key]/comments/route.ts", build: (s) => ({ url: `${ORIGIN}/api/review/link/${e(s)}/comments`, params: { kind: "link", key: s } }) },
    { label: "GET /api/review/[kind]/[key]/comments (kind)", file: "app/api/review/[kind]/[key]/comments/route.ts", build: (s) => ({ url: `${ORIGIN}/api/review/${e(s)}/${state.proofId}/comments`, params: { kind: s, key: state.proofId } }) },
    {
      label: "GET /api/review/[kind]/[key]/art/[artworkId]",
      file: "app/api/review/[kind]/[key]/art/[artworkId]/route.ts",
      build: (s) => ({ url: `${ORIGIN}/api/review/proof/${state.proofId}/art/${e(s)}`, params: { kind: "proof", key: state.proofId, artworkId: s } }),
    },
  ];
}

let baseNames: Record<string, unknown> = {};

beforeAll(async () => {
  const ours = await shopsMade.build({ team: ["designer", "production"], clientAccount: true });
  f = await buildAuthzFixture(authzBaseOf(ours));
  shopsMade.adopt({ shopIds: [f.other.id], userIds: [f.users.other.id] });
  noteOnFailure("matrix tag", f.tag);
  other = f.users.other;
  state = await freshState();
  baseNames = await actionBases(state);
});

afterAll(() => {
  session.user = null;
});

/**
 * The fewest inputs the action test tries: per action, the valid input, its boundary cases and
 * random cases up to `runsFor(name)` (at least one random case when the boundary cases fill it).
 */
function plannedActionInputs(): number {
  return readAppSurface(repoRoot).actions.reduce((sum, a) => sum + runsFor(a.name), 0);
}

/** The fewest bodies the route test tries: per route, the valid body, its boundary cases and random ones up to PER_ROUTE. */
function plannedRouteBodies(): number {
  return bodyRoutes().length * PER_ROUTE;
}

function report(kind: string) {
  const mine = problems.filter((p) => p.target.startsWith(kind));
  // One line per distinct kind of failure, so a single bug does not bury the others.
  const distinct = new Map<string, Problem>();
  for (const p of mine) distinct.set(`${p.target} ${p.what.replace(/\d+/g, "#").slice(0, 80)}`, p);
  return [...distinct.values()].map((p) => `${p.target}: ${p.what}\n    input: ${p.input}`);
}

describe(`request fuzzing, direct calls (seed ${SEED})`, () => {
  it("hands every server action generated input; each answers { ok } with a message and never throws", async () => {
    const surface = readAppSurface(repoRoot).actions;
    expect(surface.map((a) => a.name).filter((name) => !(name in baseNames)), "actions without a valid input to mutate").toEqual([]);
    const tried = counts.actions;
    for (const [n, { file, name }] of surface.entries()) {
      // A fresh working set for each action: no earlier action's fuzz cases can refuse its valid input.
      state = await freshState();
      const bases = await actionBases(state);
      baseInputs.set(name, bases[name]);
      const fn = ((await import(/* @vite-ignore */ path.join(repoRoot, file))) as Record<string, (input: unknown) => Promise<unknown>>)[name]!;
      const runs = runsFor(name);
      // The valid input itself first, as its owner: it must get through, so the deep path runs.
      const edges = name === "signUpAction" || name === "acceptInvitationAction" ? [] : boundaryCases(bases[name], Math.round(200 * SCALE));
      const cases: Array<[Caller, unknown]> = [["other", bases[name]], ...edges.map((e): [Caller, unknown] => ["other", e]), ...fc.sample(fc.tuple(caller, actionInput(bases[name])), { numRuns: Math.max(1, runs - edges.length), seed: SEED + n })];
      const started = performance.now();
      for (const [who, input] of cases) {
        signInAs(who);
        await callAction(`action ${name} as ${who}`, fn, input);
      }
      console.log(`[fuzz] ${name}: ${cases.length} inputs in ${Math.round(performance.now() - started)} ms`);
    }
    session.user = null;
    expect(report("action")).toEqual([]);
    expect(validRefused.filter((t) => t.startsWith("action")), `valid inputs refused (seed ${SEED})`).toEqual([]);
    const neverAccepted = surface.map((a) => `action ${a.name}`).filter((t) => !accepted.get(t));
    expect(neverAccepted, "actions whose valid input was refused, so only their schema was fuzzed").toEqual([]);
    console.log(`[fuzz] seed ${SEED}: ${counts.actions - tried} action inputs; accepted: ${[...accepted].filter(([t]) => t.startsWith("action ")).map(([t, n]) => `${t.slice(7)} ${n}`).join(", ")}`);
    // At least the inputs planned for every action (see the count check below).
    expect(counts.actions - tried).toBeGreaterThanOrEqual(plannedActionInputs());
  }, 600_000);

  it("sends every body-reading route handler generated bodies; none answers 5xx or leaks", async () => {
    const stripe = getStripe()!;
    const secret = webhookSecret()!;
    expect(stripe && secret, "the payments fake is configured in the test stack").toBeTruthy();
    const tried = counts.routes;
    for (const [n, route] of bodyRoutes().entries()) {
      // A fresh working set (accepted quote, open link, a note to resolve) for each route.
      state = await freshState();
      const handler = (await load(route.file))[route.method]!;
      const valid: RawBody = { text: JSON.stringify(route.base()), contentType: "application/json", label: "valid" };
      const edges = boundaryCases(route.base(), Math.round(120 * SCALE)).map((e): [Caller, RawBody] => ["other", { text: JSON.stringify(e ?? null), contentType: "application/json", label: "edge" }]);
      const random = fc.sample(fc.tuple(caller, rawBody(route.base())), { numRuns: PER_ROUTE - edges.length, seed: SEED + 100 + n });
      const cases: Array<[Caller, RawBody]> = [["other", valid], ...edges, ...random];
      const started = performance.now();
      for (const [who, body] of cases) {
        signInAs(who);
        counts.routes += 1;
        const headers = { ...(route.headers?.() ?? {}) };
        if (route.signed) headers["stripe-signature"] = stripe.webhooks.generateTestHeaderString({ payload: body.text, secret });
        await callRoute(`route ${route.label} as ${who}`, handler, route.url(), route.method, route.params(), body, headers);
      }
      console.log(`[fuzz] ${route.label}: ${cases.length} bodies in ${Math.round(performance.now() - started)} ms`);
    }
    session.user = null;
    expect(report("route")).toEqual([]);
    expect(validRefused.filter((t) => t.startsWith("route")), `valid bodies refused (seed ${SEED})`).toEqual([]);
    const neverAccepted = bodyRoutes().map((r) => `route ${r.label}`).filter((t) => !accepted.get(t));
    expect(neverAccepted, "routes whose valid body was refused").toEqual([]);
    console.log(`[fuzz] seed ${SEED}: ${counts.routes - tried} route bodies; accepted: ${[...accepted].filter(([t]) => t.startsWith("route ")).map(([t, n]) => `${t.slice(6)} ${n}`).join(", ")}`);
    // At least the bodies planned for every route (see the count check below).
    expect(counts.routes - tried).toBeGreaterThanOrEqual(plannedRouteBodies());
  }, 600_000);

  it("requests every GET route with generated ids and queries; none answers 5xx or leaks", async () => {
    state = await freshState();
    for (const [n, route] of getRoutes().entries()) {
      const handler = (await load(route.file)).GET!;
      const cases = fc.sample(fc.tuple(caller, hostileSegment), { numRuns: PER_GET, seed: SEED + 200 + n });
      for (const [who, segment] of cases) {
        signInAs(who);
        counts.gets += 1;
        const { url, params } = route.build(segment);
        await callRoute(`get ${route.label} as ${who}`, handler, url, "GET", params, null, {});
      }
    }
    session.user = null;
    expect(report("get")).toEqual([]);
  }, 600_000);

  // The two tests above each check they tried at least their planned number; this checks the plan.
  it("plans at least 10,000 generated bodies across actions and body-reading routes, each tried by its test above", () => {
    const actions = plannedActionInputs();
    const routes = plannedRouteBodies();
    console.log(`[fuzz] seed ${SEED}: at least ${actions} action inputs and ${routes} route bodies planned`);
    expect(actions + routes).toBeGreaterThanOrEqual(10_000 * Math.min(1, SCALE));
  });
});
