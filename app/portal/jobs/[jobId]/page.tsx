import Link from "next/link";
import { formatShopDate } from "@/lib/dates";
import { notFound } from "next/navigation";
import { requireActorPage } from "@/app/_server/access";
import { quotePanelData } from "@/app/_server/orders";
import { checkoutReturn } from "@/app/_server/quote-return";
import { CheckoutResult } from "@/components/orders/CheckoutResult";
import { QuotePanel } from "@/components/orders/QuotePanel";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { findJobById } from "@/db/queries/jobs";
import { listSharedProofsForClients } from "@/db/queries/review";

export const dynamic = "force-dynamic";
export const metadata = { title: "Job" };

export default async function PortalJobPage({ params, searchParams }: { params: Promise<{ jobId: string }>; searchParams: Promise<{ checkout?: string }> }) {
  const { jobId } = await params;
  const actor = await requireActorPage(`/portal/jobs/${jobId}`);
  const job = /^[A-Za-z0-9-]{1,80}$/.test(jobId) ? await findJobById({ jobId }) : undefined;
  const contact = job ? actor.contacts.find((c) => c.shopId === job.shopId && c.clientId === job.clientId) : undefined;
  if (!job || !contact) notFound();
  const returned = await checkoutReturn((await searchParams).checkout);
  const [panel, shared] = await Promise.all([quotePanelData(job.id), listSharedProofsForClients({ clientIds: [job.clientId], jobIds: [job.id] })]);
  const proofs = shared.filter((p) => p.jobId === job.id);
  return (
    <>
      <CheckoutResult outcome={returned} />
      <p className="mb-2 text-sm">
        <Link href="/portal" className="text-patina-700 hover:underline">
          ← My jobs
        </Link>
      </p>
      <PageHeader title={job.title} lead={`${contact.shopName}${job.dueDate ? ` · wanted by ${formatShopDate(job.dueDate, panel?.clock)}` : ""}`} actions={<StatusBadge status={job.status} />} />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        {panel ? <QuotePanel data={panel} canAccept /> : <EmptyState title="No quote yet">The print shop will send a quote here once the details are settled.</EmptyState>}
        <section className="card h-fit p-5" aria-label="Proofs">
          <h2 className="mb-2 text-lg">Proofs</h2>
          {proofs.length === 0 ? (
            <p className="text-sm text-ink-600">No proof shared yet.</p>
          ) : (
            <ul className="space-y-1">
              {proofs.map((p) => (
                <li key={p.proofId}>
                  <Link href={`/portal/proofs/${p.proofId}`} className="text-sm font-medium text-patina-700 hover:underline">
                    Review “{p.name}” →
                  </Link>
                </li>
              ))}
            </ul>
          )}
        </section>
      </div>
    </>
  );
}
