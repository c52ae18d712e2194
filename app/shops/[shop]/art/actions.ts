"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { deniedAction, resolveShopAccess, type ActionResult } from "@/app/_server/access";
import { replaceArtwork } from "@/db/queries/artworks";
import { listShopArtworks } from "@/db/queries/proofs";
import { parseInput } from "@/lib/input";

const replaceSchema = z.object({
  shopSlug: z.string().min(1).max(80),
  oldId: z.string().min(1).max(80),
  newId: z.string().min(1).max(80),
});

/** Puts a new version of art in place of the old one wherever it is placed. */
export async function replaceArtworkAction(input: z.input<typeof replaceSchema>): Promise<ActionResult<{ placements: number; proofs: number }>> {
  const parsed = parseInput(replaceSchema, input);
  if (!parsed.success) return { ok: false, error: "Pick the art to replace and its new version." };
  const access = await resolveShopAccess(parsed.data.shopSlug, "proofs.edit");
  if (access.kind !== "ok") return deniedAction(access);
  try {
    const ids = [...new Set([parsed.data.oldId, parsed.data.newId])];
    if ((await listShopArtworks({ shopId: access.access.shop.id, ids })).length < ids.length) {
      return { ok: false, error: "That artwork is not in this shop's library.", status: 404 };
    }
    const result = await replaceArtwork({ shopId: access.access.shop.id, oldId: parsed.data.oldId, newId: parsed.data.newId, userId: access.access.actor.id });
    if ("error" in result) return { ok: false, error: result.error };
    revalidatePath(`/shops/${parsed.data.shopSlug}/art`);
    return { ok: true, data: result };
  } catch (error) {
    console.error("[replace artwork]", error);
    return { ok: false, error: "The new version could not be put in place. Nothing was changed; try again." };
  }
}
