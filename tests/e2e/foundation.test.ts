import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, DEMO_PASSWORD, DEMO_SHOP, firstLink, launch, newContext, openSignUpLink, signIn, waitForMail } from "./support";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe("sign-in and navigation by role", () => {
  it.each([
    ["owner@chalkline.test", ["Overview", "Jobs", "Clients", "Blanks", "Shop settings"], []],
    ["designer@chalkline.test", ["Overview", "Jobs", "Clients", "Blanks"], ["Shop settings"]],
    ["press@chalkline.test", ["Overview", "Jobs", "Blanks"], ["Clients", "Shop settings"]],
    ["client@chalkline.test", ["My jobs"], ["Overview", "Shop settings", "Clients"]],
  ])("%s sees the right navigation", async (email, shown, hidden) => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, email);
    const nav = page.getByRole("navigation", { name: "Main" });
    await nav.getByRole("link", { name: shown[0], exact: true }).waitFor();
    for (const label of shown) await expect(nav.getByRole("link", { name: label, exact: true }).count()).resolves.toBe(1);
    for (const label of hidden) await expect(nav.getByRole("link", { name: label, exact: true }).count()).resolves.toBe(0);
    await context.close();
  });

  it("tells a wrong password apart clearly and keeps the visitor on the sign-in page", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await page.goto("/sign-in");
    await page.getByLabel("E-mail").fill("owner@chalkline.test");
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await page.getByRole("alert").filter({ hasText: /e-mail and password do not match/i }).waitFor();
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    await context.close();
  });

  it("shows a client the 403 page on shop settings", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, "client@chalkline.test");
    const response = await page.goto(`/shops/${DEMO_SHOP}/settings`);
    expect(response?.status()).toBe(403);
    await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toMatch(/not open to you/i);
    await context.close();
  });

  it("shows production the 403 page on settings, and another shop's owner a 404", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, "press@chalkline.test");
    expect((await page.goto(`/shops/${DEMO_SHOP}/settings`))?.status()).toBe(403);
    await context.close();

    const other = await newContext(browser);
    const otherPage = await other.newPage();
    const email = `owner-${Date.now()}@other-shop.test`;
    const since = Date.now() - 1000;
    await otherPage.goto("/sign-up");
    await otherPage.getByLabel("Shop name").fill("Gravel Road Tees");
    await otherPage.getByLabel("Your name").fill("Ada Fenwick");
    await otherPage.getByLabel("E-mail").fill(email);
    await otherPage.getByLabel("Password").fill("a-long-enough-password");
    await otherPage.getByRole("button", { name: "Create shop" }).click();
    await openSignUpLink(otherPage, email, since);
    await otherPage.waitForURL(/\/shops\/gravel-road-tees/);
    expect((await otherPage.goto(`/shops/${DEMO_SHOP}`))?.status()).toBe(404);
    expect((await otherPage.goto(`/shops/${DEMO_SHOP}/settings`))?.status()).toBe(404);
    await other.close();
  });

  it("signs in with an e-mailed link read from the local mailbox", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    const since = Date.now() - 1000;
    await page.goto("/sign-in");
    await page.getByRole("tab", { name: "E-mail me a link" }).click();
    await page.getByLabel("E-mail").fill("designer@chalkline.test");
    await page.getByRole("button", { name: "Send sign-in link" }).click();
    await page.waitForURL(/\/sign-in\/check-email/);
    const mail = await waitForMail("designer@chalkline.test", /sign-in link/i, since);
    expect(mail.html).toContain("Sign in");
    const link = firstLink(mail.text, "/api/auth/callback/email");
    await page.goto(link);
    await page.waitForURL(new RegExp(`/shops/${DEMO_SHOP}`));
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Jobs" }).waitFor();
    await context.close();
  });

  it("signs out and then asks to sign in again", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, "owner@chalkline.test");
    await page.getByRole("button", { name: /Maren Holt/ }).first().click();
    await page.getByRole("menuitem", { name: "Sign out" }).click();
    await page.waitForURL(/\/sign-in/);
    await page.goto(`/shops/${DEMO_SHOP}`);
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    await context.close();
  });
});

describe("credentials callback and health", () => {
  it("signs the demo owner in through /api/auth/callback/credentials", async () => {
    const csrfResponse = await fetch(`${BASE_URL}/api/auth/csrf`);
    const { csrfToken } = (await csrfResponse.json()) as { csrfToken: string };
    const cookie = csrfResponse.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    const response = await fetch(`${BASE_URL}/api/auth/callback/credentials`, {
      method: "POST",
      redirect: "manual",
      headers: { "content-type": "application/x-www-form-urlencoded", cookie },
      body: new URLSearchParams({ csrfToken, email: "owner@chalkline.test", password: DEMO_PASSWORD, json: "true" }),
    });
    expect([200, 302]).toContain(response.status);
    expect(response.headers.getSetCookie().some((c) => c.startsWith("next-auth.session-token="))).toBe(true);
  });

  it("answers health with the database up", async () => {
    const response = await fetch(`${BASE_URL}/api/health`);
    expect(response.status).toBe(200);
    expect(await response.json()).toEqual({ status: "ok", db: "ok" });
  });
});
