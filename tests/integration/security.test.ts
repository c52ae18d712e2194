import { NextRequest } from "next/server";
import { beforeAll, describe, expect, it } from "vitest";
import { Pool } from "pg";
import { authCookies, getAuthOptions, SIGN_IN_LIMIT_MESSAGE, usesSecureCookies } from "@/app/_server/auth";
import { LIMITS, takeLimits } from "@/app/_server/rate-limit";
import { POST as postAuth } from "@/app/api/auth/[...nextauth]/route";
import { GET as getComments, POST as postComment } from "@/app/api/review/[kind]/[key]/comments/route";
import { POST as postDecision } from "@/app/api/review/[kind]/[key]/decision/route";
import { consumeLimit, usedLimit } from "@/db/queries/limits";
import { createShareLink } from "@/db/queries/review";
import { shopFactory } from "@/tests/support/factory";
import { noteOnFailure } from "@/tests/support/failure-notes";

const shops = shopFactory("security");
let commentToken = "";
let approveToken = "";

beforeAll(async () => {
  const s = await shops.build({ sent: true });
  const base = { shopId: s.shop.id, proofId: s.proof.id, expiresAt: null, recipientEmail: null, recipientName: null, createdBy: s.owner.id };
  commentToken = (await createShareLink({ ...base, permission: "comment" })).token;
  approveToken = (await createShareLink({ ...base, permission: "approve" })).token;
});

const params = (kind: string, key: string) => ({ params: Promise.resolve({ kind, key }) });

function post(path: string, ip: string, body: unknown = {}) {
  return new Request(`http://localhost${path}`, {
    method: "POST",
    // The client address as scripts/serve.ts hands it on (the integration project runs as if behind it).
    headers: { "content-type": "application/json", "x-chalkline-client-address": ip },
    body: JSON.stringify(body),
  });
}

describe("rate limits on the public review endpoints", () => {
  it("answers 429 with a plain message after 12 notes at once from one link and address", async () => {
    const path = `/api/review/link/${commentToken}/comments`;
    // Empty notes are refused (400) after the limit is counted, so nothing is stored on the way.
    for (let i = 0; i < 12; i += 1) expect((await postComment(post(path, "198.51.100.7"), params("link", commentToken))).status).toBe(400);
    const limited = await postComment(post(path, "198.51.100.7"), params("link", commentToken));
    expect(limited.status).toBe(429);
    expect(await limited.json()).toEqual({ error: "That is a lot of notes at once. Wait a minute and try again." });
    // Another address on the same link is counted on its own, and reading is never limited.
    expect((await postComment(post(path, "198.51.100.8"), params("link", commentToken))).status).toBe(400);
    expect((await getComments(new Request(`http://localhost${path}`), params("link", commentToken))).status).toBe(200);
  });

  it("answers 429 after six decisions at once", async () => {
    const path = `/api/review/link/${approveToken}/decision`;
    for (let i = 0; i < 6; i += 1) expect((await postDecision(post(path, "198.51.100.9"), params("link", approveToken))).status).toBe(400);
    const limited = await postDecision(post(path, "198.51.100.9"), params("link", approveToken));
    expect(limited.status).toBe(429);
    expect(await limited.json()).toEqual({ error: "Too many tries. Wait a minute and try again." });
  });
});

function credentials(ip: string, type: string, body: string) {
  const request = new NextRequest("http://localhost/api/auth/callback/credentials", { method: "POST", headers: { "content-type": type, "x-chalkline-client-address": ip }, body });
  return postAuth(request, { params: Promise.resolve({ nextauth: ["callback", "credentials"] }) });
}

