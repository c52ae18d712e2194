import "server-only";
import {
  PDFDocument,
  StandardFonts,
  rgb,
  type PDFFont,
  type PDFImage,
  type PDFPage,
  type RGB,
} from "pdf-lib";
import sharp from "sharp";
import { PDF_UNITS_PER_INCH, formatLength } from "@/lib/units";
import { planSizeText, printHeading, type PrintPlan } from "@/lib/production/print-plan";
import { SAFETY_CAUTIONS } from "@/lib/safety";

/**
 * Production spec sheet: the one document the press operator works from. Letter portrait
 * (ANSI/ASME Y14.1 size A, 8.5 × 11 in = 612 × 792 pt at the 72 units per inch of ISO 32000),
 * flowing onto more pages when the tables are long.
 *
 * Everything arrives as plain data; nothing here reads the database.
 */

export interface SpecSheetLocationSize {
  size: string;
  /** "24" or "24 + 2 spares". */
  count: string;
  /** Ink width and height (the trimmed art, not its canvas). */
  widthIn: number;
  heightIn: number;
  /** From the collar seam (or the bag's top edge) down to the top of the ink. */
  topIn: number;
  /** x of the ink's center from the garment's center line; positive is to the viewer's right. */
  fromCentreIn: number;
  /** Which transfer or screen this size gets: "T1", "S2". */
  group: string;
  /** Fit problems at this size, in words; empty when it fits. */
  checks: string[];
}

export interface SpecSheetGroup {
  name: string;
  widthIn: number;
  heightIn: number;
  sizes: string[];
  toMake: number;
  /** Screen print: the film positive for this screen. */
  film: { widthIn: number; heightIn: number } | null;
}

export interface SpecSheetLocation {
  /** Already free of repeated words (printHeading). */
  heading: string;
  topFrom: "collar" | "top edge";
  tools: "screens" | "transfers" | "direct";
  perSize: SpecSheetLocationSize[];
  groups: SpecSheetGroup[];
  /** "Suggested, not applied: …" when the plan suggests other widths than the ones printed. */
  suggestion: string | null;
}

export interface SpecSheetInput {
  shopName: string;
  jobTitle: string;
  clientName: string;
  /** Already written in the shop's locale. */
  dueDate: string | null;
  /** Decoration method, as a label ("DTF", "Screen print", …). */
  method: string;
  garment: { style: string; colourName: string; colourHex: string };
  sizeRun: Array<{ size: string; quantity: number }>;
  /** Spares asked for per size, percent. */
  sparePercent?: number;
  locations: SpecSheetLocation[];
  /** Mock-up images, optional. */
  thumbnails: Array<{ label: string; png: Buffer }>;
  /** `at` already written in the shop's locale and time zone. */
  approval: { name: string; at: string; revision: string } | null;
  /** When the sheet was made, in the shop's clock. */
  madeAt?: string;
  /** Defaults to DEFAULT_CAUTIONS. */
  cautions?: string[];
}

/** A print plan as the spec sheet lays it out: every number comes from the plan. */
export function specSheetLocation(args: { label: string; proofName: string | null; plan: PrintPlan }): SpecSheetLocation {
  const { plan } = args;
  const groupWord = plan.tools === "screens" ? "screen" : plan.tools === "transfers" ? "transfer" : "print";
  const suggestion =
    plan.suggestion && plan.suggestionDiffers
      ? `Suggested, not applied: ${plan.suggestion.groups.map((g) => `${formatLength(g.widthIn, "in")} wide for ${g.sizes.join(", ")}`).join("; ")}. Ask the shop before using it.`
      : null;
  return {
    heading: printHeading([args.label, `${plan.side} view`, args.proofName]),
    topFrom: plan.topFrom,
    tools: plan.tools,
    perSize: plan.sizes.map((s) => {
      const text = planSizeText(plan, s);
      return { size: s.size, count: text.count, widthIn: s.widthIn, heightIn: s.heightIn, topIn: s.topIn, fromCentreIn: s.fromCentreIn, group: `${s.group} ${groupWord}`, checks: text.checks };
    }),
    groups: plan.groups.map((g) => ({ name: g.name, widthIn: g.widthIn, heightIn: g.heightIn, sizes: g.sizes, toMake: g.toMake, film: g.film })),
    suggestion,
  };
}

