import { describe, expect, it } from "vitest";
import { billsFewerLocations, compareQuoteToProofs, locationWords, shownPrints, type BilledLocation, type ProofForCheck, type ProofPrint, type ProofRevisionPrints } from "@/lib/quote-check";

// Expected values follow the rules written at the top of lib/quote-check.ts (our own rules).

const art = (location: string, artworkId: string | null = `art-${location}`): ProofPrint => ({ location, artworkId });
const rev = (letter: string, state: ProofRevisionPrints["state"], minutes: number, placements: ProofPrint[]): ProofRevisionPrints => ({ letter, state, sentAt: new Date(Date.UTC(2027, 0, 4, 9, minutes)), placements });
const proof = (name: string, revisions: ProofRevisionPrints[], working: ProofPrint[] = []): ProofForCheck => ({ name, revisions, working });
const bill = (...entries: Array<[string, number]>): BilledLocation[] => entries.map(([location, colours]) => ({ location, colours }));

describe("which prints a proof shows", () => {
  it.each([
    {
      what: "the approved revision wins over a newer open one and over the working placements",
      p: proof("Crew front", [rev("A", "approved", 1, [art("full-front"), art("full-back")]), rev("B", "open", 5, [art("full-front")])], [art("left-chest")]),
      includeWorking: true,
      expected: { source: "approved", letter: "A", locations: ["full-front", "full-back"] },
    },
    {
      what: "of two approved revisions, the newer one",
      p: proof("Crew front", [rev("B", "approved", 9, [art("left-chest")]), rev("A", "approved", 1, [art("full-front")])]),
      includeWorking: true,
      expected: { source: "approved", letter: "B", locations: ["left-chest"] },
    },
    {
      what: "without an approval, the newest sent revision, whatever its state",
      p: proof("Crew front", [rev("A", "changes-requested", 1, [art("full-front")]), rev("B", "changes-requested", 3, [art("full-front"), art("right-sleeve")])], [art("pouch")]),
      includeWorking: true,
      expected: { source: "sent", letter: "B", locations: ["full-front", "right-sleeve"] },
    },
    {
      what: "never sent: the working placements, for the shop",
      p: proof("Crew front", [], [art("full-front"), art("back-neck")]),
      includeWorking: true,
      expected: { source: "working", letter: null, locations: ["full-front", "back-neck"] },
    },
    {
      what: "placements without art are left out",
      p: proof("Crew front", [rev("A", "open", 1, [art("full-front"), art("full-back", null)])]),
      includeWorking: true,
      expected: { source: "sent", letter: "A", locations: ["full-front"] },
    },
  ])("$what", ({ p, includeWorking, expected }) => {
    const shown = shownPrints(p, { includeWorking });
    expect(shown && { source: shown.source, letter: shown.letter, locations: shown.placements.map((x) => x.location) }).toEqual(expected);
  });

  it.each([
    { what: "never sent, at pay time (the client never saw the working placements)", p: proof("Crew front", [], [art("full-front")]), includeWorking: false },
    { what: "no placement carries art", p: proof("Crew front", [rev("A", "open", 1, [art("full-front", null)])], [art("full-back")]), includeWorking: true },
    { what: "no revision and no placements", p: proof("Crew front", []), includeWorking: true },
    { what: "the proof is archived", p: { ...proof("Crew front", [rev("A", "open", 1, [art("full-back")])], [art("full-back")]), archived: true }, includeWorking: true },
  ])("shows nothing when $what", ({ p, includeWorking }) => {
    expect(shownPrints(p, { includeWorking })).toBeNull();
  });
});

