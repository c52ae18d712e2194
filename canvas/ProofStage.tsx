"use client";

import type Konva from "konva";
import { memo, useEffect, useMemo, useRef, useState } from "react";
// Konva's core and the five shapes drawn here, not the whole library (its filters and other shapes).
import "konva/lib/shapes/Image";
import "konva/lib/shapes/Line";
import "konva/lib/shapes/Rect";
import "konva/lib/shapes/Text";
import "konva/lib/shapes/Transformer";
import { Group, Image as KonvaImage, Layer, Line, Rect, Stage, Text, Transformer } from "react-konva/lib/ReactKonvaCore";
import type { LocationSpec } from "@/lib/garments/locations";
import type { Point } from "@/lib/garments/types";
import type { Silhouette } from "@/lib/garments/silhouette";
import type { WarningFlag } from "@/lib/placement/checks";
import type { Placement } from "@/lib/placement/model";
import { MIN_HANDLE_SIDE_IN, snapArtSize } from "@/lib/editor/snap";
import { keepInside, rulerTicks, rulerTicksCm, scaleOf, snapArtPosition, toStage, type View } from "@/lib/editor/view";
import type { LengthUnit } from "@/lib/units";
import { formatLength } from "@/lib/units";
import { inkOn, shade } from "./colour";
import { PROOF_DRAWN_MARK } from "@/lib/perf-marks";
import { printMarks } from "./marks";
import { snapHandleBox } from "./transform-snap";

export type ArtImage = { id: string; image: HTMLImageElement | null };

export type PlacementCommit = Partial<Pick<Placement, "widthIn" | "heightIn" | "offsetFromCenterIn" | "belowCollarIn" | "rotationDeg">>;

type Props = {
  width: number;
  height: number;
  view: View;
  silhouette: Silhouette;
  colourHex: string;
  specs: LocationSpec[];
  placements: Placement[];
  images: Record<string, HTMLImageElement | undefined>;
  selectedId: string | null;
  unit: LengthUnit;
  editable: boolean;
  keepAspect: boolean;
  onSelect: (id: string | null) => void;
  onCommit: (id: string, patch: PlacementCommit) => void;
  onPan: (dx: number, dy: number) => void;
  onLiveChange?: (id: string, patch: PlacementCommit) => void;
  /** Review views: dimension callouts on each print. */
  callouts?: boolean;
  /** Review views: numbered pins in garment inches. */
  pins?: Array<{ id: string; n: number; xIn: number; yIn: number; resolved: boolean; active?: boolean }>;
  /** A tap or click on the garment (not a drag), in garment inches. */
  onGarmentClick?: (point: Point) => void;
  /** A simple body figure drawn behind the garment (worn view). */
  figure?: Point[][];
  /** Called once, after the first frame that shows the garment with every print's art. */
  onDrawn?: () => void;
  /** The editor's warnings per placement id (code and severity): prints that do not fit get an outline and a tag. */
  flags?: Record<string, WarningFlag[]>;
};

export const RULER_PX = 26;
const SNAP_PX = 8;

function flat(points: readonly Point[], view: View): number[] {
  const out: number[] = [];
  for (const p of points) {
    const s = toStage(view, p);
    out.push(s.x, s.y);
  }
  return out;
}

