import { boolean, index, pgTable, text, timestamp, uniqueIndex } from "drizzle-orm/pg-core";
import { users } from "./auth";
import { shops } from "./shops";

/** The shop's customers: a team, a business, a club. */
export const clients = pgTable(
  "clients",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    shopId: text("shop_id")
      .notNull()
      .references(() => shops.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    notes: text("notes"),
    archived: boolean("archived").notNull().default(false),
    /** A resale or exempt-organisation certificate is on file: quotes carry no tax. */
    taxExempt: boolean("tax_exempt").notNull().default(false),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("clients_shop_name").on(t.shopId, t.name)],
);

export type Client = typeof clients.$inferSelect;

/** People at a client. A contact with a user id can sign in and sees only that client's jobs. */
export const clientContacts = pgTable(
  "client_contacts",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    clientId: text("client_id")
      .notNull()
      .references(() => clients.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    email: text("email").notNull(),
    phone: text("phone"),
    userId: text("user_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("client_contacts_client_email").on(t.clientId, t.email), index("client_contacts_user").on(t.userId)],
);

export type ClientContact = typeof clientContacts.$inferSelect;
