import "server-only";
import { NextResponse } from "next/server";
import type { z } from "zod";
import { holdQuoteBehindProof, resolveQuoteAccess, type QuoteAccess } from "@/app/_server/orders";
import { clientAddress } from "@/app/_server/client-address";
import { addressSubject, limitResponse, takeLimits } from "@/app/_server/rate-limit";
import type { LimitRule } from "@/db/queries/limits";
import { parseInput, readJson } from "@/lib/input";

type Granted<T> = { ok: true; body: T; access: Extract<QuoteAccess, { ok: true }>; ip: string | null };

/**
 * The shared front half of the client's quote routes: read and check the body, find who is
 * asking (signed-in contact or review link in `link`), and apply the per-quote rate limit.
 */
export async function readQuoteRequest<S extends z.ZodType<{ link?: string }>>(
  request: Request,
  quoteId: string,
  schema: S,
  limit: LimitRule,
): Promise<Granted<z.infer<S>> | { ok: false; response: NextResponse }> {
  const parsed = parseInput(schema, await readJson(request));
  if (!parsed.success) return { ok: false, response: NextResponse.json({ error: parsed.error.issues[0]?.message ?? "That could not be read." }, { status: 400 }) };
  const access = await resolveQuoteAccess(quoteId, parsed.data.link);
  if (!access.ok) return { ok: false, response: NextResponse.json({ error: access.message }, { status: access.status }) };
  // The address kept with an acceptance as evidence, and counted by the limit.
  const ip = clientAddress(request);
  const taken = await takeLimits({ rule: limit, subject: `${quoteId} ${addressSubject(ip)}` });
  if (!taken.ok) return { ok: false, response: limitResponse(taken, "Too many tries. Wait a minute and try again.") };
  return { ok: true, body: parsed.data, access, ip };
}

/**
 * 409 with the words for the client when the quote bills fewer print locations than the job's proof
 * shows (the shop is told in its activity); null when the quote covers every print.
 */
export async function refuseQuoteBehindProof(access: Granted<unknown>["access"], via: "accept" | "checkout"): Promise<NextResponse | null> {
  const held = await holdQuoteBehindProof({ quote: access.quote, payer: access.payer, via });
  return held.ok ? null : NextResponse.json({ error: held.message }, { status: held.status });
}
