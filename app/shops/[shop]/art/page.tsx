import { requireShopPage } from "@/app/_server/access";
import { PageHeader } from "@/components/ui/PageHeader";
import { listArtworks } from "@/db/queries/artworks";
import { listClients } from "@/db/queries/clients";
import { can } from "@/lib/access";
import { ArtLibrary } from "./ArtLibrary";

export const dynamic = "force-dynamic";
export const metadata = { title: "Art library" };

export default async function ArtPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<{ client?: string }> }) {
  const { shop } = await params;
  const { client } = await searchParams;
  const access = await requireShopPage(shop, "jobs.view", `/shops/${shop}/art`);
  const [clients, art] = await Promise.all([listClients({ shopId: access.shop.id }), listArtworks({ shopId: access.shop.id })]);
  const clientId = client && clients.some((c) => c.id === client) ? client : null;
  return (
    <>
      <PageHeader title="Art library" lead="Every file is checked from its bytes: real type, ink size, density and colours. Measurements are of the ink, not the padded canvas." />
      <ArtLibrary
        shopSlug={access.shop.slug}
        canEdit={can(access.role, "proofs.edit")}
        clients={clients.map((c) => ({ id: c.id, name: c.name }))}
        initialClientId={clientId}
        art={art.map((a) => ({ ...a, createdAt: a.createdAt.toISOString() }))}
      />
    </>
  );
}
