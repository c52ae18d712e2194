"use client";

import { useEffect, useRef } from "react";
import { Notice } from "./Notice";

export type CheckoutOutcome = "paid" | "pending" | "cancelled" | "unknown";

const MESSAGES: Record<Exclude<CheckoutOutcome, "unknown">, { tone: "ok" | "warn"; text: string }> = {
  paid: { tone: "ok", text: "Payment received. A receipt is on its way by e-mail." },
  pending: { tone: "warn", text: "Your payment is being confirmed. This page updates once it is through." },
  cancelled: { tone: "warn", text: "The payment was not completed. Nothing was charged; you can try again." },
};

/**
 * What happened at checkout, shown at the top of the page the payer comes back to. It takes the
 * focus once, so a screen reader says it and a phone shows it without scrolling.
 */
export function CheckoutResult({ outcome, quoteHref, className = "mb-4" }: { outcome: CheckoutOutcome | undefined; quoteHref?: string; className?: string }) {
  const box = useRef<HTMLDivElement>(null);
  const message = outcome && outcome !== "unknown" ? MESSAGES[outcome] : null;
  useEffect(() => {
    if (!message) return;
    box.current?.focus({ preventScroll: true });
    box.current?.scrollIntoView?.({ block: "nearest" });
  }, [message]);
  if (!message) return null;
  return (
    <div className={`scroll-mt-20 ${className}`}>
      <Notice tone={message.tone} testId="checkout-result" ref={box} focusable>
        {message.text}
        {quoteHref ? (
          <>
            {" "}
            <a href={quoteHref} className="font-medium underline">
              See the quote
            </a>
          </>
        ) : null}
      </Notice>
    </div>
  );
}
