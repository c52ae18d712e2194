/**
 * The server-action rows of the authorization matrix (tests/authz/matrix.ts), called directly with
 * the session mocked per actor. Allowed actors send inputs that succeed; a refused call must answer
 * { ok: false, status } with the row's status and leave every table exactly as it was.
 */
import path from "node:path";
import { fileURLToPath } from "node:url";
import { eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { saveProofAction } from "@/app/shops/[shop]/proofs/[proofId]/actions";
import { db } from "@/db/client";
import { findBlank } from "@/db/queries/blanks";
import { createClient, findClient } from "@/db/queries/clients";
import { createExport, markExport } from "@/db/queries/production";
import { getProofDocument } from "@/db/queries/proofs";
import { createShareLink } from "@/db/queries/review";
import { createInvitation, createShopWithOwner } from "@/db/queries/shops";
import { proofs } from "@/db/schema";
import { DEFAULT_PRICE_MATRIX } from "@/lib/pricing";
import { ACTION_ROWS, ACTORS, outcomeLabel, type Actor, type ActionOutcome, type ActionRow } from "@/tests/authz/matrix";
import { addTeamMember, authzBaseOf, blankFormValues, buildAuthzFixture, insertArt, insertProof, jobFormInput, LIBRARY_TEE, type AuthzFixture, type FixtureUser } from "@/tests/authz/fixtures";
import { shopFactory } from "@/tests/support/factory";
import { noteOnFailure } from "@/tests/support/failure-notes";

const session = vi.hoisted(() => ({ user: null as null | { id: string; email: string; name: string | null } }));
vi.mock("@/app/_server/auth", () => ({
  getSessionUser: async () => session.user,
  getAuthOptions: () => {
    throw new Error("next-auth is not used while the session is mocked");
  },
}));
// Outside a request there is no cache to revalidate.
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));
// Exports stay in the table; no worker runs during integration tests, so nothing is queued.
const enqueued = vi.hoisted(() => [] as string[]);
vi.mock("@/app/_server/queue", () => ({
  EXPORT_QUEUE: "chalkline-export",
  queue: () => {
    throw new Error("no queue in integration tests");
  },
  enqueueExport: async (id: string) => {
    enqueued.push(id);
  },
}));

const repoRoot = fileURLToPath(new URL("../..", import.meta.url));
// Our shop is one of this file's own (owner, designer, production, a client who signs in); the
// matrix's second shop joins its cleanup.
const shopsMade = shopFactory("authz");

type PerActor = {
  oldArt: string;
  newArt: string;
  failedExport: string;
  linkId: string;
  inviteToken: string;
  /** An invitation to an address someone signed up with (never proven) before the shop invited it. */
  takenInviteToken: string;
  /** Members and an open invitation the fixtures add to our shop for the team rows; the shop's first members are never changed. */
  roleMemberId: string;
  removeMemberId: string;
  invitationId: string;
  draftProofId: string;
};
type Ctx = { f: AuthzFixture; actor: Actor; unique: string; mine: PerActor };
type Input = (ctx: Ctx) => unknown;

let f: AuthzFixture;
const perActor = {} as Record<Actor, PerActor>;
let archiveClientId = "";
/** A member and an open invitation of the second shop, for the "their-ids" team rows. */
let otherMemberId = "";
let otherInvitationId = "";

async function blankValues(blankId: string, description: string) {
  return blankFormValues((await findBlank({ shopId: f.shop.id, blankId }))!, description);
}

async function proofDoc(shopId: string, proofId: string) {
  const document = await getProofDocument({ shopId, proofId });
  const base = document ?? (await getProofDocument({ shopId: f.shop.id, proofId: f.ids.proofId }))!;
  return {
    baseVersion: base.proof.version,
    doc: { size: base.proof.size, colourName: base.proof.colourName, colourHex: base.proof.colourHex, placements: base.placements },
  };
}

async function clientForm(clientId: string, notes: string) {
  const client = await findClient({ shopId: f.shop.id, clientId });
  const name = client?.name ?? `Matrix Rowing Club ${f.tag}`;
  const contacts = (client?.contacts ?? []).map((c) => ({ id: c.id, name: c.name, email: c.email, phone: c.phone ?? "" }));
  return { name, notes, taxExempt: false, contacts };
}

