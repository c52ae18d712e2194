import { requireShopPage } from "@/app/_server/access";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { listMembers, listOpenInvitations } from "@/db/queries/shops";
import { ROLE_LABELS } from "@/lib/access";
import { InviteForm } from "./InviteForm";

export const dynamic = "force-dynamic";
export const metadata = { title: "Shop settings" };

export default async function SettingsPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const access = await requireShopPage(shop, "shop.settings", `/shops/${shop}/settings`);
  const [members, invites] = await Promise.all([listMembers({ shopId: access.shop.id }), listOpenInvitations({ shopId: access.shop.id })]);
  return (
    <>
      <PageHeader title="Shop settings" lead="Your team and who can do what." />
      <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
        <section aria-labelledby="team-heading">
          <h2 id="team-heading" className="mb-3 text-lg">
            Team
          </h2>
          <ul className="card divide-y divide-paper-200">
            {members.map((m) => (
              <li key={m.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-3">
                <span>
                  <span className="block font-medium">{m.name ?? m.email}</span>
                  <span className="block text-sm text-ink-500">{m.email}</span>
                </span>
                <span className="rounded-full bg-paper-200 px-2.5 py-0.5 text-xs font-medium text-ink-700">{ROLE_LABELS[m.role]}</span>
              </li>
            ))}
          </ul>
          <h2 className="mb-3 mt-8 text-lg">Waiting to join</h2>
          {invites.length === 0 ? (
            <EmptyState title="No open invitations">Invite designers and press operators with the form.</EmptyState>
          ) : (
            <ul className="card divide-y divide-paper-200">
              {invites.map((i) => (
                <li key={i.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-3 text-sm">
                  <span>{i.email}</span>
                  <span className="text-ink-500">
                    {ROLE_LABELS[i.role]} · until {i.expiresAt.toLocaleDateString("en-US", { dateStyle: "medium" })}
                  </span>
                </li>
              ))}
            </ul>
          )}
        </section>
        <InviteForm shopSlug={access.shop.slug} />
      </div>
    </>
  );
}
