"use client";

import { useEffect } from "react";

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <main className="mx-auto flex min-h-[70vh] max-w-lg flex-col justify-center px-gutter">
      <h1 className="text-2xl">Something went wrong on our side</h1>
      <p className="mt-2 text-ink-700">
        We could not load this page. Often the database is restarting; your saved work is safe. Try again in a few seconds.
      </p>
      {error.digest ? <p className="measure mt-2 text-xs text-ink-500">Reference {error.digest}</p> : null}
      <button type="button" onClick={reset} className="btn-primary mt-6 self-start">
        Try again
      </button>
    </main>
  );
}
