import Link from "next/link";
import { notFound } from "next/navigation";
import { requireShopPage } from "@/app/_server/access";
import { NewProofForm } from "@/components/proofs/NewProofForm";
import { PageHeader } from "@/components/ui/PageHeader";
import { listArtworks } from "@/db/queries/artworks";
import { listBlanks } from "@/db/queries/blanks";
import { findJobDetail } from "@/db/queries/jobs";
import { LOCATION_LABELS, locationsFor, type PrintLocation } from "@/lib/garments/locations";
import { CATEGORY_INFO } from "@/lib/garments/types";
import { middleSize } from "@/lib/proofs/new-proof";

export const dynamic = "force-dynamic";
export const metadata = { title: "New proof" };

export default async function NewProofPage({ params }: { params: Promise<{ shop: string; jobId: string }> }) {
  const { shop, jobId } = await params;
  const access = await requireShopPage(shop, "proofs.edit", `/shops/${shop}/jobs/${jobId}/proofs/new`);
  const detail = await findJobDetail({ shopId: access.shop.id, jobId });
  if (!detail) notFound();
  const [blanks, art] = await Promise.all([listBlanks({ shopId: access.shop.id }), listArtworks({ shopId: access.shop.id, clientId: detail.client.id })]);
  const locations = (detail.job.printLocations ?? []).map((l) => l.location as PrintLocation);
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href={`/shops/${shop}/jobs/${jobId}`} className="text-patina-700 hover:underline">
          ← {detail.job.title}
        </Link>
      </p>
      <PageHeader title="New proof" lead={`For ${detail.client.name}. The proof starts from the job's garment, colour, size run and print locations; you can change all of it in the editor.`} />
      <NewProofForm
        shopSlug={access.shop.slug}
        jobId={jobId}
        clientId={detail.client.id}
        jobBlankId={detail.job.blankId}
        jobColour={detail.job.garmentColour}
        jobLocations={locations}
        blanks={blanks.map((b) => ({
          id: b.id,
          name: b.name,
          categoryLabel: CATEGORY_INFO[b.category].label,
          colours: b.colours,
          locations: locationsFor(b.category).map((l) => ({ value: l, label: LOCATION_LABELS[l] })),
          startSize: middleSize(b.sizeChart, detail.sizeRun),
        }))}
        artworks={art.map((a) => ({ id: a.id, name: a.name }))}
      />
    </>
  );
}
