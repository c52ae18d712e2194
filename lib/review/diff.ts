/**
 * Plain-words difference between two revisions of a proof, e.g.
 * "Front: moved 1/2 in down; width 10 1/2 in → 11 in; art replaced".
 */
import { LOCATION_LABELS, sideOf, type PrintLocation } from "@/lib/garments/locations";
import type { Placement } from "@/lib/placement/model";
import { formatLength, type LengthUnit } from "@/lib/units";

export type RevisionSnapshot = {
  blankId: string;
  blankName: string;
  size: string;
  colourName: string;
  /** Kept from the first revisions on that carry it; older snapshots fall back to the proof's colour. */
  colourHex?: string;
  placements: Placement[];
  artNames?: Record<string, string>;
};

/** Changes smaller than this are float noise, not edits (1/64 in; our own tolerance). */
const SAME_IN = 1 / 64;
const SAME_DEG = 0.05;

function moved(delta: number, positive: string, negative: string, unit: LengthUnit) {
  return `moved ${formatLength(Math.abs(delta), unit)} ${delta > 0 ? positive : negative}`;
}

function describePlacementChange(a: Placement, b: Placement, unit: LengthUnit, artNames: Record<string, string>): string[] {
  const parts: string[] = [];
  const dy = b.belowCollarIn - a.belowCollarIn;
  const dx = b.offsetFromCenterIn - a.offsetFromCenterIn;
  if (Math.abs(dy) >= SAME_IN) parts.push(moved(dy, "down", "up", unit));
  if (Math.abs(dx) >= SAME_IN) parts.push(moved(dx, "right", "left", unit));
  if (Math.abs(b.widthIn - a.widthIn) >= SAME_IN) parts.push(`width ${formatLength(a.widthIn, unit)} → ${formatLength(b.widthIn, unit)}`);
  else if (Math.abs(b.heightIn - a.heightIn) >= SAME_IN) parts.push(`height ${formatLength(a.heightIn, unit)} → ${formatLength(b.heightIn, unit)}`);
  if (Math.abs(b.rotationDeg - a.rotationDeg) >= SAME_DEG) parts.push(`turned ${round1(a.rotationDeg)}° → ${round1(b.rotationDeg)}°`);
  if (a.artworkId !== b.artworkId) {
    const from = a.artworkId ? artNames[a.artworkId] : undefined;
    const to = b.artworkId ? artNames[b.artworkId] : undefined;
    parts.push(from && to ? `art replaced (${from} → ${to})` : "art replaced");
  }
  return parts;
}

function round1(v: number) {
  return Math.round(v * 10) / 10;
}

function label(location: PrintLocation): string {
  return LOCATION_LABELS[location];
}

/** Sentences describing what changed from `before` to `after`, one per line; empty when nothing did. */
export function describeRevisionChanges(before: RevisionSnapshot, after: RevisionSnapshot, unit: LengthUnit = "in"): string[] {
  const lines: string[] = [];
  const artNames = { ...(before.artNames ?? {}), ...(after.artNames ?? {}) };
  if (before.blankId !== after.blankId) lines.push(`Garment: ${before.blankName} → ${after.blankName}`);
  if (before.colourName !== after.colourName) lines.push(`Colour: ${before.colourName} → ${after.colourName}`);
  if (before.size !== after.size) lines.push(`Size shown: ${before.size} → ${after.size}`);

  const oldById = new Map(before.placements.map((p) => [p.id, p]));
  const newById = new Map(after.placements.map((p) => [p.id, p]));
  // Order follows the newer revision, then anything removed.
  for (const p of after.placements) {
    const old = oldById.get(p.id);
    const where = label(p.location);
    if (!old) {
      lines.push(`${where}: print added (${formatLength(p.widthIn, unit)} wide, ${formatLength(p.belowCollarIn, unit)} below the collar)`);
      continue;
    }
    const parts: string[] = [];
    if (old.location !== p.location) parts.push(`moved from ${label(old.location)}${sideOf(old.location) !== sideOf(p.location) ? ` (${sideOf(old.location)} → ${sideOf(p.location)})` : ""}`);
    parts.push(...describePlacementChange(old, p, unit, artNames));
    if (parts.length) lines.push(`${where}: ${parts.join("; ")}`);
  }
  for (const p of before.placements) if (!newById.has(p.id)) lines.push(`${label(p.location)}: print removed`);
  return lines;
}

/** Next revision letter: A → B … Z → AA → AB. */
export function nextRevisionLetter(letter: string): string {
  const chars = letter.toUpperCase().split("");
  let i = chars.length - 1;
  while (i >= 0) {
    if (chars[i] !== "Z") {
      chars[i] = String.fromCharCode(chars[i]!.charCodeAt(0) + 1);
      return chars.join("");
    }
    chars[i] = "A";
    i -= 1;
  }
  return `A${chars.join("")}`;
}
