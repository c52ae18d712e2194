import { NextResponse } from "next/server";
import { z } from "zod";
import { readQuoteRequest, refuseQuoteBehindProof } from "@/app/_server/quote-request";
import { LIMITS } from "@/app/_server/rate-limit";
import { acceptQuote } from "@/db/queries/orders";

export const dynamic = "force-dynamic";

const schema = z.object({
  fullName: z.string().trim().min(3, "Type your full name.").max(120).refine((v) => /\S\s+\S/.test(v), "Type your full name: first and last."),
  confirmed: z.literal(true, { message: "Tick the box to accept the quote." }),
  link: z.string().max(200).optional(),
});

/** The client accepts a sent quote with their typed name; the time, address and browser are kept with it. */
export async function POST(request: Request, { params }: { params: Promise<{ quoteId: string }> }) {
  const { quoteId } = await params;
  const req = await readQuoteRequest(request, quoteId, schema, LIMITS.quoteAccept);
  if (!req.ok) return req.response;
  const { access, body, ip } = req;
  if (!access.payer.canAccept) return NextResponse.json({ error: "This link can view the quote but not accept it. Ask the print shop for an approval link." }, { status: 403 });
  if (access.quote.state === "accepted") return NextResponse.json({ ok: true, already: true });
  if (access.quote.state === "replaced") return NextResponse.json({ error: "The shop has sent a newer quote. Reload the page to see it." }, { status: 409 });
  const behind = await refuseQuoteBehindProof(access, "accept");
  if (behind) return behind;
  const accepted = await acceptQuote({ quoteId, name: body.fullName, userId: access.payer.userId, via: access.payer.via, ip, userAgent: request.headers.get("user-agent")?.slice(0, 400) ?? null });
  if (!accepted) return NextResponse.json({ error: "The quote changed meanwhile. Reload the page." }, { status: 409 });
  return NextResponse.json({ ok: true }, { status: 201 });
}
