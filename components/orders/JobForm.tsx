"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm, useWatch, type FieldPath } from "react-hook-form";
import { saveJobAction } from "@/app/shops/[shop]/jobs/actions";
import { locationsFor } from "@/lib/garments/locations";
import type { GarmentCategory } from "@/lib/garments/types";
import { DECORATION_LABELS, DECORATION_METHODS } from "@/lib/jobs";
import type { PriceMatrix } from "@/lib/pricing";
import { PRINT_LOCATION_OPTIONS, quoteJob } from "@/lib/quotes";
import { Notice } from "./Notice";
import { withArrival } from "@/components/ui/ArrivalNote";
import { useHydrated } from "./useHydrated";
import { QuoteLines } from "./QuoteLines";
import { jobFormSchema, type JobFormValues } from "./schemas";
import { SizeRunGrid } from "./SizeRunGrid";

export type BlankOption = { id: string; name: string; category: GarmentCategory; colours: Array<{ name: string; hex: string }> };
export type ClientOption = { id: string; name: string; taxExempt: boolean };

type Props = {
  shopSlug: string;
  jobId?: string;
  defaults: JobFormValues;
  clients: ClientOption[];
  blanks: BlankOption[];
  /** Only for roles that see prices: the live estimate beside the form. */
  matrix: PriceMatrix | null;
};

