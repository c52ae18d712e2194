"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { signIn } from "@/components/forms/auth-client";
import { lazyResolver } from "@/components/forms/lazy-resolver";
import { checkEmailPath } from "@/lib/sign-in-paths";
import { signUpAction } from "./actions";
import { browserClock } from "@/lib/dates";
import type { SignUpValues as Values } from "./schema";

const resolver = lazyResolver<Values>(() => import("./schema").then((m) => m.signUpResolver));

export function SignUpForm() {
  const router = useRouter();
  const [error, setError] = useState<string>();
  const {
    register,
    handleSubmit,
    setError: setFieldError,
    formState: { errors, isSubmitting },
  } = useForm<Values>({ resolver });

  const onSubmit = handleSubmit(async (values) => {
    setError(undefined);
    const clock = browserClock();
    const result = await signUpAction({ ...values, timeZone: clock.timeZone, locale: clock.locale });
    if (!result.ok) {
      setError(result.error);
      for (const [field, messages] of Object.entries(result.fieldErrors ?? {})) {
        if (messages?.[0]) setFieldError(field as keyof Values, { message: messages[0] });
      }
      return;
    }
    // The password works once the address is proven: the e-mailed link does that, signs in and opens the shop.
    const shopPath = `/shops/${result.data.shopSlug}`;
    const email = values.email.trim().toLowerCase();
    const sent = await signIn("email", { email, callbackUrl: shopPath, redirect: false }).catch(() => undefined);
    const failed = !sent || Boolean(sent.error) || Boolean(sent.url?.includes("error="));
    router.replace(checkEmailPath(email, shopPath, failed));
  });

  const field = (name: keyof Values, label: string, type = "text", autoComplete?: string) => (
    <div>
      <label htmlFor={name} className="field-label">
        {label}
      </label>
      <input
        id={name}
        type={type}
        autoComplete={autoComplete}
        aria-invalid={errors[name] ? true : undefined}
        aria-describedby={errors[name] ? `${name}-error` : undefined}
        className="field-input"
        {...register(name)}
      />
      {errors[name] ? (
        <p id={`${name}-error`} className="field-error">
          {errors[name]?.message}
        </p>
      ) : null}
    </div>
  );

  return (
    <div className="card p-6 sm:p-8">
      <h1 className="text-2xl">Start a shop</h1>
      <p className="mt-1 text-sm text-ink-600">
        You will be its owner, and can invite your team after. We e-mail you a link to confirm the address before the shop opens.
      </p>
      {error ? (
        <p role="alert" className="mt-4 rounded-lg border border-brick-300 bg-brick-100 px-3 py-2 text-sm text-brick-800">
          {error}
        </p>
      ) : null}
      <form onSubmit={onSubmit} className="mt-5 space-y-4" noValidate>
        {field("shopName", "Shop name", "text", "organization")}
        {field("name", "Your name", "text", "name")}
        {field("email", "E-mail", "email", "email")}
        {field("password", "Password", "password", "new-password")}
        <button type="submit" className="btn-primary w-full" disabled={isSubmitting}>
          {isSubmitting ? "Creating your shop…" : "Create shop"}
        </button>
      </form>
      <p className="mt-6 text-center text-sm text-ink-600">
        Already have an account?{" "}
        <Link href="/sign-in" className="font-medium text-patina-700 hover:underline">
          Sign in
        </Link>
      </p>
    </div>
  );
}
