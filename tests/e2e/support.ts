import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";
import { expect } from "vitest";
import { fetchFrom as fetchFromAt, signInOverHttp as signInOverHttpAt, tryPasswordSignIn as tryPasswordSignInAt, type FetchInit, type PasswordAttempt } from "../../scripts/lib/http-sign-in";

export type { PasswordAttempt };

export const BASE_URL = process.env.E2E_BASE_URL ?? "http://localhost:3100";
export const MAIL_API = process.env.MAIL_FAKE_API ?? "http://127.0.0.1:2590";
/** The mail catcher's key, from the stack `npm test` started. */
export const MAIL_KEY = process.env.MAIL_FAKE_KEY ?? "";
export const DEMO_PASSWORD = "chalkline-demo";
export const DEMO_SHOP = "quarry-street-print-co";

export async function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: [
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
      "--disable-quic",
      "--no-first-run",
    ],
  });
}

export async function newContext(browser: Browser, options: Parameters<Browser["newContext"]>[0] = {}): Promise<BrowserContext> {
  const context = await browser.newContext({ baseURL: BASE_URL, ...options });
  context.setDefaultTimeout(20_000);
  return context;
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in", exact: true }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
}

/** An HTTP request from a chosen loopback address (scripts/lib/http-sign-in.ts); a path is taken on BASE_URL. */
export function fetchFrom(source: string, url: string, init: FetchInit = {}): Promise<Response> {
  return fetchFromAt(source, new URL(url, BASE_URL).toString(), init);
}

/** The credentials sign-in a browser form makes, from a chosen loopback address, on BASE_URL unless told. */
export function tryPasswordSignIn(email: string, password: string, from = "127.0.0.1", base = BASE_URL): Promise<PasswordAttempt> {
  return tryPasswordSignInAt(email, password, from, base);
}

/** The same; returns the session cookies, or throws when no session came of it. */
export function signInOverHttp(email: string, password: string, from = "127.0.0.1", base = BASE_URL): Promise<string> {
  return signInOverHttpAt(email, password, from, base);
}

/**
 * After the sign-up form: the "check your e-mail" page, then the link e-mailed to the new address,
 * opened in the same browser. Resolves once the link has signed in and opened the new shop.
 */
export async function openSignUpLink(page: Page, email: string, since: number): Promise<CaughtMail> {
  await page.waitForURL(/\/sign-in\/check-email/);
  const mail = await waitForMail(email, /confirm your e-mail/i, since);
  await page.goto(firstLink(mail.text, "/api/auth/callback/email"));
  await page.waitForURL(/\/shops\/[^/]+/);
  return mail;
}

export type CaughtMail = { id: string; to: string[]; subject: string; text: string; html: string | null; date: string };

/** Waits for the newest message to an address whose subject matches, from the local mail catcher. */
export async function waitForMail(to: string, subject: RegExp, since = 0, timeoutMs = 15_000): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const response = await fetch(`${MAIL_API}/messages?to=${encodeURIComponent(to)}`, { headers: { "x-fake-key": MAIL_KEY } });
    const messages = (await response.json()) as CaughtMail[];
    const match = messages.find((m) => subject.test(m.subject) && Date.parse(m.date) >= since);
    if (match) return match;
    await new Promise((resolve) => setTimeout(resolve, 300));
  }
  throw new Error(`no e-mail to ${to} matching ${subject} within ${timeoutMs} ms`);
}

export function firstLink(text: string, pathPart: string): string {
  const link = text.match(/https?:\/\/\S+/g)?.find((url) => url.includes(pathPart));
  expect(link, `a link containing ${pathPart}`).toBeTruthy();
  return link!;
}

export type CspViolation = { page: string; directive: string; blocked: string; sample: string };

/**
 * Collects Content Security Policy violations from every page of a context: the browser's
 * `securitypolicyviolation` events and its "Refused to …" console errors.
 */
export async function watchCsp(context: BrowserContext): Promise<CspViolation[]> {
  const found: CspViolation[] = [];
  await context.exposeBinding("__reportCspViolation", ({ page }, v: Omit<CspViolation, "page">) => {
    found.push({ page: page.url(), ...v });
  });
  await context.addInitScript(() => {
    document.addEventListener(
      "securitypolicyviolation",
      (e) => {
        const report = (window as unknown as { __reportCspViolation?: (v: unknown) => void }).__reportCspViolation;
        report?.({ directive: e.effectiveDirective || e.violatedDirective, blocked: e.blockedURI, sample: e.sample });
      },
      true,
    );
  });
  const watch = (page: Page) =>
    page.on("console", (message) => {
      if (message.type() === "error" && /Content Security Policy|Refused to (load|execute|apply|connect|evaluate|frame|create)/i.test(message.text())) {
        found.push({ page: page.url(), directive: "console", blocked: "", sample: message.text().slice(0, 300) });
      }
    });
  context.pages().forEach(watch);
  context.on("page", watch);
  return found;
}
