/**
 * The local fakes hold other people's mail and payment events. An outsider who reaches the app or
 * the fakes' ports, without this install's key, finds nothing there: the probe that read a sign-in
 * link for the owner out of the mailbox must fail at the first step.
 */
import { describe, expect, it } from "vitest";
import { BASE_URL, MAIL_API, MAIL_KEY } from "./support";

const STRIPE_FAKE = process.env.STRIPE_FAKE_URL ?? "";
const STRIPE_ADMIN_KEY = process.env.STRIPE_FAKE_ADMIN_KEY ?? "";

describe("the mailbox and the fakes' own endpoints need this install's key", () => {
  it("keeps the sign-in link an outsider asked for out of the outsider's reach", async () => {
    expect(MAIL_KEY.length, "the test stack passes the mail catcher's key").toBeGreaterThanOrEqual(16);
    // The outsider asks for a sign-in link for the owner (as the probe did)…
    const csrf = await fetch(`${BASE_URL}/api/auth/csrf`);
    const { csrfToken } = (await csrf.json()) as { csrfToken: string };
    const cookie = csrf.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    await fetch(`${BASE_URL}/api/auth/signin/email`, {
      method: "POST",
      redirect: "manual",
      headers: { "content-type": "application/x-www-form-urlencoded", cookie },
      body: new URLSearchParams({ csrfToken, email: "owner@chalkline.test", callbackUrl: `${BASE_URL}/home`, json: "true" }),
    });
    // …and then finds no mailbox page without the key, nor with a guessed one.
    const page = await fetch(`${BASE_URL}/dev/mailbox`);
    expect(page.status).toBe(404);
    expect(await page.text()).not.toContain("/api/auth/callback/email");
    expect((await fetch(`${BASE_URL}/dev/mailbox?key=${"x".repeat(MAIL_KEY.length)}`)).status).toBe(404);
    // The catcher's own API answers nothing but its health without the key.
    const api = await fetch(`${MAIL_API}/messages?to=owner@chalkline.test`);
    expect(api.status).toBe(404);
    expect(await api.text()).not.toContain("callback");
    expect((await fetch(`${MAIL_API}/`)).status).toBe(404);
    expect((await fetch(`${MAIL_API}/health`)).status).toBe(200);
  });

  it("opens the mailbox for whoever holds the key, as npm start prints it", async () => {
    const page = await fetch(`${BASE_URL}/dev/mailbox?key=${encodeURIComponent(MAIL_KEY)}`);
    expect(page.status).toBe(200);
    expect((await fetch(`${MAIL_API}/messages`, { headers: { "x-fake-key": MAIL_KEY } })).status).toBe(200);
  });

  it("answers 404 on the payments fake's event list and replay without its key, and lists them with it", async () => {
    expect(STRIPE_FAKE, "the payments fake runs in the test stack").toMatch(/^http:\/\/127\.0\.0\.1:\d+$/);
    const events = await fetch(`${STRIPE_FAKE}/__fake/events`);
    expect(events.status).toBe(404);
    expect(await events.text()).not.toContain("@");
    expect((await fetch(`${STRIPE_FAKE}/__fake/resend/evt_anything`, { method: "POST" })).status).toBe(404);
    expect((await fetch(`${STRIPE_FAKE}/__fake/events`, { headers: { "x-fake-key": STRIPE_ADMIN_KEY } })).status).toBe(200);
  });
});
