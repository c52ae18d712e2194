"use client";

import { useId, useRef, useState } from "react";
import { formatLength, parseLength, type LengthUnit } from "@/lib/units";

type Props = {
  label: string;
  valueIn: number;
  unit: LengthUnit;
  disabled?: boolean;
  allowNegative?: boolean;
  hint?: string;
  onCommit: (inches: number) => void;
};

/** A length typed in inches (fractions welcome) or centimetres; commits on Enter or when leaving the field. */
export function LengthField({ label, valueIn, unit, disabled, allowNegative, hint, onCommit }: Props) {
  const id = useId();
  const shown = formatLength(valueIn, unit, { decimal: true, withUnit: false, digits: unit === "cm" ? 2 : 3 });
  // While the field has focus it holds what is typed; otherwise it shows the model's value.
  const [draft, setDraft] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  // Escape blurs the field to leave it; that blur must not commit what Escape threw away.
  const cancelling = useRef(false);
  const text = draft ?? shown;
  const setText = (value: string) => setDraft(value);

  function commit() {
    setDraft(null);
    if (text.trim() === shown.trim()) {
      setError(null);
      return;
    }
    const parsed = parseLength(text, unit, { allowNegative });
    if (!parsed.ok) {
      setError(parsed.message);
      return;
    }
    if (!allowNegative && parsed.inches <= 0) {
      setError("Use a size above zero.");
      return;
    }
    setError(null);
    onCommit(parsed.inches);
  }

  return (
    <div>
      <label htmlFor={id} className="mb-1 block text-xs font-medium text-ink-600">
        {label}
      </label>
      <div className="relative">
        <input
          id={id}
          inputMode="decimal"
          className="field-input measure py-1.5 pr-9 text-sm"
          value={text}
          disabled={disabled}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-err` : hint ? `${id}-hint` : undefined}
          onFocus={() => setDraft(shown)}
          onChange={(e) => setText(e.target.value)}
          onBlur={() => {
            if (cancelling.current) {
              cancelling.current = false;
              return;
            }
            commit();
          }}
          onKeyDown={(e) => {
            if (e.key === "Enter") {
              e.preventDefault();
              commit();
            }
            if (e.key === "Escape") {
              cancelling.current = true;
              setDraft(null);
              setError(null);
              (e.target as HTMLInputElement).blur();
            }
          }}
        />
        <span className="pointer-events-none absolute inset-y-0 right-2 flex items-center text-xs text-ink-500">{unit}</span>
      </div>
      {error ? (
        <p id={`${id}-err`} className="mt-1 text-xs text-brick-700">
          {error}
        </p>
      ) : hint ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-500">
          {hint}
        </p>
      ) : null}
    </div>
  );
}
