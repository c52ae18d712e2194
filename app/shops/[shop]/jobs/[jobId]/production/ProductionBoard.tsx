"use client";

import { useQuery } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { locationSpec } from "@/lib/garments/locations";
import { buildSilhouette } from "@/lib/garments/silhouette";
import type { GarmentCategory, GarmentMeasurements, SizeGroup } from "@/lib/garments/types";
import type { Placement } from "@/lib/placement/model";
import { gradeSizeRun } from "@/lib/production/grading";
import { gradingSizes, printsPerSize } from "@/lib/production/plan";
import { ROLL_WIDTHS_IN } from "@/lib/production/packing";
import { PAPER_SIZES, type PaperId } from "@/lib/production/tiling";
import { formatLength } from "@/lib/units";
import { requestExportAction, retryExportAction, saveGradingAction, saveSizeRunAction } from "./actions";

type ProofInfo = {
  id: string;
  name: string;
  size: string;
  colourHex: string;
  blank: { name: string; category: GarmentCategory; sizeChart: Array<{ size: string; group: SizeGroup; measurements: GarmentMeasurements }> };
  placements: Array<Placement & { label: string }>;
};
type ExportRow = { id: string; kind: string; state: string; progress: number; message: string | null; fileName: string | null; createdAt: string };
type Props = {
  shopSlug: string;
  jobId: string;
  canEdit: boolean;
  sizeRun: Array<{ size: string; quantity: number }>;
  proofs: ProofInfo[];
  gradings: Array<{ placementId: string; transferCount: number; assignment: Record<string, number> }>;
  exports: ExportRow[];
};

const KIND_LABELS: Record<string, string> = { "spec-sheet": "Spec sheet (PDF)", "test-print": "Test print (PDF)", "gang-sheet-png": "Gang sheet (PNG, 300 ppi)", "gang-sheet-pdf": "Gang sheet (PDF)" };

export function ProductionBoard(props: Props) {
  const router = useRouter();
  const [run, setRun] = useState(props.sizeRun);
  const [runNote, setRunNote] = useState<string | null>(null);
  const [exportIds, setExportIds] = useState<string[]>(props.exports.map((e) => e.id));
  const total = run.reduce((n, r) => n + r.quantity, 0);

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
          {props.canEdit ? (
            <div className="mt-3 flex items-center gap-3">
              <button
                type="button"
                className="btn-quiet px-3 py-1.5"
                onClick={async () => {
                  const r = await saveSizeRunAction({ shopSlug: props.shopSlug, jobId: props.jobId, sizes: run });
                  setRunNote(r.ok ? "Size run saved." : r.error);
                  router.refresh();
                }}
              >
                Save size run
              </button>
              {runNote ? <span role="status" className="text-sm text-ink-600">{runNote}</span> : null}
            </div>
          ) : null}
        </div>
      </section>

      {props.proofs.map((proof) =>
        proof.placements.map((p) => (
          <GradingPanel key={p.id} shopSlug={props.shopSlug} jobId={props.jobId} proof={proof} placement={p} sizeRun={run} saved={props.gradings.find((g) => g.placementId === p.id) ?? null} canEdit={props.canEdit} onExport={requestExport} />
        )),
      )}

      <section aria-labelledby="exports-h">
        <h2 id="exports-h" className="mb-3 text-lg">
          Files for the press
        </h2>
        <div className="card flex flex-wrap gap-3 p-4">
          <button type="button" className="btn-primary" onClick={() => requestExport({ kind: "spec-sheet", shopSlug: props.shopSlug, jobId: props.jobId })}>
            Make the spec sheet
          </button>
          <GangSheetForm onSubmit={(o) => requestExport({ shopSlug: props.shopSlug, jobId: props.jobId, ...o })} />
        </div>
        <ul className="mt-4 space-y-2" aria-label="Exports">
          {exportIds.map((id) => (
            <ExportItem key={id} id={id} shopSlug={props.shopSlug} />
          ))}
        </ul>
      </section>
    </div>
  );
}