/** What each action row sends; "ours" rows send what an allowed actor would send to succeed. */
const INPUTS: Record<string, Input> = {
  "sign-up": ({ unique }) => ({ shopName: `Matrix Signup ${unique}`, name: "Sol Reyes", email: `signup-${unique}@example.test`, password: "a-long-enough-password" }),
  "accept-invitation": ({ mine }) => ({ token: mine.inviteToken, name: "Nia Ferro", password: "a-long-enough-password" }),
  "accept-invitation/taken": ({ mine }) => ({ token: mine.takenInviteToken, name: "Nia Ferro", password: "a-long-enough-password" }),

  "replace-art/ours": ({ f, mine }) => ({ shopSlug: f.shop.slug, oldId: mine.oldArt, newId: mine.newArt }),
  "replace-art/their-slug": ({ f, mine }) => ({ shopSlug: f.other.slug, oldId: mine.oldArt, newId: mine.newArt }),
  "replace-art/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, oldId: f.ids.otherArtworkId, newId: f.ids.otherSpareArtworkId }),

  "duplicate-blank/ours": ({ f }) => ({ shopSlug: f.shop.slug, blankId: LIBRARY_TEE }),
  "duplicate-blank/their-slug": ({ f }) => ({ shopSlug: f.other.slug, blankId: f.ids.blankId }),
  "duplicate-blank/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, blankId: f.ids.otherBlankId }),
  "update-blank/ours": async ({ f, actor }) => ({ shopSlug: f.shop.slug, blankId: f.ids.blankId, values: await blankValues(f.ids.blankId, `Checked by ${actor}`) }),
  "update-blank/their-slug": async ({ f }) => ({ shopSlug: f.other.slug, blankId: f.ids.blankId, values: await blankValues(f.ids.blankId, "From another shop") }),
  "update-blank/their-ids": async ({ f }) => ({ shopSlug: f.shop.slug, blankId: f.ids.otherBlankId, values: await blankValues(f.ids.blankId, "Not ours") }),

  "create-client/ours": ({ f, unique }) => ({ shopSlug: f.shop.slug, name: `Matrix Kayak Club ${unique}`, notes: "", taxExempt: false, contacts: [{ name: "Kit Vale", email: `kit-${unique}@kayak.test`, phone: "" }] }),
  "update-client/ours": async ({ f, actor }) => ({ shopSlug: f.shop.slug, clientId: f.ids.secondClientId, ...(await clientForm(f.ids.secondClientId, `Notes by ${actor}`)) }),
  "update-client/their-slug": async ({ f }) => ({ shopSlug: f.other.slug, clientId: f.ids.secondClientId, ...(await clientForm(f.ids.secondClientId, "From another shop")), contacts: [] }),
  "update-client/their-ids": async ({ f }) => ({ shopSlug: f.shop.slug, clientId: f.ids.otherClientId, ...(await clientForm(f.ids.otherClientId, "Not ours")), contacts: [] }),
  "archive-client/ours": ({ f }) => ({ shopSlug: f.shop.slug, clientId: archiveClientId, archived: true }),
  "archive-client/their-slug": ({ f }) => ({ shopSlug: f.other.slug, clientId: archiveClientId, archived: true }),
  "archive-client/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, clientId: f.ids.otherClientId, archived: true }),

  "create-job/ours": ({ f, unique }) => ({ shopSlug: f.shop.slug, ...jobFormInput(`Matrix relay tees ${unique}`, f.ids.secondClientId) }),
  "update-job/ours": ({ f }) => ({ shopSlug: f.shop.slug, jobId: f.ids.secondClientJobId, ...jobFormInput(`Matrix regatta tees ${f.tag}`, f.ids.secondClientId) }),
  "update-job/their-slug": ({ f }) => ({ shopSlug: f.other.slug, jobId: f.ids.secondClientJobId, ...jobFormInput("Taken over", f.ids.otherClientId) }),
  "update-job/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, jobId: f.ids.otherJobId, ...jobFormInput("Taken over", f.ids.secondClientId) }),
  "job-to-press/ours": ({ f }) => ({ shopSlug: f.shop.slug, jobId: f.ids.secondClientJobId, status: "on-press" }),
  "job-to-drafting/ours": ({ f }) => ({ shopSlug: f.shop.slug, jobId: f.ids.secondClientJobId, status: "drafting" }),
  "job-to-press/their-slug": ({ f }) => ({ shopSlug: f.other.slug, jobId: f.ids.secondClientJobId, status: "on-press" }),
  "job-to-press/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, jobId: f.ids.otherJobId, status: "on-press" }),
  "send-quote/ours": ({ f }) => ({ shopSlug: f.shop.slug, jobId: f.ids.secondClientJobId }),
  "send-quote/their-slug": ({ f }) => ({ shopSlug: f.other.slug, jobId: f.ids.secondClientJobId }),
  "send-quote/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, jobId: f.ids.otherJobId }),

  "save-size-run/ours": ({ f }) => ({ shopSlug: f.shop.slug, jobId: f.ids.secondClientJobId, sizes: [{ size: "S", quantity: 8 }, { size: "M", quantity: 12 }], sparePercent: 5 }),
  "save-size-run/their-slug": ({ f }) => ({ shopSlug: f.other.slug, jobId: f.ids.secondClientJobId, sizes: [{ size: "M", quantity: 1 }] }),
  "save-size-run/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, jobId: f.ids.otherJobId, sizes: [{ size: "M", quantity: 1 }] }),
  // A print that is on the job's proof (insertProof names its placement after the proof).
  "save-grading/ours": ({ f }) => ({ shopSlug: f.shop.slug, jobId: f.ids.jobId, placementId: `matrix-${f.ids.proofId}`, transferCount: 1, assignment: { S: 10, M: 10 }, totalShortfall: 0 }),
  "save-grading/their-slug": ({ f }) => ({ shopSlug: f.other.slug, jobId: f.ids.secondClientJobId, placementId: `matrix-grading-${f.tag}`, transferCount: 1, assignment: { M: 10 }, totalShortfall: 0 }),
  "save-grading/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, jobId: f.ids.otherJobId, placementId: `matrix-grading-${f.tag}`, transferCount: 1, assignment: { M: 10 }, totalShortfall: 0 }),
  "request-export/ours": ({ f }) => ({ kind: "spec-sheet", shopSlug: f.shop.slug, jobId: f.ids.secondClientJobId }),
  "request-export/their-slug": ({ f }) => ({ kind: "spec-sheet", shopSlug: f.other.slug, jobId: f.ids.secondClientJobId }),
  "request-export/their-ids": ({ f }) => ({ kind: "spec-sheet", shopSlug: f.shop.slug, jobId: f.ids.otherJobId }),
  "retry-export/ours": ({ f, mine }) => ({ shopSlug: f.shop.slug, exportId: mine.failedExport }),
  "retry-export/their-slug": ({ f, mine }) => ({ shopSlug: f.other.slug, exportId: mine.failedExport }),
  "retry-export/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, exportId: f.ids.otherExportId }),

  "save-prices/ours": ({ f }) => ({ shopSlug: f.shop.slug, matrix: DEFAULT_PRICE_MATRIX }),

  "create-proof/ours": ({ f }) => ({ shopSlug: f.shop.slug, jobId: f.ids.secondClientJobId, name: null, blankId: null, colourName: null, art: [{ location: "full-front", artworkId: f.ids.secondClientArtworkId }] }),
  "create-proof/their-slug": ({ f }) => ({ shopSlug: f.other.slug, jobId: f.ids.secondClientJobId, name: null, blankId: null, colourName: null, art: [] }),
  "create-proof/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, jobId: f.ids.otherJobId, name: null, blankId: null, colourName: null, art: [] }),
  "duplicate-proof/ours": ({ f }) => ({ shopSlug: f.shop.slug, proofId: f.ids.proofId, name: null, blankId: null, colourName: null }),
  "duplicate-proof/their-slug": ({ f }) => ({ shopSlug: f.other.slug, proofId: f.ids.proofId, name: null, blankId: null, colourName: null }),
  "duplicate-proof/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, proofId: f.ids.otherProofId, name: null, blankId: null, colourName: null }),
  "archive-proof/ours": ({ f, mine }) => ({ shopSlug: f.shop.slug, proofId: mine.draftProofId, archived: true }),
  "archive-proof/their-slug": ({ f, mine }) => ({ shopSlug: f.other.slug, proofId: mine.draftProofId, archived: true }),
  "archive-proof/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, proofId: f.ids.otherProofId, archived: true }),

  "save-proof/ours": async ({ f }) => ({ shopSlug: f.shop.slug, proofId: f.ids.proofId, ...(await proofDoc(f.shop.id, f.ids.proofId)) }),
  "save-proof/their-slug": async ({ f }) => ({ shopSlug: f.other.slug, proofId: f.ids.proofId, ...(await proofDoc(f.shop.id, f.ids.proofId)) }),
  "save-proof/their-ids": async ({ f }) => ({ shopSlug: f.shop.slug, proofId: f.ids.otherProofId, ...(await proofDoc(f.other.id, f.ids.otherProofId)) }),
  "share-proof/ours": ({ f }) => ({ shopSlug: f.shop.slug, proofId: f.ids.proofId, permission: "view", expiresInDays: 7, recipientEmail: null, recipientName: null, message: null }),
  "share-proof/their-slug": ({ f }) => ({ shopSlug: f.other.slug, proofId: f.ids.proofId, permission: "approve", expiresInDays: null, recipientEmail: null, recipientName: null, message: null }),
  "share-proof/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, proofId: f.ids.otherProofId, permission: "approve", expiresInDays: null, recipientEmail: null, recipientName: null, message: null }),
  "list-share-links/ours": ({ f }) => ({ shopSlug: f.shop.slug, proofId: f.ids.proofId }),
  "list-share-links/their-slug": ({ f }) => ({ shopSlug: f.other.slug, proofId: f.ids.proofId }),
  "list-share-links/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, proofId: f.ids.otherProofId }),
  "revoke-share-link/ours": ({ f, mine }) => ({ shopSlug: f.shop.slug, linkId: mine.linkId }),
  "revoke-share-link/their-slug": ({ f, mine }) => ({ shopSlug: f.other.slug, linkId: mine.linkId }),
  "revoke-share-link/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, linkId: f.ids.otherLinkId }),

  "save-shop-clock/ours": ({ f }) => ({ shopSlug: f.shop.slug, locale: "en-GB", timeZone: "Europe/London" }),
  "invite-member/ours": ({ f, unique }) => ({ shopSlug: f.shop.slug, email: `invited-${unique}@example.test`, role: "production" }),
  "change-member-role/ours": ({ f, mine }) => ({ shopSlug: f.shop.slug, memberId: mine.roleMemberId, role: "designer" }),
  "change-member-role/their-slug": ({ f, mine }) => ({ shopSlug: f.other.slug, memberId: mine.roleMemberId, role: "owner" }),
  "change-member-role/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, memberId: otherMemberId, role: "owner" }),
  "remove-member/ours": ({ f, mine }) => ({ shopSlug: f.shop.slug, memberId: mine.removeMemberId }),
  "remove-member/their-slug": ({ f, mine }) => ({ shopSlug: f.other.slug, memberId: mine.removeMemberId }),
  "remove-member/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, memberId: otherMemberId }),
  "withdraw-invitation/ours": ({ f, mine }) => ({ shopSlug: f.shop.slug, invitationId: mine.invitationId }),
  "withdraw-invitation/their-slug": ({ f, mine }) => ({ shopSlug: f.other.slug, invitationId: mine.invitationId }),
  "withdraw-invitation/their-ids": ({ f }) => ({ shopSlug: f.shop.slug, invitationId: otherInvitationId }),
};

