import "server-only";
import { and, asc, desc, eq, inArray, isNull, or, sql } from "drizzle-orm";
import type { Placement } from "@/lib/placement/model";
import { db } from "../client";
import { artworkSummary, type ArtworkSummary } from "./artworks";
import { nextRevisionLetter } from "@/lib/review/diff";
import { artworks, auditLog, blanks, calibrations, clients, jobs, placements, proofRevisions, proofs, type Blank, type Proof } from "../schema";

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

export type JobProofSummary = {
  id: string;
  name: string;
  revision: string;
  size: string;
  colourName: string;
  updatedAt: Date;
  archivedAt: Date | null;
  blankId: string;
  blankName: string;
  /** The newest sent revision (letter and state), if any was sent. */
  lastSent: { letter: string; state: "open" | "approved" | "changes-requested" } | null;
  /** The newest approved revision's letter: what production prints. */
  approvedLetter: string | null;
};

/** The job's proofs with where each stands: the working letter, the last one sent, the one approved. */
export async function listProofsForJob({ shopId, jobId, includeArchived = false }: { shopId: string; jobId: string; includeArchived?: boolean }): Promise<JobProofSummary[]> {
  const rows = await db
    .select({ id: proofs.id, name: proofs.name, revision: proofs.revision, size: proofs.size, colourName: proofs.colourName, updatedAt: proofs.updatedAt, archivedAt: proofs.archivedAt, blankId: proofs.blankId, blankName: blanks.name })
    .from(proofs)
    .innerJoin(blanks, eq(blanks.id, proofs.blankId))
    .where(and(eq(proofs.shopId, shopId), eq(proofs.jobId, jobId), includeArchived ? undefined : isNull(proofs.archivedAt)))
    .orderBy(asc(proofs.createdAt), asc(proofs.name));
  if (rows.length === 0) return [];
  const revisions = await db
    .select({ proofId: proofRevisions.proofId, letter: proofRevisions.letter, state: proofRevisions.state, sentAt: proofRevisions.sentAt })
    .from(proofRevisions)
    .where(inArray(proofRevisions.proofId, rows.map((r) => r.id)))
    .orderBy(asc(proofRevisions.sentAt));
  return rows.map((row) => {
    const mine = revisions.filter((r) => r.proofId === row.id);
    const last = mine[mine.length - 1];
    const approved = mine.filter((r) => r.state === "approved").pop();
    return { ...row, lastSent: last ? { letter: last.letter, state: last.state } : null, approvedLetter: approved?.letter ?? null };
  });
}

/** Whether a placement belongs to one of the job's proofs: its working copy, or a revision sent of it. */
export async function placementOnJob({ jobId, placementId }: { jobId: string; placementId: string }): Promise<boolean> {
  const placed = JSON.stringify([{ id: placementId }]);
  const rows = await db.execute<{ found: boolean }>(sql`
    select exists (select 1 from placements pl join proofs p on p.id = pl.proof_id where p.job_id = ${jobId} and pl.id = ${placementId})
        or exists (select 1 from proof_revisions r join proofs p on p.id = r.proof_id where p.job_id = ${jobId} and r.snapshot -> 'placements' @> ${placed}::jsonb)
      as found`);
  return rows.rows[0]?.found === true;
}

export type NewProofRow = {
  shopId: string;
  jobId: string;
  name: string;
  blankId: string;
  colourName: string;
  colourHex: string;
  size: string;
  placements: Placement[];
  userId: string;
  /** For the activity feed: the proof this one was copied from. */
  copiedFrom?: string;
};

/** Stores a new proof and its placements in one transaction, at revision A, and notes it in the log. */
export async function createProof(input: NewProofRow): Promise<{ id: string }> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(proofs)
      .values({ shopId: input.shopId, jobId: input.jobId, name: input.name, blankId: input.blankId, colourName: input.colourName, colourHex: input.colourHex, size: input.size, updatedBy: input.userId })
      .returning({ id: proofs.id });
    if (input.placements.length) {
      await tx.insert(placements).values(input.placements.map((p, i) => ({ ...p, proofId: row!.id, sortOrder: i })));
    }
    await tx.insert(auditLog).values({
      shopId: input.shopId,
      actorUserId: input.userId,
      action: input.copiedFrom ? "proof.duplicated" : "proof.created",
      subjectType: "proof",
      subjectId: row!.id,
      detail: input.copiedFrom ? { name: input.name, from: input.copiedFrom } : { name: input.name },
    });
    return { id: row!.id };
  });
}

/** Names already used by the job's proofs, archived ones included (names are unique per job). */
export async function proofNamesForJob({ jobId }: { jobId: string }): Promise<string[]> {
  const rows = await db.selectDistinct({ name: proofs.name }).from(proofs).where(eq(proofs.jobId, jobId));
  return rows.map((r) => r.name);
}

export type ArchiveResult = { kind: "done"; name: string } | { kind: "missing" } | { kind: "approved"; letter: string };

