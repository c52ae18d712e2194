/**
 * Signing in over HTTP as the sign-in form does (CSRF token, then the credentials callback), from
 * a chosen loopback address: for the end-to-end tests (tests/e2e/support.ts puts their base
 * address on these) and the bench. Every url here is absolute.
 */
import { request as httpRequest } from "node:http";

export type FetchInit = { method?: string; headers?: Record<string, string>; body?: string };

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
export async function fetchFrom(source: string, url: string, init: FetchInit = {}): Promise<Response> {
  const target = new URL(url);
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
export async function tryPasswordSignIn(email: string, password: string, from: string, base: string): Promise<PasswordAttempt> {
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
export async function signInOverHttp(email: string, password: string, from: string, base: string): Promise<string> {
  const attempt = await tryPasswordSignIn(email, password, from, base);
  if (attempt.sessionEmail !== email) throw new Error(`signing in ${email} did not make a session (callback answered ${attempt.status}, error ${attempt.error})`);
  return attempt.cookie;
}
