"use client";

import { useEffect, useMemo, useRef, useState, type ReactNode } from "react";
import { fillPrintArea, placeSuggestedSize, SHAPE_LABELS, suggestSize } from "@/lib/artwork/advice";
import { assessQuality, GRADE_LABELS, type QualityGrade } from "@/lib/artwork/quality";
import { LOCATION_LABELS, locationSpec, sideOf, type PrintLocation } from "@/lib/garments/locations";
import type { DecorationMethod } from "@/lib/jobs";
import type { GarmentSide } from "@/lib/garments/types";
import type { ProofDoc, PlacementPatch } from "@/lib/editor/document";
import { shortLabels, type PlacementWarning } from "@/lib/placement/checks";
import type { Placement } from "@/lib/placement/model";
import { formatLength, type LengthUnit } from "@/lib/units";
import { LengthField } from "./LengthField";
import type { EditorArtwork, EditorBlank } from "./ProofEditor";
import { placementWarnings } from "./warnings";

type Props = {
  blank: EditorBlank;
  doc: ProofDoc;
  side: GarmentSide;
  unit: LengthUnit;
  selected: Placement | null;
  keepAspect: boolean;
  editable: boolean;
  artworks: EditorArtwork[];
  method: DecorationMethod;
  locations: Array<{ value: PrintLocation; label: string }>;
  previousSize: string | null;
  /** The size the proof was designed at; the one shown (doc.size here) may be another. */
  designSize?: string;
  calibrated: boolean;
  onCalibrate: () => void;
  onSelect: (id: string) => void;
  onSize: (size: string) => void;
  onColour: (c: { name: string; hex: string }) => void;
  onKeepAspect: (keep: boolean) => void;
  onPatch: (id: string, patch: PlacementPatch) => void;
  onResize: (id: string, change: { widthIn?: number; heightIn?: number }) => void;
  onRemove: (id: string) => void;
  onAdd: (artworkId: string, location: PrintLocation) => void;
  uploadSlot?: ReactNode;
  /** Warnings per placement id at the size shown, when the editor has computed them already (the canvas marks the same ones). */
  warningsById?: Record<string, PlacementWarning[]>;
};

const GRADE_TONE: Record<QualityGrade, string> = {
  vector: "bg-patina-100 text-patina-800",
  ideal: "bg-patina-100 text-patina-800",
  visible: "bg-ochre-100 text-ochre-800",
  poor: "bg-brick-100 text-brick-800",
};

const TONE: Record<PlacementWarning["severity"], string> = {
  error: "border-brick-300 bg-brick-100 text-brick-800",
  warning: "border-ochre-300 bg-ochre-100 text-ochre-800",
  info: "border-ink-200 bg-paper-100 text-ink-700",
};

