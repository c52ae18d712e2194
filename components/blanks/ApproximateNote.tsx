import type { ReactNode } from "react";

/** The standing reminder that starter measurements are typical values, not a supplier's chart. */
export function ApproximateNote({
  title = "Approximate — edit to your supplier's chart",
  children,
}: {
  title?: string;
  children?: ReactNode;
}) {
  return (
    <aside
      className="flex gap-3 rounded-card border border-ochre-300 bg-ochre-100 px-4 py-3 text-sm text-ochre-800"
      aria-label="About these measurements"
    >
      <svg viewBox="0 0 20 20" className="mt-0.5 h-4 w-4 shrink-0" aria-hidden="true">
        <path
          d="M3 14.5 L13.5 4 L16 6.5 L5.5 17 H3 Z"
          fill="none"
          stroke="currentColor"
          strokeWidth="1.6"
          strokeLinejoin="round"
        />
        <path d="M11.5 6 L14 8.5" stroke="currentColor" strokeWidth="1.6" />
      </svg>
      <div>
        <p className="font-medium">{title}</p>
        {children ? <div className="mt-0.5 text-ochre-800/90">{children}</div> : null}
      </div>
    </aside>
  );
}
