import { requireShopPage } from "@/app/_server/access";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { listClients } from "@/db/queries/clients";

export const dynamic = "force-dynamic";
export const metadata = { title: "Clients" };

export default async function ClientsPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const access = await requireShopPage(shop, "clients.view", `/shops/${shop}/clients`);
  const clients = await listClients({ shopId: access.shop.id });
  return (
    <>
      <PageHeader title="Clients" lead="The teams, businesses and people you print for." />
      {clients.length === 0 ? (
        <EmptyState title="No clients yet">Clients and their contacts appear here once you add a job for them.</EmptyState>
      ) : (
        <ul className="grid gap-4 md:grid-cols-2">
          {clients.map((client) => (
            <li key={client.id} className="card p-5">
              <div className="flex items-baseline justify-between gap-2">
                <h2 className="text-lg">{client.name}</h2>
                <span className="text-sm text-ink-500">
                  {client.jobs} {client.jobs === 1 ? "job" : "jobs"}
                </span>
              </div>
              {client.notes ? <p className="mt-1 text-sm text-ink-600">{client.notes}</p> : null}
              <ul className="mt-3 space-y-1 text-sm">
                {client.contacts.map((c) => (
                  <li key={c.email} className="text-ink-700">
                    {c.name} <span className="text-ink-500">· {c.email}</span>
                  </li>
                ))}
              </ul>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
