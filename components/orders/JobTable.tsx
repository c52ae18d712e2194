"use client";

import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getPaginationRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnFiltersState,
  type FilterFn,
  type SortingState,
} from "@tanstack/react-table";
import Papa from "papaparse";
import Link from "next/link";
import { useMemo, useState } from "react";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { useHydrated } from "@/components/orders/useHydrated";
import { DECORATION_LABELS, JOB_STATUS_LABELS, JOB_STATUSES, type DecorationMethod, type JobStatus } from "@/lib/jobs";
import { MONEY_STATE_LABELS, sizeRunTable, type MoneyState } from "@/lib/quotes";
import { fileDateStamp, type ShopClock } from "@/lib/dates";

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
  sizeRun: Array<{ size: string; quantity: number }>;
  /** Absent for roles that see no money. */
  money?: { state: MoneyState; totalCents: number; paidCents: number; balanceCents: number; totalText: string; balanceText: string };
};

const col = createColumnHelper<JobRow>();

const dueBetween: FilterFn<JobRow> = (row, _id, value: { from?: string; to?: string }) => {
  const due = row.original.dueDate;
  if (!value.from && !value.to) return true;
  if (!due) return false;
  return (!value.from || due >= value.from) && (!value.to || due <= value.to);
};

const PAGE_SIZES = [10, 25, 50];

