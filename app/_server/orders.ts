import "server-only";
import type Stripe from "stripe";
import { getActor } from "@/app/_server/access";
import { appUrl } from "@/app/_server/config";
import { composeMail } from "@/app/_server/emails";
import { sendMailSafely } from "@/app/_server/mail";
import { getStripe } from "@/app/_server/payments";
import { listClients } from "@/db/queries/clients";
import { findJobById } from "@/db/queries/jobs";
import {
  applyPaymentEvent,
  attachCheckout,
  createPayment,
  currentQuote,
  findAwaitingPayment,
  findQuote,
  getStoredPriceMatrix,
  listPayments,
  markReceiptSent,
  recordQuoteHeld,
  settlePayment,
  type PaymentChange,
} from "@/db/queries/orders";
import { listProofPrints } from "@/db/queries/proof-prints";
import { findProofShop } from "@/db/queries/proofs";
import { lookupShareToken } from "@/db/queries/review";
import { findShopById } from "@/db/queries/shops";
import type { Payment, QuoteRow } from "@/db/schema";
import { DEFAULT_PRICE_MATRIX, formatCents, priceMatrixSchema, type PriceMatrix } from "@/lib/pricing";
import { compareQuoteToProofs, locationWords, type BilledLocation, type QuoteProofMismatch } from "@/lib/quote-check";
import { checkoutAmount, moneySummary, PAYMENT_KIND_LABELS, type MoneySummary, type PaymentKind } from "@/lib/quotes";

/** The shop's matrix; the demo matrix until the owner saves one (a stored matrix that no longer parses is reported). */
export async function loadPriceMatrix(shopId: string): Promise<{ matrix: PriceMatrix; updatedAt: Date | null; isDemo: boolean; problem: string | null }> {
  const stored = await getStoredPriceMatrix({ shopId });
  if (!stored?.matrix) return { matrix: DEFAULT_PRICE_MATRIX, updatedAt: null, isDemo: true, problem: null };
  const parsed = priceMatrixSchema.safeParse(stored.matrix);
  if (!parsed.success) return { matrix: DEFAULT_PRICE_MATRIX, updatedAt: stored.updatedAt, isDemo: true, problem: "The saved price matrix could not be read; the demo prices are shown until it is saved again." };
  return { matrix: parsed.data, updatedAt: stored.updatedAt, isDemo: false, problem: null };
}

export async function jobMoney(jobId: string): Promise<{ quote: QuoteRow | undefined; payments: Payment[]; summary: MoneySummary }> {
  const [quote, payments] = await Promise.all([currentQuote({ jobId }), listPayments({ jobId })]);
  return { quote, payments, summary: moneySummary({ quote: quote ?? null, payments }) };
}

// ---------------------------------------------------------------------------
// The quote follows the proof
// ---------------------------------------------------------------------------

/**
 * How the locations a quote bills compare with the prints the job's proofs show (lib/quote-check.ts).
 * `includeWorking`: count proofs never sent by their working placements (the shop's view); at pay
 * time only what the client was sent counts.
 */
export async function checkQuoteAgainstProofs(input: { shopId: string; jobId: string; method: string; billed: ReadonlyArray<BilledLocation>; includeWorking: boolean }): Promise<QuoteProofMismatch[]> {
  const { proofs, artColours } = await listProofPrints({ shopId: input.shopId, jobId: input.jobId });
  return compareQuoteToProofs({ method: input.method, billed: input.billed, proofs, artColours, includeWorking: input.includeWorking });
}

function joinWords(words: readonly string[]): string {
  return words.length <= 1 ? words.join("") : `${words.slice(0, -1).join(", ")} and ${words[words.length - 1]}`;
}

/**
 * A client about to accept or pay never does so for fewer locations than the proof shows: when the
 * frozen quote bills fewer, the client is told the shop is updating it, nothing is started, and the
 * shop finds an entry in its activity.
 */
