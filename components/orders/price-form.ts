/**
 * The price matrix as the editor shows it: money in dollars (two decimals), everything else as
 * stored. `priceFormSchema` turns the form back into a matrix in cents and checks its shape.
 */
import { z } from "zod";
import { priceMatrixSchema, type PriceMatrix } from "@/lib/pricing";

const dollars = (c: number) => c / 100;
const cents = (d: number) => Math.round(d * 100);

type Grid2 = number[][];
type Grid3 = number[][][];
const map2 = (g: Grid2, f: (n: number) => number) => g.map((r) => r.map(f));
const map3 = (g: Grid3, f: (n: number) => number) => g.map((t) => map2(t, f));

/** Same shape as PriceMatrix; the money fields hold dollars. */
export type PriceForm = PriceMatrix;

export function toPriceForm(m: PriceMatrix): PriceForm {
  return {
    ...m,
    screenPrint: { ...m.screenPrint, pricesCents: map3(m.screenPrint.pricesCents, dollars), setupFeePerScreenCents: dollars(m.screenPrint.setupFeePerScreenCents) },
    dtf: { ...m.dtf, pricesCents: map2(m.dtf.pricesCents, dollars), centsPerInchOfSheet: dollars(m.dtf.centsPerInchOfSheet) },
    dtg: { ...m.dtg, pricesCents: map2(m.dtg.pricesCents, dollars) },
    htv: { ...m.htv, pricesCents: map2(m.htv.pricesCents, dollars) },
    sublimation: { ...m.sublimation, pricesCents: map2(m.sublimation.pricesCents, dollars) },
    sizeUpcharges: m.sizeUpcharges.map((u) => ({ ...u, cents: dollars(u.cents) })),
    garmentCostCents: Object.fromEntries(Object.entries(m.garmentCostCents).map(([k, v]) => [k, dollars(v)])) as PriceMatrix["garmentCostCents"],
  };
}

export function fromPriceForm(f: PriceForm): PriceMatrix {
  return {
    ...f,
    screenPrint: { ...f.screenPrint, pricesCents: map3(f.screenPrint.pricesCents, cents), setupFeePerScreenCents: cents(f.screenPrint.setupFeePerScreenCents) },
    dtf: { ...f.dtf, pricesCents: map2(f.dtf.pricesCents, cents), centsPerInchOfSheet: cents(f.dtf.centsPerInchOfSheet) },
    dtg: { ...f.dtg, pricesCents: map2(f.dtg.pricesCents, cents) },
    htv: { ...f.htv, pricesCents: map2(f.htv.pricesCents, cents) },
    sublimation: { ...f.sublimation, pricesCents: map2(f.sublimation.pricesCents, cents) },
    sizeUpcharges: f.sizeUpcharges.map((u) => ({ ...u, cents: cents(u.cents) })),
    garmentCostCents: Object.fromEntries(Object.entries(f.garmentCostCents).map(([k, v]) => [k, cents(v)])) as PriceMatrix["garmentCostCents"],
  };
}

const finite = (v: unknown) => typeof v === "number" && Number.isFinite(v);

/** Blank cells (NaN from an emptied number field) are named before the shape check runs. */
function findBlankCell(value: unknown, path: Array<string | number> = []): Array<string | number> | null {
  if (typeof value === "number") return finite(value) ? null : path;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const hit = findBlankCell(value[i], [...path, i]);
      if (hit) return hit;
    }
    return null;
  }
  if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) {
      const hit = findBlankCell(v, [...path, k]);
      if (hit) return hit;
    }
  }
  return null;
}

export const priceFormSchema = z
  .custom<PriceForm>((v) => typeof v === "object" && v !== null)
  .superRefine((v, ctx) => {
    const blank = findBlankCell(v);
    if (blank) ctx.addIssue({ code: "custom", path: blank, message: "Enter a number" });
  })
  .transform((v) => fromPriceForm(v))
  .pipe(priceMatrixSchema);
