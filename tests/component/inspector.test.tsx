import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { useState } from "react";
import { describe, expect, it, vi } from "vitest";
import { Inspector } from "@/components/editor/Inspector";
import type { EditorBlank } from "@/components/editor/ProofEditor";
import type { PlacementPatch } from "@/lib/editor/document";
import { findBlank } from "@/lib/garments/catalog";
import { LOCATION_LABELS, locationsFor } from "@/lib/garments/locations";
import type { Placement } from "@/lib/placement/model";
import type { LengthUnit } from "@/lib/units";

const tee = findBlank("everyday-crew-tee")!;
const blank: EditorBlank = {
  id: tee.id,
  name: tee.styleName,
  category: tee.category,
  colours: tee.colors,
  sizeChart: tee.sizes.map((r) => ({ size: r.size, group: r.group, measurements: r.measurements })),
};
const start: Placement = {
  id: "print-1",
  location: "full-front",
  artworkId: null,
  widthIn: 12,
  heightIn: 10,
  offsetFromCenterIn: 0,
  belowCollarIn: 3,
  rotationDeg: 0,
};

function setup({ unit = "in", editable = true }: { unit?: LengthUnit; editable?: boolean } = {}) {
  const onResize = vi.fn<(id: string, change: { widthIn?: number; heightIn?: number }) => void>();
  const onPatch = vi.fn<(id: string, patch: PlacementPatch) => void>();
  function Harness() {
    const [placement, setPlacement] = useState(start);
    return (
      <Inspector
        blank={blank}
        doc={{ size: "M", colourName: "Chalk", colourHex: "#F4F1EA", placements: [placement] }}
        side="front"
        unit={unit}
        selected={placement}
        keepAspect={false}
        editable={editable}
        artworks={[]}
        method="screen-print"
        locations={locationsFor(blank.category).map((value) => ({ value, label: LOCATION_LABELS[value] }))}
        previousSize={null}
        calibrated={false}
        onCalibrate={() => undefined}
        onSelect={() => undefined}
        onSize={() => undefined}
        onColour={() => undefined}
        onKeepAspect={() => undefined}
        onPatch={(id, patch) => {
          onPatch(id, patch);
          setPlacement((p) => ({ ...p, ...patch }));
        }}
        onResize={(id, change) => {
          onResize(id, change);
          setPlacement((p) => ({ ...p, ...change }));
        }}
        onRemove={() => undefined}
        onAdd={() => undefined}
      />
    );
  }
  render(<Harness />);
  const selected = screen.getByRole("region", { name: "Full front" });
  const field = (name: string) => within(selected).getByRole("textbox", { name });
  return { user: userEvent.setup(), field, onResize, onPatch };
}

function description(field: HTMLElement): string {
  const ids = field.getAttribute("aria-describedby")?.split(/\s+/).filter(Boolean) ?? [];
  return ids.map((id) => document.getElementById(id)?.textContent ?? "").join(" ");
}

async function enter(user: ReturnType<typeof userEvent.setup>, field: HTMLElement, text: string) {
  await user.clear(field);
  if (text) await user.type(field, text);
  await user.keyboard("{Enter}");
}

describe("Inspector length fields", () => {
  it("names each field by its label and shows the selected print in inches", () => {
    const { field } = setup();
    expect(field("Width")).toHaveProperty("value", "12");
    expect(field("Height")).toHaveProperty("value", "10");
    expect(field("From center")).toHaveProperty("value", "0");
    expect(field("Below collar")).toHaveProperty("value", "3");
    expect(description(field("From center"))).toBe("Centered");
    expect(description(field("Below collar"))).toBe("Top of the print");
  });

  it("resizes the print from a typed mixed number and shows the new width", async () => {
    const { user, field, onResize } = setup();
    await enter(user, field("Width"), "12 1/2");
    expect(onResize).toHaveBeenCalledWith("print-1", { widthIn: 12.5 });
    expect(field("Width")).toHaveProperty("value", "12.5");
  });

  it("resizes the height from a decimal on leaving the field", async () => {
    const { user, field, onResize } = setup();
    await user.clear(field("Height"));
    await user.type(field("Height"), "9.75");
    await user.tab();
    expect(onResize).toHaveBeenCalledWith("print-1", { heightIn: 9.75 });
  });

  it("moves the print off center with a negative fraction and says which way", async () => {
    const { user, field, onPatch } = setup();
    await enter(user, field("From center"), "-1 1/2");
    expect(onPatch).toHaveBeenCalledWith("print-1", { offsetFromCenterIn: -1.5 });
    expect(description(field("From center"))).toBe("Toward viewer's left");
    await enter(user, field("From center"), "2");
    expect(description(field("From center"))).toBe("Toward viewer's right");
  });

  it("moves the print down from the collar", async () => {
    const { user, field, onPatch } = setup();
    await enter(user, field("Below collar"), "3 3/4");
    expect(onPatch).toHaveBeenCalledWith("print-1", { belowCollarIn: 3.75 });
  });

  it.each([
    { name: "Width", typed: "wide", message: /"wide" isn't a length we can read/ },
    { name: "Width", typed: "-3", message: /^Enter a length of zero or more\.$/ },
    { name: "Height", typed: "0", message: /^Use a size above zero\.$/ },
    { name: "Height", typed: "", message: /^Enter a length, for example 11 1\/2 or 28 cm\.$/ },
    { name: "Below collar", typed: "two", message: /"two" isn't a length we can read/ },
  ])("refuses $typed in $name with its reason and changes nothing", async ({ name, typed, message }) => {
    const { user, field, onResize, onPatch } = setup();
    await enter(user, field(name), typed);
    expect(onResize).not.toHaveBeenCalled();
    expect(onPatch).not.toHaveBeenCalled();
    expect(field(name).getAttribute("aria-invalid")).toBe("true");
    expect(description(field(name))).toMatch(message);
  });

  it("shows and reads centimetres when the unit is cm", async () => {
    const { user, field, onResize } = setup({ unit: "cm" });
    expect(field("Width")).toHaveProperty("value", "30.48");
    await enter(user, field("Width"), "25");
    expect(onResize).toHaveBeenCalledTimes(1);
    expect(onResize.mock.calls[0]![1].widthIn).toBeCloseTo(25 / 2.54, 9);
    expect(field("Width")).toHaveProperty("value", "25.00");
  });

  it("locks every length for someone who cannot edit the proof", () => {
    const { field } = setup({ editable: false });
    for (const name of ["Width", "Height", "From center", "Below collar"])
      expect(field(name)).toHaveProperty("disabled", true);
    expect(screen.queryByRole("button", { name: "Remove print" })).toBeNull();
  });

  it("labels the rotation and proportion controls too", async () => {
    const { user, onPatch } = setup();
    const rotation = screen.getByRole("spinbutton", { name: "Rotation" });
    await user.clear(rotation);
    await user.type(rotation, "15");
    expect(onPatch).toHaveBeenLastCalledWith("print-1", { rotationDeg: 15 });
    expect(screen.getByRole("checkbox", { name: "Keep proportions" })).toBeTruthy();
  });
});