export function JobTable({ shopSlug, rows, clock = {} }: { shopSlug: string; rows: JobRow[]; clock?: ShopClock }) {
  const showMoney = rows.some((r) => r.money);
  const hydrated = useHydrated();
  const [sorting, setSorting] = useState<SortingState>([{ id: "dueDate", desc: false }]);
  const [filters, setFilters] = useState<ColumnFiltersState>([]);
  const [search, setSearch] = useState("");
  const clients = useMemo(() => [...new Map(rows.map((r) => [r.clientId, r.clientName])).entries()].sort((a, b) => a[1].localeCompare(b[1])), [rows]);

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
      col.accessor("clientId", { header: "Client id", enableSorting: false, filterFn: "equals" }),
      col.accessor("status", {
        header: "Status",
        cell: (c) => <StatusBadge status={c.getValue()} />,
        sortingFn: (a, b) => JOB_STATUSES.indexOf(a.original.status) - JOB_STATUSES.indexOf(b.original.status),
        filterFn: "equals",
      }),
      col.accessor("method", { header: "Method", cell: (c) => DECORATION_LABELS[c.getValue()] }),
      col.accessor("quantity", { header: "Pieces", cell: (c) => <span className="measure">{c.getValue()}</span> }),
      col.accessor((r) => r.dueDate ?? "", { id: "dueDate", header: "Due", cell: (c) => <span className="measure">{c.row.original.dueLabel ?? "—"}</span>, filterFn: dueBetween, sortUndefined: "last" }),
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
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting, columnFilters: filters, globalFilter: search, columnVisibility: { clientId: false } },
    onSortingChange: setSorting,
    onColumnFiltersChange: setFilters,
    onGlobalFilterChange: setSearch,
    globalFilterFn: (row, _id, value: string) => {
      const q = value.trim().toLowerCase();
      return !q || row.original.title.toLowerCase().includes(q) || row.original.clientName.toLowerCase().includes(q) || (row.original.garment ?? "").toLowerCase().includes(q);
    },
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    initialState: { pagination: { pageSize: 10 } },
  });

  const filterValue = (id: string) => filters.find((f) => f.id === id)?.value;
  const setFilter = (id: string, value: unknown) => {
    setFilters((prev) => [...prev.filter((f) => f.id !== id), ...(value === undefined || value === "" ? [] : [{ id, value }])]);
    table.setPageIndex(0);
  };
  const due = (filterValue("dueDate") as { from?: string; to?: string } | undefined) ?? {};
  const filtered = table.getFilteredRowModel().rows.map((r) => r.original);

  const exportCsv = () => {
    const { fields, data } = sizeRunTable(filtered.map((j) => ({ title: j.title, client: j.clientName, status: JOB_STATUS_LABELS[j.status], dueDate: j.dueDate, sizeRun: j.sizeRun })));
    const csv = Papa.unparse({ fields, data }, { newline: "\r\n" });
    const url = URL.createObjectURL(new Blob([csv], { type: "text/csv;charset=utf-8" }));
    const a = document.createElement("a");
    a.href = url;
    a.download = `size-runs-${fileDateStamp(new Date(), clock)}.csv`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  };

  const { pageIndex, pageSize } = table.getState().pagination;
  return (
    <div className="space-y-3" data-hydrated={hydrated}>
      <div className="card flex flex-wrap items-end gap-3 p-3" role="search" aria-label="Find jobs">
        <div className="min-w-48 flex-1">
          <label htmlFor="job-search" className="field-label">
            Search
          </label>
          <input id="job-search" type="search" className="field-input" placeholder="Job, client or garment" value={search} onChange={(e) => (setSearch(e.target.value), table.setPageIndex(0))} />
        </div>
        <div>
          <label htmlFor="job-filter-status" className="field-label">
            Status
          </label>
          <select id="job-filter-status" className="field-input" value={(filterValue("status") as string) ?? ""} onChange={(e) => setFilter("status", e.target.value)}>
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
          <select id="job-filter-client" className="field-input" value={(filterValue("clientId") as string) ?? ""} onChange={(e) => setFilter("clientId", e.target.value)}>
            <option value="">Any</option>
            {clients.map(([id, name]) => (
              <option key={id} value={id}>
                {name}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="job-filter-from" className="field-label">
            Due from
          </label>
          <input id="job-filter-from" type="date" className="field-input" value={due.from ?? ""} onChange={(e) => setFilter("dueDate", { ...due, from: e.target.value || undefined })} />
        </div>
        <div>
          <label htmlFor="job-filter-to" className="field-label">
            Due by
          </label>
          <input id="job-filter-to" type="date" className="field-input" value={due.to ?? ""} onChange={(e) => setFilter("dueDate", { ...due, to: e.target.value || undefined })} />
        </div>
        <button type="button" className="btn-quiet" onClick={exportCsv} disabled={filtered.length === 0}>
          Size runs as CSV
        </button>
      </div>

      <div className="card overflow-x-auto">
        <table className="w-full text-sm" data-testid="job-table">
          <thead>
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b border-paper-300 text-left">
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th key={header.id} scope="col" aria-sort={sorted ? (sorted === "asc" ? "ascending" : "descending") : undefined} className="px-3 py-2 text-xs font-medium uppercase tracking-wide text-ink-500">
                      {header.column.getCanSort() ? (
                        <button type="button" className="inline-flex items-center gap-1 uppercase hover:text-ink-800" onClick={header.column.getToggleSortingHandler()}>
                          {flexRender(header.column.columnDef.header, header.getContext())}
                          <span aria-hidden>{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                        </button>
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
            {table.getRowModel().rows.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-600">
                  No job matches these filters.
                </td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>

      <nav className="flex flex-wrap items-center justify-between gap-3 text-sm" aria-label="Pages">
        <span className="text-ink-600">
          {filtered.length} of {rows.length} jobs
          {filtered.length > 0 ? ` · showing ${pageIndex * pageSize + 1}–${Math.min(filtered.length, (pageIndex + 1) * pageSize)}` : ""}
        </span>
        <div className="flex items-center gap-2">
          <label htmlFor="job-page-size" className="text-ink-600">
            Per page
          </label>
          <select id="job-page-size" className="field-input w-20 py-1" value={pageSize} onChange={(e) => table.setPageSize(Number(e.target.value))}>
            {PAGE_SIZES.map((n) => (
              <option key={n}>{n}</option>
            ))}
          </select>
          <button type="button" className="btn-quiet px-3 py-1" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
            Previous
          </button>
          <span className="measure">
            {pageIndex + 1} / {Math.max(1, table.getPageCount())}
          </span>
          <button type="button" className="btn-quiet px-3 py-1" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
            Next
          </button>
        </div>
      </nav>
    </div>
  );
}
