/**
 * What an export is about, said the same way in its row on the production page and in its file
 * name: which sizes, which print locations, and for a test print the paper.
 */

export type ExportKind = "test-print" | "spec-sheet" | "gang-sheet-png" | "gang-sheet-pdf";

/** Recorded when an export is made, so its row can say what it holds. */
export type ExportSubject = {
  /** Print locations as the page names them ("Full front", "Left chest"), in proof order. */
  locations: string[];
  /** Sizes covered, in size-run order. */
  sizes: string[];
  /** Test print only: the paper's name and whether it is mirrored. */
  paper?: string;
  mirrored?: boolean;
};

export const EXPORT_KIND_LABELS: Readonly<Record<ExportKind, string>> = {
  "spec-sheet": "Spec sheet (PDF)",
  "test-print": "Test print (PDF)",
  "gang-sheet-png": "Gang sheet (PNG, 300 ppi)",
  "gang-sheet-pdf": "Gang sheet (PDF)",
};

const unique = (xs: ReadonlyArray<string>) => [...new Set(xs.filter((x) => x.trim() !== ""))];

/** "size M", "sizes S–XL" for a run of three or more, "sizes S, M". */
export function sizesText(sizes: ReadonlyArray<string>): string {
  const list = unique(sizes);
  if (list.length === 0) return "";
  if (list.length === 1) return `size ${list[0]}`;
  if (list.length === 2) return `sizes ${list[0]}, ${list[1]}`;
  return `sizes ${list[0]}–${list[list.length - 1]}`;
}

/** "Letter, mirrored": the paper's short name (its dimensions dropped) and whether it is mirrored. */
function paperText(subject: ExportSubject): string {
  return subject.paper ? `${subject.paper.replace(/\s*\(.*\)$/, "")}${subject.mirrored ? ", mirrored" : ""}` : "";
}

/** The row's heading: "Test print (PDF) · Full front · size XS · Letter, mirrored". */
export function exportTitle(kind: string, subject: ExportSubject | null | undefined): string {
  const label = (EXPORT_KIND_LABELS as Record<string, string>)[kind] ?? kind;
  if (!subject) return label;
  return [label, unique(subject.locations).join(" + "), sizesText(subject.sizes), paperText(subject)].filter(Boolean).join(" · ");
}

const slug = (s: string) =>
  s
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .replace(/[^A-Za-z0-9]+/g, "-")
    .replace(/^-|-$/g, "")
    .toLowerCase();

const KIND_SLUG: Readonly<Record<ExportKind, string>> = {
  "spec-sheet": "spec-sheet",
  "test-print": "test-print",
  "gang-sheet-png": "gang-sheet",
  "gang-sheet-pdf": "gang-sheet",
};

/**
 * A file name that says what the file holds and when it was made, so files saved side by side
 * sort by job and never overwrite each other:
 * "river-run-tees-test-print-full-front-size-xs-letter-mirrored-2026-12-04-1530.pdf".
 * `part` numbers one file of several ("1-of-3").
 */
export function exportFileName(o: { jobTitle: string; kind: ExportKind; subject: ExportSubject; stamp: string; part?: { n: number; of: number }; ext: "pdf" | "png" }): string {
  const sizes = unique(o.subject.sizes);
  const sizePart = sizes.length === 0 ? "" : sizes.length === 1 ? `size-${sizes[0]}` : sizes.length === 2 ? `sizes-${sizes[0]}-${sizes[1]}` : `sizes-${sizes[0]}-to-${sizes[sizes.length - 1]}`;
  const parts = [o.jobTitle, KIND_SLUG[o.kind], ...unique(o.subject.locations), sizePart, paperText(o.subject), o.stamp, o.part && o.part.of > 1 ? `${o.part.n}-of-${o.part.of}` : ""];
  const name = parts.map(slug).filter(Boolean).join("-").slice(0, 180).replace(/-$/, "");
  return `${name || "export"}.${o.ext}`;
}
