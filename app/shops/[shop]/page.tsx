import Link from "next/link";
import { requireShopPage } from "@/app/_server/access";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { listActivity } from "@/db/queries/audit";
import { shopOverview } from "@/db/queries/shops";
import { can } from "@/lib/access";
import { describeActivity } from "@/lib/audit-text";
import { formatShopDateTime } from "@/lib/dates";

export const dynamic = "force-dynamic";

export default async function ShopOverviewPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const access = await requireShopPage(shop, "shop.view");
  const [overview, activity] = await Promise.all([
    shopOverview({ shopId: access.shop.id }),
    listActivity({ shopId: access.shop.id, limit: 10 }),
  ]);
  const firstName = access.actor.name?.split(" ")[0];
  // A line links only where the reader's role may go.
  const mayOpen = (href: string) =>
    href.includes("/clients/") ? can(access.role, "clients.view") : href.endsWith("/prices") ? can(access.role, "prices.view") : href.endsWith("/settings") ? can(access.role, "shop.settings") : true;
  return (
    <>
      <PageHeader title={firstName ? `Good to see you, ${firstName}` : "Overview"} lead={`Here is what is moving at ${access.shop.name.replace(/\.$/, "")}.`} />
      <section className="grid gap-4 sm:grid-cols-3" aria-label="Shop at a glance">
        <Stat label="Active clients" value={overview.clients} href={can(access.role, "clients.view") ? `/shops/${shop}/clients` : undefined} />
        <Stat label="People on the team" value={overview.members} href={can(access.role, "shop.settings") ? `/shops/${shop}/settings` : undefined} />
        <Stat label="Open jobs" value={overview.openJobs} href={`/shops/${shop}/jobs`} />
      </section>
      <section className="mt-8">
        <h2 className="mb-3 text-lg">Recent activity</h2>
        {activity.length === 0 ? (
          <EmptyState title="Nothing has happened yet">
            When your team creates jobs, sends proofs or gets approvals, it shows up here.
          </EmptyState>
        ) : (
          <ul className="card divide-y divide-paper-200">
            {activity.map((entry) => (
              <li key={entry.id} className="flex flex-wrap items-baseline justify-between gap-2 px-4 py-3 text-sm">
                <span className="text-ink-800" data-testid="activity-line">
                  {describeActivity(entry, access.shop.slug, { seesMoney: can(access.role, "prices.view") }).map((part, i) =>
                    typeof part === "string" ? (
                      part
                    ) : !mayOpen(part.href) ? (
                      part.text
                    ) : (
                      <Link key={i} href={part.href} className="font-medium text-patina-700 hover:underline">
                        {part.text}
                      </Link>
                    ),
                  )}
                </span>
                <time className="text-xs text-ink-500" dateTime={entry.at.toISOString()}>
                  {formatShopDateTime(entry.at, access.shop.clock)}
                </time>
              </li>
            ))}
          </ul>
        )}
      </section>
    </>
  );
}

function Stat({ label, value, href }: { label: string; value: number; href?: string }) {
  const body = (
    <>
      <p className="text-sm text-ink-600">{label}</p>
      <p className="measure mt-1 text-3xl font-semibold text-ink-900">{value}</p>
    </>
  );
  return href ? (
    <Link href={href} className="card block p-5 hover:border-patina-300">
      {body}
    </Link>
  ) : (
    <div className="card p-5">{body}</div>
  );
}
