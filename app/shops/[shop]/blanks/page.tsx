import Link from "next/link";
import { requireShopPage } from "@/app/_server/access";
import { ApproximateNote } from "@/components/blanks/ApproximateNote";
import { BlankBadge } from "@/components/blanks/BlankBadge";
import { middleSizeIndex, sizeRange } from "@/components/blanks/chart-columns";
import { ColourSwatches } from "@/components/blanks/ColourSwatches";
import { OutlinePreview } from "@/components/blanks/OutlinePreview";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { listBlanks } from "@/db/queries/blanks";
import type { Blank } from "@/db/schema";
import { can } from "@/lib/access";
import { CATEGORY_INFO, GARMENT_CATEGORIES } from "@/lib/garments/types";

export const dynamic = "force-dynamic";
export const metadata = { title: "Blanks" };

/** Every thumbnail uses this window (inches), so a toddler tee looks as small next to a hoodie as it is. */
const THUMB_FRAME = { width: 64, height: 44 };

export default async function BlanksPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const access = await requireShopPage(shop, "blanks.view", `/shops/${shop}/blanks`);
  const canEdit = can(access.role, "blanks.edit");
  const blanks = await listBlanks({ shopId: access.shop.id });
  const own = blanks.filter((b) => b.shopId !== null).length;

  const groups = GARMENT_CATEGORIES.map((category) => ({
    category,
    items: blanks
      .filter((b) => b.category === category)
      .sort((a, b) => Number(a.shopId !== null) - Number(b.shopId !== null) || a.name.localeCompare(b.name)),
  })).filter((g) => g.items.length > 0);

  return (
    <>
      <PageHeader
        title="Blanks"
        lead={
          <>
            Garment styles and their size charts. {blanks.length - own} in the shared library
            {own > 0 ? `, ${own} of your own` : ""}. Outlines are drawn to one scale, so sizes compare at a
            glance.
          </>
        }
      />
      <div className="mb-8 max-w-3xl">
        <ApproximateNote title="Measurements are approximate">
          They are typical values to start from, not any supplier&apos;s numbers.{" "}
          {canEdit
            ? "Make an editable copy of a blank and edit it to your supplier's size chart before you proof a job."
            : "Ask an owner or designer to edit them to your supplier's size chart."}
        </ApproximateNote>
      </div>
      {groups.length === 0 ? (
        <EmptyState title="No blanks yet">
          The shared library is empty. Blanks appear here once it is loaded.
        </EmptyState>
      ) : (
        <div className="gap-6 sm:columns-2 xl:columns-3">
          {groups.map((group) => (
            <section
              key={group.category}
              aria-labelledby={`cat-${group.category}`}
              className="mb-8 break-inside-avoid"
            >
              <h2 id={`cat-${group.category}`} className="mb-3 flex items-baseline gap-2 text-base">
                {CATEGORY_INFO[group.category].label}
                <span className="text-sm font-normal text-ink-500">{group.items.length}</span>
              </h2>
              <ul className="space-y-4">
                {group.items.map((blank) => (
                  <li key={blank.id}>
                    <BlankCard blank={blank} href={`/shops/${access.shop.slug}/blanks/${blank.id}`} />
                  </li>
                ))}
              </ul>
            </section>
          ))}
        </div>
      )}
    </>
  );
}

function BlankCard({ blank, href }: { blank: Blank; href: string }) {
  const sizes = blank.sizeChart;
  const middle = sizes[middleSizeIndex(sizes)];
  const colour = blank.colours[0]?.hex ?? "#ECE6D9";
  const library = blank.shopId === null;
  return (
    <Link
      href={href}
      className="card group flex h-full flex-col overflow-hidden transition-colors hover:border-patina-300 focus-visible:border-patina-400"
    >
      <div className="border-b border-paper-200 bg-paper-100 px-4 pb-2 pt-4">
        {middle ? (
          <OutlinePreview
            category={blank.category}
            measurements={middle.measurements}
            fill={colour}
            frame={THUMB_FRAME}
            className="h-40 w-full"
            title={`${blank.name}, size ${middle.size}, front`}
          />
        ) : (
          <div className="h-40" />
        )}
      </div>
      <div className="flex flex-1 flex-col gap-2 p-4">
        <div className="flex items-start justify-between gap-3">
          <h3 className="text-base font-semibold leading-snug group-hover:text-patina-800">{blank.name}</h3>
          <BlankBadge library={library} />
        </div>
        <p className="text-sm text-ink-600">
          <span className="font-medium text-ink-800">{sizeRange(sizes)}</span>
          {sizes.length > 1 ? (
            <>
              <span className="text-ink-400"> · </span>
              {sizes.length} sizes<span className="text-ink-500"> · drawn at {middle?.size}</span>
            </>
          ) : null}
        </p>
        <div className="mt-auto pt-1">
          <ColourSwatches colours={blank.colours} />
        </div>
      </div>
    </Link>
  );
}
