import { boolean, date, doublePrecision, index, jsonb, pgEnum, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { blanks } from "./blanks";
import { users } from "./auth";
import { clients } from "./clients";
import { shops } from "./shops";

import { DECORATION_METHODS, JOB_STATUSES } from "../../lib/jobs";

export { DECORATION_METHODS, JOB_STATUSES };
export const jobStatus = pgEnum("job_status", JOB_STATUSES);

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
    /** The blank garment (style) and its colour. */
    blankId: text("blank_id").references(() => blanks.id, { onDelete: "set null" }),
    garmentColour: text("garment_colour"),
    /** Print locations, each with its ink colour count (screen print uses it for screens and price). */
    printLocations: jsonb("print_locations").$type<JobPrintLocation[]>().notNull().default([]),
    /** DTF: total transfer area per garment, in², for the quote. */
    dtfAreaIn2: doublePrecision("dtf_area_in2"),
    rush: boolean("rush").notNull().default(false),
    /** Spare pieces per size, percent of the ordered quantity (rounded up), for misprints and weeding. */
    sparePercent: doublePrecision("spare_percent").notNull().default(0),
    createdBy: text("created_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("jobs_shop_status").on(t.shopId, t.status), index("jobs_client").on(t.clientId)],
);

export type Job = typeof jobs.$inferSelect;

export type JobPrintLocation = { location: string; colours: number };
