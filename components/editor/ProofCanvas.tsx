"use client";

import dynamic from "next/dynamic";
import { useEffect, useMemo, useRef, useState } from "react";
import type { PlacementCommit } from "@/canvas/ProofStage";
import { locationSpec, sideOf, type LocationSpec } from "@/lib/garments/locations";
import { buildSilhouette } from "@/lib/garments/silhouette";
import type { GarmentCategory, GarmentSide, SizeGroup, GarmentMeasurements } from "@/lib/garments/types";
import { centredOrigin, fitZoom, panToCentre, scaleOf, type View } from "@/lib/editor/view";
import { preload } from "react-dom";
import { GarmentOutline } from "@/components/blanks/GarmentOutline";
import { PROOF_DRAWN_MARK } from "@/lib/perf-marks";
import { bodyFigure } from "@/lib/review/figure";
import type { WarningFlag } from "@/lib/placement/checks";
import type { Placement } from "@/lib/placement/model";
import type { LengthUnit } from "@/lib/units";

/** The Element Timing name of the poster's art images. */
const POSTER_TIMING = "proof-poster-art";

const ProofStage = dynamic(() => import("@/canvas/ProofStage"), {
  ssr: false,
  // The SVG poster stands in while the canvas code loads.
  loading: () => null,
});

export type ArtSource = {
  id: string;
  name: string;
  src: string;
  /** A small copy for the first, server-drawn picture (defaults to `src`). */
  posterSrc?: string;
  inkWidthPx: number;
  inkHeightPx: number;
};

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

/**
 * The proof as plain SVG, in the server's HTML: the garment and its art are on screen before any
 * script runs (a phone on a slow network waits seconds for the canvas code). The canvas takes its
 * place once it has drawn. Each art image carries an Element Timing name, so the page can mark when
 * the client could first see the garment with its art.
 */
function ProofPoster({
  silhouette,
  colourHex,
  placements,
  art,
}: {
  silhouette: ReturnType<typeof buildSilhouette>;
  colourHex: string;
  placements: Placement[];
  art: ArtSource[];
}) {
  return (
    <div className="pointer-events-none absolute inset-0" data-testid="proof-poster">
      <GarmentOutline
        silhouette={silhouette}
        fill={colourHex}
        align="middle"
        className="h-full w-full p-6"
        title="The proof, drawing at true scale"
      >
        {placements.map((p) => {
          const a = art.find((x) => x.id === p.artworkId);
          if (!a) return null;
          const href = a.posterSrc ?? a.src;
          // Fetched first, ahead of the scripts: it is what the client came to see.
          if (!href.startsWith("data:")) preload(href, { as: "image", fetchPriority: "high" });
          const cx = p.offsetFromCenterIn;
          const cy = p.belowCollarIn + p.heightIn / 2;
          return (
            <image
              key={p.id}
              href={href}
              x={cx - p.widthIn / 2}
              y={p.belowCollarIn}
              width={p.widthIn}
              height={p.heightIn}
              preserveAspectRatio="none"
              transform={p.rotationDeg ? `rotate(${p.rotationDeg} ${cx} ${cy})` : undefined}
              {...{ elementtiming: POSTER_TIMING }}
            />
          );
        })}
      </GarmentOutline>
    </div>
  );
}

/**
 * Marks the first paint of the poster's garment and art with their own paint time (Element Timing
 * renderTime), so the mark says when the client saw them, not when this script got round to it.
 */
function usePosterMark(artCount: number) {
  useEffect(() => {
    if (
      typeof PerformanceObserver === "undefined" ||
      !PerformanceObserver.supportedEntryTypes?.includes("element")
    )
      return;
    const times: number[] = [];
    const observer = new PerformanceObserver((list) => {
      for (const e of list.getEntries() as Array<
        PerformanceEntry & { identifier?: string; renderTime?: number; loadTime?: number }
      >) {
        if (e.identifier !== POSTER_TIMING) continue;
        times.push(e.renderTime || e.loadTime || e.startTime);
      }
      if (times.length < artCount || performance.getEntriesByName(PROOF_DRAWN_MARK).length > 0) return;
      observer.disconnect();
      // The garment is plain SVG, painted with the page's first contentful paint; the mark is the later of it and the art.
      const garment = performance.getEntriesByName("first-contentful-paint")[0]?.startTime ?? 0;
      performance.mark(PROOF_DRAWN_MARK, { startTime: Math.max(garment, ...times) });
    });
    observer.observe({ type: "element", buffered: true });
    if (artCount === 0) {
      const garment = performance.getEntriesByName("first-contentful-paint")[0]?.startTime;
      if (garment !== undefined && performance.getEntriesByName(PROOF_DRAWN_MARK).length === 0)
        performance.mark(PROOF_DRAWN_MARK, { startTime: garment });
    }
    return () => observer.disconnect();
  }, [artCount]);
}

