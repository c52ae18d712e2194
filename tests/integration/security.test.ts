import { randomBytes } from "node:crypto";
import { NextRequest } from "next/server";
import { beforeAll, describe, expect, it } from "vitest";
import { authCookies, getAuthOptions, SIGN_IN_LIMIT_MESSAGE, takeSignInAttempt, usesSecureCookies } from "@/app/_server/auth";
import { POST as postAuth } from "@/app/api/auth/[...nextauth]/route";
import { GET as getComments, POST as postComment } from "@/app/api/review/[kind]/[key]/comments/route";
import { POST as postDecision } from "@/app/api/review/[kind]/[key]/decision/route";
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
    headers: { "content-type": "application/json", "x-forwarded-for": ip },
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

describe("password sign-in limit", () => {
  it("answers 429 with the message the sign-in form shows once an address has used its attempts", async () => {
    const email = `Limit-${randomBytes(4).toString("hex")}@Chalkline.test`;
    noteOnFailure("sign-in limit address", email);
    for (let i = 0; i < 10; i += 1) expect(takeSignInAttempt(email)).toBe(true);
    const request = new NextRequest("http://localhost/api/auth/callback/credentials", {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded" },
      // Counted per address, whatever its case.
      body: new URLSearchParams({ email: email.toLowerCase(), password: "x", json: "true" }).toString(),
    });
    const response = await postAuth(request, { params: Promise.resolve({ nextauth: ["callback", "credentials"] }) });
    expect(response.status).toBe(429);
    expect(response.headers.get("retry-after")).toBe("60");
    const body = (await response.json()) as { error: string; url: string };
    expect(body.error).toBe(SIGN_IN_LIMIT_MESSAGE);
    expect(new URL(body.url).searchParams.get("error")).toBe(SIGN_IN_LIMIT_MESSAGE);
  });
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
