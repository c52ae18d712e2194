import { describe, expect, it } from "vitest";
import { addPlacement, nudge, removePlacement, resize, setGarment, updatePlacement, type ProofDoc } from "@/lib/editor/document";
import { centredOrigin, fitZoom, keepInside, nextZoom, panToCentre, printCentre, rulerTicks, rulerTicksCm, scaleOf, snapArtPosition, toGarment, toStage } from "@/lib/editor/view";
import type { Placement } from "@/lib/placement/model";

const view = { originX: 500, originY: 120, pxPerInch: 96, zoom: 0.5 };

describe("view transform", () => {
  // 96 CSS px per inch: CSS Values and Units Level 3 (1in = 96px).
  it("uses calibrated px per inch times zoom as the scale", () => expect(scaleOf(view)).toBe(48));

  it.each([
    [{ x: 0, y: 0 }, { x: 500, y: 120 }],
    [{ x: 1, y: 1 }, { x: 548, y: 168 }],
    [{ x: -5.5, y: 3 }, { x: 236, y: 264 }],
  ])("maps garment %o to stage %o and back", (garment, stage) => {
    const s = toStage(view, garment);
    expect(s.x).toBeCloseTo(stage.x);
    expect(s.y).toBeCloseTo(stage.y);
    const back = toGarment(view, s);
    expect(back.x).toBeCloseTo(garment.x);
    expect(back.y).toBeCloseTo(garment.y);
  });

  it("fits a 30 in tall garment into 800 px with margins", () => {
    const z = fitZoom({ boxWidthIn: 30, boxHeightIn: 30, viewportWidth: 1200, viewportHeight: 800, pxPerInch: 96, marginPx: 40 });
    expect(30 * 96 * z).toBeCloseTo(720);
  });

  it("centres a box in the viewport", () => {
    const o = centredOrigin({ box: { x: -10, y: -4, width: 20, height: 30 }, viewportWidth: 1000, viewportHeight: 800, scale: 20 });
    expect(o.originX + 0 * 20).toBeCloseTo(500);
    expect(o.originY + 11 * 20).toBeCloseTo(400);
  });

  it("steps zoom through fixed stops", () => {
    expect(nextZoom(1, 1)).toBe(1.25);
    expect(nextZoom(1, -1)).toBe(0.75);
    expect(nextZoom(0.33, -1)).toBe(0.3);
  });
});

describe("drag snapping", () => {
  it("snaps onto the center line within the pixel threshold, scaled by zoom", () => {
    // 8 px at 48 px/in is 1/6 in.
    expect(snapArtPosition({ centreXIn: 0.15, topIn: 3.01, snapPx: 8, scale: 48, snapToCentre: true })).toEqual({ offsetFromCenterIn: 0, belowCollarIn: 3, snappedToCentre: true });
    expect(snapArtPosition({ centreXIn: 0.2, topIn: 3.01, snapPx: 8, scale: 48, snapToCentre: true }).offsetFromCenterIn).toBe(0.25);
  });

  it.each([
    [1.06, 1.0],
    [1.07, 1.125],
    [-2.19, -2.25],
  ])("snaps %f in to the nearest 1/8 in (%f)", (value, snapped) => {
    expect(snapArtPosition({ centreXIn: value, topIn: value, snapPx: 0, scale: 48, snapToCentre: false }).offsetFromCenterIn).toBeCloseTo(snapped);
  });
});

describe("rulers", () => {
  it("marks every 1/8 in when there is room, with whole inches marked as such", () => {
    const ticks = rulerTicks(0, 1, 96);
    expect(ticks).toHaveLength(9);
    expect(ticks.map((t) => t.kind)).toEqual(["inch", "eighth", "quarter", "eighth", "half", "eighth", "quarter", "eighth", "inch"]);
  });

  it("drops fine marks that would crowd closer than 4 px", () => {
    expect(rulerTicks(0, 4, 10).every((t) => (t.at * 4) % 1 === 0)).toBe(true);
  });

  it("labels whole centimetres at 2.54 cm per inch (NIST SP 811)", () => {
    const cm = rulerTicksCm(0, 1, 96).filter((t) => t.kind === "cm");
    expect(cm.map((t) => t.cm)).toEqual([0, 1, 2]);
    expect(cm[1]!.atIn).toBeCloseTo(1 / 2.54);
  });
});

