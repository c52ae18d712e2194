"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useId, useRef, useState } from "react";
import { get, useForm, useWatch, type FieldErrors, type FieldPath, type UseFormRegister } from "react-hook-form";
import { savePricesAction } from "@/app/shops/[shop]/prices/actions";
import type { PriceMatrix } from "@/lib/pricing";
import { JOB_SIZE_ORDER } from "@/lib/quotes";
import { CURRENCY_NAMES, SHOP_CURRENCIES, currencySymbol, moneyInputValue, type MoneyStyle } from "@/lib/money";
import { Notice } from "./Notice";
import { useHydrated } from "./useHydrated";
import { priceFormSchema, toPriceForm, type PriceForm } from "./price-form";

type Tiered = "dtf" | "dtg" | "htv" | "sublimation";
const num = { valueAsNumber: true } as const;

/**
 * One number of the matrix. `name` is its accessible name when no visible label wraps it (grid
 * cells); with `label` it draws its own visible label, tied to the field. Money cells always show two decimals.
 */
function Cell({ path, register, errors, name, label, step = "0.01", disabled, money, initial }: { path: string; register: UseFormRegister<PriceForm>; errors: FieldErrors<PriceForm>; name?: string; label?: string; step?: string; disabled: boolean; money?: MoneyStyle; initial: PriceForm }) {
  const error = (get(errors, path) as { message?: string } | undefined)?.message;
  const id = useId();
  const errorId = `${id}-error`;
  const shown = useRef(false);
  const field = register(path as FieldPath<PriceForm>, num);
  const start = get(initial, path) as number | undefined;
  return (
    <span className="block">
      {label ? (
        <label htmlFor={id} className="field-label">
          {label}
        </label>
      ) : null}
      <span className="relative block">
        {money ? <span className="pointer-events-none absolute left-2 top-1/2 -translate-y-1/2 text-xs text-ink-400" aria-hidden>{currencySymbol(money)}</span> : null}
        <input
          id={id}
          type="number"
          step={step}
          min={0}
          aria-label={name}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? errorId : undefined}
          disabled={disabled}
          // The server-rendered page shows the numbers before the form script takes over.
          defaultValue={money && start !== undefined ? moneyInputValue(start) : start}
          className={`field-input measure w-24 py-1 text-right text-sm ${money ? "pl-5" : ""} ${error ? "border-brick-500 bg-brick-50" : ""}`}
          {...field}
          ref={(el) => {
            field.ref(el);
            // The form library writes the bare number (4.5); a price reads 4.50. Once, so typing is left alone.
            if (el && money && !shown.current && Number.isFinite(el.valueAsNumber)) el.value = moneyInputValue(el.valueAsNumber);
            if (el) shown.current = true;
          }}
          onBlur={(e) => {
            if (money && Number.isFinite(e.currentTarget.valueAsNumber)) e.currentTarget.value = moneyInputValue(e.currentTarget.valueAsNumber);
            return field.onBlur(e);
          }}
        />
      </span>
      {/* The reason in words under its cell: a hover title alone reaches neither touch nor keyboard users. */}
      {error ? (
        <span id={errorId} className="field-error block w-24 text-xs">
          {error}
        </span>
      ) : null}
    </span>
  );
}

