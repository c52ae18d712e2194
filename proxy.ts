import { NextResponse, type NextRequest } from "next/server";
import { contentSecurityPolicy, cspSourcesFromEnv, newNonce, pageSecurityHeaders } from "@/lib/security-headers";

/**
 * Every page gets a fresh nonce and a Content Security Policy built around it. Next.js reads the
 * nonce from the request's CSP header and puts it on its own scripts, so pages must render per
 * request (the root layout waits for the connection).
 */
export function proxy(request: NextRequest) {
  const nonce = newNonce();
  const sources = cspSourcesFromEnv(process.env);
  const csp = contentSecurityPolicy(nonce, sources);

  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("x-nonce", nonce);
  requestHeaders.set("Content-Security-Policy", csp);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set("Content-Security-Policy", csp);
  for (const [name, value] of Object.entries(pageSecurityHeaders(sources))) response.headers.set(name, value);
  return response;
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
