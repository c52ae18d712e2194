import { NextResponse, type NextRequest } from "next/server";
import { KEPT_HEADER, keptPageKeys, keptReviewToken, RENDER_HEADER } from "@/lib/kept-pages";
import { contentSecurityPolicy, cspSourcesFromEnv, newNonce, pageSecurityHeaders } from "@/lib/security-headers";

/**
 * Every page gets a fresh nonce and a Content Security Policy built around it. Next.js reads the
 * nonce from the request's CSP header and puts it on its own scripts, so pages must render per
 * request (the root layout waits for the connection).
 *
 * A plain visit to a review link goes to the page kept for the link's current state
 * (app/api/review-page): same policy, same fresh nonce, without rendering React again. The app's
 * own render of a page to keep carries the render key and gets the stand-in nonce instead.
 */
export async function proxy(request: NextRequest) {
  if (request.method === "POST" && request.headers.has("next-action") && !(await readableActionBody(request))) {
    return NextResponse.json({ error: "That request could not be read." }, { status: 400 });
  }
  const kept = keptPageKeys(process.env);
  const rendering = kept !== null && request.headers.get(RENDER_HEADER) === kept.render;
  const nonce = rendering ? kept.standIn : newNonce();
  const sources = cspSourcesFromEnv(process.env);
  const csp = contentSecurityPolicy(nonce, sources);

  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("x-nonce", nonce);
  requestHeaders.set("Content-Security-Policy", csp);
  requestHeaders.delete(KEPT_HEADER);
  if (!rendering) requestHeaders.delete(RENDER_HEADER);
  const token = kept && !rendering && !request.headers.has("rsc") ? keptReviewToken(request.method, request.nextUrl.pathname, request.nextUrl.search) : null;
  let response: NextResponse;
  if (kept && token) {
    requestHeaders.set(KEPT_HEADER, kept.render);
    response = NextResponse.rewrite(new URL(`/api/review-page/${token}`, request.url), { request: { headers: requestHeaders } });
  } else {
    response = NextResponse.next({ request: { headers: requestHeaders } });
  }
  response.headers.set("Content-Security-Policy", csp);
  for (const [name, value] of Object.entries(pageSecurityHeaders(sources))) response.headers.set(name, value);
  return response;
}

/**
 * A server action call from the browser carries its arguments as a JSON array (or as multipart
 * form data, left to Next.js). Anything else would make the framework's decoder throw, which
 * answers 500; refuse it here as the bad request it is.
 */
async function readableActionBody(request: NextRequest): Promise<boolean> {
  const type = request.headers.get("content-type") ?? "";
  if (type.startsWith("multipart/form-data")) return true;
  if (type && !type.startsWith("text/plain")) return false;
  try {
    const args: unknown = JSON.parse(await request.clone().text());
    return Array.isArray(args) && args.length <= MAX_ACTION_ARGS && !hasStrayReference(args);
  } catch {
    return false;
  }
}

/** Our actions take one argument (two with a form's previous state); React refuses over 1,000 with a 500. */
const MAX_ACTION_ARGS = 8;
/**
 * In a plain-text action body, a string that starts with "$" is a reference in React's reply
 * format; the browser escapes the user's own as "$$". Without multipart parts the only ones it can
 * send stand for values (dates, undefined, NaN, ±Infinity, -0, big integers); any other points at
 * a part that is not there, and the decoder fails.
 */
function hasStrayReference(value: unknown, depth = 0): boolean {
  if (depth > 64) return true;
  if (typeof value === "string") return value.startsWith("$") && !/^\$(?:\$|D|n-?\d|undefined$|NaN$|Infinity$|-Infinity$|-0$)/.test(value);
  if (Array.isArray(value)) return value.some((v) => hasStrayReference(v, depth + 1));
  if (value && typeof value === "object") return Object.values(value).some((v) => hasStrayReference(v, depth + 1));
  return false;
}

export const config = {
  matcher: [
    {
      // Pages only: API routes answer JSON or files, and built assets are never documents.
      // next.config.ts sets the other security headers on those too.
      source: "/((?!api/|_next/static|_next/image|favicon.ico|icon.svg).*)",
      missing: [
        { type: "header", key: "next-router-prefetch" },
        { type: "header", key: "purpose", value: "prefetch" },
      ],
    },
  ],
};
