import "server-only";
import { findBlank } from "@/db/queries/blanks";
import { findJobDetail } from "@/db/queries/jobs";
import { listArtworks } from "@/db/queries/artworks";
import { createProof, getProofDocument, proofNamesForJob } from "@/db/queries/proofs";
import { locationsFor } from "@/lib/garments/locations";
import { planNewProof, uniqueProofName, type PlanArt } from "@/lib/proofs/new-proof";

export type MakeProofInput = {
  shopId: string;
  userId: string;
  jobId: string;
  name: string | null;
  blankId: string | null;
  colourName: string | null;
  /** Art per print location; null leaves that print without art for now. */
  art: Array<{ location: string; artworkId: string | null }>;
};

export type MakeProofOutcome =
  | { ok: true; proofId: string; name: string; notes: string[] }
  | { ok: false; error: string; status?: number; fieldErrors?: Record<string, string[]> };

/** Art the job's proofs may use: the client's own and the shop's unfiled art, latest versions only. */
async function usableArt(shopId: string, clientId: string): Promise<Map<string, PlanArt>> {
  const rows = await listArtworks({ shopId, clientId });
  return new Map(rows.map((a) => [a.id, { id: a.id, inkWidthPx: a.inkWidthPx, inkHeightPx: a.inkHeightPx }]));
}

/**
 * Makes a proof for a job from its blank, colour, size run and print locations, with the chosen art.
 * Every reference is checked against the caller's shop and the job's client before anything is stored.
 */
export async function makeProof(input: MakeProofInput): Promise<MakeProofOutcome> {
  const detail = await findJobDetail({ shopId: input.shopId, jobId: input.jobId });
  if (!detail) return { ok: false, error: "This job no longer exists.", status: 404 };
  const blankId = input.blankId ?? detail.job.blankId;
  if (!blankId) return { ok: false, error: "Pick a blank for this proof: the job has none yet.", fieldErrors: { blankId: ["Pick a blank"] } };
  const blank = await findBlank({ shopId: input.shopId, blankId });
  if (!blank) return { ok: false, error: "Pick a blank from your library.", fieldErrors: { blankId: ["Pick a blank from your library"] } };

  const art = await usableArt(input.shopId, detail.client.id);
  const unknown = input.art.find((a) => a.artworkId && !art.has(a.artworkId));
  if (unknown) return { ok: false, error: "That art is not in this client's library.", fieldErrors: { art: ["Pick art filed under this client or the shop"] } };

  // The job's print locations; a job without any starts with the garment's first usual location.
  const jobLocations = (detail.job.printLocations ?? []).map((l) => ({ location: l.location }));
  const locations = jobLocations.length ? jobLocations : [{ location: locationsFor(blank.category)[0]! }];
  const plan = planNewProof({
    blank,
    colourName: input.colourName ?? (blank.id === detail.job.blankId ? detail.job.garmentColour : null),
    sizeRun: detail.sizeRun,
    locations,
    art: input.art.map((a) => ({ location: a.location, artwork: a.artworkId ? art.get(a.artworkId)! : null })),
    newId: () => crypto.randomUUID(),
  });
  if (!jobLocations.length) plan.notes.push("The job has no print locations yet, so the proof starts with one; add the job's locations so the quote bills them.");
  const name = uniqueProofName(input.name ?? `${blank.name}, ${plan.colourName}`, await proofNamesForJob({ jobId: detail.job.id }));
  const { id } = await createProof({ shopId: input.shopId, jobId: detail.job.id, name, blankId: blank.id, colourName: plan.colourName, colourHex: plan.colourHex, size: plan.size, placements: plan.placements, userId: input.userId });
  return { ok: true, proofId: id, name, notes: plan.notes };
}

/**
 * Copies a proof as a new draft at revision A: the same placements for another colour, or the same
 * locations and art laid out afresh for another blank (its print areas differ).
 */
export async function duplicateProof(input: { shopId: string; userId: string; proofId: string; name: string | null; blankId: string | null; colourName: string | null }): Promise<MakeProofOutcome> {
  const source = await getProofDocument({ shopId: input.shopId, proofId: input.proofId });
  if (!source) return { ok: false, error: "This proof no longer exists.", status: 404 };
  const sameBlank = !input.blankId || input.blankId === source.blank.id;
  const blank = sameBlank ? source.blank : await findBlank({ shopId: input.shopId, blankId: input.blankId! });
  if (!blank) return { ok: false, error: "Pick a blank from your library.", fieldErrors: { blankId: ["Pick a blank from your library"] } };
  const taken = await proofNamesForJob({ jobId: source.job.id });
  if (sameBlank) {
    const colour = input.colourName ? blank.colours.find((c) => c.name.toLowerCase() === input.colourName!.trim().toLowerCase()) : { name: source.proof.colourName, hex: source.proof.colourHex };
    if (!colour) return { ok: false, error: `${blank.name} does not come in ${input.colourName}.`, fieldErrors: { colourName: ["Pick one of this blank's colours"] } };
    const name = uniqueProofName(input.name ?? `${source.proof.name}, ${colour.name}`, taken);
    const placements = source.placements.map((p) => ({ ...p, id: crypto.randomUUID() }));
    const { id } = await createProof({ shopId: input.shopId, jobId: source.job.id, name, blankId: blank.id, colourName: colour.name, colourHex: colour.hex, size: source.proof.size, placements, userId: input.userId, copiedFrom: source.proof.name });
    return { ok: true, proofId: id, name, notes: [] };
  }
  const detail = await findJobDetail({ shopId: input.shopId, jobId: source.job.id });
  const artById = new Map(source.artworks.map((a) => [a.id, { id: a.id, inkWidthPx: a.inkWidthPx, inkHeightPx: a.inkHeightPx }]));
  const plan = planNewProof({
    blank,
    colourName: input.colourName ?? source.proof.colourName,
    sizeRun: detail?.sizeRun ?? [],
    locations: source.placements.map((p) => ({ location: p.location })),
    art: source.placements.map((p) => ({ location: p.location, artwork: p.artworkId ? (artById.get(p.artworkId) ?? null) : null })),
    newId: () => crypto.randomUUID(),
  });
  const name = uniqueProofName(input.name ?? `${blank.name}, ${plan.colourName}`, taken);
  const { id } = await createProof({ shopId: input.shopId, jobId: source.job.id, name, blankId: blank.id, colourName: plan.colourName, colourHex: plan.colourHex, size: plan.size, placements: plan.placements, userId: input.userId, copiedFrom: source.proof.name });
  return { ok: true, proofId: id, name, notes: plan.notes };
}