export async function holdQuoteBehindProof({ quote, payer, via }: { quote: QuoteRow; payer: Payer; via: "accept" | "checkout" }): Promise<{ ok: true } | { ok: false; status: 409; message: string }> {
  const mismatches = await checkQuoteAgainstProofs({ shopId: quote.shopId, jobId: quote.jobId, method: quote.snapshot.job.method, billed: quote.snapshot.job.locations, includeWorking: false });
  const missing = mismatches.filter((m) => m.blocking).map((m) => locationWords(m.location));
  if (missing.length === 0) return { ok: true };
  await recordQuoteHeld({ quote, missing, via, actorUserId: payer.userId, actorLabel: payer.via === "link" ? `review link${payer.name ? ` · ${payer.name}` : ""}` : payer.name });
  const where = joinWords(missing);
  const outcome = via === "checkout" ? "No payment was started and nothing was charged" : "The quote was not accepted and nothing is owed";
  return { ok: false, status: 409, message: `The print shop is updating this quote to match your proof, which also prints on the ${where}. ${outcome}; the shop will send you the updated quote.` };
}

// ---------------------------------------------------------------------------
// Who is paying
// ---------------------------------------------------------------------------

export type Payer = { via: "portal" | "link"; userId: string | null; name: string | null; email: string | null; canAccept: boolean; returnPath: string };

export type QuoteAccess = { ok: true; payer: Payer; quote: QuoteRow } | { ok: false; status: 401 | 403 | 404 | 410; message: string };

/**
 * A quote is reached by the client's contact (signed in) or by a review link of one of the
 * job's proofs. Shop members manage quotes from the job page, not here.
 */
export async function resolveQuoteAccess(quoteId: string, linkToken: string | undefined): Promise<QuoteAccess> {
  const quote = /^[A-Za-z0-9-]{1,80}$/.test(quoteId) ? await findQuote({ quoteId }) : undefined;
  if (!quote) return { ok: false, status: 404, message: "This quote does not exist." };
  if (linkToken) {
    const found = await lookupShareToken(linkToken);
    if (found.state === "missing") return { ok: false, status: 404, message: "This quote does not exist." };
    if (found.state !== "ok") return { ok: false, status: 410, message: "This review link is no longer open. Ask the print shop for a new one." };
    const proof = await findProofShop({ proofId: found.link.proofId });
    if (!proof || proof.jobId !== quote.jobId) return { ok: false, status: 404, message: "This quote does not exist." };
    return {
      ok: true,
      quote,
      payer: { via: "link", userId: null, name: found.link.recipientName, email: found.link.recipientEmail, canAccept: found.link.permission === "approve", returnPath: `/r/${linkToken}` },
    };
  }
  const actor = await getActor();
  if (!actor) return { ok: false, status: 401, message: "Sign in to continue." };
  const job = await findJobById({ jobId: quote.jobId });
  if (!job || !actor.contacts.some((c) => c.shopId === job.shopId && c.clientId === job.clientId)) {
    return { ok: false, status: 404, message: "This quote does not exist." };
  }
  return { ok: true, quote, payer: { via: "portal", userId: actor.id, name: actor.name, email: actor.email, canAccept: true, returnPath: `/portal/jobs/${job.id}` } };
}

// ---------------------------------------------------------------------------
// Checkout
// ---------------------------------------------------------------------------

export type CheckoutStart = { ok: true; url: string } | { ok: false; status: number; message: string };

