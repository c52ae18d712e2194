"use client";

import { useId, type Ref } from "react";
import type { Point, Rect } from "@/lib/garments/types";
import { describePin, isPinKey, movePin, PIN_BIG_STEP_IN, PIN_STEP_IN, type PinKey } from "@/lib/review/pin";
import { formatLength, type LengthUnit } from "@/lib/units";

const NUDGES: Array<{ key: PinKey; label: string; arrow: string; place: string }> = [
  { key: "ArrowUp", label: "up", arrow: "↑", place: "col-start-2 row-start-1" },
  { key: "ArrowLeft", label: "left", arrow: "←", place: "col-start-1 row-start-2" },
  { key: "ArrowRight", label: "right", arrow: "→", place: "col-start-3 row-start-2" },
  { key: "ArrowDown", label: "down", arrow: "↓", place: "col-start-2 row-start-3" },
];

/**
 * Moves a note's pin without touching the canvas: arrow keys on the pad (1/8 in a press, 1 in with
 * Shift) or the four nudge buttons, and says where the pin is in words after every move. `ref`
 * reaches the pad, for a form that wants the keyboard on it.
 */
export function PinMover({ pin, unit, tote, bounds, onMove, ref }: { pin: Point; unit: LengthUnit; tote?: boolean; bounds?: Rect; onMove: (pin: Point) => void; ref?: Ref<HTMLDivElement> }) {
  const id = useId();
  const where = describePin(pin, unit, { tote });
  const step = formatLength(PIN_STEP_IN, "in");
  const bigStep = formatLength(PIN_BIG_STEP_IN, "in");
  const move = (key: PinKey, big: boolean) => onMove(movePin(pin, key, big, bounds));
  return (
    <div className="flex items-center gap-3 rounded-lg border border-paper-300 bg-paper-100 p-2" role="group" aria-labelledby={`${id}-title`}>
      <div className="grid shrink-0 grid-cols-3 grid-rows-3 gap-0.5" aria-label="Nudge the pin" role="group">
        {NUDGES.map((n) => (
          <button
            key={n.key}
            type="button"
            className={`${n.place} grid h-10 w-10 place-items-center rounded-md border border-paper-300 bg-chalk text-ink-800 hover:bg-paper-200`}
            aria-label={`Move the pin ${n.label} ${step}`}
            onClick={() => move(n.key, false)}
          >
            <span aria-hidden="true">{n.arrow}</span>
          </button>
        ))}
      </div>
      <div
        ref={ref}
        role="application"
        tabIndex={0}
        aria-label="Pin position"
        aria-describedby={`${id}-where ${id}-keys`}
        className="min-w-0 flex-1 rounded-md px-1 py-0.5"
        onKeyDown={(e) => {
          if (!isPinKey(e.key)) return;
          e.preventDefault();
          move(e.key, e.shiftKey);
        }}
      >
        <p id={`${id}-title`} className="text-xs font-semibold text-ink-700">
          Move the pin
        </p>
        <p id={`${id}-where`} className="measure text-xs text-ink-800" role="status" data-testid="pin-position">
          {where}
        </p>
        <p id={`${id}-keys`} className="text-xs text-ink-500">
          Arrow keys move it {step}; with Shift, {bigStep}.
        </p>
      </div>
    </div>
  );
}
