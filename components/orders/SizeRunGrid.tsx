"use client";

import { useState } from "react";
import type { FieldErrors, UseFormRegister } from "react-hook-form";
import { SIZE_GROUPS } from "@/lib/quotes";
import { GRID_SIZES } from "./size-run";

type SizeRunForm = { sizeRun: Array<{ size: string; quantity: number }> };

/** An id for a size's field; "One size" holds a space, which would split aria-describedby in two. */
const fieldId = (size: string) => `size-${size.replace(/\s+/g, "-")}`;

/**
 * Quantities per size, youth and adult side by side. Infant, toddler and one-size rows open
 * on demand (and stay open when they hold quantities).
 */
export function SizeRunGrid<T extends SizeRunForm>({
  register,
  values,
  errors,
  disabled,
}: {
  register: UseFormRegister<T>;
  values: ReadonlyArray<{ size: string; quantity: number }>;
  errors?: FieldErrors<SizeRunForm>["sizeRun"];
  disabled?: boolean;
}) {
  const used = (key: string) => SIZE_GROUPS.find((g) => g.key === key)!.sizes.some((s) => (values[GRID_SIZES.indexOf(s)]?.quantity ?? 0) > 0);
  const [open, setOpen] = useState<Set<string>>(() => new Set(["youth", "adult", ...SIZE_GROUPS.filter((g) => used(g.key)).map((g) => g.key)]));
  const quantity = (size: string) => {
    const q = Number(values[GRID_SIZES.indexOf(size)]?.quantity ?? 0);
    return Number.isFinite(q) && q > 0 ? q : 0;
  };
  const total = GRID_SIZES.reduce((s, size) => s + quantity(size), 0);
  const reg = register as unknown as UseFormRegister<SizeRunForm>;
  // A refusal of the whole run: from the resolver it sits at `root` (the run is a field array), from setError at the top.
  const runError = errors as { message?: string; root?: { message?: string } } | undefined;
  const runMessage = runError?.root?.message ?? runError?.message;
  return (
    <div className="space-y-3" data-testid="size-run-grid">
      {SIZE_GROUPS.filter((g) => open.has(g.key)).map((group) => {
        const subtotal = group.sizes.reduce((s, size) => s + quantity(size), 0);
        return (
          <fieldset key={group.key} className="rounded-lg border border-paper-300 p-3">
            <legend className="px-1 text-sm font-medium text-ink-700">
              {group.label} <span className="measure font-normal text-ink-500">· {subtotal}</span>
            </legend>
            <div className="flex flex-wrap gap-2">
              {group.sizes.map((size) => {
                const i = GRID_SIZES.indexOf(size);
                const err = errors?.[i]?.quantity?.message;
                const id = fieldId(size);
                return (
                  <div key={size} className="w-16">
                    <label htmlFor={id} className="block text-center text-xs font-medium text-ink-600">
                      {size}
                    </label>
                    <input
                      id={id}
                      type="number"
                      inputMode="numeric"
                      min={0}
                      step={1}
                      disabled={disabled}
                      aria-invalid={err ? true : undefined}
                      aria-describedby={err ? `${id}-error` : undefined}
                      className={`field-input measure px-1 text-center ${quantity(size) > 0 ? "border-patina-400 bg-patina-50" : ""}`}
                      {...reg(`sizeRun.${i}.quantity`, { setValueAs: (v: unknown) => (v === "" || v === null || v === undefined ? 0 : Number(v)) })}
                    />
                    {err ? (
                      <p id={`${id}-error`} className="mt-0.5 text-center text-xs text-brick-700">
                        {err}
                      </p>
                    ) : null}
                  </div>
                );
              })}
            </div>
          </fieldset>
        );
      })}
      <div className="flex flex-wrap items-center gap-2 text-sm">
        {SIZE_GROUPS.filter((g) => !open.has(g.key)).map((g) => (
          <button key={g.key} type="button" className="btn-quiet px-3 py-1" disabled={disabled} onClick={() => setOpen((s) => new Set([...s, g.key]))}>
            + {g.label} sizes
          </button>
        ))}
        <span className="ml-auto font-medium" data-testid="size-run-total">
          Total <span className="measure">{total}</span>
        </span>
      </div>
      {typeof runMessage === "string" ? <p className="field-error">{runMessage}</p> : null}
    </div>
  );
}
