import Link from "next/link";
import { requireShopPage } from "@/app/_server/access";
import { jobFormOptions } from "@/app/_server/job-form";
import { JobForm } from "@/components/orders/JobForm";
import { emptySizeRun } from "@/components/orders/size-run";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";

export const dynamic = "force-dynamic";
export const metadata = { title: "New job" };

export default async function NewJobPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<{ client?: string }> }) {
  const { shop } = await params;
  const { client } = await searchParams;
  const access = await requireShopPage(shop, "jobs.edit", `/shops/${shop}/jobs/new`);
  const options = await jobFormOptions(access.shop.id, access.role);
  const clientId = options.clients.some((c) => c.id === client) ? client! : "";
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href={`/shops/${shop}/jobs`} className="text-patina-700 hover:underline">
          ← Jobs
        </Link>
      </p>
      <PageHeader title="New job" lead="Who it is for, how it is decorated, where the prints go and how many of each size." />
      {options.clients.length === 0 ? (
        <EmptyState
          title="Add a client first"
          action={
            <Link href={`/shops/${shop}/clients/new`} className="btn-primary">
              New client
            </Link>
          }
        >
          Every job belongs to a client.
        </EmptyState>
      ) : (
        <JobForm
          shopSlug={shop}
          clients={options.clients}
          blanks={options.blanks}
          matrix={options.matrix}
          defaults={{ title: "", clientId, dueDate: "", method: "screen-print", blankId: "", garmentColour: "", printLocations: [{ location: "full-front", colours: 1 }], dtfAreaIn2: null, rush: false, notes: "", sizeRun: emptySizeRun() }}
        />
      )}
    </>
  );
}