export function Inspector(props: Props) {
  const { blank, doc, unit, selected } = props;
  const row = blank.sizeChart.find((r) => r.size === doc.size) ?? blank.sizeChart[0]!;
  const previous = props.previousSize ? blank.sizeChart.find((r) => r.size === props.previousSize) : undefined;

  const given = props.warningsById;
  const computed = useMemo(
    () => (given ? null : placementWarnings({ placements: doc.placements, category: blank.category, row, previous, unit })),
    [given, doc.placements, blank.category, row, unit, previous],
  );
  const warningsById = given ?? computed ?? {};

  // "Show warnings" in the list selects the print, then brings its warnings into view and focus.
  const warningsBox = useRef<HTMLDivElement>(null);
  const pendingReveal = useRef<string | null>(null);
  const revealWarnings = () => {
    const box = warningsBox.current;
    box?.scrollIntoView?.({ block: "nearest" });
    box?.focus({ preventScroll: true });
  };
  const showWarningsOf = (id: string) => {
    if (selected?.id === id) return revealWarnings();
    pendingReveal.current = id;
    props.onSelect(id);
  };
  const selectedId = selected?.id;
  useEffect(() => {
    if (!pendingReveal.current || pendingReveal.current !== selectedId) return;
    pendingReveal.current = null;
    revealWarnings();
  }, [selectedId]);

  const artName = (id: string | null) => props.artworks.find((a) => a.id === id)?.name ?? "No art";
  const [newArt, setNewArt] = useState(props.artworks[0]?.id ?? "");
  const [newLocation, setNewLocation] = useState<PrintLocation>(props.locations[0]?.value ?? "full-front");

  return (
    <div className="space-y-6 p-4">
      <section aria-labelledby="garment-h">
        <h2 id="garment-h" className="text-sm font-semibold uppercase tracking-wider text-ink-500">
          Garment
        </h2>
        <p className="mt-1 text-sm text-ink-800">{blank.name}</p>
        <div className="mt-3 grid grid-cols-2 gap-3">
          <div>
            <label htmlFor="size" className="mb-1 block text-xs font-medium text-ink-600">
              Size shown
            </label>
            <select id="size" className="field-input py-1.5 text-sm" value={doc.size} aria-describedby="size-hint" onChange={(e) => props.onSize(e.target.value)}>
              {blank.sizeChart.map((r) => (
                <option key={r.size} value={r.size}>
                  {r.size}
                </option>
              ))}
            </select>
            <p id="size-hint" className="mt-1 text-xs text-ink-500">
              {props.designSize && props.designSize !== doc.size ? `Designed at ${props.designSize}. Looking at another size changes nothing.` : "Looking at another size changes nothing on the proof."}
            </p>
          </div>
          <div>
            <span className="mb-1 block text-xs font-medium text-ink-600">Colour: {doc.colourName}</span>
            <div className="flex flex-wrap gap-1.5" role="radiogroup" aria-label="Garment colour">
              {blank.colours.map((c) => (
                <button
                  key={c.hex + c.name}
                  type="button"
                  role="radio"
                  aria-checked={c.hex.toLowerCase() === doc.colourHex.toLowerCase()}
                  aria-label={c.name}
                  title={c.name}
                  disabled={!props.editable}
                  onClick={() => props.onColour(c)}
                  className={`h-6 w-6 rounded-full border ${c.hex.toLowerCase() === doc.colourHex.toLowerCase() ? "ring-2 ring-patina-500 ring-offset-1" : "border-ink-200"}`}
                  style={{ background: c.hex }}
                />
              ))}
            </div>
          </div>
        </div>
        <p className="mt-2 text-xs text-ink-500">
          Chest {formatLength("chestWidth" in row.measurements ? row.measurements.chestWidth : row.measurements.width, unit)} · length{" "}
          {formatLength("bodyLength" in row.measurements ? row.measurements.bodyLength : row.measurements.height, unit)}. Chart values are approximate until you edit
          them to the supplier&apos;s chart.
        </p>
      </section>

      <section aria-labelledby="placements-h">
        <h2 id="placements-h" className="text-sm font-semibold uppercase tracking-wider text-ink-500">
          Prints on this proof
        </h2>
        <ul className="mt-2 space-y-1">
          {doc.placements.map((p) => {
            const shown = (warningsById[p.id] ?? []).filter((w) => w.severity !== "info");
            const count = shown.length;
            const errors = shown.some((w) => w.severity === "error");
            return (
              <li key={p.id} className={`rounded-lg ${selected?.id === p.id ? "bg-patina-100 text-patina-900" : ""}`}>
                <button
                  type="button"
                  onClick={() => props.onSelect(p.id)}
                  aria-current={selected?.id === p.id ? "true" : undefined}
                  className={`flex w-full items-center justify-between gap-2 rounded-lg px-3 py-2 text-left text-sm ${selected?.id === p.id ? "" : "hover:bg-paper-200"}`}
                >
                  <span className="min-w-0">
                    <span className="block font-medium">{LOCATION_LABELS[p.location]}</span>
                    <span className="block truncate text-xs text-ink-600">
                      {artName(p.artworkId)} · {sideOf(p.location)}
                    </span>
                  </span>
                  {count ? null : <span className="text-xs text-patina-700">fits</span>}
                </button>
                {count ? (
                  <button
                    type="button"
                    data-testid="print-warning-summary"
                    onClick={() => showWarningsOf(p.id)}
                    className={`mx-3 mb-2 -mt-1 block rounded-md px-2 py-0.5 text-left text-xs font-medium underline-offset-2 hover:underline ${errors ? "bg-brick-100 text-brick-800" : "bg-ochre-100 text-ochre-800"}`}
                  >
                    {count} {count === 1 ? "warning" : "warnings"}: {shortLabels(shown).join(", ")}
                  </button>
                ) : null}
              </li>
            );
          })}
        </ul>
        {props.editable && props.artworks.length ? (
          <form
            className="mt-3 grid grid-cols-[1fr_auto] items-end gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              if (newArt) props.onAdd(newArt, newLocation);
            }}
          >
            {/* Art names are long: the menu takes the whole row so a name is never cut off. */}
            <div className="col-span-2">
              <label htmlFor="new-art" className="mb-1 block text-xs font-medium text-ink-600">
                Art
              </label>
              <select id="new-art" className="field-input py-1.5 text-sm" value={newArt} onChange={(e) => setNewArt(e.target.value)}>
                {props.artworks.map((a) => (
                  <option key={a.id} value={a.id}>
                    {a.name}
                  </option>
                ))}
              </select>
            </div>
            <div>
              <label htmlFor="new-loc" className="mb-1 block text-xs font-medium text-ink-600">
                Location
              </label>
              <select id="new-loc" className="field-input py-1.5 text-sm" value={newLocation} onChange={(e) => setNewLocation(e.target.value as PrintLocation)}>
                {props.locations.map((l) => (
                  <option key={l.value} value={l.value}>
                    {l.label}
                  </option>
                ))}
              </select>
            </div>
            <button type="submit" className="btn-quiet px-3 py-1.5">
              Place
            </button>
          </form>
        ) : null}
        {props.editable && props.uploadSlot ? (
          <details className="mt-3">
            <summary className="cursor-pointer text-sm font-medium text-patina-700">Upload art for this client</summary>
            <div className="mt-2">{props.uploadSlot}</div>
          </details>
        ) : null}
      </section>

      {selected ? (
        <section aria-labelledby="sel-h" data-testid="inspector-selected">
          <div className="flex items-baseline justify-between">
            <h2 id="sel-h" className="text-sm font-semibold uppercase tracking-wider text-ink-500">
              {LOCATION_LABELS[selected.location]}
            </h2>
            {props.editable ? (
              <button type="button" className="text-xs text-brick-700 hover:underline" onClick={() => props.onRemove(selected.id)}>
                Remove print
              </button>
            ) : null}
          </div>
          <div className="mt-3 grid grid-cols-2 gap-3">
            <LengthField label="Width" valueIn={selected.widthIn} unit={unit} disabled={!props.editable} onCommit={(v) => props.onResize(selected.id, { widthIn: v })} />
            <LengthField label="Height" valueIn={selected.heightIn} unit={unit} disabled={!props.editable} onCommit={(v) => props.onResize(selected.id, { heightIn: v })} />
            <LengthField
              label="From center"
              valueIn={selected.offsetFromCenterIn}
              unit={unit}
              allowNegative
              disabled={!props.editable}
              hint={selected.offsetFromCenterIn === 0 ? "Centered" : selected.offsetFromCenterIn > 0 ? "Toward viewer's right" : "Toward viewer's left"}
              onCommit={(v) => props.onPatch(selected.id, { offsetFromCenterIn: v })}
            />
            <LengthField label={blank.category === "tote" ? "Below top edge" : "Below collar"} valueIn={selected.belowCollarIn} unit={unit} allowNegative disabled={!props.editable} hint="Top of the print" onCommit={(v) => props.onPatch(selected.id, { belowCollarIn: v })} />
            <div>
              <label htmlFor="rotation" className="mb-1 block text-xs font-medium text-ink-600">
                Rotation
              </label>
              <input
                id="rotation"
                type="number"
                step={0.5}
                min={-180}
                max={180}
                className="field-input measure py-1.5 text-sm"
                value={Math.round(selected.rotationDeg * 100) / 100}
                disabled={!props.editable}
                onChange={(e) => {
                  const v = Number(e.target.value);
                  if (Number.isFinite(v) && v >= -180 && v <= 180) props.onPatch(selected.id, { rotationDeg: v });
                }}
              />
            </div>
            <label className="flex items-end gap-2 pb-2 text-sm">
              <input type="checkbox" className="accent-patina-600" checked={props.keepAspect} onChange={(e) => props.onKeepAspect(e.target.checked)} />
              Keep proportions
            </label>
          </div>
          <ArtAdvice
            placement={selected}
            artwork={props.artworks.find((a) => a.id === selected.artworkId)}
            blank={blank}
            sizeRow={row}
            method={props.method}
            editable={props.editable}
            unit={unit}
            onApply={(patch) => props.onPatch(selected.id, patch)}
          />
          <div ref={warningsBox} tabIndex={-1} role="group" aria-label={`Checks for the ${LOCATION_LABELS[selected.location].toLowerCase()} on size ${row.size}`} className="mt-4 space-y-2 rounded-lg focus-visible:outline focus-visible:outline-2 focus-visible:outline-patina-500" aria-live="polite" data-testid="print-warnings">
            {(warningsById[selected.id] ?? []).length === 0 ? (
              <p className="rounded-lg border border-patina-200 bg-patina-100 px-3 py-2 text-sm text-patina-800">Fits this size: clear of the seams and within the print area.</p>
            ) : (
              (warningsById[selected.id] ?? []).map((w, i) => (
                <p key={`${w.code}-${i}`} data-code={w.code} className={`rounded-lg border px-3 py-2 text-sm ${TONE[w.severity]}`}>
                  {w.message}
                </p>
              ))
            )}
          </div>
        </section>
      ) : (
        <p className="text-sm text-ink-500">Select a print on the garment or in the list to size and place it.</p>
      )}

      <section className="border-t border-paper-300 pt-4 text-xs text-ink-500">
        <p>
          {props.calibrated ? "This screen is calibrated." : "This screen is not calibrated (96 px per inch assumed)."}{" "}
          <button type="button" className="font-medium text-patina-700 underline" onClick={props.onCalibrate}>
            {props.calibrated ? "Calibrate again" : "Calibrate"}
          </button>
        </p>
        <p className="mt-1">Arrow keys nudge 1/8 in; Shift+arrow 1 in. Drag snaps to the center line and to 1/8 in.</p>
      </section>
    </div>
  );
}