export function JobForm({ shopSlug, jobId, defaults, clients, blanks, matrix }: Props) {
  const router = useRouter();
  const hydrated = useHydrated();
  const [notice, setNotice] = useState<string>();
  const {
    register,
    control,
    handleSubmit,
    setError,
    setValue,
    formState: { errors, isSubmitting },
  } = useForm<JobFormValues>({ resolver: zodResolver(jobFormSchema), defaultValues: defaults });
  const watched = useWatch({ control }) as JobFormValues;
  const blank = blanks.find((b) => b.id === watched.blankId) ?? null;
  const method = watched.method;
  const locations = watched.printLocations ?? [];
  const candidates = blank ? PRINT_LOCATION_OPTIONS.filter((o) => locationsFor(blank.category).includes(o.value)) : PRINT_LOCATION_OPTIONS;

  const toggleLocation = (value: string, on: boolean) => {
    const next = on ? [...locations, { location: value as (typeof locations)[number]["location"], colours: 1 }] : locations.filter((l) => l.location !== value);
    setValue("printLocations", next, { shouldDirty: true, shouldValidate: true });
  };
  const setColours = (value: string, colours: number) => {
    setValue(
      "printLocations",
      locations.map((l) => (l.location === value ? { ...l, colours } : l)),
      { shouldDirty: true, shouldValidate: true },
    );
  };

  const estimate = (() => {
    if (!matrix) return null;
    const client = clients.find((c) => c.id === watched.clientId);
    const area = typeof watched.dtfAreaIn2 === "number" && Number.isFinite(watched.dtfAreaIn2) ? watched.dtfAreaIn2 : null;
    return quoteJob(
      {
        title: watched.title ?? "",
        method: watched.method,
        sizeRun: (watched.sizeRun ?? []).map((r) => ({ size: r.size, quantity: Number.isSafeInteger(r.quantity) && r.quantity > 0 ? r.quantity : 0 })),
        printLocations: (watched.printLocations ?? []).map((l) => ({ location: l.location, colours: Number.isSafeInteger(l.colours) && l.colours > 0 ? l.colours : 1 })),
        dtfAreaIn2: area,
        rush: Boolean(watched.rush),
        garmentName: blank?.name ?? null,
        garmentColour: watched.garmentColour ?? null,
        blankId: watched.blankId ?? null,
      },
      matrix,
      { taxExempt: client?.taxExempt ?? false },
    );
  })();

  const onSubmit = handleSubmit(async (values) => {
    setNotice(undefined);
    const result = await saveJobAction({ shopSlug, jobId, ...values });
    if (!result.ok) {
      for (const [path, messages] of Object.entries(result.fieldErrors ?? {})) {
        if (messages?.[0]) setError(path as FieldPath<JobFormValues>, { message: messages[0] });
      }
      setNotice(result.error);
      return;
    }
    router.push(withArrival(`/shops/${shopSlug}/jobs/${result.data.id}`, jobId ? "job-saved" : "job-created"));
    router.refresh();
  });

  const err = (m?: string) => (m ? <p className="field-error">{m}</p> : null);
  return (
    <form onSubmit={onSubmit} noValidate aria-label={jobId ? "Edit job" : "New job"} data-hydrated={hydrated} className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <div className="card space-y-5 p-5">
        <div className="grid gap-4 sm:grid-cols-2">
          <div className="sm:col-span-2">
            <label htmlFor="job-title" className="field-label">
              Title
            </label>
            <input id="job-title" className="field-input" aria-invalid={errors.title ? true : undefined} {...register("title")} />
            {err(errors.title?.message)}
          </div>
          <div>
            <label htmlFor="job-client" className="field-label">
              Client
            </label>
            <select id="job-client" className="field-input" aria-invalid={errors.clientId ? true : undefined} {...register("clientId")}>
              <option value="">Pick a client…</option>
              {clients.map((c) => (
                <option key={c.id} value={c.id}>
                  {c.name}
                </option>
              ))}
            </select>
            {err(errors.clientId?.message)}
          </div>
          <div>
            <label htmlFor="job-due" className="field-label">
              Due date
            </label>
            <input id="job-due" type="date" className="field-input" aria-invalid={errors.dueDate ? true : undefined} {...register("dueDate")} />
            {err(errors.dueDate?.message)}
          </div>
          <div>
            <label htmlFor="job-method" className="field-label">
              Decoration method
            </label>
            <select id="job-method" className="field-input" {...register("method")}>
              {DECORATION_METHODS.map((m) => (
                <option key={m} value={m}>
                  {DECORATION_LABELS[m]}
                </option>
              ))}
            </select>
            {err(errors.method?.message)}
          </div>
          <div>
            <label htmlFor="job-blank" className="field-label">
              Garment style
            </label>
            <select id="job-blank" className="field-input" {...register("blankId")}>
              <option value="">Not chosen yet</option>
              {blanks.map((b) => (
                <option key={b.id} value={b.id}>
                  {b.name}
                </option>
              ))}
            </select>
            {err(errors.blankId?.message)}
          </div>
          <div>
            <label htmlFor="job-colour" className="field-label">
              Garment colour
            </label>
            <input id="job-colour" list="job-colour-options" className="field-input" {...register("garmentColour")} />
            <datalist id="job-colour-options">
              {(blank?.colours ?? []).map((c) => (
                <option key={c.name} value={c.name} />
              ))}
            </datalist>
            {err(errors.garmentColour?.message)}
          </div>
          {method === "dtf" ? (
            <div>
              <label htmlFor="job-dtf-area" className="field-label">
                Transfer area per garment (in²)
              </label>
              <input
                id="job-dtf-area"
                type="number"
                step="0.01"
                min="0"
                className="field-input measure"
                aria-invalid={errors.dtfAreaIn2 ? true : undefined}
                {...register("dtfAreaIn2", { setValueAs: (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v)) })}
              />
              {err(errors.dtfAreaIn2?.message)}
            </div>
          ) : null}
        </div>

        <fieldset id="print-locations">
          <legend className="field-label">Print locations</legend>
          <div className="grid gap-2 sm:grid-cols-2">
            {candidates.map((o) => {
              const chosen = locations.find((l) => l.location === o.value);
              return (
                <div key={o.value} className="flex items-center gap-3 rounded-lg border border-paper-300 px-3 py-2 has-[:checked]:border-patina-400 has-[:checked]:bg-patina-50">
                  <label className="flex flex-1 items-center gap-2 text-sm">
                    <input type="checkbox" className="accent-patina-600" checked={Boolean(chosen)} onChange={(e) => toggleLocation(o.value, e.target.checked)} />
                    {o.label}
                  </label>
                  {chosen && method === "screen-print" ? (
                    <label className="flex items-center gap-1 text-xs text-ink-600">
                      Colours
                      <input
                        type="number"
                        min={1}
                        max={12}
                        className="field-input measure w-16 px-2 py-1 text-sm"
                        value={chosen.colours}
                        aria-label={`Ink colours for ${o.label}`}
                        onChange={(e) => setColours(o.value, Math.max(1, Math.min(12, Math.round(Number(e.target.value) || 1))))}
                      />
                    </label>
                  ) : null}
                </div>
              );
            })}
          </div>
          {err(errors.printLocations?.message ?? errors.printLocations?.root?.message)}
        </fieldset>

        <div>
          <p className="field-label">Size run</p>
          <SizeRunGrid register={register} values={watched.sizeRun ?? []} errors={errors.sizeRun} />
        </div>

        <label className="flex items-start gap-3 text-sm">
          <input type="checkbox" className="mt-1 accent-patina-600" {...register("rush")} />
          <span>
            <span className="font-medium">Rush</span>
            <span className="block text-ink-600">Adds the shop&apos;s rush fee to garments and decoration (not to setup).</span>
          </span>
        </label>
        <div>
          <label htmlFor="job-notes" className="field-label">
            Notes
          </label>
          <textarea id="job-notes" rows={3} className="field-input" {...register("notes")} />
          {err(errors.notes?.message)}
        </div>
        {notice ? <Notice tone="error">{notice}</Notice> : null}
        <div className="flex gap-3">
          <button type="submit" className="btn-primary" disabled={isSubmitting}>
            {isSubmitting ? "Saving…" : jobId ? "Save job" : "Create job"}
          </button>
          <button type="button" className="btn-quiet" onClick={() => router.back()}>
            Cancel
          </button>
        </div>
      </div>

      {matrix ? (
        <aside className="card h-fit space-y-3 p-5 lg:sticky lg:top-4" aria-label="Price estimate" data-testid="price-estimate">
          <h2 className="text-lg">Price as you type</h2>
          {estimate?.ok ? <QuoteLines quote={estimate.quote} /> : <p className="text-sm text-ink-600">{estimate?.message}</p>}
          <p className="text-xs text-ink-500">From the shop&apos;s price matrix. The client sees a quote only when you send it from the job page.</p>
        </aside>
      ) : null}
    </form>
  );
}
