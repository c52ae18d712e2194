"use server";

import { resolveShopAccess } from "@/app/_server/access";
import { DB_DOWN_MESSAGE, invalidSave, saveProofSchema, saveProofWithAccess, type SaveProofInput, type SaveProofResponse } from "@/app/_server/proof-save";
import { parseInput } from "@/lib/input";

export type { SaveProofResponse } from "@/app/_server/proof-save";

const DENIED_STATUS = { anonymous: 401, forbidden: 403, "not-found": 404 } as const;

/** Autosave: the whole document, guarded by the version the editor last saw. */
export async function saveProofAction(input: SaveProofInput): Promise<SaveProofResponse> {
  const parsed = parseInput(saveProofSchema, input);
  if (!parsed.success) return invalidSave(parsed.error);
  let access;
  try {
    access = await resolveShopAccess(parsed.data.shopSlug, "proofs.edit");
  } catch (error) {
    // Access is read from the database too; while it is down the editor keeps the edits and retries.
    console.error("[proof save] access", error instanceof Error ? error.message : error);
    return { ok: false, kind: "error", message: DB_DOWN_MESSAGE };
  }
  if (access.kind !== "ok") return { ok: false, kind: "denied", message: access.message, status: DENIED_STATUS[access.kind] };
  return saveProofWithAccess(access.access, parsed.data);
}
