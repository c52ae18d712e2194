import "server-only";
import { z } from "zod";
import { getProofDocument, listShopArtworks, saveProof } from "@/db/queries/proofs";
import { can } from "@/lib/access";
import { proofDocSchema, type ProofDoc } from "@/lib/editor/document";
import { toEditorDoc } from "@/lib/editor/from-server";
import type { ShopAccess } from "./access";

export const saveProofSchema = z.object({
  shopSlug: z.string().min(1).max(80),
  proofId: z.string().min(1).max(80),
  baseVersion: z.number().int().positive(),
  doc: proofDocSchema,
  /** The editor's key for this save, the same on its retries. */
  saveKey: z.string().regex(/^[A-Za-z0-9-]{8,64}$/, "The save key is not valid.").optional(),
});

export type SaveProofInput = z.input<typeof saveProofSchema>;

export type SaveProofResponse =
  | { ok: true; version: number; savedAt: string; revision: string }
  | { ok: false; kind: "conflict"; message: string; version: number; doc: ProofDoc }
  | { ok: false; kind: "invalid" | "denied" | "missing" | "error"; message: string; status?: number };

export const CONFLICT_MESSAGE = "Someone else saved this proof after you opened it. Your change was not saved.";
export const DB_DOWN_MESSAGE = "Not saved: the database did not answer. Your edits are kept and will be retried.";

/** Zod's first complaint about a save, in words. */
export function invalidSave(error: z.ZodError): SaveProofResponse {
  const issue = error.issues[0];
  return { ok: false, kind: "invalid", message: issue ? `Not saved: ${issue.message}` : "Not saved: the proof data is not valid." };
}

/**
 * The autosave itself, for an actor whose access to the shop is already resolved (the server
 * action resolves it from the session). Checks the permission again, the proof's shop, the size
 * and the art, then writes only if nobody saved since `baseVersion`.
 */
export async function saveProofWithAccess(access: ShopAccess, input: { proofId: string; baseVersion: number; doc: ProofDoc; saveKey?: string }): Promise<SaveProofResponse> {
  if (!can(access.role, "proofs.edit")) return { ok: false, kind: "denied", message: "Your role in this shop does not allow this.", status: 403 };
  const { shop, actor } = access;
  const { doc, proofId, baseVersion } = input;
  try {
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

    const result = await saveProof({ shopId: shop.id, proofId, baseVersion, ...doc, userId: actor.id, saveKey: input.saveKey ?? null });
    if (result.kind === "saved") return { ok: true, version: result.version, savedAt: result.updatedAt.toISOString(), revision: result.revision };
    if (result.kind === "missing") return { ok: false, kind: "missing", message: "This proof no longer exists.", status: 404 };
    return { ok: false, kind: "conflict", message: CONFLICT_MESSAGE, version: result.current.proof.version, doc: toEditorDoc(result.current) };
  } catch (error) {
    console.error("[proof save]", error instanceof Error ? error.message : error);
    return { ok: false, kind: "error", message: DB_DOWN_MESSAGE };
  }
}
