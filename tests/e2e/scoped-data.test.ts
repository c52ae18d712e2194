/**
 * Regression tests from the outside, against the running build: what a client may reach of a
 * shop's art, what a review page names, a grading save aimed at another job's print, and a save
 * whose answer was lost. Each test makes its own shop; nothing of the demo is touched.
 */
import { randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, getPool } from "@/db/client";
import { createClient } from "@/db/queries/clients";
import { getProofDocument } from "@/db/queries/proofs";
import { createShareLink, sendRevision } from "@/db/queries/review";
import { createShopWithOwner } from "@/db/queries/shops";
import { createUser, markEmailVerified } from "@/db/queries/users";
import { shops } from "@/db/schema";
import { buildShopRecords, insertArt, insertProof, type ShopRecords } from "@/tests/authz/fixtures";
import { callAction } from "./actions-http";
import { BASE_URL, signInOverHttp } from "./support";

const tag = randomBytes(3).toString("hex");
const PASSWORD = `scoped-${tag}-password`;
let shop: { id: string; slug: string };
let ownerEmail = "";
let ownerId = "";
let records: ShopRecords;
let second: ShopRecords;
let clientEmail = "";
/** Art of the shop filed under no client and placed nowhere. */
let unfiledArt = "";
let unfiledName = "";
/** Art of the shop filed under no client, placed on a revision sent to our client. */
let sentArt = "";

beforeAll(async () => {
  ownerEmail = `owner-${tag}@scoped.test`;
  const made = await createShopWithOwner({ shopName: `Scoped Prints ${tag}`, name: "Rune Aldo", email: ownerEmail, passwordHash: await bcrypt.hash(PASSWORD, 10) });
  const [row] = await db.select({ id: shops.id, slug: shops.slug }).from(shops).where(eq(shops.slug, made.shopSlug));
  shop = row!;
  ownerId = made.userId;
  await markEmailVerified({ userId: made.userId });
  records = await buildShopRecords({ shopId: shop.id, ownerId: made.userId, tag: `${tag}-a` });
  second = await buildShopRecords({ shopId: shop.id, ownerId: made.userId, tag: `${tag}-b` });

  // Our client's contact, with an account of her own.
  clientEmail = `contact-${tag}@scoped.test`;
  const user = await createUser({ email: clientEmail, name: "Esme Varga", passwordHash: await bcrypt.hash(PASSWORD, 10) });
  await markEmailVerified({ userId: user.id });
  const client = await createClient({ shopId: shop.id, actorUserId: made.userId, input: { name: `Scoped Choir ${tag}`, notes: null, taxExempt: false, contacts: [{ name: "Esme Varga", email: clientEmail, phone: null }] } });
  unfiledName = `Unfiled house mark ${tag}`;
  unfiledArt = await insertArt(shop.id, null, unfiledName);
  sentArt = await insertArt(shop.id, null, `Shared house mark ${tag}`);
  const { createJob } = await import("@/db/queries/jobs");
  const job = await createJob({
    shopId: shop.id,
    actorUserId: made.userId,
    input: { title: `Choir tees ${tag}`, clientId: client.id, dueDate: null, method: "dtg", blankId: "library-everyday-crew-tee", garmentColour: "Chalk", printLocations: [{ location: "full-front", colours: 1 }], dtfAreaIn2: null, rush: false, notes: null, sizeRun: [{ size: "M", quantity: 4 }] },
  });
  const proofId = await insertProof(shop.id, job.id, `Choir front ${tag}`, sentArt, made.userId);
  await sendRevision({ document: (await getProofDocument({ shopId: shop.id, proofId }))!, userId: made.userId });
});

afterAll(async () => {
  if (shop) await db.delete(shops).where(eq(shops.id, shop.id));
  await getPool().end();
});

