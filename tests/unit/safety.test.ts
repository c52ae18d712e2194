import { describe, expect, it } from "vitest";
import { DRAWSTRING_CAUTION, SAFETY_CAUTIONS } from "@/lib/safety";

describe("the drawstring caution states the whole rule", () => {
  // US 16 CFR 1120 (children's upper outerwear drawstrings), which points to ASTM F1816-97.
  // Values as that standard gives them, from memory, approximate.
  it.each([
    { what: "both sources named", pattern: /16 CFR 1120.*ASTM F1816-97/ },
    { what: "no hood or neck drawstrings in sizes 2T to 12 (16 CFR 1120 / ASTM F1816-97)", pattern: /no hood or neck drawstrings in sizes 2T to 12/ },
    { what: "waist and bottom drawstrings covered in sizes 2T to 16 (ASTM F1816-97)", pattern: /sizes 2T to 16, a waist or bottom drawstring/ },
    { what: "at most 3 in (75 mm) outside the channel at full width (ASTM F1816-97)", pattern: /at most 3 in \(75 mm\) outside its channel with the garment at full width/ },
    { what: "no toggles or knots at the free ends (ASTM F1816-97)", pattern: /no toggles or knots at its free ends/ },
    { what: "bar-tacked (ASTM F1816-97)", pattern: /bar-tacked/ },
  ])("$what", ({ pattern }) => {
    expect(DRAWSTRING_CAUTION).toMatch(pattern);
  });

  it("is among the cautions every spec sheet and production page shows, with the deferral to local rules last", () => {
    expect(SAFETY_CAUTIONS).toContain(DRAWSTRING_CAUTION);
    expect(SAFETY_CAUTIONS[SAFETY_CAUTIONS.length - 1]).toMatch(/Local rules and the transfer maker's instructions always come first/);
  });
});