/** A digest of every table in the database: a refused call must leave it unchanged. */
async function fingerprint(): Promise<Record<string, string>> {
  const tables = await db.execute<{ table_name: string }>(sql`select table_name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' order by table_name`);
  const parts = tables.rows.map((t) => `select '${t.table_name}' as name, count(*)::text || ':' || md5(coalesce(string_agg(md5(x::text), '' order by md5(x::text)), '')) as digest from "${t.table_name}" x`);
  const rows = await db.execute<{ name: string; digest: string }>(sql.raw(parts.join(" union all ")));
  return Object.fromEntries(rows.rows.map((r) => [r.name, r.digest]));
}

/**
 * Tables whose rows changed. The rate-limit counters are left out on purpose: a refused attempt
 * (an invitation tried by the wrong account, say) is still an attempt, and counting it is the point.
 */
const COUNTERS = new Set(["rate_limits"]);
function changedTables(before: Record<string, string>, after: Record<string, string>): string[] {
  return Object.keys({ ...before, ...after }).filter((k) => !COUNTERS.has(k) && before[k] !== after[k]);
}

type Result = { ok: boolean; status?: number; error?: string; message?: string };

/** The outcome of one call, in the matrix's terms; anything else comes back as a description. */
async function call(row: ActionRow, input: unknown): Promise<{ outcome: ActionOutcome | string; result: unknown }> {
  const loaded = (await import(/* @vite-ignore */ path.join(repoRoot, row.file))) as Record<string, (input: unknown) => Promise<Result>>;
  const fn = loaded[row.name];
  if (typeof fn !== "function") return { outcome: `${row.name} is not exported by ${row.file}`, result: null };
  try {
    const result = await fn(input);
    if (result?.ok === true) return { outcome: "ok", result };
    if (result?.ok === false) return { outcome: result.status === 401 || result.status === 403 || result.status === 404 ? result.status : `refused with status ${result.status ?? "none"}: ${result.error ?? result.message}`, result };
    return { outcome: `answered ${JSON.stringify(result)}`, result };
  } catch (error) {
    // A successful action may end in redirect(), which throws Next's redirect signal.
    const digest = (error as { digest?: unknown }).digest;
    if (typeof digest === "string" && digest.startsWith("NEXT_REDIRECT")) return { outcome: "ok", result: { redirect: digest.split(";")[2] } };
    return { outcome: `threw ${error instanceof Error ? error.message : String(error)}`, result: null };
  }
}

