/**
 * The quote follows the proof, against the real PostgreSQL: a shop of our own (never the demo
 * shop's rows) with a job billing the full front, whose proof gains a full back print. Sending
 * refuses the short quote; the client's accept and checkout answer 409 in words, start no payment
 * and leave the shop one activity entry.
 */
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { POST as acceptRoute } from "@/app/api/quotes/[quoteId]/accept/route";
import { POST as checkoutRoute } from "@/app/api/quotes/[quoteId]/checkout/route";
import { checkQuoteAgainstProofs } from "@/app/_server/orders";
import { sendQuoteAction, saveJobAction } from "@/app/shops/[shop]/jobs/actions";
import { db } from "@/db/client";
import { currentQuote, findQuote, sendQuote } from "@/db/queries/orders";
import { listProofPrints } from "@/db/queries/proof-prints";
import { getProofDocument } from "@/db/queries/proofs";
import { recordDecision, sendRevision } from "@/db/queries/review";
import { createShopWithOwner } from "@/db/queries/shops";
import { artworks, auditLog, payments, placements, proofRevisions, proofs, quotes, shops } from "@/db/schema";
import { describeAudit } from "@/lib/audit-text";
import { DEFAULT_PRICE_MATRIX } from "@/lib/pricing";
import { quoteJob } from "@/lib/quotes";
import { nextRevisionLetter } from "@/lib/review/diff";
import { buildShopRecords, insertProof, jobFormInput, type ShopRecords } from "@/tests/authz/fixtures";
import { startStripeFake, type StripeFake } from "@/scripts/fakes/stripe";
import { shopFactory } from "@/tests/support/factory";

const session = vi.hoisted(() => ({ user: null as null | { id: string; email: string; name: string | null } }));
vi.mock("@/app/_server/auth", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/app/_server/auth")>()),
  getSessionUser: async () => session.user,
}));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));

// The shops made here go again after the file (pass or fail), with everything in them.
const made = shopFactory("quote-proof");
const tag = made.tag;
let shop: { id: string; slug: string };
let owner: { id: string; email: string; name: string };
let count = 0;

/** A fresh working set: a job billing a 1-colour full front, its proof sent as revision A, an accepted quote. */
async function fresh(): Promise<ShopRecords & { title: string }> {
  count += 1;
  const records = await buildShopRecords({ shopId: shop.id, ownerId: owner.id, tag: `${tag}-${count}` });
  return { ...records, title: `Mill choir tees ${tag}-${count}` };
}

/** Puts a print on the proof's working placements, as a save from the editor would. */
async function addPrint(proofId: string, location: string, artworkId: string | null) {
  await db.insert(placements).values({ id: `qp-${location}-${proofId}`, proofId, location, artworkId, widthIn: 10, heightIn: 8, offsetFromCenterIn: 0, belowCollarIn: 4, rotationDeg: 0, sortOrder: 1 });
}

/** Sends the proof's current state to the client as its next revision letter (a sent letter never changes). */
async function resend(proofId: string): Promise<string> {
  const [row] = await db.select({ revision: proofs.revision }).from(proofs).where(eq(proofs.id, proofId));
  const [sent] = await db.select({ id: proofRevisions.id }).from(proofRevisions).where(and(eq(proofRevisions.proofId, proofId), eq(proofRevisions.letter, row!.revision)));
  const letter = sent ? nextRevisionLetter(row!.revision) : row!.revision;
  await db.update(proofs).set({ revision: letter }).where(eq(proofs.id, proofId));
  const document = await getProofDocument({ shopId: shop.id, proofId });
  await sendRevision({ document: document!, userId: owner.id });
  return letter;
}

async function approve(proofId: string, letter: string) {
  const result = await recordDecision({ proofId, letter, decision: "approved", fullName: "Cass Mill", statement: "I approve this proof.", comment: null, ip: "127.0.0.1", userAgent: "quote-proof test", shareLinkId: null, userId: null });
  expect(result.ok).toBe(true);
}

function post(route: typeof checkoutRoute, quoteId: string, body: unknown, ip: string) {
  return route(new Request(`http://localhost/api/quotes/${quoteId}/x`, { method: "POST", headers: { "content-type": "application/json", "x-chalkline-client-address": ip }, body: JSON.stringify(body) }), { params: Promise.resolve({ quoteId }) });
}