/** Safety and compliance notes printed on every spec sheet unless the shop supplies its own. */
export const DEFAULT_CAUTIONS: readonly string[] = SAFETY_CAUTIONS;

// ---------------------------------------------------------------------------------------
// Text that the standard fonts can show

/**
 * Characters of the Windows-1252 (WinAnsi) range above 0x7F that are not in Latin-1, by code
 * point. The standard 14 PDF fonts with WinAnsiEncoding (ISO 32000-1, Annex D) show these and
 * Latin-1 (0xA0–0xFF); anything else makes pdf-lib throw.
 */
const WIN_ANSI_EXTRAS = new Set([
  0x20ac, 0x201a, 0x0192, 0x201e, 0x2026, 0x2020, 0x2021, 0x02c6, 0x2030, 0x0160, 0x2039, 0x0152, 0x017d,
  0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x02dc, 0x2122, 0x0161, 0x203a, 0x0153, 0x017e,
  0x0178,
]);

/** Plain-ASCII stand-ins, applied first (some of these are in WinAnsi but read badly in small print). */
const ASCII_STAND_INS: ReadonlyArray<[RegExp, string]> = [
  [/[\u2192\u27f6\u279c\u2794\u21a6]/g, "->"],
  [/[\u2190\u27f5]/g, "<-"],
  [/[\u2194\u27f7]/g, "<->"],
  [/\u21d2/g, "=>"],
  [/\u21d0/g, "<="],
  [/\u2191/g, "^"],
  [/\u2193/g, "v"],
  [/[\u00d7\u2715\u2716]/g, "x"],
  [/\u00f7/g, "/"],
  [/[\u2018\u2019\u201a\u201b\u2032\u2035]/g, "'"],
  [/[\u201c\u201d\u201e\u201f\u2033\u2036\u00ab\u00bb]/g, '"'],
  [/[\u2039]/g, "<"],
  [/[\u203a]/g, ">"],
  [/[\u2010\u2011\u2012\u2013\u2014\u2015\u2212\u2043]/g, "-"],
  [/\u2026/g, "..."],
  [/[\u2022\u2023\u25cf\u25e6\u2219]/g, "*"],
  [/\u2264/g, "<="],
  [/\u2265/g, ">="],
  [/\u2260/g, "!="],
  [/\u2248/g, "~"],
  [/\u2713|\u2714/g, "v"],
  [/[\u0141]/g, "L"],
  [/[\u0142]/g, "l"],
  [/[\u0110]/g, "D"],
  [/[\u0111]/g, "d"],
  [/\u0131/g, "i"],
];

/** Emoji joiners, skin-tone modifiers, variation selectors, zero-width marks and soft hyphens: dropped. */
const INVISIBLE =
  /[\u200b-\u200f\u2060\ufeff\ufe00-\ufe0f\u00ad\u20e3]|\p{Emoji_Modifier}|\p{Regional_Indicator}|[\u{e0000}-\u{e007f}]/gu;
/** Emoji and other pictographs (except WinAnsi ones such as © and ™): dropped, as a "?" would read like a typo on a work order. */
const PICTOGRAPHS = /\p{Extended_Pictographic}/gu;

function isWinAnsi(cp: number): boolean {
  return (cp >= 0x20 && cp <= 0x7e) || (cp >= 0xa1 && cp <= 0xff) || WIN_ANSI_EXTRAS.has(cp);
}

/**
 * Makes any text safe for the standard fonts: line breaks and odd spaces become plain spaces,
 * arrows, "×" and curly quotes become ASCII, other characters are decomposed to a WinAnsi
 * base letter where one exists (so "ő" shows as "o"), emoji are dropped, and what is left
 * (CJK, …) becomes "?". Never throws.
 */