function userFor(actor: Actor): FixtureUser | null {
  if (actor === "link" || actor === "anon") return null;
  return f.users[actor];
}

/** A failed export of the second client's job, for a retry to pick up. */
async function failedExportOf(): Promise<string> {
  const id = await createExport({ shopId: f.shop.id, jobId: f.ids.secondClientJobId, kind: "spec-sheet", params: {}, requestedBy: f.users.owner.id });
  await markExport(id, { state: "failed", message: "Failed for the matrix." });
  return id;
}

beforeAll(async () => {
  const ours = await shopsMade.build({ team: ["designer", "production"], clientAccount: true });
  f = await buildAuthzFixture(authzBaseOf(ours));
  shopsMade.adopt({ shopIds: [f.other.id], userIds: [f.users.other.id] });
  noteOnFailure("matrix tag", f.tag);
  archiveClientId = (await createClient({ shopId: f.shop.id, actorUserId: f.users.owner.id, input: { name: `Matrix Archive Club ${f.tag}`, notes: null, taxExempt: false, contacts: [] } })).id;
  for (const actor of ACTORS) {
    const oldArt = await insertArt(f.shop.id, f.ids.secondClientId, `Matrix flag ${f.tag} ${actor}`);
    const newArt = await insertArt(f.shop.id, f.ids.secondClientId, `Matrix flag ${f.tag} ${actor} v2`);
    const failedExport = await failedExportOf();
    const { link } = await createShareLink({ shopId: f.shop.id, proofId: f.ids.proofId, permission: "comment", expiresAt: null, recipientEmail: null, recipientName: null, createdBy: f.users.designer.id });
    // Invitations to the second shop: whoever accepts them, our shop's team stays as it is.
    const { token } = await createInvitation({ shopId: f.other.id, email: `joiner-${f.tag}-${actor}@example.test`, role: "production", invitedBy: f.users.other.id });
    const takenEmail = `taken-${f.tag}-${actor}@example.test`;
    await createShopWithOwner({ shopName: `Matrix Squat ${f.tag} ${actor}`, name: "Matrix squatter", email: takenEmail, passwordHash: "not-used" });
    const { token: takenInviteToken } = await createInvitation({ shopId: f.other.id, email: takenEmail, role: "production", invitedBy: f.users.other.id });
    const draftProofId = await insertProof(f.shop.id, f.ids.siblingJobId, `Matrix spare draft ${f.tag} ${actor}`, oldArt, f.users.designer.id);
    // Team rows: people of our own in our shop (the owner's allowed calls change them, nobody else's).
    const crew = (role: string) => ({ shopId: f.shop.id, ownerId: f.users.owner.id, email: `matrix-${role}-${f.tag}-${actor}@example.test`, name: `Matrix ${role} ${actor}`, role: "production" as const });
    const roleMember = await addTeamMember(crew("recast"));
    const removeMember = await addTeamMember(crew("leaver"));
    const { invitationId } = await createInvitation({ shopId: f.shop.id, email: `matrix-pending-${f.tag}-${actor}@example.test`, role: "designer", invitedBy: f.users.owner.id });
    perActor[actor] = { oldArt, newArt, failedExport, linkId: link.id, inviteToken: token, takenInviteToken, roleMemberId: roleMember.memberId, removeMemberId: removeMember.memberId, invitationId, draftProofId };
  }
  otherMemberId = (await addTeamMember({ shopId: f.other.id, ownerId: f.users.other.id, email: `matrix-their-crew-${f.tag}@example.test`, name: "Matrix their crew", role: "designer" })).memberId;
  otherInvitationId = (await createInvitation({ shopId: f.other.id, email: `matrix-their-pending-${f.tag}@example.test`, role: "designer", invitedBy: f.users.other.id })).invitationId;
});

