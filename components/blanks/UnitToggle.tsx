"use client";

import type { LengthUnit } from "@/lib/units";

/** Inches or centimetres for a size chart; inches are what is stored. */
export function UnitToggle({
  unit,
  onChange,
  label = "Units",
}: {
  unit: LengthUnit;
  onChange: (unit: LengthUnit) => void;
  label?: string;
}) {
  return (
    <div
      role="radiogroup"
      aria-label={label}
      className="inline-flex rounded-lg border border-paper-300 bg-paper-100 p-0.5 text-sm"
    >
      {(["in", "cm"] as const).map((u) => (
        <button
          key={u}
          type="button"
          role="radio"
          aria-checked={unit === u}
          onClick={() => onChange(u)}
          className={`rounded-md px-3 py-1 font-medium ${unit === u ? "bg-chalk text-ink-900 shadow-card" : "text-ink-600 hover:text-ink-900"}`}
        >
          {u === "in" ? "in" : "cm"}
        </button>
      ))}
    </div>
  );
}
