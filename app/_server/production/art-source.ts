import "server-only";
import sharp from "sharp";
import type { ArtworkSummary } from "@/db/queries/artworks";

/** Long side used when a vector has to become pixels for production (300 ppi on a 14 in print). */
const VECTOR_LONG_SIDE = 4200;

/**
 * The ORIGINAL art for production, cropped to its ink (placements measure the ink, not the canvas).
 * Raster uploads come from upload storage; vectors render from their sanitised SVG.
 */
export async function productionArt(art: ArtworkSummary): Promise<{ png: Buffer }> {
  if (art.svg) {
    const meta = await sharp(Buffer.from(art.svg), { density: 72 }).metadata();
    const long = Math.max(meta.width ?? 1, meta.height ?? 1);
    const density = Math.min(2400, (72 * VECTOR_LONG_SIDE) / long);
    let image = sharp(Buffer.from(art.svg), { density }).png();
    if (art.kind === "upload" && art.widthPx && art.inkLeftPx !== null && art.inkTopPx !== null) {
      const rendered = await image.toBuffer({ resolveWithObject: true });
      const k = rendered.info.width / art.widthPx;
      const crop = {
        left: Math.max(0, Math.floor(art.inkLeftPx * k)),
        top: Math.max(0, Math.floor(art.inkTopPx * k)),
        width: Math.min(rendered.info.width, Math.ceil(art.inkWidthPx * k)),
        height: Math.min(rendered.info.height, Math.ceil(art.inkHeightPx * k)),
      };
      crop.width = Math.min(crop.width, rendered.info.width - crop.left);
      crop.height = Math.min(crop.height, rendered.info.height - crop.top);
      image = sharp(rendered.data).extract(crop).png();
    }
    return { png: await image.toBuffer() };
  }
  if (!art.fileUrl) throw new Error(`The original file of “${art.name}” is not in storage.`);
  const response = await fetch(art.fileUrl, { signal: AbortSignal.timeout(60_000) });
  if (!response.ok) throw new Error(`Upload storage answered ${response.status} for “${art.name}”.`);
  const bytes = Buffer.from(await response.arrayBuffer());
  const base = sharp(bytes, { limitInputPixels: 100_000_000 }).rotate();
  const cropped =
    art.inkLeftPx !== null && art.inkTopPx !== null
      ? base.extract({ left: art.inkLeftPx, top: art.inkTopPx, width: art.inkWidthPx, height: art.inkHeightPx })
      : base;
  return { png: await cropped.png().toBuffer() };
}