afterAll(() => {
  session.user = null;
});

describe("authorization matrix: server actions", () => {
  it("has an input for every action row and no input without a row", () => {
    const ids = ACTION_ROWS.map((r) => r.id);
    expect(ids.filter((id) => !INPUTS[id])).toEqual([]);
    expect(Object.keys(INPUTS).filter((id) => !ids.includes(id))).toEqual([]);
  });

  it.each(ACTION_ROWS.map((row) => [`${row.name} [${row.id}]`, row] as const))("%s", async (_label, row) => {
    const problems: string[] = [];
    for (const actor of ACTORS) {
      session.user = userFor(actor);
      const expected = row.expect[actor];
      const input = await INPUTS[row.id]!({ f, actor, unique: `${f.tag}-${actor}`, mine: perActor[actor] });
      const before = expected === "ok" ? null : await fingerprint();
      const { outcome, result } = await call(row, input);
      if (outcome !== expected) problems.push(`${actor}: expected ${outcomeLabel(expected)}, got ${typeof outcome === "string" ? outcome : outcomeLabel(outcome)}`);
      if (before) {
        const changed = changedTables(before, await fingerprint());
        if (changed.length) problems.push(`${actor}: refused, yet changed ${changed.join(", ")}`);
      }
      const text = JSON.stringify(result ?? null);
      if (actor === "production" && /cents/i.test(text)) problems.push(`production: the answer carries money: ${text.slice(0, 200)}`);
      if (actor === "other" && !row.open) for (const s of f.secrets) if (text.includes(s)) problems.push(`other: the answer contains our "${s}"`);
    }
    session.user = null;
    expect(problems).toEqual([]);
  });

  it("refuses a proof save that places another shop's art behind art of its own, and saves nothing", async () => {
    session.user = f.users.designer;
    const { baseVersion, doc } = await proofDoc(f.shop.id, f.ids.proofId);
    const first = doc.placements[0]!;
    const placements = [
      { ...first, id: `matrix-own-${f.tag}`, artworkId: f.ids.secondClientArtworkId },
      { ...first, id: `matrix-foreign-${f.tag}`, location: "full-back" as const, artworkId: f.ids.otherArtworkId },
    ];
    const before = await fingerprint();
    const result = await saveProofAction({ shopSlug: f.shop.slug, proofId: f.ids.proofId, baseVersion, doc: { ...doc, placements } });
    expect(result).toMatchObject({ ok: false, kind: "invalid" });
    expect(changedTables(before, await fingerprint())).toEqual([]);
    const [proof] = await db.select({ version: proofs.version }).from(proofs).where(eq(proofs.id, f.ids.proofId));
    expect(proof!.version).toBe(baseVersion);
    session.user = null;
  });

  it("queues exports only for the actors the matrix allows", async () => {
    // request-export/ours: owner, designer and production; retry-export/ours the same. Each call
    // here has its own failed export to retry, so the rows above may run before or after this.
    const rows = ACTION_ROWS.filter((r) => r.id === "request-export/ours" || r.id === "retry-export/ours");
    expect(rows.map((r) => r.id).sort()).toEqual(["request-export/ours", "retry-export/ours"]);
    const queued: string[] = [];
    for (const row of rows) {
      for (const actor of ACTORS) {
        const mine = { ...perActor[actor], failedExport: await failedExportOf() };
        const input = await INPUTS[row.id]!({ f, actor, unique: `${f.tag}-${actor}-queue`, mine });
        session.user = userFor(actor);
        const before = enqueued.length;
        await call(row, input);
        session.user = null;
        expect(enqueued.length - before, `${row.id} as ${actor}`).toBeLessThanOrEqual(1);
        if (enqueued.length > before) queued.push(`${row.id} ${actor}`);
      }
    }
    expect(queued.sort()).toEqual(["owner", "designer", "production"].flatMap((a) => [`request-export/ours ${a}`, `retry-export/ours ${a}`]).sort());
  });
});
