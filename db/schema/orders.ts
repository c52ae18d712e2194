import { doublePrecision, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex } from "drizzle-orm/pg-core";
import type { QuoteSnapshot } from "@/lib/quotes";
import { users } from "./auth";
import { jobs } from "./jobs";
import { shops } from "./shops";

/** Our own names: a quote is out with the client, taken up by them, or replaced by a newer one. */
export const QUOTE_STATES = ["sent", "accepted", "replaced"] as const;
export const quoteState = pgEnum("quote_state", QUOTE_STATES);

/** A priced offer for a job, frozen when sent. The numbers never change after that. */
export const quotes = pgTable(
  "quotes",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    shopId: text("shop_id")
      .notNull()
      .references(() => shops.id, { onDelete: "cascade" }),
    jobId: text("job_id")
      .notNull()
      .references(() => jobs.id, { onDelete: "cascade" }),
    /** 1, 2, 3… per job. */
    number: integer("number").notNull(),
    state: quoteState("state").notNull().default("sent"),
    snapshot: jsonb("snapshot").$type<QuoteSnapshot>().notNull(),
    totalCents: integer("total_cents").notNull(),
    depositCents: integer("deposit_cents").notNull(),
    depositPercent: doublePrecision("deposit_percent").notNull(),
    sentBy: text("sent_by").references(() => users.id, { onDelete: "set null" }),
    sentAt: timestamp("sent_at", { withTimezone: true }).notNull().defaultNow(),
    acceptedAt: timestamp("accepted_at", { withTimezone: true }),
    acceptedName: text("accepted_name"),
    acceptedByUser: text("accepted_by_user").references(() => users.id, { onDelete: "set null" }),
    acceptedVia: text("accepted_via", { enum: ["portal", "link"] }),
    acceptedIp: text("accepted_ip"),
    acceptedUserAgent: text("accepted_user_agent"),
  },
  (t) => [uniqueIndex("quotes_job_number").on(t.jobId, t.number), index("quotes_shop").on(t.shopId)],
);

export type QuoteRow = typeof quotes.$inferSelect;

export const PAYMENT_KINDS = ["deposit", "full", "balance"] as const;
export const paymentKind = pgEnum("payment_kind", PAYMENT_KINDS);
/** Our own names for where a checkout stands. */
export const PAYMENT_STATES = ["awaiting", "paid", "lapsed"] as const;
export const paymentState = pgEnum("payment_state", PAYMENT_STATES);

/** One checkout: a deposit, the full amount, or the balance of a quote. */
export const payments = pgTable(
  "payments",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    shopId: text("shop_id")
      .notNull()
      .references(() => shops.id, { onDelete: "cascade" }),
    jobId: text("job_id")
      .notNull()
      .references(() => jobs.id, { onDelete: "cascade" }),
    quoteId: text("quote_id")
      .notNull()
      .references(() => quotes.id, { onDelete: "cascade" }),
    kind: paymentKind("kind").notNull(),
    amountCents: integer("amount_cents").notNull(),
    state: paymentState("state").notNull().default("awaiting"),
    checkoutSessionId: text("checkout_session_id").unique(),
    checkoutUrl: text("checkout_url"),
    paymentIntentId: text("payment_intent_id"),
    payerEmail: text("payer_email"),
    startedVia: text("started_via", { enum: ["portal", "link"] }).notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    paidAt: timestamp("paid_at", { withTimezone: true }),
    receiptSentAt: timestamp("receipt_sent_at", { withTimezone: true }),
  },
  (t) => [index("payments_job").on(t.jobId), index("payments_quote").on(t.quoteId)],
);

export type Payment = typeof payments.$inferSelect;

/** Every webhook event id seen once; a repeat delivery finds its row and changes nothing. */
export const paymentEvents = pgTable("payment_events", {
  eventId: text("event_id").primaryKey(),
  type: text("type").notNull(),
  paymentId: text("payment_id"),
  outcome: text("outcome").notNull(),
  receivedAt: timestamp("received_at", { withTimezone: true }).notNull().defaultNow(),
});

export type PaymentEvent = typeof paymentEvents.$inferSelect;
