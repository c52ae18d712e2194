/**
 * Print quality of raster art at its placed size. Effective PPI = ink pixels ÷ placed inches.
 * Thresholds: common practice, no published source — 300 ppi is the usual target for garment
 * transfers and direct prints; below it softness becomes visible; under 150 ppi it is poor.
 */
import type { DecorationMethod } from "@/lib/jobs";

export type QualityGrade = "vector" | "ideal" | "visible" | "poor";

export type QualityThresholds = { ideal: number; poor: number };

/** Per decoration method. Same numbers today; kept per method so a shop's practice can differ. */
export const QUALITY_THRESHOLDS: Record<DecorationMethod, QualityThresholds> = {
  "screen-print": { ideal: 300, poor: 150 },
  dtf: { ideal: 300, poor: 150 },
  dtg: { ideal: 300, poor: 150 },
  htv: { ideal: 300, poor: 150 },
  sublimation: { ideal: 300, poor: 150 },
};

/** Rounding slack so a file made for exactly 300 ppi does not grade as 299.99 (our own tolerance). */
const PPI_SLACK = 0.5;

export function effectivePpi(args: { inkWidthPx: number; inkHeightPx: number; widthIn: number; heightIn: number }): number {
  if (!(args.widthIn > 0) || !(args.heightIn > 0)) return 0;
  return Math.min(args.inkWidthPx / args.widthIn, args.inkHeightPx / args.heightIn);
}

export function gradePpi(ppi: number, method: DecorationMethod): Exclude<QualityGrade, "vector"> {
  const t = QUALITY_THRESHOLDS[method];
  if (ppi + PPI_SLACK >= t.ideal) return "ideal";
  if (ppi + PPI_SLACK >= t.poor) return "visible";
  return "poor";
}

export type QualityReport = { grade: QualityGrade; ppi: number | null; message: string; largestIdealWidthIn: number | null; largestIdealHeightIn: number | null };

export function assessQuality(args: {
  isVector: boolean;
  inkWidthPx: number;
  inkHeightPx: number;
  widthIn: number;
  heightIn: number;
  method: DecorationMethod;
}): QualityReport {
  if (args.isVector) {
    return { grade: "vector", ppi: null, message: "Vector art: prints sharp at any size.", largestIdealWidthIn: null, largestIdealHeightIn: null };
  }
  const t = QUALITY_THRESHOLDS[args.method];
  const ppi = effectivePpi(args);
  const grade = gradePpi(ppi, args.method);
  const largestIdealWidthIn = args.inkWidthPx / t.ideal;
  const largestIdealHeightIn = args.inkHeightPx / t.ideal;
  const rounded = Math.round(ppi);
  const message =
    grade === "ideal"
      ? `${rounded} ppi at this size: sharp.`
      : grade === "visible"
        ? `${rounded} ppi at this size: softness may show up close. ${t.ideal} ppi needs ${largestIdealWidthIn.toFixed(2)} in wide or less.`
        : `${rounded} ppi at this size: it will print blurry or blocky. Ask for a larger file, or print at most ${largestIdealWidthIn.toFixed(2)} in wide.`;
  return { grade, ppi, message, largestIdealWidthIn, largestIdealHeightIn };
}

export const GRADE_LABELS: Record<QualityGrade, string> = {
  vector: "Vector",
  ideal: "Sharp",
  visible: "Soft",
  poor: "Too low",
};
