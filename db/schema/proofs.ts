import { boolean, doublePrecision, index, integer, jsonb, pgTable, primaryKey, real, text, timestamp, uniqueIndex } from "drizzle-orm/pg-core";
import { users } from "./auth";
import { bytea } from "./columns";
import { blanks } from "./blanks";
import { jobs } from "./jobs";
import { shops } from "./shops";


/**
 * Art the shop places on garments: generated demo art carries its SVG; uploads carry the analysis
 * of the original (kept in upload storage), a preview for drawing and a thumbnail.
 */
export const artworks = pgTable(
  "artworks",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    shopId: text("shop_id")
      .notNull()
      .references(() => shops.id, { onDelete: "cascade" }),
    clientId: text("client_id"),
    name: text("name").notNull(),
    kind: text("kind", { enum: ["generated", "upload"] }).notNull(),
    /** Sanitised SVG: the only form of an SVG Chalkline ever serves. */
    svg: text("svg"),
    /** Size of the ink, in pixels of the original. */
    inkWidthPx: integer("ink_width_px").notNull(),
    inkHeightPx: integer("ink_height_px").notNull(),
    isVector: boolean("is_vector").notNull().default(false),
    fileKey: text("file_key"),
    fileUrl: text("file_url"),
    mime: text("mime"),
    bytes: integer("bytes"),
    widthPx: integer("width_px"),
    heightPx: integer("height_px"),
    densityPpi: real("density_ppi"),
    inkLeftPx: integer("ink_left_px"),
    inkTopPx: integer("ink_top_px"),
    fillRatio: real("fill_ratio"),
    shape: text("shape", { enum: ["wide", "tall", "square", "round", "emblem"] }),
    colourCount: integer("colour_count"),
    continuousTone: boolean("continuous_tone"),
    preview: bytea("preview"),
    previewWidth: integer("preview_width"),
    previewHeight: integer("preview_height"),
    thumbnail: bytea("thumbnail"),
    notes: jsonb("notes").$type<string[]>(),
    /** Versions: a replacement points at the art it replaces; the newest has no successor. */
    version: integer("version").notNull().default(1),
    previousId: text("previous_id"),
    replacedById: text("replaced_by_id"),
    uploadedBy: text("uploaded_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("artworks_shop").on(t.shopId), index("artworks_client").on(t.clientId)],
);

export type Artwork = typeof artworks.$inferSelect;

/** A job's mock-up: one garment, colour and size, at a revision letter. `version` guards concurrent saves. */
export const proofs = pgTable(
  "proofs",
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
    revision: text("revision").notNull().default("A"),
    name: text("name").notNull(),
    blankId: text("blank_id")
      .notNull()
      .references(() => blanks.id, { onDelete: "restrict" }),
    colourName: text("colour_name").notNull(),
    colourHex: text("colour_hex").notNull(),
    size: text("size").notNull(),
    version: integer("version").notNull().default(1),
    updatedBy: text("updated_by").references(() => users.id, { onDelete: "set null" }),
    /** The key the editor gave the last stored save: a retry of that save is recognised as it, not a conflict. */
    lastSaveKey: text("last_save_key"),
    /** Set when a draft proof is put away; archived proofs are left out of the job, production and the quote check. */
    archivedAt: timestamp("archived_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("proofs_job").on(t.jobId), uniqueIndex("proofs_job_revision_name").on(t.jobId, t.name, t.revision)],
);

export type Proof = typeof proofs.$inferSelect;

/** Where art sits on the garment, in garment inches: the source of truth the canvas draws. */
export const placements = pgTable(
  "placements",
  {
    id: text("id").primaryKey(),
    proofId: text("proof_id")
      .notNull()
      .references(() => proofs.id, { onDelete: "cascade" }),
    location: text("location").notNull(),
    artworkId: text("artwork_id").references(() => artworks.id, { onDelete: "set null" }),
    widthIn: doublePrecision("width_in").notNull(),
    heightIn: doublePrecision("height_in").notNull(),
    offsetFromCenterIn: doublePrecision("offset_from_center_in").notNull(),
    belowCollarIn: doublePrecision("below_collar_in").notNull(),
    rotationDeg: doublePrecision("rotation_deg").notNull().default(0),
    sortOrder: integer("sort_order").notNull().default(0),
  },
  (t) => [index("placements_proof").on(t.proofId)],
);

export type PlacementRow = typeof placements.$inferSelect;

/** Screen calibration per person and device: CSS pixels per real inch at 100% zoom. */
export const calibrations = pgTable(
  "calibrations",
  {
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    deviceKey: text("device_key").notNull(),
    deviceLabel: text("device_label"),
    pxPerInch: doublePrecision("px_per_inch").notNull(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.deviceKey] })],
);
