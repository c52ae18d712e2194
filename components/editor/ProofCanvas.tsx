"use client";

import dynamic from "next/dynamic";
import { useEffect, useMemo, useRef, useState } from "react";
import type { PlacementCommit } from "@/canvas/ProofStage";
import { locationSpec, sideOf, type LocationSpec } from "@/lib/garments/locations";
import { buildSilhouette } from "@/lib/garments/silhouette";
import type { GarmentCategory, GarmentSide, SizeGroup, GarmentMeasurements } from "@/lib/garments/types";
import { centredOrigin, fitZoom, panToCentre, scaleOf, type View } from "@/lib/editor/view";
import { bodyFigure } from "@/lib/review/figure";
import type { WarningFlag } from "@/lib/placement/checks";
import type { Placement } from "@/lib/placement/model";
import type { LengthUnit } from "@/lib/units";

const ProofStage = dynamic(() => import("@/canvas/ProofStage"), {
  ssr: false,
  loading: () => <div className="grid h-full place-items-center text-sm text-ink-500">Drawing the garment…</div>,
});

export type ArtSource = { id: string; name: string; src: string; inkWidthPx: number; inkHeightPx: number };

type Props = {
  category: GarmentCategory;
  group: SizeGroup;
  measurements: GarmentMeasurements;
  side: GarmentSide;
  colourHex: string;
  placements: Placement[];
  art: ArtSource[];
  selectedId: string | null;
  unit: LengthUnit;
  zoom: number | null;
  pxPerInch: number;
  editable: boolean;
  keepAspect: boolean;
  onZoomChange: (zoom: number) => void;
  /** Asks the view to centre on a garment point (inches); a new `n` asks again. */
  centreOn?: { n: number; x: number; y: number } | null;
  onSelect: (id: string | null) => void;
  onCommit: (id: string, patch: PlacementCommit) => void;
  onLiveChange?: (id: string, patch: PlacementCommit) => void;
  className?: string;
  callouts?: boolean;
  pins?: Array<{ id: string; n: number; xIn: number; yIn: number; resolved: boolean; active?: boolean }>;
  onGarmentClick?: (point: { x: number; y: number }) => void;
  worn?: boolean;
  /** The editor's warnings per placement id; prints that do not fit are marked on the canvas. */
  flags?: Record<string, WarningFlag[]>;
};

