import Link from "next/link";
import { notFound } from "next/navigation";
import { requireShopPage } from "@/app/_server/access";
import { PageHeader } from "@/components/ui/PageHeader";
import { loadPriceMatrix } from "@/app/_server/orders";
import { loadJobPrints } from "@/app/_server/production/plans";
import { listExports } from "@/db/queries/production";
import { can } from "@/lib/access";
import { DECORATION_LABELS, type DecorationMethod } from "@/lib/jobs";
import { LOCATION_LABELS } from "@/lib/garments/locations";
import { SAFETY_CAUTIONS } from "@/lib/safety";
import { ProductionBoard } from "./ProductionBoard";

export const dynamic = "force-dynamic";
export const metadata = { title: "Production" };

export default async function ProductionPage({ params }: { params: Promise<{ shop: string; jobId: string }> }) {
  const { shop, jobId } = await params;
  const access = await requireShopPage(shop, "production.view", `/shops/${shop}/jobs/${jobId}/production`);
  const loaded = await loadJobPrints({ shopId: access.shop.id, jobId });
  if (!loaded) notFound();
  const { job, sizeRun, printed, prints } = loaded;
  const showCost = can(access.role, "prices.view");
  const [exports, prices] = await Promise.all([listExports({ shopId: access.shop.id, jobId }), showCost ? loadPriceMatrix(access.shop.id) : null]);
  const method = job.method as DecorationMethod;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href={`/shops/${shop}/jobs/${jobId}`} className="text-patina-700 hover:underline">
          ← {job.title}
        </Link>
      </p>
      <PageHeader title="Production" lead={`${DECORATION_LABELS[method]}: the size run, each size's print, and the files the press needs.`} />
      <div role="note" className="mb-6 rounded-card border border-ochre-300 bg-ochre-100 p-4 text-sm text-ochre-800">
        <strong>Safety.</strong>
        <ul className="mt-1 list-disc space-y-1 pl-5">
          {SAFETY_CAUTIONS.map((line) => (
            <li key={line}>{line}</li>
          ))}
        </ul>
      </div>
      <ul className="mb-6 space-y-2" aria-label="Which revision production prints" data-testid="production-revisions">
        {printed.map(({ document: d, approvedLetter, newerDraft }) => (
          <li key={d.proof.id} className={`rounded-card border p-3 text-sm ${approvedLetter ? "border-patina-200 bg-patina-50 text-patina-900" : "border-ochre-300 bg-ochre-50 text-ochre-900"}`}>
            <strong>{d.proof.name}</strong>:{" "}
            {approvedLetter ? `prints revision ${approvedLetter}, as the client approved it.` : `no revision is approved yet; this shows the working copy (revision ${d.proof.revision}). Print only after the client approves.`}
            {newerDraft ? <span className="block" data-testid="newer-draft">Revision {newerDraft} is a newer draft that the client has not approved. Production keeps printing revision {approvedLetter} until {newerDraft} is approved.</span> : null}
          </li>
        ))}
      </ul>
      <ProductionBoard
        shopSlug={access.shop.slug}
        clock={access.shop.clock}
        jobId={job.id}
        method={method}
        canEdit={can(access.role, "jobs.edit")}
        canGrade={can(access.role, "production.grade")}
        film={prices ? { centsPerInch: prices.matrix.dtf.centsPerInchOfSheet, currency: prices.matrix.currency } : null}
        sizeRun={sizeRun}
        sparePercent={job.sparePercent}
        prints={prints.map(({ document: d, placement, artwork, plan }) => ({
          proofId: d.proof.id,
          proofName: d.proof.name,
          designedOn: d.proof.size,
          colourHex: d.proof.colourHex,
          blank: { name: d.blank.name, category: d.blank.category, sizeChart: d.blank.sizeChart },
          placement: { ...placement, label: LOCATION_LABELS[placement.location] },
          artworkId: artwork?.id ?? null,
          saved: plan.basis === "graded" ? (loaded.gradings.find((g) => g.placementId === placement.id) ?? null) : null,
        }))}
        exports={exports.map((e) => ({ id: e.id, kind: e.kind, state: e.state, progress: e.progress, message: e.message, fileName: e.fileName, createdAt: e.createdAt.toISOString() }))}
      />
    </>
  );
}
