/**
 * The editable proof document and the pure edits the editor applies to it. Each edit returns a new
 * document, or the same object when nothing changed, so stores and memoised views can skip work.
 */
import { z } from "zod";
import { type Placement } from "@/lib/placement/model";
import { placementSchema } from "@/lib/placement/schema";
import { EIGHTH_IN, snapToStep } from "@/lib/units";

export type ProofDoc = {
  size: string;
  colourName: string;
  colourHex: string;
  placements: Placement[];
};

export const proofDocSchema = z.object({
  size: z.string().trim().min(1, "Choose a garment size.").max(20),
  colourName: z.string().trim().min(1, "Choose a garment colour.").max(60),
  colourHex: z.string().regex(/^#[0-9a-fA-F]{6}$/, "Colour must be a hex value like #243247."),
  placements: z.array(placementSchema).max(24, "A proof holds at most 24 placements."),
});

export type PlacementPatch = Partial<Omit<Placement, "id">>;

export function updatePlacement(doc: ProofDoc, id: string, patch: PlacementPatch): ProofDoc {
  const index = doc.placements.findIndex((p) => p.id === id);
  if (index < 0) return doc;
  const current = doc.placements[index]!;
  const changed = (Object.keys(patch) as Array<keyof PlacementPatch>).some((key) => patch[key] !== undefined && patch[key] !== current[key]);
  if (!changed) return doc;
  const next = [...doc.placements];
  next[index] = { ...current, ...stripUndefined(patch) };
  return { ...doc, placements: next };
}

function stripUndefined<T extends object>(value: T): Partial<T> {
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as Partial<T>;
}

/** Moves art by whole steps (arrow keys): 1/8 in, or 1 in with shift. */
export function nudge(doc: ProofDoc, id: string, dxIn: number, dyIn: number): ProofDoc {
  const p = doc.placements.find((item) => item.id === id);
  if (!p) return doc;
  return updatePlacement(doc, id, {
    offsetFromCenterIn: round(p.offsetFromCenterIn + dxIn),
    belowCollarIn: round(p.belowCollarIn + dyIn),
  });
}

/**
 * Resizes art to a new width (or height). With the aspect locked the other side follows and the
 * art's center and top stay put, as a decorator expects when typing a width.
 */
export function resize(doc: ProofDoc, id: string, change: { widthIn?: number; heightIn?: number; keepAspect: boolean }): ProofDoc {
  const p = doc.placements.find((item) => item.id === id);
  if (!p) return doc;
  const aspect = p.widthIn / p.heightIn;
  let widthIn = change.widthIn ?? p.widthIn;
  let heightIn = change.heightIn ?? p.heightIn;
  if (change.keepAspect) {
    if (change.widthIn !== undefined) heightIn = widthIn / aspect;
    else if (change.heightIn !== undefined) widthIn = heightIn * aspect;
  }
  if (!(widthIn > 0) || !(heightIn > 0)) return doc;
  return updatePlacement(doc, id, { widthIn: round(widthIn), heightIn: round(heightIn) });
}

export function addPlacement(doc: ProofDoc, placement: Placement): ProofDoc {
  return { ...doc, placements: [...doc.placements, placement] };
}

export function removePlacement(doc: ProofDoc, id: string): ProofDoc {
  if (!doc.placements.some((p) => p.id === id)) return doc;
  return { ...doc, placements: doc.placements.filter((p) => p.id !== id) };
}

export function setGarment(doc: ProofDoc, patch: Partial<Pick<ProofDoc, "size" | "colourName" | "colourHex">>): ProofDoc {
  const next = { ...doc, ...stripUndefined(patch) };
  return next.size === doc.size && next.colourName === doc.colourName && next.colourHex === doc.colourHex ? doc : next;
}

/** Rounds away float noise (1e-9 in), far below anything a press can place. */
function round(value: number): number {
  return Math.round(value * 1e6) / 1e6;
}

export function snapLength(value: number): number {
  return snapToStep(value, EIGHTH_IN);
}

export function sameDoc(a: ProofDoc, b: ProofDoc): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}
