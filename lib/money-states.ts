/** Where a job stands with money, and the kinds of payment: names only, for every page that shows them. */
export type PaymentKind = "deposit" | "full" | "balance";

/** Our own names for where a job stands with money. */
export const MONEY_STATES = ["not-quoted", "quote-sent", "awaiting-payment", "deposit-paid", "paid-in-full"] as const;
export type MoneyState = (typeof MONEY_STATES)[number];

export const MONEY_STATE_LABELS: Readonly<Record<MoneyState, string>> = {
  "not-quoted": "Not quoted",
  "quote-sent": "Quote out",
  "awaiting-payment": "Accepted, nothing paid",
  "deposit-paid": "Deposit paid",
  "paid-in-full": "Paid in full",
};

export const PAYMENT_KIND_LABELS: Readonly<Record<PaymentKind, string>> = {
  deposit: "Deposit",
  full: "Full amount",
  balance: "Balance",
};
