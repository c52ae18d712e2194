import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as webhook } from "@/app/api/stripe/webhook/route";
import { handlePaymentEvent, jobMoney, startCheckout } from "@/app/_server/orders";
import { db } from "@/db/client";
import { createJob } from "@/db/queries/jobs";
import { acceptQuote, attachCheckout, createPayment, sendQuote } from "@/db/queries/orders";
import { paymentEvents, payments } from "@/db/schema";
import { DEFAULT_PRICE_MATRIX } from "@/lib/pricing";
import { quoteJob } from "@/lib/quotes";
import { signWebhookPayload, startStripeFake, type StripeFake } from "@/scripts/fakes/stripe";
import { shopFactory, type BuiltShop } from "@/tests/support/factory";
import { noteOnFailure } from "@/tests/support/failure-notes";

const secret = () => process.env.STRIPE_WEBHOOK_SECRET!;
const shops = shopFactory("orders");
let s: BuiltShop;
/** Event, session and payment intent ids carry this run's tag, so no two runs share one. */
const tagged = (name: string) => `${name}_${shops.tag}`;
noteOnFailure("payment ids end in", `_${shops.tag}`);

beforeAll(async () => {
  s = await shops.build({ clientAccount: true });
});

/** A job of the test's own in the file's shop, quoted and the quote accepted by the client. */
async function quotedJob(title: string) {
  const input = {
    title: `${title} ${s.tag}`,
    clientId: s.client.id,
    dueDate: "2027-04-01",
    method: "screen-print" as const,
    blankId: null,
    garmentColour: "Deep Harbor",
    printLocations: [{ location: "full-front", colours: 2 }],
    dtfAreaIn2: null,
    rush: false,
    notes: null,
    sizeRun: [
      { size: "YM", quantity: 12 },
      { size: "M", quantity: 12 },
      { size: "2XL", quantity: 2 },
    ],
  };
  const job = await createJob({ shopId: s.shop.id, actorUserId: s.owner.id, input });
  const priced = quoteJob({ ...input, garmentName: null }, DEFAULT_PRICE_MATRIX, { taxExempt: false });
  if (!priced.ok || !priced.snapshot) throw new Error(priced.ok ? "no snapshot" : priced.message);
  const quote = await sendQuote({ shopId: s.shop.id, jobId: job.id, snapshot: priced.snapshot, depositPercent: DEFAULT_PRICE_MATRIX.depositPercent, actorUserId: s.owner.id });
  await acceptQuote({ quoteId: quote.id, name: s.client.contact.name, userId: null, via: "link", ip: "127.0.0.1", userAgent: "test" });
  return { shopId: s.shop.id, job, quote };
}

function completedEvent(id: string, paymentId: string, sessionId: string, amount: number) {
  return {
    id,
    object: "event",
    api_version: "2026-10-28.endive",
    created: Math.floor(Date.now() / 1000),
    livemode: false,
    pending_webhooks: 1,
    request: { id: null, idempotency_key: null },
    type: "checkout.session.completed",
    data: { object: { id: sessionId, object: "checkout.session", amount_total: amount, currency: "usd", payment_status: "paid", status: "complete", client_reference_id: paymentId, metadata: { paymentId }, payment_intent: tagged("pi_test_1"), customer_details: { email: s.client.contact.email } } },
  };
}

function deliver(payload: string, signature: string) {
  return webhook(new Request("http://localhost/api/stripe/webhook", { method: "POST", headers: { "content-type": "application/json", "stripe-signature": signature }, body: payload }));
}

async function paymentState(id: string) {
  const [row] = await db.select().from(payments).where(eq(payments.id, id));
  return row!;
}

