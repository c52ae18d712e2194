import { describe, expect, it } from "vitest";
import { describeRevisionChanges, nextRevisionLetter, type RevisionSnapshot } from "@/lib/review/diff";
import type { Placement } from "@/lib/placement/model";

const front: Placement = { id: "p1", location: "full-front", artworkId: "art-1", widthIn: 10.5, heightIn: 10.5, offsetFromCenterIn: 0, belowCollarIn: 3, rotationDeg: 0 };
const base: RevisionSnapshot = { blankId: "b", blankName: "Everyday Crew Tee", size: "M", colourName: "Chalk", placements: [front], artNames: { "art-1": "Crest v1", "art-2": "Crest v2" } };

describe("revision diff in plain words", () => {
  it("reads like a maker would say it", () => {
    const after = { ...base, placements: [{ ...front, belowCollarIn: 3.5, widthIn: 11, heightIn: 11, artworkId: "art-2" }] };
    expect(describeRevisionChanges(base, after)).toEqual(["Full front: moved 1/2 in down; width 10 1/2 in → 11 in; art replaced (Crest v1 → Crest v2)"]);
  });

  it("says nothing when nothing changed, and ignores float noise under 1/64 in", () => {
    expect(describeRevisionChanges(base, base)).toEqual([]);
    expect(describeRevisionChanges(base, { ...base, placements: [{ ...front, belowCollarIn: 3.000001 }] })).toEqual([]);
  });

  it.each([
    [{ offsetFromCenterIn: -0.25 }, "Full front: moved 1/4 in left"],
    [{ offsetFromCenterIn: 1 }, "Full front: moved 1 in right"],
    [{ belowCollarIn: 2 }, "Full front: moved 1 in up"],
    [{ rotationDeg: 5 }, "Full front: turned 0° → 5°"],
    [{ heightIn: 9 }, "Full front: height 10 1/2 in → 9 in"],
  ])("describes %o", (patch, line) => {
    expect(describeRevisionChanges(base, { ...base, placements: [{ ...front, ...patch }] })).toEqual([line]);
  });

  it("lists garment changes, added and removed prints", () => {
    const chest: Placement = { ...front, id: "p2", location: "left-chest", widthIn: 4, heightIn: 4, offsetFromCenterIn: 4, belowCollarIn: 3 };
    const after: RevisionSnapshot = { ...base, colourName: "Carbon", size: "L", placements: [chest] };
    expect(describeRevisionChanges(base, after)).toEqual(["Colour: Chalk → Carbon", "Size shown: M → L", "Left chest: print added (4 in wide, 3 in below the collar)", "Full front: print removed"]);
  });

  it("gives centimetres when asked (2.54 cm per inch, NIST SP 811)", () => {
    expect(describeRevisionChanges(base, { ...base, placements: [{ ...front, belowCollarIn: 4 }] }, "cm")).toEqual(["Full front: moved 2.5 cm down"]);
  });
});

describe("revision letters", () => {
  it.each([
    ["A", "B"],
    ["Y", "Z"],
    ["Z", "AA"],
    ["AZ", "BA"],
    ["ZZ", "AAA"],
  ])("%s is followed by %s", (a, b) => expect(nextRevisionLetter(a)).toBe(b));
});
