"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef } from "@tanstack/react-table";
import { unstable_rethrow } from "next/navigation";
import { useId, useMemo, useState, type ReactNode } from "react";
import {
  useController,
  useFieldArray,
  useForm,
  useWatch,
  type Control,
  type FieldArrayWithId,
  type FieldErrors,
  type Path,
  type Resolver,
  type UseFormRegister,
} from "react-hook-form";
import {
  blankFormSchemaFor,
  MAX_COLOURS,
  MAX_SIZE_ROWS,
  type BlankFormValues,
} from "@/components/blanks/blank-form";
import { columnsFor, middleSizeIndex, SIZE_GROUP_LABELS } from "@/components/blanks/chart-columns";
import { PreviewPanel } from "@/components/blanks/PreviewPanel";
import { UnitToggle } from "@/components/blanks/UnitToggle";
import { CATEGORY_INFO, SIZE_GROUPS, type GarmentCategory, type GarmentMeasurements } from "@/lib/garments/types";
import { sizeRowSchemaFor } from "@/lib/garments/schemas";
import { CM_PER_INCH, parseLength, type LengthUnit } from "@/lib/units";
import { updateBlankAction } from "../actions";
import { formatShopTime, type ShopClock } from "@/lib/dates";

type SizeField = FieldArrayWithId<BlankFormValues, "sizes", "key">;
type Notice = { tone: "ok" | "error"; text: string };

export interface BlankEditorProps {
  /** The shop's locale and time zone, for "Saved at …". */
  clock?: ShopClock;
  shopSlug: string;
  blankId: string;
  category: GarmentCategory;
  initial: BlankFormValues;
  /** Shown above the details, beside the outline. */
  intro?: ReactNode;
}

