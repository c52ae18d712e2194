import "server-only";
import { fileTypeFromBuffer } from "file-type";
import sharp, { type Metadata, type OutputInfo, type Sharp } from "sharp";
import { classifyShape, type ArtShape } from "@/lib/artwork/advice";
import { sanitizeSvg } from "./sanitize-svg";
import { formatCount } from "@/lib/units";

/** Limits for uploads. 64 MB as the product promises; the pixel cap stops decompression bombs (our own bound, ~ a 12 × 12 in print at 800 ppi). */
export const MAX_UPLOAD_BYTES = 64 * 1024 * 1024;
export const MAX_INPUT_PIXELS = 100_000_000;
export const PREVIEW_LONG_SIDE = 2048;
export const THUMB_LONG_SIDE = 256;

export type ArtKind = "png" | "jpeg" | "webp" | "svg" | "pdf";

export type ArtworkAnalysis = {
  kind: ArtKind;
  mime: string;
  bytes: number;
  isVector: boolean;
  /** Pixel size of the whole file (for SVG/PDF: of the rendering used for analysis). */
  widthPx: number;
  heightPx: number;
  /** Embedded density, pixels per inch, when the file states one. */
  densityPpi: number | null;
  ink: { left: number; top: number; width: number; height: number };
  fillRatio: number;
  cornersEmpty: boolean;
  shape: ArtShape;
  colourCount: number;
  continuousTone: boolean;
  preview: Buffer;
  previewWidth: number;
  previewHeight: number;
  thumbnail: Buffer;
  sanitizedSvg: string | null;
  notes: string[];
};

export type AnalysisResult = { ok: true; analysis: ArtworkAnalysis } | { ok: false; message: string };

const EXTENSIONS: Record<ArtKind, string[]> = {
  png: ["png"],
  jpeg: ["jpg", "jpeg", "jpe"],
  webp: ["webp"],
  svg: ["svg"],
  pdf: ["pdf"],
};

const KIND_NAMES: Record<ArtKind, string> = { png: "a PNG image", jpeg: "a JPEG image", webp: "a WebP image", svg: "an SVG drawing", pdf: "a PDF" };
const MIME: Record<ArtKind, string> = { png: "image/png", jpeg: "image/jpeg", webp: "image/webp", svg: "image/svg+xml", pdf: "application/pdf" };

function looksLikeSvg(bytes: Buffer): boolean {
  const head = bytes.subarray(0, 2048).toString("utf8").replace(/^\uFEFF/, "").trimStart();
  return /^(<\?xml[^>]*>\s*)?(<!--[\s\S]*?-->\s*)*(<!DOCTYPE svg[^>]*>\s*)?<svg[\s>]/i.test(head);
}

/** The real type, from the bytes. Never from the name or the declared type. */
export async function sniffKind(bytes: Buffer): Promise<{ kind: ArtKind } | { kind: null; found: string | null }> {
  const detected = await fileTypeFromBuffer(bytes);
  if (detected) {
    if (detected.mime === "image/png") return { kind: "png" };
    if (detected.mime === "image/jpeg") return { kind: "jpeg" };
    if (detected.mime === "image/webp") return { kind: "webp" };
    if (detected.mime === "application/pdf") return { kind: "pdf" };
    if (detected.mime === "application/xml" && looksLikeSvg(bytes)) return { kind: "svg" };
    return { kind: null, found: detected.mime };
  }
  if (looksLikeSvg(bytes)) return { kind: "svg" };
  return { kind: null, found: null };
}

function declaredKind(name: string, declaredType: string | null): ArtKind | null {
  const ext = name.toLowerCase().split(".").pop() ?? "";
  for (const [kind, exts] of Object.entries(EXTENSIONS) as Array<[ArtKind, string[]]>) if (exts.includes(ext)) return kind;
  for (const [kind, mime] of Object.entries(MIME) as Array<[ArtKind, string]>) if (declaredType === mime) return kind;
  return null;
}