async function heldEntries(jobId: string) {
  return db.select().from(auditLog).where(and(eq(auditLog.shopId, shop.id), eq(auditLog.action, "quote.held"), eq(auditLog.subjectId, jobId)));
}

/** A new quote out for the job at the demo prices (sent, not accepted), billing the job's locations. */
async function sentQuote(records: { jobId: string; clientId: string; title: string }, locations: Array<{ location: string; colours: number }>) {
  const input = { ...jobFormInput(records.title, records.clientId), printLocations: locations, notes: null };
  const priced = quoteJob({ ...input, garmentName: "Everyday Crew Tee" }, DEFAULT_PRICE_MATRIX, { taxExempt: false });
  if (!priced.ok || !priced.snapshot) throw new Error(priced.ok ? "no snapshot" : priced.message);
  return sendQuote({ shopId: shop.id, jobId: records.jobId, snapshot: priced.snapshot, depositPercent: DEFAULT_PRICE_MATRIX.depositPercent, actorUserId: owner.id });
}

let fake: StripeFake;
const savedFakeUrl = process.env.STRIPE_FAKE_URL;

beforeAll(async () => {
  const email = `quote-proof-${tag}@mill-prints.test`;
  const created = await createShopWithOwner({ shopName: `Quote Proof Mill ${tag}`, name: "Odile Marsh", email, passwordHash: "not-used-in-this-test" });
  made.adopt({ shopSlugs: [created.shopSlug], userIds: [created.userId] });
  const [row] = await db.select({ id: shops.id, slug: shops.slug }).from(shops).where(eq(shops.slug, created.shopSlug));
  shop = row!;
  owner = { id: created.userId, email, name: "Odile Marsh" };
  fake = await startStripeFake({ port: 0, dir: mkdtempSync(path.join(tmpdir(), "chalkline-quote-proof-")), webhookUrl: null, webhookSecret: process.env.STRIPE_WEBHOOK_SECRET ?? "whsec_quote_proof", log: () => {} });
  process.env.STRIPE_FAKE_URL = fake.url;
});

afterAll(async () => {
  process.env.STRIPE_FAKE_URL = savedFakeUrl;
  await fake?.close();
});

describe("what the proofs show, from the database", () => {
  it("reads the approved revision's prints and the art's colour count, and names the missing full back", async () => {
    const r = await fresh();
    await addPrint(r.proofId, "full-back", r.spareArtworkId);
    const letter = await resend(r.proofId);
    await approve(r.proofId, letter);
    await db.update(artworks).set({ colourCount: 3 }).where(eq(artworks.id, r.artworkId));

    const prints = await listProofPrints({ shopId: shop.id, jobId: r.jobId });
    expect(prints.proofs).toHaveLength(1);
    const revisions = [...prints.proofs[0]!.revisions].sort((a, b) => a.letter.localeCompare(b.letter));
    expect(revisions).toEqual([expect.objectContaining({ letter: "A", state: "open" }), expect.objectContaining({ letter: "B", state: "approved" })]);
    expect(revisions[0]!.placements.map((p) => p.location)).toEqual(["full-front"]);
    expect(revisions[1]!.placements.map((p) => p.location).sort()).toEqual(["full-back", "full-front"]);
    expect(prints.artColours[r.artworkId]).toBe(3);
    expect(prints.artColours[r.spareArtworkId]).toBeNull();

    const quote = (await findQuote({ quoteId: r.quoteId }))!;
    const mismatches = await checkQuoteAgainstProofs({ shopId: shop.id, jobId: r.jobId, method: quote.snapshot.job.method, billed: quote.snapshot.job.locations, includeWorking: false });
    expect(mismatches.map((m) => m.message)).toEqual([
      "The proof prints on the full back, but the quote does not bill a full back print.",
      "The full front art on the proof has about 3 ink colours, but the quote bills 1 colour there.",
    ]);
  });

  it("another shop's id reads nothing", async () => {
    const r = await fresh();
    const elsewhere = await createShopWithOwner({ shopName: `Quote Proof Elsewhere ${tag}`, name: "Vic Ray", email: `elsewhere-${tag}@mill-prints.test`, passwordHash: "not-used-in-this-test" });
    made.adopt({ shopSlugs: [elsewhere.shopSlug], userIds: [elsewhere.userId] });
    const [theirs] = await db.select({ id: shops.id }).from(shops).where(eq(shops.slug, elsewhere.shopSlug));
    expect(await listProofPrints({ shopId: theirs!.id, jobId: r.jobId })).toEqual({ proofs: [], artColours: {} });
  });
});