export function BlankEditor({ shopSlug, blankId, category, initial, intro, clock = {} }: BlankEditorProps) {
  const formId = useId();
  const schema = useMemo(() => blankFormSchemaFor(category), [category]);
  const measurementsSchema = useMemo(() => sizeRowSchemaFor(category).shape.measurements, [category]);
  const [unit, setUnit] = useState<LengthUnit>("in");
  const [selected, setSelected] = useState(() => middleSizeIndex(initial.sizes));
  const [notice, setNotice] = useState<Notice>();

  const {
    control,
    register,
    handleSubmit,
    reset,
    setError,
    setFocus,
    formState: { errors, isSubmitting, isDirty, submitCount },
  } = useForm<BlankFormValues>({
    resolver: zodResolver(schema) as unknown as Resolver<BlankFormValues>,
    defaultValues: initial,
    mode: "onTouched",
  });
  const sizeRows = useFieldArray({ control, name: "sizes", keyName: "key" });
  const colourRows = useFieldArray({ control, name: "colours", keyName: "key" });
  const liveSizes = useWatch({ control, name: "sizes" });
  const liveColours = useWatch({ control, name: "colours" });

  const problems = collectProblems(errors, liveSizes);
  const selectedIndex = Math.min(selected, Math.max(liveSizes.length - 1, 0));
  const selectedRow = liveSizes[selectedIndex];
  const parsedSelected = selectedRow ? measurementsSchema.safeParse(selectedRow.measurements) : undefined;
  const drawable = liveSizes.flatMap((row) => {
    const parsed = measurementsSchema.safeParse(row.measurements);
    return parsed.success ? [parsed.data as GarmentMeasurements] : [];
  });

  const onSubmit = handleSubmit(
    async (values) => {
      setNotice(undefined);
      try {
        const result = await updateBlankAction({ shopSlug, blankId, values });
        if (!result.ok) {
          for (const [path, messages] of Object.entries(result.fieldErrors ?? {})) {
            const message = messages?.[0];
            if (message)
              setError((path === "root" ? "root.server" : path) as Path<BlankFormValues>, {
                type: "server",
                message,
              });
          }
          setNotice({ tone: "error", text: result.error });
          return;
        }
        reset(values);
        const at = formatShopTime(new Date(result.data.updatedAt), clock);
        setNotice({ tone: "ok", text: `Saved at ${at}.` });
      } catch (err) {
        unstable_rethrow(err);
        setNotice({
          tone: "error",
          text: "Could not reach Chalkline, so nothing was saved. Your changes are still here; try again.",
        });
      }
    },
    () => setNotice({ tone: "error", text: "Not saved. Fix the values marked in red, then save again." }),
  );

  const addSize = () => {
    const last = liveSizes[liveSizes.length - 1] ?? initial.sizes[initial.sizes.length - 1];
    const index = sizeRows.fields.length;
    sizeRows.append(
      { size: "", group: last?.group ?? "adult", measurements: { ...(last?.measurements ?? {}) } },
      { focusName: `sizes.${index}.size` },
    );
    setSelected(index);
  };

  const removeSize = (index: number) => {
    sizeRows.remove(index);
    setSelected((s) => (s > index ? s - 1 : Math.min(s, Math.max(sizeRows.fields.length - 2, 0))));
  };

  const tableColumns = useChartColumns({ category, control, register });
  const meta: ChartMeta = { unit, rowCount: sizeRows.fields.length, onRemove: removeSize };
  // The form library's handles are stable; the table re-renders whenever the field array does.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable<SizeField>({
    data: sizeRows.fields,
    columns: tableColumns,
    meta,
    getCoreRowModel: getCoreRowModel(),
    getRowId: (row) => row.key,
  });

  return (
    <form
      id={formId}
      onSubmit={onSubmit}
      noValidate
      aria-label="Edit blank"
      className="grid grid-cols-[minmax(0,1fr)] gap-6 lg:grid-cols-[minmax(0,1fr)_20rem]"
    >
      <div className="min-w-0 space-y-6">
        {intro}
        <section className="card space-y-4 p-5" aria-labelledby={`${formId}-details`}>
          <h2 id={`${formId}-details`} className="text-base">
            Details
          </h2>
          <div>
            <label htmlFor={`${formId}-name`} className="field-label">
              Name
            </label>
            <input
              id={`${formId}-name`}
              className="field-input"
              aria-invalid={errors.name ? true : undefined}
              aria-describedby={errors.name ? `${formId}-name-error` : undefined}
              {...register("name")}
            />
            {errors.name ? (
              <p id={`${formId}-name-error`} className="field-error">
                {errors.name.message}
              </p>
            ) : null}
          </div>
          <div>
            <label htmlFor={`${formId}-description`} className="field-label">
              Description <span className="font-normal text-ink-500">(optional)</span>
            </label>
            <textarea
              id={`${formId}-description`}
              rows={2}
              className="field-input"
              aria-invalid={errors.description ? true : undefined}
              {...register("description")}
            />
            {errors.description ? <p className="field-error">{errors.description.message}</p> : null}
          </div>
        </section>

        <section className="card p-5" aria-labelledby={`${formId}-colours`}>
          <div className="flex items-center justify-between gap-3">
            <h2 id={`${formId}-colours`} className="text-base">
              Colours
            </h2>
            <button
              type="button"
              className="btn-quiet px-3 py-1.5"
              disabled={colourRows.fields.length >= MAX_COLOURS}
              onClick={() =>
                colourRows.append(
                  { name: "", hex: "#FFFFFF" },
                  { focusName: `colours.${colourRows.fields.length}.name` },
                )
              }
            >
              Add a colour
            </button>
          </div>
          <ul className="mt-3 space-y-2">
            {colourRows.fields.map((field, i) => (
              <ColourRow
                key={field.key}
                control={control}
                register={register}
                index={i}
                name={liveColours[i]?.name ?? ""}
                nameError={errors.colours?.[i]?.name?.message}
                onRemove={() => colourRows.remove(i)}
                canRemove={colourRows.fields.length > 1}
              />
            ))}
          </ul>
          {errors.colours?.message || errors.colours?.root?.message ? (
            <p className="field-error">{errors.colours?.message ?? errors.colours?.root?.message}</p>
          ) : null}
        </section>
      </div>

      <PreviewPanel
        category={category}
        sizes={liveSizes.map((r) => r.size)}
        selected={selectedIndex}
        onSelect={setSelected}
        measurements={parsedSelected?.success ? (parsedSelected.data as GarmentMeasurements) : null}
        allMeasurements={drawable}
        colours={liveColours}
        unit={unit}
        invalidMessage={`Fix the numbers for ${selectedRow?.size.trim() || "this size"} to see its outline.`}
      />

      <section className="card min-w-0 lg:col-span-2" aria-labelledby={`${formId}-chart`}>
        <div className="flex flex-wrap items-center justify-between gap-3 border-b border-paper-200 px-5 py-3">
          <div>
            <h2 id={`${formId}-chart`} className="text-base">
              Size chart
            </h2>
            <p className="text-xs text-ink-500">
              Flat measurements in{" "}
              {unit === "in"
                ? "inches. 20.5, 20 1/2 and 52 cm all work"
                : "centimetres, kept in inches. 52, 52.1 or 20.5 in all work"}
              .
            </p>
          </div>
          <UnitToggle unit={unit} onChange={setUnit} label="Units for the size chart" />
        </div>
        <div className="relative overflow-x-auto">
          <table className="w-full min-w-max border-collapse text-sm">
            <thead>
              {table.getHeaderGroups().map((group) => (
                <tr key={group.id} className="bg-paper-50 text-left align-bottom">
                  {group.headers.map((header) => (
                    <th
                      key={header.id}
                      scope="col"
                      className="px-2 py-2 font-medium text-ink-700 first:sticky first:left-0 first:z-[1] first:bg-paper-50 first:pl-5 last:pr-5 max-sm:first:pl-3"
                    >
                      {flexRender(header.column.columnDef.header, header.getContext())}
                    </th>
                  ))}
                </tr>
              ))}
            </thead>
            <tbody className="divide-y divide-paper-200">
              {table.getRowModel().rows.map((row) => (
                <tr
                  key={row.id}
                  className={`align-top ${row.index === selectedIndex ? "bg-patina-100/50" : ""}`}
                  onFocusCapture={() => setSelected(row.index)}
                >
                  {row.getVisibleCells().map((cell) => (
                    <td
                      key={cell.id}
                      className="px-2 py-2 first:sticky first:left-0 first:z-[1] first:bg-chalk first:pl-5 last:pr-5 max-sm:first:pl-3"
                    >
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <div className="flex flex-wrap items-center justify-between gap-3 border-t border-paper-200 px-5 py-3">
          <button
            type="button"
            className="btn-quiet px-3 py-1.5"
            onClick={addSize}
            disabled={sizeRows.fields.length >= MAX_SIZE_ROWS}
          >
            Add a size
          </button>
          {errors.sizes?.message || errors.sizes?.root?.message ? (
            <p className="field-error mt-0">{errors.sizes?.message ?? errors.sizes?.root?.message}</p>
          ) : null}
        </div>
      </section>

      <div className="card sticky bottom-3 z-10 space-y-3 p-4 shadow-lift lg:col-span-2">
        {problems.length > 0 && (submitCount > 0 || notice?.tone === "error") ? (
          <div role="alert" className="rounded-lg bg-brick-100 px-3 py-2 text-sm text-brick-800">
            <p className="font-medium">
              {notice?.tone === "error"
                ? notice.text
                : "Not saved. Fix the values marked in red, then save again."}
            </p>
            <ul className="mt-1 max-h-32 list-disc space-y-0.5 overflow-y-auto pl-5">
              {problems.map((p) => (
                <li key={p.path}>
                  <button
                    type="button"
                    className="text-left underline decoration-brick-300 underline-offset-2 hover:decoration-brick-700"
                    onClick={() => focusField(setFocus, p.path)}
                  >
                    {p.where}: {p.message}
                  </button>
                </li>
              ))}
            </ul>
          </div>
        ) : notice && !(notice.tone === "ok" && isDirty) ? (
          <p
            role={notice.tone === "error" ? "alert" : "status"}
            className={`rounded-lg px-3 py-2 text-sm ${notice.tone === "ok" ? "bg-patina-100 text-patina-800" : "bg-brick-100 text-brick-800"}`}
          >
            {notice.text}
          </p>
        ) : null}
        <div className="flex items-center justify-between gap-3">
          <p
            className={`text-sm ${isDirty ? "font-medium text-ochre-800" : "text-ink-600"}`}
            aria-live="polite"
          >
            {isDirty ? "Unsaved changes" : "All changes saved"}
          </p>
          <div className="flex shrink-0 gap-2">
            <button
              type="button"
              className="btn-quiet"
              disabled={!isDirty || isSubmitting}
              onClick={() => {
                reset();
                setNotice(undefined);
              }}
            >
              Discard
            </button>
            <button type="submit" className="btn-primary" disabled={isSubmitting}>
              {isSubmitting ? "Saving…" : "Save blank"}
            </button>
          </div>
        </div>
      </div>
    </form>
  );
}

// ---------------------------------------------------------------------------
// Table columns

/** What changes between renders reaches the cells through table meta, so the columns (and the inputs) stay mounted. */
interface ChartMeta {
  unit: LengthUnit;
  rowCount: number;
  onRemove: (index: number) => void;
}

function chartMeta(meta: unknown): ChartMeta {
  return meta as ChartMeta;
}

function useChartColumns({
  category,
  control,
  register,
}: {
  category: GarmentCategory;
  control: Control<BlankFormValues>;
  register: UseFormRegister<BlankFormValues>;
}): ColumnDef<SizeField>[] {
  return useMemo(() => {
    const columns: ColumnDef<SizeField>[] = [
      {
        id: "size",
        header: () => "Size",
        cell: ({ row }) => <SizeNameCell control={control} index={row.index} />,
      },
    ];
    if (!CATEGORY_INFO[category].isTote) {
      columns.push({
        id: "group",
        header: () => "Group",
        cell: ({ row }) => (
          <select
            aria-label={`Row ${row.index + 1} size group`}
            className="field-input w-24 px-2 py-1.5 text-sm"
            {...register(`sizes.${row.index}.group`)}
          >
            {SIZE_GROUPS.map((g) => (
              <option key={g} value={g}>
                {SIZE_GROUP_LABELS[g]}
              </option>
            ))}
          </select>
        ),
      });
    }
    for (const c of columnsFor(category)) {
      columns.push({
        id: c.key,
        header: ({ table }) => (
          <>
            <span className="block w-20 leading-tight">
              {c.label}{" "}
              <span className="font-normal text-ink-500">({chartMeta(table.options.meta).unit})</span>
            </span>
            {c.hint ? (
              <span className="mt-0.5 block w-20 text-xs font-normal leading-tight text-ink-500">
                {c.hint}
              </span>
            ) : null}
          </>
        ),
        cell: ({ row, table }) => (
          <MeasureCell
            control={control}
            index={row.index}
            field={c.key}
            label={c.label}
            unit={chartMeta(table.options.meta).unit}
          />
        ),
      });
    }
    columns.push({
      id: "actions",
      header: () => <span className="sr-only">Remove</span>,
      cell: ({ row, table }) => {
        const meta = chartMeta(table.options.meta);
        return (
          <RemoveRowButton
            control={control}
            index={row.index}
            onRemove={meta.onRemove}
            disabled={meta.rowCount <= 1}
          />
        );
      },
    });
    return columns;
  }, [category, control, register]);
}

function useRowName(control: Control<BlankFormValues>, index: number): string {
  const size = useWatch({ control, name: `sizes.${index}.size` });
  return size?.trim() || `Row ${index + 1}`;
}

function SizeNameCell({ control, index }: { control: Control<BlankFormValues>; index: number }) {
  const { field, fieldState } = useController({ control, name: `sizes.${index}.size` });
  const errorId = `size-${index}-name-error`;
  return (
    <div className="w-20">
      <input
        {...field}
        value={field.value ?? ""}
        aria-label={`Row ${index + 1} size name`}
        aria-invalid={fieldState.error ? true : undefined}
        aria-describedby={fieldState.error ? errorId : undefined}
        className={`field-input px-2 py-1.5 text-sm font-semibold ${fieldState.error ? "border-brick-600" : ""}`}
        autoComplete="off"
      />
      {fieldState.error ? (
        <p id={errorId} className="mt-1 text-xs text-brick-700">
          {fieldState.error.message}
        </p>
      ) : null}
    </div>
  );
}

/** Rounding for a value typed in centimetres and kept in inches: far finer than a chart is quoted. */
const INCH_DECIMALS = 4;

function toShown(inches: unknown, unit: LengthUnit): string {
  if (typeof inches !== "number" || !Number.isFinite(inches)) return "";
  return unit === "cm"
    ? String(Number((inches * CM_PER_INCH).toFixed(2)))
    : String(Number(inches.toFixed(INCH_DECIMALS)));
}

/**
 * Reads what was typed the way charts are written: 20.5, 20 1/2, 20,5 or 52 cm. Negative numbers pass
 * through so the schema can say what is wrong with them; anything unreadable becomes NaN.
 */
function toInches(text: string, unit: LengthUnit): number {
  if (text.trim() === "") return Number.NaN;
  const parsed = parseLength(text, unit, { allowNegative: true });
  if (!parsed.ok) return Number.NaN;
  return Number(parsed.inches.toFixed(INCH_DECIMALS));
}

function MeasureCell({
  control,
  index,
  field: key,
  label,
  unit,
}: {
  control: Control<BlankFormValues>;
  index: number;
  field: string;
  label: string;
  unit: LengthUnit;
}) {
  const rowName = useRowName(control, index);
  const {
    field: { ref, name, value, onChange, onBlur },
    fieldState,
  } = useController({ control, name: `sizes.${index}.measurements.${key}` });
  // While the cell has focus it shows exactly what was typed; otherwise the stored inches in the chosen unit.
  const [draft, setDraft] = useState<string | null>(null);
  const shown = draft ?? toShown(value, unit);
  const errorId = `size-${index}-${key}-error`;
  return (
    <div className="w-20">
      <input
        ref={ref}
        name={name}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        spellCheck={false}
        value={shown}
        aria-label={`${rowName} ${label.toLowerCase()}`}
        aria-invalid={fieldState.error ? true : undefined}
        aria-describedby={fieldState.error ? errorId : undefined}
        onFocus={() => setDraft(shown)}
        onChange={(e) => {
          setDraft(e.target.value);
          onChange(toInches(e.target.value, unit));
        }}
        onBlur={() => {
          setDraft(null);
          onBlur();
        }}
        className={`field-input measure px-2 py-1.5 text-right text-sm ${fieldState.error ? "border-brick-600 bg-brick-100/40" : ""}`}
      />
      {fieldState.error ? (
        <p id={errorId} className="mt-1 text-xs leading-snug text-brick-700">
          {fieldState.error.message}
        </p>
      ) : null}
    </div>
  );
}

function RemoveRowButton({
  control,
  index,
  onRemove,
  disabled,
}: {
  control: Control<BlankFormValues>;
  index: number;
  onRemove: (index: number) => void;
  disabled: boolean;
}) {
  const rowName = useRowName(control, index);
  return (
    <button
      type="button"
      className="flex h-9 w-9 items-center justify-center rounded-md text-ink-500 hover:bg-brick-100 hover:text-brick-800 disabled:cursor-not-allowed disabled:opacity-40"
      onClick={() => onRemove(index)}
      disabled={disabled}
      aria-label={`Remove size ${rowName}`}
      title={disabled ? "A chart needs at least one size" : `Remove ${rowName}`}
    >
      <svg viewBox="0 0 16 16" className="h-4 w-4" aria-hidden="true">
        <path d="M4 4 L12 12 M12 4 L4 12" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
      </svg>
    </button>
  );
}

function ColourRow({
  control,
  register,
  index,
  name: colourName,
  nameError,
  onRemove,
  canRemove,
}: {
  control: Control<BlankFormValues>;
  register: UseFormRegister<BlankFormValues>;
  index: number;
  name: string;
  nameError?: string;
  onRemove: () => void;
  canRemove: boolean;
}) {
  const {
    field: { ref, name, value: raw, onChange, onBlur },
    fieldState,
  } = useController({ control, name: `colours.${index}.hex` });
  const value = typeof raw === "string" ? raw : "";
  const valid = /^#[0-9a-f]{6}$/i.test(value.trim());
  const label = `Colour ${index + 1}`;
  return (
    <li className="grid grid-cols-[auto_minmax(0,1fr)_5.75rem_auto] items-start gap-2 sm:grid-cols-[auto_minmax(0,1fr)_6.5rem_auto]">
      <input
        type="color"
        aria-label={`Pick ${label.toLowerCase()}`}
        value={valid ? value.trim().toLowerCase() : "#ffffff"}
        onChange={(e) => onChange(e.target.value.toUpperCase())}
        onBlur={onBlur}
        className="h-[2.625rem] w-11 cursor-pointer rounded-lg border border-ink-200 bg-white p-1"
      />
      <div className="min-w-0">
        <input
          aria-label={`${label} name`}
          placeholder="Colour name"
          className="field-input px-2.5 text-sm sm:px-3 sm:text-base"
          aria-invalid={nameError ? true : undefined}
          {...register(`colours.${index}.name`)}
        />
        {nameError ? <p className="field-error text-xs">{nameError}</p> : null}
      </div>
      <div className="min-w-0">
        <input
          ref={ref}
          name={name}
          value={value}
          onChange={onChange}
          onBlur={onBlur}
          aria-label={`${label} hex`}
          aria-invalid={fieldState.error ? true : undefined}
          spellCheck={false}
          autoComplete="off"
          className="field-input measure px-2 text-sm uppercase sm:text-base"
        />
        {fieldState.error ? <p className="field-error text-xs">{fieldState.error.message}</p> : null}
      </div>
      <button
        type="button"
        className="flex h-[2.625rem] w-9 items-center justify-center rounded-md text-ink-500 hover:bg-brick-100 hover:text-brick-800 disabled:cursor-not-allowed disabled:opacity-40"
        onClick={onRemove}
        disabled={!canRemove}
        aria-label={`Remove ${colourName.trim() || label.toLowerCase()}`}
        title={
          canRemove
            ? `Remove ${colourName.trim() || label.toLowerCase()}`
            : "A blank needs at least one colour"
        }
      >
        <svg viewBox="0 0 16 16" className="h-4 w-4" aria-hidden="true">
          <path d="M4 4 L12 12 M12 4 L4 12" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
        </svg>
      </button>
    </li>
  );
}

// ---------------------------------------------------------------------------
// Error summary

type Problem = { path: string; where: string; message: string };

const FIELD_WORDS: Record<string, string> = { name: "Name", description: "Description" };

function collectProblems(errors: FieldErrors<BlankFormValues>, sizes: BlankFormValues["sizes"]): Problem[] {
  const out: Problem[] = [];
  const walk = (node: unknown, path: string[]) => {
    if (!node || typeof node !== "object") return;
    const n = node as Record<string, unknown>;
    if (typeof n.message === "string" && typeof n.type === "string") {
      out.push({ path: path.join("."), where: describePath(path, sizes), message: n.message });
    }
    for (const [k, v] of Object.entries(n)) {
      if (k === "ref" || k === "message" || k === "type" || k === "types") continue;
      walk(v, k === "root" ? path : [...path, k]);
    }
  };
  walk(errors, []);
  return out;
}

function describePath(path: string[], sizes: BlankFormValues["sizes"]): string {
  const [head, index] = path;
  if (head === "sizes") {
    if (index === undefined || !/^\d+$/.test(index)) return "Size chart";
    return `Size ${sizes[Number(index)]?.size.trim() || `row ${Number(index) + 1}`}`;
  }
  if (head === "colours")
    return index !== undefined && /^\d+$/.test(index) ? `Colour ${Number(index) + 1}` : "Colours";
  return FIELD_WORDS[head ?? ""] ?? "Form";
}

function focusField(setFocus: (name: Path<BlankFormValues>) => void, path: string) {
  try {
    setFocus(path as Path<BlankFormValues>);
  } catch {
    // Array-level messages have no single input to focus.
  }
}
