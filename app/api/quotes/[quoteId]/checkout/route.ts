import { NextResponse } from "next/server";
import { z } from "zod";
import { resolveQuoteAccess, startCheckout } from "@/app/_server/orders";
import { takeToken } from "@/app/_server/rate-limit";
import { clientIp } from "@/app/_server/review";
import { PAYMENT_KINDS } from "@/db/schema";

export const dynamic = "force-dynamic";

const schema = z.object({
  kind: z.enum(PAYMENT_KINDS, { message: "Pick what to pay." }),
  link: z.string().max(200).optional(),
});

/** Opens a checkout for the deposit, the full amount or the balance, and answers with its page. */
export async function POST(request: Request, { params }: { params: Promise<{ quoteId: string }> }) {
  const { quoteId } = await params;
  const parsed = schema.safeParse(await request.json().catch(() => undefined));
  if (!parsed.success) return NextResponse.json({ error: parsed.error.issues[0]?.message ?? "That could not be read." }, { status: 400 });
  const access = await resolveQuoteAccess(quoteId, parsed.data.link);
  if (!access.ok) return NextResponse.json({ error: access.message }, { status: access.status });
  if (!takeToken(`checkout:${quoteId}:${clientIp(request) ?? "?"}`, { capacity: 8, refillPerMinute: 4 })) {
    return NextResponse.json({ error: "Too many tries. Wait a minute and try again." }, { status: 429 });
  }
  const started = await startCheckout({ quote: access.quote, payer: access.payer, kind: parsed.data.kind });
  if (!started.ok) return NextResponse.json({ error: started.message }, { status: started.status });
  return NextResponse.json({ url: started.url });
}
