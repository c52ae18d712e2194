/**
 * The editor's view transform between garment inches and stage pixels (CSS px inside the Konva stage).
 * scale = calibrated CSS px per real inch × zoom; at zoom 1 an inch on a calibrated screen is an inch.
 */
import type { Point } from "@/lib/garments/types";
import { CSS_PX_PER_INCH, snapToStep, EIGHTH_IN } from "@/lib/units";

export type View = { originX: number; originY: number; pxPerInch: number; zoom: number };

export const ZOOM_STEPS = [0.1, 0.125, 0.15, 0.2, 0.25, 0.3, 0.4, 0.5, 0.6, 0.75, 1, 1.25, 1.5, 2, 3, 4] as const;
export const MIN_ZOOM = ZOOM_STEPS[0];
export const MAX_ZOOM = ZOOM_STEPS[ZOOM_STEPS.length - 1]!;

/** Screen calibration bounds: anything outside is a typo, not a screen (our own sanity range). */
export const MIN_PX_PER_INCH = 40;
export const MAX_PX_PER_INCH = 600;
export const DEFAULT_PX_PER_INCH = CSS_PX_PER_INCH;

export function scaleOf(view: View): number {
  return view.pxPerInch * view.zoom;
}

export function toStage(view: View, p: Point): Point {
  const s = scaleOf(view);
  return { x: view.originX + p.x * s, y: view.originY + p.y * s };
}

export function toGarment(view: View, p: Point): Point {
  const s = scaleOf(view);
  return { x: (p.x - view.originX) / s, y: (p.y - view.originY) / s };
}

export function clampZoom(zoom: number): number {
  return Math.min(MAX_ZOOM, Math.max(MIN_ZOOM, zoom));
}

export function nextZoom(zoom: number, direction: 1 | -1): number {
  if (direction > 0) return ZOOM_STEPS.find((z) => z > zoom + 1e-9) ?? MAX_ZOOM;
  return [...ZOOM_STEPS].reverse().find((z) => z < zoom - 1e-9) ?? MIN_ZOOM;
}

/** Zoom that fits a box of garment inches into a viewport with a margin on every side. */
export function fitZoom(args: { boxWidthIn: number; boxHeightIn: number; viewportWidth: number; viewportHeight: number; pxPerInch: number; marginPx?: number }): number {
  const margin = args.marginPx ?? 48;
  const zx = (args.viewportWidth - 2 * margin) / (args.boxWidthIn * args.pxPerInch);
  const zy = (args.viewportHeight - 2 * margin) / (args.boxHeightIn * args.pxPerInch);
  return clampZoom(Math.min(zx, zy));
}

/** Origin that centres a garment box (in inches, relative to the collar origin) in the viewport. */
export function centredOrigin(args: { box: { x: number; y: number; width: number; height: number }; viewportWidth: number; viewportHeight: number; scale: number }): { originX: number; originY: number } {
  const { box, scale } = args;
  return {
    originX: args.viewportWidth / 2 - (box.x + box.width / 2) * scale,
    originY: args.viewportHeight / 2 - (box.y + box.height / 2) * scale,
  };
}

/** Snaps a dragged art centre: onto the center line when close, otherwise to 1/8 in steps. */
export function snapArtPosition(args: {
  centreXIn: number;
  topIn: number;
  snapPx: number;
  scale: number;
  snapToCentre: boolean;
}): { offsetFromCenterIn: number; belowCollarIn: number; snappedToCentre: boolean } {
  const thresholdIn = args.snapPx / args.scale;
  const nearCentre = args.snapToCentre && Math.abs(args.centreXIn) <= thresholdIn;
  return {
    offsetFromCenterIn: nearCentre ? 0 : snapToStep(args.centreXIn, EIGHTH_IN),
    belowCollarIn: snapToStep(args.topIn, EIGHTH_IN),
    snappedToCentre: nearCentre,
  };
}

/** Ruler ticks between two garment-inch positions: every 1/8 in, with longer marks at 1/2 and whole inches. */
export function rulerTicks(fromIn: number, toIn: number, scale: number): Array<{ at: number; kind: "inch" | "half" | "quarter" | "eighth" }> {
  const ticks: Array<{ at: number; kind: "inch" | "half" | "quarter" | "eighth" }> = [];
  // Drop the finest marks when they would be closer than 4 px on screen.
  const step = scale * EIGHTH_IN >= 4 ? EIGHTH_IN : scale * 0.25 >= 4 ? 0.25 : scale * 0.5 >= 4 ? 0.5 : 1;
  const start = Math.ceil(fromIn / step) * step;
  for (let v = start; v <= toIn + 1e-9; v += step) {
    const eighths = Math.round(v * 8);
    const kind = eighths % 8 === 0 ? "inch" : eighths % 4 === 0 ? "half" : eighths % 2 === 0 ? "quarter" : "eighth";
    ticks.push({ at: Math.round(v * 8) / 8, kind });
  }
  return ticks;
}

/** Ruler ticks in centimetres: every millimetre when there is room, labels at whole centimetres. */
export function rulerTicksCm(fromIn: number, toIn: number, scale: number): Array<{ atIn: number; cm: number; kind: "cm" | "half" | "mm" }> {
  const pxPerCm = scale / 2.54;
  const stepMm = pxPerCm / 10 >= 4 ? 1 : pxPerCm / 2 >= 4 ? 5 : 10;
  const fromMm = Math.ceil((fromIn * 25.4) / stepMm) * stepMm;
  const ticks: Array<{ atIn: number; cm: number; kind: "cm" | "half" | "mm" }> = [];
  for (let mm = fromMm; mm <= toIn * 25.4 + 1e-9; mm += stepMm) {
    const whole = Math.round(mm);
    ticks.push({ atIn: whole / 25.4, cm: whole / 10, kind: whole % 10 === 0 ? "cm" : whole % 5 === 0 ? "half" : "mm" });
  }
  return ticks;
}

/**
 * The pan (garment point at the viewport centre, in inches from the garment box's middle) that
 * puts `point` (inches: across from the center line, down from the collar) in the middle of the view.
 */
export function panToCentre(box: { x: number; y: number; width: number; height: number }, point: { x: number; y: number }): { x: number; y: number } {
  return { x: point.x - (box.x + box.width / 2), y: point.y - (box.y + box.height / 2) };
}

/** Where a print's middle is, in garment inches (across from the center line, down from the collar). */
export function printCentre(p: { offsetFromCenterIn: number; belowCollarIn: number; heightIn: number }): { x: number; y: number } {
  return { x: p.offsetFromCenterIn, y: p.belowCollarIn + p.heightIn / 2 };
}

/**
 * Slides a label box (stage pixels) the least distance that keeps it inside `bounds`, so a callout
 * near the rulers or the edge stays readable. A box larger than the bounds keeps its left/top edge in.
 */
export function keepInside(box: { left: number; top: number; width: number; height: number }, bounds: { left: number; top: number; right: number; bottom: number }): { left: number; top: number } {
  const slide = (start: number, size: number, min: number, max: number) => Math.max(min, Math.min(start, max - size));
  return { left: slide(box.left, box.width, bounds.left, bounds.right), top: slide(box.top, box.height, bounds.top, bounds.bottom) };
}
