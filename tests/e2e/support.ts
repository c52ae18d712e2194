import { request as httpRequest } from "node:http";
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";
import { expect } from "vitest";

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

/** Cookie jar: name=value pairs from Set-Cookie headers. */
function absorb(jar: Map<string, string>, response: Response) {
  for (const line of response.headers.getSetCookie()) {
    const [pair] = line.split(";");
    const at = pair!.indexOf("=");
    jar.set(pair!.slice(0, at), pair!.slice(at + 1));
  }
}
const header = (jar: Map<string, string>) => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");

export type PasswordAttempt = { cookie: string; status: number; error: string | null; sessionEmail: string | null };

/**
 * An HTTP request from a chosen loopback address (127.0.0.0/8 is all loopback on Linux), so the app
 * sees a different client at the socket: how these tests stand in for people on other networks.
 * The app trusts no proxy in tests, so X-Forwarded-For cannot do that.
 */
export async function fetchFrom(source: string, url: string, init: { method?: string; headers?: Record<string, string>; body?: string } = {}): Promise<Response> {
  const target = new URL(url, BASE_URL);
  const body = init.body === undefined ? undefined : Buffer.from(init.body);
  return new Promise<Response>((resolve, reject) => {
    const request = httpRequest(
      {
        host: target.hostname === "localhost" ? "127.0.0.1" : target.hostname,
        port: target.port,
        path: `${target.pathname}${target.search}`,
        method: init.method ?? "GET",
        headers: { host: target.host, ...(body ? { "content-length": String(body.length) } : {}), ...init.headers },
        localAddress: source,
      },
      (response) => {
        const chunks: Buffer[] = [];
        response.on("data", (chunk: Buffer) => chunks.push(chunk));
        response.on("error", reject);
        response.on("end", () => {
          const headers = new Headers();
          for (let i = 0; i + 1 < response.rawHeaders.length; i += 2) headers.append(response.rawHeaders[i]!, response.rawHeaders[i + 1]!);
          const status = response.statusCode ?? 500;
          resolve(new Response([101, 204, 205, 304].includes(status) ? null : Buffer.concat(chunks), { status, headers }));
        });
      },
    );
    request.on("error", reject);
    request.end(body);
  });
}

/**
 * The credentials sign-in a browser form makes: CSRF token, then the callback, from a chosen loopback
 * address. Says what came of it: the cookies, next-auth's `error` (as its client reads it from the url
 * it answers), and whose session the cookies now carry, if anyone's.
 */
export async function tryPasswordSignIn(email: string, password: string, from = "127.0.0.1", base = BASE_URL): Promise<PasswordAttempt> {
  const jar = new Map<string, string>();
  const csrf = await fetchFrom(from, `${base}/api/auth/csrf`);
  absorb(jar, csrf);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const callback = await fetchFrom(from, `${base}/api/auth/callback/credentials`, {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: header(jar) },
    body: new URLSearchParams({ csrfToken, email, password, callbackUrl: `${base}/home`, json: "true" }).toString(),
  });
  absorb(jar, callback);
  const answer = (await callback.json().catch(() => null)) as { url?: string } | null;
  const error = answer?.url ? new URL(answer.url, base).searchParams.get("error") : null;
  const cookie = header(jar);
  const session = (await (await fetchFrom(from, `${base}/api/auth/session`, { headers: { cookie } })).json()) as { user?: { email?: string } };
  return { cookie, status: callback.status, error, sessionEmail: session.user?.email ?? null };
}

/** The credentials sign-in a browser form makes; returns the session cookies, or throws when no session came of it. */
export async function signInOverHttp(email: string, password: string, from = "127.0.0.1", base = BASE_URL): Promise<string> {
  const attempt = await tryPasswordSignIn(email, password, from, base);
  if (attempt.sessionEmail !== email) throw new Error(`signing in ${email} did not make a session (callback answered ${attempt.status}, error ${attempt.error})`);
  return attempt.cookie;
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
