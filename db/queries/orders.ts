import "server-only";
import { and, desc, eq, gt, max, ne, sql } from "drizzle-orm";
import type { QuoteSnapshot } from "@/lib/quotes";
import { db } from "../client";
import { auditLog, paymentEvents, payments, quotes, shops, type Payment, type QuoteRow } from "../schema";
import { recordAudit } from "./audit";

// ---------------------------------------------------------------------------
// Price matrix
// ---------------------------------------------------------------------------

export async function getStoredPriceMatrix({ shopId }: { shopId: string }) {
  const [row] = await db.select({ matrix: shops.priceMatrix, updatedAt: shops.priceMatrixUpdatedAt }).from(shops).where(eq(shops.id, shopId)).limit(1);
  return row;
}

export async function savePriceMatrix({ shopId, matrix, actorUserId }: { shopId: string; matrix: unknown; actorUserId: string }) {
  await db.transaction(async (tx) => {
    await tx.update(shops).set({ priceMatrix: matrix, priceMatrixUpdatedAt: new Date() }).where(eq(shops.id, shopId));
    await recordAudit({ shopId, actorUserId, action: "prices.updated", subjectType: "shop", subjectId: shopId }, tx);
  });
}

// ---------------------------------------------------------------------------
// Quotes
// ---------------------------------------------------------------------------

/** The newest quote still in force (sent or accepted), if any. */
export async function currentQuote({ jobId }: { jobId: string }): Promise<QuoteRow | undefined> {
  const [row] = await db
    .select()
    .from(quotes)
    .where(and(eq(quotes.jobId, jobId), ne(quotes.state, "replaced")))
    .orderBy(desc(quotes.number))
    .limit(1);
  return row;
}

export async function listQuotes({ jobId }: { jobId: string }) {
  return db.select().from(quotes).where(eq(quotes.jobId, jobId)).orderBy(desc(quotes.number));
}

export async function findQuote({ quoteId }: { quoteId: string }) {
  const [row] = await db.select().from(quotes).where(eq(quotes.id, quoteId)).limit(1);
  return row;
}

/** Freezes a new quote and replaces the one before it, in one transaction. */
export async function sendQuote(input: { shopId: string; jobId: string; snapshot: QuoteSnapshot; depositPercent: number; actorUserId: string }) {
  return db.transaction(async (tx) => {
    // Serialise quotes of one job: the row lock makes the number and the replacement safe.
    await tx.execute(sql`select id from jobs where id = ${input.jobId} for update`);
    const [last] = await tx.select({ n: max(quotes.number) }).from(quotes).where(eq(quotes.jobId, input.jobId));
    await tx.update(quotes).set({ state: "replaced" }).where(and(eq(quotes.jobId, input.jobId), ne(quotes.state, "replaced")));
    const [quote] = await tx
      .insert(quotes)
      .values({
        shopId: input.shopId,
        jobId: input.jobId,
        number: (last?.n ?? 0) + 1,
        snapshot: input.snapshot,
        totalCents: input.snapshot.quote.totalCents,
        depositCents: input.snapshot.quote.depositCents,
        depositPercent: input.depositPercent,
        sentBy: input.actorUserId,
      })
      .returning();
    await recordAudit({ shopId: input.shopId, actorUserId: input.actorUserId, action: "quote.sent", subjectType: "job", subjectId: input.jobId, detail: { title: input.snapshot.job.title, number: quote!.number } }, tx);
    return quote!;
  });
}

/** Accepts a quote once; a second accept (or a replaced quote) changes nothing and returns undefined. */
export async function acceptQuote(input: { quoteId: string; name: string; userId: string | null; via: "portal" | "link"; ip: string | null; userAgent: string | null }) {
  return db.transaction(async (tx) => {
    const [quote] = await tx
      .update(quotes)
      .set({ state: "accepted", acceptedAt: new Date(), acceptedName: input.name, acceptedByUser: input.userId, acceptedVia: input.via, acceptedIp: input.ip, acceptedUserAgent: input.userAgent })
      .where(and(eq(quotes.id, input.quoteId), eq(quotes.state, "sent")))
      .returning();
    if (quote) await recordAudit({ shopId: quote.shopId, actorUserId: input.userId, actorLabel: input.name, action: "quote.accepted", subjectType: "job", subjectId: quote.jobId, detail: { number: quote.number, title: quote.snapshot.job.title } }, tx);
    return quote;
  });
}

/**
 * Tells the shop that a client was stopped from accepting or paying a quote that bills fewer
 * print locations than the proof shows. One entry per quote an hour (our own choice), so a client
 * trying again does not fill the activity list. Returns whether an entry was written.
 */
export async function recordQuoteHeld(input: { quote: Pick<QuoteRow, "id" | "shopId" | "jobId" | "number" | "snapshot">; missing: string[]; via: "accept" | "checkout"; actorUserId: string | null; actorLabel: string | null }): Promise<boolean> {
  const [recent] = await db
    .select({ id: auditLog.id })
    .from(auditLog)
    .where(and(eq(auditLog.shopId, input.quote.shopId), eq(auditLog.action, "quote.held"), eq(auditLog.subjectId, input.quote.jobId), sql`${auditLog.detail} ->> 'quoteId' = ${input.quote.id}`, gt(auditLog.at, sql`now() - interval '1 hour'`)))
    .limit(1);
  if (recent) return false;
  await recordAudit({
    shopId: input.quote.shopId,
    actorUserId: input.actorUserId,
    actorLabel: input.actorLabel,
    action: "quote.held",
    subjectType: "job",
    subjectId: input.quote.jobId,
    detail: { quoteId: input.quote.id, number: input.quote.number, title: input.quote.snapshot.job.title, missing: input.missing, via: input.via },
  });
  return true;
}