export function toWinAnsi(text: string): string {
  let s = String(text ?? "")
    .replace(INVISIBLE, "")
    .replace(PICTOGRAPHS, (ch) => (isWinAnsi(ch.codePointAt(0)!) ? ch : ""));
  for (const [pattern, replacement] of ASCII_STAND_INS) s = s.replace(pattern, replacement);
  s = s.replace(/[\s\u0000-\u001f\u007f-\u009f\u00a0]+/g, " ");
  let out = "";
  for (const ch of s) {
    const cp = ch.codePointAt(0)!;
    if (isWinAnsi(cp)) {
      out += ch;
      continue;
    }
    const base = ch.normalize("NFKD").replace(/[\u0300-\u036f]/g, "");
    const kept = [...base].filter((c) => isWinAnsi(c.codePointAt(0)!)).join("");
    out += kept !== "" && kept.length === [...base].length ? kept : "?";
  }
  return out.replace(/\?{2,}/g, "?").replace(/ {2,}/g, " ");
}

/** Breaks sanitised text into lines no wider than `maxWidth` points; overlong words are cut. */
export function wrapText(text: string, font: PDFFont, size: number, maxWidth: number): string[] {
  const words = toWinAnsi(text).trim().split(" ").filter(Boolean);
  const lines: string[] = [];
  let line = "";
  const width = (t: string) => font.widthOfTextAtSize(t, size);
  for (let word of words) {
    const candidate = line ? `${line} ${word}` : word;
    if (width(candidate) <= maxWidth) {
      line = candidate;
      continue;
    }
    if (line) lines.push(line);
    line = "";
    while (width(word) > maxWidth && word.length > 1) {
      let cut = word.length - 1;
      while (cut > 1 && width(word.slice(0, cut)) > maxWidth) cut -= 1;
      lines.push(word.slice(0, cut));
      word = word.slice(cut);
    }
    line = word;
  }
  if (line) lines.push(line);
  return lines.length ? lines : [""];
}

/** Sanitised text cut with "..." to fit `maxWidth` points. */
export function fitText(text: string, font: PDFFont, size: number, maxWidth: number): string {
  const clean = toWinAnsi(text);
  if (font.widthOfTextAtSize(clean, size) <= maxWidth) return clean;
  let cut = clean.length;
  while (cut > 0 && font.widthOfTextAtSize(`${clean.slice(0, cut)}...`, size) > maxWidth) cut -= 1;
  // Never mid-word: back up to the last space that fits, unless the first word alone is too long.
  const space = clean.lastIndexOf(" ", cut);
  if (space > 0 && clean[cut] !== " ") cut = space;
  return `${clean.slice(0, cut).trimEnd()}...`;
}

/** "#1f2a3b" or "1F2A3B" or "#abc" to a pdf-lib colour; null when unreadable. */
export function parseHexColour(hex: string): RGB | null {
  const m = /^#?([0-9a-f]{3}|[0-9a-f]{6})$/i.exec(String(hex ?? "").trim());
  if (!m) return null;
  const h = m[1]!.length === 3 ? [...m[1]!].map((c) => c + c).join("") : m[1]!;
  const n = Number.parseInt(h, 16);
  return rgb(((n >> 16) & 255) / 255, ((n >> 8) & 255) / 255, (n & 255) / 255);
}

// ---------------------------------------------------------------------------------------
// Layout

/** ANSI/ASME Y14.1 size A (Letter) in points: 8.5 × 11 in at 72 per inch (ISO 32000). */
const PAGE_W = 8.5 * PDF_UNITS_PER_INCH;
const PAGE_H = 11 * PDF_UNITS_PER_INCH;
/** Our own layout: half-inch margins, room at the foot for the page footer. */
const MARGIN = 0.5 * PDF_UNITS_PER_INCH;
const CONTENT_W = PAGE_W - 2 * MARGIN;
const BOTTOM_LIMIT = PAGE_H - MARGIN - 18;

const INK = rgb(0.1, 0.1, 0.12);
const MUTED = rgb(0.42, 0.43, 0.47);
const RULE = rgb(0.78, 0.79, 0.82);
const ZEBRA = rgb(0.955, 0.958, 0.965);
const HEAD_FILL = rgb(0.88, 0.89, 0.92);
const GOOD = rgb(0.1, 0.45, 0.22);
const STOP = rgb(0.72, 0.1, 0.1);

/** Longest side of an embedded thumbnail, px (our own bound: sharp enough at 1.7 in, small file). */
const THUMB_MAX_PX = 600;

interface Fonts {
  regular: PDFFont;
  bold: PDFFont;
}

/** Top-down cursor over Letter pages; `y` is points from the top edge. */
class Flow {
  page!: PDFPage;
  y = MARGIN;
  readonly pages: PDFPage[] = [];

