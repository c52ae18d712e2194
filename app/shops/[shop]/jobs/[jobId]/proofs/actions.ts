"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { deniedAction, resolveShopAccess, type ActionResult } from "@/app/_server/access";
import { duplicateProof, makeProof, type MakeProofOutcome } from "@/app/_server/proof-make";
import { setProofArchived } from "@/db/queries/proofs";
import { parseInput } from "@/lib/input";
import { PRINT_LOCATIONS } from "@/lib/garments/locations";

const id = z.string().trim().min(1).max(80);
const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `Keep it under ${max} characters.`)
    .nullish()
    .transform((v) => (v ? v : null));

const createSchema = z.object({
  shopSlug: id,
  jobId: id,
  name: optionalText(80),
  blankId: id.nullish().transform((v) => v ?? null),
  colourName: optionalText(60),
  art: z
    .array(z.object({ location: z.enum(PRINT_LOCATIONS, { error: "Choose a print location." }), artworkId: id.nullable() }))
    .max(12, "A proof starts with at most 12 prints."),
});

const duplicateSchema = z.object({
  shopSlug: id,
  proofId: id,
  name: optionalText(80),
  blankId: id.nullish().transform((v) => v ?? null),
  colourName: optionalText(60),
});

const archiveSchema = z.object({ shopSlug: id, proofId: id, archived: z.boolean() });

function settle(outcome: MakeProofOutcome, shopSlug: string): ActionResult<{ proofId: string; name: string; url: string; notes: string[] }> {
  if (!outcome.ok) return { ok: false, error: outcome.error, status: outcome.status, fieldErrors: outcome.fieldErrors };
  return { ok: true, data: { proofId: outcome.proofId, name: outcome.name, url: `/shops/${shopSlug}/proofs/${outcome.proofId}`, notes: outcome.notes } };
}

function failed(error: unknown, what: string): ActionResult<never> {
  console.error(`[proofs] ${what}`, error instanceof Error ? error.message : error);
  return { ok: false, error: `The proof could not be ${what} just now. Nothing was changed; try again.` };
}

/** Makes a proof for a job: its blank, colour, a middle size of the run, one print per location, with the chosen art. */
export async function createProofAction(input: z.input<typeof createSchema>): Promise<ActionResult<{ proofId: string; name: string; url: string; notes: string[] }>> {
  const parsed = parseInput(createSchema, input);
  if (!parsed.success) return { ok: false, error: parsed.error.issues[0]?.message ?? "Check the form.", fieldErrors: z.flattenError(parsed.error).fieldErrors };
  const access = await resolveShopAccess(parsed.data.shopSlug, "proofs.edit");
  if (access.kind !== "ok") return deniedAction(access);
  const { shop, actor } = access.access;
  try {
    const outcome = await makeProof({ shopId: shop.id, userId: actor.id, ...parsed.data });
    if (outcome.ok) revalidatePath(`/shops/${shop.slug}/jobs/${parsed.data.jobId}`);
    return settle(outcome, shop.slug);
  } catch (error) {
    return failed(error, "made");
  }
}

/** Copies a proof as a new draft, for another colour or another blank. */
export async function duplicateProofAction(input: z.input<typeof duplicateSchema>): Promise<ActionResult<{ proofId: string; name: string; url: string; notes: string[] }>> {
  const parsed = parseInput(duplicateSchema, input);
  if (!parsed.success) return { ok: false, error: parsed.error.issues[0]?.message ?? "Check the form.", fieldErrors: z.flattenError(parsed.error).fieldErrors };
  const access = await resolveShopAccess(parsed.data.shopSlug, "proofs.edit");
  if (access.kind !== "ok") return deniedAction(access);
  const { shop, actor } = access.access;
  try {
    const outcome = await duplicateProof({ shopId: shop.id, userId: actor.id, ...parsed.data });
    if (outcome.ok) revalidatePath(`/shops/${shop.slug}/jobs`, "layout");
    return settle(outcome, shop.slug);
  } catch (error) {
    return failed(error, "copied");
  }
}

/** Archives a draft proof (one the client has not approved), or brings it back. */
export async function archiveProofAction(input: z.input<typeof archiveSchema>): Promise<ActionResult<{ archived: boolean }>> {
  const parsed = parseInput(archiveSchema, input);
  if (!parsed.success) return { ok: false, error: parsed.error.issues[0]?.message ?? "Unknown proof." };
  const access = await resolveShopAccess(parsed.data.shopSlug, "proofs.edit");
  if (access.kind !== "ok") return deniedAction(access);
  const { shop, actor } = access.access;
  try {
    const result = await setProofArchived({ shopId: shop.id, proofId: parsed.data.proofId, archived: parsed.data.archived, userId: actor.id });
    if (result.kind === "missing") return { ok: false, error: "Not found.", status: 404 };
    if (result.kind === "approved") return { ok: false, error: `Revision ${result.letter} of this proof is approved, so production prints it. An approved proof cannot be archived.`, status: 409 };
    revalidatePath(`/shops/${shop.slug}/jobs`, "layout");
    return { ok: true, data: { archived: parsed.data.archived } };
  } catch (error) {
    return failed(error, parsed.data.archived ? "archived" : "brought back");
  }
}
