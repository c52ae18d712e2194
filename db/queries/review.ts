import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { and, asc, desc, eq, inArray, isNull, sql } from "drizzle-orm";
import type { RevisionSnapshot } from "@/lib/review/diff";
import { db } from "../client";
import { approvals, auditLog, clients, jobs, memberships, proofComments, proofRevisions, proofs, shareLinks, shops, users, type ShareLink } from "../schema";
import type { ProofDocument } from "./proofs";

export function hashShareToken(token: string): string {
  return createHash("sha256").update(`share:${token}`).digest("hex");
}

export function snapshotOf(document: ProofDocument): RevisionSnapshot {
  return {
    blankId: document.blank.id,
    blankName: document.blank.name,
    size: document.proof.size,
    colourName: document.proof.colourName,
    colourHex: document.proof.colourHex,
    placements: document.placements,
    // Names of the placed art only: the snapshot is what a client is shown.
    artNames: Object.fromEntries(document.artworks.filter((a) => document.placements.some((p) => p.artworkId === a.id)).map((a) => [a.id, a.name])),
  };
}

/**
 * Freezes the proof's current state as its current revision letter, ready for the client. A letter
 * once sent never changes: sharing again without edits hands out the same revision, and any edit
 * after a send has already moved the proof to the next letter (see saveProof).
 */
export async function sendRevision({ document, userId }: { document: ProofDocument; userId: string }) {
  const letter = document.proof.revision;
  const snapshot = snapshotOf(document);
  const [inserted] = await db
    .insert(proofRevisions)
    .values({ proofId: document.proof.id, letter, snapshot, sentBy: userId, state: "open" })
    .onConflictDoNothing({ target: [proofRevisions.proofId, proofRevisions.letter] })
    .returning();
  const row =
    inserted ??
    (await db
      .select()
      .from(proofRevisions)
      .where(and(eq(proofRevisions.proofId, document.proof.id), eq(proofRevisions.letter, letter)))
      .limit(1)
      .then((rows) => rows[0]));
  if (inserted) {
    await db.update(jobs).set({ status: "with-client", updatedAt: new Date() }).where(and(eq(jobs.id, document.job.id), eq(jobs.status, "drafting")));
    await db.insert(auditLog).values({ shopId: document.proof.shopId, actorUserId: userId, action: "proof.revision-sent", subjectType: "proof", subjectId: document.proof.id, detail: { revision: letter } });
  }
  return row!;
}

export async function listRevisions({ proofId }: { proofId: string }) {
  return db.select().from(proofRevisions).where(eq(proofRevisions.proofId, proofId)).orderBy(asc(proofRevisions.sentAt));
}

export async function latestRevision({ proofId }: { proofId: string }) {
  const [row] = await db.select().from(proofRevisions).where(eq(proofRevisions.proofId, proofId)).orderBy(desc(proofRevisions.sentAt)).limit(1);
  return row;
}

export async function createShareLink(input: {
  shopId: string;
  proofId: string;
  permission: ShareLink["permission"];
  expiresAt: Date | null;
  recipientEmail: string | null;
  recipientName: string | null;
  createdBy: string;
}): Promise<{ token: string; link: ShareLink }> {
  // 32 random bytes: 256 bits, well past the 128-bit floor. Only the hash is stored.
  const token = randomBytes(32).toString("base64url");
  const [link] = await db.insert(shareLinks).values({ ...input, tokenHash: hashShareToken(token) }).returning();
  await db.insert(auditLog).values({ shopId: input.shopId, actorUserId: input.createdBy, action: "proof.shared", subjectType: "proof", subjectId: input.proofId, detail: { permission: input.permission, to: input.recipientEmail } });
  return { token, link: link! };
}

export async function listShareLinks({ shopId, proofId }: { shopId: string; proofId: string }) {
  return db.select().from(shareLinks).where(and(eq(shareLinks.shopId, shopId), eq(shareLinks.proofId, proofId))).orderBy(desc(shareLinks.createdAt));
}

export async function revokeShareLink({ shopId, linkId, userId }: { shopId: string; linkId: string; userId: string }) {
  const [row] = await db
    .update(shareLinks)
    .set({ revokedAt: new Date() })
    .where(and(eq(shareLinks.id, linkId), eq(shareLinks.shopId, shopId), isNull(shareLinks.revokedAt)))
    .returning();
  if (row) await db.insert(auditLog).values({ shopId, actorUserId: userId, action: "share.revoked", subjectType: "share_link", subjectId: linkId });
  return row;
}

export type TokenLookup = { state: "ok"; link: ShareLink } | { state: "revoked" | "expired"; link: ShareLink } | { state: "missing" };

export async function lookupShareToken(token: string): Promise<TokenLookup> {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return { state: "missing" };
  const [link] = await db.select().from(shareLinks).where(eq(shareLinks.tokenHash, hashShareToken(token))).limit(1);
  if (!link) return { state: "missing" };
  if (link.revokedAt) return { state: "revoked", link };
  if (link.expiresAt && link.expiresAt.getTime() <= Date.now()) return { state: "expired", link };
  return { state: "ok", link };
}

