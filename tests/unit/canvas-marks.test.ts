import { describe, expect, it } from "vitest";
import { MARK_GAP_PX, MARK_TAG_HEIGHT_PX, printMarks } from "@/canvas/marks";
import type { View } from "@/lib/editor/view";
import { shortLabel, type WarningFlag } from "@/lib/placement/checks";
import type { Placement } from "@/lib/placement/model";

// A view of our own choosing: 10 px per inch, the collar's centre at (200, 100).
const view: View = { originX: 200, originY: 100, pxPerInch: 10, zoom: 1 };
const art = (patch: Partial<Placement> = {}): Placement => ({
  id: "a",
  location: "full-front",
  artworkId: null,
  widthIn: 10,
  heightIn: 4,
  offsetFromCenterIn: 0,
  belowCollarIn: 3,
  rotationDeg: 0,
  ...patch,
});

describe("short labels (our own words)", () => {
  it.each([
    [{ code: "too-wide", severity: "warning" }, "Too wide"],
    [{ code: "too-tall", severity: "warning" }, "Too tall"],
    [{ code: "seam-clearance", severity: "warning" }, "Near seam"],
    [{ code: "seam-clearance", severity: "error" }, "Over seam"],
    [{ code: "outside-print-area", severity: "warning" }, "Outside area"],
    [{ code: "hem-clearance", severity: "error" }, "Past hem"],
    [{ code: "off-garment", severity: "error" }, "Off garment"],
  ] as const)("%o reads %s", (flag, label) => {
    expect(shortLabel(flag)).toBe(label);
  });
});

describe("printMarks", () => {
  it("marks only prints with a fit problem, not style hints", () => {
    const flags: Record<string, WarningFlag[]> = {
      a: [
        { code: "slight-tilt", severity: "warning" },
        { code: "top-too-low", severity: "info" },
      ],
      b: [{ code: "too-wide", severity: "warning" }],
    };
    const marks = printMarks({ placements: [art(), art({ id: "b" }), art({ id: "c" })], flags, view });
    expect(marks.map((m) => m.id)).toEqual(["b"]);
  });

  it("outlines the art set off by the gap, with the tag just above, naming each problem once", () => {
    const flags: Record<string, WarningFlag[]> = {
      a: [
        { code: "too-wide", severity: "warning" },
        { code: "seam-clearance", severity: "warning" },
        { code: "slight-tilt", severity: "warning" },
      ],
    };
    const [mark] = printMarks({ placements: [art()], flags, view });
    // Art from x -5..5 in, y 3..7 in: stage 150..250 by 130..170, plus the gap on every side.
    const g = MARK_GAP_PX;
    expect(mark!.points).toEqual([150 - g, 130 - g, 250 + g, 130 - g, 250 + g, 170 + g, 150 - g, 170 + g]);
    expect(mark!.text).toBe("Too wide · Near seam");
    expect(mark!.error).toBe(false);
    expect(mark!.tag.x).toBe(150 - g);
    expect(mark!.tag.y).toBe(130 - g - MARK_TAG_HEIGHT_PX - 3);
  });

  it("turns the outline with the art and calls a crossing an error", () => {
    const flags: Record<string, WarningFlag[]> = { a: [{ code: "seam-clearance", severity: "error" }] };
    const [mark] = printMarks({
      placements: [art({ widthIn: 4, heightIn: 4, rotationDeg: 90 })],
      flags,
      view,
      gapPx: 0,
    });
    const pts = mark!.points;
    // A square turned a quarter: the same corners, each moved one place round (centre at 200, 150).
    expect(pts[0]).toBeCloseTo(220, 9);
    expect(pts[1]).toBeCloseTo(130, 9);
    expect(mark!.error).toBe(true);
    expect(mark!.text).toBe("Over seam");
  });

  it("puts the tag under the outline when above it would sit behind the ruler", () => {
    const flags: Record<string, WarningFlag[]> = { a: [{ code: "too-tall", severity: "warning" }] };
    const [mark] = printMarks({ placements: [art({ belowCollarIn: -8 })], flags, view, gapPx: 0, minY: 28 });
    // Art from y -8..-4 in: stage 20..60; above would be under 28, so the tag goes below 60.
    expect(mark!.tag.y).toBe(63);
  });

  it("leaves out a print being dragged or resized", () => {
    const flags: Record<string, WarningFlag[]> = { a: [{ code: "too-wide", severity: "warning" }] };
    expect(printMarks({ placements: [art()], flags, view, skip: "a" })).toEqual([]);
  });
});
