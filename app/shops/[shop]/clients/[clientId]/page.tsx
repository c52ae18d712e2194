import { Suspense } from "react";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireShopPage } from "@/app/_server/access";
import { ClientForm } from "@/components/orders/ClientForm";
import { PageHeader } from "@/components/ui/PageHeader";
import { ArrivalNote } from "@/components/ui/ArrivalNote";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { findClient } from "@/db/queries/clients";
import { listJobPage } from "@/db/queries/jobs";
import { can } from "@/lib/access";
import { DEFAULT_JOB_LIST, JOB_PAGE_SIZES, jobListSearch } from "@/lib/job-list";

export const dynamic = "force-dynamic";
export const metadata = { title: "Client" };

export default async function ClientPage({ params }: { params: Promise<{ shop: string; clientId: string }> }) {
  const { shop, clientId } = await params;
  const access = await requireShopPage(shop, "clients.view", `/shops/${shop}/clients/${clientId}`);
  const client = await findClient({ shopId: access.shop.id, clientId });
  if (!client) notFound();
  // The most recently changed jobs; a client with more has the rest in the job list, filtered to them.
  const shown = { ...DEFAULT_JOB_LIST, clientId: client.id, sort: "updated" as const, dir: "desc" as const, pageSize: JOB_PAGE_SIZES.at(-1)! };
  const { rows: jobs, total: jobTotal } = await listJobPage({ shopId: access.shop.id, query: shown });
  const canEdit = can(access.role, "clients.edit");
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href={`/shops/${shop}/clients`} className="text-patina-700 hover:underline">
          ← Clients
        </Link>
      </p>
      <PageHeader
        title={client.name}
        lead={client.archived ? "Archived: kept with its jobs and payments, hidden from the lists." : undefined}
        actions={
          can(access.role, "jobs.edit") && !client.archived ? (
            <Link href={`/shops/${shop}/jobs/new?client=${client.id}`} className="btn-primary">
              New job for this client
            </Link>
          ) : undefined
        }
      />
      <Suspense fallback={null}>
        <div className="mb-4 empty:hidden">
          <ArrivalNote />
        </div>
      </Suspense>
      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <ClientForm
          shopSlug={shop}
          clientId={client.id}
          archived={client.archived}
          canEdit={canEdit}
          defaults={{ name: client.name, notes: client.notes ?? "", taxExempt: client.taxExempt, contacts: client.contacts.map((c) => ({ id: c.id, name: c.name, email: c.email, phone: c.phone ?? "" })) }}
        />
        <section className="card p-5" aria-label="Jobs for this client">
          <h2 className="mb-3 text-lg">Jobs</h2>
          {jobs.length === 0 ? (
            <p className="text-sm text-ink-600">No jobs yet.</p>
          ) : (
            <ul className="space-y-2 text-sm">
              {jobs.map((j) => (
                <li key={j.id} className="flex items-center justify-between gap-2">
                  <Link href={`/shops/${shop}/jobs/${j.id}`} className="text-patina-700 hover:underline">
                    {j.title}
                  </Link>
                  <StatusBadge status={j.status} />
                </li>
              ))}
            </ul>
          )}
          {jobTotal > jobs.length ? (
            <p className="mt-3 text-sm">
              <Link href={`/shops/${shop}/jobs${jobListSearch(shown)}`} className="font-medium text-patina-700 hover:underline">
                All {jobTotal} jobs for this client →
              </Link>
            </p>
          ) : null}
        </section>
      </div>
    </>
  );
}
