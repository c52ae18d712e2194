import type { Payment } from "@/db/schema";
import { formatShopDateTime, type ShopClock } from "@/lib/dates";
import { formatMoney } from "@/lib/money";
import { PAYMENT_KIND_LABELS } from "@/lib/quotes";

const STATE_TEXT: Record<Payment["state"], string> = { awaiting: "Checkout open", paid: "Paid", lapsed: "Checkout lapsed" };
const STATE_TONE: Record<Payment["state"], string> = { awaiting: "text-ochre-800", paid: "text-patina-800", lapsed: "text-ink-500" };

export function PaymentList({ payments, clock, currency }: { payments: Payment[]; clock: ShopClock; currency?: string }) {
  if (payments.length === 0) return <p className="text-sm text-ink-600">No payments yet.</p>;
  return (
    <ul className="divide-y divide-paper-200 text-sm" data-testid="payment-list">
      {payments.map((p) => (
        <li key={p.id} className="flex flex-wrap items-baseline justify-between gap-2 py-2">
          <span>
            {PAYMENT_KIND_LABELS[p.kind]} <span className="measure">{formatMoney(p.amountCents, { currency, locale: clock.locale })}</span>
            <span className="block text-xs text-ink-500">
              {formatShopDateTime(p.paidAt ?? p.createdAt, clock)}
              {p.payerEmail ? ` · ${p.payerEmail}` : ""}
            </span>
          </span>
          <span className={`font-medium ${STATE_TONE[p.state]}`}>{STATE_TEXT[p.state]}</span>
        </li>
      ))}
    </ul>
  );
}
