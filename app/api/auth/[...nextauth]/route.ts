import NextAuth from "next-auth";
import { NextResponse, type NextRequest } from "next/server";
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

async function handler(request: NextRequest, context: Context) {
  const { nextauth } = await context.params;
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
