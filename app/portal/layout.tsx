import type { ReactNode } from "react";
import { requireActorPage } from "@/app/_server/access";
import { QueryProvider } from "@/app/providers";
import { AppShell } from "@/components/shell/AppShell";

export default async function PortalLayout({ children }: { children: ReactNode }) {
  const actor = await requireActorPage("/portal");
  const label = actor.contacts[0]?.clientName ?? "Your proofs";
  return (
    <AppShell
      homeHref="/portal"
      contextLabel={label}
      nav={[{ key: "my-jobs", label: "My jobs", href: "/portal" }]}
      user={{ name: actor.name, email: actor.email }}
      roleLabel={actor.contacts.length ? `Client · ${actor.contacts[0]!.shopName}` : "Client"}
    >
      <QueryProvider>{children}</QueryProvider>
    </AppShell>
  );
}
