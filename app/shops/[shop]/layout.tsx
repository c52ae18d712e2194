import type { ReactNode } from "react";
import { requireShopPage } from "@/app/_server/access";
import { QueryProvider } from "@/app/providers";
import { AppShell } from "@/components/shell/AppShell";
import { ROLE_LABELS, shopNav } from "@/lib/access";

export default async function ShopLayout({ children, params }: { children: ReactNode; params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const access = await requireShopPage(shop, "shop.view");
  return (
    <AppShell
      homeHref={`/shops/${access.shop.slug}`}
      contextLabel={access.shop.name}
      nav={shopNav(access.role, access.shop.slug)}
      user={{ name: access.actor.name, email: access.actor.email }}
      roleLabel={`${ROLE_LABELS[access.role]} · ${access.shop.name}`}
    >
      <QueryProvider>{children}</QueryProvider>
    </AppShell>
  );
}
