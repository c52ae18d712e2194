import Link from "next/link";
import { notFound } from "next/navigation";
import { requireShopPage, resolveShopAccess } from "@/app/_server/access";
import { ApproximateNote } from "@/components/blanks/ApproximateNote";
import { BlankBadge } from "@/components/blanks/BlankBadge";
import type { BlankFormValues } from "@/components/blanks/blank-form";
import { sizeRange } from "@/components/blanks/chart-columns";
import { MeasuringGuide } from "@/components/blanks/MeasuringGuide";
import { SizeChartView } from "@/components/blanks/SizeChartView";
import { findBlank, listBlankCopies } from "@/db/queries/blanks";
import { can } from "@/lib/access";
import { CATEGORY_INFO } from "@/lib/garments/types";
import { BlankEditor } from "./BlankEditor";
import { CopyBlankButton } from "./CopyBlankButton";

export const dynamic = "force-dynamic";

type Props = {
  params: Promise<{ shop: string; blankId: string }>;
  searchParams: Promise<{ copied?: string }>;
};

export async function generateMetadata({ params }: Props) {
  const { shop, blankId } = await params;
  const access = await resolveShopAccess(shop, "blanks.view");
  const blank =
    access.kind === "ok" ? await findBlank({ shopId: access.access.shop.id, blankId }) : undefined;
  return { title: blank?.name ?? "Blank" };
}

export default async function BlankPage({ params, searchParams }: Props) {
  const { shop, blankId } = await params;
  const { copied } = await searchParams;
  const access = await requireShopPage(shop, "blanks.view", `/shops/${shop}/blanks/${blankId}`);
  const blank = await findBlank({ shopId: access.shop.id, blankId });
  if (!blank) notFound();

  const library = blank.shopId === null;
  const canEdit = can(access.role, "blanks.edit");
  const base = `/shops/${access.shop.slug}/blanks`;
  const [copies, source] = await Promise.all([
    library && canEdit
      ? listBlankCopies({ shopId: access.shop.id, sourceBlankId: blank.id })
      : Promise.resolve([]),
    !library && blank.sourceBlankId
      ? findBlank({ shopId: access.shop.id, blankId: blank.sourceBlankId })
      : Promise.resolve(undefined),
  ]);
  const editable = !library && canEdit;

  const initial: BlankFormValues = {
    name: blank.name,
    description: blank.description ?? "",
    colours: blank.colours.map((c) => ({ name: c.name, hex: c.hex.toUpperCase() })),
    sizes: blank.sizeChart.map((row) => ({
      size: row.size,
      group: row.group,
      measurements: { ...(row.measurements as unknown as Record<string, number>) },
    })),
  };

  const intro = (
    <>
      {copied && !library ? (
        <p role="status" className="rounded-lg bg-patina-100 px-4 py-3 text-sm text-patina-800">
          This is your shop&apos;s own copy. Change the numbers to match your supplier&apos;s chart and save;
          the library version stays as it was.
        </p>
      ) : null}
      <ApproximateNote>
        {library
          ? canEdit
            ? "Typical values for this kind of garment, shared by every shop and read-only. Make an editable copy to set your supplier's numbers."
            : "Typical values for this kind of garment, shared by every shop and read-only. An owner or designer can make an editable copy."
          : "These numbers started as typical values. Check each size against the chart from your supplier, then save."}
      </ApproximateNote>
      {library && copies.length > 0 ? (
        <section className="card px-4 py-3 text-sm" aria-label="Your copies">
          <span className="text-ink-600">
            Your shop already has {copies.length === 1 ? "a copy" : `${copies.length} copies`}:{" "}
          </span>
          {copies.map((c, i) => (
            <span key={c.id}>
              {i > 0 ? ", " : null}
              <Link href={`${base}/${c.id}`} className="font-medium text-patina-700 hover:underline">
                {c.name}
              </Link>
            </span>
          ))}
        </section>
      ) : null}
    </>
  );

  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-4 text-sm">
        <Link href={base} className="text-patina-700 hover:underline">
          ← All blanks
        </Link>
      </nav>

      <header className="mb-6 flex flex-wrap items-start justify-between gap-4">
        <div className="min-w-0">
          <p className="text-sm font-medium text-ink-500">{CATEGORY_INFO[blank.category].label}</p>
          <div className="mt-0.5 flex flex-wrap items-center gap-3">
            <h1 className="text-2xl">{blank.name}</h1>
            <BlankBadge library={library} />
          </div>
          {blank.description ? <p className="mt-1 max-w-prose text-ink-600">{blank.description}</p> : null}
          <div className="mt-3 flex flex-wrap items-center gap-x-4 gap-y-2 text-sm text-ink-600">
            <span>
              <span className="font-medium text-ink-800">{sizeRange(blank.sizeChart)}</span>
              {blank.sizeChart.length > 1 ? ` · ${blank.sizeChart.length} sizes` : null} ·{" "}
              {blank.colours.length} {blank.colours.length === 1 ? "colour" : "colours"}
            </span>
            {source ? (
              <span>
                Copied from{" "}
                <Link href={`${base}/${source.id}`} className="text-patina-700 hover:underline">
                  {source.name}
                </Link>
              </span>
            ) : null}
          </div>
        </div>
        {library && canEdit ? <CopyBlankButton shopSlug={access.shop.slug} blankId={blank.id} /> : null}
      </header>

      {editable ? (
        <BlankEditor
          shopSlug={access.shop.slug}
          clock={access.shop.clock}
          blankId={blank.id}
          category={blank.category}
          initial={initial}
          intro={intro}
        />
      ) : (
        <SizeChartView
          category={blank.category}
          sizes={blank.sizeChart}
          colours={blank.colours}
          intro={
            <>
              {intro}
              <ColourList colours={blank.colours} />
            </>
          }
          notes={<MeasuringGuide category={blank.category} />}
        />
      )}
    </>
  );
}

function ColourList({ colours }: { colours: readonly { name: string; hex: string }[] }) {
  return (
    <section className="card p-4" aria-labelledby="colours-heading">
      <h2 id="colours-heading" className="text-base">
        Colours
      </h2>
      <ul className="mt-3 grid gap-2 sm:grid-cols-2">
        {colours.map((c) => (
          <li key={`${c.name}-${c.hex}`} className="flex items-center gap-3 text-sm">
            <span
              className="h-6 w-6 shrink-0 rounded-md border border-ink-900/15"
              style={{ backgroundColor: c.hex }}
              aria-hidden="true"
            />
            <span className="text-ink-800">{c.name}</span>
            <span className="measure ml-auto text-xs text-ink-500">{c.hex.toUpperCase()}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}
