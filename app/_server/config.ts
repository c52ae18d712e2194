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

export function mailFrom(): string {
  return process.env.MAIL_FROM ?? "Chalkline <proofs@chalkline.test>";
}