function GradingPanel(props: {
  shopSlug: string;
  jobId: string;
  proof: ProofInfo;
  placement: Placement & { label: string };
  sizeRun: Array<{ size: string; quantity: number }>;
  saved: { transferCount: number; assignment: Record<string, number> } | null;
  canEdit: boolean;
  onExport: (input: Parameters<typeof requestExportAction>[0]) => Promise<void>;
}) {
  const { proof, placement } = props;
  const [k, setK] = useState(props.saved?.transferCount ?? 2);
  const [note, setNote] = useState<string | null>(null);
  const [paper, setPaper] = useState<PaperId>("letter");
  const [mirror, setMirror] = useState(false);
  const [testSize, setTestSize] = useState(proof.size);
  const { sizes, missing, noRoom } = useMemo(
    () => gradingSizes({ category: proof.blank.category, chart: proof.blank.sizeChart, sizeRun: props.sizeRun, placement, designedOn: proof.size }),
    [proof, placement, props.sizeRun],
  );
  const result = useMemo(() => (sizes.length ? gradeSizeRun(sizes, k) : null), [sizes, k]);
  const prints = printsPerSize({ placement, sizeRun: props.sizeRun.filter((r) => !missing.includes(r.size) && !noRoom.includes(r.size)), assignment: result?.assignment ?? null });
  const frame = useMemo(() => {
    let w = 0;
    let h = 0;
    for (const row of proof.blank.sizeChart) {
      const s = buildSilhouette(proof.blank.category, row.measurements, "front");
      const xs = s.outline.map((p) => Math.abs(p.x));
      w = Math.max(w, Math.max(...xs) * 2);
      h = Math.max(h, s.hemY - Math.min(...s.outline.map((p) => p.y)));
    }
    return { w: w + 2, h: h + 2 };
  }, [proof.blank]);

  return (
    <section className="card p-4" aria-label={`Print sizes for ${placement.label}`}>
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <h2 className="text-lg">
          {placement.label} <span className="text-sm text-ink-500">· {proof.name}, designed at {formatLength(placement.widthIn, "in")} wide on size {proof.size}</span>
        </h2>
        <label className="flex items-center gap-2 text-sm">
          Transfer sizes
          <select className="field-input w-20 py-1" value={k} onChange={(e) => setK(Number(e.target.value))} aria-label="Number of transfer sizes">
            {[1, 2, 3, 4].map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </select>
        </label>
      </div>
      {missing.length ? <p className="mt-1 text-xs text-ochre-800">Not on this blank&apos;s size chart: {missing.join(", ")}.</p> : null}
      {noRoom.length ? <p className="mt-1 text-xs text-ochre-800">No room for a {placement.label.toLowerCase()} print on size {noRoom.join(", ")}.</p> : null}
      {result ? (
        <p className="mt-2 text-sm text-ink-700" data-testid="grading-summary">
          {result.groups.map((g, i) => `T${i + 1} ${formatLength(g.widthIn, "in")} for ${g.sizes.join(", ")}`).join(" · ")}. Shortfall from ideal: {result.totalShortfall.toFixed(2)} garment-inches.
        </p>
      ) : null}
      <div className="mt-3 flex gap-3 overflow-x-auto pb-2" aria-label="Every size at the same scale">
        {prints.map((print) => {
          const row = proof.blank.sizeChart.find((r) => r.size === print.size)!;
          const s = buildSilhouette(proof.blank.category, row.measurements, "front");
          const spec = locationSpec({ location: placement.location, category: proof.blank.category, group: row.group, measurements: row.measurements });
          const top = Math.min(...s.outline.map((p) => p.y)) - 1;
          const d = s.outline.map((p, i) => `${i ? "L" : "M"}${p.x.toFixed(2)} ${p.y.toFixed(2)}`).join(" ") + "Z";
          return (
            <figure key={print.size} className="shrink-0 text-center">
              <svg viewBox={`${-frame.w / 2} ${top} ${frame.w} ${frame.h}`} width={96} height={(96 * frame.h) / frame.w} role="img" aria-label={`Size ${print.size}: print ${print.widthIn.toFixed(2)} inches wide`}>
                <path d={d} fill={proof.colourHex} stroke="#4c515a" strokeWidth={0.15} />
                <rect x={spec.printArea.x} y={spec.printArea.y} width={spec.printArea.width} height={spec.printArea.height} fill="none" stroke="#94c6be" strokeWidth={0.12} strokeDasharray="0.4 0.3" />
                <rect x={print.offsetFromCenterIn - print.widthIn / 2} y={print.belowCollarIn} width={print.widthIn} height={print.heightIn} fill="#b7791f" opacity={0.85} />
              </svg>
              <figcaption className="measure mt-1 text-xs">
                <span className="block font-medium text-ink-800">
                  {print.size} × {print.quantity}
                </span>
                <span className="text-ink-500">{print.transfer.split(" · ")[0]} · {formatLength(print.widthIn, "in")}</span>
              </figcaption>
            </figure>
          );
        })}
      </div>
      <div className="mt-3 flex flex-wrap items-center gap-3 border-t border-paper-200 pt-3">
        {props.canEdit && result ? (
          <button
            type="button"
            className="btn-quiet px-3 py-1.5"
            onClick={async () => {
              const r = await saveGradingAction({ shopSlug: props.shopSlug, jobId: props.jobId, placementId: placement.id, transferCount: k, assignment: result.assignment, totalShortfall: result.totalShortfall });
              setNote(r.ok ? "These print sizes are now used for the spec sheet and gang sheet." : r.error);
            }}
          >
            Use these sizes
          </button>
        ) : null}
        {note ? <span role="status" className="text-sm text-ink-600">{note}</span> : null}
        <span className="ml-auto flex flex-wrap items-center gap-2 text-sm">
          <span>Paper test print:</span>
          <select className="field-input w-24 py-1" aria-label="Size to test" value={testSize} onChange={(e) => setTestSize(e.target.value)}>
            {proof.blank.sizeChart.map((r) => (
              <option key={r.size} value={r.size}>
                {r.size}
              </option>
            ))}
          </select>
          <select className="field-input w-28 py-1" aria-label="Paper" value={paper} onChange={(e) => setPaper(e.target.value as PaperId)}>
            {Object.values(PAPER_SIZES).map((p) => (
              <option key={p.id} value={p.id}>
                {p.label}
              </option>
            ))}
          </select>
          <label className="flex items-center gap-1">
            <input type="checkbox" className="accent-patina-600" checked={mirror} onChange={(e) => setMirror(e.target.checked)} /> Mirror (HTV, sublimation)
          </label>
          <button type="button" className="btn-quiet px-3 py-1.5" onClick={() => props.onExport({ kind: "test-print", shopSlug: props.shopSlug, jobId: props.jobId, proofId: proof.id, placementId: placement.id, size: testSize, paper, mirror, outline: true })}>
            Make test print
          </button>
        </span>
      </div>
    </section>
  );
}

function GangSheetForm({ onSubmit }: { onSubmit: (o: { kind: "gang-sheet-png" | "gang-sheet-pdf"; rollWidthIn: 11 | 13 | 22 | 24; gapIn: number; sparePercent: number; allowRotation: boolean; maxSheetLengthIn: number }) => void }) {
  const [roll, setRoll] = useState<11 | 13 | 22 | 24>(22);
  const [gap, setGap] = useState(0.25);
  const [spare, setSpare] = useState(5);
  const [rotate, setRotate] = useState(true);
  const [maxLength, setMaxLength] = useState(120);
  return (
    <div className="flex flex-wrap items-end gap-2 text-sm">
      <label>
        <span className="field-label">Roll width</span>
        <select className="field-input w-24 py-1" value={roll} onChange={(e) => setRoll(Number(e.target.value) as 11 | 13 | 22 | 24)}>
          {ROLL_WIDTHS_IN.map((w) => (
            <option key={w} value={w}>
              {w} in
            </option>
          ))}
        </select>
      </label>
      <label>
        <span className="field-label">Gap (in)</span>
        <input type="number" step={0.125} min={0} max={2} className="field-input w-20 py-1" value={gap} onChange={(e) => setGap(Number(e.target.value))} />
      </label>
      <label>
        <span className="field-label">Spares %</span>
        <input type="number" step={1} min={0} max={50} className="field-input w-20 py-1" value={spare} onChange={(e) => setSpare(Number(e.target.value))} />
      </label>
      <label>
        <span className="field-label">Max sheet (in)</span>
        <input type="number" step={1} min={12} max={600} className="field-input w-24 py-1" value={maxLength} onChange={(e) => setMaxLength(Number(e.target.value))} />
      </label>
      <label className="flex items-center gap-1 pb-2">
        <input type="checkbox" className="accent-patina-600" checked={rotate} onChange={(e) => setRotate(e.target.checked)} /> Allow turning
      </label>
      <button type="button" className="btn-quiet px-3 py-1.5" onClick={() => onSubmit({ kind: "gang-sheet-png", rollWidthIn: roll, gapIn: gap, sparePercent: spare, allowRotation: rotate, maxSheetLengthIn: maxLength })}>
        Gang sheet PNG
      </button>
      <button type="button" className="btn-quiet px-3 py-1.5" onClick={() => onSubmit({ kind: "gang-sheet-pdf", rollWidthIn: roll, gapIn: gap, sparePercent: spare, allowRotation: rotate, maxSheetLengthIn: maxLength })}>
        Gang sheet PDF
      </button>
    </div>
  );
}

function ExportItem({ id, shopSlug }: { id: string; shopSlug: string }) {
  const query = useQuery<ExportRow & { attempts: number }>({
    queryKey: ["export", id],
    queryFn: async () => {
      const r = await fetch(`/api/exports/${id}`, { cache: "no-store" });
      if (!r.ok) throw new Error("Could not read the export.");
      return r.json();
    },
    refetchInterval: (q) => (q.state.data && (q.state.data.state === "done" || q.state.data.state === "failed") ? false : 800),
  });
  const e = query.data;
  if (!e) return <li className="card px-4 py-3 text-sm text-ink-500">Loading…</li>;
  const pct = Math.round(e.progress * 100);
  return (
    <li className="card px-4 py-3 text-sm" data-testid="export-row" data-kind={e.kind} data-state={e.state}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className="font-medium">{KIND_LABELS[e.kind] ?? e.kind}</span>
        <span className="text-xs text-ink-500">{e.state === "done" ? "Ready" : e.state === "failed" ? "Failed" : e.state === "queued" ? "Waiting for the worker" : `Working · ${pct}%`}</span>
      </div>
      {e.state === "queued" || e.state === "running" ? (
        <div role="progressbar" aria-label={`${KIND_LABELS[e.kind] ?? e.kind} progress`} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} className="mt-2 h-2 overflow-hidden rounded-full bg-paper-200">
          <div className="h-full rounded-full bg-patina-500 transition-[width]" style={{ width: `${pct}%` }} />
        </div>
      ) : null}
      {e.state === "done" ? (
        <a href={`/api/exports/${id}/file`} className="mt-1 inline-block font-medium text-patina-700 hover:underline" download>
          Download {e.fileName}
        </a>
      ) : null}
      {e.state === "failed" ? (
        <div className="mt-1 flex flex-wrap items-center gap-2">
          <span className="text-brick-700" role="alert">
            {e.message}
          </span>
          <button type="button" className="btn-quiet px-2.5 py-1 text-xs" onClick={async () => { await retryExportAction({ shopSlug, exportId: id }); await query.refetch(); }}>
            Try again
          </button>
        </div>
      ) : null}
    </li>
  );
}