describe("a client reaches only art meant for them", () => {
  it("shop art filed under no client and never sent to them answers 404; art placed on a revision sent to them answers 200", async () => {
    const cookie = await signInOverHttp(clientEmail, PASSWORD);
    const unfiled = await fetch(`${BASE_URL}/api/artworks/${unfiledArt}/preview`, { headers: { cookie } });
    expect(unfiled.status).toBe(404);
    const sent = await fetch(`${BASE_URL}/api/artworks/${sentArt}/svg`, { headers: { cookie } });
    expect(sent.status).toBe(200);
    // Another client's art of the same shop stays out of reach too.
    expect((await fetch(`${BASE_URL}/api/artworks/${records.artworkId}/preview`, { headers: { cookie } })).status).toBe(404);
  });

  it("a review page names the placed art only, never the rest of the shop's library", async () => {
    // Sent now, while the shop's library holds art that is not on this proof.
    const proofId = await insertProof(shop.id, records.jobId, `Mill back ${tag}`, records.artworkId, ownerId);
    await sendRevision({ document: (await getProofDocument({ shopId: shop.id, proofId }))!, userId: ownerId });
    const { token } = await createShareLink({ shopId: shop.id, proofId, permission: "comment", expiresAt: null, recipientEmail: null, recipientName: null, createdBy: ownerId });
    const response = await fetch(`${BASE_URL}/r/${token}`);
    expect(response.status).toBe(200);
    const html = await response.text();
    expect(html).toContain(`Mill note ${tag}-a`);
    expect(html).not.toContain(unfiledName);
    expect(html).not.toContain(`Mill staff ${tag}-a`);
    expect(html).not.toContain(unfiledArt);
  });
});

describe("the grading save", () => {
  const file = "app/shops/[shop]/jobs/[jobId]/production/actions.ts";
  const grading = (jobId: string, placementId: string) => [{ shopSlug: shop.slug, jobId, placementId, transferCount: 1, assignment: { M: 10 }, totalShortfall: 0 }];

  it("refuses a print of another job, or one that does not exist, with 404; takes the job's own print", async () => {
    const cookie = await signInOverHttp(ownerEmail, PASSWORD);
    const pagePath = `/shops/${shop.slug}/jobs/${records.jobId}/production`;
    const foreign = await callAction({ file, name: "saveGradingAction", pagePath, args: grading(records.jobId, `matrix-${second.proofId}`), cookie });
    expect(foreign.result).toMatchObject({ ok: false, status: 404 });
    const missing = await callAction({ file, name: "saveGradingAction", pagePath, args: grading(records.jobId, `no-such-print-${tag}`), cookie });
    expect(missing.result).toMatchObject({ ok: false, status: 404 });
    const own = await callAction({ file, name: "saveGradingAction", pagePath, args: grading(records.jobId, `matrix-${records.proofId}`), cookie });
    expect(own.result).toMatchObject({ ok: true });
  });
});

describe("a save whose answer was lost", () => {
  const file = "app/shops/[shop]/proofs/[proofId]/actions.ts";

  it("is recognised as itself when retried with its key; another save from the old version is a conflict", async () => {
    const cookie = await signInOverHttp(ownerEmail, PASSWORD);
    const d = (await getProofDocument({ shopId: shop.id, proofId: second.proofId }))!;
    const doc = { size: d.proof.size, colourName: d.proof.colourName, colourHex: d.proof.colourHex, placements: d.placements.map((p) => ({ ...p, belowCollarIn: p.belowCollarIn + 0.5 })) };
    const pagePath = `/shops/${shop.slug}/proofs/${second.proofId}`;
    const saveKey = `retry-${tag}-0001`;
    const first = await callAction({ file, name: "saveProofAction", pagePath, args: [{ shopSlug: shop.slug, proofId: second.proofId, baseVersion: d.proof.version, doc, saveKey }], cookie });
    expect(first.result).toMatchObject({ ok: true, version: d.proof.version + 1 });
    // The same request again, as the editor retries after a lost answer.
    const retry = await callAction({ file, name: "saveProofAction", pagePath, args: [{ shopSlug: shop.slug, proofId: second.proofId, baseVersion: d.proof.version, doc, saveKey }], cookie });
    expect(retry.result).toMatchObject({ ok: true, version: d.proof.version + 1 });
    // A different save from the same old version is someone else's: a conflict, and nothing changes.
    const other = await callAction({ file, name: "saveProofAction", pagePath, args: [{ shopSlug: shop.slug, proofId: second.proofId, baseVersion: d.proof.version, doc, saveKey: `other-${tag}-0002` }], cookie });
    expect(other.result).toMatchObject({ ok: false, kind: "conflict" });
    expect((await getProofDocument({ shopId: shop.id, proofId: second.proofId }))!.proof.version).toBe(d.proof.version + 1);
  });
});
