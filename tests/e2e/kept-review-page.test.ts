/**
 * Review pages kept per link and state, tried over HTTP against the running build as a visitor
 * would: a second visit is answered from the kept page with its own fresh nonce (the policy is as
 * strict as a render's), anything that changes on the page (a note, a resolved note, a decision
 * on the link, a withdrawn link) is seen on the very next visit, whichever process made the change
 * (here: the database written directly), and the kept page runs in Chromium with no policy
 * violation. The shop, proof and link are this file's own.
 */
import { randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import { eq } from "drizzle-orm";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, getPool } from "@/db/client";
import { addComment, revokeShareLink, setCommentResolved } from "@/db/queries/review";
import { createShopWithOwner } from "@/db/queries/shops";
import { shareLinks, shops } from "@/db/schema";
import { buildShopRecords, type ShopRecords } from "@/tests/authz/fixtures";
import { BASE_URL, launch, newContext, watchCsp } from "./support";

let records: ShopRecords;
let shopId: string;
let ownerId: string;
let tag: string;
let browser: Browser | undefined;

beforeAll(async () => {
  tag = randomBytes(3).toString("hex");
  const made = await createShopWithOwner({
    shopName: `Keepsake Press ${tag}`,
    name: "Ilse Marrow",
    email: `ilse-${tag}@keepsake-press.test`,
    passwordHash: await bcrypt.hash(`keepsake-${tag}-password`, 10),
  });
  ownerId = made.userId;
  const [shop] = await db.select({ id: shops.id }).from(shops).where(eq(shops.slug, made.shopSlug));
  shopId = shop!.id;
  records = await buildShopRecords({ shopId, ownerId, tag });
});
afterAll(async () => {
  await browser?.close();
  if (shopId) await db.delete(shops).where(eq(shops.id, shopId));
  await getPool().end();
});

type Visit = { status: number; state: string | null; nonce: string; body: string };

async function visit(path = `/r/${records.linkToken}`): Promise<Visit> {
  const response = await fetch(new URL(path, BASE_URL), { headers: { accept: "text/html" }, redirect: "manual" });
  const csp = response.headers.get("content-security-policy") ?? "";
  return { status: response.status, state: response.headers.get("x-review-page"), nonce: /'nonce-([^']+)'/.exec(csp)?.[1] ?? "", body: await response.text() };
}

/** Every nonce the page's scripts carry. */
function scriptNonces(html: string): Set<string> {
  return new Set([...html.matchAll(/<script\b[^>]*\bnonce="([^"]+)"/g)].map((m) => m[1]!));
}

describe("a review link's page kept per state", () => {
  it("answers a second visit from the kept page, with that answer's own nonce on every script", async () => {
    // The link's first visit writes the view down, which is a new state of the page.
    await visit();
    const first = await visit();
    const second = await visit();
    expect(first.status).toBe(200);
    expect(second.status).toBe(200);
    expect(second.state).toBe("kept");
    expect(second.nonce).not.toBe("");
    expect(second.nonce).not.toBe(first.nonce);
    expect([...scriptNonces(second.body)]).toEqual([second.nonce]);
    expect([...scriptNonces(first.body)]).toEqual([first.nonce]);
    // Nothing of the first answer's nonce, nor any stand-in, is left in the second.
    expect(second.body.includes(first.nonce)).toBe(false);
    expect(second.body.replaceAll(second.nonce, "N")).toBe(first.body.replaceAll(first.nonce, "N"));
    expect(second.body).toContain(`Mill front ${tag}`);
  });

  it("shows a note posted through the page's own route on the next visit", async () => {
    await visit();
    const body = `Move it up a finger ${tag}`;
    const posted = await fetch(new URL(`/api/review/link/${records.linkToken}/comments`, BASE_URL), {
      method: "POST",
      headers: { "content-type": "application/json", origin: BASE_URL },
      body: JSON.stringify({ body, side: "front", xIn: 0, yIn: 4, authorName: "Cass Mill" }),
    });
    expect(posted.status).toBe(201);
    const next = await visit();
    expect(next.state).toBe("rendered");
    expect(next.body).toContain(body);
    const again = await visit();
    expect(again.state).toBe("kept");
    expect(again.body).toContain(body);
  });

  it("sees what another process wrote to the database: a new note, then that note resolved", async () => {
    await visit();
    const body = `Written elsewhere ${tag}`;
    const note = await addComment({ proofId: records.proofId, revisionLetter: "A", side: "front", xIn: 1, yIn: 5, body, authorName: "Cass Mill", authorRole: "client" });
    const withNote = await visit();
    expect(withNote.state).toBe("rendered");
    expect(withNote.body).toContain(body);
    const kept = await visit();
    expect(kept.state).toBe("kept");
    await setCommentResolved({ proofId: records.proofId, commentId: note.id, resolved: true, by: ownerId });
    const resolved = await visit();
    expect(resolved.state).toBe("rendered");
    expect(resolved.body.replaceAll(resolved.nonce, "N")).not.toBe(kept.body.replaceAll(kept.nonce, "N"));
  });

  it("writes the visit down on a kept answer as a render does", async () => {
    await visit();
    await db.update(shareLinks).set({ lastSeenAt: new Date(Date.now() - 3_600_000) }).where(eq(shareLinks.id, records.linkId));
    const seen = await visit();
    expect(seen.state).toBe("kept");
    const [link] = await db.select({ lastSeenAt: shareLinks.lastSeenAt }).from(shareLinks).where(eq(shareLinks.id, records.linkId));
    expect(Date.now() - link!.lastSeenAt!.getTime()).toBeLessThan(60_000);
  });

  it("runs the kept page in Chromium without a policy violation", async () => {
    await visit();
    browser = await launch();
    const context = await newContext(browser);
    const violations = await watchCsp(context);
    const page = await context.newPage();
    const response = await page.goto(`/r/${records.linkToken}`);
    expect(response?.headers()["x-review-page"]).toBe("kept");
    await page.locator("[data-testid=review][data-hydrated=true]").waitFor();
    expect(violations).toEqual([]);
    await context.close();
  });

  it("never keeps a page with a query, and is not reachable from outside", async () => {
    const fresh = await visit(`/r/${records.linkToken}?view=fresh`);
    expect(fresh.status).toBe(200);
    expect(fresh.state).toBeNull();
    const direct = await fetch(new URL(`/api/review-page/${records.linkToken}`, BASE_URL), { headers: { "x-nonce": "AAAAAAAAAAAAAAAAAAAAAA==", "x-chalkline-kept": "guess" } });
    expect(direct.status).toBe(404);
  });

  it("stops answering the moment the link is withdrawn", async () => {
    expect((await visit()).status).toBe(200);
    await revokeShareLink({ shopId, linkId: records.linkId, userId: ownerId });
    const gone = await visit();
    expect(gone.status).toBe(404);
    expect(gone.body).not.toContain(`Mill front ${tag}`);
  });
});
