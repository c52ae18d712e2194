import "server-only";
import { getActor, type Actor } from "@/app/_server/access";
import { findProofShop, getProofDocument, type ProofDocument } from "@/db/queries/proofs";
import { latestRevision, listApprovals, listComments, lookupShareToken } from "@/db/queries/review";
import type { ProofRevision, ShareLink } from "@/db/schema";
import { can, type ShopRole } from "@/lib/access";

/** Who is looking at a proof for review, and what they may do. */
export type Reviewer =
  | { kind: "link"; link: ShareLink; shopId: string; proofId: string; canComment: boolean; canApprove: boolean; displayName: string | null }
  | { kind: "client"; actor: Actor; shopId: string; proofId: string; canComment: true; canApprove: true; displayName: string }
  | { kind: "shop"; actor: Actor; role: ShopRole; shopId: string; proofId: string; canComment: boolean; canApprove: false; displayName: string };

export type ReviewAccess = { ok: true; reviewer: Reviewer } | { ok: false; status: 401 | 404 | 410; message: string };

const GONE: Record<"revoked" | "expired", string> = {
  revoked: "The print shop has withdrawn this link. Ask them for a new one.",
  expired: "This link has expired. Ask the print shop for a new one.",
};

/** `kind` is "link" (a share token) or "proof" (a signed-in client or shop member). */
/** Whether a path segment can be one of our record ids (uuids and library slugs); anything else is not found. */
export function isRecordId(value: string): boolean {
  return /^[A-Za-z0-9-]{1,80}$/.test(value);
}

export async function resolveReview(kind: string, key: string): Promise<ReviewAccess> {
  if (kind === "link") {
    const found = await lookupShareToken(key);
    // A wrong token and a missing one look the same from outside.
    if (found.state === "missing") return { ok: false, status: 404, message: "This review link does not exist." };
    if (found.state !== "ok") return { ok: false, status: 410, message: GONE[found.state] };
    const { link } = found;
    return {
      ok: true,
      reviewer: { kind: "link", link, shopId: link.shopId, proofId: link.proofId, canComment: link.permission !== "view", canApprove: link.permission === "approve", displayName: link.recipientName },
    };
  }
  if (kind !== "proof" || !isRecordId(key)) return { ok: false, status: 404, message: "Not found." };
  const actor = await getActor();
  if (!actor) return { ok: false, status: 401, message: "Sign in to continue." };
  const owner = await findProofShop({ proofId: key });
  if (!owner) return { ok: false, status: 404, message: "Not found." };
  const membership = actor.memberships.find((m) => m.shopId === owner.shopId);
  if (membership && can(membership.role, "jobs.view")) {
    return { ok: true, reviewer: { kind: "shop", actor, role: membership.role, shopId: owner.shopId, proofId: key, canComment: can(membership.role, "proofs.edit"), canApprove: false, displayName: actor.name ?? actor.email } };
  }
  // A client reaches a proof only once a revision was sent to them, never the shop's working copy.
  if (actor.contacts.some((c) => c.shopId === owner.shopId && c.clientId === owner.clientId) && (await latestRevision({ proofId: key }))) {
    return { ok: true, reviewer: { kind: "client", actor, shopId: owner.shopId, proofId: key, canComment: true, canApprove: true, displayName: actor.name ?? actor.email } };
  }
  return { ok: false, status: 404, message: "Not found." };
}

export type ReviewData = { document: ProofDocument; revision: ProofRevision | undefined };

export async function loadReview(reviewer: Reviewer): Promise<ReviewData | undefined> {
  const document = await getProofDocument({ shopId: reviewer.shopId, proofId: reviewer.proofId });
  if (!document) return undefined;
  return { document, revision: await latestRevision({ proofId: reviewer.proofId }) };
}

/** Notes, the newest revision's state and the decisions: what both review views poll. */
export async function reviewState(proofId: string) {
  const [comments, revision, approvals] = await Promise.all([listComments({ proofId }), latestRevision({ proofId }), listApprovals({ proofId })]);
  return {
    comments: comments.map((c) => ({
      id: c.id,
      parentId: c.parentId,
      side: c.side,
      xIn: c.xIn,
      yIn: c.yIn,
      body: c.body,
      authorName: c.authorName,
      authorRole: c.authorRole,
      revisionLetter: c.revisionLetter,
      createdAt: c.createdAt.toISOString(),
      resolvedAt: c.resolvedAt?.toISOString() ?? null,
    })),
    revision: revision ? { letter: revision.letter, state: revision.state, sentAt: revision.sentAt.toISOString() } : null,
    approvals: approvals.map((a) => ({ id: a.id, decision: a.decision, fullName: a.fullName, revisionLetter: a.revisionLetter, at: a.at.toISOString() })),
  };
}
