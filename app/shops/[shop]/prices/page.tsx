import { requireShopPage } from "@/app/_server/access";
import { loadPriceMatrix } from "@/app/_server/orders";
import { Notice } from "@/components/orders/Notice";
import { PriceMatrixEditor } from "@/components/orders/PriceMatrixEditor";
import { PageHeader } from "@/components/ui/PageHeader";
import { can } from "@/lib/access";
import { formatShopDateTime } from "@/lib/dates";

export const dynamic = "force-dynamic";
export const metadata = { title: "Prices" };

export default async function PricesPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const access = await requireShopPage(shop, "prices.view", `/shops/${shop}/prices`);
  const prices = await loadPriceMatrix(access.shop.id);
  return (
    <>
      <PageHeader
        title="Prices"
        lead={
          prices.updatedAt
            ? `Last saved ${formatShopDateTime(prices.updatedAt, access.shop.clock)}. Quotes already sent keep the numbers they were sent with.`
            : "These are demo prices, invented for a new shop. Replace them with your own before you send quotes."
        }
      />
      {prices.problem ? (
        <div className="mb-4">
          <Notice tone="warn">{prices.problem}</Notice>
        </div>
      ) : null}
      <PriceMatrixEditor shopSlug={shop} matrix={prices.matrix} canEdit={can(access.role, "prices.edit")} locale={access.shop.clock.locale} />
    </>
  );
}
