"use client";

import { useQuery } from "@tanstack/react-query";
import { formatShopDateTime, formatShopTime, type ShopClock } from "@/lib/dates";
import { exportTitle, type ExportSubject } from "@/lib/production/export-names";
import { formatCents } from "@/lib/pricing";
import { formatLength } from "@/lib/units";

export type ExportFile = { n: number; fileName: string; bytes: number; href: string };
export type ExportStatus = {
  id: string;
  kind: string;
  state: "queued" | "running" | "done" | "failed";
  progress: number;
  message: string | null;
  fileName: string | null;
  attempts: number;
  files: ExportFile[];
  /** For a gang sheet: what was packed, as made. */
  summary: { rollWidthIn: number; pieces: number; sheetLengthsIn: number[]; totalLengthIn: number; efficiency: number } | null;
  /** What the export holds (locations, sizes, paper), known once it is made. */
  subject: ExportSubject | null;
  createdAt: string;
  finishedAt: string | null;
};

/** The film price per inch, for those who see prices. */
export type FilmPrice = { centsPerInch: number; currency: string } | null;

/** What a made gang sheet holds: the same facts the planner forecasts, read from the files as made. */
export function madeSheetText(summary: NonNullable<ExportStatus["summary"]>, film: FilmPrice): string {
  const count = summary.sheetLengthsIn.length;
  const lengths = summary.sheetLengthsIn.map((l) => formatLength(l, "in")).join(", ");
  const cost = film ? `, about ${formatCents(Math.ceil(summary.totalLengthIn) * film.centsPerInch, film.currency)}` : "";
  return `As made: ${count} ${count === 1 ? "sheet" : "sheets"} (${lengths}) holding ${summary.pieces} transfers, ${formatLength(summary.totalLengthIn, "in")} of ${summary.rollWidthIn} in film, ${Math.round(summary.efficiency * 100)}% covered${cost}.`;
}

/** How often a running export is asked for its progress: under a second, so the bar moves each second. */
const POLL_MS = 800;

const sizeText = (bytes: number) => (bytes >= 1e6 ? `${(bytes / 1e6).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1e3))} kB`);

async function readStatus(id: string): Promise<ExportStatus> {
  const r = await fetch(`/api/exports/${id}`, { cache: "no-store" });
  if (!r.ok) throw new Error("Could not read the export.");
  return r.json();
}

/** One export on the production page: its progress while it runs, then a download link per file. */
export function ExportItem({ id, onRetry, film = null, clock = {} }: { id: string; onRetry: (id: string) => Promise<void>; film?: FilmPrice; clock?: ShopClock }) {
  const query = useQuery({
    queryKey: ["export", id],
    queryFn: () => readStatus(id),
    refetchInterval: (q) => (q.state.data && (q.state.data.state === "done" || q.state.data.state === "failed") ? false : POLL_MS),
  });
  const e = query.data;
  if (!e) return <li className="card px-4 py-3 text-sm text-ink-500">{query.isError ? "Could not read this export; it will be tried again." : "Loading…"}</li>;
  const label = exportTitle(e.kind, e.subject);
  const when = e.state === "done" && e.finishedAt ? `made ${formatShopDateTime(new Date(e.finishedAt), clock)}` : e.state === "failed" ? null : `asked for at ${formatShopTime(new Date(e.createdAt), clock)}`;
  const pct = Math.round(e.progress * 100);
  const files = e.files ?? [];
  const several = files.length > 1;
  return (
    <li className="card px-4 py-3 text-sm" data-testid="export-row" data-kind={e.kind} data-state={e.state} data-files={files.length}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className="font-medium" data-testid="export-title">
          {label}
        </span>
        <span className="text-xs text-ink-500" data-testid="export-state">
          {e.state === "done" ? (several ? `Ready · ${files.length} files` : "Ready") : e.state === "failed" ? "Failed" : e.state === "queued" ? "Waiting for the worker" : `Working · ${pct}%`}
          {when ? ` · ${when}` : ""}
        </span>
      </div>
      {e.state === "queued" || e.state === "running" ? (
        <div role="progressbar" aria-label={`${label} progress`} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} className="mt-2 h-2 overflow-hidden rounded-full bg-paper-200">
          <div className="h-full rounded-full bg-patina-500 transition-[width]" style={{ width: `${pct}%` }} />
        </div>
      ) : null}
      {e.state === "done" && e.summary ? (
        <p className="mt-1 text-xs text-ink-600" data-testid="export-summary">
          {madeSheetText(e.summary, film)}
        </p>
      ) : null}
      {e.state === "done" && files.length > 0 ? (
        <ul className={several ? "mt-1 grid gap-x-4 gap-y-0.5 sm:grid-cols-2" : "mt-1"} aria-label={several ? `${label} files` : undefined}>
          {files.map((f) => (
            <li key={f.n}>
              <a href={f.href} className="inline-block font-medium text-patina-700 hover:underline" download>
                Download {several ? `sheet ${f.n} of ${files.length}` : f.fileName}
              </a>{" "}
              <span className="text-xs text-ink-500">
                {several ? `${f.fileName}, ` : ""}
                {sizeText(f.bytes)}
              </span>
            </li>
          ))}
        </ul>
      ) : null}
      {e.state === "failed" ? (
        <div className="mt-1 flex flex-wrap items-center gap-2">
          <span className="text-brick-700" role="alert">
            {e.message}
          </span>
          <button
            type="button"
            className="btn-quiet px-2.5 py-1 text-xs"
            onClick={async () => {
              await onRetry(id);
              await query.refetch();
            }}
          >
            Try again
          </button>
        </div>
      ) : null}
    </li>
  );
}
