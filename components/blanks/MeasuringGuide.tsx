import type { GarmentCategory } from "@/lib/garments/types";
import { columnsFor } from "./chart-columns";

/** How each size-chart number is taken, so a chart from a supplier can be checked line by line. */
export function MeasuringGuide({ category }: { category: GarmentCategory }) {
  return (
    <section className="card p-4" aria-labelledby="guide-heading">
      <h2 id="guide-heading" className="text-base">
        How the chart is measured
      </h2>
      <p className="mt-0.5 text-xs text-ink-500">Laid flat, not stretched.</p>
      <dl className="mt-3 grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2">
        {columnsFor(category).map((c) => (
          <div key={c.key}>
            <dt className="font-medium text-ink-800">{c.label}</dt>
            <dd className="text-ink-600">{c.how}</dd>
          </div>
        ))}
      </dl>
    </section>
  );
}
