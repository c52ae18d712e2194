import "server-only";
import { and, asc, desc, eq, isNull, or } from "drizzle-orm";
import { db } from "../client";
import { blanks, type Blank, type BlankColour, type BlankSizeRow } from "../schema";

const visibleTo = (shopId: string) => or(isNull(blanks.shopId), eq(blanks.shopId, shopId));

/** Library blanks and the shop's own, library first. */
export async function listBlanks({ shopId }: { shopId: string }): Promise<Blank[]> {
  return db.select().from(blanks).where(visibleTo(shopId)).orderBy(asc(blanks.shopId), asc(blanks.category), asc(blanks.name));
}

export async function findBlank({ shopId, blankId }: { shopId: string; blankId: string }): Promise<Blank | undefined> {
  const [row] = await db.select().from(blanks).where(and(eq(blanks.id, blankId), visibleTo(shopId))).limit(1);
  return row;
}

export async function duplicateBlank({ shopId, blankId }: { shopId: string; blankId: string }): Promise<Blank | undefined> {
  const source = await findBlank({ shopId, blankId });
  if (!source) return undefined;
  const [copy] = await db
    .insert(blanks)
    .values({
      shopId,
      sourceBlankId: source.id,
      name: `${source.name} (our chart)`,
      category: source.category,
      description: source.description,
      colours: source.colours,
      sizeChart: source.sizeChart,
    })
    .returning();
  return copy;
}

/** Updates one of the shop's own blanks. Library blanks are never changed here. */
export async function updateBlank(input: {
  shopId: string;
  blankId: string;
  name: string;
  description: string | null;
  colours: BlankColour[];
  sizeChart: BlankSizeRow[];
}): Promise<Blank | undefined> {
  const [row] = await db
    .update(blanks)
    .set({ name: input.name, description: input.description, colours: input.colours, sizeChart: input.sizeChart, updatedAt: new Date() })
    .where(and(eq(blanks.id, input.blankId), eq(blanks.shopId, input.shopId)))
    .returning();
  return row;
}

/** The shop's own copies of one blank (usually a library blank), newest first. */
export async function listBlankCopies({ shopId, sourceBlankId }: { shopId: string; sourceBlankId: string }): Promise<Blank[]> {
  return db
    .select()
    .from(blanks)
    .where(and(eq(blanks.shopId, shopId), eq(blanks.sourceBlankId, sourceBlankId)))
    .orderBy(desc(blanks.createdAt));
}