describe("payment webhook", () => {
  it("refuses a bad signature with 400 and changes nothing", async () => {
    const { shopId, job, quote } = await quotedJob("Webhook signature check");
    const payment = await createPayment({ shopId, jobId: job.id, quoteId: quote.id, kind: "deposit", amountCents: quote.depositCents, startedVia: "link" });
    await attachCheckout({ paymentId: payment.id, sessionId: tagged("cs_test_badsig"), url: null });
    const payload = JSON.stringify(completedEvent(tagged("evt_badsig_1"), payment.id, tagged("cs_test_badsig"), quote.depositCents));

    const wrongKey = await deliver(payload, signWebhookPayload(payload, "whsec_not_the_right_one"));
    expect(wrongKey.status).toBe(400);
    const tampered = await deliver(payload.replace(String(quote.depositCents), "1"), signWebhookPayload(payload, secret()));
    expect(tampered.status).toBe(400);
    const stale = await deliver(payload, signWebhookPayload(payload, secret(), Math.floor(Date.now() / 1000) - 3600));
    expect(stale.status).toBe(400);
    const missing = await webhook(new Request("http://localhost/api/stripe/webhook", { method: "POST", body: payload }));
    expect(missing.status).toBe(400);

    expect((await paymentState(payment.id)).state).toBe("awaiting");
    expect(await db.select().from(paymentEvents).where(eq(paymentEvents.eventId, tagged("evt_badsig_1")))).toHaveLength(0);
    expect((await jobMoney(job.id)).summary.paidCents).toBe(0);
  });

  it("counts the same event delivered twice once, and a reordered second event for the same payment changes nothing", async () => {
    const { shopId, job, quote } = await quotedJob("Webhook duplicate check");
    const payment = await createPayment({ shopId, jobId: job.id, quoteId: quote.id, kind: "deposit", amountCents: quote.depositCents, startedVia: "link" });
    await attachCheckout({ paymentId: payment.id, sessionId: tagged("cs_test_dup"), url: null });
    const payload = JSON.stringify(completedEvent(tagged("evt_dup_1"), payment.id, tagged("cs_test_dup"), quote.depositCents));

    const first = await deliver(payload, signWebhookPayload(payload, secret()));
    expect(first.status).toBe(200);
    expect(await first.json()).toMatchObject({ outcome: "paid", duplicate: false });
    const again = await deliver(payload, signWebhookPayload(payload, secret()));
    expect(again.status).toBe(200);
    expect(await again.json()).toMatchObject({ duplicate: true });

    // The payment intent's own event arrives later, with another id: the payment is already paid.
    const intentEvent = { ...completedEvent(tagged("evt_dup_2"), payment.id, tagged("cs_test_dup"), quote.depositCents), type: "payment_intent.succeeded", data: { object: { id: tagged("pi_test_1"), object: "payment_intent", amount: quote.depositCents, amount_received: quote.depositCents, metadata: { paymentId: payment.id } } } };
    const intentPayload = JSON.stringify(intentEvent);
    const third = await deliver(intentPayload, signWebhookPayload(intentPayload, secret()));
    expect(await third.json()).toMatchObject({ outcome: "unchanged", duplicate: false });

    const money = await jobMoney(job.id);
    expect(money.summary.paidCents).toBe(quote.depositCents);
    expect(money.summary.balanceCents).toBe(quote.totalCents - quote.depositCents);
    expect(money.summary.state).toBe("deposit-paid");
    expect(await db.select().from(paymentEvents).where(eq(paymentEvents.eventId, tagged("evt_dup_1")))).toHaveLength(1);
  });

  it("takes the payment intent's event first when it arrives before the session's", async () => {
    const { shopId, job, quote } = await quotedJob("Webhook reorder check");
    const payment = await createPayment({ shopId, jobId: job.id, quoteId: quote.id, kind: "full", amountCents: quote.totalCents, startedVia: "portal" });
    await attachCheckout({ paymentId: payment.id, sessionId: tagged("cs_test_reorder"), url: null });
    const intent = await handlePaymentEvent({ id: tagged("evt_reorder_pi"), type: "payment_intent.succeeded", data: { object: { id: tagged("pi_reorder"), amount: quote.totalCents, amount_received: quote.totalCents, metadata: { paymentId: payment.id }, receipt_email: null } } } as never);
    expect(intent.outcome).toBe("paid");
    const session = await handlePaymentEvent(completedEvent(tagged("evt_reorder_cs"), payment.id, tagged("cs_test_reorder"), quote.totalCents) as never);
    expect(session.outcome).toBe("unchanged");
    expect((await jobMoney(job.id)).summary).toMatchObject({ state: "paid-in-full", paidCents: quote.totalCents, balanceCents: 0 });
  });

  it("never marks a payment paid for a different amount than it asked for", async () => {
    const { shopId, job, quote } = await quotedJob("Webhook amount check");
    const payment = await createPayment({ shopId, jobId: job.id, quoteId: quote.id, kind: "deposit", amountCents: quote.depositCents, startedVia: "link" });
    const result = await handlePaymentEvent(completedEvent(tagged("evt_amount"), payment.id, tagged("cs_test_amount"), 100) as never);
    expect(result.outcome).toBe("unknown-payment");
    expect((await paymentState(payment.id)).state).toBe("awaiting");
  });
});

describe("checkout through the payments SDK and the local fake", () => {
  let fake: StripeFake;
  const saved = { ...process.env };
  beforeAll(async () => {
    const { mkdtempSync } = await import("node:fs");
    const { tmpdir } = await import("node:os");
    const path = await import("node:path");
    fake = await startStripeFake({ port: 0, dir: mkdtempSync(path.join(tmpdir(), "chalkline-pay-")), webhookUrl: null, webhookSecret: secret(), log: () => {} });
    process.env.STRIPE_FAKE_URL = fake.url;
  });
  afterAll(async () => {
    process.env.STRIPE_FAKE_URL = saved.STRIPE_FAKE_URL;
    await fake.close();
  });

  it("opens a deposit checkout for the accepted quote, and sends the payer back to the same open one", async () => {
    const { job, quote } = await quotedJob("Checkout start check");
    const payer = { via: "portal" as const, userId: null, name: s.client.contact.name, email: s.client.contact.email, canAccept: true, returnPath: `/portal/jobs/${job.id}` };
    const first = await startCheckout({ quote, payer, kind: "deposit" });
    expect(first).toMatchObject({ ok: true });
    const second = await startCheckout({ quote, payer, kind: "deposit" });
    expect(second).toEqual(first);
    const rows = await db.select().from(payments).where(eq(payments.jobId, job.id));
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ kind: "deposit", amountCents: quote.depositCents, state: "awaiting" });
    expect(rows[0]!.checkoutSessionId).toMatch(/^cs_/);

    const balance = await startCheckout({ quote, payer, kind: "balance" });
    expect(balance).toMatchObject({ ok: false, status: 409 });
  });
});
