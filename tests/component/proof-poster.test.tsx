import { render } from "@testing-library/react";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { ProofCanvas } from "@/components/editor/ProofCanvas";
import { findBlank, findSizeRow } from "@/lib/garments/catalog";
import type { Placement } from "@/lib/placement/model";

// The canvas code loads on demand; here it never arrives, as on a slow phone before the chunk lands.
vi.mock("next/dynamic", () => ({ default: () => () => null }));

beforeAll(() => {
  globalThis.ResizeObserver ??= class {
    observe() {}
    unobserve() {}
    disconnect() {}
  } as unknown as typeof ResizeObserver;
});
afterEach(() => vi.restoreAllMocks());

const blank = findBlank("everyday-crew-tee")!;
const row = findSizeRow(blank, "M")!;
const print: Placement = { id: "p1", location: "full-front", artworkId: "a1", widthIn: 10, heightIn: 8, offsetFromCenterIn: 1.5, belowCollarIn: 3, rotationDeg: 5 };

function draw(placements: Placement[]) {
  return render(
    <ProofCanvas
      category={blank.category}
      group={row.group}
      measurements={row.measurements}
      side="front"
      colourHex="#1f2a44"
      placements={placements}
      art={[{ id: "a1", name: "Crest", src: "/art/a1.webp", inkWidthPx: 1000, inkHeightPx: 800 }]}
      selectedId={null}
      unit="in"
      zoom={null}
      pxPerInch={96}
      editable={false}
      keepAspect
      onZoomChange={() => {}}
      onSelect={() => {}}
      onCommit={() => {}}
    />,
  );
}

describe("the proof poster", () => {
  it("draws the garment and its art as SVG in garment inches before the canvas code runs", () => {
    const { container } = draw([print]);
    const svg = container.querySelector("svg[role=img]");
    expect(svg?.getAttribute("aria-label")).toBe("The proof, drawing at true scale");
    const image = container.querySelector("svg image")!;
    expect(image.getAttribute("href")).toBe("/art/a1.webp");
    // Left edge = offset − width / 2 = 1.5 − 5; top = 3 in below the collar; the print's own size.
    expect(Number(image.getAttribute("x"))).toBeCloseTo(-3.5, 9);
    expect(Number(image.getAttribute("y"))).toBeCloseTo(3, 9);
    expect(Number(image.getAttribute("width"))).toBe(10);
    expect(Number(image.getAttribute("height"))).toBe(8);
    // Turned about its own middle: (1.5, 3 + 8 / 2).
    expect(image.getAttribute("transform")).toBe("rotate(5 1.5 7)");
    expect(image.getAttribute("elementtiming")).toBe("proof-poster-art");
  });

  it("leaves out prints of the other side and prints without art", () => {
    const back: Placement = { ...print, id: "p2", location: "full-back" };
    const bare: Placement = { ...print, id: "p3", artworkId: null };
    const { container } = draw([back, bare]);
    expect(container.querySelectorAll("svg image")).toHaveLength(0);
    expect(container.querySelector("svg[role=img] path")).not.toBeNull();
  });
});
