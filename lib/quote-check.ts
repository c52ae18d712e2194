/**
 * The quote follows the proof: the print locations (and, for screen print, the ink colours) a quote
 * bills, set against the prints the job's proofs show.
 *
 * Pure: no React, no database. The rules are our own:
 *
 *  - Which placements a proof shows: its newest approved revision if it has one, else its newest
 *    sent revision, else (only where the caller allows it) its working placements. At pay time the
 *    caller leaves the working placements out: the client never saw them.
 *  - Only placements that carry art count; a proof with none, or an archived proof, is left out.
 *  - A location a proof prints on that the quote does not bill blocks the quote (`blocking`):
 *    the shop must not send it, and the client must not accept or pay it.
 *  - A location the quote bills that no proof shows, and (screen print only) fewer ink colours billed
 *    at a location than its art is known to have, are warnings the owner sees. Colours count only
 *    when the art's colour count is known and the art is not continuous tone; with several pieces of
 *    art at one location the largest count is taken (shared inks make a sum an overcount).
 *  - No proof with art: nothing to compare, no mismatches.
 */
import { LOCATION_LABELS, PRINT_LOCATIONS } from "./garments/locations";

/** A placement as far as the quote cares: where it prints, and which art. */
export type ProofPrint = { location: string; artworkId: string | null };

export type ProofRevisionPrints = { letter: string; state: "open" | "approved" | "changes-requested"; sentAt: Date | string; placements: ReadonlyArray<ProofPrint> };

export type ProofForCheck = {
  name: string;
  /** Every revision sent to the client, in any order. */
  revisions: ReadonlyArray<ProofRevisionPrints>;
  /** The proof's working placements, as last saved. */
  working: ReadonlyArray<ProofPrint>;
  /** A draft put away: it shows nothing. */
  archived?: boolean;
};

export type ShownPrints = { source: "approved" | "sent" | "working"; letter: string | null; placements: ProofPrint[] };

/** What the quote bills at each location. */
export type BilledLocation = { location: string; colours: number };

export type QuoteProofMismatch =
  | { kind: "not-billed"; location: string; proofs: string[]; blocking: true; message: string }
  | { kind: "not-shown"; location: string; blocking: false; message: string }
  | { kind: "fewer-colours"; location: string; billedColours: number; artColours: number; blocking: false; message: string };

export type QuoteProofInput = {
  /** The job's decoration method as stored on jobs (e.g. "screen-print"). */
  method: string;
  billed: ReadonlyArray<BilledLocation>;
  proofs: ReadonlyArray<ProofForCheck>;
  /** Known ink colours per artwork id; null or missing when unknown (or continuous tone). */
  artColours?: Readonly<Record<string, number | null | undefined>>;
  /** Fall back to the working placements of a proof never sent. True for the shop, false at pay time. */
  includeWorking: boolean;
};

function time(value: Date | string): number {
  const t = value instanceof Date ? value.getTime() : Date.parse(value);
  return Number.isFinite(t) ? t : 0;
}

function newest(revisions: ReadonlyArray<ProofRevisionPrints>): ProofRevisionPrints | undefined {
  let best: ProofRevisionPrints | undefined;
  for (const r of revisions) if (!best || time(r.sentAt) > time(best.sentAt)) best = r;
  return best;
}

function withArt(placements: ReadonlyArray<ProofPrint> | undefined): ProofPrint[] {
  if (!Array.isArray(placements)) return [];
  return placements.filter((p): p is ProofPrint => Boolean(p) && typeof p.location === "string" && typeof p.artworkId === "string" && p.artworkId.length > 0).map((p) => ({ location: p.location, artworkId: p.artworkId }));
}

/** The prints a proof shows: approved revision, else newest sent, else (if allowed) working; null if none carries art. */
export function shownPrints(proof: ProofForCheck, { includeWorking }: { includeWorking: boolean }): ShownPrints | null {
  if (proof.archived) return null;
  const approved = newest(proof.revisions.filter((r) => r.state === "approved"));
  const sent = newest(proof.revisions);
  const chosen: ShownPrints | null = approved
    ? { source: "approved", letter: approved.letter, placements: withArt(approved.placements) }
    : sent
      ? { source: "sent", letter: sent.letter, placements: withArt(sent.placements) }
      : includeWorking
        ? { source: "working", letter: null, placements: withArt(proof.working) }
        : null;
  return chosen && chosen.placements.length > 0 ? chosen : null;
}