/**
 * A share link's lookup and, in the same round trip, a stamp of everything its review page shows:
 * the link's own settings, the proof and job names, the shop's name and clock, the blanks drawn,
 * every revision and its state, the notes and whether each is resolved, the decisions, and the
 * job's quotes and payments. Any change to any of them changes the stamp, whichever process made
 * it, so a page kept under the stamp is never older than the database.
 */
export async function reviewPageStamp(token: string): Promise<{ lookup: TokenLookup; stamp: string | null; latestLetter: string | null }> {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return { lookup: { state: "missing" }, stamp: null, latestLetter: null };
  const proofId = sql`${shareLinks.proofId}`;
  const stamp = sql<string>`md5(concat_ws('|',
    ${shareLinks.permission}, ${shareLinks.recipientName}, ${shareLinks.lastSeenLetter},
    (select concat_ws(':', p.name, p.updated_at, j.title, j.updated_at, s.name, s.locale, s.time_zone, s.price_matrix_updated_at, b.updated_at)
       from proofs p join jobs j on j.id = p.job_id join shops s on s.id = p.shop_id left join blanks b on b.id = p.blank_id where p.id = ${proofId}),
    (select concat_ws(':', string_agg(r.id || r.state, ',' order by r.sent_at, r.id), max(b.updated_at))
       from proof_revisions r left join blanks b on b.id = r.snapshot->>'blankId' where r.proof_id = ${proofId}),
    (select md5(string_agg(c.id || coalesce(c.resolved_at::text, ''), ',' order by c.id)) from proof_comments c where c.proof_id = ${proofId}),
    (select string_agg(a.id, ',' order by a.id) from approvals a where a.proof_id = ${proofId}),
    (select string_agg(q.id || q.state || coalesce(q.accepted_at::text, ''), ',' order by q.id)
       from quotes q join proofs p on p.job_id = q.job_id where p.id = ${proofId}),
    (select string_agg(m.id || m.state, ',' order by m.id) from payments m join proofs p on p.job_id = m.job_id where p.id = ${proofId})
  ))`;
  const latestLetter = sql<string | null>`(select r.letter from proof_revisions r where r.proof_id = ${proofId} order by r.sent_at desc limit 1)`;
  const [row] = await db.select({ link: shareLinks, stamp, latestLetter }).from(shareLinks).where(eq(shareLinks.tokenHash, hashShareToken(token))).limit(1);
  if (!row) return { lookup: { state: "missing" }, stamp: null, latestLetter: null };
  const { link } = row;
  if (link.revokedAt) return { lookup: { state: "revoked", link }, stamp: null, latestLetter: null };
  if (link.expiresAt && link.expiresAt.getTime() <= Date.now()) return { lookup: { state: "expired", link }, stamp: null, latestLetter: null };
  return { lookup: { state: "ok", link }, stamp: row.stamp, latestLetter: row.latestLetter };
}

/** A link's view is written down on a new revision, or at most once a minute on the same one. */
export function seenWriteDue(link: Pick<ShareLink, "lastSeenLetter" | "lastSeenAt">, latestLetter: string, now = Date.now()): boolean {
  return link.lastSeenLetter !== latestLetter || !link.lastSeenAt || now - link.lastSeenAt.getTime() > 60_000;
}

export async function markSeen({ linkId, letter }: { linkId: string; letter: string }) {
  await db.update(shareLinks).set({ lastSeenLetter: letter, lastSeenAt: new Date() }).where(eq(shareLinks.id, linkId));
}

export async function listComments({ proofId }: { proofId: string }) {
  return db.select().from(proofComments).where(eq(proofComments.proofId, proofId)).orderBy(asc(proofComments.createdAt));
}

export async function addComment(values: typeof proofComments.$inferInsert) {
  const [row] = await db.insert(proofComments).values(values).returning();
  return row!;
}

export async function setCommentResolved({ proofId, commentId, resolved, by }: { proofId: string; commentId: string; resolved: boolean; by: string }) {
  const [row] = await db
    .update(proofComments)
    .set(resolved ? { resolvedAt: new Date(), resolvedBy: by } : { resolvedAt: null, resolvedBy: null })
    .where(and(eq(proofComments.id, commentId), eq(proofComments.proofId, proofId), isNull(proofComments.parentId)))
    .returning();
  return row;
}

export async function listApprovals({ proofId }: { proofId: string }) {
  return db.select().from(approvals).where(eq(approvals.proofId, proofId)).orderBy(desc(approvals.at));
}

export type DecisionInput = {
  proofId: string;
  letter: string;
  decision: "approved" | "changes-requested";
  fullName: string;
  statement: string;
  comment: string | null;
  ip: string | null;
  userAgent: string | null;
  shareLinkId: string | null;
  userId: string | null;
};

