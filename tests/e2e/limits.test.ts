/**
 * Rate limits from the attacker's side, over HTTP against the production build. Each attacker or
 * owner is a loopback address of its own (127.0.0.0/8), which the app sees at the socket; the test
 * app trusts no proxy, so X-Forwarded-For is only something a client wrote.
 */
import { randomBytes } from "node:crypto";
import { readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import bcrypt from "bcryptjs";
import { eq } from "drizzle-orm";
import { Pool } from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, getPool } from "@/db/client";
import { sendQuote } from "@/db/queries/orders";
import { createShareLink } from "@/db/queries/review";
import { createShopWithOwner } from "@/db/queries/shops";
import { markEmailVerified } from "@/db/queries/users";
import { approvals, quotes, shops } from "@/db/schema";
import { DEFAULT_PRICE_MATRIX } from "@/lib/pricing";
import { quoteJob } from "@/lib/quotes";
import { buildShopRecords, jobFormInput, type ShopRecords } from "@/tests/authz/fixtures";
import { BASE_URL, fetchFrom, firstLink, signInOverHttp, waitForMail } from "./support";

const repoRoot = fileURLToPath(new URL("../..", import.meta.url));
const tag = randomBytes(3).toString("hex");
const password = `limits-${tag}-password`;
const ownerEmail = `limits-owner-${tag}@bramble-print.test`;
let shop: { id: string; slug: string };
let ownerId: string;
let records: ShopRecords;

type Jar = Map<string, string>;
function absorb(jar: Jar, response: Response) {
  for (const line of response.headers.getSetCookie()) {
    const [pair] = line.split(";");
    const at = pair!.indexOf("=");
    jar.set(pair!.slice(0, at), pair!.slice(at + 1));
  }
}
const cookieOf = (jar: Jar) => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");

/** A CSRF token and its cookie, fetched from `from`, as next-auth's client does before posting. */
async function csrf(from: string): Promise<{ token: string; jar: Jar }> {
  const jar: Jar = new Map();
  const response = await fetchFrom(from, "/api/auth/csrf");
  absorb(jar, response);
  return { token: ((await response.json()) as { csrfToken: string }).csrfToken, jar };
}

/** One password attempt from `from`, as a form or as JSON. */
async function attempt(from: string, email: string, secret: string, encoding: "form" | "json" = "form"): Promise<Response> {
  const { token, jar } = await csrf(from);
  const fields = { email, password: secret, csrfToken: token, json: "true", callbackUrl: `${BASE_URL}/home` };
  return fetchFrom(from, "/api/auth/callback/credentials", {
    method: "POST",
    headers: { cookie: cookieOf(jar), "content-type": encoding === "form" ? "application/x-www-form-urlencoded" : "application/json" },
    body: encoding === "form" ? new URLSearchParams(fields).toString() : JSON.stringify(fields),
  });
}

