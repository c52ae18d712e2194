"use client";

import { useEffect, useRef, useState } from "react";

/**
 * Copies `text` and says so: the button reads "Copied" for a moment, and a polite live region
 * tells a screen reader. When the browser refuses the clipboard, it says that instead and selects
 * nothing for the user to lose.
 */
export function CopyButton({ text, label = "Copy", what = "Link", className = "btn-quiet px-2.5 py-1 text-xs" }: { text: string; label?: string; what?: string; className?: string }) {
  const [said, setSaid] = useState<"copied" | "refused" | null>(null);
  const timer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  useEffect(() => () => clearTimeout(timer.current), []);
  const copy = async () => {
    clearTimeout(timer.current);
    try {
      if (!navigator.clipboard) throw new Error("no clipboard");
      await navigator.clipboard.writeText(text);
      setSaid("copied");
    } catch {
      setSaid("refused");
    }
    timer.current = setTimeout(() => setSaid(null), 2500);
  };
  return (
    <>
      <button type="button" className={className} onClick={copy}>
        {said === "copied" ? "Copied" : label}
      </button>
      {/* A polite live region of its own, without role=status, so it never doubles the status it sits in. */}
      <span aria-live="polite" className="sr-only" data-testid="copy-said">
        {said === "copied" ? `${what} copied.` : said === "refused" ? `${what} could not be copied: select it and copy it by hand.` : ""}
      </span>
      {said === "refused" ? <span className="text-xs text-brick-700">Select the link and copy it by hand.</span> : null}
    </>
  );
}
