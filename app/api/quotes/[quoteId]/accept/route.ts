import { NextResponse } from "next/server";
import { z } from "zod";
import { resolveQuoteAccess } from "@/app/_server/orders";
import { takeToken } from "@/app/_server/rate-limit";
import { clientIp } from "@/app/_server/review";
import { acceptQuote } from "@/db/queries/orders";

export const dynamic = "force-dynamic";

const schema = z.object({
  fullName: z.string().trim().min(3, "Type your full name.").max(120).refine((v) => /\S+\s+\S+/.test(v), "Type your full name: first and last."),
  confirmed: z.literal(true, { message: "Tick the box to accept the quote." }),
  link: z.string().max(200).optional(),
});

export async function POST(request: Request, { params }: { params: Promise<{ quoteId: string }> }) {
  const { quoteId } = await params;
  const parsed = schema.safeParse(await request.json().catch(() => undefined));
  if (!parsed.success) return NextResponse.json({ error: parsed.error.issues[0]?.message ?? "That could not be read." }, { status: 400 });
  const access = await resolveQuoteAccess(quoteId, parsed.data.link);
  if (!access.ok) return NextResponse.json({ error: access.message }, { status: access.status });
  if (!access.payer.canAccept) return NextResponse.json({ error: "This link can view the quote but not accept it. Ask the print shop for an approval link." }, { status: 403 });
  const ip = clientIp(request);
  if (!takeToken(`quote-accept:${quoteId}:${ip ?? "?"}`, { capacity: 6, refillPerMinute: 2 })) {
    return NextResponse.json({ error: "Too many tries. Wait a minute and try again." }, { status: 429 });
  }
  if (access.quote.state === "accepted") return NextResponse.json({ ok: true, already: true });
  if (access.quote.state === "replaced") return NextResponse.json({ error: "The shop has sent a newer quote. Reload the page to see it." }, { status: 409 });
  const accepted = await acceptQuote({ quoteId, name: parsed.data.fullName, userId: access.payer.userId, via: access.payer.via, ip, userAgent: request.headers.get("user-agent")?.slice(0, 400) ?? null });
  if (!accepted) return NextResponse.json({ error: "The quote changed meanwhile. Reload the page." }, { status: 409 });
  return NextResponse.json({ ok: true }, { status: 201 });
}
