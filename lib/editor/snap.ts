/**
 * Snapping for art changed by the canvas's resize handles, in garment inches. Drags already snap
 * positions to 1/8 in (snapArtPosition in view.ts); a resize snaps sizes to the same step.
 */
import { EIGHTH_IN, snapToStep } from "@/lib/units";

export type ArtSize = { widthIn: number; heightIn: number };

/** The smallest side a resize handle leaves (our own floor: two steps of 1/8 in, still grabbable on screen). */
export const MIN_HANDLE_SIDE_IN = 0.25;

/** Float noise in inches below which a side counts as unchanged (far under any step we snap to). */
const SAME_IN = 1e-9;

function ceilToStep(value: number): number {
  return Math.ceil(value / EIGHTH_IN - 1e-9) * EIGHTH_IN;
}

/**
 * Snaps a resized art size to 1/8 in.
 * - Proportional (the art's proportions kept): the long side snaps to the nearest 1/8 in and the
 *   short side follows the proportions of `before`, so the art is never stretched.
 * - Free: each side the handle changed snaps to the nearest 1/8 in; a side it left alone keeps its
 *   exact length, so a sideways handle never nudges the height.
 * Nothing changed (a turn, or a click on a handle) gives `before` back unchanged.
 * Neither side ends under `minIn`.
 */
export function snapArtSize(args: {
  before: ArtSize;
  after: ArtSize;
  proportional: boolean;
  minIn?: number;
}): ArtSize {
  const { before, after } = args;
  const minIn = args.minIn ?? MIN_HANDLE_SIDE_IN;
  const widthChanged = Math.abs(after.widthIn - before.widthIn) > SAME_IN;
  const heightChanged = Math.abs(after.heightIn - before.heightIn) > SAME_IN;
  if (!widthChanged && !heightChanged) return before;
  if (args.proportional) {
    const wide = before.widthIn >= before.heightIn;
    const longOverShort = wide ? before.widthIn / before.heightIn : before.heightIn / before.widthIn;
    const asked = wide ? after.widthIn : after.heightIn;
    // The short side must reach minIn too, so the long side may not go below minIn × proportions.
    const long = Math.max(snapToStep(asked, EIGHTH_IN), ceilToStep(minIn * longOverShort));
    const short = long / longOverShort;
    return wide ? { widthIn: long, heightIn: short } : { widthIn: short, heightIn: long };
  }
  const side = (changed: boolean, was: number, asked: number) =>
    changed ? Math.max(snapToStep(asked, EIGHTH_IN), ceilToStep(minIn)) : was;
  return {
    widthIn: side(widthChanged, before.widthIn, after.widthIn),
    heightIn: side(heightChanged, before.heightIn, after.heightIn),
  };
}
