/**
 * The placement warnings by code and weight, and their short words: what the canvas needs to mark
 * a print, apart from the checks themselves (checks.ts), which parse placements with zod.
 */
export type WarningSeverity = "error" | "warning" | "info";

export type PlacementWarningCode =
  | "invalid-placement"
  | "location-not-offered"
  | "too-wide"
  | "too-tall"
  | "seam-clearance"
  | "off-garment"
  | "collar-clearance"
  | "hem-clearance"
  | "pocket-clearance"
  | "outside-print-area"
  | "top-too-high"
  | "top-too-low"
  | "slightly-off-center"
  | "slight-tilt"
  | "size-switch";

export interface PlacementWarning {
  code: PlacementWarningCode;
  message: string;
  severity: WarningSeverity;
  details?: Record<string, number | string | boolean | string[]>;
}

/** Codes meaning "the art does not fit this size", as opposed to style hints. */
export const FIT_CODES: ReadonlySet<PlacementWarningCode> = new Set<PlacementWarningCode>([
  "too-wide",
  "too-tall",
  "seam-clearance",
  "off-garment",
  "collar-clearance",
  "hem-clearance",
  "pocket-clearance",
  "outside-print-area",
]);

/** A warning's code and weight, all the canvas needs to mark a print. */
export type WarningFlag = Pick<PlacementWarning, "code" | "severity">;

/** Short words for each warning, for tags on the canvas and the list of prints (our own wording). */
const SHORT_LABELS: Readonly<Record<PlacementWarningCode, string | { error: string; other: string }>> = {
  "invalid-placement": "Not valid",
  "location-not-offered": "No such location",
  "too-wide": "Too wide",
  "too-tall": "Too tall",
  "seam-clearance": { error: "Over seam", other: "Near seam" },
  "off-garment": "Off garment",
  "collar-clearance": { error: "Into collar", other: "Near collar" },
  "hem-clearance": { error: "Past hem", other: "Near hem" },
  "pocket-clearance": { error: "On pocket", other: "Near pocket" },
  "outside-print-area": "Outside area",
  "top-too-high": "Sits high",
  "top-too-low": "Sits low",
  "slightly-off-center": "Off center",
  "slight-tilt": "Slight tilt",
  "size-switch": "Size change",
};

export function shortLabel(flag: WarningFlag): string {
  const label = SHORT_LABELS[flag.code];
  return typeof label === "string" ? label : flag.severity === "error" ? label.error : label.other;
}

/** The short labels of a list of warnings, in its order, each once. */
export function shortLabels(flags: readonly WarningFlag[]): string[] {
  return [...new Set(flags.map(shortLabel))];
}

/** The warnings that say the art does not fit (errors and warnings about fit, no hints). */
export function fitProblems(warnings: readonly PlacementWarning[]): PlacementWarning[];
export function fitProblems(warnings: readonly WarningFlag[]): WarningFlag[];
export function fitProblems(warnings: readonly WarningFlag[]): WarningFlag[] {
  return warnings.filter((w) => FIT_CODES.has(w.code) && w.severity !== "info");
}
