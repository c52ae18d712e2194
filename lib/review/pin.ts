import type { Point, Rect } from "@/lib/garments/types";
import { EIGHTH_IN, formatLength, type LengthUnit } from "@/lib/units";

/*
 * A note's pin in garment inches: x from the centre line (growing to the viewer's right), y below
 * the collar seam (for a tote, below the bag's top edge), the same space as the placements.
 */

/** One arrow-key press: the finest step the trade usually quotes a print size in. */
export const PIN_STEP_IN = EIGHTH_IN;
/** One arrow-key press with Shift held (our own choice: a whole inch, easy to count). */
export const PIN_BIG_STEP_IN = 1;

export type PinKey = "ArrowLeft" | "ArrowRight" | "ArrowUp" | "ArrowDown";

export function isPinKey(key: string): key is PinKey {
  return key === "ArrowLeft" || key === "ArrowRight" || key === "ArrowUp" || key === "ArrowDown";
}

/** Clears binary noise (6.375000000000001) without moving a real value. */
function clean(value: number): number {
  const cleaned = Number(value.toFixed(10));
  return cleaned === 0 ? 0 : cleaned;
}

function clamp(value: number, min: number, max: number): number {
  return Math.min(max, Math.max(min, value));
}

/**
 * Moves a pin one step for an arrow key: 1/8 in, or 1 in with Shift. Up is towards the collar.
 * With bounds the pin stays inside them.
 */
export function movePin(pin: Point, key: PinKey, big: boolean, bounds?: Rect): Point {
  const step = big ? PIN_BIG_STEP_IN : PIN_STEP_IN;
  const dx = key === "ArrowLeft" ? -step : key === "ArrowRight" ? step : 0;
  const dy = key === "ArrowUp" ? -step : key === "ArrowDown" ? step : 0;
  let x = clean(pin.x + dx);
  let y = clean(pin.y + dy);
  if (bounds) {
    x = clamp(x, bounds.x, bounds.x + bounds.width);
    y = clamp(y, bounds.y, bounds.y + bounds.height);
  }
  return { x, y };
}

/** Where a pin is, in words a screen reader can say: "Pin at 1 1/4 in right of centre, 6 1/2 in below the collar". */
export function describePin(pin: Point, unit: LengthUnit, opts: { tote?: boolean } = {}): string {
  const top = opts.tote ? "the top edge" : "the collar";
  // A length that shows as nothing gets no direction: "0 in from centre", "0 in below the collar".
  const zero = formatLength(0, unit);
  const xText = formatLength(Math.abs(pin.x), unit);
  const yText = formatLength(Math.abs(pin.y), unit);
  const across = xText === zero ? `${zero} from centre` : `${xText} ${pin.x < 0 ? "left" : "right"} of centre`;
  const down = `${yText} ${pin.y < 0 && yText !== zero ? "above" : "below"} ${top}`;
  return `Pin at ${across}, ${down}`;
}
