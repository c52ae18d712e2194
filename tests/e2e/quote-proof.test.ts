/**
 * The quote follows the proof, over HTTP against the production build: in a shop of our own, the
 * client's approved proof prints on the full front and the full back while the accepted quote
 * bills the front only. A review link trying to pay gets 409 in words and no payment row; accepting
 * a new short quote is refused the same way; the owner's job page says why and links to the job's
 * print locations.
 */
import { randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { findQuote, sendQuote } from "@/db/queries/orders";
import { getProofDocument } from "@/db/queries/proofs";
import { recordDecision, sendRevision } from "@/db/queries/review";
import { createShopWithOwner } from "@/db/queries/shops";
import { markEmailVerified } from "@/db/queries/users";
import { auditLog, payments, placements, proofs, shops } from "@/db/schema";
import { DEFAULT_PRICE_MATRIX } from "@/lib/pricing";
import { quoteJob } from "@/lib/quotes";
import { buildShopRecords, jobFormInput, type ShopRecords } from "@/tests/authz/fixtures";
import { BASE_URL, fetchFrom, signInOverHttp } from "./support";

const tag = randomBytes(3).toString("hex");
const password = `quote-proof-${tag}-password`;
const email = `quote-proof-${tag}@ridge-prints.test`;
let shop: { id: string; slug: string };
let ownerId: string;
let records: ShopRecords;
const title = () => `Mill choir tees ${tag}`;

async function post(path: string, body: unknown, ip: string) {
  // `ip`: the loopback address the request comes from, so each step has its own per-address limits.
  const response = await fetchFrom(ip, `${BASE_URL}${path}`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  return { status: response.status, type: response.headers.get("content-type") ?? "", body: (await response.json().catch(() => null)) as { error?: string; url?: string } | null };
}

beforeAll(async () => {
  const created = await createShopWithOwner({ shopName: `Ridge Quote Prints ${tag}`, name: "Odile Marsh", email, passwordHash: await bcrypt.hash(password, 10) });
  // Signed up and opened the e-mailed link, so the password works.
  await markEmailVerified({ userId: created.userId });
  const [row] = await db.select({ id: shops.id, slug: shops.slug }).from(shops).where(eq(shops.slug, created.shopSlug));
  shop = row!;
  ownerId = created.userId;
  records = await buildShopRecords({ shopId: shop.id, ownerId, tag });
  // The proof (revision A sent, front only) gains a full back print, is sent as revision B and approved.
  await db.insert(placements).values({ id: `e2e-back-${records.proofId}`, proofId: records.proofId, location: "full-back", artworkId: records.spareArtworkId, widthIn: 11, heightIn: 9, offsetFromCenterIn: 0, belowCollarIn: 4, rotationDeg: 0, sortOrder: 1 });
  await db.update(proofs).set({ revision: "B" }).where(eq(proofs.id, records.proofId));
  const document = await getProofDocument({ shopId: shop.id, proofId: records.proofId });
  await sendRevision({ document: document!, userId: ownerId });
  const approved = await recordDecision({ proofId: records.proofId, letter: "B", decision: "approved", fullName: "Cass Mill", statement: "I approve this proof.", comment: null, ip: "127.0.0.1", userAgent: "quote-proof e2e", shareLinkId: null, userId: null });
  expect(approved.ok).toBe(true);
});

describe("a client paying for fewer locations than the approved proof", () => {
  it("checking out through the review link answers 409 with words, starts no payment and tells the shop", async () => {
    for (const kind of ["deposit", "full"]) {
      const answer = await post(`/api/quotes/${records.quoteId}/checkout`, { kind, link: records.linkToken }, "127.0.91.1");
      expect(answer.status).toBe(409);
      expect(answer.type).toContain("application/json");
      expect(answer.body?.error).toBe("The print shop is updating this quote to match your proof, which also prints on the full back. No payment was started and nothing was charged; the shop will send you the updated quote.");
      expect(answer.body?.url).toBeUndefined();
    }
    expect(await db.select().from(payments).where(eq(payments.quoteId, records.quoteId))).toHaveLength(0);
    const held = (await db.select().from(auditLog).where(eq(auditLog.shopId, shop.id))).filter((e) => e.action === "quote.held");
    expect(held).toHaveLength(1);
    expect(held[0]!.detail).toMatchObject({ quoteId: records.quoteId, missing: ["full back"], via: "checkout" });
  });

  it("the owner's job page says the quote out is held and links to the job's print locations", async () => {
    const cookie = await signInOverHttp(email, password);
    const response = await fetch(`${BASE_URL}/shops/${shop.slug}/jobs/${records.jobId}`, { headers: { cookie, accept: "text/html" } });
    expect(response.status).toBe(200);
    const html = await response.text();
    expect(html).toContain("bills fewer print locations than the proof the client was sent, so the client cannot accept or pay it.");
    expect(html).toContain("The proof prints on the full back, but the quote does not bill a full back print.");
    expect(html).toContain(`href="/shops/${shop.slug}/jobs/${records.jobId}/edit#print-locations"`);
    // The price today bills the front only as well, so sending is shut until the back is added.
    expect(html).toContain("This quote bills fewer print locations than the proofs show. Add them before sending.");
  });

  it("accepting a new quote that still bills the front only answers 409 and leaves it unaccepted", async () => {
    const input = { ...jobFormInput(title(), records.clientId), notes: null };
    const priced = quoteJob({ ...input, garmentName: "Everyday Crew Tee" }, DEFAULT_PRICE_MATRIX, { taxExempt: false });
    if (!priced.ok || !priced.snapshot) throw new Error(priced.ok ? "no snapshot" : priced.message);
    const quote = await sendQuote({ shopId: shop.id, jobId: records.jobId, snapshot: priced.snapshot, depositPercent: DEFAULT_PRICE_MATRIX.depositPercent, actorUserId: ownerId });

    const answer = await post(`/api/quotes/${quote.id}/accept`, { fullName: "Cass Mill", confirmed: true, link: records.linkToken }, "127.0.91.2");
    expect(answer.status).toBe(409);
    expect(answer.body?.error).toContain("The print shop is updating this quote to match your proof");
    expect((await findQuote({ quoteId: quote.id }))?.state).toBe("sent");
    const checkout = await post(`/api/quotes/${quote.id}/checkout`, { kind: "deposit", link: records.linkToken }, "127.0.91.2");
    expect(checkout.status).toBe(409);
    expect(await db.select().from(payments).where(eq(payments.jobId, records.jobId))).toHaveLength(0);
  });
});
