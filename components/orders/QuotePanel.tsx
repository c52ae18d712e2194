"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import type { QuotePanelData } from "@/app/_server/orders";
import { formatShopDate, formatShopDateTime } from "@/lib/dates";
import { formatMoney } from "@/lib/money";
import { MONEY_STATE_LABELS, PAYMENT_KIND_LABELS, type PaymentKind } from "@/lib/money-states";
import { Notice } from "./Notice";
import { useHydrated } from "./useHydrated";
import { QuoteLines } from "./QuoteLines";

async function post<T>(url: string, body: unknown): Promise<T> {
  const res = await fetch(url, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  const data = (await res.json().catch(() => ({}))) as T & { error?: string };
  if (!res.ok) throw new Error(data.error ?? "Something went wrong. Try again.");
  return data;
}

/**
 * The client's side of a quote: every line, accept with a typed name, then pay the deposit, the
 * full amount or the balance on the payment service's page.
 */
export function QuotePanel({ data, linkToken, canAccept }: { data: QuotePanelData; linkToken?: string; canAccept: boolean }) {
  const router = useRouter();
  const hydrated = useHydrated();
  const { quote, summary } = data;
  const currency = quote.snapshot.quote.currency;
  const clock = data.clock;
  const money = (c: number) => formatMoney(c, { currency, locale: clock.locale });
  const [fullName, setFullName] = useState("");
  const [confirmed, setConfirmed] = useState(false);

  const accept = useMutation({
    mutationFn: () => post<{ ok: true }>(`/api/quotes/${quote.id}/accept`, { fullName, confirmed, link: linkToken }),
    onSuccess: () => router.refresh(),
  });
  const pay = useMutation({
    mutationFn: (kind: PaymentKind) => post<{ url: string }>(`/api/quotes/${quote.id}/checkout`, { kind, link: linkToken }),
    onSuccess: ({ url }) => {
      setLeaving(true);
      window.location.assign(url);
    },
  });
  // From the click until the payment page has replaced this one: the button says what is happening.
  const [leaving, setLeaving] = useState(false);
  const opening = pay.isPending || leaving ? pay.variables : undefined;

  const job = quote.snapshot.job;
  return (
    <section id="quote" className="card scroll-mt-20 space-y-4 p-5" aria-label="Quote" data-testid="quote-panel" data-hydrated={hydrated}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="text-lg">Quote Q{quote.number}</h2>
        <span className="rounded-full bg-paper-200 px-2.5 py-0.5 text-xs font-medium" data-testid="quote-state">
          {MONEY_STATE_LABELS[summary.state]}
        </span>
      </div>
      <p className="text-sm text-ink-600">
        {job.garmentName ? `${job.garmentName}${job.garmentColour ? `, ${job.garmentColour}` : ""}. ` : ""}
        {job.locations.map((l) => l.label).join(", ")}. {job.sizeRun.map((r) => `${r.size} × ${r.quantity}`).join(", ")}.
      </p>
      <QuoteLines quote={quote.snapshot.quote} locale={clock.locale} />

      {summary.state === "quote-sent" ? (
        canAccept ? (
          <form
            className="space-y-3 rounded-lg border border-paper-300 p-4"
            onSubmit={(e) => {
              e.preventDefault();
              accept.mutate();
            }}
            aria-label="Accept the quote"
          >
            <label className="flex items-start gap-2 text-sm">
              <input type="checkbox" className="mt-1 accent-patina-600" checked={confirmed} onChange={(e) => setConfirmed(e.target.checked)} />
              <span>
                I accept this quote of {money(quote.snapshot.quote.totalCents)} for the garments and sizes above
                {quote.snapshot.quote.depositCents > 0 && quote.snapshot.quote.depositCents < quote.snapshot.quote.totalCents ? `, with a deposit of ${money(quote.snapshot.quote.depositCents)} to start the work` : ""}.
              </span>
            </label>
            <div>
              <label htmlFor="quote-name" className="field-label">
                Your full name
              </label>
              <input id="quote-name" className="field-input" autoComplete="name" value={fullName} onChange={(e) => setFullName(e.target.value)} />
            </div>
            {accept.error ? <Notice tone="error">{accept.error.message}</Notice> : null}
            <button type="submit" className="btn-primary" disabled={accept.isPending}>
              {accept.isPending ? "Accepting…" : "Accept quote"}
            </button>
          </form>
        ) : (
          <p className="text-sm text-ink-600">Ask the print shop for an approval link to accept this quote.</p>
        )
      ) : null}

      {quote.state === "accepted" ? (
        <div className="space-y-3">
          <p className="text-sm text-ink-600">
            Accepted by {quote.acceptedName}
            {quote.acceptedAt ? ` on ${formatShopDateTime(new Date(quote.acceptedAt), clock)}` : ""}.
          </p>
          <dl className="grid grid-cols-2 gap-2 text-center text-sm">
            <div className="rounded-lg bg-patina-50 p-2">
              <dt className="text-xs text-ink-500">Paid</dt>
              <dd className="measure font-semibold" data-testid="client-paid">
                {money(summary.paidCents)}
              </dd>
            </div>
            <div className="rounded-lg bg-ochre-50 p-2">
              <dt className="text-xs text-ink-500">Balance due</dt>
              <dd className="measure font-semibold" data-testid="client-balance">
                {money(summary.balanceCents)}
              </dd>
            </div>
          </dl>
          {summary.payable.length > 0 ? (
            data.paymentsReady ? (
              <div className="flex flex-wrap gap-2">
                {summary.payable.map((p, i) => (
                  <button key={p.kind} type="button" className={`${i === 0 ? "btn-primary" : "btn-quiet"} inline-flex items-center gap-2`} disabled={opening !== undefined} aria-busy={opening === p.kind || undefined} onClick={() => pay.mutate(p.kind)}>
                    {opening === p.kind ? <span aria-hidden className="size-3.5 animate-spin rounded-full border-2 border-current border-r-transparent" /> : null}
                    Pay {PAYMENT_KIND_LABELS[p.kind].toLowerCase()}: {money(p.amountCents)}
                  </button>
                ))}
                <p role="status" className="basis-full text-sm text-ink-600" data-testid="pay-progress">
                  {opening ? "Opening the secure payment page…" : ""}
                </p>
              </div>
            ) : (
              <p className="text-sm text-ink-600">Online payment is not set up for this shop. Contact them to pay.</p>
            )
          ) : null}
          {pay.error ? <Notice tone="error">{pay.error.message}</Notice> : null}
          {data.payments.length ? (
            <ul className="text-sm text-ink-600">
              {data.payments.map((p) => (
                <li key={p.id}>
                  {PAYMENT_KIND_LABELS[p.kind]} of {money(p.amountCents)} paid {p.paidAt ? formatShopDate(new Date(p.paidAt), clock) : ""}
                </li>
              ))}
            </ul>
          ) : null}
          <p className="text-xs text-ink-500">Card details go to the payment service only; the print shop never sees them.</p>
        </div>
      ) : null}
    </section>
  );
}
