"use client";

import { useRouter } from "next/navigation";
import { useDeferredValue, useMemo, useState } from "react";
import { buildSilhouette } from "@/lib/garments/silhouette";
import { locationSpec } from "@/lib/garments/locations";
import type { GarmentCategory, GarmentMeasurements, SizeGroup } from "@/lib/garments/types";
import type { DecorationMethod } from "@/lib/jobs";
import type { Placement } from "@/lib/placement/model";
import { formatCents } from "@/lib/pricing";
import { expandTransfers, packGangSheet, ROLL_WIDTHS_IN } from "@/lib/production/packing";
import { gangItems, gradingGapText, planSizeText, printPlan, toolsFor, type PrintPlan } from "@/lib/production/print-plan";
import { PAPER_SIZES, type PaperId } from "@/lib/production/tiling";
import { formatLength } from "@/lib/units";
import { ExportItem } from "@/components/production/ExportItem";
import type { ShopClock } from "@/lib/dates";
import { requestExportAction, retryExportAction, saveGradingAction, saveSizeRunAction } from "./actions";

type ChartRow = { size: string; group: SizeGroup; measurements: GarmentMeasurements };
type PrintInfo = {
  proofId: string;
  proofName: string;
  designedOn: string;
  colourHex: string;
  blank: { name: string; category: GarmentCategory; sizeChart: ChartRow[] };
  placement: Placement & { label: string };
  artworkId: string | null;
  saved: { transferCount: number; assignment: Record<string, number> } | null;
};
type ExportRow = { id: string; kind: string; state: string; progress: number; message: string | null; fileName: string | null; createdAt: string };
type Props = {
  shopSlug: string;
  /** The shop's locale and time zone, for the time each export was made. */
  clock?: ShopClock;
  jobId: string;
  method: DecorationMethod;
  canEdit: boolean;
  canGrade: boolean;
  /** The shop's film price per inch of gang sheet; null for roles that do not see prices. */
  film: { centsPerInch: number; currency: string } | null;
  sizeRun: Array<{ size: string; quantity: number }>;
  sparePercent: number;
  prints: PrintInfo[];
  exports: ExportRow[];
};


const TOOL_WORDS = {
  screens: { many: "Screen sizes", one: "screen", lead: "Each screen size is a set of screens (one per ink colour) and a film positive." },
  transfers: { many: "Transfer sizes", one: "transfer", lead: "Each transfer size is packed on the gang sheet." },
  direct: { many: "Print sizes", one: "print size", lead: "Printed straight onto the garment: no transfers and no gang sheet." },
} as const;

type GangSettings = { rollWidthIn: 11 | 13 | 22 | 24; gapIn: number; allowRotation: boolean; maxSheetLengthIn: number };