describe("quote against proofs", () => {
  it.each([
    {
      what: "front and back on the approved proof, the quote bills the front only",
      method: "screen-print",
      billed: bill(["full-front", 2]),
      proofs: [proof("Crew tee", [rev("A", "approved", 1, [art("full-front"), art("full-back")])])],
      expected: ["The proof prints on the full back, but the quote does not bill a full back print."],
      blocks: true,
    },
    {
      what: "the quote bills a left chest no proof shows (a warning only)",
      method: "dtg",
      billed: bill(["full-front", 1], ["left-chest", 1]),
      proofs: [proof("Crew tee", [rev("A", "approved", 1, [art("full-front")])])],
      expected: ["The quote bills a left chest print that no proof shows."],
      blocks: false,
    },
    {
      what: "art moved from the full front to the left chest: the missing one comes first",
      method: "htv",
      billed: bill(["full-front", 1]),
      proofs: [proof("Crew tee", [rev("A", "open", 1, [art("left-chest")])])],
      expected: ["The proof prints on the left chest, but the quote does not bill a left chest print.", "The quote bills a full front print that no proof shows."],
      blocks: true,
    },
    {
      what: "several proofs are named, and one location shown by two names both",
      method: "dtf",
      billed: bill(["full-front", 1]),
      proofs: [
        proof("Navy run", [rev("A", "approved", 1, [art("full-front"), art("right-sleeve")])]),
        proof("Sand run", [rev("A", "open", 2, [art("full-front"), art("right-sleeve"), art("back-neck")])]),
      ],
      expected: [
        'The proofs "Navy run" and "Sand run" print on the right sleeve, but the quote does not bill a right sleeve print.',
        'The proof "Sand run" prints on the back neck, but the quote does not bill a back neck print.',
      ],
      blocks: true,
    },
    {
      what: "screen print billing fewer colours than the art is known to have (a warning only)",
      method: "screen-print",
      billed: bill(["full-front", 2], ["full-back", 1]),
      proofs: [proof("Crew tee", [rev("A", "approved", 1, [art("full-front", "crest"), art("full-back", "numbers")])])],
      colours: { crest: 4, numbers: 1 },
      expected: ["The full front art on the proof has about 4 ink colours, but the quote bills 2 colours there."],
      blocks: false,
    },
    {
      what: "two pieces of art at one location: the larger colour count is taken",
      method: "screen-print",
      billed: bill(["full-front", 3]),
      proofs: [proof("Crew tee", [rev("A", "open", 1, [art("full-front", "crest"), art("full-front", "motto")])])],
      colours: { crest: 3, motto: 5 },
      expected: ["The full front art on the proof has about 5 ink colours, but the quote bills 3 colours there."],
      blocks: false,
    },
    {
      what: "colours are not compared for other methods",
      method: "dtf",
      billed: bill(["full-front", 1]),
      proofs: [proof("Crew tee", [rev("A", "open", 1, [art("full-front", "crest")])])],
      colours: { crest: 6 },
      expected: [],
      blocks: false,
    },
    {
      what: "unknown colour counts are not compared",
      method: "screen-print",
      billed: bill(["full-front", 1]),
      proofs: [proof("Crew tee", [rev("A", "open", 1, [art("full-front", "photo")])])],
      colours: { photo: null },
      expected: [],
      blocks: false,
    },
    {
      what: "billing more colours than the art has is fine (an underbase, say)",
      method: "screen-print",
      billed: bill(["full-front", 4]),
      proofs: [proof("Crew tee", [rev("A", "open", 1, [art("full-front", "crest")])])],
      colours: { crest: 3 },
      expected: [],
      blocks: false,
    },
    {
      what: "everything billed and shown",
      method: "screen-print",
      billed: bill(["full-back", 1], ["full-front", 2]),
      proofs: [proof("Crew tee", [rev("A", "approved", 1, [art("full-front"), art("full-back")])])],
      expected: [],
      blocks: false,
    },
    {
      what: "no proof carries art: nothing to compare",
      method: "screen-print",
      billed: bill(["full-front", 1], ["left-sleeve", 1]),
      proofs: [proof("Crew tee", [rev("A", "open", 1, [art("full-front", null)])])],
      expected: [],
      blocks: false,
    },
    {
      what: "a proof without art beside one with art is left out of the names",
      method: "dtg",
      billed: bill(["full-front", 1]),
      proofs: [proof("Blank run", [], []), proof("Crew tee", [], [art("full-front"), art("pouch")])],
      expected: ["The proof prints on the pouch pocket, but the quote does not bill a pouch pocket print."],
      blocks: true,
    },
  ])("$what", ({ method, billed, proofs, colours, expected, blocks }) => {
    const mismatches = compareQuoteToProofs({ method, billed, proofs, artColours: colours, includeWorking: true });
    expect(mismatches.map((m) => m.message)).toEqual(expected);
    expect(billsFewerLocations(mismatches)).toBe(blocks);
  });

  it.each([
    { includeWorking: true, expected: ["The proof prints on the full back, but the quote does not bill a full back print."] },
    { includeWorking: false, expected: [] },
  ])("a proof never sent counts for the shop, not at pay time (includeWorking $includeWorking)", ({ includeWorking, expected }) => {
    const proofs = [proof("Crew tee", [], [art("full-front"), art("full-back")])];
    expect(compareQuoteToProofs({ method: "dtg", billed: bill(["full-front", 1]), proofs, includeWorking }).map((m) => m.message)).toEqual(expected);
  });

  it("the blocking mismatch says where and which proofs", () => {
    const [first] = compareQuoteToProofs({ method: "dtg", billed: bill(["full-front", 1]), proofs: [proof("Crew tee", [rev("A", "approved", 1, [art("full-front"), art("full-back")])])], includeWorking: false });
    expect(first).toMatchObject({ kind: "not-billed", location: "full-back", proofs: ["Crew tee"], blocking: true });
  });

  it("reads revision times given as text, as they come back from JSON", () => {
    const p = proof("Crew tee", [
      { letter: "A", state: "open", sentAt: "2027-01-04T09:00:00.000Z", placements: [art("full-front")] },
      { letter: "B", state: "open", sentAt: "2027-01-04T10:00:00.000Z", placements: [art("full-front"), art("full-back")] },
    ]);
    expect(shownPrints(p, { includeWorking: false })?.letter).toBe("B");
  });
});

describe("location words", () => {
  it.each([
    { location: "full-back", expected: "full back" },
    { location: "left-chest", expected: "left chest" },
    { location: "pouch", expected: "pouch pocket" },
    { location: "hood-side", expected: "hood side" },
  ])("$location reads as $expected (labels from lib/garments/locations.ts)", ({ location, expected }) => {
    expect(locationWords(location)).toBe(expected);
  });
});