/** Sizes the stage to its box, keeps the view transform, and draws the proof through ProofStage. */
export function ProofCanvas(props: Props) {
  const box = useRef<HTMLDivElement>(null);
  const [size, setSize] = useState({ width: 0, height: 0 });
  // Pan is kept as the garment point (inches from the garment's middle) at the viewport centre,
  // so zooming keeps that point still; switching side starts centred again.
  const [pan, setPan] = useState<{ side: GarmentSide; x: number; y: number }>({
    side: props.side,
    x: 0,
    y: 0,
  });
  const images = useImages(props.art);
  // The SVG poster shows until the canvas has drawn the garment with its art.
  const [stageDrawn, setStageDrawn] = useState(false);

  const silhouette = useMemo(
    () => buildSilhouette(props.category, props.measurements, props.side),
    [props.category, props.measurements, props.side],
  );
  const figure = useMemo(() => {
    if (!props.worn || !("bodyLength" in props.measurements)) return undefined;
    return bodyFigure({
      silhouette,
      bodyLength: props.measurements.bodyLength,
      chestWidth: props.measurements.chestWidth,
      neckWidth: props.measurements.neckWidth,
    });
  }, [props.worn, props.measurements, silhouette]);
  const garmentBox = useMemo(() => {
    const pts = [
      ...silhouette.outline,
      ...(silhouette.hood ?? []),
      ...(silhouette.handles ?? []).flat(),
      ...(figure ?? []).flat(),
    ];
    const xs = pts.map((p) => p.x);
    const ys = pts.map((p) => p.y);
    return {
      x: Math.min(...xs),
      y: Math.min(...ys),
      width: Math.max(...xs) - Math.min(...xs),
      height: Math.max(...ys) - Math.min(...ys),
    };
  }, [silhouette, figure]);

  // "Actual size" and the like centre the view on the print they are about.
  // Only a new request moves the view; a later side or size change keeps its own pan.
  const centreOn = props.centreOn;
  const [centredFor, setCentredFor] = useState(0);
  if (centreOn && centreOn.n !== centredFor) {
    setCentredFor(centreOn.n);
    setPan({ side: props.side, ...panToCentre(garmentBox, centreOn) });
  }

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
        ? fitZoom({
            boxWidthIn: garmentBox.width,
            boxHeightIn: garmentBox.height,
            viewportWidth: size.width,
            viewportHeight: size.height,
            pxPerInch: props.pxPerInch,
          })
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
    return {
      originX: centre.originX - panIn.x * scale,
      originY: centre.originY - panIn.y * scale,
      pxPerInch: props.pxPerInch,
      zoom: effectiveZoom,
    };
  }, [effectiveZoom, viewW, viewH, garmentBox, props.pxPerInch, panIn.x, panIn.y]);

  const sidePlacements = props.placements.filter((p) => sideOf(p.location) === props.side);
  usePosterMark(sidePlacements.filter((p) => props.art.some((a) => a.id === p.artworkId)).length);
  const locationKey = [...new Set(sidePlacements.map((p) => p.location))].sort().join(",");
  const specs = useMemo(() => {
    const list: LocationSpec[] = [];
    for (const location of locationKey ? (locationKey.split(",") as Placement["location"][]) : []) {
      try {
        list.push(
          locationSpec({
            location,
            category: props.category,
            group: props.group,
            measurements: props.measurements,
            silhouette,
          }),
        );
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
      {stageDrawn ? null : (
        <ProofPoster
          silhouette={silhouette}
          colourHex={props.colourHex}
          placements={sidePlacements}
          art={props.art}
        />
      )}
      {view && size.width > 0 ? (
        <ProofStage
          onDrawn={() => setStageDrawn(true)}
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
