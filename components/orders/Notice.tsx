import type { Ref } from "react";

export type NoticeTone = "ok" | "warn" | "error";

const TONES: Record<NoticeTone, string> = {
  ok: "bg-patina-100 text-patina-800",
  warn: "bg-ochre-100 text-ochre-800",
  error: "bg-brick-100 text-brick-800",
};

/**
 * A short message under a form or panel; errors are announced at once, the rest politely.
 * `focusable` lets a page move the focus to it (out of the tab order).
 */
export function Notice({ tone, children, testId, ref, focusable }: { tone: NoticeTone; children: React.ReactNode; testId?: string; ref?: Ref<HTMLDivElement>; focusable?: boolean }) {
  return (
    <div ref={ref} role={tone === "error" ? "alert" : "status"} tabIndex={focusable ? -1 : undefined} data-testid={testId} className={`rounded-lg px-3 py-2 text-sm ${TONES[tone]}`}>
      {children}
    </div>
  );
}
