"use client";

import { useEffect, useRef, useState } from "react";
import { MAX_PX_PER_INCH, MIN_PX_PER_INCH } from "@/lib/editor/view";
import { ID1_CARD_MM, MM_PER_INCH, pxPerInchFromCardWidth } from "@/lib/units";

/** Card width in inches (ISO/IEC 7810 ID-1: 85.60 mm), for the on-screen rectangle. */
const CARD_WIDTH_IN = ID1_CARD_MM.width / MM_PER_INCH;
const CARD_ASPECT = ID1_CARD_MM.height / ID1_CARD_MM.width;

type Props = { open: boolean; current: number; onClose: () => void; onSave: (pxPerInch: number) => Promise<void>; saving: boolean; error: string | null };

/**
 * Screen calibration: the maker holds any bank-card-sized card (ISO/IEC 7810 ID-1, 85.60 × 53.98 mm)
 * against the screen and widens the rectangle until it matches.
 */
export function CalibrationDialog({ open, current, onClose, onSave, saving, error }: Props) {
  const [cardPx, setCardPx] = useState(() => current * CARD_WIDTH_IN);
  const dialog = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const el = dialog.current;
    if (!el) return;
    if (open && !el.open) {
      setCardPx(Math.round(current * CARD_WIDTH_IN * 10) / 10);
      el.showModal();
    }
    if (!open && el.open) el.close();
  }, [open, current]);
  const pxPerInch = Number.isFinite(cardPx) && cardPx > 0 ? pxPerInchFromCardWidth(cardPx) : 0;
  const valid = pxPerInch >= MIN_PX_PER_INCH && pxPerInch <= MAX_PX_PER_INCH;
  const minCard = MIN_PX_PER_INCH * CARD_WIDTH_IN;
  const maxCard = Math.min(MAX_PX_PER_INCH * CARD_WIDTH_IN, 900);

  return (
    <dialog ref={dialog} onClose={onClose} className="w-[min(44rem,95vw)] rounded-card border border-paper-300 bg-chalk p-0 shadow-lift backdrop:bg-ink-900/40" aria-labelledby="cal-title">
      <div className="p-6">
        <h2 id="cal-title" className="text-xl">
          Match a card to the screen
        </h2>
        <p className="mt-1 text-sm text-ink-600">
          Hold any bank or ID card (85.60 × 53.98 mm) flat against the screen, its corner on the rectangle&apos;s top-left corner. Widen or narrow
          the rectangle until its edges line up with the card. Keep the browser zoom at 100%.
        </p>
        <div className="mt-5 overflow-x-auto">
          <div
            data-testid="calibration-card"
            className="rounded-[0.45rem] border-2 border-patina-600 bg-patina-100"
            style={{ width: `${cardPx}px`, height: `${cardPx * CARD_ASPECT}px` }}
          />
        </div>
        <div className="mt-5 flex flex-wrap items-center gap-3">
          <button type="button" className="btn-quiet px-3" onClick={() => setCardPx((v) => Math.max(minCard, v - 1))} aria-label="Narrower by 1 pixel">
            −
          </button>
          <input
            type="range"
            min={minCard}
            max={maxCard}
            step={0.5}
            value={cardPx}
            onChange={(e) => setCardPx(Number(e.target.value))}
            aria-label="Card width on screen"
            className="min-w-40 flex-1 accent-patina-600"
          />
          <button type="button" className="btn-quiet px-3" onClick={() => setCardPx((v) => Math.min(maxCard, v + 1))} aria-label="Wider by 1 pixel">
            +
          </button>
          <span className="flex items-center gap-2 text-sm">
            <label htmlFor="cal-card-px">Card width</label>
            <input
              id="cal-card-px"
              type="number"
              step={0.1}
              value={Math.round(cardPx * 10) / 10}
              onChange={(e) => setCardPx(Number(e.target.value))}
              className="field-input w-24 py-1"
              aria-describedby="cal-card-px-unit"
            />
            <span id="cal-card-px-unit" className="text-ink-500">
              px<span className="sr-only"> (screen pixels)</span>
            </span>
          </span>
        </div>
        <p className="measure mt-3 text-sm text-ink-700">
          This screen: {pxPerInch.toFixed(1)} px per inch
          {!valid ? <span className="ml-2 text-brick-700">That is outside what any screen shows; check the card.</span> : null}
        </p>
        {error ? <p className="field-error">{error}</p> : null}
        <div className="mt-6 flex justify-end gap-2">
          <button type="button" className="btn-quiet" onClick={onClose}>
            Cancel
          </button>
          <button
            type="button"
            className="btn-primary"
            disabled={!valid || saving}
            onClick={async () => {
              await onSave(pxPerInch);
              onClose();
            }}
          >
            {saving ? "Saving…" : "Use this calibration"}
          </button>
        </div>
      </div>
    </dialog>
  );
}
