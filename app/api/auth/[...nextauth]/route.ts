import NextAuth from "next-auth";
import { NextRequest, NextResponse } from "next/server";
import { inputProblem } from "@/lib/input";
import { authCookies, getAuthOptions, SIGN_IN_LIMIT_MESSAGE, SIGN_IN_LINK_LIMIT_MESSAGE, signInLinkRecipient, usesSecureCookies } from "@/app/_server/auth";
import { clientAddress } from "@/app/_server/client-address";
import { addressSubject, limitResponse, LIMITS, refundLimits, takeLimits, UNAVAILABLE_MESSAGE, type Taken } from "@/app/_server/rate-limit";
import { normalizeEmail } from "@/db/queries/users";

export const dynamic = "force-dynamic";

type Context = { params: Promise<{ nextauth: string[] }> };

const MAX_BODY = 16_384;
const MAX_FIELD = 2_048;

/** Whether a callback url next-auth would read is a url at all (next-auth throws on one that is not). */
function readableUrl(value: string, origin: string): boolean {
  if (value.length > MAX_FIELD) return false;
  try {
    // next-auth joins a path to the site's address and parses anything else on its own.
    if (value.startsWith("/")) new URL(value, origin);
    else new URL(value);
    return true;
  } catch {
    return false;
  }
}

/** A key and text value next-auth can take: short, with no NUL or broken character. */
function readableText(key: string, value: unknown): boolean {
  return typeof value === "string" && key.length <= 64 && value.length <= MAX_FIELD && !inputProblem(key) && !inputProblem(value);
}

type Encoding = "form" | "json";
type Read = { ok: true; fields: Map<string, unknown>; encoding: Encoding | null } | { ok: false; status: 400 | 415; reason: string };

/**
 * How a body is to be read, from its media type alone: exactly a form or JSON. The only parameter
 * taken is `charset=utf-8` (fetch adds it to form bodies; both are read as UTF-8 whatever it says,
 * so it changes nothing); any other parameter, or any other type, is refused, so no parameter can
 * make one reader see a form where another sees JSON.
 */
function bodyEncoding(type: string | null): Encoding | null {
  if (!type) return null;
  const [media = "", ...parameters] = type.split(";");
  const kind = media.trim().toLowerCase();
  if (kind !== "application/x-www-form-urlencoded" && kind !== "application/json") return null;
  if (!parameters.every((p) => /^\s*charset\s*=\s*(?:utf-8|"utf-8")\s*$/i.test(p))) return null;
  return kind === "application/json" ? "json" : "form";
}

/**
 * Reads the request once, refusing what next-auth would choke on (and answer 500): a body that is
 * neither a form nor a JSON object (415 for any other content type), fields that are not text,
 * oversized input, callback urls that are not urls. Gives the body's fields (none for GET); the
 * limits and next-auth both work from these fields and nothing else.
 */
async function readAuthRequest(request: NextRequest): Promise<Read> {
  const origin = request.nextUrl.origin;
  const refuse = (reason: string, status: 400 | 415 = 400): Read => ({ ok: false, status, reason });
  for (const [key, value] of request.nextUrl.searchParams) {
    if (!readableText(key, value)) return refuse("The address is too long or not readable.");
    if (key === "callbackUrl" && !readableUrl(value, origin)) return refuse("The return address is not a url.");
  }
  const fields = new Map<string, unknown>();
  if (request.method !== "POST") return { ok: true, fields, encoding: null };
  const encoding = bodyEncoding(request.headers.get("content-type"));
  if (!encoding) return refuse("Send a form (application/x-www-form-urlencoded) or JSON (application/json).", 415);
  const text = await request.text();
  if (text.length > MAX_BODY) return refuse("The request is too large.");
  const json = encoding === "json";
  if (text === "") return json ? refuse("The request is not valid JSON.") : { ok: true, fields, encoding };
  if (!json) for (const [k, v] of new URLSearchParams(text)) fields.set(k, v);
  else {
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      return refuse("The request is not valid JSON.");
    }
    if (!body || typeof body !== "object" || Array.isArray(body)) return refuse("The request must be an object.");
    for (const [k, v] of Object.entries(body)) fields.set(k, v);
  }
  for (const [key, value] of fields) {
    // `data` is the one object field next-auth takes (a session update); it is not read here.
    if (key === "data" && json) {
      if (inputProblem(value)) return refuse("A field of the request is not readable.");
      continue;
    }
    if (!readableText(key, value)) return refuse("A field of the request is not readable text.");
    if (key === "callbackUrl" && !readableUrl(value as string, origin)) return refuse("The return address is not a url.");
  }
  return { ok: true, fields, encoding };
}