/**
 * Archives a draft proof, or brings one back. A proof with an approved revision is what production
 * prints, so it cannot be archived; the refusal names the approved letter.
 */
export async function setProofArchived({ shopId, proofId, archived, userId }: { shopId: string; proofId: string; archived: boolean; userId: string }): Promise<ArchiveResult> {
  return db.transaction(async (tx) => {
    const [row] = await tx.select({ id: proofs.id, name: proofs.name }).from(proofs).where(and(eq(proofs.id, proofId), eq(proofs.shopId, shopId))).for("update");
    if (!row) return { kind: "missing" as const };
    if (archived) {
      const [approved] = await tx
        .select({ letter: proofRevisions.letter })
        .from(proofRevisions)
        .where(and(eq(proofRevisions.proofId, proofId), eq(proofRevisions.state, "approved")))
        .limit(1);
      if (approved) return { kind: "approved" as const, letter: approved.letter };
    }
    await tx.update(proofs).set({ archivedAt: archived ? new Date() : null }).where(eq(proofs.id, proofId));
    await tx.insert(auditLog).values({ shopId, actorUserId: userId, action: archived ? "proof.archived" : "proof.restored", subjectType: "proof", subjectId: proofId, detail: { name: row.name } });
    return { kind: "done" as const, name: row.name };
  });
}

export type ProductionDocument = {
  document: ProofDocument;
  /** The approved letter the document shows, or null when nothing is approved yet (the working copy is shown). */
  approvedLetter: string | null;
  /** The proof's working letter when it differs from the approved one: a newer draft exists. */
  newerDraft: string | null;
};

/**
 * What production works from: the newest approved revision, frozen as the client approved it, or
 * the working copy while nothing is approved. Edits after approval never reach the press until the
 * next revision is approved.
 */
export async function getProductionDocument({ shopId, proofId }: { shopId: string; proofId: string }): Promise<ProductionDocument | undefined> {
  const live = await getProofDocument({ shopId, proofId });
  if (!live) return undefined;
  const [approved] = await db
    .select({ letter: proofRevisions.letter, snapshot: proofRevisions.snapshot })
    .from(proofRevisions)
    .where(and(eq(proofRevisions.proofId, proofId), eq(proofRevisions.state, "approved")))
    .orderBy(desc(proofRevisions.sentAt))
    .limit(1);
  if (!approved) return { document: live, approvedLetter: null, newerDraft: null };
  const snap = approved.snapshot;
  let blank = live.blank;
  if (snap.blankId !== live.blank.id) {
    const [row] = await db.select().from(blanks).where(eq(blanks.id, snap.blankId)).limit(1);
    if (row) blank = row;
  }
  const placedIds = [...new Set(snap.placements.map((p) => p.artworkId).filter((id): id is string => !!id))];
  const missing = placedIds.filter((id) => !live.artworks.some((a) => a.id === id));
  const extra = missing.length ? await db.select(artworkSummary).from(artworks).where(and(eq(artworks.shopId, shopId), inArray(artworks.id, missing))) : [];
  const document: ProofDocument = {
    proof: { ...live.proof, revision: approved.letter, size: snap.size, colourName: snap.colourName, colourHex: snap.colourHex ?? live.proof.colourHex, blankId: snap.blankId },
    job: live.job,
    blank,
    placements: snap.placements,
    artworks: [...live.artworks, ...extra],
  };
  return { document, approvedLetter: approved.letter, newerDraft: live.proof.revision !== approved.letter ? live.proof.revision : null };
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
  /** Made by the editor for each save; the same key on a retry of that save. */
  saveKey?: string | null;
};

export type SaveProofResult =
  | { kind: "saved"; version: number; updatedAt: Date; revision: string }
  | { kind: "conflict"; current: ProofDocument }
  | { kind: "missing" };

/**
 * Saves the whole editable state of a proof if nobody saved since `baseVersion`. The size the proof
 * was designed at is part of the document; the size being looked at in the editor is not.
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
      .select({ revision: proofs.revision, version: proofs.version, updatedAt: proofs.updatedAt, lastSaveKey: proofs.lastSaveKey })
      .from(proofs)
      .where(and(eq(proofs.id, input.proofId), eq(proofs.shopId, input.shopId)))
      .for("update");
    if (!current) return null;
    // A retry of the save stored last (its answer was lost on the way back) is that save, not a conflict.
    if (current.version !== input.baseVersion) return input.saveKey && current.lastSaveKey === input.saveKey ? { version: current.version, updatedAt: current.updatedAt, revision: current.revision } : null;
    // A sent revision never changes: the first edit after a send (or an approval) starts the next
    // letter as a draft. The share lock makes a save wait for a send or an approval being recorded.
    let revision = current.revision;
    const [sent] = await tx
      .select({ state: proofRevisions.state })
      .from(proofRevisions)
      .where(and(eq(proofRevisions.proofId, input.proofId), eq(proofRevisions.letter, revision)))
      .for("share");
    if (sent) revision = nextRevisionLetter(revision);
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
        lastSaveKey: input.saveKey ?? null,
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