/** The garment at true scale, its guides, the art, and rulers. A projection of the placement model. */
export default function ProofStage(props: Props) {
  const { view, silhouette, colourHex, width, height } = props;
  const s = scaleOf(view);
  const ink = inkOn(colourHex);
  const transformer = useRef<Konva.Transformer>(null);
  const nodes = useRef<Record<string, Konva.Image | null>>({});
  const panning = useRef<{ x: number; y: number } | null>(null);
  const travelled = useRef(0);
  // The print Konva owns during a drag or resize; its mark comes back when the gesture ends.
  const [moving, setMoving] = useState<string | null>(null);
  const marks = useMemo(
    () => (props.flags ? printMarks({ placements: props.placements, flags: props.flags, view, skip: moving, minY: RULER_PX + 2 }) : []),
    [props.flags, props.placements, view, moving],
  );

  // Once per page: the first frame with the garment and every print's art on it is marked, so the
  // time a client waits for the mock-up can be measured (the browser's LCP does not see a canvas).
  const artReady = props.placements.every((p) => !p.artworkId || props.images[p.artworkId]);
  const onDrawn = useRef(props.onDrawn);
  useEffect(() => {
    onDrawn.current = props.onDrawn;
  });
  const drawnOnce = useRef(false);
  useEffect(() => {
    if (!artReady || drawnOnce.current || typeof performance === "undefined") return;
    // Konva draws on the next animation frame; the mark goes after that frame has been painted.
    let second = 0;
    const first = requestAnimationFrame(() => {
      second = requestAnimationFrame(() => {
        if (performance.getEntriesByName(PROOF_DRAWN_MARK).length === 0) performance.mark(PROOF_DRAWN_MARK);
        drawnOnce.current = true;
        onDrawn.current?.();
      });
    });
    return () => {
      cancelAnimationFrame(first);
      cancelAnimationFrame(second);
    };
  }, [artReady]);

  useEffect(() => {
    const tr = transformer.current;
    if (!tr) return;
    const node = props.selectedId ? nodes.current[props.selectedId] : null;
    tr.nodes(node && props.editable ? [node] : []);
    tr.getLayer()?.batchDraw();
  }, [props.selectedId, props.editable, props.placements, view]);



  /** A drag moved the art: its position was snapped on the way (dragBoundFunc); its size is unchanged. */
  function commitDrag(p: Placement, node: Konva.Image) {
    setMoving(null);
    props.onCommit(p.id, {
      offsetFromCenterIn: (node.x() - view.originX) / s,
      belowCollarIn: (node.y() - view.originY) / s - p.heightIn / 2,
    });
  }

  /**
   * A resize or turn ended. Konva changed scaleX/scaleY: fold them into width and height. A resize
   * snaps its size to 1/8 in (as boundBoxFunc did on the way) and then its position, as drags do;
   * a turn alone keeps size and position as they were.
   */
  function commitTransform(p: Placement, node: Konva.Image) {
    setMoving(null);
    const asked = { widthIn: (node.width() * node.scaleX()) / s, heightIn: (node.height() * node.scaleY()) / s };
    const size = snapArtSize({ before: { widthIn: p.widthIn, heightIn: p.heightIn }, after: asked, proportional: props.keepAspect });
    const resized = size.widthIn !== p.widthIn || size.heightIn !== p.heightIn;
    const centreXIn = (node.x() - view.originX) / s;
    const centreYIn = (node.y() - view.originY) / s;
    const at = resized
      ? snapArtPosition({ centreXIn, topIn: centreYIn - size.heightIn / 2, snapPx: SNAP_PX, scale: s, snapToCentre: true })
      : { offsetFromCenterIn: centreXIn, belowCollarIn: centreYIn - size.heightIn / 2 };
    const widthPx = size.widthIn * s;
    const heightPx = size.heightIn * s;
    node.scaleX(1);
    node.scaleY(1);
    node.width(widthPx);
    node.height(heightPx);
    node.offsetX(widthPx / 2);
    node.offsetY(heightPx / 2);
    node.x(view.originX + at.offsetFromCenterIn * s);
    node.y(view.originY + (at.belowCollarIn + size.heightIn / 2) * s);
    props.onCommit(p.id, {
      widthIn: size.widthIn,
      heightIn: size.heightIn,
      offsetFromCenterIn: at.offsetFromCenterIn,
      belowCollarIn: at.belowCollarIn,
      rotationDeg: Math.round(node.rotation() * 100) / 100,
    });
  }

  return (
    <Stage
      width={width}
      height={height}
      onMouseDown={(e) => {
        travelled.current = 0;
        const target = e.target;
        const onArt = target.getClassName() === "Image" || target.getParent()?.getClassName() === "Transformer";
        if (!onArt) {
          props.onSelect(null);
          const pos = e.target.getStage()?.getPointerPosition();
          if (pos) panning.current = pos;
          travelled.current = 0;
        }
      }}
      onClick={(e) => {
        if (!props.onGarmentClick || travelled.current > 4) return;
        const pos = e.target.getStage()?.getPointerPosition();
        if (pos && pos.x > RULER_PX && pos.y > RULER_PX) props.onGarmentClick({ x: (pos.x - view.originX) / s, y: (pos.y - view.originY) / s });
      }}
      onTap={(e) => {
        if (!props.onGarmentClick) return;
        const pos = e.target.getStage()?.getPointerPosition();
        if (pos && pos.x > RULER_PX && pos.y > RULER_PX) props.onGarmentClick({ x: (pos.x - view.originX) / s, y: (pos.y - view.originY) / s });
      }}
      onMouseMove={(e) => {
        if (!panning.current) return;
        const pos = e.target.getStage()?.getPointerPosition();
        if (!pos) return;
        travelled.current += Math.abs(pos.x - panning.current.x) + Math.abs(pos.y - panning.current.y);
        props.onPan(pos.x - panning.current.x, pos.y - panning.current.y);
        panning.current = pos;
      }}
      onMouseUp={() => (panning.current = null)}
      onMouseLeave={() => (panning.current = null)}
      onWheel={(e) => {
        e.evt.preventDefault();
        props.onPan(-e.evt.deltaX, -e.evt.deltaY);
      }}
    >
      <GarmentLayers view={view} silhouette={silhouette} colourHex={colourHex} width={width} height={height} figure={props.figure} specs={props.specs} />

      <Layer>
        {props.placements.map((p) => {
          const centre = toStage(view, { x: p.offsetFromCenterIn, y: p.belowCollarIn + p.heightIn / 2 });
          const w = p.widthIn * s;
          const h = p.heightIn * s;
          return (
            <KonvaImage
              key={p.id}
              name="art"
              id={`art-${p.id}`}
              ref={(node) => {
                nodes.current[p.id] = node;
              }}
              image={props.images[p.artworkId ?? ""]}
              x={centre.x}
              y={centre.y}
              width={w}
              height={h}
              offsetX={w / 2}
              offsetY={h / 2}
              rotation={p.rotationDeg}
              draggable={props.editable}
              stroke={props.images[p.artworkId ?? ""] ? undefined : ink.guide}
              strokeWidth={1}
              onMouseDown={() => props.onSelect(p.id)}
              onTap={() => props.onSelect(p.id)}
              dragBoundFunc={(pos) => {
                const snapped = snapArtPosition({
                  centreXIn: (pos.x - view.originX) / s,
                  topIn: (pos.y - view.originY) / s - p.heightIn / 2,
                  snapPx: SNAP_PX,
                  scale: s,
                  snapToCentre: true,
                });
                return {
                  x: view.originX + snapped.offsetFromCenterIn * s,
                  y: view.originY + (snapped.belowCollarIn + p.heightIn / 2) * s,
                };
              }}
              onDragStart={() => setMoving(p.id)}
              onTransformStart={() => setMoving(p.id)}
              onDragMove={(e) => {
                const node = e.target;
                props.onLiveChange?.(p.id, {
                  offsetFromCenterIn: (node.x() - view.originX) / s,
                  belowCollarIn: (node.y() - view.originY) / s - p.heightIn / 2,
                });
              }}
              onTransform={(e) => {
                const node = e.target as Konva.Image;
                props.onLiveChange?.(p.id, { widthIn: (node.width() * node.scaleX()) / s, heightIn: (node.height() * node.scaleY()) / s });
              }}
              onDragEnd={(e) => commitDrag(p, e.target as Konva.Image)}
              onTransformEnd={(e) => commitTransform(p, e.target as Konva.Image)}
            />
          );
        })}
        <Transformer
          ref={transformer}
          keepRatio={props.keepAspect}
          enabledAnchors={props.keepAspect ? ["top-left", "top-right", "bottom-left", "bottom-right"] : undefined}
          rotationSnaps={[0, 90, 180, 270]}
          rotationSnapTolerance={2}
          flipEnabled={false}
          anchorSize={9}
          anchorStroke="#2f6f66"
          borderStroke="#2f6f66"
          anchorCornerRadius={2}
          boundBoxFunc={(oldBox, newBox) =>
            // Sides snap to 1/8 in while the handle moves, never under the smallest side, keeping the
            // pivot corner still; the box is always rebuilt from the pointer, so it never sticks.
            snapHandleBox({ oldBox, newBox, scale: s, proportional: props.keepAspect, minIn: MIN_HANDLE_SIDE_IN })
          }
        />
      </Layer>

      {marks.length ? (
        <Layer listening={false} name="fit-marks">
          {marks.map((m) => (
            <Group key={`mark-${m.id}`} name="fit-mark">
              {/* A light halo under the dashes keeps the outline readable on dark and red garments alike. */}
              <Line points={m.points} closed stroke="#fdfdfb" strokeWidth={4} opacity={0.85} />
              <Line points={m.points} closed stroke={m.error ? "#873425" : "#a8412f"} strokeWidth={2} dash={[7, 4]} />
              <Rect x={m.tag.x} y={m.tag.y} width={m.tag.width} height={m.tag.height} cornerRadius={4} fill={m.error ? "#873425" : "#a8412f"} stroke="#fdfdfb" strokeWidth={1} />
              <Text x={m.tag.x + 6} y={m.tag.y + 4} text={m.text} fontSize={11} fontStyle="bold" fill="#fdfdfb" />
            </Group>
          ))}
        </Layer>
      ) : null}

      {props.callouts || props.pins?.length ? (
        <Layer listening={false}>
          {props.callouts ? props.placements.map((p) => <Callouts key={`co-${p.id}`} placement={p} view={view} unit={props.unit} topFrom={silhouette.category === "tote" ? "top edge" : "collar"} width={props.width} height={props.height} />) : null}
          {(props.pins ?? []).map((pin) => {
            const at = toStage(view, { x: pin.xIn, y: pin.yIn });
            return (
              <Group key={pin.id} x={at.x} y={at.y} opacity={pin.resolved ? 0.55 : 1}>
                <Line points={[0, 0, -9, -16, 9, -16]} closed fill={pin.active ? "#b7791f" : "#a8412f"} />
                <Rect x={-11} y={-34} width={22} height={22} cornerRadius={11} fill={pin.active ? "#b7791f" : "#a8412f"} stroke="#fdfdfb" strokeWidth={2} />
                <Text x={-11} y={-29} width={22} align="center" text={String(pin.n)} fontSize={12} fontStyle="bold" fill="#fdfdfb" />
              </Group>
            );
          })}
        </Layer>
      ) : null}
      <MemoRulers width={width} height={height} view={view} unit={props.unit} />
    </Stage>
  );
}