function useImages(art: ArtSource[]) {
  const [images, setImages] = useState<Record<string, HTMLImageElement | undefined>>({});
  useEffect(() => {
    let cancelled = false;
    for (const a of art) {
      if (images[a.id]) continue;
      const img = new window.Image();
      img.decoding = "async";
      img.onload = () => !cancelled && setImages((prev) => ({ ...prev, [a.id]: img }));
      img.src = a.src;
    }
    return () => {
      cancelled = true;
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [art]);
  return images;
}

/** Sizes the stage to its box, keeps the view transform, and draws the proof through ProofStage. */
export function ProofCanvas(props: Props) {
  const box = useRef<HTMLDivElement>(null);
  const [size, setSize] = useState({ width: 0, height: 0 });
  // Pan is kept as the garment point (inches from the garment's middle) at the viewport centre,
  // so zooming keeps that point still; switching side starts centred again.
  const [pan, setPan] = useState<{ side: GarmentSide; x: number; y: number }>({ side: props.side, x: 0, y: 0 });
  const images = useImages(props.art);

  const silhouette = useMemo(() => buildSilhouette(props.category, props.measurements, props.side), [props.category, props.measurements, props.side]);
  const figure = useMemo(() => {
    if (!props.worn || !("bodyLength" in props.measurements)) return undefined;
    return bodyFigure({ silhouette, bodyLength: props.measurements.bodyLength, chestWidth: props.measurements.chestWidth, neckWidth: props.measurements.neckWidth });
  }, [props.worn, props.measurements, silhouette]);
  const garmentBox = useMemo(() => {
    const pts = [...silhouette.outline, ...(silhouette.hood ?? []), ...(silhouette.handles ?? []).flat(), ...(figure ?? []).flat()];
    const xs = pts.map((p) => p.x);
    const ys = pts.map((p) => p.y);
    return { x: Math.min(...xs), y: Math.min(...ys), width: Math.max(...xs) - Math.min(...xs), height: Math.max(...ys) - Math.min(...ys) };
  }, [silhouette, figure]);

  // "Actual size" and the like centre the view on the print they are about.
  const centreOn = props.centreOn;
  useEffect(() => {
    if (!centreOn) return;
    setPan({ side: props.side, ...panToCentre(garmentBox, centreOn) });
    // Only a new request moves the view; a later side or size change keeps its own pan.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [centreOn?.n]);

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const observer = new ResizeObserver(([entry]) => {
      if (!entry) return;
      setSize({ width: Math.floor(entry.contentRect.width), height: Math.floor(entry.contentRect.height) });
    });
    observer.observe(el);
    return () => observer.disconnect();
  }, []);

  const zoom = props.zoom;
  const { onZoomChange } = props;
  const fitted = useMemo(
    () =>
      size.width && size.height
        ? fitZoom({ boxWidthIn: garmentBox.width, boxHeightIn: garmentBox.height, viewportWidth: size.width, viewportHeight: size.height, pxPerInch: props.pxPerInch })
        : null,
    [size, garmentBox, props.pxPerInch],
  );
  // With no zoom asked for, the first view fits the garment; report it so the controls show it.
  useEffect(() => {
    if (zoom === null && fitted !== null) onZoomChange(fitted);
  }, [zoom, fitted, onZoomChange]);

  const effectiveZoom = zoom ?? fitted;
  const panIn = pan.side === props.side ? pan : { x: 0, y: 0 };
  // One view object per real change of zoom, size or pan, so a drag does not redraw the garment.
  const viewW = size.width;
  const viewH = size.height;
  const view: View | null = useMemo(() => {
    if (effectiveZoom === null || !viewW) return null;
    const scale = props.pxPerInch * effectiveZoom;
    const centre = centredOrigin({ box: garmentBox, viewportWidth: viewW, viewportHeight: viewH, scale });
    return { originX: centre.originX - panIn.x * scale, originY: centre.originY - panIn.y * scale, pxPerInch: props.pxPerInch, zoom: effectiveZoom };
  }, [effectiveZoom, viewW, viewH, garmentBox, props.pxPerInch, panIn.x, panIn.y]);

  const sidePlacements = props.placements.filter((p) => sideOf(p.location) === props.side);
  const locationKey = [...new Set(sidePlacements.map((p) => p.location))].sort().join(",");
  const specs = useMemo(() => {
    const list: LocationSpec[] = [];
    for (const location of locationKey ? (locationKey.split(",") as Placement["location"][]) : []) {
      try {
        list.push(locationSpec({ location, category: props.category, group: props.group, measurements: props.measurements, silhouette }));
      } catch {
        // A location this garment does not offer: the placement checks say so in words.
      }
    }
    return list;
  }, [locationKey, props.category, props.group, props.measurements, silhouette]);

  const images2 = useMemo(() => {
    const out: Record<string, HTMLImageElement | undefined> = {};
    for (const a of props.art) out[a.id] = images[a.id];
    return out;
  }, [images, props.art]);

  return (
    <div
      ref={box}
      className={`relative h-full w-full overflow-hidden ${props.className ?? ""}`}
      data-testid="proof-canvas"
      data-scale={view ? scaleOf(view) : undefined}
      data-origin-x={view?.originX}
      data-origin-y={view?.originY}
    >
      {view && size.width > 0 ? (
        <ProofStage
          width={size.width}
          height={size.height}
          view={view}
          silhouette={silhouette}
          colourHex={props.colourHex}
          specs={specs}
          placements={sidePlacements}
          images={images2}
          selectedId={props.selectedId}
          unit={props.unit}
          editable={props.editable}
          keepAspect={props.keepAspect}
          onSelect={props.onSelect}
          onCommit={props.onCommit}
          onLiveChange={props.onLiveChange}
          callouts={props.callouts}
          pins={props.pins}
          onGarmentClick={props.onGarmentClick}
          figure={figure}
          flags={props.flags}
          onPan={(dx, dy) => {
            const scale = scaleOf(view);
            setPan((p) => {
              const base = p.side === props.side ? p : { x: 0, y: 0 };
              return { side: props.side, x: base.x - dx / scale, y: base.y - dy / scale };
            });
          }}
        />
      ) : null}
    </div>
  );
}