export function ProductionBoard(props: Props) {
  const router = useRouter();
  const tools = toolsFor(props.method);
  const [run, setRun] = useState(props.sizeRun);
  const [spare, setSpare] = useState(props.sparePercent);
  const [runNote, setRunNote] = useState<string | null>(null);
  const [exportIds, setExportIds] = useState<string[]>(props.exports.map((e) => e.id));
  const [saved, setSaved] = useState<Record<string, PrintInfo["saved"]>>(() => Object.fromEntries(props.prints.map((p) => [p.placement.id, p.saved])));
  const [counts, setCounts] = useState<Record<string, number>>(() => Object.fromEntries(props.prints.map((p) => [p.placement.id, p.saved?.transferCount ?? 2])));
  const total = run.reduce((n, r) => n + r.quantity, 0);
  const unsaved = spare !== props.sparePercent || JSON.stringify(run) !== JSON.stringify(props.sizeRun);

  const plans = useMemo(
    () =>
      props.prints.map((p) => ({
        print: p,
        plan: printPlan({
          method: props.method,
          category: p.blank.category,
          chart: p.blank.sizeChart,
          sizeRun: run,
          placement: p.placement,
          designedOn: p.designedOn,
          saved: saved[p.placement.id] ?? null,
          transferCount: counts[p.placement.id] ?? 2,
          sparePercent: spare,
        }),
      })),
    [props.prints, props.method, run, saved, counts, spare],
  );

  async function requestExport(input: Parameters<typeof requestExportAction>[0]) {
    const r = await requestExportAction(input);
    if (r.ok) setExportIds((ids) => [r.data.exportId, ...ids]);
    else alert(r.error);
  }

  return (
    <div className="space-y-8">
      <section aria-labelledby="run-h">
        <h2 id="run-h" className="mb-3 text-lg">
          Size run <span className="measure text-sm text-ink-500">· {total} garments</span>
        </h2>
        <div className="card overflow-x-auto p-4">
          <table className="measure text-sm">
            <thead>
              <tr>
                {run.map((r) => (
                  <th key={r.size} className="px-2 pb-1 text-center font-medium text-ink-600">
                    {r.size}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              <tr>
                {run.map((r, i) => (
                  <td key={r.size} className="px-1">
                    <input
                      type="number"
                      min={0}
                      step={1}
                      aria-label={`Quantity ${r.size}`}
                      disabled={!props.canEdit}
                      className="field-input w-16 px-2 py-1 text-center"
                      value={r.quantity}
                      onChange={(e) => setRun((all) => all.map((x, j) => (j === i ? { ...x, quantity: Math.max(0, Math.floor(Number(e.target.value) || 0)) } : x)))}
                    />
                  </td>
                ))}
              </tr>
            </tbody>
          </table>
          {tools !== "screens" ? (
            <label className="mt-3 flex items-center gap-2 text-sm">
              Spares per size
              <input
                type="number"
                min={0}
                max={50}
                step={1}
                disabled={!props.canEdit}
                className="field-input w-20 py-1"
                value={spare}
                onChange={(e) => setSpare(Math.min(50, Math.max(0, Number(e.target.value) || 0)))}
              />
              % <span className="text-xs text-ink-500">rounded up for each size, for misprints{tools === "transfers" ? " and weeding" : ""}</span>
            </label>
          ) : null}
          {props.canEdit ? (
            <div className="mt-3 flex items-center gap-3">
              <button
                type="button"
                className="btn-quiet px-3 py-1.5"
                onClick={async () => {
                  const r = await saveSizeRunAction({ shopSlug: props.shopSlug, jobId: props.jobId, sizes: run, sparePercent: spare });
                  setRunNote(r.ok ? "Size run saved." : r.error);
                  router.refresh();
                }}
              >
                Save size run
              </button>
              {runNote ? <span role="status" className="text-sm text-ink-600">{runNote}</span> : null}
              {unsaved ? <span className="text-xs text-ochre-800">Not saved yet: the files use the saved size run.</span> : null}
            </div>
          ) : null}
        </div>
      </section>

      {plans.map(({ print, plan }) => (
        <GradingPanel
          key={print.placement.id}
          shopSlug={props.shopSlug}
          jobId={props.jobId}
          print={print}
          plan={plan}
          count={counts[print.placement.id] ?? 2}
          onCount={(n) => setCounts((c) => ({ ...c, [print.placement.id]: n }))}
          canGrade={props.canGrade}
          onSaved={(grading) => {
            setSaved((all) => ({ ...all, [print.placement.id]: grading }));
            router.refresh();
          }}
          onExport={requestExport}
        />
      ))}

      <section aria-labelledby="exports-h">
        <h2 id="exports-h" className="mb-3 text-lg">
          Files for the press
        </h2>
        <div className="card space-y-4 p-4">
          <div className="flex flex-wrap items-center gap-3">
            <button type="button" className="btn-primary" onClick={() => requestExport({ kind: "spec-sheet", shopSlug: props.shopSlug, jobId: props.jobId })}>
              Make the spec sheet
            </button>
            <span className="text-sm text-ink-600">{TOOL_WORDS[tools].lead}</span>
          </div>
          {tools === "transfers" ? (
            <GangSheetPlanner plans={plans} film={props.film} onSubmit={(kind, o) => requestExport({ shopSlug: props.shopSlug, jobId: props.jobId, kind, ...o })} />
          ) : tools === "screens" ? (
            <ScreenList plans={plans} />
          ) : null}
        </div>
        <ul className="mt-4 space-y-2" aria-label="Exports">
          {exportIds.map((id) => (
            <ExportItem key={id} id={id} film={props.film} clock={props.clock} onRetry={async (exportId) => void (await retryExportAction({ shopSlug: props.shopSlug, exportId }))} />
          ))}
        </ul>
      </section>
    </div>
  );
}

/** Short words for a fit problem, drawn beside the flagged print. Our own wording. */
function flagWord(plan: PrintPlan["sizes"][number]): string | null {
  const codes = new Set(plan.checks.map((c) => c.code));
  if (codes.has("too-wide") || codes.has("too-tall") || codes.has("outside-print-area")) return "Over print area";
  if (codes.has("seam-clearance")) return "Near seam";
  if (codes.has("collar-clearance")) return "Near collar";
  if (codes.has("hem-clearance") || codes.has("pocket-clearance")) return "Near edge";
  if (codes.size) return "Check";
  return null;
}

function GradingPanel(props: {
  shopSlug: string;
  jobId: string;
  print: PrintInfo;
  plan: PrintPlan;
  count: number;
  onCount: (n: number) => void;
  canGrade: boolean;
  onSaved: (grading: { transferCount: number; assignment: Record<string, number> }) => void;
  onExport: (input: Parameters<typeof requestExportAction>[0]) => Promise<void>;
}) {
  const { print, plan } = props;
  const { placement, blank } = print;
  const words = TOOL_WORDS[plan.tools];
  const [note, setNote] = useState<string | null>(null);
  const [paper, setPaper] = useState<PaperId>("letter");
  const [mirror, setMirror] = useState(false);
  const [testSize, setTestSize] = useState(print.designedOn);
  const frame = useMemo(() => {
    let w = 0;
    let h = 0;
    for (const row of blank.sizeChart) {
      const s = buildSilhouette(blank.category, row.measurements, plan.side);
      const xs = s.outline.map((p) => Math.abs(p.x));
      w = Math.max(w, Math.max(...xs) * 2);
      h = Math.max(h, s.hemY - Math.min(...s.outline.map((p) => p.y)));
    }
    return { w: w + 2, h: h + 2 };
  }, [blank, plan.side]);
  const flagged = plan.sizes.filter((s) => s.checks.length > 0);
  const topTitle = plan.topFrom === "collar" ? "Below collar" : "Below top edge";

  async function applySuggestion() {
    if (!plan.suggestion) return;
    const grading = { transferCount: props.count, assignment: plan.suggestion.assignment };
    const r = await saveGradingAction({ shopSlug: props.shopSlug, jobId: props.jobId, placementId: placement.id, ...grading, totalShortfall: plan.suggestion.totalShortfall });
    if (r.ok) {
      props.onSaved(grading);
      setNote("The suggested sizes are now what the spec sheet, test prints and gang sheet use.");
    } else setNote(r.error);
  }

  return (
    <section className="card p-4" aria-label={`Print sizes for ${placement.label}`} data-testid="print-plan" data-location={placement.location}>
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <h2 className="text-lg">
          {placement.label} <span className="text-sm text-ink-500">· {print.proofName}, designed at {formatLength(placement.widthIn, "in")} ink width on size {print.designedOn}</span>
        </h2>
        <label className="flex items-center gap-2 text-sm">
          {words.many} to suggest
          <select className="field-input w-20 py-1" value={props.count} onChange={(e) => props.onCount(Number(e.target.value))}>
            {[1, 2, 3, 4].map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </select>
        </label>
      </div>
      {plan.missing.length ? <p className="mt-1 text-xs text-ochre-800">Not on this blank&apos;s size chart: {plan.missing.join(", ")}.</p> : null}
      {plan.noRoom.length ? <p className="mt-1 text-xs text-ochre-800">No room for a {placement.label.toLowerCase()} print on size {plan.noRoom.join(", ")}.</p> : null}
      <p className="mt-2 text-sm text-ink-700" data-testid="plan-now">
        <strong>{plan.basis === "graded" ? "Printing (saved sizes): " : "Printing as designed: "}</strong>
        {plan.groups.map((g) => `${g.name} ${formatLength(g.widthIn, "in")} × ${formatLength(g.heightIn, "in")} for ${g.sizes.join(", ")}`).join(" · ") || "no sizes in the run."}
      </p>
      {plan.suggestion && plan.suggestionDiffers ? (
        <div className="mt-2 flex flex-wrap items-center gap-3 rounded-card border border-ochre-300 bg-ochre-50 p-3 text-sm text-ochre-900" data-testid="plan-suggestion">
          <span>
            <strong>Suggested: </strong>
            {plan.suggestion.groups.map((g, i) => `${formatLength(g.widthIn, "in")} for ${g.sizes.join(", ")}${i < plan.suggestion!.groups.length - 1 ? " · " : ""}`)}
            {" "}(fits every size&apos;s print area; {gradingGapText(plan.suggestion.largestShortIn)}).
          </span>
          {props.canGrade ? (
            <button type="button" className="btn-quiet px-3 py-1.5" onClick={applySuggestion}>
              Use the suggested sizes
            </button>
          ) : (
            <span className="text-xs">The spec sheet prints this as a suggestion until the shop applies it.</span>
          )}
        </div>
      ) : null}
      {flagged.length ? (
        <p className="mt-2 rounded-card border border-brick-300 bg-brick-50 p-2 text-sm text-brick-800" data-testid="plan-flags">
          <strong>{flagged.length === 1 ? "1 size does not fit: " : `${flagged.length} sizes do not fit: `}</strong>
          {flagged.map((s) => `${s.size} (${flagWord(s)?.toLowerCase()})`).join(", ")}. Details are in the table below.
        </p>
      ) : null}
      {note ? (
        <p role="status" className="mt-2 text-sm text-ink-600">
          {note}
        </p>
      ) : null}
      <div className="mt-3 flex gap-3 overflow-x-auto pb-2" aria-label="Every size at the same scale">
        {plan.sizes.map((s) => {
          const row = blank.sizeChart.find((r) => r.size === s.size)!;
          const outline = buildSilhouette(blank.category, row.measurements, plan.side);
          const spec = locationSpec({ location: placement.location, category: blank.category, group: row.group, measurements: row.measurements });
          const top = Math.min(...outline.outline.map((p) => p.y)) - 1;
          const d = outline.outline.map((p, i) => `${i ? "L" : "M"}${p.x.toFixed(2)} ${p.y.toFixed(2)}`).join(" ") + "Z";
          const flag = flagWord(s);
          const x = s.fromCentreIn - s.widthIn / 2;
          return (
            <figure key={s.size} className="shrink-0 text-center">
              <svg viewBox={`${-frame.w / 2} ${top} ${frame.w} ${frame.h}`} width={96} height={(96 * frame.h) / frame.w} role="img" aria-label={`Size ${s.size}: ink ${s.widthIn.toFixed(2)} by ${s.heightIn.toFixed(2)} inches${flag ? `, ${flag.toLowerCase()}` : ""}`}>
                <path d={d} fill={print.colourHex} stroke="#4c515a" strokeWidth={0.15} />
                <rect x={spec.printArea.x} y={spec.printArea.y} width={spec.printArea.width} height={spec.printArea.height} fill="none" stroke="#94c6be" strokeWidth={0.12} strokeDasharray="0.4 0.3" />
                <rect x={x} y={s.topIn} width={s.widthIn} height={s.heightIn} fill="#b7791f" opacity={0.85} />
                {flag ? <rect x={x - 0.5} y={s.topIn - 0.5} width={s.widthIn + 1} height={s.heightIn + 1} fill="none" stroke="#a23b2a" strokeWidth={0.35} strokeDasharray="0.9 0.45" /> : null}
              </svg>
              <figcaption className="measure mt-1 text-xs">
                <span className="block font-medium text-ink-800">
                  {s.size} × {s.toMake}
                </span>
                <span className="text-ink-500">
                  {s.group} · {formatLength(s.widthIn, "in")}
                </span>
                {flag ? <span className="mt-0.5 block rounded bg-brick-100 px-1 font-medium text-brick-800">{flag}</span> : null}
              </figcaption>
            </figure>
          );
        })}
      </div>
      <div className="mt-2 overflow-x-auto">
        <table className="measure w-full whitespace-nowrap text-left text-xs" aria-label={`${placement.label}: every size's print`}>
          <thead className="text-ink-500">
            <tr>
              <th className="py-1 pr-3 font-medium">Size</th>
              <th className="py-1 pr-3 font-medium">To make</th>
              <th className="py-1 pr-3 font-medium">Ink W × H</th>
              <th className="py-1 pr-3 font-medium">{topTitle}</th>
              <th className="py-1 pr-3 font-medium">From centre</th>
              <th className="py-1 pr-3 font-medium">{words.one[0]!.toUpperCase() + words.one.slice(1)}</th>
              <th className="py-1 font-medium">Checks</th>
            </tr>
          </thead>
          <tbody>
            {plan.sizes.map((s) => {
              const t = planSizeText(plan, s);
              return (
                <tr key={s.size} className={`border-t border-paper-200 ${s.checks.length ? "bg-brick-50" : ""}`} data-testid="plan-row" data-size={s.size}>
                  <td className="py-1 pr-3 font-medium">{t.size}</td>
                  <td className="py-1 pr-3">{t.count}</td>
                  <td className="py-1 pr-3" data-testid="plan-ink">{t.ink}</td>
                  <td className="py-1 pr-3">{t.top}</td>
                  <td className="py-1 pr-3">{t.fromCentre}</td>
                  <td className="py-1 pr-3">{t.group}</td>
                  <td className="min-w-48 whitespace-normal py-1 text-brick-800">{t.checks.length ? t.checks.join(" ") : <span className="text-patina-700">Fits</span>}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <div className="mt-3 flex flex-wrap items-center gap-3 border-t border-paper-200 pt-3">
        <span className="ml-auto flex flex-wrap items-center gap-2 text-sm">
          <span>Paper test print:</span>
          <select className="field-input w-24 py-1" aria-label="Size to test" value={testSize} onChange={(e) => setTestSize(e.target.value)}>
            {blank.sizeChart.map((r) => (
              <option key={r.size} value={r.size}>
                {r.size}
              </option>
            ))}
          </select>
          <select className="field-input w-auto py-1" aria-label="Paper" value={paper} onChange={(e) => setPaper(e.target.value as PaperId)}>
            {Object.values(PAPER_SIZES).map((p) => (
              <option key={p.id} value={p.id}>
                {p.label}
              </option>
            ))}
          </select>
          <label className="flex items-center gap-1">
            <input type="checkbox" className="accent-patina-600" checked={mirror} onChange={(e) => setMirror(e.target.checked)} /> Mirror (HTV, sublimation)
          </label>
          <button type="button" className="btn-quiet px-3 py-1.5" onClick={() => props.onExport({ kind: "test-print", shopSlug: props.shopSlug, jobId: props.jobId, proofId: print.proofId, placementId: placement.id, size: testSize, paper, mirror, outline: true })}>
            Make test print
          </button>
        </span>
      </div>
    </section>
  );
}

function ScreenList({ plans }: { plans: Array<{ print: PrintInfo; plan: PrintPlan }> }) {
  return (
    <div className="text-sm" data-testid="screen-list">
      <h3 className="mb-1 font-medium">Screens and film positives</h3>
      <ul className="measure list-disc space-y-1 pl-5">
        {plans.flatMap(({ print, plan }) =>
          plan.groups.map((g) => (
            <li key={`${print.placement.id}-${g.name}`}>
              {print.placement.label} {g.name}: art {formatLength(g.widthIn, "in")} × {formatLength(g.heightIn, "in")} for {g.sizes.join(", ")}; film positive {g.film ? `${formatLength(g.film.widthIn, "in")} × ${formatLength(g.film.heightIn, "in")}` : "—"}.
            </li>
          )),
        )}
      </ul>
      <p className="mt-1 text-xs text-ink-500">Film positives allow 1 in around the art for registration marks and tape. One screen per ink colour for each screen size.</p>
    </div>
  );
}

function GangSheetPlanner({ plans, film, onSubmit }: { plans: Array<{ print: PrintInfo; plan: PrintPlan }>; film: Props["film"]; onSubmit: (kind: "gang-sheet-png" | "gang-sheet-pdf", o: GangSettings) => void }) {
  const [settings, setSettings] = useState<GangSettings>({ rollWidthIn: 22, gapIn: 0.25, allowRotation: true, maxSheetLengthIn: 120 });
  const deferred = useDeferredValue(settings);
  const items = useMemo(() => gangItems(plans.filter((p) => p.print.artworkId).map((p) => ({ plan: p.plan, artworkId: p.print.artworkId! }))), [plans]);
  const packed = useMemo(() => {
    if (!items.length) return { ok: false as const, message: "No transfers to pack: add quantities to the size run." };
    try {
      return { ok: true as const, result: packGangSheet({ pieces: expandTransfers(items, 0), ...deferred }) };
    } catch (error) {
      return { ok: false as const, message: error instanceof Error ? error.message : "These settings cannot be packed." };
    }
  }, [items, deferred]);
  const set = <K extends keyof GangSettings>(key: K, value: GangSettings[K]) => setSettings((s) => ({ ...s, [key]: value }));
  const pieces = items.reduce((n, i) => n + i.quantity, 0);
  return (
    <div className="space-y-3 border-t border-paper-200 pt-3">
      <div className="flex flex-wrap items-end gap-2 text-sm">
        <label>
          <span className="field-label">Roll width</span>
          <select className="field-input w-24 py-1" value={settings.rollWidthIn} onChange={(e) => set("rollWidthIn", Number(e.target.value) as GangSettings["rollWidthIn"])}>
            {ROLL_WIDTHS_IN.map((w) => (
              <option key={w} value={w}>
                {w} in
              </option>
            ))}
          </select>
        </label>
        <label>
          <span className="field-label">Gap (in)</span>
          <input type="number" step={0.125} min={0} max={2} className="field-input w-20 py-1" value={settings.gapIn} onChange={(e) => set("gapIn", Math.min(2, Math.max(0, Number(e.target.value) || 0)))} />
        </label>
        <label>
          <span className="field-label">Longest sheet (in)</span>
          <input type="number" step={1} min={12} max={600} className="field-input w-24 py-1" value={settings.maxSheetLengthIn} onChange={(e) => set("maxSheetLengthIn", Math.min(600, Math.max(12, Number(e.target.value) || 12)))} />
        </label>
        <label className="flex items-center gap-1 pb-2">
          <input type="checkbox" className="accent-patina-600" checked={settings.allowRotation} onChange={(e) => set("allowRotation", e.target.checked)} /> Allow turning
        </label>
        <button type="button" className="btn-quiet px-3 py-1.5" disabled={!packed.ok} onClick={() => onSubmit("gang-sheet-png", settings)}>
          Gang sheet PNG
        </button>
        <button type="button" className="btn-quiet px-3 py-1.5" disabled={!packed.ok} onClick={() => onSubmit("gang-sheet-pdf", settings)}>
          Gang sheet PDF
        </button>
      </div>
      {packed.ok ? (
        <div className="measure text-sm text-ink-700" data-testid="gang-forecast" aria-live="polite">
          <p>
            <strong>
              {packed.result.sheets.length} {packed.result.sheets.length === 1 ? "sheet" : "sheets"}
            </strong>{" "}
            for {pieces} transfers ({items.map((i) => `${i.quantity} × ${formatLength(i.widthIn, "in")}`).join(", ")}), spares included. Film used: {formatLength(packed.result.totalLengthIn, "in")} of {settings.rollWidthIn} in roll, {Math.round(packed.result.efficiency * 100)}% covered by transfers
            {film ? `, about ${formatCents(Math.ceil(packed.result.totalLengthIn) * film.centsPerInch, film.currency)} at ${formatCents(film.centsPerInch, film.currency)} per inch` : ""}.
          </p>
          <p className="text-xs text-ink-500">Sheet lengths: {packed.result.sheets.map((s, i) => `${i + 1}: ${formatLength(s.lengthIn, "in")}`).join(" · ")}</p>
        </div>
      ) : (
        <p className="text-sm text-brick-800" role="alert">
          {packed.message}
        </p>
      )}
    </div>
  );
}
