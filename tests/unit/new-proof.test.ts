import { describe, expect, it } from "vitest";
import { findBlank, type Blank } from "@/lib/garments/catalog";
import { middleSize, pickColour, planNewProof, uniqueProofName, type PlanBlank } from "@/lib/proofs/new-proof";
import { proofStanding } from "@/lib/proofs/standing";

function asPlanBlank(blank: Blank): PlanBlank {
  return { id: blank.id, name: blank.styleName, category: blank.category, colours: blank.colors, sizeChart: blank.sizes.map((r) => ({ size: r.size, group: r.group, measurements: r.measurements })) };
}
const tee = asPlanBlank(findBlank("everyday-crew-tee")!);
const hoodie = asPlanBlank(findBlank("campfire-pullover-hoodie")!);
const tote = asPlanBlank(findBlank("market-canvas-tote")!);
const chart = (sizes: string[]) => sizes.map((size) => ({ size }));
let n = 0;
const newId = () => `p${(n += 1)}`;

describe("middleSize: the size holding the middle garment of the run", () => {
  // Hand-worked: pieces counted in chart order; the middle piece is number ceil(total / 2).
  it.each([
    { run: [["S", 2], ["M", 10], ["L", 8]], want: "M", why: "20 pieces, piece 10: S holds 1–2, M holds 3–12" },
    { run: [["XS", 2], ["S", 6], ["M", 10], ["L", 8], ["XL", 5], ["2XL", 3], ["3XL", 2], ["4XL", 1]], want: "L", why: "37 pieces, piece 19: M ends at 18, L holds 19–26" },
    { run: [["L", 1], ["S", 1]], want: "S", why: "2 pieces, piece 1 in chart order is the S" },
    { run: [["M", 0], ["XL", 3]], want: "XL", why: "sizes with no pieces do not count" },
    { run: [["5XL", 9], ["S", 1]], want: "S", why: "a size the chart lacks is passed over" },
  ])("$why → $want", ({ run, want }) => {
    expect(middleSize(chart(["XS", "S", "M", "L", "XL", "2XL", "3XL", "4XL"]), run.map(([size, quantity]) => ({ size: size as string, quantity: quantity as number })))).toBe(want);
  });

  it("falls back to the middle of the chart when the run is empty (lower middle of 6 sizes is the 3rd)", () => {
    expect(middleSize(chart(["XS", "S", "M", "L", "XL", "2XL"]), [])).toBe("M");
  });

  it("refuses a chart with no sizes", () => {
    expect(() => middleSize([], [])).toThrow(/no sizes/);
  });
});