export function PriceMatrixEditor({ shopSlug, matrix, canEdit, locale }: { shopSlug: string; matrix: PriceMatrix; canEdit: boolean; locale?: string }) {
  const router = useRouter();
  const hydrated = useHydrated();
  const [notice, setNotice] = useState<{ tone: "ok" | "error"; text: string }>();
  const [screenLocation, setScreenLocation] = useState(0);
  const [initial] = useState(() => toPriceForm(matrix));
  const form = useForm<PriceForm, unknown, PriceMatrix>({ resolver: zodResolver(priceFormSchema), defaultValues: initial });
  const { register, control, handleSubmit, setValue, getValues, setError, formState } = form;
  const { errors, isSubmitting, isDirty } = formState;
  const values = useWatch({ control }) as PriceForm;
  const disabled = !canEdit;
  const moneyStyle: MoneyStyle = { currency: values.currency ?? matrix.currency, locale };

  const onSubmit = handleSubmit(
    async (cleaned) => {
      setNotice(undefined);
      const result = await savePricesAction({ shopSlug, matrix: cleaned });
      if (!result.ok) {
        for (const [path, messages] of Object.entries(result.fieldErrors ?? {})) if (messages?.[0]) setError(path as FieldPath<PriceForm>, { message: messages[0] });
        setNotice({ tone: "error", text: result.error });
        return;
      }
      form.reset(toPriceForm(cleaned));
      setNotice({ tone: "ok", text: "Prices saved. New quotes use them; quotes already sent keep their numbers." });
      router.refresh();
    },
    () => setNotice({ tone: "error", text: "Some prices need fixing; the reason is under each highlighted cell." }),
  );

  const update = <K extends keyof PriceForm>(key: K, next: PriceForm[K]) => setValue(key, next as never, { shouldDirty: true });

  // Structural edits on a breaks × locations table.
  const addBreak = (m: Tiered | "screenPrint") => {
    const t = getValues(m) as PriceForm["dtg"] | PriceForm["screenPrint"];
    const last = t.quantityBreaks.at(-1) ?? 0;
    const rows = t.pricesCents as unknown[];
    update(m, { ...t, quantityBreaks: [...t.quantityBreaks, last * 2 || 1], pricesCents: [...rows, structuredClone(rows.at(-1))] } as never);
  };
  const removeBreak = (m: Tiered | "screenPrint", i: number) => {
    const t = getValues(m) as PriceForm["dtg"];
    if (t.quantityBreaks.length <= 1) return;
    update(m, { ...t, quantityBreaks: t.quantityBreaks.filter((_, j) => j !== i), pricesCents: t.pricesCents.filter((_, j) => j !== i) } as never);
  };
  const addLocation = (m: Tiered | "screenPrint") => {
    const t = getValues(m) as PriceForm["dtg"];
    update(m, { ...t, pricesCents: (t.pricesCents as unknown[][]).map((row) => [...row, structuredClone(row.at(-1))]) } as never);
  };
  const removeLocation = (m: Tiered | "screenPrint") => {
    const t = getValues(m) as PriceForm["dtg"];
    if ((t.pricesCents[0]?.length ?? 0) <= 1) return;
    update(m, { ...t, pricesCents: t.pricesCents.map((row) => row.slice(0, -1)) } as never);
    if (m === "screenPrint") setScreenLocation((l) => Math.min(l, (t.pricesCents[0]?.length ?? 2) - 2));
  };
  const addColour = () => {
    const t = getValues("screenPrint");
    update("screenPrint", { ...t, pricesCents: t.pricesCents.map((tab) => tab.map((row) => [...row, row.at(-1) ?? 0])) });
  };
  const removeColour = () => {
    const t = getValues("screenPrint");
    if ((t.pricesCents[0]?.[0]?.length ?? 0) <= 1) return;
    update("screenPrint", { ...t, pricesCents: t.pricesCents.map((tab) => tab.map((row) => row.slice(0, -1))) });
  };

  const breaksColumn = (m: Tiered | "screenPrint", i: number) => (
    <th scope="row" className="whitespace-nowrap py-1 pr-2 text-left font-normal">
      <span className="flex items-center gap-1">
        <Cell path={`${m}.quantityBreaks.${i}`} register={register} errors={errors} initial={initial} name={`Quantity break ${i + 1}`} step="1" disabled={disabled} />
        <span className="text-xs text-ink-500">+ pcs</span>
        {canEdit && values[m].quantityBreaks.length > 1 ? (
          <button type="button" className="text-xs text-brick-700 hover:underline" onClick={() => removeBreak(m, i)} aria-label={`Remove break ${i + 1}`}>
            ✕
          </button>
        ) : null}
      </span>
    </th>
  );

  /** Quantity breaks down the side, one priced column per location (or colour) count. */
  const priceGrid = (m: Tiered | "screenPrint", columns: number, unit: string, cellPath: (i: number, c: number) => string, cellLabel: (i: number, c: number) => string) => (
    <div className="overflow-x-auto">
      <table className="text-sm">
        <thead>
          <tr className="text-left text-xs uppercase tracking-wide text-ink-500">
            <th scope="col" className="pb-1 pr-2 font-medium">
              Quantity
            </th>
            {Array.from({ length: columns }, (_, c) => (
              <th key={c} scope="col" className="pb-1 pr-2 font-medium">
                {c + 1} {c === 0 ? unit : `${unit}s`}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {values[m].quantityBreaks.map((_, i) => (
            <tr key={i}>
              {breaksColumn(m, i)}
              {Array.from({ length: columns }, (_, c) => (
                <td key={c} className="py-1 pr-2">
                  <Cell path={cellPath(i, c)} register={register} errors={errors} initial={initial} name={cellLabel(i, c)} disabled={disabled} money={moneyStyle} />
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );

  const tierTable = (m: Tiered, title: string, lead: string) => {
    const width = values[m].pricesCents[0]?.length ?? 0;
    return (
      <section key={m} className="card space-y-3 p-5" aria-label={title}>
        <div>
          <h2 className="text-lg">{title}</h2>
          <p className="text-sm text-ink-600">{lead}</p>
        </div>
        {priceGrid(m, width, "location", (i, l) => `${m}.pricesCents.${i}.${l}`, (i, l) => `${title}, break ${i + 1}, ${l + 1} ${l === 0 ? "location" : "locations"}, per garment`)}
        {canEdit ? (
          <div className="flex flex-wrap gap-2">
            <button type="button" className="btn-quiet px-3 py-1" onClick={() => addBreak(m)}>
              + Break
            </button>
            <button type="button" className="btn-quiet px-3 py-1" onClick={() => addLocation(m)}>
              + Location
            </button>
            <button type="button" className="btn-quiet px-3 py-1" onClick={() => removeLocation(m)} disabled={width <= 1}>
              − Location
            </button>
          </div>
        ) : null}
      </section>
    );
  };

  const sp = values.screenPrint;
  const spLocations = sp.pricesCents[0]?.length ?? 0;
  const spColours = sp.pricesCents[0]?.[0]?.length ?? 0;
  const loc = Math.min(screenLocation, Math.max(0, spLocations - 1));
  const formError = (path: string) => (get(errors, path) as { message?: string } | undefined)?.message ?? (get(errors, `${path}.root`) as { message?: string } | undefined)?.message;

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6" data-hydrated={hydrated} aria-label="Price matrix">
      {!canEdit ? <Notice tone="warn">You can see the shop&apos;s prices. Only the owner can change them.</Notice> : null}

      <section className="card grid gap-4 p-5 sm:grid-cols-2 lg:grid-cols-5" aria-label="Terms">
        {(
          [
            ["depositPercent", "Deposit to start (%)", "0.01"],
            ["taxRatePercent", "Sales tax (%)", "0.001"],
            ["rushFeePercent", "Rush fee (%)", "0.01"],
          ] as const
        ).map(([path, label, step]) => (
          <div key={path}>
            <Cell label={label} path={path} register={register} errors={errors} initial={initial} step={step} disabled={disabled} />
          </div>
        ))}
        <label className="block">
          <span className="field-label">Currency</span>
          <select className="field-input w-full py-1 text-sm" disabled={disabled} {...register("currency")}>
            {SHOP_CURRENCIES.map((c) => (
              <option key={c} value={c}>
                {CURRENCY_NAMES[c]} ({c.toUpperCase()})
              </option>
            ))}
          </select>
        </label>
        <div>
            <Cell label="Blank garment, each" path="garmentCostCents.default" register={register} errors={errors} initial={initial} disabled={disabled} money={moneyStyle} />
          </div>
      </section>

      <section className="card space-y-3 p-5" aria-label="Screen print">
        <div className="flex flex-wrap items-end justify-between gap-3">
          <div>
            <h2 className="text-lg">Screen print</h2>
            <p className="text-sm text-ink-600">Price per garment by quantity and ink colours, for each number of print locations. A job is priced at its location count and its most colourful location.</p>
          </div>
          <div>
            <Cell label="Setup, per screen" path="screenPrint.setupFeePerScreenCents" register={register} errors={errors} initial={initial} disabled={disabled} money={moneyStyle} />
          </div>
        </div>
        <div className="flex flex-wrap gap-1" role="tablist" aria-label="Number of locations">
          {Array.from({ length: spLocations }, (_, l) => (
            <button key={l} type="button" role="tab" aria-selected={l === loc} className={`rounded-md px-3 py-1 text-sm ${l === loc ? "bg-ink-800 text-chalk" : "bg-paper-200 text-ink-700"}`} onClick={() => setScreenLocation(l)}>
              {l + 1} {l === 0 ? "location" : "locations"}
            </button>
          ))}
        </div>
        <div role="tabpanel">
          {priceGrid("screenPrint", spColours, "colour", (i, c) => `screenPrint.pricesCents.${i}.${loc}.${c}`, (i, c) => `Screen print, break ${i + 1}, ${loc + 1} ${loc === 0 ? "location" : "locations"}, ${c + 1} ${c === 0 ? "colour" : "colours"}, per garment`)}
        </div>
        {canEdit ? (
          <div className="flex flex-wrap gap-2">
            <button type="button" className="btn-quiet px-3 py-1" onClick={() => addBreak("screenPrint")}>
              + Break
            </button>
            <button type="button" className="btn-quiet px-3 py-1" onClick={addColour}>
              + Colour
            </button>
            <button type="button" className="btn-quiet px-3 py-1" onClick={removeColour} disabled={spColours <= 1}>
              − Colour
            </button>
            <button type="button" className="btn-quiet px-3 py-1" onClick={() => addLocation("screenPrint")}>
              + Location
            </button>
            <button type="button" className="btn-quiet px-3 py-1" onClick={() => removeLocation("screenPrint")} disabled={spLocations <= 1}>
              − Location
            </button>
          </div>
        ) : null}
        {formError("screenPrint.quantityBreaks") ? <p className="field-error">{formError("screenPrint.quantityBreaks")}</p> : null}
      </section>

      <section className="card space-y-3 p-5" aria-label="DTF transfers">
        <h2 className="text-lg">DTF transfers</h2>
        <fieldset className="flex flex-wrap gap-4 text-sm" disabled={disabled}>
          <legend className="field-label">Charge the transfers</legend>
          <label className="flex items-center gap-2">
            <input type="radio" value="area" className="accent-patina-600" {...register("dtf.mode")} /> by transfer area
          </label>
          <label className="flex items-center gap-2">
            <input type="radio" value="length" className="accent-patina-600" {...register("dtf.mode")} /> by gang sheet length
          </label>
        </fieldset>
        <div className="flex flex-wrap gap-4">
          <div>
            <Cell label="Cents per in²" path="dtf.centsPerSquareInch" register={register} errors={errors} initial={initial} step="0.01" disabled={disabled} />
          </div>
          <div>
            <Cell label="Per inch of sheet" path="dtf.centsPerInchOfSheet" register={register} errors={errors} initial={initial} disabled={disabled} money={moneyStyle} />
          </div>
          <div>
            <Cell label="Roll width (in)" path="dtf.rollWidthIn" register={register} errors={errors} initial={initial} step="0.25" disabled={disabled} />
          </div>
        </div>
      </section>
      {tierTable("dtf", "DTF pressing", "Pressing per garment, on top of the transfers.")}
      {tierTable("dtg", "DTG", "Printing per garment.")}
      {tierTable("htv", "HTV", "Cutting, weeding and pressing per garment.")}
      {tierTable("sublimation", "Sublimation", "Printing and pressing per garment.")}

      <section className="card space-y-3 p-5" aria-label="Size upcharges">
        <div>
          <h2 className="text-lg">Size upcharges</h2>
          <p className="text-sm text-ink-600">Each applies from its size up, until the next one takes over.</p>
        </div>
        <ul className="space-y-2">
          {values.sizeUpcharges.map((u, i) => (
            <li key={i} className="flex items-center gap-2 text-sm">
              <span>From</span>
              <select className="field-input w-28 py-1" disabled={disabled} aria-label={`Upcharge ${i + 1} starts at size`} {...register(`sizeUpcharges.${i}.fromSize`)}>
                {JOB_SIZE_ORDER.map((s) => (
                  <option key={s}>{s}</option>
                ))}
              </select>
              <Cell path={`sizeUpcharges.${i}.cents`} register={register} errors={errors} initial={initial} name={`Upcharge ${i + 1}, per garment`} disabled={disabled} money={moneyStyle} />
              {canEdit ? (
                <button type="button" className="text-xs text-brick-700 hover:underline" onClick={() => update("sizeUpcharges", getValues("sizeUpcharges").filter((_, j) => j !== i))}>
                  Remove
                </button>
              ) : null}
            </li>
          ))}
        </ul>
        {formError("sizeUpcharges") ? <p className="field-error">{formError("sizeUpcharges")}</p> : null}
        {canEdit ? (
          <button type="button" className="btn-quiet px-3 py-1" onClick={() => update("sizeUpcharges", [...getValues("sizeUpcharges"), { fromSize: "2XL", cents: 0 }])}>
            + Upcharge
          </button>
        ) : null}
      </section>

      {notice ? <Notice tone={notice.tone}>{notice.text}</Notice> : null}
      {canEdit ? (
        <div className="sticky bottom-0 flex items-center gap-3 border-t border-paper-300 bg-paper/95 py-3 backdrop-blur">
          <button type="submit" className="btn-primary" disabled={isSubmitting}>
            {isSubmitting ? "Saving…" : "Save prices"}
          </button>
          {isDirty ? <span className="text-sm text-ink-500">Unsaved changes</span> : null}
        </div>
      ) : null}
    </form>
  );
}
