import { NextResponse } from "next/server";
import { z } from "zod";
import { notifyClientComment, notifyShopReply } from "@/app/_server/notify";
import { clientAddress } from "@/app/_server/client-address";
import { addressSubject, LIMITS, limitResponse, takeLimits } from "@/app/_server/rate-limit";
import { resolveReview, reviewState } from "@/app/_server/review";
import { addComment, latestRevision, listShareLinks, setCommentResolved } from "@/db/queries/review";
import { parseInput, readJson } from "@/lib/input";

export const dynamic = "force-dynamic";

type Params = { params: Promise<{ kind: string; key: string }> };

const postSchema = z
  .object({
    body: z.string().trim().min(1, "Write a note first.").max(2000, "Keep a note under 2,000 characters."),
    parentId: z.string().min(1).max(80).nullable().default(null),
    side: z.enum(["front", "back"]).nullable().default(null),
    xIn: z.number().finite().min(-60).max(60).nullable().default(null),
    yIn: z.number().finite().min(-60).max(60).nullable().default(null),
    authorName: z.string().trim().min(1).max(80).optional(),
  })
  .refine((v) => v.parentId !== null || (v.side !== null && v.xIn !== null && v.yIn !== null), { message: "Tap the garment where the note belongs." });

const patchSchema = z.object({ commentId: z.string().min(1).max(80), resolved: z.boolean() });

function error(status: number, message: string) {
  return NextResponse.json({ error: message }, { status });
}

export async function GET(_request: Request, { params }: Params) {
  const { kind, key } = await params;
  const access = await resolveReview(kind, key);
  if (!access.ok) return error(access.status, access.message);
  return NextResponse.json(await reviewState(access.reviewer.proofId), { headers: { "Cache-Control": "no-store" } });
}

export async function POST(request: Request, { params }: Params) {
  const { kind, key } = await params;
  const access = await resolveReview(kind, key);
  if (!access.ok) return error(access.status, access.message);
  const reviewer = access.reviewer;
  if (!reviewer.canComment) return error(403, "This link lets you look, not comment.");
  // Each note e-mails the shop: per link and address, then per link from every address together.
  const taken =
    reviewer.kind === "link"
      ? await takeLimits({ rule: LIMITS.commentLinkAddress, subject: `${reviewer.link.id} ${addressSubject(clientAddress(request))}` }, { rule: LIMITS.commentLink, subject: reviewer.link.id })
      : await takeLimits({ rule: LIMITS.commentUser, subject: reviewer.actor.id });
  if (!taken.ok) return limitResponse(taken, "That is a lot of notes at once. Wait a minute and try again.");
  const parsed = parseInput(postSchema, await readJson(request));
  if (!parsed.success) return error(400, parsed.error.issues[0]?.message ?? "That note could not be read.");
  const input = parsed.data;
  const revision = await latestRevision({ proofId: reviewer.proofId });
  const authorName = reviewer.kind === "link" ? (input.authorName ?? reviewer.displayName ?? "Client") : reviewer.displayName;
  const comment = await addComment({
    proofId: reviewer.proofId,
    revisionLetter: revision?.letter ?? "A",
    parentId: input.parentId,
    side: input.parentId ? null : input.side,
    xIn: input.parentId ? null : input.xIn,
    yIn: input.parentId ? null : input.yIn,
    body: input.body,
    authorName,
    authorRole: reviewer.kind === "shop" ? "shop" : "client",
    authorUserId: reviewer.kind === "link" ? null : reviewer.actor.id,
    shareLinkId: reviewer.kind === "link" ? reviewer.link.id : null,
  });
  // The note is saved; e-mail is best effort and never undoes it.
  if (reviewer.kind === "shop") {
    const links = await listShareLinks({ shopId: reviewer.shopId, proofId: reviewer.proofId });
    void notifyShopReply({ proofId: reviewer.proofId, author: authorName, body: input.body, recipients: links.filter((l) => !l.revokedAt && l.recipientEmail).map((l) => l.recipientEmail!) });
  } else {
    void notifyClientComment({ proofId: reviewer.proofId, author: authorName, body: input.body });
  }
  return NextResponse.json({ comment: { id: comment.id }, ...(await reviewState(reviewer.proofId)) }, { status: 201 });
}

export async function PATCH(request: Request, { params }: Params) {
  const { kind, key } = await params;
  const access = await resolveReview(kind, key);
  if (!access.ok) return error(access.status, access.message);
  if (access.reviewer.kind !== "shop" || !access.reviewer.canComment) return error(403, "Only the shop team can resolve notes.");
  const parsed = parseInput(patchSchema, await readJson(request));
  if (!parsed.success) return error(400, "Say which note to resolve or reopen.");
  const row = await setCommentResolved({ proofId: access.reviewer.proofId, commentId: parsed.data.commentId, resolved: parsed.data.resolved, by: access.reviewer.actor.id });
  if (!row) return error(404, "That note is not on this proof.");
  return NextResponse.json(await reviewState(access.reviewer.proofId));
}
