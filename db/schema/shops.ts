import { index, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex } from "drizzle-orm/pg-core";
import { users } from "./auth";

export const memberRole = pgEnum("member_role", ["owner", "designer", "production"]);

export const shops = pgTable("shops", {
  id: text("id")
    .primaryKey()
    .$defaultFn(() => crypto.randomUUID()),
  slug: text("slug").notNull().unique(),
  name: text("name").notNull(),
  /** The shop's price matrix (lib/pricing.ts); null until the owner saves one (the demo matrix is shown). */
  priceMatrix: jsonb("price_matrix").$type<unknown>(),
  priceMatrixUpdatedAt: timestamp("price_matrix_updated_at", { withTimezone: true }),
  /** How the shop writes dates and numbers (BCP 47) and its clock (IANA zone): lib/dates.ts. */
  locale: text("locale").notNull().default("en-US"),
  timeZone: text("time_zone").notNull().default("UTC"),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

export type Shop = typeof shops.$inferSelect;

export const memberships = pgTable(
  "memberships",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    shopId: text("shop_id")
      .notNull()
      .references(() => shops.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    role: memberRole("role").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("memberships_shop_user").on(t.shopId, t.userId), index("memberships_user").on(t.userId)],
);

export type Membership = typeof memberships.$inferSelect;

/** Pending invitations: an owner asks someone to join the shop with a role. */
export const invitations = pgTable(
  "invitations",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    shopId: text("shop_id")
      .notNull()
      .references(() => shops.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    role: memberRole("role").notNull(),
    /** sha-256 of the token sent by e-mail; the token itself is never stored. */
    tokenHash: text("token_hash").notNull().unique(),
    invitedBy: text("invited_by")
      .notNull()
      .references(() => users.id),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    acceptedAt: timestamp("accepted_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("invitations_shop").on(t.shopId)],
);

export type Invitation = typeof invitations.$inferSelect;
