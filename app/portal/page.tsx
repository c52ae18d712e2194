import { requireActorPage } from "@/app/_server/access";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";
import Link from "next/link";
import { formatShopDate } from "@/lib/dates";
import { listJobsForClients } from "@/db/queries/jobs";
import { listSharedProofsForClients } from "@/db/queries/review";
import { PageLinks } from "@/components/ui/PageLinks";
import { pageCount, PORTAL_PAGE_SIZE, readPage } from "@/lib/job-list";

export const dynamic = "force-dynamic";
export const metadata = { title: "My jobs" };

export default async function PortalPage({ searchParams }: { searchParams: Promise<{ page?: string | string[] }> }) {
  const actor = await requireActorPage("/portal");
  const clientIds = actor.contacts.map((c) => c.clientId);
  const page = readPage((await searchParams).page);
  // One page of jobs, and the shared proofs of that page's jobs only.
  const { rows: jobs, total } = await listJobsForClients({ clientIds, page, pageSize: PORTAL_PAGE_SIZE });
  const shared = await listSharedProofsForClients({ clientIds, jobIds: jobs.map((j) => j.id) });
  const pages = pageCount(total, PORTAL_PAGE_SIZE);
  const first = (page - 1) * PORTAL_PAGE_SIZE + 1;
  return (
    <>
      <PageHeader title="My jobs" lead="Quotes, payments and proofs from your print shop." />
      {jobs.length === 0 && total > 0 ? (
        <EmptyState title="No jobs on this page" action={<PageLinks page={page} pages={pages} hrefOf={(n) => (n > 1 ? `/portal?page=${n}` : "/portal")} />}>
          There are {total} jobs, on {pages} pages.
        </EmptyState>
      ) : jobs.length === 0 ? (
        <EmptyState title="Nothing to review yet">When your print shop shares a proof with you, it appears here.</EmptyState>
      ) : (
        <ul className="card divide-y divide-paper-200">
          {jobs.map((job) => (
            <li key={job.id} className="flex flex-wrap items-center justify-between gap-3 px-4 py-3">
              <span>
                <Link href={`/portal/jobs/${job.id}`} className="block font-medium text-ink-900 hover:text-patina-700 hover:underline">
                  {job.title}
                </Link>
                <span className="block text-sm text-ink-500">
                  {job.shopName}
                  {job.dueDate ? ` · wanted by ${formatShopDate(job.dueDate, { locale: job.shopLocale })}` : ""}
                </span>
              </span>
              <span className="flex items-center gap-2">
                {job.money.quote && job.money.quote.state !== "replaced" ? (
                  <Link href={`/portal/jobs/${job.id}`} className="text-sm font-medium text-patina-700 hover:underline">
                    {job.money.quote.state === "sent" ? "Quote waiting for you →" : "Quote and payments →"}
                  </Link>
                ) : null}
                <StatusBadge status={job.status} />
              </span>
              {shared.filter((p) => p.jobId === job.id).length ? (
                <ul className="w-full space-y-1">
                  {shared
                    .filter((p) => p.jobId === job.id)
                    .map((p) => (
                      <li key={p.proofId}>
                        <Link href={`/portal/proofs/${p.proofId}`} className="text-sm font-medium text-patina-700 hover:underline">
                          Review “{p.name}” →
                        </Link>
                      </li>
                    ))}
                </ul>
              ) : null}
            </li>
          ))}
        </ul>
      )}
      {total > PORTAL_PAGE_SIZE && jobs.length > 0 ? (
        <nav className="mt-3 flex flex-wrap items-center justify-between gap-3 text-sm" aria-label="Pages">
          <span className="text-ink-600">
            {total} jobs · showing {first}–{first + jobs.length - 1}
          </span>
          <PageLinks page={page} pages={pages} hrefOf={(n) => (n > 1 ? `/portal?page=${n}` : "/portal")} />
        </nav>
      ) : null}
    </>
  );
}
