import type { LocationSpec } from "@/lib/garments/locations";
import type { Placement } from "./schema";
import type { Point, Rect } from "@/lib/garments/types";
import { degToRad } from "@/lib/units";

/** Largest art side we accept, in inches (our own sanity bound, well past any platen). */
export const MAX_ART_SIDE_IN = 60;

export type { Placement } from "./schema";

export function placementCenter(p: Placement): Point {
  return { x: p.offsetFromCenterIn, y: p.belowCollarIn + p.heightIn / 2 };
}

/** Corners of the turned art: top-left, top-right, bottom-right, bottom-left of the art (clockwise). */
export function placementCorners(p: Placement): Point[] {
  const c = placementCenter(p);
  const a = degToRad(p.rotationDeg);
  const cos = Math.cos(a);
  const sin = Math.sin(a);
  const hw = p.widthIn / 2;
  const hh = p.heightIn / 2;
  const local: Point[] = [
    { x: -hw, y: -hh },
    { x: hw, y: -hh },
    { x: hw, y: hh },
    { x: -hw, y: hh },
  ];
  return local.map(({ x, y }) => ({ x: c.x + x * cos - y * sin, y: c.y + x * sin + y * cos }));
}

/** Axis-aligned box around the art in garment inches, turn included. */
export function placementBounds(p: Placement): Rect {
  const c = placementCenter(p);
  const a = degToRad(p.rotationDeg);
  const cos = Math.abs(Math.cos(a));
  const sin = Math.abs(Math.sin(a));
  const halfW = (p.widthIn / 2) * cos + (p.heightIn / 2) * sin;
  const halfH = (p.widthIn / 2) * sin + (p.heightIn / 2) * cos;
  return { x: c.x - halfW, y: c.y - halfH, width: 2 * halfW, height: 2 * halfH };
}

/** Width and height of art with the given width-to-height ratio, fitted inside a box. */
export function fitInBox(
  aspect: number,
  boxWidth: number,
  boxHeight: number,
): { width: number; height: number } {
  if (!Number.isFinite(aspect) || aspect <= 0) {
    throw new RangeError("Artwork aspect ratio (width ÷ height) must be a positive number.");
  }
  const byWidth = { width: boxWidth, height: boxWidth / aspect };
  return byWidth.height <= boxHeight ? byWidth : { width: boxHeight * aspect, height: boxHeight };
}

/**
 * A new placement of art with the given width-to-height ratio at a location's usual spot, sized to
 * fit its typical box.
 */
export function defaultPlacement(spec: LocationSpec, aspect: number, id: string = spec.location): Placement {
  if (!(spec.typicalWidth > 0 && spec.typicalHeight > 0)) {
    throw new RangeError(`This size leaves no room for a ${spec.label.toLowerCase()} print.`);
  }
  const size = fitInBox(aspect, spec.typicalWidth, spec.typicalHeight);
  const belowCollarIn =
    spec.verticalAlign === "top"
      ? spec.defaultBelowCollar
      : spec.defaultBelowCollar + spec.typicalHeight / 2 - size.height / 2;
  return {
    id,
    location: spec.location,
    artworkId: null,
    widthIn: size.width,
    heightIn: size.height,
    offsetFromCenterIn: spec.defaultOffsetFromCenter,
    belowCollarIn,
    rotationDeg: spec.axisRotationDeg,
  };
}
