import { describe, expect, it } from "vitest";
import { exportFileName, exportTitle, sizesText } from "@/lib/production/export-names";

describe("export names", () => {
  it("says which sizes an export covers", () => {
    expect(sizesText([])).toBe("");
    expect(sizesText(["M"])).toBe("size M");
    expect(sizesText(["S", "M"])).toBe("sizes S, M");
    expect(sizesText(["YS", "YM", "S", "M", "3XL"])).toBe("sizes YS–3XL");
    expect(sizesText(["M", "M"])).toBe("size M");
  });

  it("titles a row with its kind, locations, sizes and paper", () => {
    expect(exportTitle("spec-sheet", null)).toBe("Spec sheet (PDF)");
    expect(exportTitle("spec-sheet", { locations: ["Full front", "Left chest"], sizes: ["S", "M", "L"] })).toBe("Spec sheet (PDF) · Full front + Left chest · sizes S–L");
    expect(exportTitle("test-print", { locations: ["Full front"], sizes: ["XS"], paper: "A4 (210 × 297 mm)", mirrored: false })).toBe("Test print (PDF) · Full front · size XS · A4");
  });

  it("names files by job, kind, location, size, paper and the time they were made", () => {
    const subject = { locations: ["Full front"], sizes: ["XS"], paper: "Letter (8.5 × 11 in)", mirrored: true };
    expect(exportFileName({ jobTitle: "River Run tees", kind: "test-print", subject, stamp: "2026-12-04-1530", ext: "pdf" })).toBe("river-run-tees-test-print-full-front-size-xs-letter-mirrored-2026-12-04-1530.pdf");
    const gang = { locations: ["Full front", "Left sleeve"], sizes: ["S", "M", "L", "XL"] };
    expect(exportFileName({ jobTitle: "Café crew", kind: "gang-sheet-png", subject: gang, stamp: "2026-12-04-1530", part: { n: 2, of: 3 }, ext: "png" })).toBe("cafe-crew-gang-sheet-full-front-left-sleeve-sizes-s-to-xl-2026-12-04-1530-2-of-3.png");
    // One sheet needs no part number.
    expect(exportFileName({ jobTitle: "Café crew", kind: "gang-sheet-pdf", subject: gang, stamp: "2026-12-04-1530", part: { n: 1, of: 1 }, ext: "pdf" })).toBe("cafe-crew-gang-sheet-full-front-left-sleeve-sizes-s-to-xl-2026-12-04-1530.pdf");
    expect(exportFileName({ jobTitle: "***", kind: "spec-sheet", subject: { locations: [], sizes: [] }, stamp: "", ext: "pdf" })).toBe("spec-sheet.pdf");
  });
});
