import type { Point } from "@/lib/garments/types";
import type { Silhouette } from "@/lib/garments/silhouette";

/**
 * A garment outline as plain SVG, in garment inches. No hooks and no dependencies, so it renders
 * on the server, in client components and in the editor alike.
 *
 * Without `frame` the drawing is fitted to the garment. With `frame` (inches) every garment drawn
 * with the same frame shares one scale, sitting on a common baseline, so sizes compare truly.
 */
export interface GarmentOutlineProps {
  silhouette: Silhouette;
  /** Fabric colour, any CSS colour; hex is needed for the automatic contrast of seam lines. */
  fill: string;
  frame?: { width: number; height: number };
  /** Dashed chest line and hem marks, for previews next to a size chart. */
  guides?: boolean;
  /** Accessible name; without it the drawing is decorative. */
  title?: string;
  className?: string;
  /** "middle" centres the drawing in its box, as the proof canvas does; the default rests it on the bottom. */
  align?: "bottom" | "middle";
  /** Drawn over the garment, in the same garment inches (a proof's prints). */
  children?: React.ReactNode;
}

type Box = { minX: number; minY: number; maxX: number; maxY: number };

const PAD_IN = 1;

export function GarmentOutline({
  silhouette: s,
  fill,
  frame,
  guides = false,
  title,
  className,
  align = "bottom",
  children,
}: GarmentOutlineProps) {
  const box = boundsOf([s.outline, ...(s.hood ? [s.hood] : []), ...(s.handles ?? [])]);
  const viewBox = frame ? framedViewBox(box, frame) : fittedViewBox(box);
  const dark = isDark(fill);
  const edge = dark ? "#0f1013" : "#4c515a";
  const seam = dark ? "rgba(253, 253, 251, 0.38)" : "rgba(24, 26, 30, 0.32)";
  const guide = dark ? "rgba(253, 253, 251, 0.75)" : "rgba(47, 111, 102, 0.9)";
  const stroke = {
    vectorEffect: "non-scaling-stroke" as const,
    strokeLinejoin: "round" as const,
    strokeLinecap: "round" as const,
  };

  const [nearHandle, farHandle] = s.handles ?? [];
  const hood = s.hood ? (
    <path d={closedPath(s.hood)} fill={fill} stroke={edge} strokeWidth={1} {...stroke} />
  ) : null;
  const bands = bandLines(s);

  return (
    <svg
      viewBox={viewBox}
      className={className}
      role={title ? "img" : undefined}
      aria-label={title}
      aria-hidden={title ? undefined : true}
      preserveAspectRatio={align === "middle" ? "xMidYMid meet" : "xMidYMax meet"}
    >
      {title ? <title>{title}</title> : null}
      {farHandle ? (
        <path
          d={closedPath(farHandle)}
          fill={fill}
          stroke={edge}
          strokeWidth={1}
          {...stroke}
          opacity={0.85}
        />
      ) : null}
      {s.hoodLayer === "behind" ? hood : null}
      <path d={closedPath(s.outline)} fill={fill} />
      {(s.sleeves ?? []).map((sleeve, i) => (
        <path
          key={`sleeve-${i}`}
          d={closedPath(sleeve)}
          fill="none"
          stroke={seam}
          strokeWidth={1}
          {...stroke}
        />
      ))}
      {s.neckline.length > 1 ? (
        <path d={openPath(s.neckline)} fill="none" stroke={seam} strokeWidth={1.25} {...stroke} />
      ) : null}
      {bands.map((line, i) => (
        <path key={`band-${i}`} d={openPath(line)} fill="none" stroke={seam} strokeWidth={1} {...stroke} />
      ))}
      {s.pocket ? (
        <path d={closedPath(s.pocket)} fill="none" stroke={seam} strokeWidth={1} {...stroke} />
      ) : null}
      {s.gussetFoldY !== undefined ? (
        <path
          d={openPath(acrossBody(s, s.gussetFoldY))}
          fill="none"
          stroke={seam}
          strokeWidth={1}
          strokeDasharray="4 3"
          {...stroke}
        />
      ) : null}
      <path d={closedPath(s.outline)} fill="none" stroke={edge} strokeWidth={1.25} {...stroke} />
      {nearHandle ? (
        <path d={closedPath(nearHandle)} fill={fill} stroke={edge} strokeWidth={1} {...stroke} />
      ) : null}
      {s.hoodLayer === "over" ? hood : null}
      {children}
      {guides ? (
        <g>
          {s.category !== "tote" ? (
            <path
              d={openPath(acrossBody(s, s.chestLineY))}
              fill="none"
              stroke={guide}
              strokeWidth={1.25}
              strokeDasharray="5 3"
              {...stroke}
            />
          ) : null}
          <path
            d={openPath([
              { x: 0, y: s.hps.left.y },
              { x: 0, y: s.hemY },
            ])}
            fill="none"
            stroke={guide}
            strokeWidth={1}
            strokeDasharray="2 3"
            {...stroke}
          />
        </g>
      ) : null}
    </svg>
  );
}

