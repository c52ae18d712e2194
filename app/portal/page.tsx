import { requireActorPage } from "@/app/_server/access";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";
import Link from "next/link";
import { formatShopDate } from "@/lib/dates";
import { listJobsForClients } from "@/db/queries/jobs";
import { listSharedProofsForClients } from "@/db/queries/review";

export const dynamic = "force-dynamic";
export const metadata = { title: "My jobs" };

export default async function PortalPage() {
  const actor = await requireActorPage("/portal");
  const clientIds = actor.contacts.map((c) => c.clientId);
  const [jobs, shared] = await Promise.all([listJobsForClients({ clientIds }), listSharedProofsForClients({ clientIds })]);
  return (
    <>
      <PageHeader title="My jobs" lead="Quotes, payments and proofs from your print shop." />
      {jobs.length === 0 ? (
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
    </>
  );
}
