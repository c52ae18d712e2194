"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useOptimistic, useState, useTransition } from "react";
import { setJobStatusAction } from "@/app/shops/[shop]/jobs/actions";
import { DECORATION_LABELS, JOB_STATUS_LABELS, JOB_STATUSES, type JobStatus } from "@/lib/jobs";
import { MONEY_STATE_LABELS } from "@/lib/quotes";
import { jobListSearch } from "@/lib/job-list";
import { Notice } from "./Notice";
import { useHydrated } from "@/components/orders/useHydrated";
import type { JobRow } from "./JobTable";

/**
 * Jobs in columns by status: the most recently changed few of each, with the column's full count
 * and a link to the rest in the list. Each card moves with its own menu, so the board works by
 * keyboard too.
 */
export function JobBoard({ shopSlug, rows, counts, movable }: { shopSlug: string; rows: JobRow[]; counts: Record<JobStatus, number>; movable: readonly JobStatus[] }) {
  const router = useRouter();
  const hydrated = useHydrated();
  const [error, setError] = useState<string>();
  const [said, setSaid] = useState("");
  const [pending, startTransition] = useTransition();
  const [optimistic, move] = useOptimistic(rows, (state, change: { id: string; status: JobStatus }) => state.map((r) => (r.id === change.id ? { ...r, status: change.status } : r)));

  const onMove = (id: string, status: JobStatus) =>
    startTransition(async () => {
      setError(undefined);
      const title = rows.find((r) => r.id === id)?.title ?? "The job";
      setSaid(`Moving ${title} to ${JOB_STATUS_LABELS[status]}…`);
      move({ id, status });
      const result = await setJobStatusAction({ shopSlug, jobId: id, status });
      if (!result.ok) {
        setError(result.error);
        setSaid("");
      } else setSaid(`${title} is now in ${JOB_STATUS_LABELS[status]}.`);
      router.refresh();
    });

  return (
    <div className="space-y-3" data-hydrated={hydrated}>
      {error ? <Notice tone="error">{error}</Notice> : null}
      <p role="status" aria-busy={pending} className="min-h-5 text-sm text-ink-600" data-testid="board-said">
        {said}
      </p>
      {/* Three columns a row until the screen has room for all six at their readable width. */}
      <div className="grid gap-3 pb-2 sm:grid-cols-2 lg:grid-cols-3 2xl:grid-cols-6" data-testid="job-board">
        {JOB_STATUSES.map((status) => {
          const cards = optimistic.filter((r) => r.status === status);
          // The server's count, moved by the cards moved here and not yet confirmed.
          const inColumn = counts[status] + cards.length - rows.filter((r) => r.status === status).length;
          const rest = inColumn - cards.length;
          return (
            <section key={status} aria-label={JOB_STATUS_LABELS[status]} className="min-w-0 rounded-card bg-paper-100 p-2">
              <h2 className="mb-2 flex items-center justify-between px-1 text-sm font-semibold">
                {JOB_STATUS_LABELS[status]} <span className="measure font-normal text-ink-500">{inColumn}</span>
              </h2>
              <ul className="space-y-2">
                {cards.map((job) => (
                  <li key={job.id} className="card p-3 text-sm" data-testid="board-card">
                    <Link href={`/shops/${shopSlug}/jobs/${job.id}`} className="font-medium text-ink-900 hover:underline">
                      {job.title}
                    </Link>
                    <p className="text-ink-600">{job.clientName}</p>
                    <p className="measure mt-1 text-xs text-ink-500">
                      {job.quantity} pcs · {DECORATION_LABELS[job.method]}
                      {job.dueLabel ? ` · due ${job.dueLabel}` : ""}
                    </p>
                    {job.money ? <p className="mt-1 text-xs text-patina-800">{MONEY_STATE_LABELS[job.money.state]}</p> : null}
                    {movable.length ? (
                      <label className="mt-2 block text-xs text-ink-600">
                        <span className="mb-0.5 block">Move to</span>
                        {/* The name starts with the visible words; the job's title tells one card's select from the next. */}
                        <select className="field-input w-full min-w-0 py-1 text-xs" value={job.status} onChange={(e) => onMove(job.id, e.target.value as JobStatus)} aria-label={`Move to: ${job.title}`}>
                          {JOB_STATUSES.map((s) => (
                            <option key={s} value={s} disabled={s !== job.status && (!movable.includes(s) || (movable.length < JOB_STATUSES.length && !movable.includes(job.status)))}>
                              {JOB_STATUS_LABELS[s]}
                            </option>
                          ))}
                        </select>
                      </label>
                    ) : null}
                  </li>
                ))}
              </ul>
              {rest > 0 ? (
                <p className="mt-2 px-1 text-sm">
                  <Link href={`/shops/${shopSlug}/jobs${jobListSearch({ status, sort: "updated", dir: "desc" })}`} className="font-medium text-patina-700 hover:underline">
                    {rest} more in the list →
                  </Link>
                </p>
              ) : null}
            </section>
          );
        })}
      </div>
    </div>
  );
}
