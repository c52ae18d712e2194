import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { useState } from "react";
import { describe, expect, it, vi } from "vitest";
import { Inspector } from "@/components/editor/Inspector";
import type { EditorArtwork, EditorBlank } from "@/components/editor/ProofEditor";
import type { PlacementPatch } from "@/lib/editor/document";
import { findBlank } from "@/lib/garments/catalog";
import { LOCATION_LABELS, locationsFor } from "@/lib/garments/locations";
import type { Placement } from "@/lib/placement/model";

// The demo tee's size chart (Chalkline's own demo data). On XS its full front takes at most about
// 10 in (the checks' own limit, read at 1/8 in), so 12 in art is too wide and near the side seams.
const tee = findBlank("everyday-crew-tee")!;
const blank: EditorBlank = {
  id: tee.id,
  name: tee.styleName,
  category: tee.category,
  colours: tee.colors,
  sizeChart: tee.sizes.map((r) => ({ size: r.size, group: r.group, measurements: r.measurements })),
};
const wideArt: EditorArtwork = {
  id: "art-1",
  name: "Team crest",
  kind: "generated",
  svg: null,
  isVector: true,
  hasPreview: false,
  inkWidthPx: 3000,
  inkHeightPx: 1000,
  shape: "wide",
  colourCount: 2,
};
const front: Placement = {
  id: "front",
  location: "full-front",
  artworkId: "art-1",
  widthIn: 12,
  heightIn: 4,
  offsetFromCenterIn: 0,
  belowCollarIn: 3,
  rotationDeg: 0,
};
const back: Placement = {
  id: "back",
  location: "back-neck",
  artworkId: null,
  widthIn: 2,
  heightIn: 1,
  offsetFromCenterIn: 0,
  belowCollarIn: 0.75,
  rotationDeg: 0,
};

function setup(first: string) {
  const onSelect = vi.fn<(id: string) => void>();
  function Harness() {
    const [placements, setPlacements] = useState([front, back]);
    const [selectedId, setSelectedId] = useState(first);
    return (
      <Inspector
        blank={blank}
        doc={{ size: "XS", colourName: "Chalk", colourHex: "#F4F1EA", placements }}
        side="front"
        unit="in"
        selected={placements.find((p) => p.id === selectedId) ?? null}
        keepAspect
        editable
        artworks={[wideArt]}
        method="screen-print"
        locations={locationsFor(blank.category).map((value) => ({ value, label: LOCATION_LABELS[value] }))}
        previousSize={null}
        calibrated={false}
        onCalibrate={() => undefined}
        onSelect={(id) => {
          onSelect(id);
          setSelectedId(id);
        }}
        onSize={() => undefined}
        onColour={() => undefined}
        onKeepAspect={() => undefined}
        onPatch={(id, patch: PlacementPatch) =>
          setPlacements((list) => list.map((p) => (p.id === id ? { ...p, ...patch } : p)))
        }
        onResize={() => undefined}
        onRemove={() => undefined}
        onAdd={() => undefined}
      />
    );
  }
  render(<Harness />);
  return { user: userEvent.setup(), onSelect };
}

describe("Inspector: warnings in the list of prints", () => {
  it("names what is wrong beside the count, and says a fitting print fits", () => {
    setup("back");
    const list = screen.getByRole("list");
    // Our own short words: "Too wide" for too-wide, "Near seam" for art inside the seam clearance.
    expect(within(list).getByRole("button", { name: "2 warnings: Too wide, Near seam" })).toBeTruthy();
    const items = within(list).getAllByRole("listitem");
    expect(items[1]!.textContent).toContain("fits");
  });

  it("the summary selects the print and moves focus to its full list of warnings", async () => {
    const { user, onSelect } = setup("back");
    await user.click(screen.getByRole("button", { name: /^2 warnings/ }));
    expect(onSelect).toHaveBeenCalledWith("front");
    const checks = screen.getByRole("group", { name: "Checks for the full front on size XS" });
    expect(document.activeElement).toBe(checks);
    const messages = within(checks)
      .getAllByText(/./, { selector: "p" })
      .map((p) => p.getAttribute("data-code"));
    expect(messages).toEqual(expect.arrayContaining(["too-wide", "seam-clearance"]));
    expect(within(checks).getByText(/takes at most 10 in\.$/)).toBeTruthy();
  });

  it("when the print is already selected, the summary still brings its warnings into focus", async () => {
    const { user } = setup("front");
    await user.click(screen.getByRole("button", { name: /^2 warnings/ }));
    expect(document.activeElement).toBe(
      screen.getByRole("group", { name: "Checks for the full front on size XS" }),
    );
  });

  it("the suggested size reads in 1/8 in, stays inside the print area, and leaves no warning", async () => {
    const { user } = setup("front");
    // Wide art on XS: the 11 in target is cut to the print area's 9.997 in, rounded down to 9 7/8 in
    // (1/8 in display: Chalkline's own formatLength); 3:1 art is then 3 7/24 in tall, shown as 3 1/4 in.
    const button = screen.getByRole("button", { name: "Suggested size (9 7/8 × 3 1/4 in)" });
    expect(screen.getByText(/Reduced to stay inside the print area \(10 × 14 in\)\./)).toBeTruthy();
    await user.click(button);
    const checks = screen.getByRole("group", { name: "Checks for the full front on size XS" });
    expect(within(checks).getByText(/^Fits this size/)).toBeTruthy();
    expect(within(screen.getByRole("list")).queryByRole("button", { name: /warnings?:/ })).toBeNull();
  });
});
