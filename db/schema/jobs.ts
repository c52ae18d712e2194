import { sql } from "drizzle-orm";
import { boolean, date, doublePrecision, index, integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp } from "drizzle-orm/pg-core";
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
  // The job list, board and portal read one page at a time: each order they page by has an index
  // that starts with the shop (or client) and ends with the id that breaks ties.
  (t) => [
    index("jobs_shop_status_updated").on(t.shopId, t.status, t.updatedAt.desc().nullsFirst(), t.id),
    index("jobs_shop_updated").on(t.shopId, t.updatedAt.desc().nullsFirst(), t.id),
    index("jobs_shop_due").on(t.shopId, t.dueDate, t.id),
    index("jobs_shop_title").on(t.shopId, t.title, t.id),
    index("jobs_shop_method").on(t.shopId, t.method, t.id),
    index("jobs_client_updated").on(t.clientId, t.updatedAt.desc().nullsFirst(), t.id),
    index("jobs_blank").on(t.blankId),
    // Substring search on the title (pg_trgm, shipped with PostgreSQL's contrib modules).
    index("jobs_title_trgm").using("gin", sql`${t.title} gin_trgm_ops`),
  ],
);

export type Job = typeof jobs.$inferSelect;

/**
 * How many jobs each shop has in each status, kept by triggers on `jobs` (migration 0013): the list
 * and the board show every column's count on every view, and counting a large shop's jobs each time
 * read tens of thousands of index entries. No foreign key: a shop's deletion removes its jobs, and
 * the triggers bring its counts to 0 in the same statement.
 */
export const shopJobCounts = pgTable(
  "shop_job_counts",
  {
    shopId: text("shop_id").notNull(),
    status: jobStatus("status").notNull(),
    n: integer("n").notNull().default(0),
  },
  (t) => [primaryKey({ columns: [t.shopId, t.status] })],
);

export type JobPrintLocation = { location: string; colours: number };
