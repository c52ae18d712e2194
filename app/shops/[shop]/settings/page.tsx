import { requireShopPage } from "@/app/_server/access";
import { PageHeader } from "@/components/ui/PageHeader";
import { findShopById, listMembers, listOpenInvitations } from "@/db/queries/shops";
import { formatShopDate } from "@/lib/dates";
import { ClockForm } from "./ClockForm";
import { InviteForm } from "./InviteForm";
import { TeamPanel } from "./TeamPanel";

export const dynamic = "force-dynamic";
export const metadata = { title: "Shop settings" };

export default async function SettingsPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const access = await requireShopPage(shop, "shop.settings", `/shops/${shop}/settings`);
  const [members, invites, clock] = await Promise.all([listMembers({ shopId: access.shop.id }), listOpenInvitations({ shopId: access.shop.id }), findShopById({ shopId: access.shop.id })]);
  return (
    <>
      <PageHeader title="Shop settings" lead="Your team, who can do what, and how your dates read." />
      <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
        <section aria-labelledby="team-heading">
          <h2 id="team-heading" className="mb-3 text-lg">
            Team
          </h2>
          <TeamPanel
            shopSlug={access.shop.slug}
            shopName={access.shop.name}
            members={members.map((m) => ({ id: m.id, name: m.name, email: m.email, role: m.role, you: m.userId === access.actor.id }))}
            // Dates are written here, so the server's and the browser's time zones cannot disagree.
            invitations={invites.map((i) => ({ id: i.id, email: i.email, role: i.role, until: formatShopDate(i.expiresAt, { locale: clock?.locale, timeZone: clock?.timeZone }) }))}
          />
        </section>
        <div className="space-y-6">
          <InviteForm shopSlug={access.shop.slug} />
          <ClockForm shopSlug={access.shop.slug} locale={clock?.locale ?? "en-US"} timeZone={clock?.timeZone ?? "UTC"} />
        </div>
      </div>
    </>
  );
}
