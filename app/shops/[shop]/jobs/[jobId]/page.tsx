import Link from "next/link";
import { notFound } from "next/navigation";
import { requireShopPage } from "@/app/_server/access";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { findJob } from "@/db/queries/jobs";
import { listProofsForJob } from "@/db/queries/proofs";
import { listJobDecisions } from "@/db/queries/review";
import { DECORATION_LABELS } from "@/lib/jobs";

export const dynamic = "force-dynamic";
export const metadata = { title: "Job" };

export default async function JobPage({ params }: { params: Promise<{ shop: string; jobId: string }> }) {
  const { shop, jobId } = await params;
  const access = await requireShopPage(shop, "jobs.view", `/shops/${shop}/jobs/${jobId}`);
  const job = await findJob({ shopId: access.shop.id, jobId });
  if (!job) notFound();
  const [proofs, decisions] = await Promise.all([listProofsForJob({ shopId: access.shop.id, jobId }), listJobDecisions({ shopId: access.shop.id, jobId })]);
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href={`/shops/${shop}/jobs`} className="text-patina-700 hover:underline">
          ← Jobs
        </Link>
      </p>
      <PageHeader
        title={job.title}
        lead={
          <>
            {DECORATION_LABELS[job.method]}
            {job.dueDate ? ` · due ${job.dueDate}` : ""}
          </>
        }
        actions={
          <>
            <StatusBadge status={job.status} />
            <Link href={`/shops/${shop}/jobs/${jobId}/production`} className="btn-quiet px-3 py-1.5">
              Production
            </Link>
          </>
        }
      />
      {job.notes ? <p className="mb-6 max-w-prose text-ink-700">{job.notes}</p> : null}
      <h2 className="mb-3 text-lg">Proofs</h2>
      {proofs.length === 0 ? (
        <EmptyState title="No proofs yet">A proof places the client&apos;s art on a blank at true size.</EmptyState>
      ) : (
        <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
          {proofs.map((p) => (
            <li key={p.id}>
              <Link href={`/shops/${shop}/proofs/${p.id}`} className="card block p-5 hover:border-patina-300">
                <p className="font-medium text-ink-900">
                  {p.name} <span className="measure text-sm text-ink-500">rev. {p.revision}</span>
                </p>
                <p className="mt-1 text-sm text-ink-600">
                  {p.blankName} · {p.colourName} · size {p.size}
                </p>
                <p className="mt-2 text-xs text-ink-500">Updated {p.updatedAt.toLocaleString("en-US", { dateStyle: "medium", timeStyle: "short" })}</p>
              </Link>
            </li>
          ))}
        </ul>
      )}
      <h2 className="mb-3 mt-8 text-lg">Approval record</h2>
      {decisions.length === 0 ? (
        <EmptyState title="No decisions yet">When the client approves a revision or asks for changes, the record appears here.</EmptyState>
      ) : (
        <ul className="card divide-y divide-paper-200" data-testid="approval-record">
          {decisions.map((d) => (
            <li key={d.id} className="px-4 py-3 text-sm">
              <p className="font-medium">
                {d.decision === "approved" ? "Approved" : "Changes asked for"}: {d.proofName}, revision {d.revisionLetter}
              </p>
              <p className="text-ink-600">
                By {d.fullName} on {d.at.toLocaleString("en-US", { dateStyle: "medium", timeStyle: "medium" })}
                {d.viaLink ? " through a review link" : " signed in"}
              </p>
              {d.decision === "approved" ? <p className="mt-1 text-xs text-ink-500">“{d.statement}”</p> : null}
              <p className="measure mt-1 text-xs text-ink-500">
                IP {d.ip ?? "unknown"} · {d.userAgent ?? "unknown browser"}
              </p>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