/** Renders page 1 of a PDF to PNG at the given resolution, refusing multi-page files. */
async function renderPdf(bytes: Buffer, ppi: number): Promise<{ ok: true; png: Buffer } | { ok: false; message: string }> {
  const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
  let doc;
  try {
    doc = await pdfjs.getDocument({ data: new Uint8Array(bytes), isEvalSupported: false, disableFontFace: true, useSystemFonts: false, verbosity: 0 }).promise;
  } catch {
    return { ok: false, message: "This PDF could not be opened. It may be damaged or password-protected." };
  }
  try {
    if (doc.numPages !== 1) return { ok: false, message: `This PDF has ${doc.numPages} pages. Upload a single-page PDF with just the art.` };
    const page = await doc.getPage(1);
    const base = page.getViewport({ scale: 1 });
    let scale = ppi / 72;
    if (base.width * scale * base.height * scale > MAX_INPUT_PIXELS / 4) scale = Math.sqrt(MAX_INPUT_PIXELS / 4 / (base.width * base.height));
    const viewport = page.getViewport({ scale });
    const { createCanvas } = await import("@napi-rs/canvas");
    const canvas = createCanvas(Math.ceil(viewport.width), Math.ceil(viewport.height));
    const context = canvas.getContext("2d");
    await page.render({ canvas: canvas as never, canvasContext: context as never, viewport, background: "rgba(0,0,0,0)" } as never).promise;
    return { ok: true, png: canvas.toBuffer("image/png") };
  } finally {
    await doc.destroy();
  }
}

/** Ink bounds: the box of pixels that are not transparent (alpha art) or not near-white (opaque art). */
export function findInk(data: Buffer, width: number, height: number, useAlpha: boolean): { left: number; top: number; width: number; height: number } | null {
  const isInk = useAlpha
    ? (i: number) => data[i + 3]! > 16
    : (i: number) => data[i]! < 245 || data[i + 1]! < 245 || data[i + 2]! < 245;
  const rowHasInk = (y: number, x0 = 0, x1 = width) => {
    for (let x = x0, i = (y * width + x0) * 4; x < x1; x += 1, i += 4) if (isInk(i)) return true;
    return false;
  };
  let top = 0;
  while (top < height && !rowHasInk(top)) top += 1;
  if (top === height) return null;
  let bottom = height - 1;
  while (bottom > top && !rowHasInk(bottom)) bottom -= 1;
  const colHasInk = (x: number) => {
    for (let y = top, i = (top * width + x) * 4; y <= bottom; y += 1, i += width * 4) if (isInk(i)) return true;
    return false;
  };
  let left = 0;
  while (left < width && !colHasInk(left)) left += 1;
  let right = width - 1;
  while (right > left && !colHasInk(right)) right -= 1;
  return { left, top, width: right - left + 1, height: bottom - top + 1 };
}

/** Shape cues and a colour estimate from a small copy of the ink (nearest-neighbour, so no blended colours). */
async function inkStats(image: Sharp, useAlpha: boolean) {
  const { data, info } = await image.clone().resize(160, 160, { fit: "inside", kernel: "nearest" }).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
  const w = info.width;
  const h = info.height;
  const ink = (x: number, y: number) => {
    const i = (y * w + x) * 4;
    return useAlpha ? data[i + 3]! > 16 : data[i]! < 245 || data[i + 1]! < 245 || data[i + 2]! < 245;
  };
  let inkCount = 0;
  const buckets = new Map<number, number>();
  for (let y = 0; y < h; y += 1) {
    for (let x = 0; x < w; x += 1) {
      if (!ink(x, y)) continue;
      inkCount += 1;
      const i = (y * w + x) * 4;
      const key = ((data[i]! >> 4) << 8) | ((data[i + 1]! >> 4) << 4) | (data[i + 2]! >> 4);
      buckets.set(key, (buckets.get(key) ?? 0) + 1);
    }
  }
  const corner = Math.max(1, Math.floor(Math.min(w, h) * 0.12));
  let cornerInk = 0;
  for (const [cx, cy] of [
    [0, 0],
    [w - corner, 0],
    [0, h - corner],
    [w - corner, h - corner],
  ] as const)
    for (let y = cy; y < cy + corner; y += 1) for (let x = cx; x < cx + corner; x += 1) if (ink(x, y)) cornerInk += 1;
  const shares = [...buckets.values()].map((n) => n / Math.max(1, inkCount));
  // A colour counts when it covers at least 0.5% of the ink (our own cut-off; anti-aliased edges fall below it).
  const colourCount = Math.max(1, shares.filter((s) => s >= 0.005).length);
  const continuousTone = shares.filter((s) => s >= 0.001).length > 40;
  return { fillRatio: inkCount / (w * h), cornersEmpty: cornerInk / (4 * corner * corner) < 0.02, colourCount, continuousTone };
}

