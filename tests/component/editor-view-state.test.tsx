/**
 * Looking is not editing: the size shown, the side, zoom, actual size and units live in the
 * editor's view state. None of them changes the document the autosave sends, nor its history.
 */
import { describe, expect, it } from "vitest";
import { createEditorStore } from "@/components/editor/store";
import type { ProofDoc } from "@/lib/editor/document";

const doc: ProofDoc = {
  size: "M",
  colourName: "Chalk",
  colourHex: "#F4F1EA",
  placements: [{ id: "front", location: "full-front", artworkId: null, widthIn: 10, heightIn: 8, offsetFromCenterIn: 0, belowCollarIn: 3, rotationDeg: 0 }],
};

describe("editor view state", () => {
  it("switching the size shown, side, zoom and units leaves the document and its history as they were", () => {
    const store = createEditorStore({ doc, zoom: 1 });
    const before = store.getState().doc;
    store.getState().showSize("XS");
    store.getState().setSide("back");
    store.getState().setZoom(2);
    store.getState().setZoom(1); // "Actual size"
    store.getState().setUnit("cm");
    expect(store.getState().doc).toBe(before);
    expect(store.getState().doc.size).toBe("M");
    expect(store.temporal.getState().pastStates).toHaveLength(0);
    expect(store.getState().viewSize).toBe("XS");
    // The size looked at before is kept for the "no longer fits" check.
    expect(store.getState().previousSize).toBe("M");
  });

  it("an edit still goes into the document and can be undone", () => {
    const store = createEditorStore({ doc, zoom: 1 });
    store.getState().showSize("L");
    store.getState().apply((d) => ({ ...d, placements: d.placements.map((p) => ({ ...p, widthIn: 9 })) }));
    expect(store.getState().doc.placements[0]!.widthIn).toBe(9);
    expect(store.getState().doc.size).toBe("M");
    store.temporal.getState().undo();
    expect(store.getState().doc).toEqual(doc);
    expect(store.getState().viewSize).toBe("L");
  });
});