export async function startCheckout({ quote, payer, kind }: { quote: QuoteRow; payer: Payer; kind: PaymentKind }): Promise<CheckoutStart> {
  const stripe = getStripe();
  if (!stripe) return { ok: false, status: 503, message: "Card payments are not set up for this shop yet. Contact the print shop to pay." };
  const current = await currentQuote({ jobId: quote.jobId });
  if (!current || current.id !== quote.id) return { ok: false, status: 409, message: "The shop has sent a newer quote. Reload the page to see it." };
  const held = await holdQuoteBehindProof({ quote: current, payer, via: "checkout" });
  if (!held.ok) return held;
  const { summary } = await jobMoney(quote.jobId);
  const amount = checkoutAmount(summary, kind);
  if (!amount.ok) return { ok: false, status: 409, message: amount.message };

  // Sending the payer back to a checkout that is still open avoids paying the same thing twice.
  const awaiting = await findAwaitingPayment({ quoteId: quote.id, kind, amountCents: amount.amountCents });
  if (awaiting?.checkoutSessionId) {
    const session = await stripe.checkout.sessions.retrieve(awaiting.checkoutSessionId).catch(() => null);
    if (session?.status === "open" && session.url) return { ok: true, url: session.url };
    if (session?.status === "complete" && session.payment_status === "paid") {
      await recordSessionPaid(session);
      return { ok: false, status: 409, message: "That payment has already gone through. Reload the page." };
    }
  }

  const shop = await findShopById({ shopId: quote.shopId });
  const payment = await createPayment({ shopId: quote.shopId, jobId: quote.jobId, quoteId: quote.id, kind, amountCents: amount.amountCents, startedVia: payer.via });
  const back = `${appUrl()}${payer.returnPath}`;
  const title = quote.snapshot.job.title;
  try {
    const session = await stripe.checkout.sessions.create(
      {
        mode: "payment",
        line_items: [
          {
            quantity: 1,
            price_data: {
              currency: quote.snapshot.quote.currency,
              unit_amount: amount.amountCents,
              product_data: { name: `${PAYMENT_KIND_LABELS[kind]}: ${title}`, description: `${shop?.name ?? "Print shop"}, quote Q${quote.number}` },
            },
          },
        ],
        client_reference_id: payment.id,
        metadata: { paymentId: payment.id, jobId: quote.jobId, quoteId: quote.id },
        payment_intent_data: { metadata: { paymentId: payment.id, jobId: quote.jobId } },
        ...(payer.email ? { customer_email: payer.email } : {}),
        success_url: `${back}${back.includes("?") ? "&" : "?"}checkout={CHECKOUT_SESSION_ID}`,
        cancel_url: `${back}${back.includes("?") ? "&" : "?"}checkout=cancelled`,
      },
      { idempotencyKey: `checkout-${payment.id}` },
    );
    await attachCheckout({ paymentId: payment.id, sessionId: session.id, url: session.url });
    if (!session.url) return { ok: false, status: 502, message: "The payment service did not return a checkout page. Try again." };
    return { ok: true, url: session.url };
  } catch (error) {
    console.error("[payments] checkout could not start:", error instanceof Error ? error.message : error);
    return { ok: false, status: 502, message: "The payment service could not be reached. Nothing was charged; try again in a minute." };
  }
}

// ---------------------------------------------------------------------------
// Webhook and return
// ---------------------------------------------------------------------------

function sessionChange(session: Stripe.Checkout.Session) {
  const paymentId = session.metadata?.paymentId ?? session.client_reference_id;
  if (!paymentId) return null;
  return {
    paymentId,
    to: "paid" as const,
    sessionId: session.id,
    paymentIntentId: typeof session.payment_intent === "string" ? session.payment_intent : (session.payment_intent?.id ?? null),
    payerEmail: session.customer_details?.email ?? session.customer_email ?? null,
    amountCents: session.amount_total,
  };
}

async function afterChange(change: PaymentChange): Promise<void> {
  if (change.outcome === "paid" && change.payment) await sendReceipt(change.payment);
}

/** Handles a verified webhook event once. Returns what it did, for the log and the tests. */
export async function handlePaymentEvent(event: Stripe.Event): Promise<{ outcome: string; duplicate: boolean }> {
  let change: Parameters<typeof applyPaymentEvent>[1] = null;
  switch (event.type) {
    case "checkout.session.completed":
    case "checkout.session.async_payment_succeeded": {
      const session = event.data.object;
      if (session.payment_status === "paid") change = sessionChange(session);
      break;
    }
    case "checkout.session.expired": {
      const session = event.data.object;
      const paymentId = session.metadata?.paymentId ?? session.client_reference_id;
      if (paymentId) change = { paymentId, to: "lapsed", sessionId: session.id };
      break;
    }
    case "payment_intent.succeeded": {
      const intent = event.data.object;
      const paymentId = intent.metadata?.paymentId;
      if (paymentId) change = { paymentId, to: "paid", paymentIntentId: intent.id, payerEmail: intent.receipt_email ?? null, amountCents: intent.amount_received || intent.amount };
      break;
    }
    default:
      break;
  }
  const result = await applyPaymentEvent({ id: event.id, type: event.type }, change);
  if (!result.duplicate) await afterChange(result);
  return { outcome: result.outcome, duplicate: result.duplicate };
}

