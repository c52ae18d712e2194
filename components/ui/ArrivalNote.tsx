"use client";

import { useEffect, useState } from "react";
import { usePathname, useRouter, useSearchParams } from "next/navigation";
import { Notice } from "@/components/orders/Notice";

/** What a form that leaves for another page confirms there, by the `done` word in the address. */
const DONE_TEXT = {
  "job-created": "Job created. Add a proof next, then share it with the client.",
  "job-saved": "Job saved.",
  "client-created": "Client added.",
} as const;

export type ArrivalWord = keyof typeof DONE_TEXT;

/** The address a form goes to, carrying the confirmation to show on arrival. */
export function withArrival(href: string, word: ArrivalWord): string {
  return `${href}${href.includes("?") ? "&" : "?"}done=${word}`;
}

/**
 * Confirms, in words a screen reader announces, the action that brought the user here; then takes
 * the word out of the address so a reload or a shared link does not say it again.
 */
export function ArrivalNote() {
  const params = useSearchParams();
  const pathname = usePathname();
  const router = useRouter();
  const word = params.get("done");
  const [text] = useState(() => (word && word in DONE_TEXT ? DONE_TEXT[word as ArrivalWord] : null));
  useEffect(() => {
    if (!word) return;
    const rest = new URLSearchParams(params.toString());
    rest.delete("done");
    const q = rest.toString();
    router.replace(`${pathname}${q ? `?${q}` : ""}`, { scroll: false });
  }, [word, params, pathname, router]);
  return text ? (
    <Notice tone="ok" testId="arrival-note">
      {text}
    </Notice>
  ) : null;
}
