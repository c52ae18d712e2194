import { NextResponse } from "next/server";
import type Stripe from "stripe";
import { handlePaymentEvent } from "@/app/_server/orders";
import { getStripe, paymentEventSchema, webhookSecret } from "@/app/_server/payments";
import { parseInput } from "@/lib/input";

export const dynamic = "force-dynamic";

/**
 * Payment events from the payment service (or its local fake). The signature is checked on the
 * raw body before anything is read; a bad one gets 400 and changes nothing. Each event id is
 * applied once, so redeliveries and reordered events never count a payment twice.
 */
export async function POST(request: Request) {
  const stripe = getStripe();
  const secret = webhookSecret();
  if (!stripe || !secret) return NextResponse.json({ error: "Payments are not set up." }, { status: 503 });
  const signature = request.headers.get("stripe-signature");
  if (!signature) return NextResponse.json({ error: "Missing signature." }, { status: 400 });
  const body = await request.text();
  let event: Stripe.Event;
  try {
    event = stripe.webhooks.constructEvent(body, signature, secret);
  } catch {
    return NextResponse.json({ error: "The signature does not match." }, { status: 400 });
  }
  // Signed, yet not an event this can read: refused for good, so it is not retried forever.
  if (!parseInput(paymentEventSchema, event).success) return NextResponse.json({ error: "The event could not be read." }, { status: 400 });
  try {
    const result = await handlePaymentEvent(event);
    return NextResponse.json({ received: true, ...result });
  } catch (error) {
    // A 500 makes the sender retry later; the event id was not stored, so the retry is applied.
    console.error("[payments] webhook failed:", error instanceof Error ? error.message : error);
    return NextResponse.json({ error: "Could not record the event; it will be retried." }, { status: 500 });
  }
}
