"use client";

import { createContext, useContext } from "react";
import { temporal } from "zundo";
import { useStore } from "zustand";
import { createStore, type StoreApi } from "zustand/vanilla";
import type { GarmentSide } from "@/lib/garments/types";
import type { ProofDoc } from "@/lib/editor/document";
import type { LengthUnit } from "@/lib/units";

/**
 * Editor state. `doc` is the proof document in garment inches, the only thing saved and undone.
 * Everything else is how the maker is looking at it.
 */
export type EditorState = {
  doc: ProofDoc;
  selectedId: string | null;
  side: GarmentSide;
  unit: LengthUnit;
  zoom: number;
  keepAspect: boolean;
  /** The size being looked at. View state: switching it never changes the saved proof. */
  viewSize: string;
  /** The size before the last size switch, for the "no longer fits" check. */
  previousSize: string | null;
  apply: (edit: (doc: ProofDoc) => ProofDoc) => void;
  replaceDoc: (doc: ProofDoc) => void;
  select: (id: string | null) => void;
  setSide: (side: GarmentSide) => void;
  setUnit: (unit: LengthUnit) => void;
  setZoom: (zoom: number) => void;
  setKeepAspect: (keep: boolean) => void;
  setPreviousSize: (size: string | null) => void;
  /** Looks at another size; remembers the one before it for the fit check. */
  showSize: (size: string) => void;
};

export type EditorStore = ReturnType<typeof createEditorStore>;

export function createEditorStore(init: { doc: ProofDoc; zoom: number; unit?: LengthUnit; side?: GarmentSide }) {
  return createStore<EditorState>()(
    temporal(
      (set, get) => ({
        doc: init.doc,
        selectedId: init.doc.placements[0]?.id ?? null,
        side: init.side ?? "front",
        unit: init.unit ?? "in",
        zoom: init.zoom,
        keepAspect: true,
        viewSize: init.doc.size,
        previousSize: null,
        apply: (edit) => {
          const next = edit(get().doc);
          if (next !== get().doc) set({ doc: next });
        },
        replaceDoc: (doc) => set({ doc, selectedId: doc.placements.some((p) => p.id === get().selectedId) ? get().selectedId : (doc.placements[0]?.id ?? null) }),
        select: (id) => get().selectedId !== id && set({ selectedId: id }),
        setSide: (side) => get().side !== side && set({ side }),
        setUnit: (unit) => get().unit !== unit && set({ unit }),
        setZoom: (zoom) => get().zoom !== zoom && set({ zoom }),
        setKeepAspect: (keepAspect) => set({ keepAspect }),
        setPreviousSize: (previousSize) => set({ previousSize }),
        showSize: (size) => get().viewSize !== size && set({ previousSize: get().viewSize, viewSize: size }),
      }),
      {
        // Only the document is history; selection, zoom and units are not undone.
        partialize: (state) => ({ doc: state.doc }),
        equality: (a, b) => a.doc === b.doc,
        limit: 200,
      },
    ),
  );
}

export const EditorContext = createContext<EditorStore | null>(null);

export function useEditor<T>(selector: (state: EditorState) => T): T {
  const store = useContext(EditorContext);
  if (!store) throw new Error("useEditor must be used inside the proof editor.");
  return useStore(store as unknown as StoreApi<EditorState>, selector);
}

export function useEditorStore(): EditorStore {
  const store = useContext(EditorContext);
  if (!store) throw new Error("useEditorStore must be used inside the proof editor.");
  return store;
}
