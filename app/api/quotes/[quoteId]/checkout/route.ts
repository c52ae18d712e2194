import { NextResponse } from "next/server";
import { z } from "zod";
import { startCheckout } from "@/app/_server/orders";
import { readQuoteRequest } from "@/app/_server/quote-request";
import { LIMITS } from "@/app/_server/rate-limit";
import { PAYMENT_KINDS } from "@/db/schema";

export const dynamic = "force-dynamic";

const schema = z.object({
  kind: z.enum(PAYMENT_KINDS, { message: "Pick what to pay." }),
  link: z.string().max(200).optional(),
});

/** Opens a checkout for the deposit, the full amount or the balance, and answers with its page. */
export async function POST(request: Request, { params }: { params: Promise<{ quoteId: string }> }) {
  const { quoteId } = await params;
  const req = await readQuoteRequest(request, quoteId, schema, LIMITS.checkout);
  if (!req.ok) return req.response;
  const started = await startCheckout({ quote: req.access.quote, payer: req.access.payer, kind: req.body.kind });
  if (!started.ok) return NextResponse.json({ error: started.message }, { status: started.status });
  return NextResponse.json({ url: started.url });
}
