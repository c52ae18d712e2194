import "server-only";
import { and, desc, eq, inArray, isNull, or, sql } from "drizzle-orm";
import { db } from "../client";
import { artworks, auditLog, placements, proofs, type Artwork } from "../schema";

/** Columns the editor and library need; never the preview bytes. */
export const artworkSummary = {
  id: artworks.id,
  name: artworks.name,
  kind: artworks.kind,
  clientId: artworks.clientId,
  svg: artworks.svg,
  mime: artworks.mime,
  fileUrl: artworks.fileUrl,
  bytes: artworks.bytes,
  isVector: artworks.isVector,
  inkWidthPx: artworks.inkWidthPx,
  inkHeightPx: artworks.inkHeightPx,
  widthPx: artworks.widthPx,
  heightPx: artworks.heightPx,
  inkLeftPx: artworks.inkLeftPx,
  inkTopPx: artworks.inkTopPx,
  densityPpi: artworks.densityPpi,
  shape: artworks.shape,
  fillRatio: artworks.fillRatio,
  colourCount: artworks.colourCount,
  continuousTone: artworks.continuousTone,
  notes: artworks.notes,
  version: artworks.version,
  previousId: artworks.previousId,
  replacedById: artworks.replacedById,
  hasPreview: sql<boolean>`${artworks.preview} is not null`,
  createdAt: artworks.createdAt,
};

export type NewUploadedArtwork = Omit<typeof artworks.$inferInsert, "id" | "kind" | "createdAt">;

export async function insertUploadedArtwork(values: NewUploadedArtwork): Promise<string> {
  return db.transaction(async (tx) => {
    const [row] = await tx.insert(artworks).values({ ...values, kind: "upload" }).returning({ id: artworks.id });
    await tx.insert(auditLog).values({
      shopId: values.shopId,
      actorUserId: values.uploadedBy ?? null,
      action: "artwork.uploaded",
      subjectType: "artwork",
      subjectId: row!.id,
      detail: { name: values.name },
    });
    return row!.id;
  });
}

/** The shop's current art (latest versions), optionally narrowed to one client plus the shop's own art. */
export async function listArtworks({ shopId, clientId }: { shopId: string; clientId?: string | null }) {
  const scope = clientId ? or(eq(artworks.clientId, clientId), isNull(artworks.clientId)) : undefined;
  return db
    .select(artworkSummary)
    .from(artworks)
    .where(and(eq(artworks.shopId, shopId), isNull(artworks.replacedById), scope))
    .orderBy(desc(artworks.createdAt));
}

export type ArtworkSummary = Awaited<ReturnType<typeof listArtworks>>[number];

export async function findArtwork({ shopId, artworkId }: { shopId: string; artworkId: string }) {
  const [row] = await db.select(artworkSummary).from(artworks).where(and(eq(artworks.shopId, shopId), eq(artworks.id, artworkId))).limit(1);
  return row;
}

export async function getArtworkImage({ shopId, artworkId, variant }: { shopId: string; artworkId: string; variant: "preview" | "thumbnail" }) {
  const [row] = await db
    .select({ data: variant === "preview" ? artworks.preview : artworks.thumbnail, svg: artworks.svg })
    .from(artworks)
    .where(and(eq(artworks.shopId, shopId), eq(artworks.id, artworkId)))
    .limit(1);
  return row;
}

export async function artworkShop({ artworkId }: { artworkId: string }): Promise<Pick<Artwork, "shopId" | "clientId"> | undefined> {
  const [row] = await db.select({ shopId: artworks.shopId, clientId: artworks.clientId }).from(artworks).where(eq(artworks.id, artworkId)).limit(1);
  return row;
}

/**
 * Whether art is placed on a revision that was sent to one of these clients: what a client may see
 * of art that is not filed under their own record.
 */
export async function artSentToClients({ artworkId, clientIds }: { artworkId: string; clientIds: string[] }): Promise<boolean> {
  if (clientIds.length === 0) return false;
  const placed = JSON.stringify([{ artworkId }]);
  const rows = await db.execute<{ found: boolean }>(sql`
    select exists (
      select 1 from proof_revisions r
      join proofs p on p.id = r.proof_id
      join jobs j on j.id = p.job_id
      where j.client_id in (${sql.join(clientIds.map((id) => sql`${id}`), sql`, `)})
        and r.snapshot -> 'placements' @> ${placed}::jsonb
    ) as found`);
  return rows.rows[0]?.found === true;
}

/**
 * Replaces art with a newer version everywhere it is placed. Each placement keeps its width; its
 * height follows the new art's proportions. Touched proofs get a new version, so an open editor
 * is told instead of silently overwriting the change.
 */
export async function replaceArtwork(input: { shopId: string; oldId: string; newId: string; userId: string }): Promise<{ placements: number; proofs: number } | { error: string }> {
  return db.transaction(async (tx) => {
    const both = await tx.select().from(artworks).where(and(eq(artworks.shopId, input.shopId), inArray(artworks.id, [input.oldId, input.newId])));
    const oldArt = both.find((a) => a.id === input.oldId);
    const newArt = both.find((a) => a.id === input.newId);
    if (!oldArt || !newArt) return { error: "That artwork is not in this shop's library." };
    if (oldArt.id === newArt.id) return { error: "Pick a different file to replace it with." };
    if (oldArt.replacedById) return { error: "This artwork was already replaced by a newer version." };
    const aspect = newArt.inkWidthPx / newArt.inkHeightPx;
    const touched = await tx
      .update(placements)
      .set({ artworkId: newArt.id, heightIn: sql`${placements.widthIn} / ${aspect}` })
      .where(eq(placements.artworkId, oldArt.id))
      .returning({ proofId: placements.proofId });
    const proofIds = [...new Set(touched.map((t) => t.proofId))];
    if (proofIds.length) {
      await tx
        .update(proofs)
        .set({ version: sql`${proofs.version} + 1`, updatedAt: new Date(), updatedBy: input.userId })
        .where(and(eq(proofs.shopId, input.shopId), inArray(proofs.id, proofIds)));
    }
    await tx.update(artworks).set({ replacedById: newArt.id }).where(eq(artworks.id, oldArt.id));
    await tx
      .update(artworks)
      .set({
        previousId: oldArt.id,
        version: oldArt.version + 1,
        clientId: newArt.clientId ?? oldArt.clientId,
        notes: [...(newArt.notes ?? []), `Replaces version ${oldArt.version} (“${oldArt.name}”); ${touched.length} placement${touched.length === 1 ? "" : "s"} kept their width, heights follow the new proportions.`],
      })
      .where(eq(artworks.id, newArt.id));
    await tx.insert(auditLog).values({
      shopId: input.shopId,
      actorUserId: input.userId,
      action: "artwork.replaced",
      subjectType: "artwork",
      subjectId: newArt.id,
      detail: { from: oldArt.name, to: newArt.name, placements: touched.length, proofs: proofIds.length },
    });
    return { placements: touched.length, proofs: proofIds.length };
  });
}