/** The payer came back with a session id: confirm with the payment service, in case the webhook is late. */
export async function confirmReturn(sessionId: string): Promise<"paid" | "pending" | "unknown"> {
  if (!/^cs_[A-Za-z0-9_]{1,200}$/.test(sessionId)) return "unknown";
  const stripe = getStripe();
  if (!stripe) return "unknown";
  const session = await stripe.checkout.sessions.retrieve(sessionId).catch(() => null);
  if (!session) return "unknown";
  if (session.payment_status !== "paid") return "pending";
  await recordSessionPaid(session);
  return "paid";
}

async function recordSessionPaid(session: Stripe.Checkout.Session) {
  const change = sessionChange(session);
  if (!change) return;
  await afterChange(await settlePayment(change));
}

// ---------------------------------------------------------------------------
// Receipt
// ---------------------------------------------------------------------------

async function sendReceipt(payment: Payment): Promise<void> {
  if (!(await markReceiptSent({ paymentId: payment.id }))) return;
  const [quote, job, shop, money] = await Promise.all([findQuote({ quoteId: payment.quoteId }), findJobById({ jobId: payment.jobId }), findShopById({ shopId: payment.shopId }), jobMoney(payment.jobId)]);
  if (!quote || !job) return;
  const clientContacts = (await listClients({ shopId: payment.shopId, includeArchived: true })).find((c) => c.id === job.clientId)?.contacts ?? [];
  const to = new Set<string>([payment.payerEmail, ...clientContacts.map((c) => c.email)].filter((e): e is string => Boolean(e)));
  const currency = quote.snapshot.quote.currency;
  const paidText = formatCents(payment.amountCents, currency);
  const balance = money.summary.balanceCents;
  for (const address of to) {
    await sendMailSafely(
      composeMail({
        to: address,
        subject: `Receipt: ${paidText} paid for ${job.title}`,
        heading: `Thank you: ${paidText} received`,
        paragraphs: [
          `${shop?.name ?? "The print shop"} received your ${PAYMENT_KIND_LABELS[payment.kind].toLowerCase()} of ${paidText} for "${job.title}" (quote Q${quote.number}, total ${formatCents(quote.totalCents, currency)}).`,
          `Paid so far: ${formatCents(money.summary.paidCents, currency)}. ${balance > 0 ? `Balance due: ${formatCents(balance, currency)}.` : "Nothing more is due."}`,
          `Receipt number: ${payment.id.slice(0, 8).toUpperCase()}. Paid on ${(payment.paidAt ?? new Date()).toUTCString()}.`,
        ],
        action: { label: "See the job", url: `${appUrl()}/portal/jobs/${job.id}` },
        footnote: "Keep this e-mail for your records. Card details are handled by the payment service and never reach the print shop.",
      }),
    );
  }
}

// ---------------------------------------------------------------------------
// What the client's quote panel shows
// ---------------------------------------------------------------------------

export type QuotePanelData = {
  quote: { id: string; number: number; state: QuoteRow["state"]; sentAt: string; acceptedName: string | null; acceptedAt: string | null; snapshot: QuoteRow["snapshot"] };
  summary: MoneySummary;
  payments: Array<{ id: string; kind: PaymentKind; amountCents: number; state: Payment["state"]; paidAt: string | null }>;
  paymentsReady: boolean;
  /** The shop's locale and time zone, for its dates and money. */
  clock: { locale: string | null; timeZone: string | null };
};

export async function quotePanelData(jobId: string): Promise<QuotePanelData | null> {
  const { quote, payments, summary } = await jobMoney(jobId);
  if (!quote) return null;
  const shop = await findShopById({ shopId: quote.shopId });
  return {
    quote: { id: quote.id, number: quote.number, state: quote.state, sentAt: quote.sentAt.toISOString(), acceptedName: quote.acceptedName, acceptedAt: quote.acceptedAt?.toISOString() ?? null, snapshot: quote.snapshot },
    summary,
    payments: payments.filter((p) => p.state === "paid").map((p) => ({ id: p.id, kind: p.kind, amountCents: p.amountCents, state: p.state, paidAt: p.paidAt?.toISOString() ?? null })),
    paymentsReady: Boolean(getStripe()),
    clock: { locale: shop?.locale ?? null, timeZone: shop?.timeZone ?? null },
  };
}