  constructor(
    readonly doc: PDFDocument,
    readonly fonts: Fonts,
  ) {
    this.newPage();
  }

  newPage(): void {
    this.page = this.doc.addPage([PAGE_W, PAGE_H]);
    this.pages.push(this.page);
    this.y = MARGIN;
  }

  /** Starts a new page unless `height` points still fit on this one. */
  ensure(height: number): boolean {
    if (this.y + height <= BOTTOM_LIMIT) return false;
    this.newPage();
    return true;
  }

  text(
    text: string,
    x: number,
    top: number,
    size: number,
    opts: { bold?: boolean; color?: RGB; maxWidth?: number } = {},
  ) {
    const font = opts.bold ? this.fonts.bold : this.fonts.regular;
    const clean = opts.maxWidth ? fitText(text, font, size, opts.maxWidth) : toWinAnsi(text);
    // `top` is the top of the line box; the baseline sits about 0.8 em lower.
    this.page.drawText(clean, { x, y: PAGE_H - top - size * 0.8, size, font, color: opts.color ?? INK });
  }

  textRight(
    text: string,
    right: number,
    top: number,
    size: number,
    opts: { bold?: boolean; color?: RGB } = {},
  ) {
    const font = opts.bold ? this.fonts.bold : this.fonts.regular;
    const clean = toWinAnsi(text);
    this.text(clean, right - font.widthOfTextAtSize(clean, size), top, size, opts);
  }

  rect(
    x: number,
    top: number,
    w: number,
    h: number,
    opts: { fill?: RGB; border?: RGB; borderWidth?: number },
  ) {
    this.page.drawRectangle({
      x,
      y: PAGE_H - top - h,
      width: w,
      height: h,
      color: opts.fill,
      borderColor: opts.border,
      borderWidth: opts.border ? (opts.borderWidth ?? 0.75) : 0,
    });
  }

  rule(top: number, color: RGB = RULE, width = 0.75) {
    this.page.drawLine({
      start: { x: MARGIN, y: PAGE_H - top },
      end: { x: PAGE_W - MARGIN, y: PAGE_H - top },
      thickness: width,
      color,
    });
  }

  heading(title: string, note?: string) {
    this.ensure(40);
    this.y += 8;
    this.text(title, MARGIN, this.y, 12, { bold: true });
    if (note) {
      const w = this.fonts.bold.widthOfTextAtSize(toWinAnsi(title), 12);
      this.text(note, MARGIN + w + 8, this.y + 3, 8, { color: MUTED, maxWidth: CONTENT_W - w - 8 });
    }
    this.y += 17;
  }
}

function inchesAndDecimal(value: number): { main: string; decimal: string } {
  return {
    main: formatLength(value, "in"),
    decimal: `${formatLength(value, "in", { decimal: true, digits: 2 })} | ${formatLength(value, "cm")}`,
  };
}

function sizePair(w: number, h: number): { main: string; decimal: string } {
  const ew = formatLength(w, "in", { withUnit: false });
  const eh = formatLength(h, "in", { withUnit: false });
  const dw = formatLength(w, "in", { decimal: true, withUnit: false });
  const dh = formatLength(h, "in", { decimal: true, withUnit: false });
  const cw = formatLength(w, "cm", { withUnit: false });
  const ch = formatLength(h, "cm", { withUnit: false });
  return { main: `${ew} x ${eh} in`, decimal: `${dw} x ${dh} in | ${cw} x ${ch} cm` };
}

function fromCenter(offset: number): { main: string; decimal: string } {
  if (!Number.isFinite(offset)) return { main: "-", decimal: "" };
  // Anything that rounds to 0 at 1/8 in is centred for the press.
  if (formatLength(Math.abs(offset), "in", { withUnit: false }) === "0") {
    const rest =
      Math.abs(offset) < 0.005
        ? "0 in"
        : `${formatLength(Math.abs(offset), "in", { decimal: true })} ${offset > 0 ? "right" : "left"}`;
    return { main: "Centered", decimal: rest };
  }
  const side = offset > 0 ? "right" : "left";
  return {
    main: `${formatLength(Math.abs(offset), "in")} ${side}`,
    decimal: `${formatLength(Math.abs(offset), "in", { decimal: true })} ${side} | ${formatLength(Math.abs(offset), "cm")}`,
  };
}

