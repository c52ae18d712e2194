"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { DropZone } from "@/components/artwork/DropZone";
import { useCallback, useEffect, useMemo, useState } from "react";
import { useStore } from "zustand";
import { saveProofAction } from "@/app/shops/[shop]/proofs/[proofId]/actions";
import type { PlacementCommit } from "@/canvas/ProofStage";
import { addPlacement, nudge, removePlacement, resize, setGarment, updatePlacement, type ProofDoc } from "@/lib/editor/document";
import { nextZoom, printCentre } from "@/lib/editor/view";
import { LOCATION_LABELS, locationSpec, locationsFor, sideOf, type PrintLocation } from "@/lib/garments/locations";
import { formatLength } from "@/lib/units";
import { CATEGORY_INFO, type GarmentCategory, type GarmentMeasurements, type SizeGroup } from "@/lib/garments/types";
import { defaultPlacement } from "@/lib/placement/model";
import type { ArtShape } from "@/lib/artwork/advice";
import { svgDataUrl } from "@/lib/demo-art";
import type { DecorationMethod } from "@/lib/jobs";
import { CalibrationDialog } from "./CalibrationDialog";
import { useCalibration } from "./calibration";
import { Inspector } from "./Inspector";
import { ProofCanvas, type ArtSource } from "./ProofCanvas";
import { ClientNotes } from "./ClientNotes";
import { SaveIndicator } from "./SaveIndicator";
import { SharePanel } from "./SharePanel";
import { createEditorStore, EditorContext, useEditor, type EditorStore } from "./store";
import { useAutosave } from "./useAutosave";
import { placementWarnings } from "./warnings";
import type { ShopClock } from "@/lib/dates";

export type EditorBlank = {
  id: string;
  name: string;
  category: GarmentCategory;
  colours: Array<{ name: string; hex: string }>;
  sizeChart: Array<{ size: string; group: SizeGroup; measurements: GarmentMeasurements }>;
};

export type EditorArtwork = {
  id: string;
  name: string;
  kind: string;
  svg: string | null;
  isVector: boolean;
  hasPreview: boolean;
  inkWidthPx: number;
  inkHeightPx: number;
  shape: ArtShape | null;
  colourCount: number | null;
};

type Props = {
  shopSlug: string;
  /** The shop's locale and time zone, for the dates in the side panels. */
  clock?: ShopClock;
  proof: { id: string; name: string; revision: string; version: number };
  job: { id: string; title: string; clientId: string; clientName: string; method: DecorationMethod };
  blank: EditorBlank;
  doc: ProofDoc;
  artworks: EditorArtwork[];
  canEdit: boolean;
  initialZoom: number | null;
  contact: { email: string; name: string } | null;
};

export function ProofEditor(props: Props) {
  const [store] = useState<EditorStore>(() => createEditorStore({ doc: props.doc, zoom: props.initialZoom ?? 0 }));
  return (
    <EditorContext.Provider value={store}>
      <EditorBody {...props} store={store} />
    </EditorContext.Provider>
  );
}