describe("sending a quote", () => {
  it("refuses a quote that bills fewer locations than a proof never sent shows, and sends it once the job bills them", async () => {
    session.user = owner;
    const r = await fresh();
    const unsent = await insertProof(shop.id, r.jobId, `Mill back ${tag}-${count}`, r.spareArtworkId, owner.id);
    await addPrint(unsent, "full-back", r.spareArtworkId);
    const before = await currentQuote({ jobId: r.jobId });

    const refused = await sendQuoteAction({ shopSlug: shop.slug, jobId: r.jobId });
    expect(refused).toMatchObject({ ok: false, status: 409 });
    if (refused.ok) throw new Error("sent");
    expect(refused.error).toContain("This quote bills fewer print locations than the proofs show.");
    expect(refused.error).toContain(`The proof "Mill back ${tag}-${count}" prints on the full back, but the quote does not bill a full back print.`);
    expect((await currentQuote({ jobId: r.jobId }))?.id).toBe(before?.id);

    const saved = await saveJobAction({ shopSlug: shop.slug, jobId: r.jobId, ...jobFormInput(r.title, r.clientId), printLocations: [{ location: "full-front", colours: 1 }, { location: "full-back", colours: 1 }] });
    expect(saved.ok).toBe(true);
    const sent = await sendQuoteAction({ shopSlug: shop.slug, jobId: r.jobId });
    expect(sent).toMatchObject({ ok: true, data: { number: 2, warnings: [] } });
    const quote = (await currentQuote({ jobId: r.jobId }))!;
    expect(quote.snapshot.job.locations.map((l) => l.location)).toEqual(["full-front", "full-back"]);
  });

  it("goes by the revision the client was sent: a back print saved after sending counts once it is sent", async () => {
    session.user = owner;
    const r = await fresh();
    await addPrint(r.proofId, "full-back", r.spareArtworkId);
    expect(await sendQuoteAction({ shopSlug: shop.slug, jobId: r.jobId })).toMatchObject({ ok: true, data: { warnings: [] } });
    await resend(r.proofId);
    const refused = await sendQuoteAction({ shopSlug: shop.slug, jobId: r.jobId });
    expect(refused).toMatchObject({ ok: false, status: 409 });
  });

  it("sends a quote billing more than the proofs show, with the warning in the answer", async () => {
    session.user = owner;
    const r = await fresh();
    await saveJobAction({ shopSlug: shop.slug, jobId: r.jobId, ...jobFormInput(r.title, r.clientId), printLocations: [{ location: "full-front", colours: 1 }, { location: "left-chest", colours: 1 }] });
    const sent = await sendQuoteAction({ shopSlug: shop.slug, jobId: r.jobId });
    expect(sent).toMatchObject({ ok: true, data: { warnings: ["The quote bills a left chest print that no proof shows."] } });
  });
});

