import Link from "next/link";
import { requireShopPage } from "@/app/_server/access";
import { ClientForm } from "@/components/orders/ClientForm";
import { PageHeader } from "@/components/ui/PageHeader";

export const dynamic = "force-dynamic";
export const metadata = { title: "New client" };

export default async function NewClientPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  await requireShopPage(shop, "clients.edit", `/shops/${shop}/clients/new`);
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href={`/shops/${shop}/clients`} className="text-patina-700 hover:underline">
          ← Clients
        </Link>
      </p>
      <PageHeader title="New client" />
      <ClientForm shopSlug={shop} canEdit defaults={{ name: "", notes: "", taxExempt: false, contacts: [{ name: "", email: "", phone: "" }] }} />
    </>
  );
}
