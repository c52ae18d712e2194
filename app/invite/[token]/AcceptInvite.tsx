"use client";

import { signIn, signOut } from "@/components/forms/auth-client";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { useHydrated } from "@/components/orders/useHydrated";
import { acceptInvitationAction } from "./actions";

export function AcceptInvite({ token, email, needsAccount }: { token: string; email: string; needsAccount: boolean }) {
  const router = useRouter();
  const hydrated = useHydrated();
  const [error, setError] = useState<string>();
  const [fieldErrors, setFieldErrors] = useState<Record<string, string[] | undefined>>({});
  const [busy, setBusy] = useState(false);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const password = needsAccount ? String(form.get("password") ?? "") : undefined;
    setBusy(true);
    const result = await acceptInvitationAction({ token, name: needsAccount ? String(form.get("name") ?? "") : undefined, password });
    setBusy(false);
    if (!result.ok) {
      setError(result.error);
      setFieldErrors(result.fieldErrors ?? {});
      return;
    }
    // A new account signs in with the password just chosen; an existing one is signed in already.
    if (password) await signIn("credentials", { email, password, redirect: false });
    router.replace(`/shops/${result.data.shopSlug}`);
    router.refresh();
  }

  return (
    <form onSubmit={onSubmit} className="mt-6 space-y-4" noValidate data-hydrated={hydrated}>
      {error ? (
        <p role="alert" className="rounded-lg bg-brick-100 px-3 py-2 text-sm text-brick-800">
          {error}
        </p>
      ) : null}
      {needsAccount ? (
        <>
          <div>
            <label htmlFor="name" className="field-label">
              Your name
            </label>
            <input id="name" name="name" className="field-input" autoComplete="name" />
            {fieldErrors.name?.[0] ? <p className="field-error">{fieldErrors.name[0]}</p> : null}
          </div>
          <div>
            <label htmlFor="password" className="field-label">
              Choose a password
            </label>
            <input id="password" name="password" type="password" className="field-input" autoComplete="new-password" />
            {fieldErrors.password?.[0] ? <p className="field-error">{fieldErrors.password[0]}</p> : null}
          </div>
        </>
      ) : (
        <p className="text-sm text-ink-600">You are signed in as {email}.</p>
      )}
      <button type="submit" className="btn-primary w-full" disabled={busy}>
        {busy ? "Joining…" : "Accept and join"}
      </button>
    </form>
  );
}

/** Someone else is signed in: sign out first, then sign in as the invited address and come back. */
export function SwitchAccount({ signedInAs, email, signInHref }: { signedInAs: string; email: string; signInHref: string }) {
  const hydrated = useHydrated();
  const [busy, setBusy] = useState(false);
  return (
    <div className="mt-6 space-y-4" data-hydrated={hydrated} data-testid="invite-switch-account">
      <p className="text-sm text-ink-700">
        You are signed in as {signedInAs}. This invitation joins the account for {email}: sign out, then sign in as {email} to accept.
      </p>
      <button
        type="button"
        className="btn-primary w-full"
        disabled={busy}
        onClick={() => {
          setBusy(true);
          void signOut({ callbackUrl: signInHref });
        }}
      >
        {busy ? "Signing out…" : `Sign out and sign in as ${email}`}
      </button>
    </div>
  );
}