/** Width and height (inches) of everything the outline draws: body, sleeves, hood and handles. */
export function silhouetteExtent(s: Silhouette): { width: number; height: number } {
  const b = boundsOf([s.outline, ...(s.hood ? [s.hood] : []), ...(s.handles ?? [])]);
  return { width: b.maxX - b.minX, height: b.maxY - b.minY };
}

function boundsOf(shapes: readonly (readonly Point[])[]): Box {
  const box: Box = { minX: Infinity, minY: Infinity, maxX: -Infinity, maxY: -Infinity };
  for (const shape of shapes) {
    for (const p of shape) {
      if (p.x < box.minX) box.minX = p.x;
      if (p.x > box.maxX) box.maxX = p.x;
      if (p.y < box.minY) box.minY = p.y;
      if (p.y > box.maxY) box.maxY = p.y;
    }
  }
  if (!Number.isFinite(box.minX)) return { minX: -1, minY: -1, maxX: 1, maxY: 1 };
  return box;
}

function fittedViewBox(b: Box): string {
  return [b.minX - PAD_IN, b.minY - PAD_IN, b.maxX - b.minX + 2 * PAD_IN, b.maxY - b.minY + 2 * PAD_IN]
    .map(round)
    .join(" ");
}

/** A fixed-size window, centred on the garment across and resting its lowest point on the bottom edge. */
function framedViewBox(b: Box, frame: { width: number; height: number }): string {
  const width = Math.max(frame.width, b.maxX - b.minX + 2 * PAD_IN);
  const height = Math.max(frame.height, b.maxY - b.minY + 2 * PAD_IN);
  const centerX = (b.minX + b.maxX) / 2;
  return [centerX - width / 2, b.maxY + PAD_IN - height, width, height].map(round).join(" ");
}

/** Ribbed bands and cuffs, drawn as a seam line across the body or sleeve. */
function bandLines(s: Silhouette): Point[][] {
  const lines: Point[][] = [];
  if (s.waistbandTopY !== undefined) lines.push(acrossBody(s, s.waistbandTopY));
  for (const frame of s.sleeveFrames ?? []) {
    if (!(frame.cuffBand > 0)) continue;
    const a = (frame.angleDeg * Math.PI) / 180;
    const along = { x: Math.cos(a), y: Math.sin(a) };
    // The sleeve lies below its top line: take the square direction that points down the screen.
    let across = { x: -along.y, y: along.x };
    if (across.y < 0) across = { x: -across.x, y: -across.y };
    const at = frame.length - frame.cuffBand;
    const start = { x: frame.origin.x + along.x * at, y: frame.origin.y + along.y * at };
    lines.push([start, { x: start.x + across.x * frame.cuffWidth, y: start.y + across.y * frame.cuffWidth }]);
  }
  return lines;
}

function acrossBody(s: Silhouette, y: number): Point[] {
  const edge = s.bodyEdgeAt(y);
  if (!edge) return [];
  return [
    { x: edge.left, y },
    { x: edge.right, y },
  ];
}

function round(n: number): number {
  return Math.round(n * 1000) / 1000;
}

function openPath(points: readonly Point[]): string {
  return points.map((p, i) => `${i === 0 ? "M" : "L"}${round(p.x)} ${round(p.y)}`).join(" ");
}

function closedPath(points: readonly Point[]): string {
  return points.length > 0 ? `${openPath(points)} Z` : "";
}

/** Fabric darker than this relative luminance (WCAG 2 formula) gets light seam lines; the cut-off is our own choice. */
const DARK_LUMINANCE = 0.3;

function isDark(colour: string): boolean {
  const m = /^#?([0-9a-f]{6})$/i.exec(colour.trim());
  if (!m) return false;
  const n = parseInt(m[1]!, 16);
  const channel = (v: number) => {
    const c = v / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  };
  const luminance =
    0.2126 * channel((n >> 16) & 255) + 0.7152 * channel((n >> 8) & 255) + 0.0722 * channel(n & 255);
  return luminance < DARK_LUMINANCE;
}
