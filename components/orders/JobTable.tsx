"use client";

import { createColumnHelper, flexRender, getCoreRowModel, useReactTable } from "@tanstack/react-table";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useMemo, useRef, useState, useTransition } from "react";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { PageLinks } from "@/components/ui/PageLinks";
import { useHydrated } from "@/components/orders/useHydrated";
import { DECORATION_LABELS, JOB_STATUS_LABELS, JOB_STATUSES, type DecorationMethod, type JobStatus } from "@/lib/jobs";
import { MONEY_STATE_LABELS, type MoneyState } from "@/lib/quotes";
import { DEFAULT_JOB_PAGE_SIZE, JOB_PAGE_SIZES, jobListSearch, pageCount, type JobListQuery, type JobSort } from "@/lib/job-list";

export type JobRow = {
  id: string;
  title: string;
  status: JobStatus;
  method: DecorationMethod;
  dueDate: string | null;
  /** The due date as the shop writes it (lib/dates.ts). */
  dueLabel: string | null;
  rush: boolean;
  clientId: string;
  clientName: string;
  garment: string | null;
  quantity: number;
  /** Absent for roles that see no money. */
  money?: { state: MoneyState; totalCents: number; paidCents: number; balanceCents: number; totalText: string; balanceText: string };
};

const col = createColumnHelper<JobRow>();

/** The column a header sorts by on the server; columns without one do not sort. */
const SORT_OF: Record<string, JobSort> = { title: "title", clientName: "client", status: "status", method: "method", dueDate: "due" };

/** Typing waits this long for a pause before the list is asked again. */
const SEARCH_PAUSE_MS = 300;

/**
 * One page of the shop's jobs. Filters, search, order and page live in the address and the server
 * answers with the page; changing one asks for page 1 of the new question.
 */
