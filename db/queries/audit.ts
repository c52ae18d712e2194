import "server-only";
import { desc, eq } from "drizzle-orm";
import { db, type Database } from "../client";
import { auditLog } from "../schema";

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