function drawHeader(flow: Flow, input: SpecSheetInput, totalPieces: number) {
  const { fonts } = flow;
  flow.text(input.shopName || "Shop", MARGIN, flow.y, 10, {
    bold: true,
    color: MUTED,
    maxWidth: CONTENT_W * 0.6,
  });
  flow.textRight("PRODUCTION SPEC SHEET", PAGE_W - MARGIN, flow.y, 10, { bold: true });
  flow.y += 16;
  flow.rule(flow.y, INK, 1.25);
  flow.y += 10;
  const titleLines = wrapText(input.jobTitle || "Untitled job", fonts.bold, 18, CONTENT_W).slice(0, 3);
  for (const line of titleLines) {
    flow.text(line, MARGIN, flow.y, 18, { bold: true });
    flow.y += 22;
  }
  flow.y += 4;

  const colW = CONTENT_W / 3;
  const field = (col: number, row: number, label: string, value: string, indent = 0) => {
    const x = MARGIN + col * colW;
    const top = flow.y + row * 30;
    flow.text(label.toUpperCase(), x, top, 7, { bold: true, color: MUTED });
    flow.text(value, x + indent, top + 10, 11, { maxWidth: colW - 10 - indent });
  };
  field(0, 0, "Client", input.clientName || "-");
  field(1, 0, "Due", input.dueDate || "No due date");
  field(2, 0, "Method", input.method || "-");
  field(0, 1, "Garment", input.garment.style || "-");
  const swatch = parseHexColour(input.garment.colourHex);
  const swatchX = MARGIN + colW;
  const swatchTop = flow.y + 30 + 10;
  flow.rect(swatchX, swatchTop, 12, 12, { fill: swatch ?? rgb(1, 1, 1), border: INK, borderWidth: 0.5 });
  if (!swatch) {
    // An unreadable colour code: a crossed box rather than a made-up colour.
    flow.page.drawLine({
      start: { x: swatchX, y: PAGE_H - swatchTop },
      end: { x: swatchX + 12, y: PAGE_H - swatchTop - 12 },
      thickness: 0.5,
      color: INK,
    });
  }
  const colourText = swatch
    ? `${input.garment.colourName || "-"} (${toWinAnsi(input.garment.colourHex).trim()})`
    : `${input.garment.colourName || "-"} (no colour code)`;
  field(1, 1, "Colour", colourText, 17);
  field(2, 1, "Garments", input.sparePercent ? `${totalPieces} (+${input.sparePercent}% spares per size)` : `${totalPieces}`);
  flow.y += 62;
  flow.rule(flow.y);
  flow.y += 4;
}

function drawSizeRun(flow: Flow, sizeRun: SpecSheetInput["sizeRun"], total: number) {
  flow.heading("Size run");
  const labelW = 44;
  const cellW = 46;
  const perBand = Math.max(1, Math.floor((CONTENT_W - labelW) / cellW) - 1);
  const cells = sizeRun.map((s) => ({
    size: s.size,
    qty: Number.isFinite(s.quantity) ? String(s.quantity) : "-",
  }));
  if (cells.length === 0) {
    flow.text("No sizes in this order.", MARGIN, flow.y, 10, { color: MUTED });
    flow.y += 18;
    return;
  }
  for (let start = 0; start < cells.length; start += perBand) {
    const band = cells.slice(start, start + perBand);
    const last = start + perBand >= cells.length;
    const columns = band.length + (last ? 1 : 0);
    flow.ensure(44);
    const top = flow.y;
    const rowH = 18;
    flow.rect(MARGIN, top, labelW + columns * cellW, rowH, { fill: HEAD_FILL });
    flow.text("Size", MARGIN + 4, top + 5, 9, { bold: true });
    flow.text("Qty", MARGIN + 4, top + rowH + 5, 9, { bold: true });
    band.forEach((cell, i) => {
      const x = MARGIN + labelW + i * cellW;
      flow.text(cell.size, x + 4, top + 5, 9, { bold: true, maxWidth: cellW - 6 });
      flow.text(cell.qty, x + 4, top + rowH + 4, 11, { maxWidth: cellW - 6 });
    });
    if (last) {
      const x = MARGIN + labelW + band.length * cellW;
      flow.text("Total", x + 4, top + 5, 9, { bold: true });
      flow.text(String(total), x + 4, top + rowH + 4, 11, { bold: true });
    }
    flow.rect(MARGIN, top, labelW + columns * cellW, rowH * 2, { border: RULE });
    for (let i = 0; i <= columns; i++) {
      const x = MARGIN + labelW + i * cellW;
      flow.page.drawLine({
        start: { x, y: PAGE_H - top },
        end: { x, y: PAGE_H - top - 2 * rowH },
        thickness: 0.5,
        color: RULE,
      });
    }
    flow.y += rowH * 2 + 8;
  }
}

