import type { ReactNode } from "react";

export function EmptyState({ title, children, action }: { title: string; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="rounded-card border border-dashed border-ink-200 bg-paper-50 px-6 py-10 text-center">
      <h3 className="text-lg">{title}</h3>
      {children ? <div className="mx-auto mt-2 max-w-prose text-sm text-ink-600">{children}</div> : null}
      {action ? <div className="mt-5">{action}</div> : null}
    </div>
  );
}
