import { requireActorPage } from "@/app/_server/access";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";
import Link from "next/link";
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
      <PageHeader title="My jobs" lead="Proofs your print shop has prepared for you." />
      {jobs.length === 0 ? (
        <EmptyState title="Nothing to review yet">When your print shop shares a proof with you, it appears here.</EmptyState>
      ) : (
        <ul className="card divide-y divide-paper-200">
          {jobs.map((job) => (
            <li key={job.id} className="flex flex-wrap items-center justify-between gap-3 px-4 py-3">
              <span>
                <span className="block font-medium">{job.title}</span>
                <span className="block text-sm text-ink-500">
                  {job.shopName}
                  {job.dueDate ? ` · wanted by ${job.dueDate}` : ""}
                </span>
              </span>
              <StatusBadge status={job.status} />
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