/** "full back", "left chest": the location's label in running text. */
export function locationWords(location: string): string {
  const label = (LOCATION_LABELS as Record<string, string>)[location] ?? location.replace(/-/g, " ");
  return label.toLowerCase();
}

function article(words: string): string {
  return /^[aeiou]/i.test(words) ? "an" : "a";
}

function listNames(names: readonly string[]): string {
  const quoted = names.map((n) => `"${n}"`);
  if (quoted.length <= 1) return quoted.join("");
  return `${quoted.slice(0, -1).join(", ")} and ${quoted[quoted.length - 1]}`;
}

/** Locations in the garment order of PRINT_LOCATIONS, unknown ones after, alphabetically. */
function ordered(locations: Iterable<string>): string[] {
  const order = PRINT_LOCATIONS as readonly string[];
  const rank = (l: string) => (order.includes(l) ? order.indexOf(l) : order.length);
  return [...new Set(locations)].sort((a, b) => rank(a) - rank(b) || a.localeCompare(b));
}

/** Every way the quote and the proofs disagree, blocking ones first, in plain words. */
export function compareQuoteToProofs(input: QuoteProofInput): QuoteProofMismatch[] {
  const shown = input.proofs.map((proof) => ({ proof, prints: shownPrints(proof, { includeWorking: input.includeWorking }) })).filter((s) => s.prints !== null);
  if (shown.length === 0) return [];
  const nameProofs = shown.length > 1;

  // location → proof names showing it, and the largest known colour count of its art.
  const byLocation = new Map<string, { proofs: string[]; colours: number | null }>();
  for (const { proof, prints } of shown) {
    for (const p of prints!.placements) {
      const entry = byLocation.get(p.location) ?? { proofs: [], colours: null };
      if (!entry.proofs.includes(proof.name)) entry.proofs.push(proof.name);
      const known = p.artworkId ? input.artColours?.[p.artworkId] : null;
      if (typeof known === "number" && Number.isSafeInteger(known) && known > 0) entry.colours = Math.max(entry.colours ?? 0, known);
      byLocation.set(p.location, entry);
    }
  }
  const billed = new Map<string, number>();
  for (const b of input.billed) billed.set(b.location, Math.max(billed.get(b.location) ?? 0, b.colours));

  const blocking: QuoteProofMismatch[] = [];
  const warnings: QuoteProofMismatch[] = [];
  for (const location of ordered(byLocation.keys())) {
    const entry = byLocation.get(location)!;
    const words = locationWords(location);
    const billedColours = billed.get(location);
    if (billedColours === undefined) {
      const who = nameProofs ? `The ${entry.proofs.length > 1 ? "proofs" : "proof"} ${listNames(entry.proofs)} ${entry.proofs.length > 1 ? "print" : "prints"}` : "The proof prints";
      blocking.push({ kind: "not-billed", location, proofs: entry.proofs, blocking: true, message: `${who} on the ${words}, but the quote does not bill ${article(words)} ${words} print.` });
      continue;
    }
    if (input.method === "screen-print" && entry.colours !== null && billedColours < entry.colours) {
      warnings.push({
        kind: "fewer-colours",
        location,
        billedColours,
        artColours: entry.colours,
        blocking: false,
        message: `The ${words} art on the proof has about ${entry.colours} ink colours, but the quote bills ${billedColours} ${billedColours === 1 ? "colour" : "colours"} there.`,
      });
    }
  }
  for (const location of ordered(billed.keys())) {
    if (byLocation.has(location)) continue;
    const words = locationWords(location);
    warnings.push({ kind: "not-shown", location, blocking: false, message: `The quote bills ${article(words)} ${words} print that no proof shows.` });
  }
  return [...blocking, ...warnings];
}

/** True when the quote bills fewer locations than the proofs show: it must not be sent, accepted or paid. */
export function billsFewerLocations(mismatches: ReadonlyArray<QuoteProofMismatch>): boolean {
  return mismatches.some((m) => m.blocking);
}