type GarmentLayersProps = Pick<Props, "view" | "silhouette" | "colourHex" | "width" | "height" | "figure" | "specs">;

/**
 * The garment, its seams, guides and print areas. Memoised: dragging art changes none of its
 * props, so Konva never redraws the blurred garment shadow mid-drag.
 */
const GarmentLayers = memo(function GarmentLayers({ view, silhouette, colourHex, width, height, figure, specs }: GarmentLayersProps) {
  const s = scaleOf(view);
  const ink = inkOn(colourHex);
  const garment = useMemo(() => {
    const body = flat(silhouette.outline, view);
    const neck = flat(silhouette.neckline, view);
    return {
      body,
      neck,
      hood: silhouette.hood ? flat(silhouette.hood, view) : null,
      pocket: silhouette.pocket ? flat(silhouette.pocket, view) : null,
      sleeves: (silhouette.sleeves ?? []).map((p) => flat(p, view)),
      handles: (silhouette.handles ?? []).map((p) => flat(p, view)),
      rightEdge: flat(silhouette.bodyEdge, view),
      leftEdge: flat(silhouette.bodyEdge.map((p) => ({ x: -p.x, y: p.y })), view),
    };
  }, [silhouette, view]);

  const top = toStage(view, { x: 0, y: silhouette.hps.left.y - (silhouette.hood && silhouette.hoodLayer === "behind" ? 12 : 2) });
  const bottom = toStage(view, { x: 0, y: silhouette.hemY + 2 });
  const collarLines: number[] = [];
  for (let inch = 1; inch <= Math.min(16, Math.floor(silhouette.lowerBoundaryY)); inch += 1) collarLines.push(inch);
  return (
    <>
      <Layer listening={false}>
        <Rect x={0} y={0} width={width} height={height} fill="#ece6d9" />
        {(figure ?? []).map((shape, i) => (
          <Line key={`fig${i}`} points={flat(shape, view)} closed fill="#c9b8a6" stroke="#a8957f" strokeWidth={1} />
        ))}
        {garment.handles.slice(1).map((h, i) => (
          <Line key={`hb${i}`} points={h} closed fill={shade(colourHex, -0.12)} stroke={ink.seam} strokeWidth={1} />
        ))}
        {garment.hood && silhouette.hoodLayer === "behind" ? (
          <Line points={garment.hood} closed fill={shade(colourHex, -0.1)} stroke={ink.seam} strokeWidth={1.2} />
        ) : null}
        <Line points={garment.body} closed fill={colourHex} stroke={ink.seam} strokeWidth={1.5} shadowColor="#181a1e" shadowBlur={18} shadowOpacity={0.18} shadowOffsetY={6} />
        {garment.sleeves.map((sl, i) => (
          <Line key={`sl${i}`} points={sl} closed stroke={ink.seam} strokeWidth={1} dash={[4, 3]} />
        ))}
        {garment.neck.length ? <Line points={garment.neck} stroke={ink.seam} strokeWidth={2.5} lineCap="round" /> : null}
        {garment.pocket ? <Line points={garment.pocket} closed stroke={ink.seam} strokeWidth={1.2} dash={[5, 3]} /> : null}
        {garment.hood && silhouette.hoodLayer === "over" ? (
          <Line points={garment.hood} closed fill={shade(colourHex, 0.05)} stroke={ink.seam} strokeWidth={1.2} />
        ) : null}
        {garment.handles.slice(0, 1).map((h, i) => (
          <Line key={`hf${i}`} points={h} closed fill={shade(colourHex, -0.05)} stroke={ink.seam} strokeWidth={1} />
        ))}
      </Layer>

      <Layer listening={false}>
        {/* Side seams and armhole seams: art must keep clear of these. */}
        <Line points={garment.rightEdge} stroke="#b7791f" strokeWidth={2} opacity={0.9} />
        <Line points={garment.leftEdge} stroke="#b7791f" strokeWidth={2} opacity={0.9} />
        {/* Center line. */}
        <Line points={[top.x, top.y, bottom.x, bottom.y]} stroke={ink.guide} strokeWidth={1} dash={[6, 4]} opacity={0.8} />
        {/* Whole inches below the collar, across the center. */}
        {silhouette.neckline.length
          ? collarLines.map((inch) => {
              const a = toStage(view, { x: -1.5, y: inch });
              const b = toStage(view, { x: 1.5, y: inch });
              return (
                <Group key={`c${inch}`}>
                  <Line points={[a.x, a.y, b.x, b.y]} stroke={ink.guide} strokeWidth={1} opacity={0.55} />
                  {s >= 10 ? <Text x={b.x + 4} y={b.y - 6} text={`${inch}″`} fontSize={10} fill={ink.label} opacity={0.8} /> : null}
                </Group>
              );
            })
          : null}
        {specs.map((spec) => {
          const a = toStage(view, { x: spec.printArea.x, y: spec.printArea.y });
          const area = spec.printArea;
          const centre = toStage(view, { x: area.x + area.width / 2, y: area.y + area.height / 2 });
          return (
            <Group key={spec.location} x={centre.x} y={centre.y} rotation={spec.axisRotationDeg}>
              <Rect
                x={-(area.width * s) / 2}
                y={-(area.height * s) / 2}
                width={area.width * s}
                height={area.height * s}
                stroke={ink.guide}
                strokeWidth={1.5}
                dash={[8, 5]}
              />
              {/* Named just under its bottom edge: clear of the width callout above the art and of the art itself. */}
              <Text x={-(area.width * s) / 2} y={(area.height * s) / 2 + 3} width={Math.max(0, area.width * s)} wrap="none" ellipsis text={`${spec.label} print area`} fontSize={11} fill={ink.label} visible={a.y > RULER_PX && area.width * s > 60} />
            </Group>
          );
        })}
      </Layer>

    </>
  );
});

