import NextAuth from "next-auth";
import { NextResponse, type NextRequest } from "next/server";
import { inputProblem } from "@/lib/input";
import { getAuthOptions, SIGN_IN_LIMIT_MESSAGE, takeSignInAttempt } from "@/app/_server/auth";

export const dynamic = "force-dynamic";

type Context = { params: Promise<{ nextauth: string[] }> };

/** The e-mail a password sign-in is for, read from a copy of the body (form or JSON). */
async function signInEmail(request: Request): Promise<string | null> {
  const type = request.headers.get("content-type") ?? "";
  try {
    if (type.includes("application/json")) {
      const body = (await request.json()) as { email?: unknown };
      return typeof body.email === "string" ? body.email : null;
    }
    if (type.includes("application/x-www-form-urlencoded")) return new URLSearchParams(await request.text()).get("email");
  } catch {
    return null;
  }
  return null;
}

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

/**
 * What next-auth itself would choke on (and answer 500): a body that is neither a form nor a JSON
 * object, fields that are not text, oversized input, callback urls that are not urls. Returns the
 * reason, or null when the request is fine to hand over.
 */
async function unreadable(request: NextRequest): Promise<string | null> {
  const origin = request.nextUrl.origin;
  for (const [key, value] of request.nextUrl.searchParams) {
    if (key.length > 64 || value.length > MAX_FIELD || value.includes("\u0000")) return "The address is too long or not readable.";
    if (key === "callbackUrl" && !readableUrl(value, origin)) return "The return address is not a url.";
  }
  if (request.method !== "POST") return null;
  const text = await request.clone().text();
  if (text.length > MAX_BODY) return "The request is too large.";
  const type = request.headers.get("content-type") ?? "";
  if (text === "") return type.includes("application/json") ? "The request is not valid JSON." : null;
  let fields: Array<[string, unknown]>;
  if (type.includes("application/x-www-form-urlencoded")) fields = [...new URLSearchParams(text)];
  else if (type.includes("application/json")) {
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      return "The request is not valid JSON.";
    }
    if (!body || typeof body !== "object" || Array.isArray(body)) return "The request must be an object.";
    fields = Object.entries(body);
  } else return "Send a form or JSON.";
  for (const [key, value] of fields) {
    // `data` is the one object field next-auth takes (a session update); it is not read here.
    if (key === "data" && type.includes("application/json")) {
      if (inputProblem(value)) return "A field of the request is not readable.";
      continue;
    }
    if (typeof value !== "string" || key.length > 64 || value.length > MAX_FIELD || value.includes("\u0000") || !value.isWellFormed()) return "A field of the request is not readable text.";
    if (key === "callbackUrl" && !readableUrl(value, origin)) return "The return address is not a url.";
  }
  return null;
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
  const reason = await unreadable(request);
  if (reason) return NextResponse.json({ error: reason }, { status: 400, headers: { "Cache-Control": "no-store" } });
  if (request.method === "POST" && nextauth.join("/") === "callback/credentials") {
    const email = await signInEmail(request.clone());
    // Too many password attempts for one address: a real 429 that the sign-in form shows in words
    // (next-auth's client reads `error` from the url it is given back).
    if (email && !takeSignInAttempt(email)) {
      const url = new URL("/sign-in", request.nextUrl.origin);
      url.searchParams.set("error", SIGN_IN_LIMIT_MESSAGE);
      return NextResponse.json({ error: SIGN_IN_LIMIT_MESSAGE, url: url.toString() }, { status: 429, headers: { "Retry-After": "60", "Cache-Control": "no-store" } });
    }
  }
  return NextAuth(getAuthOptions())(request, context);
}

export { handler as GET, handler as POST };