describe("password sign-in limit", () => {
  it("answers 429 with the message the sign-in form shows once an address has used its attempts", async () => {
    const ip = "198.51.100.20";
    noteOnFailure("sign-in limit address", ip);
    for (let i = 0; i < 10; i += 1) expect(await takeLimits({ rule: LIMITS.signInAddress, subject: ip })).toEqual({ ok: true });
    const response = await credentials(ip, "application/x-www-form-urlencoded", new URLSearchParams({ email: `Limit-${Date.now()}@Chalkline.test`, password: "x", json: "true" }).toString());
    expect(response.status).toBe(429);
    expect(Number(response.headers.get("retry-after"))).toBeGreaterThan(500);
    const body = (await response.json()) as { error: string; url: string };
    expect(body.error).toBe(SIGN_IN_LIMIT_MESSAGE);
    expect(new URL(body.url).searchParams.get("error")).toBe(SIGN_IN_LIMIT_MESSAGE);
    // The same as JSON.
    expect((await credentials(ip, "application/json", JSON.stringify({ email: "someone@chalkline.test", password: "x" }))).status).toBe(429);
  });

  it("refuses with 415 any content type but a plain form or JSON, whatever its parameters claim", async () => {
    const body = JSON.stringify({ "a&=": "1", email: "owner@chalkline.test", password: "x" });
    for (const type of ["application/x-www-form-urlencoded; x=application/json", "application/json; x=application/x-www-form-urlencoded", "text/plain", "application/json;charset=latin1", "application/x-www-form-urlencoded;"]) {
      expect((await credentials("198.51.100.21", type, body)).status, type).toBe(415);
    }
    // Nothing was counted for them.
    expect(await usedLimit({ rule: LIMITS.signInAddress, subject: "198.51.100.21" })).toBe(0);
  });
});

describe("shared limit store", () => {
  it("a limit reached through one process's pool holds for another process's pool on the same database", async () => {
    const subject = `shared-${Date.now()}`;
    for (let i = 0; i < LIMITS.signInAddress.points; i += 1) expect((await consumeLimit({ rule: LIMITS.signInAddress, subject })).allowed).toBe(true);
    const second = new Pool({ connectionString: process.env.DATABASE_URL, max: 2 });
    try {
      expect(await consumeLimit({ rule: LIMITS.signInAddress, subject, pool: second })).toMatchObject({ allowed: false });
      // And a point taken there is seen here.
      const other = `shared-other-${Date.now()}`;
      await consumeLimit({ rule: LIMITS.signInAddress, subject: other, pool: second });
      expect(await usedLimit({ rule: LIMITS.signInAddress, subject: other })).toBe(1);
    } finally {
      await second.end();
    }
  });

  it("spraying over 50,000 other subjects does not reset an address that reached its limit", async () => {
    const ip = "198.51.100.30";
    for (let i = 0; i < LIMITS.signInAddress.points; i += 1) await consumeLimit({ rule: LIMITS.signInAddress, subject: ip });
    const stamp = Date.now();
    const subjects = Array.from({ length: 50_001 }, (_, i) => `spray-${stamp}-${i}@nowhere.test`);
    // Ten at a time, as many connections as the app's pool has.
    for (let i = 0; i < subjects.length; i += 10) await Promise.all(subjects.slice(i, i + 10).map((subject) => consumeLimit({ rule: LIMITS.signInAccount, subject })));
    expect(await consumeLimit({ rule: LIMITS.signInAddress, subject: ip })).toMatchObject({ allowed: false });
  }, 300_000);
});

describe("session cookies", () => {
  it("are Secure with the __Secure- and __Host- prefixes when the app is served over https, and httpOnly + SameSite=Lax always", () => {
    expect(usesSecureCookies({ NEXTAUTH_URL: "https://proofs.example.test" })).toBe(true);
    expect(usesSecureCookies({ APP_URL: "https://proofs.example.test" })).toBe(true);
    expect(usesSecureCookies({ NEXTAUTH_URL: "http://localhost:3000" })).toBe(false);
    const secure = authCookies(true);
    expect(secure.sessionToken!.name).toBe("__Secure-next-auth.session-token");
    expect(secure.callbackUrl!.name).toBe("__Secure-next-auth.callback-url");
    expect(secure.csrfToken!.name).toBe("__Host-next-auth.csrf-token");
    for (const cookie of [secure.sessionToken!, secure.csrfToken!, secure.callbackUrl!]) {
      expect(cookie.options).toMatchObject({ httpOnly: true, sameSite: "lax", secure: true, path: "/" });
    }
    const plain = authCookies(false);
    expect(plain.sessionToken).toEqual({ name: "next-auth.session-token", options: { httpOnly: true, sameSite: "lax", secure: false, path: "/" } });
    // The options in use follow the app's URL (http in tests).
    const options = getAuthOptions();
    expect(options.useSecureCookies).toBe(usesSecureCookies());
    expect(options.cookies).toEqual(authCookies(usesSecureCookies()));
  });
});