function EditorBody(props: Props & { store: EditorStore }) {
  const { store, blank } = props;
  const router = useRouter();
  const doc = useEditor((s) => s.doc);
  const side = useEditor((s) => s.side);
  const unit = useEditor((s) => s.unit);
  const zoomValue = useEditor((s) => s.zoom);
  const selectedId = useEditor((s) => s.selectedId);
  const keepAspect = useEditor((s) => s.keepAspect);
  const viewSize = useEditor((s) => s.viewSize);
  const previousSize = useEditor((s) => s.previousSize);
  const temporal = useStore(store.temporal);
  const calibration = useCalibration(true);
  const [calibrating, setCalibrating] = useState(false);
  const [sharing, setSharing] = useState(false);
  const [live, setLive] = useState<{ id: string; patch: PlacementCommit } | null>(null);

  const zoom = zoomValue > 0 ? zoomValue : null;
  const sizeRow = blank.sizeChart.find((r) => r.size === viewSize) ?? blank.sizeChart[0]!;
  // What the inspector shows is the document at the size being looked at; the saved size stays the proof's own.
  const viewDoc = useMemo(() => (doc.size === viewSize ? doc : { ...doc, size: viewSize }), [doc, viewSize]);
  const info = CATEGORY_INFO[blank.category];
  // One set of checks at the size looked at: the inspector lists them, the canvas marks the prints.
  const previousRow = previousSize ? blank.sizeChart.find((r) => r.size === previousSize) : undefined;
  const warningsById = useMemo(
    () => placementWarnings({ placements: doc.placements, category: blank.category, row: sizeRow, previous: previousRow, unit }),
    [doc.placements, blank.category, sizeRow, previousRow, unit],
  );

  const save = useCallback(
    (input: { baseVersion: number; doc: ProofDoc; saveKey: string }) => saveProofAction({ shopSlug: props.shopSlug, proofId: props.proof.id, ...input }),
    [props.shopSlug, props.proof.id],
  );
  const [revision, setRevision] = useState(props.proof.revision);
  const autosave = useAutosave({ proofId: props.proof.id, store, initialVersion: props.proof.version, enabled: props.canEdit, save, onSaved: setRevision });

  const art: ArtSource[] = useMemo(
    () =>
      props.artworks
        .filter((a) => a.hasPreview || a.svg)
        .map((a) => ({
          id: a.id,
          name: a.name,
          // Generated art draws from its own SVG; uploads draw from their downscaled preview, never the original.
          src: a.kind === "generated" && a.svg ? svgDataUrl(a.svg) : `/api/artworks/${a.id}/preview`,
          inkWidthPx: a.inkWidthPx,
          inkHeightPx: a.inkHeightPx,
        })),
    [props.artworks],
  );

  const selected = doc.placements.find((p) => p.id === selectedId) ?? null;
  // Actual size opens on the middle of the print in hand (the selected one, else the first on this side).
  const [centreOn, setCentreOn] = useState<{ n: number; x: number; y: number } | null>(null);
  const showActualSize = () => {
    store.getState().setZoom(1);
    const onSide = doc.placements.filter((p) => sideOf(p.location) === side);
    const target = (selected && sideOf(selected.location) === side ? selected : null) ?? onSide[0];
    if (target) setCentreOn((c) => ({ n: (c?.n ?? 0) + 1, ...printCentre(target) }));
  };
  const selectedArtName = props.artworks.find((a) => a.id === selected?.artworkId)?.name ?? "no art";
  const shownSelected = selected && live?.id === selected.id ? { ...selected, ...live.patch } : selected;

  // Keyboard: arrows nudge 1/8 in (shift: 1 in), undo and redo.
  useEffect(() => {
    function onKey(event: KeyboardEvent) {
      const target = event.target as HTMLElement | null;
      if (target && (target.closest("input, textarea, select, [contenteditable=true]") || target.closest("dialog"))) return;
      const mod = event.metaKey || event.ctrlKey;
      if (mod && event.key.toLowerCase() === "z") {
        event.preventDefault();
        if (event.shiftKey) store.temporal.getState().redo();
        else store.temporal.getState().undo();
        return;
      }
      if (mod && event.key.toLowerCase() === "y") {
        event.preventDefault();
        store.temporal.getState().redo();
        return;
      }
      const id = store.getState().selectedId;
      if (!id || !props.canEdit) return;
      const step = event.shiftKey ? 1 : 0.125;
      const moves: Record<string, [number, number]> = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, -step], ArrowDown: [0, step] };
      const move = moves[event.key];
      if (move) {
        event.preventDefault();
        store.getState().apply((d) => nudge(d, id, move[0], move[1]));
      }
    }
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [store, props.canEdit]);

  const onCommit = useCallback(
    (id: string, patch: PlacementCommit) => {
      setLive(null);
      store.getState().apply((d) => updatePlacement(d, id, patch));
    },
    [store],
  );
  const onSelect = useCallback((id: string | null) => store.getState().select(id), [store]);
  const onZoomChange = useCallback((z: number) => store.getState().setZoom(z), [store]);

  function switchSize(size: string) {
    store.getState().showSize(size);
  }

  function addArt(artworkId: string, location: PrintLocation) {
    const artwork = props.artworks.find((a) => a.id === artworkId);
    if (!artwork) return;
    const spec = locationSpec({ location, category: blank.category, group: sizeRow.group, measurements: sizeRow.measurements });
    const placement = { ...defaultPlacement(spec, artwork.inkWidthPx / artwork.inkHeightPx, crypto.randomUUID()), artworkId };
    store.getState().apply((d) => addPlacement(d, placement));
    store.getState().setSide(sideOf(location));
    store.getState().select(placement.id);
  }

  return (
    <div className="-mx-gutter -my-6 flex h-[calc(100dvh-3.5rem)] flex-col lg:-mx-10 lg:-my-8 lg:h-dvh">
      <header className="flex flex-wrap items-center gap-x-4 gap-y-2 border-b border-paper-300 bg-chalk px-4 py-2.5">
        <div className="min-w-0">
          <p className="truncate text-xs text-ink-500">
            <Link href={`/shops/${props.shopSlug}/jobs/${props.job.id}`} className="hover:underline">
              {props.job.clientName} · {props.job.title}
            </Link>
          </p>
          <h1 className="truncate text-lg leading-tight">
            {props.proof.name} <span className="measure text-sm font-medium text-ink-500" data-testid="revision-letter">rev. {revision}</span>
          </h1>
        </div>
        <SaveIndicator status={autosave.status} saves={autosave.saves} retries={autosave.retries} editable={props.canEdit} onTakeTheirs={autosave.takeTheirs} onKeepMine={autosave.keepMine} />
        <div className="ml-auto flex flex-wrap items-center gap-2">
          <div className="flex rounded-lg border border-paper-300 p-0.5 text-sm" role="group" aria-label="Garment side">
            {(["front", "back"] as const).map((s) => (
              <button key={s} type="button" aria-pressed={side === s} onClick={() => store.getState().setSide(s)} className={`rounded-md px-3 py-1 capitalize ${side === s ? "bg-ink-800 text-chalk" : "text-ink-700 hover:bg-paper-200"}`}>
                {s}
              </button>
            ))}
          </div>
          <div className="flex items-center rounded-lg border border-paper-300 text-sm" role="group" aria-label="Zoom">
            <button type="button" className="px-2.5 py-1 hover:bg-paper-200" aria-label="Zoom out" onClick={() => zoom && store.getState().setZoom(nextZoom(zoom, -1))}>
              −
            </button>
            <span className="measure w-14 text-center" data-testid="zoom-value">
              {zoom ? `${Math.round(zoom * 100)}%` : "…"}
            </span>
            <button type="button" className="px-2.5 py-1 hover:bg-paper-200" aria-label="Zoom in" onClick={() => zoom && store.getState().setZoom(nextZoom(zoom, 1))}>
              +
            </button>
            <button type="button" className="border-l border-paper-300 px-2.5 py-1 hover:bg-paper-200" onClick={showActualSize} title="At 100% an inch on screen is an inch, once the screen is calibrated">
              Actual size
            </button>
          </div>
          <div className="flex rounded-lg border border-paper-300 p-0.5 text-sm" role="group" aria-label="Units">
            {(["in", "cm"] as const).map((u) => (
              <button key={u} type="button" aria-pressed={unit === u} onClick={() => store.getState().setUnit(u)} className={`rounded-md px-2.5 py-1 ${unit === u ? "bg-ink-800 text-chalk" : "text-ink-700 hover:bg-paper-200"}`}>
                {u}
              </button>
            ))}
          </div>
          {props.canEdit ? (
            <button type="button" className="btn-primary px-3 py-1.5" onClick={() => setSharing(true)}>
              Share with client
            </button>
          ) : null}
          <div className="flex gap-1">
            <button type="button" className="btn-quiet px-3 py-1.5" disabled={!temporal.pastStates.length || !props.canEdit} onClick={() => temporal.undo()} title="Undo (Ctrl+Z)">
              Undo
            </button>
            <button type="button" className="btn-quiet px-3 py-1.5" disabled={!temporal.futureStates.length || !props.canEdit} onClick={() => temporal.redo()} title="Redo (Ctrl+Shift+Z)">
              Redo
            </button>
          </div>
        </div>
      </header>

      {!calibration.calibrated ? (
        <div className="flex flex-wrap items-center gap-3 border-b border-ochre-300 bg-ochre-100 px-4 py-1.5 text-sm text-ochre-800" role="note">
          <span>This screen is not calibrated: Chalkline assumes 96 px per inch (the CSS standard), so an inch on screen may not be a real inch.</span>
          <button type="button" className="font-medium underline" onClick={() => setCalibrating(true)}>
            Calibrate with a card
          </button>
        </div>
      ) : null}

      <div className="flex min-h-0 flex-1 flex-col lg:flex-row">
        <div
          className="relative min-h-[55vh] flex-1 focus-visible:-outline-offset-4 lg:min-h-0"
          tabIndex={0}
          role="application"
          aria-roledescription="garment canvas"
          aria-label="Garment canvas"
          aria-describedby="canvas-selection canvas-keys"
          data-testid="canvas-focus"
        >
          <p id="canvas-selection" className="sr-only" aria-live="polite">
            {selected ? `Selected: ${LOCATION_LABELS[selected.location]}, ${selectedArtName}, ${formatLength(selected.widthIn, unit)} wide, ${formatLength(selected.belowCollarIn, unit)} below the collar.` : "No print selected. Choose one under Prints on this proof."}
          </p>
          <p id="canvas-keys" className="sr-only">
            {props.canEdit ? "Arrow keys nudge the selected print by 1/8 inch, or by 1 inch with Shift. Ctrl+Z undoes." : "You can look at this proof but not change it."}
          </p>
          <ProofCanvas
            category={blank.category}
            group={sizeRow.group}
            measurements={sizeRow.measurements}
            side={side}
            colourHex={doc.colourHex}
            placements={doc.placements}
            art={art}
            selectedId={selectedId}
            unit={unit}
            zoom={zoom}
            pxPerInch={calibration.pxPerInch}
            editable={props.canEdit}
            keepAspect={keepAspect}
            onZoomChange={onZoomChange}
            centreOn={centreOn}
            onSelect={onSelect}
            onCommit={onCommit}
            onLiveChange={(id, patch) => setLive({ id, patch })}
            flags={warningsById}
          />
          <p className="pointer-events-none absolute bottom-2 left-10 rounded bg-chalk/90 px-2 py-1 text-xs text-ink-600">
            {blank.name} · {info.label} · size {viewSize} · {side} · {calibration.calibrated ? `${calibration.pxPerInch.toFixed(1)} px/in calibrated` : "96 px/in (not calibrated)"}
          </p>
        </div>
        <aside className="w-full shrink-0 overflow-y-auto border-t border-paper-300 bg-paper-50 lg:w-panel lg:border-l lg:border-t-0" aria-label="Inspector">
          <Inspector
            blank={blank}
            doc={viewDoc}
            designSize={doc.size}
            side={side}
            unit={unit}
            selected={shownSelected}
            keepAspect={keepAspect}
            editable={props.canEdit}
            artworks={props.artworks}
            method={props.job.method}
            locations={locationsFor(blank.category).map((l) => ({ value: l, label: LOCATION_LABELS[l] }))}
            previousSize={previousSize}
            warningsById={warningsById}
            calibrated={calibration.calibrated}
            onCalibrate={() => setCalibrating(true)}
            onSelect={(id) => {
              store.getState().select(id);
              const p = doc.placements.find((x) => x.id === id);
              if (p) store.getState().setSide(sideOf(p.location));
            }}
            onSize={switchSize}
            onColour={(c) => store.getState().apply((d) => setGarment(d, { colourName: c.name, colourHex: c.hex }))}
            onKeepAspect={(k) => store.getState().setKeepAspect(k)}
            onPatch={(id, patch) => store.getState().apply((d) => updatePlacement(d, id, patch))}
            onResize={(id, change) => store.getState().apply((d) => resize(d, id, { ...change, keepAspect }))}
            onRemove={(id) => store.getState().apply((d) => removePlacement(d, id))}
            onAdd={addArt}
            uploadSlot={<DropZone shopSlug={props.shopSlug} clientId={props.job.clientId} onUploaded={() => router.refresh()} />}
          />
          <ClientNotes proofId={props.proof.id} canReply={props.canEdit} clock={props.clock} />
        </aside>
      </div>
      <SharePanel open={sharing} onClose={() => setSharing(false)} shopSlug={props.shopSlug} proofId={props.proof.id} defaultEmail={props.contact?.email ?? null} defaultName={props.contact?.name ?? null} clock={props.clock} />
      <CalibrationDialog open={calibrating} current={calibration.pxPerInch} onClose={() => setCalibrating(false)} onSave={calibration.save} saving={calibration.saving} error={calibration.error} />
    </div>
  );
}