export function JobTable({ shopSlug, rows, total, all, query, clients }: { shopSlug: string; rows: JobRow[]; total: number; all: number; query: JobListQuery; clients: Array<{ id: string; name: string }> }) {
  const showMoney = rows.some((r) => r.money);
  const hydrated = useHydrated();
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [search, setSearch] = useState(query.q ?? "");
  // What was last asked for: the controls show it at once, before the server's page arrives.
  const [asked, setAsked] = useState(query);
  const [answered, setAnswered] = useState(query);
  if (jobListSearch(answered) !== jobListSearch(query)) {
    // A new page came (a link, the back button): the controls follow it.
    setAnswered(query);
    setAsked(query);
  }
  const typing = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  const base = `/shops/${shopSlug}/jobs`;
  const hrefOf = (changes: Partial<JobListQuery>) => `${base}${jobListSearch({ ...asked, ...changes })}`;

  /** Asks for the list with these changes (and whatever is typed in the search box), from page 1. */
  const go = (changes: Partial<JobListQuery>, how: "push" | "replace" = "push") => {
    clearTimeout(typing.current);
    const next = { ...asked, q: search.trim() || null, page: 1, ...changes };
    setAsked(next);
    const href = `${base}${jobListSearch(next)}`;
    startTransition(() => (how === "push" ? router.push(href, { scroll: false }) : router.replace(href, { scroll: false })));
  };
  const onSearch = (value: string) => {
    setSearch(value);
    clearTimeout(typing.current);
    typing.current = setTimeout(() => go({ q: value.trim() || null }, "replace"), SEARCH_PAUSE_MS);
  };

  const columns = useMemo(
    () => [
      col.accessor("title", {
        header: "Job",
        cell: (c) => (
          <Link href={`/shops/${shopSlug}/jobs/${c.row.original.id}`} className="font-medium text-ink-900 hover:text-patina-700 hover:underline">
            {c.getValue()}
            {c.row.original.rush ? <span className="ml-2 rounded bg-brick-100 px-1.5 py-0.5 text-xs font-medium text-brick-800">Rush</span> : null}
          </Link>
        ),
      }),
      col.accessor("clientName", { header: "Client" }),
      col.accessor("status", { header: "Status", cell: (c) => <StatusBadge status={c.getValue()} /> }),
      col.accessor("method", { header: "Method", cell: (c) => DECORATION_LABELS[c.getValue()] }),
      col.accessor("quantity", { header: "Pieces", cell: (c) => <span className="measure">{c.getValue()}</span> }),
      col.accessor((r) => r.dueDate ?? "", { id: "dueDate", header: "Due", cell: (c) => <span className="measure">{c.row.original.dueLabel ?? "—"}</span> }),
      ...(showMoney
        ? [
            col.accessor((r) => r.money?.totalCents ?? 0, { id: "total", header: "Quoted", cell: (c) => <span className="measure">{c.getValue() ? c.row.original.money?.totalText : "—"}</span> }),
            col.accessor((r) => r.money?.balanceCents ?? 0, {
              id: "balance",
              header: "Due now",
              cell: (c) => (
                <span>
                  <span className="measure">{c.row.original.money?.totalCents ? c.row.original.money.balanceText : "—"}</span>
                  <span className="block text-xs text-ink-500">{c.row.original.money ? MONEY_STATE_LABELS[c.row.original.money.state] : ""}</span>
                </span>
              ),
            }),
          ]
        : []),
    ],
    [shopSlug, showMoney],
  );

  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({ data: rows, columns, getCoreRowModel: getCoreRowModel(), manualSorting: true, manualFiltering: true, manualPagination: true });

  /** The size runs of every job the filters (and the search box as typed) find, from the server. */
  const exportCsv = () => {
    const a = document.createElement("a");
    a.href = `${base}/size-runs${jobListSearch({ ...asked, q: search.trim() || null, page: 1 })}`;
    a.download = "";
    a.click();
  };

  const pages = pageCount(total, query.pageSize);
  const first = (query.page - 1) * query.pageSize + 1;
  return (
    <div className="space-y-3" data-hydrated={hydrated}>
      <form
        className="card flex flex-wrap items-end gap-3 p-3"
        role="search"
        aria-label="Find jobs"
        action={base}
        method="get"
        onSubmit={(e) => {
          e.preventDefault();
          go({});
        }}
      >
        {asked.sort !== "due" || asked.dir !== "asc" ? (
          <>
            <input type="hidden" name="sort" value={asked.sort} />
            <input type="hidden" name="dir" value={asked.dir} />
          </>
        ) : null}
        {asked.pageSize !== DEFAULT_JOB_PAGE_SIZE ? <input type="hidden" name="size" value={asked.pageSize} /> : null}
        <div className="min-w-48 flex-1">
          <label htmlFor="job-search" className="field-label">
            Search
          </label>
          <input id="job-search" name="q" type="search" className="field-input" placeholder="Job, client or garment" value={search} onChange={(e) => onSearch(e.target.value)} />
        </div>
        <div>
          <label htmlFor="job-filter-status" className="field-label">
            Status
          </label>
          <select id="job-filter-status" name="status" className="field-input" value={asked.status ?? ""} onChange={(e) => go({ status: (e.target.value || null) as JobStatus | null })}>
            <option value="">Any</option>
            {JOB_STATUSES.map((s) => (
              <option key={s} value={s}>
                {JOB_STATUS_LABELS[s]}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="job-filter-client" className="field-label">
            Client
          </label>
          <select id="job-filter-client" name="client" className="field-input" value={asked.clientId ?? ""} onChange={(e) => go({ clientId: e.target.value || null })}>
            <option value="">Any</option>
            {clients.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="job-filter-from" className="field-label">
            Due from
          </label>
          <input id="job-filter-from" name="from" type="date" className="field-input" value={asked.dueFrom ?? ""} onChange={(e) => go({ dueFrom: e.target.value || null })} />
        </div>
        <div>
          <label htmlFor="job-filter-to" className="field-label">
            Due by
          </label>
          <input id="job-filter-to" name="to" type="date" className="field-input" value={asked.dueTo ?? ""} onChange={(e) => go({ dueTo: e.target.value || null })} />
        </div>
        <button type="button" className="btn-quiet" onClick={exportCsv} disabled={total === 0 && search.trim() === (query.q ?? "")}>
          Size runs as CSV
        </button>
      </form>

      <div className="card overflow-x-auto">
        <table className="w-full text-sm" data-testid="job-table" aria-busy={pending}>
          <thead>
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b border-paper-300 text-left">
                {group.headers.map((header) => {
                  const by = SORT_OF[header.column.id];
                  const sorted = by && asked.sort === by ? asked.dir : false;
                  return (
                    <th key={header.id} scope="col" aria-sort={sorted ? (sorted === "asc" ? "ascending" : "descending") : undefined} className="px-3 py-2 text-xs font-medium uppercase tracking-wide text-ink-500">
                      {by ? (
                        <Link
                          href={hrefOf({ sort: by, dir: sorted === "asc" ? "desc" : "asc", page: 1 })}
                          scroll={false}
                          className="inline-flex items-center gap-1 uppercase hover:text-ink-800"
                          onClick={(e) => {
                            e.preventDefault();
                            go({ sort: by, dir: sorted === "asc" ? "desc" : "asc" });
                          }}
                        >
                          {flexRender(header.column.columnDef.header, header.getContext())}
                          <span aria-hidden>{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                        </Link>
                      ) : (
                        flexRender(header.column.columnDef.header, header.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className="divide-y divide-paper-200">
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} className="hover:bg-paper-50">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-2 align-top">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {rows.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-600">
                  {total > 0 ? "No jobs on this page." : "No job matches these filters."}
                </td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>

      <nav className="flex flex-wrap items-center justify-between gap-3 text-sm" aria-label="Pages">
        <span className="text-ink-600">
          {total} of {all} jobs
          {rows.length > 0 ? ` · showing ${first}–${first + rows.length - 1}` : ""}
        </span>
        <div className="flex items-center gap-2">
          <label htmlFor="job-page-size" className="text-ink-600">
            Per page
          </label>
          <select id="job-page-size" className="field-input w-20 py-1" value={asked.pageSize} onChange={(e) => go({ pageSize: Number(e.target.value) })}>
            {JOB_PAGE_SIZES.map((n) => (
              <option key={n}>{n}</option>
            ))}
          </select>
          <PageLinks page={query.page} pages={pages} hrefOf={(n) => `${base}${jobListSearch({ ...query, page: n })}`} />
        </div>
      </nav>
    </div>
  );
}
