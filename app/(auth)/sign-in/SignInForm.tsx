"use client";

import Link from "next/link";
import { signIn } from "@/components/forms/auth-client";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { checkEmailPath } from "@/lib/sign-in-paths";

type Props = { callbackUrl?: string; initialError?: string; initialEmail?: string; signedOut?: boolean };

/** What sending a link can answer, in words: a sentence from the server (the rate limit) is shown as it is. */
function linkError(code: string | null | undefined): string {
  if (code === "NoAccount") return "There is no Chalkline account for that e-mail. Ask your shop for an invitation, or start a shop.";
  if (code && code.includes(" ")) return code;
  return "We could not send a link to that address. Check it, or use your password.";
}

export function SignInForm({ callbackUrl, initialError, initialEmail, signedOut }: Props) {
  const router = useRouter();
  const [mode, setMode] = useState<"password" | "link">("password");
  const [error, setError] = useState<string | undefined>(initialError);
  /** The address whose password was right but which was never proven: offered a new link. */
  const [unproven, setUnproven] = useState<string>();
  const [busy, setBusy] = useState(false);
  const returnTo = callbackUrl ?? "/home";

  async function sendLink(email: string) {
    setBusy(true);
    setError(undefined);
    const result = await signIn("email", { email, callbackUrl: returnTo, redirect: false });
    setBusy(false);
    if (!result || result.error) {
      // Past the link limits the answer is a 429 whose error is already in words.
      setError(result?.status === 429 && result.error ? result.error : linkError(result?.error));
      return;
    }
    if (result.url && result.url.includes("error=")) {
      setError(linkError(new URL(result.url, window.location.origin).searchParams.get("error")));
      return;
    }
    router.push(checkEmailPath(email, returnTo));
  }

  async function submitPassword(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const email = String(form.get("email") ?? "").trim();
    setBusy(true);
    setError(undefined);
    setUnproven(undefined);
    const result = await signIn("credentials", {
      email,
      password: String(form.get("password") ?? ""),
      redirect: false,
    });
    setBusy(false);
    if (!result || result.error) {
      if (result?.error === "EmailUnproven") {
        setUnproven(email);
        return;
      }
      setError(
        result?.error && result.error !== "CredentialsSignin"
          ? result.error
          : "That e-mail and password do not match. Check both and try again.",
      );
      return;
    }
    router.replace(returnTo);
    router.refresh();
  }

  async function submitLink(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    await sendLink(String(form.get("email") ?? "").trim());
  }

  return (
    <div className="card p-6 sm:p-8">
      <h1 className="text-2xl">Sign in</h1>
      <p className="mt-1 text-sm text-ink-600">For shop teams and their clients.</p>
      {signedOut ? (
        <p role="status" className="mt-4 rounded-lg bg-patina-100 px-3 py-2 text-sm text-patina-800">
          You are signed out.
        </p>
      ) : null}

      <div className="mt-6 grid grid-cols-2 gap-1 rounded-lg bg-paper-200 p-1 text-sm" role="tablist" aria-label="Sign-in method">
        {(
          [
            ["password", "Password"],
            ["link", "E-mail me a link"],
          ] as const
        ).map(([key, label]) => (
          <button
            key={key}
            type="button"
            role="tab"
            aria-selected={mode === key}
            onClick={() => {
              setMode(key);
              setError(undefined);
              setUnproven(undefined);
            }}
            className={`rounded-md px-3 py-1.5 font-medium ${mode === key ? "bg-chalk text-ink-900 shadow-card" : "text-ink-600"}`}
          >
            {label}
          </button>
        ))}
      </div>

      {error ? (
        <p role="alert" className="mt-4 rounded-lg border border-brick-300 bg-brick-100 px-3 py-2 text-sm text-brick-800">
          {error}
        </p>
      ) : null}

      {unproven ? (
        <div role="alert" className="mt-4 rounded-lg border border-brick-300 bg-brick-100 px-3 py-2 text-sm text-brick-800">
          <p>
            Open the link we e-mailed to <strong>{unproven}</strong> first: it proves the address is yours. After that, your password
            works here.
          </p>
          <button type="button" className="btn-quiet mt-2" disabled={busy} onClick={() => void sendLink(unproven)}>
            {busy ? "Sending…" : "Send the link again"}
          </button>
        </div>
      ) : null}

      {mode === "password" ? (
        <form onSubmit={submitPassword} className="mt-5 space-y-4" noValidate>
          <div>
            <label htmlFor="email" className="field-label">
              E-mail
            </label>
            <input id="email" name="email" type="email" autoComplete="email" required defaultValue={initialEmail} className="field-input" />
          </div>
          <div>
            <label htmlFor="password" className="field-label">
              Password
            </label>
            <input id="password" name="password" type="password" autoComplete="current-password" required className="field-input" />
          </div>
          <button type="submit" className="btn-primary w-full" disabled={busy}>
            {busy ? "Signing in…" : "Sign in"}
          </button>
        </form>
      ) : (
        <form onSubmit={submitLink} className="mt-5 space-y-4" noValidate>
          <div>
            <label htmlFor="link-email" className="field-label">
              E-mail
            </label>
            <input id="link-email" name="email" type="email" autoComplete="email" required defaultValue={initialEmail} className="field-input" />
            <p className="mt-1 text-xs text-ink-500">We send a one-time link that signs you in. No password needed.</p>
          </div>
          <button type="submit" className="btn-primary w-full" disabled={busy}>
            {busy ? "Sending…" : "Send sign-in link"}
          </button>
        </form>
      )}

      <p className="mt-6 text-center text-sm text-ink-600">
        New to Chalkline?{" "}
        <Link href="/sign-up" className="font-medium text-patina-700 underline-offset-2 hover:underline">
          Start a shop
        </Link>
      </p>
    </div>
  );
}
