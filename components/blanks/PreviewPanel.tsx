"use client";

import { useId, useState } from "react";
import {
  CATEGORY_INFO,
  isToteMeasurements,
  type GarmentCategory,
  type GarmentMeasurements,
  type GarmentSide,
} from "@/lib/garments/types";
import { formatLength, type LengthUnit } from "@/lib/units";
import { GarmentOutline, silhouetteExtent } from "./GarmentOutline";
import { silhouetteOrNull } from "./OutlinePreview";

export interface PreviewPanelProps {
  category: GarmentCategory;
  /** Size names in chart order. */
  sizes: readonly string[];
  selected: number;
  onSelect: (index: number) => void;
  /** Measurements of the selected size, or null when they are not valid yet. */
  measurements: GarmentMeasurements | null;
  /** Every drawable size of the chart; the frame fits the largest, so smaller sizes look smaller. */
  allMeasurements: readonly GarmentMeasurements[];
  colours: readonly { name: string; hex: string }[];
  unit: LengthUnit;
  invalidMessage?: string;
  /** Grid placement from the page around it. */
  className?: string;
}

/** Outline of one size of a blank, front or back, in one of its colours, drawn to the chart's own scale. */
export function PreviewPanel({
  category,
  sizes,
  selected,
  onSelect,
  measurements,
  allMeasurements,
  colours,
  unit,
  invalidMessage,
  className = "",
}: PreviewPanelProps) {
  const id = useId();
  const [side, setSide] = useState<GarmentSide>("front");
  const [colourIndex, setColourIndex] = useState(0);
  const colour = colours[Math.min(colourIndex, colours.length - 1)];
  const fill = colour && /^#[0-9a-f]{6}$/i.test(colour.hex) ? colour.hex : "#ECE6D9";

  const silhouette = measurements ? silhouetteOrNull(category, measurements, side) : null;
  const frame = frameFor(category, allMeasurements, side);
  const sizeName = sizes[selected] ?? "";
  const isTote = CATEGORY_INFO[category].isTote;

  return (
    <section
      className={`card p-4 lg:sticky lg:top-6 lg:self-start ${className}`}
      aria-labelledby={`${id}-title`}
    >
      <div className="flex items-center justify-between gap-2">
        <h2 id={`${id}-title`} className="text-base">
          Outline
        </h2>
        <div
          role="radiogroup"
          aria-label="Side"
          className="inline-flex rounded-lg border border-paper-300 bg-paper-100 p-0.5 text-xs"
        >
          {(["front", "back"] as const).map((s) => (
            <button
              key={s}
              type="button"
              role="radio"
              aria-checked={side === s}
              onClick={() => setSide(s)}
              className={`rounded-md px-2.5 py-1 font-medium capitalize ${side === s ? "bg-chalk text-ink-900 shadow-card" : "text-ink-600 hover:text-ink-900"}`}
            >
              {s}
            </button>
          ))}
        </div>
      </div>

      <div className="mt-3 rounded-lg bg-paper-100 p-3">
        {silhouette ? (
          <GarmentOutline
            silhouette={silhouette}
            fill={fill}
            frame={frame}
            guides
            className="h-56 w-full"
            title={`Size ${sizeName}, ${side}${colour ? `, ${colour.name}` : ""}`}
          />
        ) : (
          <div
            className="flex h-56 items-center justify-center px-4 text-center text-sm text-ink-600"
            role="status"
          >
            {invalidMessage ?? "These numbers do not make a shape we can draw."}
          </div>
        )}
      </div>

      {measurements ? <KeyNumbers measurements={measurements} unit={unit} /> : null}

      <div className="mt-4 space-y-3">
        <div>
          <label htmlFor={`${id}-size`} className="field-label">
            Size
          </label>
          <select
            id={`${id}-size`}
            className="field-input"
            value={selected}
            onChange={(e) => onSelect(Number(e.target.value))}
          >
            {sizes.map((name, i) => (
              <option key={`${name}-${i}`} value={i}>
                {name.trim() || `Row ${i + 1} (unnamed)`}
              </option>
            ))}
          </select>
        </div>
        {colours.length > 0 ? (
          <fieldset>
            <legend className="field-label">
              Colour
              {colour ? (
                <span className="font-normal text-ink-500"> · {colour.name || "unnamed"}</span>
              ) : null}
            </legend>
            <div className="flex flex-wrap gap-1.5">
              {colours.map((c, i) => (
                <button
                  key={`${c.name}-${i}`}
                  type="button"
                  aria-label={c.name || `Colour ${i + 1}`}
                  aria-pressed={i === colourIndex}
                  onClick={() => setColourIndex(i)}
                  className={`h-7 w-7 rounded-full border ${i === colourIndex ? "border-patina-600 ring-2 ring-patina-300" : "border-ink-900/15"}`}
                  style={{ backgroundColor: /^#[0-9a-f]{6}$/i.test(c.hex) ? c.hex : "transparent" }}
                />
              ))}
            </div>
          </fieldset>
        ) : null}
      </div>
      <p className="mt-4 text-xs text-ink-500">
        {isTote
          ? "Drawn from the chart to one scale. A dashed line near the bottom marks where the gusset folds under."
          : "Drawn from the chart to one scale across sizes. The dashed line marks where chest width is measured, 1 in below the armhole."}
      </p>
    </section>
  );
}

function KeyNumbers({ measurements: m, unit }: { measurements: GarmentMeasurements; unit: LengthUnit }) {
  const fmt = (v: number) => formatLength(v, unit, { decimal: true });
  const pairs: [string, number][] = isToteMeasurements(m)
    ? [
        ["Width", m.width],
        ["Height", m.height],
      ]
    : [
        ["Chest", m.chestWidth],
        ["Length", m.bodyLength],
      ];
  return (
    <dl className="mt-3 grid grid-cols-2 gap-2 text-sm">
      {pairs.map(([label, value]) => (
        <div key={label} className="rounded-lg border border-paper-200 px-3 py-2">
          <dt className="text-xs text-ink-500">{label}</dt>
          <dd className="measure text-ink-900">{fmt(value)}</dd>
        </div>
      ))}
    </dl>
  );
}

/** A frame just large enough for the biggest drawable size, so the preview keeps one scale as you switch sizes. */
function frameFor(
  category: GarmentCategory,
  all: readonly GarmentMeasurements[],
  side: GarmentSide,
): { width: number; height: number } | undefined {
  let width = 0;
  let height = 0;
  for (const m of all) {
    const s = silhouetteOrNull(category, m, side);
    if (!s) continue;
    const e = silhouetteExtent(s);
    width = Math.max(width, e.width);
    height = Math.max(height, e.height);
  }
  return width > 0 ? { width: width + 3, height: height + 3 } : undefined;
}
