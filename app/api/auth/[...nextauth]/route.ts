import NextAuth from "next-auth";
import { NextResponse, type NextRequest } from "next/server";
import { inputProblem } from "@/lib/input";
import { getAuthOptions, LINK_LIMIT_MESSAGE, SIGN_IN_LIMIT_MESSAGE, takeSignInAttempt, takeSignInLink } from "@/app/_server/auth";

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

type Read = { ok: true; fields: Map<string, unknown> } | { ok: false; reason: string };

/**
 * Reads the request as next-auth will, refusing what it would choke on (and answer 500): a body
 * that is neither a form nor a JSON object, fields that are not text, oversized input, callback
 * urls that are not urls. Gives the body's fields (none for GET) when the request is fine.
 */
async function readAuthRequest(request: NextRequest): Promise<Read> {
  const origin = request.nextUrl.origin;
  const refuse = (reason: string): Read => ({ ok: false, reason });
  for (const [key, value] of request.nextUrl.searchParams) {
    if (!readableText(key, value)) return refuse("The address is too long or not readable.");
    if (key === "callbackUrl" && !readableUrl(value, origin)) return refuse("The return address is not a url.");
  }
  const fields = new Map<string, unknown>();
  if (request.method !== "POST") return { ok: true, fields };
  const text = await request.clone().text();
  if (text.length > MAX_BODY) return refuse("The request is too large.");
  const type = request.headers.get("content-type") ?? "";
  const json = type.includes("application/json");
  if (text === "") return json ? refuse("The request is not valid JSON.") : { ok: true, fields };
  if (type.includes("application/x-www-form-urlencoded")) for (const [k, v] of new URLSearchParams(text)) fields.set(k, v);
  else if (json) {
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      return refuse("The request is not valid JSON.");
    }
    if (!body || typeof body !== "object" || Array.isArray(body)) return refuse("The request must be an object.");
    for (const [k, v] of Object.entries(body)) fields.set(k, v);
  } else return refuse("Send a form or JSON.");
  for (const [key, value] of fields) {
    // `data` is the one object field next-auth takes (a session update); it is not read here.
    if (key === "data" && json) {
      if (inputProblem(value)) return refuse("A field of the request is not readable.");
      continue;
    }
    if (!readableText(key, value)) return refuse("A field of the request is not readable text.");
    if (key === "callbackUrl" && !readableUrl(value as string, origin)) return refuse("The return address is not a url.");
  }
  return { ok: true, fields };
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
  if (!read.ok) return NextResponse.json({ error: read.reason }, { status: 400, headers: { "Cache-Control": "no-store" } });
  const limited = (message: string) => {
    const url = new URL("/sign-in", request.nextUrl.origin);
    url.searchParams.set("error", message);
    return NextResponse.json({ error: message, url: url.toString() }, { status: 429, headers: { "Retry-After": "60", "Cache-Control": "no-store" } });
  };
  if (request.method === "POST" && nextauth.join("/") === "callback/credentials") {
    const email = read.fields.get("email");
    // Too many password attempts for one address: a real 429 that the sign-in form shows in words
    // (next-auth's client reads `error` from the url it is given back).
    if (typeof email === "string" && email && !takeSignInAttempt(email)) return limited(SIGN_IN_LIMIT_MESSAGE);
  }
  if (request.method === "POST" && nextauth.join("/") === "signin/email") {
    // Each request sends an e-mail to the address: a few, then one a minute.
    const email = read.fields.get("email");
    if (typeof email === "string" && email && !takeSignInLink(email)) return limited(LINK_LIMIT_MESSAGE);
  }
  return NextAuth(getAuthOptions())(request, context);
}

export { handler as GET, handler as POST };
