import { z } from "zod";
import { PRINT_LOCATIONS, type LocationSpec } from "@/lib/garments/locations";
import type { Point, Rect } from "@/lib/garments/types";
import { degToRad } from "@/lib/units";

/** Largest art side we accept, in inches (our own sanity bound, well past any platen). */
export const MAX_ART_SIDE_IN = 60;

/**
 * One piece of art placed on a garment, in the garment inches of its location's side.
 * offsetFromCenterIn is the x of the art's center; belowCollarIn is the y of its top edge before
 * turning. The art turns about its center; positive rotationDeg is clockwise on screen.
 */
export const placementSchema = z.object({
  id: z.string().min(1, { message: "A placement needs an id." }),
  location: z.enum(PRINT_LOCATIONS, { error: "Choose a print location." }),
  artworkId: z.string().min(1, { message: "Artwork id can't be empty; use null for no artwork." }).nullable(),
  widthIn: z
    .number({ error: "Width must be a number of inches." })
    .refine((v) => v > 0, { message: "Width must be more than 0 in." })
    .refine((v) => v <= MAX_ART_SIDE_IN, { message: `Width can't be more than ${MAX_ART_SIDE_IN} in.` }),
  heightIn: z
    .number({ error: "Height must be a number of inches." })
    .refine((v) => v > 0, { message: "Height must be more than 0 in." })
    .refine((v) => v <= MAX_ART_SIDE_IN, { message: `Height can't be more than ${MAX_ART_SIDE_IN} in.` }),
  offsetFromCenterIn: z.number({ error: "Offset from center must be a number of inches." }),
  belowCollarIn: z.number({ error: "Distance below the collar must be a number of inches." }),
  rotationDeg: z
    .number({ error: "Rotation must be a number of degrees." })
    .refine((v) => v >= -180 && v <= 180, { message: "Rotation must be between -180° and 180°." }),
});

export type Placement = z.infer<typeof placementSchema>;

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