const LOCATION_COLUMNS = [
  { title: "Size (count)", width: 78 },
  { title: "Ink W x H", width: 150 },
  { title: "Below collar", width: 92 },
  { title: "From center", width: 100 },
  { title: "Transfer / screen", width: CONTENT_W - 78 - 150 - 92 - 100 },
] as const;

function drawLocation(flow: Flow, location: SpecSheetLocation) {
  const checkLines = location.perSize.reduce((n, r) => n + r.checks.length, 0);
  // Keep a table whole when it fits on one page; a longer one starts with at least three rows.
  const whole = 25 + 16 + 26 * Math.max(1, location.perSize.length) + 12 * checkLines + 6;
  flow.ensure(whole <= BOTTOM_LIMIT - MARGIN ? whole : 25 + 16 + 26 * 3);
  const topTitle = location.topFrom === "collar" ? "Below collar" : "Below top edge";
  flow.heading(
    location.heading || "Print",
    `Sizes are of the ink. ${topTitle}: ${location.topFrom === "collar" ? "collar seam" : "bag's top edge"} to top of ink. From center: ink center, left/right as you face this side.`,
  );
  const header = () => {
    flow.rect(MARGIN, flow.y, CONTENT_W, 16, { fill: HEAD_FILL });
    let x = MARGIN;
    for (const col of LOCATION_COLUMNS) {
      const title = col.title === "Below collar" ? topTitle : col.title;
      flow.text(title, x + 4, flow.y + 4, 8, { bold: true, maxWidth: col.width - 6 });
      x += col.width;
    }
    flow.y += 16;
  };
  header();
  if (location.perSize.length === 0) {
    flow.text("No sizes listed for this location.", MARGIN + 4, flow.y + 6, 9, { color: MUTED });
    flow.y += 22;
    return;
  }
  const rowH = 26;
  location.perSize.forEach((row, i) => {
    const warnings = row.checks.flatMap((c) => wrapText(`Check: ${c}`, flow.fonts.bold, 8, CONTENT_W - 12));
    if (flow.ensure(rowH + warnings.length * 11)) {
      flow.text(`${location.heading}, continued`, MARGIN, flow.y, 9, { bold: true, color: MUTED });
      flow.y += 14;
      header();
    }
    if (i % 2 === 1) flow.rect(MARGIN, flow.y, CONTENT_W, rowH + warnings.length * 11, { fill: ZEBRA });
    const cells: Array<{ main: string; decimal: string; bold?: boolean }> = [
      { main: row.size, decimal: row.count, bold: true },
      sizePair(row.widthIn, row.heightIn),
      inchesAndDecimal(row.topIn),
      fromCenter(row.fromCentreIn),
      { main: row.group || "-", decimal: "" },
    ];
    let x = MARGIN;
    cells.forEach((cell, c) => {
      const w = LOCATION_COLUMNS[c]!.width;
      flow.text(cell.main, x + 4, flow.y + 4, 10, { bold: cell.bold, maxWidth: w - 6 });
      if (cell.decimal) flow.text(cell.decimal, x + 4, flow.y + 16, 6.5, { color: MUTED, maxWidth: w - 6 });
      x += w;
    });
    flow.y += rowH;
    for (const line of warnings) {
      flow.text(line, MARGIN + 8, flow.y - 2, 8, { bold: true, color: STOP });
      flow.y += 11;
    }
  });
  flow.rule(flow.y);
  flow.y += 6;
  const groupLines = location.groups.map((g) => {
    const what = location.tools === "screens" ? "Screen" : location.tools === "transfers" ? "Transfer" : "Print";
    const film = g.film ? `; film positive ${formatLength(g.film.widthIn, "in", { withUnit: false })} x ${formatLength(g.film.heightIn, "in")}` : "";
    const made = location.tools === "screens" ? "" : `, make ${g.toMake}`;
    return `${what} ${g.name}: ${formatLength(g.widthIn, "in", { withUnit: false })} x ${formatLength(g.heightIn, "in")} for ${g.sizes.join(", ")}${made}${film}.`;
  });
  for (const line of groupLines.flatMap((l) => wrapText(l, flow.fonts.regular, 8.5, CONTENT_W))) {
    flow.ensure(12);
    flow.text(line, MARGIN, flow.y, 8.5);
    flow.y += 12;
  }
  if (location.suggestion) {
    for (const line of wrapText(location.suggestion, flow.fonts.bold, 8.5, CONTENT_W)) {
      flow.ensure(12);
      flow.text(line, MARGIN, flow.y, 8.5, { bold: true, color: rgb(0.6, 0.4, 0.05) });
      flow.y += 12;
    }
  }
  flow.y += 4;
}