/** Records the client's decision on one revision. Approval locks that revision for good. */
export async function recordDecision(input: DecisionInput): Promise<{ ok: true; approvalId: string; commentId: string | null } | { ok: false; message: string }> {
  return db.transaction(async (tx) => {
    const [revision] = await tx
      .select()
      .from(proofRevisions)
      .where(and(eq(proofRevisions.proofId, input.proofId), eq(proofRevisions.letter, input.letter)))
      .for("update")
      .limit(1);
    if (!revision) return { ok: false as const, message: "That revision does not exist." };
    const [newest] = await tx.select().from(proofRevisions).where(eq(proofRevisions.proofId, input.proofId)).orderBy(desc(proofRevisions.sentAt)).limit(1);
    if (newest && newest.id !== revision.id) return { ok: false as const, message: `Revision ${input.letter} has been replaced by revision ${newest.letter}. Look at the newest one first.` };
    if (revision.state === "approved") return { ok: false as const, message: `Revision ${input.letter} is already approved.` };
    const [proof] = await tx.select({ shopId: proofs.shopId, jobId: proofs.jobId }).from(proofs).where(eq(proofs.id, input.proofId));
    let commentId: string | null = null;
    if (input.comment) {
      const [comment] = await tx
        .insert(proofComments)
        .values({ proofId: input.proofId, revisionLetter: input.letter, body: input.comment, authorName: input.fullName, authorRole: "client", authorUserId: input.userId, shareLinkId: input.shareLinkId })
        .returning({ id: proofComments.id });
      commentId = comment!.id;
    }
    const [approval] = await tx
      .insert(approvals)
      .values({ proofId: input.proofId, revisionId: revision.id, revisionLetter: input.letter, decision: input.decision, fullName: input.fullName, statement: input.statement, commentId, ip: input.ip, userAgent: input.userAgent, shareLinkId: input.shareLinkId, userId: input.userId })
      .returning({ id: approvals.id });
    await tx.update(proofRevisions).set({ state: input.decision === "approved" ? "approved" : "changes-requested" }).where(eq(proofRevisions.id, revision.id));
    if (input.decision === "approved") await tx.update(jobs).set({ status: "cleared", updatedAt: new Date() }).where(eq(jobs.id, proof!.jobId));
    await tx.insert(auditLog).values({
      shopId: proof!.shopId,
      actorUserId: input.userId,
      actorLabel: input.shareLinkId ? `share link · ${input.fullName}` : input.fullName,
      action: input.decision === "approved" ? "proof.approved" : "proof.changes-requested",
      subjectType: "proof",
      subjectId: input.proofId,
      detail: { revision: input.letter, name: input.fullName },
    });
    return { ok: true as const, approvalId: approval!.id, commentId };
  });
}

/** Who at the shop hears about client activity: owners and designers. */
export async function shopNotificationRecipients({ shopId }: { shopId: string }) {
  return db
    .select({ email: users.email, name: users.name, role: memberships.role })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.shopId, shopId))
    .then((rows) => rows.filter((r) => r.role !== "production"));
}

export async function proofContext({ proofId }: { proofId: string }) {
  const [row] = await db
    .select({ proofId: proofs.id, proofName: proofs.name, revision: proofs.revision, shopId: shops.id, shopSlug: shops.slug, shopName: shops.name, locale: shops.locale, timeZone: shops.timeZone, jobId: jobs.id, jobTitle: jobs.title, clientId: clients.id, clientName: clients.name })
    .from(proofs)
    .innerJoin(shops, eq(shops.id, proofs.shopId))
    .innerJoin(jobs, eq(jobs.id, proofs.jobId))
    .innerJoin(clients, eq(clients.id, jobs.clientId))
    .where(eq(proofs.id, proofId))
    .limit(1);
  return row;
}

/** Proofs a client may open: those with at least one revision sent, of these jobs if they are these clients' (a portal page asks for its own rows only). */
export async function listSharedProofsForClients({ clientIds, jobIds }: { clientIds: string[]; jobIds: string[] }) {
  if (clientIds.length === 0 || jobIds.length === 0) return [];
  const rows = await db
    .selectDistinct({ proofId: proofs.id, jobId: proofs.jobId, name: proofs.name })
    .from(proofs)
    .innerJoin(jobs, eq(jobs.id, proofs.jobId))
    .innerJoin(proofRevisions, eq(proofRevisions.proofId, proofs.id))
    .where(and(inArray(jobs.clientId, clientIds), inArray(proofs.jobId, jobIds)));
  return rows;
}

/** The approval record for a job's proofs, newest first, for the shop. */
export async function listJobDecisions({ shopId, jobId }: { shopId: string; jobId: string }) {
  return db
    .select({ id: approvals.id, proofName: proofs.name, decision: approvals.decision, fullName: approvals.fullName, revisionLetter: approvals.revisionLetter, statement: approvals.statement, ip: approvals.ip, userAgent: approvals.userAgent, at: approvals.at, viaLink: approvals.shareLinkId })
    .from(approvals)
    .innerJoin(proofs, eq(proofs.id, approvals.proofId))
    .where(and(eq(proofs.shopId, shopId), eq(proofs.jobId, jobId)))
    .orderBy(desc(approvals.at));
}
