import { date, index, pgEnum, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { users } from "./auth";
import { clients } from "./clients";
import { shops } from "./shops";

/** Our own names for where a job stands, in order. */
export const JOB_STATUSES = ["drafting", "with-client", "cleared", "on-press", "packed", "collected"] as const;
export const jobStatus = pgEnum("job_status", JOB_STATUSES);

export const DECORATION_METHODS = ["screen-print", "dtf", "dtg", "htv", "sublimation"] as const;
export const decorationMethod = pgEnum("decoration_method", DECORATION_METHODS);

export const jobs = pgTable(
  "jobs",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    shopId: text("shop_id")
      .notNull()
      .references(() => shops.id, { onDelete: "cascade" }),
    clientId: text("client_id")
      .notNull()
      .references(() => clients.id, { onDelete: "restrict" }),
    title: text("title").notNull(),
    status: jobStatus("status").notNull().default("drafting"),
    method: decorationMethod("method").notNull().default("screen-print"),
    dueDate: date("due_date"),
    notes: text("notes"),
    createdBy: text("created_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("jobs_shop_status").on(t.shopId, t.status), index("jobs_client").on(t.clientId)],
);

export type Job = typeof jobs.$inferSelect;
