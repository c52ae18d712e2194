import Link from "next/link";
import { requireShopPage } from "@/app/_server/access";
import { JobBoard } from "@/components/orders/JobBoard";
import { JobTable, type JobRow } from "@/components/orders/JobTable";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { listClientNames } from "@/db/queries/clients";
import { countJobsByStatus, listBoardColumns, listJobPage, type JobListRow } from "@/db/queries/jobs";
import { can } from "@/lib/access";
import { JOB_STATUSES, type JobStatus } from "@/lib/jobs";
import { BOARD_COLUMN_SIZE, readJobListParams } from "@/lib/job-list";
import { moneySummary } from "@/lib/quotes";
import { loadPriceMatrix } from "@/app/_server/orders";
import { formatShopDate } from "@/lib/dates";
import { formatMoney } from "@/lib/money";

export const dynamic = "force-dynamic";
export const metadata = { title: "Jobs" };

export default async function JobsPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { shop } = await params;
  const asked = await searchParams;
  const board = asked.view === "board";
  const query = readJobListParams(asked);
  const access = await requireShopPage(shop, "jobs.view", `/shops/${shop}/jobs`);
  const seesMoney = can(access.role, "prices.view");
  const shopId = access.shop.id;
  // The board asks for the newest few of each status; the list for one page. Either way only those rows get their sizes and money.
  const counting = countJobsByStatus({ shopId });
  const [counts, listed, clients, prices] = await Promise.all([
    counting,
    board ? listBoardColumns({ shopId, perColumn: BOARD_COLUMN_SIZE }).then((rows) => ({ rows, total: 0 })) : listJobPage({ shopId, query, statusCounts: counting }),
    board ? [] : listClientNames({ shopId }),
    seesMoney ? loadPriceMatrix(shopId) : null,
  ]);
  const all = JOB_STATUSES.reduce((n, s) => n + counts[s], 0);
  const clock = access.shop.clock;
  const cash = (cents: number) => formatMoney(cents, { currency: prices?.matrix.currency, locale: clock.locale });
  const rows: JobRow[] = listed.rows.map((j: JobListRow) => {
    const summary = moneySummary({ quote: j.money.quote, payments: j.money.paid ? [{ state: "paid", amountCents: j.money.paid }] : [] });
    return {
      id: j.id,
      title: j.title,
      status: j.status,
      method: j.method,
      dueDate: j.dueDate,
      dueLabel: j.dueDate ? formatShopDate(j.dueDate, clock) : null,
      rush: j.rush,
      clientId: j.clientId,
      clientName: j.clientName,
      garment: j.garmentName,
      quantity: j.sizeRun.reduce((s, r) => s + r.quantity, 0),
      ...(seesMoney ? { money: { state: summary.state, totalCents: summary.totalCents, paidCents: summary.paidCents, balanceCents: summary.balanceCents, totalText: cash(summary.totalCents), balanceText: cash(summary.balanceCents) } } : {}),
    };
  });
  const movable: readonly JobStatus[] = can(access.role, "jobs.edit") ? JOB_STATUSES : access.role === "production" ? ["cleared", "on-press", "packed", "collected"] : [];
  return (
    <>
      <PageHeader
        title="Jobs"
        lead="Every order, from first proof to pickup."
        actions={
          <>
            <div className="inline-flex rounded-lg border border-paper-300 bg-chalk p-0.5 text-sm" role="group" aria-label="View">
              <Link href={`/shops/${shop}/jobs`} aria-current={board ? undefined : "page"} className={`rounded-md px-3 py-1.5 ${board ? "text-ink-600" : "bg-ink-800 text-chalk"}`}>
                List
              </Link>
              <Link href={`/shops/${shop}/jobs?view=board`} aria-current={board ? "page" : undefined} className={`rounded-md px-3 py-1.5 ${board ? "bg-ink-800 text-chalk" : "text-ink-600"}`}>
                Board
              </Link>
            </div>
            {can(access.role, "jobs.edit") ? (
              <Link href={`/shops/${shop}/jobs/new`} className="btn-primary">
                New job
              </Link>
            ) : null}
          </>
        }
      />
      {all === 0 ? (
        <EmptyState title="No jobs yet">A job holds a client&apos;s garments, sizes and proofs.</EmptyState>
      ) : board ? (
        <JobBoard shopSlug={shop} rows={rows} counts={counts} movable={movable} />
      ) : (
        <JobTable shopSlug={shop} rows={rows} total={listed.total} all={all} query={query} clients={clients} />
      )}
    </>
  );
}
