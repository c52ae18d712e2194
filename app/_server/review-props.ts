import "server-only";
import type { ReviewViewProps } from "@/components/review/ReviewView";
import { findBlank } from "@/db/queries/blanks";
import { listRevisions, markSeen, proofContext, seenWriteDue } from "@/db/queries/review";
import { describeRevisionChanges } from "@/lib/review/diff";
import { loadReview, reviewState, type Reviewer } from "./review";

/** Everything the review page draws, from the latest revision sent to the client (never the working copy). */
export async function buildReviewProps(reviewer: Reviewer, key: string): Promise<ReviewViewProps | null> {
  const data = await loadReview(reviewer);
  if (!data) return null;
  const { document } = data;
  const revisions = await listRevisions({ proofId: document.proof.id });
  const latest = revisions[revisions.length - 1];
  // Shop members may preview before anything was sent; clients only ever see a sent revision.
  if (!latest && reviewer.kind !== "shop") return null;
  const snapshot = latest?.snapshot ?? {
    blankId: document.blank.id,
    blankName: document.blank.name,
    size: document.proof.size,
    colourName: document.proof.colourName,
    placements: document.placements,
  };
  // Independent reads (and the seen-marker write) go out together: one round trip instead of four.
  const seenWrite = reviewer.kind === "link" && latest && seenWriteDue(reviewer.link, latest.letter) ? markSeen({ linkId: reviewer.link.id, letter: latest.letter }) : null;
  const [foundBlank, context, initial] = await Promise.all([findBlank({ shopId: reviewer.shopId, blankId: snapshot.blankId }), proofContext({ proofId: document.proof.id }), reviewState(document.proof.id), seenWrite]);
  const blank = foundBlank ?? document.blank;
  const colourHex = blank.colours.find((c) => c.name === snapshot.colourName)?.hex ?? document.proof.colourHex;

  let sinceLetter: string | null = null;
  if (reviewer.kind === "link") sinceLetter = reviewer.link.lastSeenLetter;
  else if (revisions.length > 1) sinceLetter = revisions[revisions.length - 2]!.letter;
  const since = sinceLetter && latest && sinceLetter !== latest.letter ? revisions.find((r) => r.letter === sinceLetter) : undefined;
  const changes = since && latest ? { since: since.letter, lines: describeRevisionChanges(since.snapshot, latest.snapshot) } : null;

  const placedArt = new Set(snapshot.placements.map((p) => p.artworkId).filter(Boolean));
  // Older snapshots named all of the shop's art; a reviewer is told the names of placed art only.
  const placedNames = Object.fromEntries(Object.entries(snapshot.artNames ?? {}).filter(([id]) => placedArt.has(id)));
  return {
    reviewKind: reviewer.kind === "link" ? "link" : "proof",
    reviewKey: key,
    shopName: context?.shopName ?? "",
    clock: { locale: context?.locale ?? null, timeZone: context?.timeZone ?? null },
    jobTitle: document.job.title,
    proofName: document.proof.name,
    snapshot: { ...snapshot, artNames: placedNames },
    colourHex,
    blank: { category: blank.category, name: blank.name, sizeChart: blank.sizeChart },
    art: document.artworks.filter((a) => placedArt.has(a.id)).map((a) => ({ id: a.id, name: a.name, kind: a.kind, svg: a.kind === "generated" ? a.svg : null, inkWidthPx: a.inkWidthPx, inkHeightPx: a.inkHeightPx })),
    canComment: reviewer.canComment,
    canApprove: reviewer.canApprove,
    viewerName: reviewer.displayName,
    changes,
    signedIn: reviewer.kind !== "link",
    initial,
  };
}
