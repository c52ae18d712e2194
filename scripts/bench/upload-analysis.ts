/** Upload analysis of a 24-megapixel PNG against sharp's bare decode and resize of the same file. */
import sharp from "sharp";
import { timeAsync } from "./cpu-timing";
import type { Row } from "./table";

export async function measureUploadAnalysis(): Promise<Row[]> {
  const { analyzeArtwork } = await import("../../app/_server/artwork/analyze");
  const w = 6000;
  const h = 4000;
  const noise = Buffer.alloc(w * h * 4);
  for (let i = 0; i < noise.length; i += 4) {
    const x = (i / 4) % w;
    const y = Math.floor(i / 4 / w);
    noise[i] = (x * 7) & 255;
    noise[i + 1] = (y * 5) & 255;
    noise[i + 2] = ((x + y) * 3) & 255;
    noise[i + 3] = x > 300 && x < w - 300 && y > 200 && y < h - 200 ? 255 : 0;
  }
  const png = await sharp(noise, { raw: { width: w, height: h, channels: 4 } }).png({ compressionLevel: 3 }).toBuffer();
  const bareMs = await timeAsync(() => sharp(png, { limitInputPixels: false }).resize(2048, 2048, { fit: "inside" }).webp().toBuffer(), 3);
  const analysisMs = await timeAsync(() => analyzeArtwork(png, { name: "bench.png", type: "image/png" }), 3);
  return [{ benchmark: "upload analysis, 24 MP PNG", subject: "full analysis", value: `${analysisMs.toFixed(0)} ms`, against: `sharp decode+resize ${bareMs.toFixed(0)} ms`, ratio: `${(analysisMs / bareMs).toFixed(2)}×` }];
}