/**
 * The request next-auth reads: the same url and headers, and a body written afresh from the fields
 * read above under its plain content type, so next-auth parses exactly what the limits counted.
 */
function forNextAuth(request: NextRequest, read: Extract<Read, { ok: true }>): NextRequest {
  if (request.method !== "POST" || !read.encoding) return request;
  const headers = new Headers(request.headers);
  headers.delete("content-length");
  let body: string;
  if (read.encoding === "json") {
    headers.set("content-type", "application/json");
    // Always an object, "{}" when empty: next-auth parses a JSON body whatever it holds.
    body = JSON.stringify(Object.fromEntries(read.fields));
  } else {
    headers.set("content-type", "application/x-www-form-urlencoded");
    body = new URLSearchParams([...read.fields].map(([k, v]) => [k, String(v)])).toString();
  }
  return new NextRequest(request.url, { method: "POST", headers, body });
}

/** Whether next-auth's answer signs someone in: it sets a session cookie (or the first chunk of one) with a value. */
function signsIn(response: Response): boolean {
  const name = authCookies(usesSecureCookies()).sessionToken!.name;
  return response.headers.getSetCookie().some((line) => {
    const [cookieName = "", ...value] = line.split(";")[0]!.split("=");
    return (cookieName === name || cookieName === `${name}.0`) && value.join("=") !== "";
  });
}

/** A refusal next-auth's client shows in words: it reads `error` from the url it is given back. */
function limitRefusal(request: NextRequest, taken: Extract<Taken, { ok: false }>, message: string): NextResponse {
  const words = taken.status === 429 ? message : UNAVAILABLE_MESSAGE;
  const url = new URL("/sign-in", request.nextUrl.origin);
  url.searchParams.set("error", words);
  return limitResponse(taken, message, { url: url.toString() });
}

/** next-auth's own endpoints: one word, or sign-in / callback with one of our providers. */
const ENDPOINTS = new Set(["session", "csrf", "providers", "signin", "signout", "error", "verify-request", "_log"]);
function knownEndpoint(path: string[]): boolean {
  const [action, provider, ...rest] = path;
  if (rest.length > 0 || !action) return false;
  if (provider === undefined) return ENDPOINTS.has(action);
  return (action === "signin" || action === "callback") && getAuthOptions().providers.some((p) => p.id === provider);
}

async function handler(request: NextRequest, context: Context) {
  const { nextauth } = await context.params;
  if (!knownEndpoint(nextauth)) return NextResponse.json({ error: "Not found." }, { status: 404 });
  const read = await readAuthRequest(request);
  if (!read.ok) return NextResponse.json({ error: read.reason }, { status: read.status, headers: { "Cache-Control": "no-store" } });
  const nextAuth = () => NextAuth(getAuthOptions())(forNextAuth(request, read), context) as Promise<Response>;
  if (request.method !== "POST") return nextAuth();
  const address = addressSubject(clientAddress(request));
  const email = read.fields.get("email");
  const endpoint = nextauth.join("/");

  if (endpoint === "callback/credentials") {
    // Failed password attempts: per client address first, then per account from everywhere.
    // An address that is refused spends nothing of the account's allowance.
    const account = typeof email === "string" && email.trim() ? normalizeEmail(email) : null;
    const checks = [{ rule: LIMITS.signInAddress, subject: address }, ...(account ? [{ rule: LIMITS.signInAccount, subject: account }] : [])];
    const taken = await takeLimits(...checks);
    if (!taken.ok) return limitRefusal(request, taken, SIGN_IN_LIMIT_MESSAGE);
    const response = await nextAuth();
    // A sign-in that worked was not a failure: its points go back.
    if (signsIn(response)) await refundLimits(...checks);
    return response;
  }
  if (endpoint === "signin/email") {
    // Sign-in links, per address and per recipient (as next-auth will address the e-mail). Password
    // failures never count here, so an account locked for passwords can still be entered by link.
    const recipient = signInLinkRecipient(email);
    const taken = await takeLimits({ rule: LIMITS.signInLinkAddress, subject: address }, ...(recipient ? [{ rule: LIMITS.signInLinkRecipient, subject: recipient }] : []));
    if (!taken.ok) return limitRefusal(request, taken, SIGN_IN_LINK_LIMIT_MESSAGE);
  }
  return nextAuth();
}

export { handler as GET, handler as POST };