describe("planNewProof", () => {
  const art = { id: "art-wide", inkWidthPx: 1200, inkHeightPx: 800 };

  it("starts from the job's colour, the middle size and one print per location", () => {
    const plan = planNewProof({ blank: tee, colourName: "deep harbor", sizeRun: [{ size: "S", quantity: 2 }, { size: "M", quantity: 10 }, { size: "L", quantity: 8 }], locations: [{ location: "full-front" }, { location: "full-back" }], art: [{ location: "full-front", artwork: art }], newId });
    expect(plan.size).toBe("M");
    expect(plan.colourName).toBe("Deep Harbor");
    expect(plan.colourHex).toBe("#243247");
    expect(plan.placements.map((p) => p.location)).toEqual(["full-front", "full-back"]);
    // The back had no art of its own, so it takes the first art given.
    expect(plan.placements.map((p) => p.artworkId)).toEqual(["art-wide", "art-wide"]);
    expect(plan.notes).toEqual([]);
  });

  it("places a full front where the trade puts it on an adult tee", () => {
    const plan = planNewProof({ blank: tee, colourName: null, sizeRun: [{ size: "M", quantity: 1 }], locations: [{ location: "full-front" }], art: [{ location: "full-front", artwork: { id: "sq", inkWidthPx: 1000, inkHeightPx: 1000 } }], newId });
    const front = plan.placements[0]!;
    // Common practice, no published source: a full front sits about 3 to 3.5 in below the collar,
    // centred, and is at most about 12 in wide on an adult tee (11.25 x 14 in is the usual largest).
    expect(front.belowCollarIn).toBeGreaterThanOrEqual(2.5);
    expect(front.belowCollarIn).toBeLessThanOrEqual(4);
    expect(front.offsetFromCenterIn).toBe(0);
    expect(front.widthIn).toBeGreaterThan(8);
    expect(front.widthIn).toBeLessThanOrEqual(12);
    // Square art stays square.
    expect(front.widthIn).toBeCloseTo(front.heightIn, 6);
  });

  it("keeps the art's proportions: 3:2 art is 1.5 times as wide as it is tall", () => {
    const plan = planNewProof({ blank: tee, colourName: null, sizeRun: [], locations: [{ location: "left-chest" }], art: [{ location: "left-chest", artwork: art }], newId });
    const chest = plan.placements[0]!;
    expect(chest.widthIn / chest.heightIn).toBeCloseTo(1.5, 6);
    // Common practice, no published source: a left chest print is 3 to 4.5 in wide, off centre to the wearer's left.
    expect(chest.widthIn).toBeGreaterThanOrEqual(3);
    expect(chest.widthIn).toBeLessThanOrEqual(4.5);
    expect(chest.offsetFromCenterIn).not.toBe(0);
  });

  it("leaves an explicit 'no art' print without art", () => {
    const plan = planNewProof({ blank: tee, colourName: null, sizeRun: [], locations: [{ location: "full-front" }, { location: "full-back" }], art: [{ location: "full-front", artwork: art }, { location: "full-back", artwork: null }], newId });
    expect(plan.placements.map((p) => p.artworkId)).toEqual(["art-wide", null]);
  });

  it("says which locations the garment lacks and leaves them off", () => {
    const plan = planNewProof({ blank: tote, colourName: null, sizeRun: [{ size: "One size", quantity: 40 }], locations: [{ location: "tote-front" }, { location: "full-back" }], art: [], newId });
    expect(plan.placements.map((p) => p.location)).toEqual(["tote-front"]);
    expect(plan.notes.join(" ")).toMatch(/no full back print location/);
    expect(plan.size).toBe("One size");
  });

  it("falls back to the blank's first colour and says so", () => {
    const plan = planNewProof({ blank: hoodie, colourName: "Neon Lime", sizeRun: [], locations: [{ location: "full-front" }], art: [], newId });
    expect(plan.colourName).toBe(hoodie.colours[0]!.name);
    expect(plan.notes.join(" ")).toMatch(/does not come in Neon Lime/);
  });

  it("uses a fresh id for each print", () => {
    const plan = planNewProof({ blank: tee, colourName: null, sizeRun: [], locations: [{ location: "full-front" }, { location: "full-back" }, { location: "full-front" }], art: [], newId });
    expect(plan.placements).toHaveLength(2);
    expect(new Set(plan.placements.map((p) => p.id)).size).toBe(2);
  });
});

describe("pickColour and uniqueProofName", () => {
  it("matches colour names in any case", () => {
    expect(pickColour(tee, "CHALK")).toMatchObject({ name: "Chalk", matched: true });
  });
  it.each([
    { wanted: "Team tee", taken: [], want: "Team tee" },
    { wanted: "Team tee", taken: ["team tee"], want: "Team tee 2" },
    { wanted: "Team tee", taken: ["Team tee", "Team tee 2"], want: "Team tee 3" },
    { wanted: "  ", taken: [], want: "Proof" },
  ])("$wanted with $taken taken → $want", ({ wanted, taken, want }) => {
    expect(uniqueProofName(wanted, taken)).toBe(want);
  });
});

describe("proofStanding", () => {
  it.each([
    { input: { revision: "A", lastSent: null, approvedLetter: null }, tone: "draft", changed: false },
    { input: { revision: "A", lastSent: { letter: "A", state: "open" as const }, approvedLetter: null }, tone: "waiting", changed: false },
    { input: { revision: "B", lastSent: { letter: "A", state: "changes-requested" as const }, approvedLetter: null }, tone: "changes", changed: false },
    { input: { revision: "A", lastSent: { letter: "A", state: "approved" as const }, approvedLetter: "A" }, tone: "approved", changed: false },
    { input: { revision: "B", lastSent: { letter: "A", state: "approved" as const }, approvedLetter: "A" }, tone: "changed", changed: true },
  ])("$tone", ({ input, tone, changed }) => {
    const standing = proofStanding(input);
    expect(standing.tone).toBe(tone);
    expect(standing.changedAfterApproval).toBe(changed);
    expect(standing.detail.length).toBeGreaterThan(10);
  });

  it("names both letters when a proof changed after approval", () => {
    expect(proofStanding({ revision: "B", lastSent: { letter: "A", state: "approved" }, approvedLetter: "A" }).detail).toBe("Revision B is a draft made after the client approved revision A. Production prints revision A until B is approved.");
  });
});