async function embedThumbnail(doc: PDFDocument, png: Buffer): Promise<PDFImage | null> {
  try {
    // Through sharp: any PNG flavour becomes a plain 8-bit one, and big mock-ups shrink.
    const normalised = await sharp(png, { limitInputPixels: 100_000_000 })
      .resize(THUMB_MAX_PX, THUMB_MAX_PX, { fit: "inside", withoutEnlargement: true })
      .png()
      .toBuffer();
    return await doc.embedPng(normalised);
  } catch {
    return null;
  }
}

async function drawThumbnails(flow: Flow, thumbnails: SpecSheetInput["thumbnails"]) {
  if (thumbnails.length === 0) return;
  flow.ensure(40 + 150);
  flow.heading("Mock-ups");
  const box = 122;
  const gap = (CONTENT_W - 4 * box) / 3;
  for (let i = 0; i < thumbnails.length; i++) {
    const col = i % 4;
    if (col === 0 && i > 0) flow.y += box + 30;
    if (col === 0) flow.ensure(box + 20);
    const x = MARGIN + col * (box + gap);
    const thumb = thumbnails[i]!;
    flow.rect(x, flow.y, box, box, { border: RULE });
    const image = await embedThumbnail(flow.doc, thumb.png);
    if (image) {
      const s = Math.min((box - 8) / image.width, (box - 8) / image.height);
      const w = image.width * s;
      const h = image.height * s;
      flow.page.drawImage(image, {
        x: x + (box - w) / 2,
        y: PAGE_H - flow.y - (box + h) / 2,
        width: w,
        height: h,
      });
    } else {
      flow.text("Image could not be read", x + 6, flow.y + box / 2 - 4, 8, {
        color: MUTED,
        maxWidth: box - 12,
      });
    }
    // Two lines at word breaks; a third line's worth ends the second with "...".
    const lines = wrapText(thumb.label, flow.fonts.regular, 8, box);
    const shown = lines.length > 2 ? [lines[0]!, fitText(`${lines[1]} ${lines.slice(2).join(" ")}`, flow.fonts.regular, 8, box)] : lines;
    shown.forEach((line, n) => flow.text(line, x, flow.y + box + 4 + n * 10, 8, { color: MUTED }));
  }
  flow.y += box + 30;
}

function drawApproval(flow: Flow, approval: SpecSheetInput["approval"]) {
  flow.ensure(40 + 60);
  flow.heading("Approval");
  if (!approval) {
    flow.rect(MARGIN, flow.y, CONTENT_W, 46, { fill: STOP });
    flow.text("NOT APPROVED YET", MARGIN + 12, flow.y + 8, 18, { bold: true, color: rgb(1, 1, 1) });
    flow.text("Do not print until the client has approved the proof.", MARGIN + 12, flow.y + 30, 9, {
      color: rgb(1, 1, 1),
    });
    flow.y += 54;
    return;
  }
  flow.rect(MARGIN, flow.y, CONTENT_W, 50, { border: GOOD, borderWidth: 1.5 });
  flow.text("APPROVED", MARGIN + 12, flow.y + 8, 14, { bold: true, color: GOOD });
  const col = (CONTENT_W - 24) / 3;
  const item = (i: number, label: string, value: string) => {
    const x = MARGIN + 12 + i * col;
    flow.text(label.toUpperCase(), x, flow.y + 26, 7, { bold: true, color: MUTED });
    flow.text(value || "-", x, flow.y + 35, 10, { maxWidth: col - 8 });
  };
  item(0, "Approved by", approval.name);
  item(1, "Approved at", approval.at);
  item(2, "Proof revision", approval.revision);
  flow.y += 58;
}

