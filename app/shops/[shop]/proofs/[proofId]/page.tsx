import { notFound } from "next/navigation";
import { requireShopPage } from "@/app/_server/access";
import { ProofEditor } from "@/components/editor/ProofEditor";
import { firstContact } from "@/db/queries/contacts";
import { getProofDocument } from "@/db/queries/proofs";
import { can } from "@/lib/access";
import { toEditorDoc } from "@/lib/editor/from-server";
import { clampZoom } from "@/lib/editor/view";
import type { DecorationMethod } from "@/lib/jobs";

export const dynamic = "force-dynamic";

export async function generateMetadata() {
  return { title: "Proof" };
}

export default async function ProofPage({ params, searchParams }: { params: Promise<{ shop: string; proofId: string }>; searchParams: Promise<{ zoom?: string }> }) {
  const { shop, proofId } = await params;
  const { zoom } = await searchParams;
  const access = await requireShopPage(shop, "jobs.view", `/shops/${shop}/proofs/${proofId}`);
  const document = await getProofDocument({ shopId: access.shop.id, proofId });
  if (!document) notFound();
  const requested = Number(zoom);
  const contact = await firstContact({ clientId: document.job.clientId });
  return (
    <ProofEditor
      shopSlug={access.shop.slug}
      clock={access.shop.clock}
      proof={{ id: document.proof.id, name: document.proof.name, revision: document.proof.revision, version: document.proof.version }}
      job={{ id: document.job.id, title: document.job.title, clientId: document.job.clientId, clientName: document.job.clientName, method: document.job.method as DecorationMethod }}
      blank={{ id: document.blank.id, name: document.blank.name, category: document.blank.category, colours: document.blank.colours, sizeChart: document.blank.sizeChart }}
      doc={toEditorDoc(document)}
      artworks={document.artworks}
      canEdit={can(access.role, "proofs.edit")}
      initialZoom={Number.isFinite(requested) && requested > 0 ? clampZoom(requested) : null}
      contact={contact ? { email: contact.email, name: contact.name } : null}
    />
  );
}
