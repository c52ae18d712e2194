"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { useFieldArray, useForm, type FieldPath } from "react-hook-form";
import { createClientAction, setClientArchivedAction, updateClientAction } from "@/app/shops/[shop]/clients/actions";
import { clientFormSchema, type ClientFormValues } from "./schemas";
import { Notice } from "./Notice";
import { withArrival } from "@/components/ui/ArrivalNote";
import { useHydrated } from "./useHydrated";

type Props = {
  shopSlug: string;
  clientId?: string;
  archived?: boolean;
  canEdit: boolean;
  defaults: ClientFormValues;
};

export function ClientForm({ shopSlug, clientId, archived = false, canEdit, defaults }: Props) {
  const router = useRouter();
  const hydrated = useHydrated();
  const [notice, setNotice] = useState<{ tone: "ok" | "error"; text: string }>();
  const [archiving, startArchive] = useTransition();
  const {
    register,
    control,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting, isDirty },
  } = useForm<ClientFormValues>({ resolver: zodResolver(clientFormSchema), defaultValues: defaults });
  const contacts = useFieldArray({ control, name: "contacts", keyName: "key" });

  const onSubmit = handleSubmit(async (values) => {
    setNotice(undefined);
    const result = clientId ? await updateClientAction({ shopSlug, clientId, ...values }) : await createClientAction({ shopSlug, ...values });
    if (!result.ok) {
      for (const [path, messages] of Object.entries(result.fieldErrors ?? {})) {
        if (messages?.[0]) setError(path as FieldPath<ClientFormValues>, { message: messages[0] });
      }
      setNotice({ tone: "error", text: result.error });
      return;
    }
    if (!clientId) {
      router.push(withArrival(`/shops/${shopSlug}/clients/${result.data.id}`, "client-created"));
      return;
    }
    reset(values);
    setNotice({ tone: "ok", text: "Saved." });
    router.refresh();
  });

  const toggleArchive = () =>
    startArchive(async () => {
      if (!clientId) return;
      const result = await setClientArchivedAction({ shopSlug, clientId, archived: !archived });
      setNotice(result.ok ? { tone: "ok", text: result.data.archived ? "Archived. Their jobs stay; they leave the client lists." : "Restored." } : { tone: "error", text: result.error });
      router.refresh();
    });

  const contactErrors = errors.contacts;
  return (
    <form onSubmit={onSubmit} noValidate className="card space-y-5 p-5" data-hydrated={hydrated} aria-label={clientId ? "Client details" : "New client"}>
      <fieldset disabled={!canEdit} className="space-y-5">
        <div>
          <label htmlFor="client-name" className="field-label">
            Name
          </label>
          <input id="client-name" className="field-input" aria-invalid={errors.name ? true : undefined} {...register("name")} />
          {errors.name ? <p className="field-error">{errors.name.message}</p> : null}
        </div>
        <div>
          <label htmlFor="client-notes" className="field-label">
            Notes
          </label>
          <textarea id="client-notes" rows={3} className="field-input" {...register("notes")} />
          {errors.notes ? <p className="field-error">{errors.notes.message}</p> : null}
        </div>
        <label className="flex items-start gap-3 text-sm">
          <input type="checkbox" className="mt-1 accent-patina-600" {...register("taxExempt")} />
          <span>
            <span className="font-medium">Tax exempt</span>
            <span className="block text-ink-600">A resale or exempt-organisation certificate is on file. Quotes for this client carry no tax.</span>
          </span>
        </label>

        <fieldset>
          <legend className="field-label">Contacts</legend>
          <p className="mb-3 text-sm text-ink-600">Contacts get quotes and receipts. A contact who signs in with this e-mail sees this client&apos;s jobs and nothing else.</p>
          {typeof contactErrors?.message === "string" ? <p className="field-error mb-2">{contactErrors.message}</p> : null}
          <ul className="space-y-3">
            {contacts.fields.map((field, i) => {
              const err = contactErrors?.[i];
              return (
                <li key={field.key} className="grid gap-3 rounded-lg border border-paper-300 p-3 sm:grid-cols-[1fr_1fr_10rem_auto]" data-testid="contact-row">
                  <div>
                    <label htmlFor={`contact-${i}-name`} className="field-label">
                      Name
                    </label>
                    <input id={`contact-${i}-name`} className="field-input" aria-invalid={err?.name ? true : undefined} {...register(`contacts.${i}.name`)} />
                    {err?.name ? <p className="field-error">{err.name.message}</p> : null}
                  </div>
                  <div>
                    <label htmlFor={`contact-${i}-email`} className="field-label">
                      E-mail
                    </label>
                    <input id={`contact-${i}-email`} type="email" className="field-input" aria-invalid={err?.email ? true : undefined} {...register(`contacts.${i}.email`)} />
                    {err?.email ? <p className="field-error">{err.email.message}</p> : null}
                  </div>
                  <div>
                    <label htmlFor={`contact-${i}-phone`} className="field-label">
                      Phone
                    </label>
                    <input id={`contact-${i}-phone`} type="tel" className="field-input" {...register(`contacts.${i}.phone`)} />
                  </div>
                  <div className="flex items-end">
                    <button type="button" className="btn-quiet" onClick={() => contacts.remove(i)} aria-label={`Remove contact ${i + 1}`}>
                      Remove
                    </button>
                  </div>
                </li>
              );
            })}
          </ul>
          <button type="button" className="btn-quiet mt-3" onClick={() => contacts.append({ name: "", email: "", phone: "" })}>
            Add a contact
          </button>
        </fieldset>
      </fieldset>

      {notice ? <Notice tone={notice.tone}>{notice.text}</Notice> : null}
      {canEdit ? (
        <div className="flex flex-wrap items-center gap-3">
          <button type="submit" className="btn-primary" disabled={isSubmitting}>
            {isSubmitting ? "Saving…" : clientId ? "Save client" : "Create client"}
          </button>
          {clientId && isDirty ? <span className="text-sm text-ink-500">Unsaved changes</span> : null}
          {clientId ? (
            <button type="button" className="btn-quiet ml-auto" onClick={toggleArchive} disabled={archiving}>
              {archived ? "Restore client" : "Archive client"}
            </button>
          ) : null}
        </div>
      ) : null}
    </form>
  );
}