const art: Placement = { id: "a", location: "full-front", artworkId: null, widthIn: 10, heightIn: 5, offsetFromCenterIn: 0, belowCollarIn: 3, rotationDeg: 0 };
const doc: ProofDoc = { size: "M", colourName: "Chalk", colourHex: "#F4F1EA", placements: [art] };

describe("document edits", () => {
  it("nudges by 1/8 in and by 1 in", () => {
    const once = nudge(doc, "a", 0.125, 0);
    expect(once.placements[0]!.offsetFromCenterIn).toBe(0.125);
    expect(nudge(once, "a", 0, 1).placements[0]!.belowCollarIn).toBe(4);
  });

  it("keeps proportions when the width is typed, and the top stays put", () => {
    const next = resize(doc, "a", { widthIn: 11, keepAspect: true });
    expect(next.placements[0]).toMatchObject({ widthIn: 11, heightIn: 5.5, belowCollarIn: 3 });
    expect(resize(doc, "a", { heightIn: 6, keepAspect: false }).placements[0]).toMatchObject({ widthIn: 10, heightIn: 6 });
  });

  it("returns the same object when nothing changes, so views skip work", () => {
    expect(updatePlacement(doc, "a", { widthIn: 10 })).toBe(doc);
    expect(updatePlacement(doc, "missing", { widthIn: 3 })).toBe(doc);
    expect(setGarment(doc, { size: "M" })).toBe(doc);
    expect(removePlacement(doc, "missing")).toBe(doc);
  });

  it("refuses sizes of zero or less", () => {
    expect(resize(doc, "a", { widthIn: 0, keepAspect: true })).toBe(doc);
  });

  it("adds and removes placements", () => {
    const added = addPlacement(doc, { ...art, id: "b" });
    expect(added.placements.map((p) => p.id)).toEqual(["a", "b"]);
    expect(removePlacement(added, "a").placements.map((p) => p.id)).toEqual(["b"]);
  });
});

describe("keeping callouts readable and centring a print", () => {
  it("slides a label the least distance that keeps it off the rulers and inside the stage", () => {
    const bounds = { left: 28, top: 28, right: 390, bottom: 600 };
    // Already inside: unchanged.
    expect(keepInside({ left: 100, top: 100, width: 80, height: 18 }, bounds)).toEqual({ left: 100, top: 100 });
    // Half under the left ruler: moved right to its edge, not further.
    expect(keepInside({ left: 0, top: 100, width: 80, height: 18 }, bounds)).toEqual({ left: 28, top: 100 });
    // Past the right edge: moved left so its right side sits on the edge.
    expect(keepInside({ left: 350, top: 100, width: 80, height: 18 }, bounds)).toEqual({ left: 310, top: 100 });
    // Under the top ruler and wider than the stage: top edge in, left edge in.
    expect(keepInside({ left: 10, top: 5, width: 500, height: 18 }, bounds)).toEqual({ left: 28, top: 28 });
  });

  it("pans so a print's middle sits at the viewport centre", () => {
    const box = { x: -11, y: -2, width: 22, height: 30 };
    const middle = printCentre({ offsetFromCenterIn: 0, belowCollarIn: 3, heightIn: 10 });
    expect(middle).toEqual({ x: 0, y: 8 });
    const pan = panToCentre(box, middle);
    expect(pan).toEqual({ x: 0, y: -5 });
    // Put back through the view maths: the print's middle lands on the viewport centre (390 × 600 at 96 px/in).
    const scale = 96;
    const o = centredOrigin({ box, viewportWidth: 390, viewportHeight: 600, scale });
    expect(o.originX - pan.x * scale + middle.x * scale).toBeCloseTo(195, 9);
    expect(o.originY - pan.y * scale + middle.y * scale).toBeCloseTo(300, 9);
  });
});