const MemoRulers = memo(Rulers);

function Rulers({ width, height, view, unit }: { width: number; height: number; view: View; unit: LengthUnit }) {
  const s = scaleOf(view);
  const fromX = (RULER_PX - view.originX) / s;
  const toX = (width - view.originX) / s;
  const fromY = (RULER_PX - view.originY) / s;
  const toY = (height - view.originY) / s;
  const marks: Array<{ pos: number; len: number; label?: string; horizontal: boolean }> = [];
  if (unit === "in") {
    const len = { inch: 12, half: 8, quarter: 6, eighth: 4 } as const;
    for (const t of rulerTicks(fromX, toX, s)) marks.push({ pos: view.originX + t.at * s, len: len[t.kind], label: t.kind === "inch" && (s >= 14 || t.at % 2 === 0) ? String(Math.abs(t.at)) : undefined, horizontal: true });
    for (const t of rulerTicks(fromY, toY, s)) marks.push({ pos: view.originY + t.at * s, len: len[t.kind], label: t.kind === "inch" && (s >= 14 || t.at % 2 === 0) ? String(t.at) : undefined, horizontal: false });
  } else {
    const len = { cm: 12, half: 8, mm: 4 } as const;
    for (const t of rulerTicksCm(fromX, toX, s)) marks.push({ pos: view.originX + t.atIn * s, len: len[t.kind], label: t.kind === "cm" && (s / 2.54 >= 14 || t.cm % 2 === 0) ? String(Math.abs(t.cm)) : undefined, horizontal: true });
    for (const t of rulerTicksCm(fromY, toY, s)) marks.push({ pos: view.originY + t.atIn * s, len: len[t.kind], label: t.kind === "cm" && (s / 2.54 >= 14 || t.cm % 2 === 0) ? String(t.cm) : undefined, horizontal: false });
  }
  return (
    <Layer listening={false} name="rulers">
      <Rect x={0} y={0} width={width} height={RULER_PX} fill="#fbfaf6" stroke="#ddd4c1" strokeWidth={1} />
      <Rect x={0} y={0} width={RULER_PX} height={height} fill="#fbfaf6" stroke="#ddd4c1" strokeWidth={1} />
      {marks.map((m, i) =>
        m.horizontal ? (
          <Group key={i}>
            <Line points={[m.pos, RULER_PX, m.pos, RULER_PX - m.len]} stroke="#4c515a" strokeWidth={1} />
            {m.label ? <Text x={m.pos + 2} y={3} text={m.label} fontSize={10} fill="#363a41" /> : null}
          </Group>
        ) : (
          <Group key={i}>
            <Line points={[RULER_PX, m.pos, RULER_PX - m.len, m.pos]} stroke="#4c515a" strokeWidth={1} />
            {m.label ? <Text x={2} y={m.pos + 2} text={m.label} fontSize={10} fill="#363a41" /> : null}
          </Group>
        ),
      )}
      <Rect x={0} y={0} width={RULER_PX} height={RULER_PX} fill="#f6f3ec" />
      <Text x={4} y={8} text={unit} fontSize={10} fill="#686e78" />
    </Layer>
  );
}