describe("the client about to pay", () => {
  it("a link checking out a quote that bills fewer locations than the approved proof gets 409, no payment, and the shop one activity entry", async () => {
    const r = await fresh();
    await addPrint(r.proofId, "full-back", r.spareArtworkId);
    const letter = await resend(r.proofId);
    await approve(r.proofId, letter);

    const first = await post(checkoutRoute, r.quoteId, { kind: "deposit", link: r.linkToken }, "10.88.0.1");
    expect(first.status).toBe(409);
    const body = (await first.json()) as { error: string };
    expect(body.error).toBe("The print shop is updating this quote to match your proof, which also prints on the full back. No payment was started and nothing was charged; the shop will send you the updated quote.");
    const again = await post(checkoutRoute, r.quoteId, { kind: "full", link: r.linkToken }, "10.88.0.1");
    expect(again.status).toBe(409);

    expect(await db.select().from(payments).where(eq(payments.quoteId, r.quoteId))).toHaveLength(0);
    const entries = await heldEntries(r.jobId);
    expect(entries).toHaveLength(1);
    expect(entries[0]).toMatchObject({ actorLabel: "review link", detail: { quoteId: r.quoteId, number: 1, missing: ["full back"], via: "checkout" } });
    expect(describeAudit(entries[0]!.action, entries[0]!.detail ?? undefined)).toBe(
      `The client could not pay quote Q1 on ${r.title}: the proof prints on the full back, which the quote does not bill. Update the job's print locations and send a new quote.`,
    );
  });

  it("a link accepting such a quote gets 409 and the quote stays unaccepted", async () => {
    const r = await fresh();
    await addPrint(r.proofId, "full-back", r.spareArtworkId);
    await resend(r.proofId);
    const quote = await sentQuote(r, [{ location: "full-front", colours: 1 }]);

    const answer = await post(acceptRoute, quote.id, { fullName: "Cass Mill", confirmed: true, link: r.linkToken }, "10.88.0.2");
    expect(answer.status).toBe(409);
    expect(((await answer.json()) as { error: string }).error).toContain("The quote was not accepted and nothing is owed");
    expect((await findQuote({ quoteId: quote.id }))?.state).toBe("sent");
    expect((await heldEntries(r.jobId)).map((e) => e.detail?.via)).toEqual(["accept"]);
  });

  it("pays a quote that covers the proof; a print only on the working proof (never sent) does not hold it", async () => {
    const r = await fresh();
    await approve(r.proofId, "A");
    await addPrint(r.proofId, "full-back", r.spareArtworkId);

    const answer = await post(checkoutRoute, r.quoteId, { kind: "deposit", link: r.linkToken }, "10.88.0.3");
    expect(answer.status).toBe(200);
    expect(((await answer.json()) as { url: string }).url).toMatch(/^http/);
    expect(await db.select().from(payments).where(eq(payments.quoteId, r.quoteId))).toHaveLength(1);
    expect(await heldEntries(r.jobId)).toHaveLength(0);
  });

  it("a new quote that bills the back opens checkout again once accepted", async () => {
    const r = await fresh();
    await addPrint(r.proofId, "full-back", r.spareArtworkId);
    const letter = await resend(r.proofId);
    await approve(r.proofId, letter);
    expect((await post(checkoutRoute, r.quoteId, { kind: "deposit", link: r.linkToken }, "10.88.0.4")).status).toBe(409);

    const quote = await sentQuote(r, [{ location: "full-front", colours: 1 }, { location: "full-back", colours: 1 }]);
    expect((await post(acceptRoute, quote.id, { fullName: "Cass Mill", confirmed: true, link: r.linkToken }, "10.88.0.4")).status).toBe(201);
    const answer = await post(checkoutRoute, quote.id, { kind: "deposit", link: r.linkToken }, "10.88.0.4");
    expect(answer.status).toBe(200);
    expect(await db.select().from(payments).where(eq(payments.quoteId, quote.id))).toHaveLength(1);
  });

  it("a second proof of the job counts too: its approved back print holds the quote", async () => {
    const r = await fresh();
    const second = await insertProof(shop.id, r.jobId, `Mill back ${tag}-${count}`, r.artworkId, owner.id);
    await addPrint(second, "full-back", r.spareArtworkId);
    const letter = await resend(second);
    await approve(second, letter);
    const answer = await post(checkoutRoute, r.quoteId, { kind: "full", link: r.linkToken }, "10.88.0.5");
    expect(answer.status).toBe(409);
    expect(await db.select().from(payments).where(eq(payments.quoteId, r.quoteId))).toHaveLength(0);
    // The accepted quote itself is untouched.
    expect((await db.select({ state: quotes.state }).from(quotes).where(eq(quotes.id, r.quoteId)))[0]?.state).toBe("accepted");
  });
});

describe("an accepted quote", () => {
  it("answers an accept as before, whatever the proofs show (accepting again changes nothing)", async () => {
    const r = await fresh();
    await addPrint(r.proofId, "full-back", r.spareArtworkId);
    await resend(r.proofId);
    const answer = await post(acceptRoute, r.quoteId, { fullName: "Cass Mill", confirmed: true, link: r.linkToken }, "10.88.0.6");
    expect(answer.status).toBe(200);
    expect(await answer.json()).toEqual({ ok: true, already: true });
    expect(await heldEntries(r.jobId)).toHaveLength(0);
  });
});
