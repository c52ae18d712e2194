import "server-only";
import { and, desc, eq, inArray } from "drizzle-orm";
import { db, type Database } from "../client";
import { auditLog, clients, jobs, proofs, shareLinks, users } from "../schema";

type Executor = Pick<Database, "insert">;

export async function recordAudit(
  entry: {
    shopId?: string | null;
    actorUserId?: string | null;
    actorLabel?: string | null;
    action: string;
    subjectType?: string;
    subjectId?: string;
    detail?: Record<string, unknown>;
  },
  executor: Executor = db,
): Promise<void> {
  await executor.insert(auditLog).values({
    shopId: entry.shopId ?? null,
    actorUserId: entry.actorUserId ?? null,
    actorLabel: entry.actorLabel ?? null,
    action: entry.action,
    subjectType: entry.subjectType,
    subjectId: entry.subjectId,
    detail: entry.detail,
  });
}

export async function listAudit({ shopId, limit = 50 }: { shopId: string; limit?: number }) {
  return db.select().from(auditLog).where(eq(auditLog.shopId, shopId)).orderBy(desc(auditLog.at)).limit(limit);
}

export type ActivityRow = {
  id: string;
  at: Date;
  action: string;
  detail: Record<string, unknown>;
  /** Who did it: the member's name, or the label kept for someone without an account. */
  actorName: string | null;
  job: { id: string; title: string } | null;
  proof: { id: string; name: string } | null;
  client: { id: string; name: string } | null;
};

/**
 * The shop's latest activity with who did it and what it was about: each entry's subject is
 * followed to its job (a proof's job, a share link's proof's job) so the line can link there.
 */
export async function listActivity({ shopId, limit = 20 }: { shopId: string; limit?: number }): Promise<ActivityRow[]> {
  const rows = await db
    .select({ entry: auditLog, userName: users.name, userEmail: users.email })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.actorUserId))
    .where(eq(auditLog.shopId, shopId))
    .orderBy(desc(auditLog.at), desc(auditLog.id))
    .limit(limit);
  const ids = (type: string) => [...new Set(rows.filter((r) => r.entry.subjectType === type && r.entry.subjectId).map((r) => r.entry.subjectId!))];
  const links = ids("share_link").length ? await db.select({ id: shareLinks.id, proofId: shareLinks.proofId }).from(shareLinks).where(and(eq(shareLinks.shopId, shopId), inArray(shareLinks.id, ids("share_link")))) : [];
  const proofIds = [...new Set([...ids("proof"), ...links.map((l) => l.proofId)])];
  const proofRows = proofIds.length ? await db.select({ id: proofs.id, name: proofs.name, jobId: proofs.jobId }).from(proofs).where(and(eq(proofs.shopId, shopId), inArray(proofs.id, proofIds))) : [];
  const jobIds = [...new Set([...ids("job"), ...proofRows.map((p) => p.jobId)])];
  const jobRows = jobIds.length ? await db.select({ id: jobs.id, title: jobs.title }).from(jobs).where(and(eq(jobs.shopId, shopId), inArray(jobs.id, jobIds))) : [];
  const clientRows = ids("client").length ? await db.select({ id: clients.id, name: clients.name }).from(clients).where(and(eq(clients.shopId, shopId), inArray(clients.id, ids("client")))) : [];
  const proofById = new Map(proofRows.map((p) => [p.id, p]));
  const jobById = new Map(jobRows.map((j) => [j.id, j]));
  const linkById = new Map(links.map((l) => [l.id, l]));
  const clientById = new Map(clientRows.map((c) => [c.id, c]));
  return rows.map(({ entry, userName, userEmail }) => {
    const subject = entry.subjectId ?? "";
    const proofRow = entry.subjectType === "proof" ? proofById.get(subject) : entry.subjectType === "share_link" ? proofById.get(linkById.get(subject)?.proofId ?? "") : undefined;
    const jobRow = entry.subjectType === "job" ? jobById.get(subject) : proofRow ? jobById.get(proofRow.jobId) : undefined;
    const clientRow = entry.subjectType === "client" ? clientById.get(subject) : undefined;
    return {
      id: entry.id,
      at: entry.at,
      action: entry.action,
      detail: entry.detail ?? {},
      actorName: userName ?? entry.actorLabel ?? userEmail ?? null,
      job: jobRow ? { id: jobRow.id, title: jobRow.title } : null,
      proof: proofRow ? { id: proofRow.id, name: proofRow.name } : null,
      client: clientRow ? { id: clientRow.id, name: clientRow.name } : null,
    };
  });
}
