"use server";

import { z } from "zod";
import { resolveShopAccess } from "@/app/_server/access";
import { getProofDocument, listShopArtworks, saveProof } from "@/db/queries/proofs";
import { proofDocSchema, type ProofDoc } from "@/lib/editor/document";
import { toEditorDoc } from "@/lib/editor/from-server";

const saveSchema = z.object({
  shopSlug: z.string().min(1).max(80),
  proofId: z.string().min(1).max(80),
  baseVersion: z.number().int().positive(),
  doc: proofDocSchema,
});

export type SaveProofResponse =
  | { ok: true; version: number; savedAt: string; revision: string }
  | { ok: false; kind: "conflict"; message: string; version: number; doc: ProofDoc }
  | { ok: false; kind: "invalid" | "denied" | "missing" | "error"; message: string; status?: number };

const DENIED_STATUS = { anonymous: 401, forbidden: 403, "not-found": 404 } as const;

/** Autosave: the whole document, guarded by the version the editor last saw. */
export async function saveProofAction(input: z.input<typeof saveSchema>): Promise<SaveProofResponse> {
  const parsed = saveSchema.safeParse(input);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { ok: false, kind: "invalid", message: issue ? `Not saved: ${issue.message}` : "Not saved: the proof data is not valid." };
  }
  const access = await resolveShopAccess(parsed.data.shopSlug, "proofs.edit");
  if (access.kind !== "ok") return { ok: false, kind: "denied", message: access.message, status: DENIED_STATUS[access.kind] };
  const { shop, actor } = access.access;
  const { doc, proofId, baseVersion } = parsed.data;

  const current = await getProofDocument({ shopId: shop.id, proofId });
  if (!current) return { ok: false, kind: "missing", message: "This proof no longer exists.", status: 404 };
  if (!current.blank.sizeChart.some((row) => row.size === doc.size)) {
    return { ok: false, kind: "invalid", message: `Not saved: size ${doc.size} is not in this blank's size chart.` };
  }
  const artIds = new Set(current.artworks.map((a) => a.id));
  // Every placed art that the proof does not list yet must be the shop's own, not only the first one.
  const unknownArt = [...new Set(doc.placements.flatMap((p) => (p.artworkId && !artIds.has(p.artworkId) ? [p.artworkId] : [])))];
  if (unknownArt.length) {
    const shopArt = await listShopArtworks({ shopId: shop.id, ids: unknownArt });
    if (shopArt.length < unknownArt.length) return { ok: false, kind: "invalid", message: "Not saved: that artwork is not in this shop's library." };
  }

  try {
    const result = await saveProof({ shopId: shop.id, proofId, baseVersion, ...doc, userId: actor.id });
    if (result.kind === "saved") return { ok: true, version: result.version, savedAt: result.updatedAt.toISOString(), revision: result.revision };
    if (result.kind === "missing") return { ok: false, kind: "missing", message: "This proof no longer exists.", status: 404 };
    return {
      ok: false,
      kind: "conflict",
      message: "Someone else saved this proof after you opened it. Your change was not saved.",
      version: result.current.proof.version,
      doc: toEditorDoc(result.current),
    };
  } catch (error) {
    console.error("[proof save]", error);
    return { ok: false, kind: "error", message: "Not saved: the database did not answer. Your edits are kept and will be retried." };
  }
}