/** Asks for a sign-in link from `from`. */
async function askForLink(from: string, email: string): Promise<Response> {
  const { token, jar } = await csrf(from);
  return fetchFrom(from, "/api/auth/signin/email", {
    method: "POST",
    headers: { cookie: cookieOf(jar), "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ email, csrfToken: token, json: "true", callbackUrl: `${BASE_URL}/home` }).toString(),
  });
}

beforeAll(async () => {
  const created = await createShopWithOwner({ shopName: `Bramble Limit Prints ${tag}`, name: "Wren Halloway", email: ownerEmail, passwordHash: await bcrypt.hash(password, 10) });
  // The owner proved the address (opened the link sign-up sent), so the password signs in.
  await markEmailVerified({ userId: created.userId });
  const [row] = await db.select({ id: shops.id, slug: shops.slug }).from(shops).where(eq(shops.slug, created.shopSlug));
  shop = row!;
  ownerId = created.userId;
  records = await buildShopRecords({ shopId: shop.id, ownerId, tag });
});

afterAll(async () => {
  await getPool().end();
});

describe("password sign-in limits", () => {
  it("refuses a content type with a smuggled parameter (415), and the 11th wrong password from one address gets 429 as a form or as JSON", async () => {
    const from = "127.0.50.1";
    // A JSON object whose first key holds "&=": read as a form it has no e-mail; as JSON it has one.
    const { token, jar } = await csrf(from);
    const smuggled = await fetchFrom(from, "/api/auth/callback/credentials", {
      method: "POST",
      headers: { cookie: cookieOf(jar), "content-type": "application/x-www-form-urlencoded; x=application/json" },
      body: JSON.stringify({ "a&=": "1", email: ownerEmail, password: "not-the-password", csrfToken: token, json: "true" }),
    });
    expect(smuggled.status).toBe(415);
    for (const type of ["text/plain", "application/json; x=application/x-www-form-urlencoded", "multipart/form-data; boundary=x", "application/jsonx"]) {
      const other = await fetchFrom(from, "/api/auth/callback/credentials", { method: "POST", headers: { cookie: cookieOf(jar), "content-type": type }, body: "{}" });
      expect(other.status, type).toBe(415);
    }

    for (let i = 0; i < 10; i += 1) {
      const response = await attempt(from, ownerEmail, "not-the-password", i % 2 ? "json" : "form");
      expect(response.status, await response.text()).toBe(401);
    }
    for (const encoding of ["form", "json"] as const) {
      const limited = await attempt(from, ownerEmail, "not-the-password", encoding);
      expect(limited.status).toBe(429);
      expect(Number(limited.headers.get("retry-after"))).toBeGreaterThan(0);
      expect(await limited.json()).toMatchObject({ error: "Too many sign-in attempts. Wait a few minutes and try again, or sign in with an e-mail link." });
    }
    // The right password from the limited address is refused too: the limit is not advice.
    const right = await attempt(from, ownerEmail, password);
    expect(right.status).toBe(429);
    expect(right.headers.getSetCookie().some((c) => c.includes("session-token="))).toBe(false);
  });

  it("wrong passwords from one address do not stop the owner signing in from another", async () => {
    for (let i = 0; i < 10; i += 1) expect((await attempt("127.0.51.1", ownerEmail, `guess-${i}`)).status).toBe(401);
    expect((await attempt("127.0.51.1", ownerEmail, "guess-x")).status).toBe(429);
    const cookie = await signInOverHttp(ownerEmail, password, "127.0.51.2");
    expect(cookie).toContain("session-token=");
  });

  it("counts every e-mail an address sprays at, so new e-mails never start it afresh", async () => {
    const from = "127.0.55.1";
    for (let i = 0; i < 10; i += 1) expect((await attempt(from, `spray-${tag}-${i}@nowhere.test`, "guess")).status).toBe(401);
    for (let i = 10; i < 60; i += 1) expect((await attempt(from, `spray-${tag}-${i}@nowhere.test`, "guess")).status).toBe(429);
  });

  it("holds a limit reached over HTTP when another process checks it: the counters are in PostgreSQL", async () => {
    // This test process is a second process with its own connection pool.
    const { LIMITS } = await import("@/app/_server/rate-limit");
    const { consumeLimit, usedLimit } = await import("@/db/queries/limits");
    const second = new Pool({ connectionString: process.env.DATABASE_URL, max: 1 });
    try {
      expect(await usedLimit({ rule: LIMITS.signInAddress, subject: "127.0.55.1", pool: second })).toBeGreaterThanOrEqual(10);
      expect(await consumeLimit({ rule: LIMITS.signInAddress, subject: "127.0.55.1", pool: second })).toMatchObject({ allowed: false });
    } finally {
      await second.end();
    }
  });

  it("limits an account tried from many addresses, and its owner still gets in with an e-mail link", async () => {
    const email = `limits-linked-${tag}@bramble-print.test`;
    const created = await createShopWithOwner({ shopName: `Bramble Link Prints ${tag}`, name: "Ivo Sandal", email, passwordHash: await bcrypt.hash(password, 10) });
    await markEmailVerified({ userId: created.userId });
    expect(created.userId).toBeTruthy();
    // Five addresses, ten wrong passwords each: every one of them is a 401, none is locked yet.
    for (let a = 1; a <= 5; a += 1) {
      for (let i = 0; i < 10; i += 1) expect((await attempt(`127.0.57.${a}`, email, `guess-${a}-${i}`)).status).toBe(401);
    }
    // The account has had its fifty: a sixth address is refused, and so is the right password.
    expect((await attempt("127.0.57.6", email, "guess-6")).status).toBe(429);
    expect((await attempt("127.0.57.7", email, password)).status).toBe(429);
    // The e-mail link is not counted with passwords: the owner asks for one and signs in with it.
    const since = Date.now();
    const asked = await askForLink("127.0.57.8", email);
    expect(asked.status, await asked.clone().text()).toBe(200);
    expect(((await asked.json()) as { url: string }).url).not.toContain("error=");
    const mail = await waitForMail(email, /sign-in link/i, since - 1000);
    const link = firstLink(mail.text, "/api/auth/callback/email").replace(/^https?:\/\/[^/]+/, BASE_URL);
    const jar: Jar = new Map();
    const followed = await fetchFrom("127.0.57.8", link);
    absorb(jar, followed);
    const session = (await (await fetchFrom("127.0.57.8", "/api/auth/session", { headers: { cookie: cookieOf(jar) } })).json()) as { user?: { email?: string } };
    expect(session.user?.email).toBe(email);
  });
});

describe("sign-in link limits", () => {
  it("answers 429 past five links for one recipient, and past twenty from one address", async () => {
    for (let i = 0; i < 5; i += 1) expect((await askForLink(`127.0.53.${i + 1}`, ownerEmail)).status).toBe(200);
    const perRecipient = await askForLink("127.0.53.9", ownerEmail);
    expect(perRecipient.status).toBe(429);
    expect(await perRecipient.json()).toMatchObject({ error: "Too many sign-in links asked for. Wait a while and try again, or use your password." });

    for (let i = 0; i < 20; i += 1) expect((await askForLink("127.0.54.1", `nobody-${tag}-${i}@nowhere.test`)).status).toBe(200);
    expect((await askForLink("127.0.54.1", `nobody-${tag}-x@nowhere.test`)).status).toBe(429);
  });
});

/** The build's action id for accepting an invitation, as the browser would send it. */
function acceptActionId(): string {
  const manifest = JSON.parse(readFileSync(path.join(repoRoot, ".next", "server", "server-reference-manifest.json"), "utf8")) as { node: Record<string, { exportedName?: string; filename?: string }> };
  const found = Object.entries(manifest.node).find(([, e]) => e.exportedName === "acceptInvitationAction");
  if (!found) throw new Error("the build lists no acceptInvitationAction");
  return found[0];
}

function postAccept(from: string, token: string, headers: Record<string, string> = {}): Promise<Response> {
  return fetchFrom(from, `/invite/${token}`, {
    method: "POST",
    headers: { "next-action": acceptActionId(), "content-type": "text/plain;charset=UTF-8", accept: "text/x-component", origin: new URL(BASE_URL).origin, ...headers },
    body: JSON.stringify([{ token, name: "Tam Reed", password: "a-long-enough-password" }]),
  });
}

async function acceptInvite(from: string, token: string): Promise<string> {
  const response = await postAccept(from, token);
  expect(response.status).toBe(200);
  return response.text();
}

describe("invitation accept limits", () => {
  it("refuses past five tries with one invitation, and past twenty from one address", async () => {
    const token = `no-such-invitation-${tag}-0000000000`;
    for (let i = 0; i < 5; i += 1) expect(await acceptInvite(`127.0.58.${i + 1}`, token)).not.toContain("Too many tries with invitations");
    expect(await acceptInvite("127.0.58.9", token)).toContain("Too many tries with invitations");

    for (let i = 0; i < 20; i += 1) expect(await acceptInvite("127.0.59.1", `no-such-invitation-${tag}-${i}-000000000`)).not.toContain("Too many tries with invitations");
    expect(await acceptInvite("127.0.59.1", `no-such-invitation-${tag}-x-000000000`)).toContain("Too many tries with invitations");
  });
});

describe("forwarded addresses from clients", () => {
  it("ignores an X-Forwarded-Host a client wrote: an action posted from another origin that claims to be that host does not run", async () => {
    const token = `no-such-invitation-${tag}-host-0000000`;
    // The same call from our own origin runs and says the invitation is not valid.
    expect(await (await postAccept("127.0.61.1", token)).text()).toContain("This invitation link is not valid.");
    const forged = await postAccept("127.0.61.2", token, { origin: "http://elsewhere.test", "x-forwarded-host": "elsewhere.test" });
    expect(forged.status).not.toBe(200);
    expect(await forged.text()).not.toContain("This invitation link is not valid.");
  });

  it("rotating X-Forwarded-For does not reset the note limit", async () => {
    const { token } = await createShareLink({ shopId: shop.id, proofId: records.proofId, permission: "comment", expiresAt: null, recipientEmail: null, recipientName: null, createdBy: ownerId });
    const note = (i: number) =>
      fetchFrom("127.0.52.1", `/api/review/link/${token}/comments`, {
        method: "POST",
        // An empty note is refused (400) after the limit has counted it, so nothing is stored or e-mailed.
        headers: { "content-type": "application/json", "x-forwarded-for": `203.0.113.${i + 1}`, "x-real-ip": `198.51.100.${i + 1}`, "x-chalkline-client-address": `192.0.2.${i + 1}` },
        body: JSON.stringify({ body: "" }),
      });
    for (let i = 0; i < 12; i += 1) expect((await note(i)).status).toBe(400);
    for (let i = 12; i < 18; i += 1) expect((await note(i)).status).toBe(429);
  });

  it("keeps the socket's address with an approval and a quote acceptance, not the one the client wrote", async () => {
    const decided = await fetchFrom("127.0.56.1", `/api/review/link/${records.linkToken}/decision`, {
      method: "POST",
      headers: { "content-type": "application/json", "x-forwarded-for": "203.0.113.77", "x-chalkline-client-address": "192.0.2.77" },
      body: JSON.stringify({ decision: "approved", letter: "A", fullName: "Cass Mill", confirmed: true }),
    });
    expect(decided.status, await decided.clone().text()).toBe(201);
    const { approvalId } = (await decided.json()) as { approvalId: string };
    const [approval] = await db.select({ ip: approvals.ip }).from(approvals).where(eq(approvals.id, approvalId));
    expect(approval?.ip).toBe("127.0.56.1");

    const input = { ...jobFormInput(`Mill choir tees ${tag}`, records.clientId), notes: null };
    const priced = quoteJob({ ...input, garmentName: "Everyday Crew Tee" }, DEFAULT_PRICE_MATRIX, { taxExempt: false });
    if (!priced.ok || !priced.snapshot) throw new Error(priced.ok ? "no snapshot" : priced.message);
    const quote = await sendQuote({ shopId: shop.id, jobId: records.jobId, snapshot: priced.snapshot, depositPercent: DEFAULT_PRICE_MATRIX.depositPercent, actorUserId: ownerId });
    const accepted = await fetchFrom("127.0.56.2", `/api/quotes/${quote.id}/accept`, {
      method: "POST",
      headers: { "content-type": "application/json", "x-forwarded-for": "203.0.113.78" },
      body: JSON.stringify({ fullName: "Cass Mill", confirmed: true, link: records.linkToken }),
    });
    expect(accepted.status, await accepted.clone().text()).toBe(201);
    const [row] = await db.select({ ip: quotes.acceptedIp }).from(quotes).where(eq(quotes.id, quote.id));
    expect(row?.ip).toBe("127.0.56.2");
  });
});