// ---------------------------------------------------------------------------
// Payments
// ---------------------------------------------------------------------------

export async function listPayments({ jobId }: { jobId: string }): Promise<Payment[]> {
  return db.select().from(payments).where(eq(payments.jobId, jobId)).orderBy(desc(payments.createdAt));
}

export async function findPayment({ paymentId }: { paymentId: string }) {
  const [row] = await db.select().from(payments).where(eq(payments.id, paymentId)).limit(1);
  return row;
}

/** An awaiting checkout for the same quote, kind and amount, to send the payer back to instead of opening another. */
export async function findAwaitingPayment({ quoteId, kind, amountCents }: { quoteId: string; kind: Payment["kind"]; amountCents: number }) {
  const [row] = await db
    .select()
    .from(payments)
    .where(and(eq(payments.quoteId, quoteId), eq(payments.kind, kind), eq(payments.amountCents, amountCents), eq(payments.state, "awaiting")))
    .orderBy(desc(payments.createdAt))
    .limit(1);
  return row;
}

export async function createPayment(input: { shopId: string; jobId: string; quoteId: string; kind: Payment["kind"]; amountCents: number; startedVia: "portal" | "link" }) {
  const [row] = await db.insert(payments).values(input).returning();
  return row!;
}

export async function attachCheckout({ paymentId, sessionId, url }: { paymentId: string; sessionId: string; url: string | null }) {
  await db.update(payments).set({ checkoutSessionId: sessionId, checkoutUrl: url }).where(eq(payments.id, paymentId));
}

export async function markPaymentLapsed({ paymentId }: { paymentId: string }) {
  await db.update(payments).set({ state: "lapsed" }).where(and(eq(payments.id, paymentId), eq(payments.state, "awaiting")));
}

export type PaymentChange = { outcome: "paid" | "lapsed" | "unchanged" | "unknown-payment"; payment?: Payment };

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

async function settle(tx: Tx, change: { paymentId: string; to: "paid" | "lapsed"; sessionId?: string | null; paymentIntentId?: string | null; payerEmail?: string | null; amountCents?: number | null }): Promise<PaymentChange> {
  const [existing] = await tx.select().from(payments).where(eq(payments.id, change.paymentId)).for("update").limit(1);
  if (!existing) return { outcome: "unknown-payment" };
  if (change.sessionId && existing.checkoutSessionId && existing.checkoutSessionId !== change.sessionId) return { outcome: "unknown-payment" };
  if (change.to === "paid") {
    if (existing.state === "paid") return { outcome: "unchanged", payment: existing };
    if (change.amountCents != null && change.amountCents !== existing.amountCents) return { outcome: "unknown-payment", payment: existing };
    const [updated] = await tx
      .update(payments)
      .set({ state: "paid", paidAt: new Date(), paymentIntentId: change.paymentIntentId ?? existing.paymentIntentId, payerEmail: change.payerEmail ?? existing.payerEmail, checkoutSessionId: existing.checkoutSessionId ?? change.sessionId ?? null })
      .where(eq(payments.id, existing.id))
      .returning();
    const [paidQuote] = await tx.select({ snapshot: quotes.snapshot }).from(quotes).where(eq(quotes.id, existing.quoteId)).limit(1);
    await recordAudit({ shopId: existing.shopId, actorLabel: "Payments", action: "payment.received", subjectType: "job", subjectId: existing.jobId, detail: { kind: existing.kind, amountCents: existing.amountCents, currency: paidQuote?.snapshot.quote.currency ?? "usd" } }, tx);
    return { outcome: "paid", payment: updated };
  }
  if (existing.state !== "awaiting") return { outcome: "unchanged", payment: existing };
  const [updated] = await tx.update(payments).set({ state: "lapsed" }).where(eq(payments.id, existing.id)).returning();
  return { outcome: "lapsed", payment: updated };
}

/**
 * Applies one webhook event exactly once. The event id is stored in the same transaction as the
 * change, so a repeated delivery finds it and changes nothing; a paid payment never goes back.
 */
export async function applyPaymentEvent(event: { id: string; type: string }, change: Parameters<typeof settle>[1] | null): Promise<PaymentChange & { duplicate: boolean }> {
  return db.transaction(async (tx) => {
    const inserted = await tx
      .insert(paymentEvents)
      .values({ eventId: event.id, type: event.type, paymentId: change?.paymentId ?? null, outcome: "pending" })
      .onConflictDoNothing()
      .returning({ eventId: paymentEvents.eventId });
    if (inserted.length === 0) return { outcome: "unchanged", duplicate: true };
    const result: PaymentChange = change ? await settle(tx, change) : { outcome: "unchanged" };
    await tx.update(paymentEvents).set({ outcome: result.outcome }).where(eq(paymentEvents.eventId, event.id));
    return { ...result, duplicate: false };
  });
}

/** The same change, from the payer coming back from checkout (no event id): idempotent by payment state. */
export async function settlePayment(change: Parameters<typeof settle>[1]): Promise<PaymentChange> {
  return db.transaction((tx) => settle(tx, change));
}

export async function markReceiptSent({ paymentId }: { paymentId: string }): Promise<boolean> {
  const rows = await db
    .update(payments)
    .set({ receiptSentAt: new Date() })
    .where(and(eq(payments.id, paymentId), sql`${payments.receiptSentAt} is null`))
    .returning({ id: payments.id });
  return rows.length > 0;
}

export async function countPaymentEvents({ eventId }: { eventId: string }) {
  const rows = await db.select().from(paymentEvents).where(eq(paymentEvents.eventId, eventId));
  return rows.length;
}
