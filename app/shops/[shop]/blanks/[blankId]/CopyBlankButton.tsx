"use client";

import { unstable_rethrow } from "next/navigation";
import { useState, useTransition } from "react";
import { duplicateBlankAction } from "../actions";

/** Copies a library blank into the shop; the server opens the copy when it is made. */
export function CopyBlankButton({
  shopSlug,
  blankId,
  label = "Make an editable copy",
}: {
  shopSlug: string;
  blankId: string;
  label?: string;
}) {
  const [pending, startTransition] = useTransition();
  const [error, setError] = useState<string>();

  const copy = () => {
    setError(undefined);
    startTransition(async () => {
      try {
        const result = await duplicateBlankAction({ shopSlug, blankId });
        if (result && !result.ok) setError(result.error);
      } catch (err) {
        // Success arrives as a redirect to the copy, which the router must see; anything else is a real failure.
        unstable_rethrow(err);
        setError("The copy could not be made. Check your connection and try again.");
      }
    });
  };

  return (
    <div className="space-y-2">
      <button type="button" className="btn-primary" onClick={copy} disabled={pending}>
        {pending ? "Copying…" : label}
      </button>
      {error ? (
        <p role="alert" className="rounded-lg bg-brick-100 px-3 py-2 text-sm text-brick-800">
          {error}
        </p>
      ) : null}
    </div>
  );
}
