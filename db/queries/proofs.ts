import "server-only";
import { and, asc, eq, inArray, isNull, or, sql } from "drizzle-orm";
import type { Placement } from "@/lib/placement/model";
import { db } from "../client";
import { artworkSummary, type ArtworkSummary } from "./artworks";
import { nextRevisionLetter } from "@/lib/review/diff";
import { artworks, blanks, calibrations, clients, jobs, placements, proofRevisions, proofs, type Blank, type Proof } from "../schema";

export type ProofDocument = {
  proof: Proof;
  job: { id: string; title: string; clientId: string; clientName: string; method: string };
  blank: Blank;
  placements: Placement[];
  artworks: ArtworkSummary[];
};

function toPlacement(row: typeof placements.$inferSelect): Placement {
  return {
    id: row.id,
    location: row.location as Placement["location"],
    artworkId: row.artworkId,
    widthIn: row.widthIn,
    heightIn: row.heightIn,
    offsetFromCenterIn: row.offsetFromCenterIn,
    belowCollarIn: row.belowCollarIn,
    rotationDeg: row.rotationDeg,
  };
}

/**
 * A proof with everything the editor and the review views draw. Scoped to the shop: other shops get nothing.
 * Read in one repeatable-read snapshot, so the version, the garment and the placements always belong
 * to the same save even while another save commits between the queries.
 */
export async function getProofDocument({ shopId, proofId }: { shopId: string; proofId: string }): Promise<ProofDocument | undefined> {
  return db.transaction((tx) => readProofDocument(tx, { shopId, proofId }), { isolationLevel: "repeatable read", accessMode: "read only" });
}

type Reader = Pick<typeof db, "select">;

async function readProofDocument(reader: Reader, { shopId, proofId }: { shopId: string; proofId: string }): Promise<ProofDocument | undefined> {
  const [row] = await reader
    .select({ proof: proofs, blank: blanks, job: { id: jobs.id, title: jobs.title, clientId: clients.id, clientName: clients.name, method: jobs.method } })
    .from(proofs)
    .innerJoin(blanks, eq(blanks.id, proofs.blankId))
    .innerJoin(jobs, eq(jobs.id, proofs.jobId))
    .innerJoin(clients, eq(clients.id, jobs.clientId))
    .where(and(eq(proofs.id, proofId), eq(proofs.shopId, shopId)))
    .limit(1);
  if (!row) return undefined;
  const placementRows = await reader.select().from(placements).where(eq(placements.proofId, proofId)).orderBy(asc(placements.sortOrder));
  const artIds = [...new Set(placementRows.map((p) => p.artworkId).filter((id): id is string => !!id))];
  // The client's art and the shop's own, plus anything already placed (even an older version).
  const art = await reader
    .select(artworkSummary)
    .from(artworks)
    .where(
      and(
        eq(artworks.shopId, shopId),
        or(and(isNull(artworks.replacedById), or(eq(artworks.clientId, row.job.clientId), isNull(artworks.clientId))), artIds.length ? inArray(artworks.id, artIds) : sql`false`),
      ),
    )
    .orderBy(asc(artworks.name));
  return { proof: row.proof, blank: row.blank, job: row.job, placements: placementRows.map(toPlacement), artworks: art };
}

/** The proof's shop, for routes addressed by proof id alone. */
export async function findProofShop({ proofId }: { proofId: string }): Promise<{ shopId: string; clientId: string; jobId: string } | undefined> {
  const [row] = await db
    .select({ shopId: proofs.shopId, clientId: jobs.clientId, jobId: jobs.id })
    .from(proofs)
    .innerJoin(jobs, eq(jobs.id, proofs.jobId))
    .where(eq(proofs.id, proofId))
    .limit(1);
  return row;
}

export async function listShopArtworks({ shopId, ids }: { shopId: string; ids?: string[] }) {
  const where = ids ? and(eq(artworks.shopId, shopId), inArray(artworks.id, ids)) : eq(artworks.shopId, shopId);
  return db
    .select({ id: artworks.id, name: artworks.name, kind: artworks.kind, svg: artworks.svg, inkWidthPx: artworks.inkWidthPx, inkHeightPx: artworks.inkHeightPx })
    .from(artworks)
    .where(where)
    .orderBy(asc(artworks.name));
}

