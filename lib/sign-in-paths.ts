/**
 * Where sign-in sends people back to, and the page that says a link is on its way. Pure.
 */

/**
 * A path on this site, or undefined: it starts with one "/" and is not "//host" or "/\host", which
 * a browser reads as another site. A return address from the query string goes through this.
 */
export function localPath(value: string | null | undefined): string | undefined {
  if (!value || value.length > 2000) return undefined;
  if (!value.startsWith("/") || value.startsWith("//") || value.startsWith("/\\")) return undefined;
  if (/[\u0000-\u001f\u007f]/.test(value)) return undefined;
  return value;
}

/**
 * The check-email page for a link to this address, returning to `callbackUrl` when it is opened;
 * `unsent` when sending it failed, so the page says so and offers to try again.
 */
export function checkEmailPath(email: string, callbackUrl: string, unsent = false): string {
  return `/sign-in/check-email?${new URLSearchParams({ email, callbackUrl, ...(unsent ? { unsent: "1" } : {}) })}`;
}

/** An address shown back on a page from the query string: plausible, or nothing. */
export function shownEmail(value: string | null | undefined): string | undefined {
  if (!value || value.length > 320) return undefined;
  return /^[^\s@]+@[^\s@]+$/.test(value) ? value : undefined;
}
