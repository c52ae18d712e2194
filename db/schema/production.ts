import { index, integer, jsonb, pgTable, primaryKey, real, text, timestamp } from "drizzle-orm/pg-core";
import type { ExportSubject } from "@/lib/production/export-names";
import { users } from "./auth";
import { bytea } from "./columns";
import { jobs } from "./jobs";
import { shops } from "./shops";


/** The job's size run: how many garments of each size. Orders and production both read it. */
export const jobSizes = pgTable(
  "job_sizes",
  {
    jobId: text("job_id")
      .notNull()
      .references(() => jobs.id, { onDelete: "cascade" }),
    size: text("size").notNull(),
    quantity: integer("quantity").notNull().default(0),
    sortOrder: integer("sort_order").notNull().default(0),
  },
  (t) => [primaryKey({ columns: [t.jobId, t.size] })],
);

export type JobSize = typeof jobSizes.$inferSelect;

/** The transfer (or screen) widths chosen for a job's print location, and which sizes get which. */
export const jobGradings = pgTable(
  "job_gradings",
  {
    jobId: text("job_id")
      .notNull()
      .references(() => jobs.id, { onDelete: "cascade" }),
    placementId: text("placement_id").notNull(),
    transferCount: integer("transfer_count").notNull(),
    assignment: jsonb("assignment").$type<Record<string, number>>().notNull(),
    totalShortfall: real("total_shortfall").notNull(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.jobId, t.placementId] })],
);

export type { ExportSubject };
export type ExportSummaryFacts = { rollWidthIn: number; pieces: number; sheetLengthsIn: number[]; totalLengthIn: number; efficiency: number };

/** Heavy exports run by the job worker; the UI follows progress and downloads the result. */
export const exportJobs = pgTable(
  "export_jobs",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    shopId: text("shop_id")
      .notNull()
      .references(() => shops.id, { onDelete: "cascade" }),
    jobId: text("job_id").references(() => jobs.id, { onDelete: "cascade" }),
    kind: text("kind", { enum: ["test-print", "spec-sheet", "gang-sheet-png", "gang-sheet-pdf"] }).notNull(),
    params: jsonb("params").$type<Record<string, unknown>>().notNull(),
    state: text("state", { enum: ["queued", "running", "done", "failed"] }).notNull().default("queued"),
    progress: real("progress").notNull().default(0),
    message: text("message"),
    fileName: text("file_name"),
    mime: text("mime"),
    result: bytea("result"),
    /** How many files the export made: 1, or one per sheet for a PNG gang sheet (files 2… in export_files). */
    fileCount: integer("file_count").notNull().default(1),
    /** What a gang sheet export packed, as made: sheet lengths, pieces, film used and cover. */
    summary: jsonb("summary").$type<ExportSummaryFacts>(),
    /** What the export holds (locations, sizes, paper), written when it is made. */
    subject: jsonb("subject").$type<ExportSubject>(),
    attempts: integer("attempts").notNull().default(0),
    requestedBy: text("requested_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    finishedAt: timestamp("finished_at", { withTimezone: true }),
  },
  (t) => [index("export_jobs_job").on(t.jobId, t.createdAt)],
);

export type ExportJob = typeof exportJobs.$inferSelect;

/**
 * The further files of an export that makes several (a PNG gang sheet gives one file per sheet).
 * File 1 stays in `export_jobs.result`; files 2… are here, numbered as the page shows them.
 */
export const exportFiles = pgTable(
  "export_files",
  {
    exportId: text("export_id")
      .notNull()
      .references(() => exportJobs.id, { onDelete: "cascade" }),
    position: integer("position").notNull(),
    fileName: text("file_name").notNull(),
    mime: text("mime").notNull(),
    bytes: integer("bytes").notNull(),
    content: bytea("content").notNull(),
  },
  (t) => [primaryKey({ columns: [t.exportId, t.position] })],
);
