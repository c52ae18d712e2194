/**
 * The Content Security Policy and the other security headers of every page, as pure functions of
 * the request's nonce and of where uploads and payments live. `proxy.ts` calls these per request.
 */

export type CspSources = {
  /** Origins the browser uploads art to (the upload service's ingest hosts, or the local fake). */
  uploadConnect: string[];
  /** Origins upload files can be shown from. */
  uploadImages: string[];
  /** Origins a form may post to besides our own (the payments checkout page). */
  checkout: string[];
  /** `next dev`: React's dev tools need eval and the reload socket. Never in production. */
  dev: boolean;
  /** The app is served over https: ask the browser to upgrade any http sub-request. */
  https: boolean;
};

/** Hosted upload service: browsers send files to its regional ingest hosts and read them from its file hosts. */
const HOSTED_UPLOAD_CONNECT = ["https://*.ingest.uploadthing.com", "https://api.uploadthing.com"];
const HOSTED_UPLOAD_IMAGES = ["https://*.ufs.sh", "https://utfs.io"];
const HOSTED_CHECKOUT = ["https://checkout.stripe.com"];

function origin(url: string | undefined): string | null {
  if (!url) return null;
  try {
    return new URL(url).origin;
  } catch {
    return null;
  }
}

/** A loopback origin under both of its names: a fake on 127.0.0.1 is also reached as localhost. */
function withLoopbackTwin(value: string): string[] {
  const u = new URL(value);
  if (u.hostname === "127.0.0.1") return [value, `${u.protocol}//localhost${u.port ? `:${u.port}` : ""}`];
  if (u.hostname === "localhost") return [value, `${u.protocol}//127.0.0.1${u.port ? `:${u.port}` : ""}`];
  return [value];
}

/** Where uploads and payments live for this process, from the same variables the SDK options read. */
export function cspSourcesFromEnv(env: Record<string, string | undefined>): CspSources {
  const uploadsFake = origin(env.UPLOADTHING_FAKE_URL?.trim());
  const checkoutFake = origin(env.STRIPE_FAKE_URL?.trim());
  const appUrl = env.APP_URL ?? env.NEXTAUTH_URL ?? "";
  return {
    uploadConnect: uploadsFake ? withLoopbackTwin(uploadsFake) : HOSTED_UPLOAD_CONNECT,
    uploadImages: uploadsFake ? withLoopbackTwin(uploadsFake) : HOSTED_UPLOAD_IMAGES,
    checkout: checkoutFake ? withLoopbackTwin(checkoutFake) : HOSTED_CHECKOUT,
    dev: env.NODE_ENV === "development",
    https: appUrl.startsWith("https://"),
  };
}

/** A fresh nonce: 128 random bits, base64. */
export function newNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return btoa(String.fromCharCode(...bytes));
}

/**
 * Scripts only from our own bundles that carry this request's nonce (and what they load:
 * 'strict-dynamic'). Inline styles stay allowed: the canvas library and utility classes set
 * style attributes. No plugins, no framing by other sites, no <base> tricks, forms only to us
 * and the checkout page.
 */
export function contentSecurityPolicy(nonce: string, sources: CspSources): string {
  const directives: Array<[string, string[]]> = [
    ["default-src", ["'self'"]],
    ["script-src", ["'self'", `'nonce-${nonce}'`, "'strict-dynamic'", ...(sources.dev ? ["'unsafe-eval'"] : [])]],
    ["style-src", ["'self'", "'unsafe-inline'"]],
    ["img-src", ["'self'", "data:", "blob:", ...sources.uploadImages]],
    ["font-src", ["'self'"]],
    ["connect-src", ["'self'", ...sources.uploadConnect, ...(sources.dev ? ["ws:", "wss:"] : [])]],
    ["media-src", ["'self'"]],
    ["worker-src", ["'self'", "blob:"]],
    ["frame-src", ["'self'"]],
    ["object-src", ["'none'"]],
    ["base-uri", ["'self'"]],
    ["form-action", ["'self'", ...sources.checkout]],
    ["frame-ancestors", ["'none'"]],
  ];
  const text = directives.map(([name, values]) => `${name} ${[...new Set(values)].join(" ")}`);
  if (sources.https) text.push("upgrade-insecure-requests");
  return text.join("; ");
}

/** Headers set on every page beside the CSP (next.config.ts sets the same on everything else). */
export function pageSecurityHeaders(sources: Pick<CspSources, "https">): Record<string, string> {
  return {
    ...STATIC_SECURITY_HEADERS,
    // Two years: common practice (browser preload lists ask for at least one). Only over https.
    ...(sources.https ? { "Strict-Transport-Security": "max-age=63072000; includeSubDomains" } : {}),
  };
}

export const STATIC_SECURITY_HEADERS: Record<string, string> = {
  "X-Content-Type-Options": "nosniff",
  "Referrer-Policy": "strict-origin-when-cross-origin",
  "X-Frame-Options": "DENY",
  "Cross-Origin-Opener-Policy": "same-origin",
  // The calibration card and the canvas need none of these.
  "Permissions-Policy": "camera=(), microphone=(), geolocation=(), payment=(), usb=()",
};
