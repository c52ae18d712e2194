import { formatMoney } from "@/lib/money";
import type { Quote } from "@/lib/pricing";

/** A quote's lines and totals, as a table. Notes (total 0) show as plain remarks. */
export function QuoteLines({ quote, caption, locale }: { quote: Quote; caption?: string; locale?: string | null }) {
  const money = (c: number) => formatMoney(c, { currency: quote.currency, locale });
  const charges = quote.lines.filter((l) => l.unit !== "note");
  const notes = quote.lines.filter((l) => l.unit === "note");
  return (
    <div>
      <table className="w-full text-sm" data-testid="quote-lines">
        {caption ? <caption className="mb-2 text-left text-ink-600">{caption}</caption> : null}
        <thead>
          <tr className="border-b border-paper-300 text-left text-xs uppercase tracking-wide text-ink-500">
            <th scope="col" className="py-1.5 pr-2 font-medium">
              Item
            </th>
            <th scope="col" className="py-1.5 pr-2 text-right font-medium">
              Qty
            </th>
            <th scope="col" className="py-1.5 pr-2 text-right font-medium">
              Each
            </th>
            <th scope="col" className="py-1.5 text-right font-medium">
              Amount
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-paper-200">
          {charges.map((line) => (
            <tr key={line.key}>
              <td className="py-1.5 pr-2">{line.label}</td>
              <td className="measure py-1.5 pr-2 text-right">{line.quantity}</td>
              <td className="measure py-1.5 pr-2 text-right">{money(line.unitCents)}</td>
              <td className="measure py-1.5 text-right">{money(line.totalCents)}</td>
            </tr>
          ))}
        </tbody>
        <tfoot className="border-t border-paper-300">
          <tr>
            <th scope="row" colSpan={3} className="pt-2 pr-2 text-right font-normal text-ink-600">
              Subtotal
            </th>
            <td className="measure pt-2 text-right">{money(quote.subtotalCents)}</td>
          </tr>
          <tr>
            <th scope="row" colSpan={3} className="pr-2 text-right font-normal text-ink-600">
              {quote.taxableCents === 0 && quote.subtotalCents > 0 ? "Tax (exempt)" : "Tax"}
            </th>
            <td className="measure text-right">{money(quote.taxCents)}</td>
          </tr>
          <tr className="text-base font-semibold">
            <th scope="row" colSpan={3} className="pt-1 pr-2 text-right">
              Total
            </th>
            <td className="measure pt-1 text-right" data-testid="quote-total">
              {money(quote.totalCents)}
            </td>
          </tr>
          {quote.depositCents > 0 && quote.depositCents < quote.totalCents ? (
            <tr className="text-ink-600">
              <th scope="row" colSpan={3} className="pr-2 text-right font-normal">
                Deposit to start
              </th>
              <td className="measure text-right" data-testid="quote-deposit">
                {money(quote.depositCents)}
              </td>
            </tr>
          ) : null}
        </tfoot>
      </table>
      {notes.map((n) => (
        <p key={n.key} className="mt-2 text-xs text-ochre-800">
          {n.label}
        </p>
      ))}
    </div>
  );
}