export async function listProofsForJob({ shopId, jobId }: { shopId: string; jobId: string }) {
  return db
    .select({ id: proofs.id, name: proofs.name, revision: proofs.revision, size: proofs.size, colourName: proofs.colourName, updatedAt: proofs.updatedAt, blankName: blanks.name })
    .from(proofs)
    .innerJoin(blanks, eq(blanks.id, proofs.blankId))
    .where(and(eq(proofs.shopId, shopId), eq(proofs.jobId, jobId)))
    .orderBy(asc(proofs.name), asc(proofs.revision));
}

export type SaveProofInput = {
  shopId: string;
  proofId: string;
  baseVersion: number;
  size: string;
  colourName: string;
  colourHex: string;
  placements: Placement[];
  userId: string;
};

export type SaveProofResult =
  | { kind: "saved"; version: number; updatedAt: Date; revision: string }
  | { kind: "conflict"; current: ProofDocument }
  | { kind: "missing" };

/**
 * Saves the whole editable state of a proof if nobody saved since `baseVersion`.
 * A stale save changes nothing and returns the fresh document instead.
 *
 * Concurrency: the proof row is locked first, so two saves of one proof run one after the other
 * and the second sees the first's version; the update itself still only matches
 * `version = baseVersion`. The revision row is read with a share lock, so a save waits for an
 * approval being recorded at that moment and then starts the next letter instead of writing into
 * the approved one.
 */
export async function saveProof(input: SaveProofInput): Promise<SaveProofResult> {
  const outcome = await db.transaction(async (tx) => {
    const [current] = await tx
      .select({ revision: proofs.revision, version: proofs.version })
      .from(proofs)
      .where(and(eq(proofs.id, input.proofId), eq(proofs.shopId, input.shopId)))
      .for("update");
    if (!current || current.version !== input.baseVersion) return null;
    // An approved revision is locked: the first edit after approval starts the next letter.
    let revision = current.revision;
    const [frozen] = await tx
      .select({ state: proofRevisions.state })
      .from(proofRevisions)
      .where(and(eq(proofRevisions.proofId, input.proofId), eq(proofRevisions.letter, revision)))
      .for("share");
    if (frozen?.state === "approved") revision = nextRevisionLetter(revision);
    const [updated] = await tx
      .update(proofs)
      .set({
        revision,
        version: sql`${proofs.version} + 1`,
        size: input.size,
        colourName: input.colourName,
        colourHex: input.colourHex,
        updatedBy: input.userId,
        updatedAt: new Date(),
      })
      .where(and(eq(proofs.id, input.proofId), eq(proofs.shopId, input.shopId), eq(proofs.version, input.baseVersion)))
      .returning({ version: proofs.version, updatedAt: proofs.updatedAt, revision: proofs.revision });
    if (!updated) return null;
    await tx.delete(placements).where(eq(placements.proofId, input.proofId));
    if (input.placements.length) {
      await tx.insert(placements).values(input.placements.map((p, i) => ({ ...p, proofId: input.proofId, sortOrder: i })));
    }
    return updated;
  });
  if (outcome) return { kind: "saved", version: outcome.version, updatedAt: outcome.updatedAt, revision: outcome.revision };
  const current = await getProofDocument({ shopId: input.shopId, proofId: input.proofId });
  return current ? { kind: "conflict", current } : { kind: "missing" };
}

export async function getCalibration({ userId, deviceKey }: { userId: string; deviceKey: string }) {
  const [row] = await db
    .select()
    .from(calibrations)
    .where(and(eq(calibrations.userId, userId), eq(calibrations.deviceKey, deviceKey)))
    .limit(1);
  return row;
}

export async function saveCalibration(input: { userId: string; deviceKey: string; deviceLabel: string | null; pxPerInch: number }) {
  await db
    .insert(calibrations)
    .values({ ...input, updatedAt: new Date() })
    .onConflictDoUpdate({
      target: [calibrations.userId, calibrations.deviceKey],
      set: { pxPerInch: input.pxPerInch, deviceLabel: input.deviceLabel, updatedAt: new Date() },
    });
}
