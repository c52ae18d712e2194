import Link from "next/link";
import { notFound } from "next/navigation";
import { requireShopPage } from "@/app/_server/access";
import { jobFormOptions } from "@/app/_server/job-form";
import { JobForm } from "@/components/orders/JobForm";
import { emptySizeRun } from "@/components/orders/size-run";
import { PageHeader } from "@/components/ui/PageHeader";
import { findJobDetail } from "@/db/queries/jobs";
import { printLocationsSchema } from "@/lib/quotes";

export const dynamic = "force-dynamic";
export const metadata = { title: "Edit job" };

export default async function EditJobPage({ params }: { params: Promise<{ shop: string; jobId: string }> }) {
  const { shop, jobId } = await params;
  const access = await requireShopPage(shop, "jobs.edit", `/shops/${shop}/jobs/${jobId}/edit`);
  const detail = await findJobDetail({ shopId: access.shop.id, jobId });
  if (!detail) notFound();
  const { job } = detail;
  const options = await jobFormOptions(access.shop.id, access.role, job.clientId);
  const locations = printLocationsSchema.safeParse(job.printLocations);
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href={`/shops/${shop}/jobs/${jobId}`} className="text-patina-700 hover:underline">
          ← {job.title}
        </Link>
      </p>
      <PageHeader title="Edit job" />
      <JobForm
        shopSlug={shop}
        jobId={jobId}
        clients={options.clients}
        blanks={options.blanks}
        matrix={options.matrix}
        defaults={{
          title: job.title,
          clientId: job.clientId,
          dueDate: job.dueDate ?? "",
          method: job.method,
          blankId: job.blankId ?? "",
          garmentColour: job.garmentColour ?? "",
          printLocations: locations.success ? locations.data : [],
          dtfAreaIn2: job.dtfAreaIn2,
          rush: job.rush,
          notes: job.notes ?? "",
          sizeRun: emptySizeRun(detail.sizeRun),
        }}
      />
    </>
  );
}
