import Link from "next/link";
import { requireShopPage } from "@/app/_server/access";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { listJobs } from "@/db/queries/jobs";
import { DECORATION_LABELS } from "@/lib/jobs";

export const dynamic = "force-dynamic";
export const metadata = { title: "Jobs" };

export default async function JobsPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const access = await requireShopPage(shop, "jobs.view", `/shops/${shop}/jobs`);
  const jobs = await listJobs({ shopId: access.shop.id });
  return (
    <>
      <PageHeader title="Jobs" lead="Every order, from first proof to pickup." />
      {jobs.length === 0 ? (
        <EmptyState title="No jobs yet">A job holds a client&apos;s garments, sizes and proofs.</EmptyState>
      ) : (
        <ul className="card divide-y divide-paper-200">
          {jobs.map((job) => (
            <li key={job.id}>
              <Link href={`/shops/${shop}/jobs/${job.id}`} className="flex flex-wrap items-center justify-between gap-3 px-4 py-3 hover:bg-paper-50">
                <span>
                  <span className="block font-medium text-ink-900">{job.title}</span>
                  <span className="block text-sm text-ink-500">
                    {job.clientName} · {DECORATION_LABELS[job.method]}
                    {job.dueDate ? ` · due ${job.dueDate}` : ""}
                  </span>
                </span>
                <StatusBadge status={job.status} />
              </Link>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