function drawCautions(flow: Flow, cautions: readonly string[]) {
  const { regular } = flow.fonts;
  const size = 8.5;
  const lead = 11;
  const width = CONTENT_W - 28;
  const items = cautions.map((c) => wrapText(c, regular, size, width));
  const boxHeight = (lines: string[][]) => 12 + lines.reduce((n, l) => n + l.length * lead + 3, 0);
  flow.ensure(40 + Math.min(boxHeight(items), 200));
  flow.heading("Safety and compliance");
  let pending = items;
  while (pending.length > 0) {
    // As many whole cautions as fit here; a caution is never split across pages.
    let fit = 0;
    while (fit < pending.length && flow.y + boxHeight(pending.slice(0, fit + 1)) <= BOTTOM_LIMIT) fit += 1;
    if (fit === 0) {
      if (flow.y > MARGIN) {
        flow.newPage();
        continue;
      }
      fit = 1;
    }
    const chunk = pending.slice(0, fit);
    const h = boxHeight(chunk);
    flow.rect(MARGIN, flow.y, CONTENT_W, h, { border: rgb(0.75, 0.55, 0.1), borderWidth: 1 });
    let top = flow.y + 7;
    for (const lines of chunk) {
      flow.text("!", MARGIN + 10, top, size, { bold: true, color: rgb(0.75, 0.55, 0.1) });
      for (const line of lines) {
        flow.text(line, MARGIN + 20, top, size);
        top += lead;
      }
      top += 3;
    }
    flow.y += h + 6;
    pending = pending.slice(fit);
  }
}

function drawFooters(flow: Flow, input: SpecSheetInput) {
  const { regular } = flow.fonts;
  const n = flow.pages.length;
  flow.pages.forEach((page, i) => {
    const right = toWinAnsi(`Page ${i + 1} of ${n}`);
    const rightW = regular.widthOfTextAtSize(right, 7.5);
    const left = fitText(
      `${input.shopName} - ${input.jobTitle} - spec sheet${input.madeAt ? `, made ${input.madeAt}` : ""}`,
      regular,
      7.5,
      CONTENT_W - rightW - 20,
    );
    const y = MARGIN - 14;
    page.drawLine({
      start: { x: MARGIN, y: y + 10 },
      end: { x: PAGE_W - MARGIN, y: y + 10 },
      thickness: 0.5,
      color: RULE,
    });
    page.drawText(left, { x: MARGIN, y, size: 7.5, font: regular, color: MUTED });
    page.drawText(right, { x: PAGE_W - MARGIN - rightW, y, size: 7.5, font: regular, color: MUTED });
  });
}

/** Renders the spec sheet: Letter portrait, as many pages as the tables need. */
export async function renderSpecSheetPdf(input: SpecSheetInput): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  doc.setTitle(toWinAnsi(`${input.jobTitle} - spec sheet`));
  doc.setCreator("Chalkline");
  doc.setProducer("Chalkline");
  const fonts: Fonts = {
    regular: await doc.embedFont(StandardFonts.Helvetica),
    bold: await doc.embedFont(StandardFonts.HelveticaBold),
  };
  const flow = new Flow(doc, fonts);
  const sizeRun = input.sizeRun ?? [];
  const total = sizeRun.reduce((sum, s) => sum + (Number.isFinite(s.quantity) ? s.quantity : 0), 0);

  drawHeader(flow, input, total);
  drawSizeRun(flow, sizeRun, total);
  for (const location of input.locations ?? []) drawLocation(flow, location);
  await drawThumbnails(flow, input.thumbnails ?? []);
  drawApproval(flow, input.approval);
  drawCautions(flow, input.cautions ?? DEFAULT_CAUTIONS);
  drawFooters(flow, input);
  return doc.save();
}
