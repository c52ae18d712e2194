"use client";

import { signIn } from "@/components/forms/auth-client";
import { useState } from "react";
import { useHydrated } from "@/components/orders/useHydrated";

/** Asks for another link to the same address (the first may be slow, filtered or expired). */
export function SendAgain({ email, callbackUrl }: { email: string; callbackUrl: string }) {
  const hydrated = useHydrated();
  const [state, setState] = useState<{ kind: "idle" | "busy" | "sent" } | { kind: "error"; message: string }>({ kind: "idle" });

  async function send() {
    setState({ kind: "busy" });
    const result = await signIn("email", { email, callbackUrl, redirect: false });
    const code = result?.error ?? (result?.url?.includes("error=") ? new URL(result.url, window.location.origin).searchParams.get("error") : null);
    if (!result || code) {
      setState({ kind: "error", message: code && code.includes(" ") ? code : "We could not send another link just now. Try again in a moment." });
      return;
    }
    setState({ kind: "sent" });
  }

  return (
    <div className="mt-5" data-hydrated={hydrated}>
      <p className="text-sm text-ink-600">Nothing arrived? Look in the spam folder, or ask for a new link.</p>
      <button type="button" className="btn-quiet mt-2" disabled={state.kind === "busy"} onClick={() => void send()}>
        {state.kind === "busy" ? "Sending…" : "Send the link again"}
      </button>
      {state.kind === "sent" ? (
        <p role="status" className="mt-2 text-sm text-patina-800">
          A new link is on its way to {email}.
        </p>
      ) : null}
      {state.kind === "error" ? (
        <p role="alert" className="mt-2 text-sm text-brick-800">
          {state.message}
        </p>
      ) : null}
    </div>
  );
}
