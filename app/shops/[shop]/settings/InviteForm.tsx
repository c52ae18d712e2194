"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { useHydrated } from "@/components/orders/useHydrated";
import { ROLE_DESCRIPTIONS, ROLE_LABELS, SHOP_ROLES } from "@/lib/access";
import { inviteMemberAction } from "./actions";

const schema = z.object({
  email: z.string().trim().email("Enter a valid e-mail address."),
  role: z.enum(SHOP_ROLES),
});
type Values = z.infer<typeof schema>;

export function InviteForm({ shopSlug }: { shopSlug: string }) {
  const hydrated = useHydrated();
  const [notice, setNotice] = useState<{ tone: "ok" | "warn" | "error"; text: string; link?: string }>();
  const {
    register,
    handleSubmit,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<Values>({ resolver: zodResolver(schema), defaultValues: { role: "designer" } });

  const onSubmit = handleSubmit(async (values) => {
    setNotice(undefined);
    const result = await inviteMemberAction({ shopSlug, ...values });
    if (!result.ok) {
      setNotice({ tone: "error", text: result.error });
      return;
    }
    reset({ email: "", role: values.role });
    setNotice(
      result.data.emailed
        ? { tone: "ok", text: `Invitation sent to ${values.email}.` }
        : { tone: "warn", text: "The invitation is saved, but the e-mail could not be sent. Share this link yourself:", link: result.data.link },
    );
  });

  return (
    <form onSubmit={onSubmit} className="card space-y-4 p-5" noValidate aria-label="Invite a team member" data-hydrated={hydrated}>
      <h2 className="text-lg">Invite someone</h2>
      <div>
        <label htmlFor="invite-email" className="field-label">
          E-mail
        </label>
        <input id="invite-email" type="email" className="field-input" aria-invalid={errors.email ? true : undefined} {...register("email")} />
        {errors.email ? <p className="field-error">{errors.email.message}</p> : null}
      </div>
      <fieldset>
        <legend className="field-label">Role</legend>
        <div className="space-y-2">
          {SHOP_ROLES.map((role) => (
            <label key={role} className="flex cursor-pointer items-start gap-3 rounded-lg border border-paper-300 p-3 has-[:checked]:border-patina-400 has-[:checked]:bg-patina-100">
              <input type="radio" value={role} className="mt-1 accent-patina-600" {...register("role")} />
              <span>
                <span className="block text-sm font-medium">{ROLE_LABELS[role]}</span>
                <span className="block text-xs text-ink-600">{ROLE_DESCRIPTIONS[role]}</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>
      {notice ? (
        <div
          role={notice.tone === "error" ? "alert" : "status"}
          className={`rounded-lg px-3 py-2 text-sm ${
            notice.tone === "ok" ? "bg-patina-100 text-patina-800" : notice.tone === "warn" ? "bg-ochre-100 text-ochre-800" : "bg-brick-100 text-brick-800"
          }`}
        >
          {notice.text}
          {notice.link ? <code className="mt-1 block break-all text-xs">{notice.link}</code> : null}
        </div>
      ) : null}
      <button type="submit" className="btn-primary" disabled={isSubmitting}>
        {isSubmitting ? "Sending…" : "Send invitation"}
      </button>
    </form>
  );
}
