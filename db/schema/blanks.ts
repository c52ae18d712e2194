import { index, jsonb, pgEnum, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { GARMENT_CATEGORIES, type GarmentMeasurements, type SizeGroup } from "@/lib/garments/types";
import { shops } from "./shops";

export const garmentCategory = pgEnum("garment_category", GARMENT_CATEGORIES);

export type BlankColour = { name: string; hex: string };
export type BlankSizeRow = { size: string; group: SizeGroup; measurements: GarmentMeasurements };

/**
 * Garment styles. Library blanks (shop_id null) are shared and read-only; a shop duplicates one
 * to edit its size chart to the supplier's numbers.
 */
export const blanks = pgTable(
  "blanks",
  {
    id: text("id")
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    shopId: text("shop_id").references(() => shops.id, { onDelete: "cascade" }),
    sourceBlankId: text("source_blank_id"),
    name: text("name").notNull(),
    category: garmentCategory("category").notNull(),
    description: text("description"),
    colours: jsonb("colours").$type<BlankColour[]>().notNull(),
    sizeChart: jsonb("size_chart").$type<BlankSizeRow[]>().notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("blanks_shop").on(t.shopId)],
);

export type Blank = typeof blanks.$inferSelect;
