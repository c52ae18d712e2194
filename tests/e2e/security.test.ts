import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type { Browser, Page } from "playwright-core";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { fetchProof, openTeeProof, waitSaved } from "./editor-support";
import { BASE_URL, fetchFrom, launch, newContext, signIn, watchCsp } from "./support";
import { demoCopy, type DemoCopy } from "./demo-copy";
import { getPool } from "@/db/client";

let browser: Browser;
let demo: DemoCopy;
beforeAll(async () => {
  demo = await demoCopy("security");
  browser = await launch();
});
afterAll(async () => {
  await demo?.drop();
  await getPool().end();
  await browser?.close();
});

function directives(csp: string): Record<string, string[]> {
  return Object.fromEntries(
    csp.split(";").map((part) => {
      const [name, ...values] = part.trim().split(/\s+/);
      return [name!, values];
    }),
  );
}

const originOf = (url: string | undefined) => (url ? new URL(url).origin : "");

async function openProof(page: Page, jobTitle: RegExp, proofName: RegExp) {
  await page.goto(`/shops/${demo.slug}/jobs`);
  await page.getByRole("link", { name: jobTitle }).click();
  await page.getByRole("link", { name: proofName }).click();
  await page.waitForURL(/\/proofs\//);
  await page.locator("[data-testid=proof-canvas][data-scale]").waitFor();
}

describe("security headers", () => {
  it("sends every page a Content Security Policy with a fresh nonce that Next.js puts on its scripts", async () => {
    const first = await fetch(`${BASE_URL}/sign-in`);
    expect(first.status).toBe(200);
    const csp = first.headers.get("content-security-policy");
    expect(csp).toBeTruthy();
    const d = directives(csp!);
    const nonce = d["script-src"]!.find((v) => v.startsWith("'nonce-"))!.slice(7, -1);
    expect(nonce.length).toBeGreaterThanOrEqual(22);
    expect(d["script-src"]).toEqual(["'self'", `'nonce-${nonce}'`, "'strict-dynamic'"]);
    expect(d["style-src"]).toEqual(["'self'", "'unsafe-inline'"]);
    expect(d["default-src"]).toEqual(["'self'"]);
    expect(d["object-src"]).toEqual(["'none'"]);
    expect(d["base-uri"]).toEqual(["'self'"]);
    expect(d["frame-ancestors"]).toEqual(["'none'"]);
    expect(d["img-src"]).toEqual(expect.arrayContaining(["'self'", "data:", "blob:", originOf(process.env.UPLOADTHING_FAKE_URL)]));
    expect(d["connect-src"]).toEqual(expect.arrayContaining(["'self'", originOf(process.env.UPLOADTHING_FAKE_URL)]));
    expect(d["form-action"]).toEqual(expect.arrayContaining(["'self'", originOf(process.env.STRIPE_FAKE_URL)]));

    // Every script tag in the page carries this response's nonce.
    const html = await first.text();
    const scripts = html.match(/<script\b[^>]*>/g) ?? [];
    expect(scripts.length).toBeGreaterThan(0);
    for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`);

    // The next response has another nonce.
    const second = await fetch(`${BASE_URL}/sign-in`);
    expect(second.headers.get("content-security-policy")).not.toContain(nonce);

    for (const response of [first, await fetch(`${BASE_URL}/`), await fetch(`${BASE_URL}/api/health`)]) {
      expect(response.headers.get("x-content-type-options")).toBe("nosniff");
      expect(response.headers.get("x-frame-options")).toBe("DENY");
      expect(response.headers.get("referrer-policy")).toBe("strict-origin-when-cross-origin");
      expect(response.headers.get("cross-origin-opener-policy")).toBe("same-origin");
      expect(response.headers.get("permissions-policy")).toContain("camera=()");
      expect(response.headers.get("x-powered-by")).toBeNull();
    }
    // Served over plain http here, so no HSTS (it is sent once APP_URL is https).
    expect(first.headers.get("strict-transport-security")).toBeNull();
  });

  it("keeps the session cookie away from scripts and other sites", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, demo.emails.designer);
    const cookies = await context.cookies();
    const session = cookies.find((c) => c.name.endsWith("next-auth.session-token"));
    expect(session).toMatchObject({ httpOnly: true, sameSite: "Lax" });
    const csrf = cookies.find((c) => c.name.endsWith("next-auth.csrf-token"));
    expect(csrf).toMatchObject({ httpOnly: true, sameSite: "Lax" });
    await context.close();
  });
});

describe("pages under the policy", () => {
  it("signs up and in, edits and saves in the editor, uploads art, opens a review link, production and the portal without a single CSP violation", async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "chalkline-csp-"));
    const file = path.join(dir, "csp-check-badge.png");
    writeFileSync(
      file,
      await sharp({ create: { width: 900, height: 600, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } })
        .composite([{ input: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="800" height="500"><rect width="800" height="500" rx="60" fill="#2a6f5e"/></svg>'), left: 50, top: 50 }])
        .png()
        .toBuffer(),
    );

    const context = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const violations = await watchCsp(context);
    const page = await context.newPage();
    // Sign-up checks its fields in the browser with zod, which must not reach for eval.
    await page.goto("/sign-up");
    await page.getByRole("button", { name: "Create shop" }).click();
    await page.locator(".field-error").first().waitFor();
    await signIn(page, demo.emails.owner);

    // Editor: keyboard nudge, autosave, and back.
    const proofId = await openTeeProof(page, 0.3, demo.slug);
    const before = (await fetchProof(page, proofId)).placements[0]!;
    await page.getByRole("heading", { name: "Team tee" }).click();
    await page.keyboard.press("ArrowDown");
    await waitSaved(page);
    await page.keyboard.press("ArrowUp");
    await waitSaved(page);
    expect((await fetchProof(page, proofId)).placements[0]!.belowCollarIn).toBeCloseTo(before.belowCollarIn, 6);

    // Upload: straight from the browser to the upload service, then analysed and shown.
    await page.goto(`/shops/${demo.slug}/art`);
    await page.getByLabel("Art files").setInputFiles(file);
    await page.locator('[data-testid=upload-row][data-name="csp-check-badge.png"][data-state=done]').waitFor({ timeout: 60_000 });
    const thumb = page.locator('[data-testid=art-card][data-name="csp-check-badge"] img');
    await thumb.waitFor({ timeout: 15_000 });
    await thumb.scrollIntoViewIfNeeded();
    await expect.poll(() => thumb.evaluate((img: HTMLImageElement) => img.naturalWidth), { timeout: 15_000 }).toBeGreaterThan(0);

    // Review link, opened by someone without an account, who pins a note.
    await openProof(page, /Market stall totes/, /Market tote/);
    await page.getByRole("button", { name: "Share with client" }).click();
    await page.getByRole("button", { name: "Make a link to copy" }).click();
    const url = await page.getByLabel("Review link").inputValue();
    const visitor = await newContext(browser, { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    const visitorViolations = await watchCsp(visitor);
    const review = await visitor.newPage();
    expect((await review.goto(url))?.status()).toBe(200);
    const canvas = review.locator("[data-testid=review-canvas] [data-testid=proof-canvas][data-scale]");
    await canvas.waitFor();
    await review.waitForFunction(() => ((window as unknown as { Konva?: { stages: unknown[] } }).Konva?.stages.length ?? 0) > 0);
    const box = (await canvas.boundingBox())!;
    const scale = Number(await canvas.getAttribute("data-scale"));
    const ox = Number(await canvas.getAttribute("data-origin-x"));
    const oy = Number(await canvas.getAttribute("data-origin-y"));
    await review.mouse.click(box.x + ox + 3 * scale, box.y + oy + 6 * scale);
    await review.getByLabel("Note", { exact: true }).fill("Checking the page under its security policy.");
    await review.getByRole("button", { name: "Pin note" }).click();
    await review.getByTestId("note").filter({ hasText: "security policy" }).waitFor();

    // The production page and the client's own portal run under the same policy.
    await page.goto(`/shops/${demo.slug}/jobs`);
    await page.getByRole("link", { name: /Spring season team tees/ }).click();
    await page.getByRole("link", { name: "Production" }).click();
    await page.getByTestId("plan-now").first().waitFor();
    const clientContext = await newContext(browser, { viewport: { width: 1280, height: 900 } });
    const clientViolations = await watchCsp(clientContext);
    const clientPage = await clientContext.newPage();
    await signIn(clientPage, demo.emails.client);
    await clientPage.goto("/portal");
    const portalProof = clientPage.locator('a[href^="/portal/proofs/"]').first();
    if ((await portalProof.count()) > 0) {
      await portalProof.click();
      await clientPage.waitForURL(/\/portal\/proofs\//);
      await clientPage.locator("[data-testid=proof-canvas][data-scale]").waitFor();
    }

    expect(violations).toEqual([]);
    expect(visitorViolations).toEqual([]);
    expect(clientViolations).toEqual([]);
    await clientContext.close();
    await visitor.close();
    await context.close();
  });
});

describe("rate limits", () => {
  it("answers 429 once an account has had its wrong passwords, and the sign-in form says so in words", async () => {
    // Fifty wrong passwords for one e-mail, ten from each of five addresses (so no address is
    // locked), use up the account's allowance; the browser then tries it from its own address.
    const email = `limit-${Date.now()}@chalkline.test`;
    for (let a = 1; a <= 5; a += 1) {
      for (let i = 0; i < 10; i += 1) {
        const csrf = await fetchFrom(`127.0.60.${a}`, "/api/auth/csrf");
        const cookie = csrf.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
        const { csrfToken } = (await csrf.json()) as { csrfToken: string };
        const response = await fetchFrom(`127.0.60.${a}`, "/api/auth/callback/credentials", {
          method: "POST",
          headers: { cookie, "content-type": "application/x-www-form-urlencoded" },
          body: new URLSearchParams({ email, password: "not-it", csrfToken, json: "true", callbackUrl: `${BASE_URL}/home` }).toString(),
        });
        expect(response.status, await response.text()).toBe(401);
      }
    }
    const context = await newContext(browser);
    const page = await context.newPage();
    await page.goto("/sign-in");
    await page.getByLabel("E-mail").fill(email);
    await page.getByLabel("Password").fill("not-it");
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await page.getByRole("alert").filter({ hasText: "Too many sign-in attempts. Wait a few minutes and try again, or sign in with an e-mail link." }).waitFor();
    await context.close();
  });
});
