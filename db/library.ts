/** Library blanks: shared, read-only garment styles every shop starts from. Kept in step with lib/garments/catalog. */
import { sql } from "drizzle-orm";
import type { NodePgDatabase } from "drizzle-orm/node-postgres";
import { CATALOG } from "@/lib/garments/catalog";
import * as schema from "./schema";

export const libraryBlankId = (catalogId: string) => `library-${catalogId}`;

export async function ensureLibraryBlanks(db: NodePgDatabase<typeof schema>): Promise<number> {
  for (const blank of CATALOG) {
    await db
      .insert(schema.blanks)
      .values({
        id: libraryBlankId(blank.id),
        shopId: null,
        name: blank.styleName,
        category: blank.category,
        description: blank.description,
        colours: blank.colors,
        sizeChart: blank.sizes,
      })
      .onConflictDoUpdate({
        target: schema.blanks.id,
        set: {
          name: sql`excluded.name`,
          category: sql`excluded.category`,
          description: sql`excluded.description`,
          colours: sql`excluded.colours`,
          sizeChart: sql`excluded.size_chart`,
          updatedAt: sql`now()`,
        },
      });
  }
  return CATALOG.length;
}
