import "server-only";
import { and, eq, inArray, sql } from "drizzle-orm";
import type { ProofForCheck, ProofPrint } from "@/lib/quote-check";
import { db } from "../client";
import { artworks, placements, proofRevisions, proofs } from "../schema";

export type JobProofPrints = {
  proofs: ProofForCheck[];
  /** Known ink colours per artwork id; null when unknown or continuous tone. */
  artColours: Record<string, number | null>;
};

function prints(value: unknown): ProofPrint[] {
  if (!Array.isArray(value)) return [];
  return value.flatMap((p: unknown) => {
    if (!p || typeof p !== "object") return [];
    const { location, artworkId } = p as { location?: unknown; artworkId?: unknown };
    return typeof location === "string" ? [{ location, artworkId: typeof artworkId === "string" ? artworkId : null }] : [];
  });
}

/**
 * What each of a job's proofs prints where: its sent revisions (placements only) and its working
 * placements, with the known colour counts of the art on them. Scoped to the shop. Read in one
 * repeatable-read snapshot, so a revision sent meanwhile never pairs with older placements.
 */
export async function listProofPrints({ shopId, jobId }: { shopId: string; jobId: string }): Promise<JobProofPrints> {
  return db.transaction(
    async (tx) => {
      const proofRows = await tx.select({ id: proofs.id, name: proofs.name, archivedAt: proofs.archivedAt }).from(proofs).where(and(eq(proofs.shopId, shopId), eq(proofs.jobId, jobId)));
      if (proofRows.length === 0) return { proofs: [], artColours: {} };
      const ids = proofRows.map((p) => p.id);
      const working = await tx.select({ proofId: placements.proofId, location: placements.location, artworkId: placements.artworkId }).from(placements).where(inArray(placements.proofId, ids));
      const revisions = await tx
        .select({ proofId: proofRevisions.proofId, letter: proofRevisions.letter, state: proofRevisions.state, sentAt: proofRevisions.sentAt, placements: sql<unknown>`${proofRevisions.snapshot} -> 'placements'` })
        .from(proofRevisions)
        .where(inArray(proofRevisions.proofId, ids));
      const result: ProofForCheck[] = proofRows.map((p) => ({
        name: p.name,
        archived: p.archivedAt !== null,
        working: working.filter((w) => w.proofId === p.id).map((w) => ({ location: w.location, artworkId: w.artworkId })),
        revisions: revisions.filter((r) => r.proofId === p.id).map((r) => ({ letter: r.letter, state: r.state, sentAt: r.sentAt, placements: prints(r.placements) })),
      }));
      const artIds = [...new Set(result.flatMap((p) => [...p.working, ...p.revisions.flatMap((r) => r.placements)]).map((p) => p.artworkId).filter((id): id is string => Boolean(id)))];
      const art = artIds.length
        ? await tx
            .select({ id: artworks.id, colourCount: artworks.colourCount, continuousTone: artworks.continuousTone })
            .from(artworks)
            .where(and(eq(artworks.shopId, shopId), inArray(artworks.id, artIds)))
        : [];
      const artColours = Object.fromEntries(art.map((a) => [a.id, a.continuousTone ? null : a.colourCount]));
      return { proofs: result, artColours };
    },
    { isolationLevel: "repeatable read", accessMode: "read only" },
  );
}