/** Print quality at the placed size, and one-click sizes from the trade's rules of thumb. */
function ArtAdvice(props: {
  placement: Placement;
  artwork: EditorArtwork | undefined;
  blank: EditorBlank;
  sizeRow: EditorBlank["sizeChart"][number];
  method: DecorationMethod;
  editable: boolean;
  unit: LengthUnit;
  onApply: (patch: PlacementPatch) => void;
}) {
  const { placement, artwork, blank, sizeRow, unit, editable } = props;
  // Sizing runs the checks a few times; keep it to real changes (the inspector re-renders during a drag).
  const sizing = useMemo(() => {
    if (!artwork || !editable) return null;
    const aspect = artwork.inkWidthPx / artwork.inkHeightPx;
    let spec;
    try {
      spec = locationSpec({ location: placement.location, category: blank.category, group: sizeRow.group, measurements: sizeRow.measurements });
    } catch {
      return null;
    }
    const advice = suggestSize({ shape: artwork.shape ?? "square", aspect, group: sizeRow.group, maxWidthIn: spec.maxWidth, maxHeightIn: spec.maxHeight, unit });
    const fill = fillPrintArea({ aspect, maxWidthIn: spec.maxWidth, maxHeightIn: spec.maxHeight, unit });
    // Each button puts its size where it passes the checks: in place if it fits there, else on the usual spot.
    const place = (size: { widthIn: number; heightIn: number }) =>
      placeSuggestedSize({ placement, size, category: blank.category, group: sizeRow.group, measurements: sizeRow.measurements, sizeLabel: sizeRow.size });
    return { advice, suggestedAt: place(advice), filled: place(fill)?.placement ?? null };
  }, [artwork, editable, placement, blank.category, sizeRow, unit]);
  if (!artwork) return null;
  const quality = assessQuality({
    isVector: artwork.isVector,
    inkWidthPx: artwork.inkWidthPx,
    inkHeightPx: artwork.inkHeightPx,
    widthIn: placement.widthIn,
    heightIn: placement.heightIn,
    method: props.method,
  });
  const shape = artwork.shape ?? "square";
  const advice = sizing?.advice ?? null;
  const suggestedAt = sizing?.suggestedAt ?? null;
  const suggested = suggestedAt?.placement ?? null;
  const filled = sizing?.filled ?? null;
  const patchOf = (p: Placement): PlacementPatch => ({ widthIn: p.widthIn, heightIn: p.heightIn, offsetFromCenterIn: p.offsetFromCenterIn, belowCollarIn: p.belowCollarIn, rotationDeg: p.rotationDeg });
  const sizeText = (p: Placement) => `${formatLength(p.widthIn, unit, { withUnit: false })} × ${formatLength(p.heightIn, unit)}`;
  return (
    <div className="mt-4 space-y-3 rounded-lg border border-paper-300 bg-chalk p-3" data-testid="art-quality">
      <div className="flex items-center justify-between gap-2">
        <span className="text-xs font-medium text-ink-600">Print quality</span>
        <span className={`rounded-full px-2 py-0.5 text-xs font-semibold ${GRADE_TONE[quality.grade]}`} data-testid="ppi-grade" data-grade={quality.grade}>
          {GRADE_LABELS[quality.grade]}
          {quality.ppi !== null ? ` · ${Math.round(quality.ppi)} ppi` : ""}
        </span>
      </div>
      <p className="text-xs text-ink-600">{quality.message}</p>
      {quality.largestIdealWidthIn !== null ? (
        <p className="measure text-xs text-ink-500">
          Largest at 300 ppi: {quality.largestIdealWidthIn.toFixed(2)} × {quality.largestIdealHeightIn!.toFixed(2)} in
        </p>
      ) : null}
      {artwork.colourCount ? (
        <p className="text-xs text-ink-500">
          About {artwork.colourCount} colour{artwork.colourCount === 1 ? "" : "s"} · {SHAPE_LABELS[shape].toLowerCase()} art
        </p>
      ) : null}
      {advice && (suggested || filled) && props.editable ? (
        <div className="space-y-2 border-t border-paper-200 pt-2">
          <div className="flex flex-wrap gap-2">
            {suggested ? (
              <button type="button" className="btn-quiet px-2.5 py-1 text-xs" onClick={() => props.onApply(patchOf(suggested))}>
                Suggested size ({sizeText(suggested)})
              </button>
            ) : null}
            {filled ? (
              <button type="button" className="btn-quiet px-2.5 py-1 text-xs" title={sizeText(filled)} onClick={() => props.onApply(patchOf(filled))}>
                Fill print area
              </button>
            ) : null}
          </div>
          <p className="text-xs text-ink-500">
            {advice.rule}
            {suggestedAt?.where === "usual-spot" ? " At this size the print moves to its usual spot, where it fits." : ""}
          </p>
        </div>
      ) : null}
    </div>
  );
}
