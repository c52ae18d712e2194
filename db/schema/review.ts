import { doublePrecision, index, jsonb, pgTable, text, timestamp, uniqueIndex } from "drizzle-orm/pg-core";
import type { RevisionSnapshot } from "@/lib/review/diff";
import { users } from "./auth";
import { proofs } from "./proofs";
import { shops } from "./shops";

/** A frozen revision of a proof, as sent to the client. Approved revisions never change. */
export const proofRevisions = pgTable(
  "proof_revisions",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    proofId: text("proof_id")
      .notNull()
      .references(() => proofs.id, { onDelete: "cascade" }),
    letter: text("letter").notNull(),
    snapshot: jsonb("snapshot").$type<RevisionSnapshot>().notNull(),
    state: text("state", { enum: ["open", "approved", "changes-requested"] }).notNull().default("open"),
    sentAt: timestamp("sent_at", { withTimezone: true }).notNull().defaultNow(),
    sentBy: text("sent_by").references(() => users.id, { onDelete: "set null" }),
  },
  (t) => [uniqueIndex("proof_revisions_letter").on(t.proofId, t.letter)],
);

export type ProofRevision = typeof proofRevisions.$inferSelect;

/** A link to review a proof without an account. Only a hash of its token is stored. */
export const shareLinks = pgTable(
  "share_links",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    shopId: text("shop_id")
      .notNull()
      .references(() => shops.id, { onDelete: "cascade" }),
    proofId: text("proof_id")
      .notNull()
      .references(() => proofs.id, { onDelete: "cascade" }),
    tokenHash: text("token_hash").notNull().unique(),
    permission: text("permission", { enum: ["view", "comment", "approve"] }).notNull(),
    recipientEmail: text("recipient_email"),
    recipientName: text("recipient_name"),
    expiresAt: timestamp("expires_at", { withTimezone: true }),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    createdBy: text("created_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    lastSeenLetter: text("last_seen_letter"),
    lastSeenAt: timestamp("last_seen_at", { withTimezone: true }),
  },
  (t) => [index("share_links_proof").on(t.proofId)],
);

export type ShareLink = typeof shareLinks.$inferSelect;

/** A comment pinned to a spot on the garment, in garment inches of one side, so it stays put at any zoom. */
export const proofComments = pgTable(
  "proof_comments",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    proofId: text("proof_id")
      .notNull()
      .references(() => proofs.id, { onDelete: "cascade" }),
    revisionLetter: text("revision_letter").notNull(),
    parentId: text("parent_id"),
    side: text("side", { enum: ["front", "back"] }),
    xIn: doublePrecision("x_in"),
    yIn: doublePrecision("y_in"),
    body: text("body").notNull(),
    authorUserId: text("author_user_id").references(() => users.id, { onDelete: "set null" }),
    authorName: text("author_name").notNull(),
    authorRole: text("author_role", { enum: ["shop", "client"] }).notNull(),
    shareLinkId: text("share_link_id").references(() => shareLinks.id, { onDelete: "set null" }),
    resolvedAt: timestamp("resolved_at", { withTimezone: true }),
    resolvedBy: text("resolved_by"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("proof_comments_proof").on(t.proofId, t.createdAt)],
);

export type ProofComment = typeof proofComments.$inferSelect;

/** The client's sign-off on one revision: who, when, from where, and what they confirmed. */
export const approvals = pgTable(
  "approvals",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    proofId: text("proof_id")
      .notNull()
      .references(() => proofs.id, { onDelete: "cascade" }),
    revisionId: text("revision_id")
      .notNull()
      .references(() => proofRevisions.id, { onDelete: "cascade" }),
    revisionLetter: text("revision_letter").notNull(),
    decision: text("decision", { enum: ["approved", "changes-requested"] }).notNull(),
    fullName: text("full_name").notNull(),
    statement: text("statement").notNull(),
    commentId: text("comment_id"),
    ip: text("ip"),
    userAgent: text("user_agent"),
    shareLinkId: text("share_link_id").references(() => shareLinks.id, { onDelete: "set null" }),
    userId: text("user_id").references(() => users.id, { onDelete: "set null" }),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("approvals_proof").on(t.proofId)],
);

export type Approval = typeof approvals.$inferSelect;