/**
 * Everything Chalkline needs to know about uploaded art: real type, pixel size, density, ink bounds,
 * colours, shape, preview and thumbnail. Refuses what it cannot trust, with a sentence that says why.
 */
export async function analyzeArtwork(bytes: Buffer, declared: { name: string; type: string | null }): Promise<AnalysisResult> {
  if (bytes.length === 0) return { ok: false, message: "The file is empty (0 bytes). Export the art again and upload the new file." };
  if (bytes.length > MAX_UPLOAD_BYTES) {
    return { ok: false, message: `The file is ${(bytes.length / 1024 / 1024).toFixed(1)} MB; the limit is 64 MB. Export it smaller or flatten its layers.` };
  }
  const sniffed = await sniffKind(bytes);
  if (!sniffed.kind) {
    return {
      ok: false,
      message: sniffed.found
        ? `This file is ${sniffed.found}, which Chalkline cannot use as art. Upload PNG, JPEG, WebP, SVG or a single-page PDF.`
        : "This file is not an image Chalkline recognises. Upload PNG, JPEG, WebP, SVG or a single-page PDF.",
    };
  }
  const kind = sniffed.kind;
  const claimed = declaredKind(declared.name, declared.type);
  if (claimed && claimed !== kind) {
    return { ok: false, message: `“${declared.name}” is named as ${KIND_NAMES[claimed]} but its contents are ${KIND_NAMES[kind]}. Rename it or export it again; it was not stored.` };
  }

  const notes: string[] = [];
  let source: Buffer = bytes;
  let sanitizedSvg: string | null = null;
  let density: number | undefined;
  if (kind === "svg") {
    const report = sanitizeSvg(bytes.toString("utf8"));
    sanitizedSvg = report.svg;
    const { scripts, handlers, externalRefs } = report.removed;
    if (scripts || handlers || externalRefs) {
      notes.push(
        `Removed from the SVG before storing it: ${[
          scripts ? `${scripts} script${scripts > 1 ? "s" : ""}` : "",
          handlers ? `${handlers} event handler${handlers > 1 ? "s" : ""}` : "",
          externalRefs ? `${externalRefs} outside reference${externalRefs > 1 ? "s" : ""}` : "",
        ]
          .filter(Boolean)
          .join(", ")}.`,
      );
    }
    if (!/<svg[\s>]/i.test(sanitizedSvg)) return { ok: false, message: "Nothing drawable was left in this SVG after removing unsafe content." };
    source = Buffer.from(sanitizedSvg, "utf8");
    try {
      const meta = await sharp(source, { density: 72 }).metadata();
      const long = Math.max(meta.width ?? 0, meta.height ?? 0);
      if (!long) return { ok: false, message: "This SVG has no size. Give the root <svg> a width and height or a viewBox." };
      density = Math.max(1, Math.min(2400, (72 * PREVIEW_LONG_SIDE) / long));
    } catch {
      return { ok: false, message: "This SVG could not be read. It may be damaged; export it again." };
    }
  } else if (kind === "pdf") {
    const rendered = await renderPdf(bytes, 300);
    if (!rendered.ok) return rendered;
    source = rendered.png;
    notes.push("PDF page rendered at 300 ppi for checking; raster images inside a PDF are not measured separately.");
  }

  let meta: Metadata;
  try {
    meta = await sharp(source, { limitInputPixels: false, density }).metadata();
  } catch {
    return { ok: false, message: "This image could not be read. The file may be damaged or cut short; export it again." };
  }
  const width = meta.width ?? 0;
  const height = meta.height ?? 0;
  if (!width || !height) return { ok: false, message: "This image has no pixels." };
  if (width * height > MAX_INPUT_PIXELS) {
    return {
      ok: false,
      message: `This image is ${formatCount(width)} × ${formatCount(height)} pixels (${Math.round((width * height) / 1e6)} megapixels), over the ${MAX_INPUT_PIXELS / 1e6} megapixel limit. Resize it before uploading.`,
    };
  }

  let raw: { data: Buffer; info: OutputInfo };
  const image = sharp(source, { limitInputPixels: MAX_INPUT_PIXELS, density, failOn: "error" }).rotate();
  try {
    raw = await image.clone().ensureAlpha().raw().toBuffer({ resolveWithObject: true });
  } catch {
    return { ok: false, message: "The image data is incomplete or damaged (the file may have been cut short). Export it again and re-upload." };
  }
  const { data, info } = raw;
  let useAlpha = false;
  if (meta.hasAlpha) for (let i = 3; i < data.length; i += 4 * 7) if (data[i]! < 250) { useAlpha = true; break; }
  const ink = findInk(data, info.width, info.height, useAlpha);
  if (!ink) return { ok: false, message: "This image is blank: no ink was found (it is fully transparent or white)." };
  if (ink.width < info.width || ink.height < info.height) {
    notes.push(`Trimmed empty margins: the ink is ${ink.width} × ${ink.height} px of the ${info.width} × ${info.height} px canvas.`);
  }

  const inkImage = sharp(data, { raw: { width: info.width, height: info.height, channels: 4 } }).extract(ink);
  // One downscaled copy feeds the preview, the thumbnail and the colour count, so the full-size pixels are read once.
  const previewRaw = await inkImage.clone().resize(PREVIEW_LONG_SIDE, PREVIEW_LONG_SIDE, { fit: "inside", withoutEnlargement: true }).raw().toBuffer({ resolveWithObject: true });
  const small = () => sharp(previewRaw.data, { raw: { width: previewRaw.info.width, height: previewRaw.info.height, channels: 4 } });
  const [stats, preview, thumbnail] = await Promise.all([
    inkStats(small(), useAlpha),
    small().webp({ quality: 88, alphaQuality: 100, effort: 2 }).toBuffer({ resolveWithObject: true }),
    small().resize(THUMB_LONG_SIDE, THUMB_LONG_SIDE, { fit: "inside", withoutEnlargement: true }).webp({ quality: 80 }).toBuffer(),
  ]);

  const densityPpi = kind === "svg" || kind === "pdf" ? null : meta.density && meta.density > 0 ? meta.density : null;
  return {
    ok: true,
    analysis: {
      kind,
      mime: MIME[kind],
      bytes: bytes.length,
      isVector: kind === "svg" || kind === "pdf",
      widthPx: info.width,
      heightPx: info.height,
      densityPpi,
      ink,
      fillRatio: stats.fillRatio,
      cornersEmpty: stats.cornersEmpty,
      shape: classifyShape({ inkWidthPx: ink.width, inkHeightPx: ink.height, fillRatio: stats.fillRatio, cornersEmpty: stats.cornersEmpty }),
      colourCount: stats.colourCount,
      continuousTone: stats.continuousTone,
      preview: preview.data,
      previewWidth: preview.info.width,
      previewHeight: preview.info.height,
      thumbnail,
      sanitizedSvg,
      notes,
    },
  };
}
