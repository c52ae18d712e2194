/**
 * Snapping inside the resize handles' bound box (Konva's Transformer boundBoxFunc). Pure: plain
 * boxes in, a box out, no Konva objects, so it can be tested without a canvas.
 */
import { snapArtSize } from "@/lib/editor/snap";

/** A box as the Transformer hands it over: absolute stage pixels, top-left corner, turn in radians. */
export type HandleBox = { x: number; y: number; width: number; height: number; rotation: number };

/** Points of a box, as fractions of its width and height: the four corners and the middle. */
const ROLES: ReadonlyArray<readonly [number, number]> = [
  [0, 0],
  [1, 0],
  [0, 1],
  [1, 1],
  [0.5, 0.5],
];

function pointOf(box: HandleBox, [fx, fy]: readonly [number, number]): { x: number; y: number } {
  const cos = Math.cos(box.rotation);
  const sin = Math.sin(box.rotation);
  return {
    x: box.x + fx * box.width * cos - fy * box.height * sin,
    y: box.y + fx * box.width * sin + fy * box.height * cos,
  };
}

/** Pixels below which a side counts as unchanged. */
const SAME_PX = 1e-6;

/**
 * Snaps the box a resize handle asks for to whole 1/8 in sides (snapArtSize), keeping still the
 * point the handle pivots on: the opposite corner, or the middle when scaling from the centre.
 * A box whose size did not change (a turn) passes through as asked.
 * `proportional` is the editor's keep-proportions setting; a drag that kept the proportions anyway
 * (Shift on a free handle) is treated as proportional too.
 */
export function snapHandleBox(args: {
  oldBox: HandleBox;
  newBox: HandleBox;
  /** Stage pixels per garment inch. */
  scale: number;
  proportional: boolean;
  minIn?: number;
}): HandleBox {
  const { oldBox, newBox, scale } = args;
  const sameWidth = Math.abs(Math.abs(newBox.width) - Math.abs(oldBox.width)) <= SAME_PX;
  const sameHeight = Math.abs(Math.abs(newBox.height) - Math.abs(oldBox.height)) <= SAME_PX;
  if ((sameWidth && sameHeight) || !(scale > 0)) return newBox;

  const before = { widthIn: Math.abs(oldBox.width) / scale, heightIn: Math.abs(oldBox.height) / scale };
  const after = { widthIn: Math.abs(newBox.width) / scale, heightIn: Math.abs(newBox.height) / scale };
  const keptRatio =
    !sameWidth &&
    !sameHeight &&
    Math.abs(after.widthIn / after.heightIn - before.widthIn / before.heightIn) <=
      1e-6 * (before.widthIn / before.heightIn);
  const size = snapArtSize({
    before,
    after,
    proportional: args.proportional || keptRatio,
    minIn: args.minIn,
  });

  // The pivot: the point of the box that moved least between the two boxes.
  let pivot = ROLES[0]!;
  let least = Infinity;
  for (const role of ROLES) {
    const a = pointOf(oldBox, role);
    const b = pointOf(newBox, role);
    const moved = Math.hypot(a.x - b.x, a.y - b.y);
    if (moved < least - 1e-9) {
      least = moved;
      pivot = role;
    }
  }
  const anchor = pointOf(newBox, pivot);
  const width = size.widthIn * scale;
  const height = size.heightIn * scale;
  const cos = Math.cos(newBox.rotation);
  const sin = Math.sin(newBox.rotation);
  const [fx, fy] = pivot;
  return {
    x: anchor.x - (fx * width * cos - fy * height * sin),
    y: anchor.y - (fx * width * sin + fy * height * cos),
    width,
    height,
    rotation: newBox.rotation,
  };
}
