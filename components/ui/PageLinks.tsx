import Link from "next/link";

/**
 * Previous and next links around "page n / m" for a list the server pages. Where a link would lead
 * nowhere, a disabled button stands in its place. Renders nothing when everything fits on one page.
 */
export function PageLinks({ page, pages, hrefOf, className = "" }: { page: number; pages: number; hrefOf: (page: number) => string; className?: string }) {
  if (pages <= 1 && page <= 1) return null;
  const step = (to: number, label: string) =>
    to >= 1 && to <= pages ? (
      <Link href={hrefOf(to)} className="btn-quiet px-3 py-1" rel={to < page ? "prev" : "next"}>
        {label}
      </Link>
    ) : (
      <button type="button" className="btn-quiet px-3 py-1" disabled>
        {label}
      </button>
    );
  return (
    <span className={`inline-flex items-center gap-2 ${className}`}>
      {step(Math.min(page - 1, pages), "Previous")}
      <span className="measure">
        {Math.min(page, pages)} / {pages}
      </span>
      {step(page + 1, "Next")}
    </span>
  );
}
