import Link from "next/link";
import { requireShopPage } from "@/app/_server/access";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { listClients } from "@/db/queries/clients";
import { can } from "@/lib/access";

export const dynamic = "force-dynamic";
export const metadata = { title: "Clients" };

export default async function ClientsPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<{ archived?: string }> }) {
  const { shop } = await params;
  const showArchived = (await searchParams).archived === "1";
  const access = await requireShopPage(shop, "clients.view", `/shops/${shop}/clients`);
  const all = await listClients({ shopId: access.shop.id, includeArchived: true });
  const clients = all.filter((c) => c.archived === showArchived);
  const archivedCount = all.filter((c) => c.archived).length;
  const canEdit = can(access.role, "clients.edit");
  return (
    <>
      <PageHeader
        title={showArchived ? "Archived clients" : "Clients"}
        lead="The teams, businesses and people you print for."
        actions={
          <>
            <Link href={showArchived ? `/shops/${shop}/clients` : `/shops/${shop}/clients?archived=1`} className="btn-quiet">
              {showArchived ? "Current clients" : `Archived (${archivedCount})`}
            </Link>
            {canEdit ? (
              <Link href={`/shops/${shop}/clients/new`} className="btn-primary">
                New client
              </Link>
            ) : null}
          </>
        }
      />
      {clients.length === 0 ? (
        <EmptyState title={showArchived ? "Nothing archived" : "No clients yet"}>
          {showArchived ? "Archived clients keep their jobs and payments; they just leave the lists." : "Add a client, then start a job for them."}
        </EmptyState>
      ) : (
        <ul className="grid gap-4 md:grid-cols-2" aria-label="Clients">
          {clients.map((client) => (
            <li key={client.id}>
              <Link href={`/shops/${shop}/clients/${client.id}`} className="card block p-5 hover:border-patina-300">
                <div className="flex items-baseline justify-between gap-2">
                  <h2 className="text-lg">{client.name}</h2>
                  <span className="text-sm text-ink-500">
                    {client.jobs} {client.jobs === 1 ? "job" : "jobs"}
                  </span>
                </div>
                {client.taxExempt ? <p className="mt-1 text-xs font-medium uppercase tracking-wide text-patina-700">Tax exempt</p> : null}
                {client.notes ? <p className="mt-1 text-sm text-ink-600">{client.notes}</p> : null}
                <ul className="mt-3 space-y-1 text-sm">
                  {client.contacts.map((c) => (
                    <li key={c.id} className="text-ink-700">
                      {c.name} <span className="text-ink-500">· {c.email}</span>
                      {c.hasAccount ? <span className="ml-1 text-xs text-patina-700">(signs in)</span> : null}
                    </li>
                  ))}
                </ul>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
