"use client";

import { useState, type ReactNode } from "react";
import {
  CATEGORY_INFO,
  type GarmentCategory,
  type GarmentMeasurements,
  type SizeGroup,
} from "@/lib/garments/types";
import { formatLength, type LengthUnit } from "@/lib/units";
import { columnsFor, middleSizeIndex, SIZE_GROUP_LABELS } from "./chart-columns";
import { PreviewPanel } from "./PreviewPanel";
import { UnitToggle } from "./UnitToggle";

export interface SizeChartViewProps {
  category: GarmentCategory;
  sizes: readonly { size: string; group: SizeGroup; measurements: GarmentMeasurements }[];
  colours: readonly { name: string; hex: string }[];
  /** Shown beside the outline, above the chart. */
  intro?: ReactNode;
  /** Reference notes: beside the outline on wide screens, after the chart on narrow ones. */
  notes?: ReactNode;
}

/** Read-only size chart with an in/cm switch, beside an outline of the chosen size. */
export function SizeChartView({ category, sizes, colours, intro, notes }: SizeChartViewProps) {
  const [unit, setUnit] = useState<LengthUnit>("in");
  const [selected, setSelected] = useState(() => middleSizeIndex(sizes));
  const columns = columnsFor(category);
  const isTote = CATEGORY_INFO[category].isTote;
  const current = sizes[selected];

  return (
    <div className="grid grid-cols-[minmax(0,1fr)] gap-6 lg:grid-cols-[minmax(0,1fr)_20rem] lg:grid-rows-[auto_1fr_auto]">
      <div className="min-w-0 space-y-6 lg:col-start-1 lg:row-start-1">{intro}</div>
      {current ? (
        <PreviewPanel
          className="lg:col-start-2 lg:row-span-2 lg:row-start-1"
          category={category}
          sizes={sizes.map((s) => s.size)}
          selected={selected}
          onSelect={setSelected}
          measurements={current.measurements}
          allMeasurements={sizes.map((s) => s.measurements)}
          colours={colours}
          unit={unit}
        />
      ) : null}
      <section className="card min-w-0 lg:col-span-2 lg:row-start-3" aria-labelledby="chart-heading">
        <div className="flex flex-wrap items-center justify-between gap-3 border-b border-paper-200 px-4 py-3">
          <div>
            <h2 id="chart-heading" className="text-base">
              Size chart
            </h2>
            <p className="text-xs text-ink-500">
              Flat measurements in {unit === "in" ? "inches" : "centimetres"}. Pick a row to see its outline.
            </p>
          </div>
          <UnitToggle unit={unit} onChange={setUnit} />
        </div>
        <div className="relative overflow-x-auto">
          <table className="w-full min-w-max border-collapse text-sm">
            <thead>
              <tr className="bg-paper-50 text-left align-bottom">
                <th scope="col" className="sticky left-0 bg-paper-50 px-4 py-2 font-medium text-ink-700">
                  Size
                </th>
                {isTote ? null : (
                  <th scope="col" className="px-3 py-2 font-medium text-ink-700">
                    Group
                  </th>
                )}
                {columns.map((c) => (
                  <th
                    key={c.key}
                    scope="col"
                    className="px-3 py-2 text-right font-medium text-ink-700 last:pr-4"
                  >
                    <span className="ml-auto block max-w-[5.5rem] leading-tight">{c.label}</span>
                    {c.hint ? (
                      <span className="ml-auto mt-0.5 block max-w-[6.5rem] text-xs font-normal leading-tight text-ink-500">
                        {c.hint}
                      </span>
                    ) : null}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody className="divide-y divide-paper-200">
              {sizes.map((row, i) => {
                const values = row.measurements as unknown as Record<string, number>;
                const active = i === selected;
                return (
                  <tr
                    key={`${row.size}-${i}`}
                    onClick={() => setSelected(i)}
                    data-selected={active || undefined}
                    className={`cursor-pointer ${active ? "bg-patina-100/60" : "hover:bg-paper-100"}`}
                  >
                    <th
                      scope="row"
                      className={`sticky left-0 px-4 py-2 text-left font-semibold text-ink-900 ${active ? "bg-patina-100" : "bg-chalk"}`}
                    >
                      {row.size}
                    </th>
                    {isTote ? null : (
                      <td className="px-3 py-2 text-ink-600">{SIZE_GROUP_LABELS[row.group]}</td>
                    )}
                    {columns.map((c) => (
                      <td key={c.key} className="measure px-3 py-2 text-right text-ink-800 last:pr-4">
                        {formatLength(values[c.key] ?? Number.NaN, unit, { decimal: true, withUnit: false })}
                      </td>
                    ))}
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      </section>
      {notes ? (
        <div className="min-w-0 space-y-6 self-start lg:col-start-1 lg:row-start-2">{notes}</div>
      ) : null}
    </div>
  );
}
