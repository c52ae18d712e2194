import "server-only";

/** Public base URL of this app, used in links inside e-mails. */
export function appUrl(): string {
  return (process.env.APP_URL ?? process.env.NEXTAUTH_URL ?? `http://localhost:${process.env.PORT ?? 3000}`).replace(/\/$/, "");
}

/** The local mail catcher's HTTP API, when the fake is in use (never with real SMTP settings). */
export function mailFakeApi(): string | null {
  if (process.env.SMTP_URL) return null;
  return process.env.MAIL_FAKE_API ?? null;
}

/**
 * The local mail catcher and its key, when the fake is in use. The mailbox page answers only to a
 * request that carries this install's key; without one, or with real SMTP settings, it is not there.
 */
export function mailFake(): { api: string; key: string } | null {
  const api = mailFakeApi();
  const key = process.env.MAIL_FAKE_KEY;
  return api && key && key.length >= 16 ? { api, key } : null;
}

export function mailFrom(): string {
  return process.env.MAIL_FROM ?? "Chalkline <proofs@chalkline.test>";
}