/** Width, height, distance below the collar and offset from center, drawn on the garment. */
function Callouts({ placement: p, view, unit, topFrom, width: stageW, height: stageH }: { placement: Placement; view: View; unit: LengthUnit; topFrom: string; width: number; height: number }) {
  const s = scaleOf(view);
  const topLeft = toStage(view, { x: p.offsetFromCenterIn - p.widthIn / 2, y: p.belowCollarIn });
  const w = p.widthIn * s;
  const h = p.heightIn * s;
  const centreX = view.originX + p.offsetFromCenterIn * s;
  const collarY = view.originY;
  const ink = "#b7791f";
  const label = (text: string, x: number, y: number, align: "center" | "left" | "right" = "center") => {
    // Bold 11 px digits and letters run about 7 px each; the box leaves 5 px each side.
    const w = text.length * 7 + 10;
    const left = align === "center" ? -w / 2 : align === "left" ? -3 : -w + 3;
    // Never under the rulers or past the stage's edge: the number is the point of the callout.
    const at = keepInside({ left: x + left, top: y - 9, width: w, height: 18 }, { left: RULER_PX + 2, top: RULER_PX + 2, right: stageW - 2, bottom: stageH - 2 });
    return (
      <Group x={at.left} y={at.top}>
        <Rect x={0} y={0} width={w} height={18} cornerRadius={4} fill="#fdfdfb" opacity={0.92} />
        <Text x={5} y={3} text={text} fontSize={11} fontStyle="bold" fill="#23262b" />
      </Group>
    );
  };
  const offset = p.offsetFromCenterIn;
  return (
    <Group>
      <Line points={[topLeft.x, topLeft.y - 14, topLeft.x + w, topLeft.y - 14]} stroke={ink} strokeWidth={1.5} />
      <Line points={[topLeft.x, topLeft.y - 19, topLeft.x, topLeft.y - 9]} stroke={ink} strokeWidth={1.5} />
      <Line points={[topLeft.x + w, topLeft.y - 19, topLeft.x + w, topLeft.y - 9]} stroke={ink} strokeWidth={1.5} />
      {label(`${formatLength(p.widthIn, unit)} wide`, topLeft.x + w / 2, topLeft.y - 14)}
      <Line points={[topLeft.x + w + 14, topLeft.y, topLeft.x + w + 14, topLeft.y + h]} stroke={ink} strokeWidth={1.5} />
      <Line points={[topLeft.x + w + 9, topLeft.y, topLeft.x + w + 19, topLeft.y]} stroke={ink} strokeWidth={1.5} />
      <Line points={[topLeft.x + w + 9, topLeft.y + h, topLeft.x + w + 19, topLeft.y + h]} stroke={ink} strokeWidth={1.5} />
      {label(`${formatLength(p.heightIn, unit)} high`, topLeft.x + w + 22, topLeft.y + h / 2, "left")}
      {p.belowCollarIn > 0 ? (
        <>
          <Line points={[topLeft.x - 12, collarY, topLeft.x - 12, topLeft.y]} stroke={ink} strokeWidth={1.5} dash={[4, 3]} />
          <Line points={[topLeft.x - 17, collarY, topLeft.x - 7, collarY]} stroke={ink} strokeWidth={1.5} />
          {label(`${formatLength(p.belowCollarIn, unit)} below ${topFrom}`, topLeft.x - 16, collarY + (topLeft.y - collarY) / 2, "right")}
        </>
      ) : null}
      {Math.abs(offset) >= 1 / 16 ? (
        <>
          <Line points={[view.originX, topLeft.y + h + 14, centreX, topLeft.y + h + 14]} stroke={ink} strokeWidth={1.5} dash={[4, 3]} />
          {label(`${formatLength(Math.abs(offset), unit)} from center`, (view.originX + centreX) / 2, topLeft.y + h + 14)}
        </>
      ) : null}
    </Group>
  );
}
