import "server-only";
import { insertUploadedArtwork } from "@/db/queries/artworks";
import { analyzeArtwork, MAX_UPLOAD_BYTES } from "./analyze";
import { deleteStoredFile } from "./storage";

type Analysis = Extract<Awaited<ReturnType<typeof analyzeArtwork>>, { ok: true }>["analysis"];

/** The stored columns an analysed upload fills, beside who owns it and where its file is. */
export function artworkColumns(a: Analysis) {
  return {
    svg: a.sanitizedSvg,
    inkWidthPx: a.ink.width,
    inkHeightPx: a.ink.height,
    isVector: a.isVector,
    mime: a.mime,
    bytes: a.bytes,
    widthPx: a.widthPx,
    heightPx: a.heightPx,
    densityPpi: a.densityPpi,
    inkLeftPx: a.ink.left,
    inkTopPx: a.ink.top,
    fillRatio: a.fillRatio,
    shape: a.shape,
    colourCount: a.colourCount,
    continuousTone: a.continuousTone,
    preview: a.preview,
    previewWidth: a.previewWidth,
    previewHeight: a.previewHeight,
    thumbnail: a.thumbnail,
    notes: a.notes,
  };
}

export type IngestInput = {
  fileUrl: string;
  fileKey: string;
  name: string;
  size: number;
  declaredType: string | null;
  shopId: string;
  userId: string;
  clientId: string | null;
};

export type IngestResult = { ok: true; artworkId: string; notes: string[] } | { ok: false; message: string };

async function download(url: string): Promise<Buffer | string> {
  let response: Response;
  try {
    response = await fetch(url, { signal: AbortSignal.timeout(60_000) });
  } catch {
    return "The uploaded file could not be fetched back from storage. Try the upload again.";
  }
  if (!response.ok || !response.body) return `Storage answered ${response.status} for the uploaded file. Try the upload again.`;
  const declared = Number(response.headers.get("content-length") ?? 0);
  if (declared > MAX_UPLOAD_BYTES) return "The file is over the 64 MB limit.";
  const chunks: Uint8Array[] = [];
  let total = 0;
  const reader = response.body.getReader();
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > MAX_UPLOAD_BYTES) {
      await reader.cancel();
      return "The file is over the 64 MB limit.";
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks);
}

/**
 * After an upload lands in storage: read it back, analyse it without trusting its name or type,
 * and store the analysis. Refused files are removed from storage, so nothing unusable stays behind.
 */
export async function ingestUploadedArtwork(input: IngestInput): Promise<IngestResult> {
  const bytes = await download(input.fileUrl);
  if (typeof bytes === "string") {
    await deleteStoredFile(input.fileKey);
    return { ok: false, message: bytes };
  }
  const stored = await storeArtwork({ bytes, name: input.name, declaredType: input.declaredType, shopId: input.shopId, userId: input.userId, clientId: input.clientId, fileKey: input.fileKey, fileUrl: input.fileUrl });
  if (!stored.ok) {
    if (stored.refused) await deleteStoredFile(input.fileKey);
    return { ok: false, message: stored.message };
  }
  try {
    // The raw SVG may hold scripts; only the sanitised copy in the database is ever served or printed.
    if (stored.kind === "svg") await deleteStoredFile(input.fileKey);
  } catch (error) {
    console.error("[artwork ingest] storage clean-up", error);
  }
  return { ok: true, artworkId: stored.artworkId, notes: stored.notes };
}

export type StoreArtworkInput = {
  bytes: Buffer;
  name: string;
  declaredType: string | null;
  shopId: string;
  userId: string;
  clientId: string | null;
  fileKey: string | null;
  fileUrl: string | null;
};

/**
 * Analyses art bytes without trusting their name or type and stores the analysis: measured ink
 * bounds, quality, preview and thumbnail. Uploads come here once read back from storage; the demo
 * art of the seed comes here too, so it is measured exactly as an upload is.
 */
export async function storeArtwork(input: StoreArtworkInput): Promise<{ ok: true; artworkId: string; notes: string[]; kind: string } | { ok: false; message: string; refused: boolean }> {
  const result = await analyzeArtwork(input.bytes, { name: input.name, type: input.declaredType });
  if (!result.ok) return { ok: false, message: result.message, refused: true };
  const a = result.analysis;
  const displayName = input.name.replace(/\.[a-z0-9]+$/i, "").slice(0, 120) || "Untitled art";
  try {
    const artworkId = await insertUploadedArtwork({
      ...artworkColumns(a),
      shopId: input.shopId,
      clientId: input.clientId,
      name: displayName,
      fileKey: input.fileKey,
      fileUrl: input.fileUrl,
      uploadedBy: input.userId,
    });
    return { ok: true, artworkId, notes: a.notes, kind: a.kind };
  } catch (error) {
    console.error("[artwork ingest]", error);
    return { ok: false, message: "The art was read but could not be saved. Try again in a moment.", refused: false };
  }
}
