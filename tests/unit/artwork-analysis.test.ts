import { deflateSync } from "node:zlib";
import { PDFDocument, rgb } from "pdf-lib";
import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { analyzeArtwork, findInk, MAX_UPLOAD_BYTES } from "@/app/_server/artwork/analyze";
import { sanitizeSvg } from "@/app/_server/artwork/sanitize-svg";

/** Reads the pHYs chunk straight from PNG bytes (W3C PNG specification, pHYs: X px/unit, Y px/unit, unit 1 = metre). */
function readPhys(png: Buffer): { x: number; y: number; unit: number } | null {
  let offset = 8;
  while (offset < png.length) {
    const length = png.readUInt32BE(offset);
    const type = png.toString("latin1", offset + 4, offset + 8);
    if (type === "pHYs") return { x: png.readUInt32BE(offset + 8), y: png.readUInt32BE(offset + 12), unit: png[offset + 16]! };
    offset += 12 + length;
  }
  return null;
}

const crcTable = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k += 1) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});
function crc32(buf: Buffer): number {
  let c = 0xffffffff;
  for (const b of buf) c = crcTable[(c ^ b) & 0xff]! ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, "latin1"), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([len, body, crc]);
}
/** A tiny file whose header claims a huge image: the shape of a decompression bomb. */
function bombPng(width: number, height: number): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 0; // greyscale
  return Buffer.concat([Buffer.from([137, 80, 78, 71, 13, 10, 26, 10]), chunk("IHDR", ihdr), chunk("IDAT", deflateSync(Buffer.alloc(1024))), chunk("IEND", Buffer.alloc(0))]);
}

async function rectOn(background: { r: number; g: number; b: number; alpha: number }, rect: { left: number; top: number; width: number; height: number }, size = { width: 1000, height: 800 }) {
  const block = await sharp({ create: { width: rect.width, height: rect.height, channels: 4, background: { r: 200, g: 30, b: 40, alpha: 1 } } }).png().toBuffer();
  return sharp({ create: { ...size, channels: 4, background } }).composite([{ input: block, left: rect.left, top: rect.top }]).png().toBuffer();
}

describe("embedded density", () => {
  it("reads a PNG written at 300 ppi as 11811 pixels per metre (W3C PNG specification, pHYs chunk)", async () => {
    const png = await sharp({ create: { width: 30, height: 30, channels: 3, background: "#123456" } }).withMetadata({ density: 300 }).png().toBuffer();
    // 300 px/in ÷ 0.0254 m/in (NIST SP 811) = 11811.02 px/m, stored as an integer.
    expect(readPhys(png)).toEqual({ x: 11811, y: 11811, unit: 1 });
    const result = await analyzeArtwork(png, { name: "swatch.png", type: "image/png" });
    expect(result.ok && result.analysis.densityPpi).toBeCloseTo(300, 0);
  });

  it("reads JPEG JFIF density through sharp (reference library)", async () => {
    const jpeg = await sharp({ create: { width: 40, height: 40, channels: 3, background: "#224466" } }).withMetadata({ density: 240 }).jpeg().toBuffer();
    const result = await analyzeArtwork(jpeg, { name: "swatch.jpg", type: "image/jpeg" });
    expect(result.ok && result.analysis.densityPpi).toBe(240);
  });
});

describe("ink bounds", () => {
  it.each([
    ["transparent", { r: 0, g: 0, b: 0, alpha: 0 }, { left: 123, top: 45, width: 300, height: 200 }],
    ["white", { r: 255, g: 255, b: 255, alpha: 1 }, { left: 0, top: 799 - 9, width: 1000, height: 10 }],
    ["near-white", { r: 250, g: 250, b: 248, alpha: 1 }, { left: 517, top: 3, width: 1, height: 1 }],
  ])("trims %s margins exactly", async (_label, background, rect) => {
    const png = await rectOn(background, rect);
    const result = await analyzeArtwork(png, { name: "art.png", type: "image/png" });
    expect(result.ok).toBe(true);
    if (result.ok) {
      expect(result.analysis.ink).toEqual(rect);
      expect(result.analysis.widthPx).toBe(1000);
    }
  });

  it("finds no ink in a blank image and says so", async () => {
    const blank = await sharp({ create: { width: 50, height: 50, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } }).png().toBuffer();
    expect(await analyzeArtwork(blank, { name: "blank.png", type: "image/png" })).toEqual({ ok: false, message: expect.stringMatching(/blank/) });
  });

  it("scans raw pixels the same way in findInk", () => {
    const w = 5;
    const h = 4;
    const data = Buffer.alloc(w * h * 4, 255);
    data[(2 * w + 3) * 4] = 0; // one dark-ish pixel at (3, 2)
    expect(findInk(data, w, h, false)).toEqual({ left: 3, top: 2, width: 1, height: 1 });
  });
});

describe("colours and shape", () => {
  it("counts three flat spot colours as three", async () => {
    const bar = (colour: string) => sharp({ create: { width: 100, height: 300, channels: 3, background: colour } }).png().toBuffer();
    const png = await sharp({ create: { width: 300, height: 300, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } })
      .composite([
        { input: await bar("#d62828"), left: 0, top: 0 },
        { input: await bar("#003049"), left: 100, top: 0 },
        { input: await bar("#fcbf49"), left: 200, top: 0 },
      ])
      .png()
      .toBuffer();
    const result = await analyzeArtwork(png, { name: "flag.png", type: "image/png" });
    expect(result.ok && result.analysis.colourCount).toBe(3);
    expect(result.ok && result.analysis.continuousTone).toBe(false);
  });

  it("calls a disc round and a banner wide", async () => {
    const disc = Buffer.from(`<svg xmlns="http://www.w3.org/2000/svg" width="600" height="600"><circle cx="300" cy="300" r="300" fill="#123"/></svg>`);
    const banner = Buffer.from(`<svg xmlns="http://www.w3.org/2000/svg" width="900" height="300"><rect width="900" height="300" fill="#123"/></svg>`);
    const d = await analyzeArtwork(disc, { name: "disc.svg", type: "image/svg+xml" });
    const b = await analyzeArtwork(banner, { name: "banner.svg", type: "image/svg+xml" });
    expect(d.ok && d.analysis.shape).toBe("round");
    expect(b.ok && b.analysis.shape).toBe("wide");
    expect(d.ok && d.analysis.isVector).toBe(true);
  });

  it("makes a preview no larger than 2048 px on the long side, and a thumbnail", async () => {
    const big = await sharp({ create: { width: 3000, height: 1500, channels: 3, background: "#335577" } }).png().toBuffer();
    const result = await analyzeArtwork(big, { name: "big.png", type: "image/png" });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(Math.max(result.analysis.previewWidth, result.analysis.previewHeight)).toBe(2048);
    const thumb = await sharp(result.analysis.thumbnail).metadata();
    expect(Math.max(thumb.width!, thumb.height!)).toBe(256);
  });
});

describe("PDF art", () => {
  it("renders a single-page PDF and finds its ink", async () => {
    const pdf = await PDFDocument.create();
    const page = pdf.addPage([612, 792]); // US Letter in PDF units (ISO 32000: 72 per inch)
    page.drawRectangle({ x: 72, y: 72, width: 144, height: 72, color: rgb(0.1, 0.2, 0.6) });
    const result = await analyzeArtwork(Buffer.from(await pdf.save()), { name: "logo.pdf", type: "application/pdf" });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    // 2 in × 1 in of ink rendered at 300 ppi.
    expect(result.analysis.ink.width).toBeGreaterThanOrEqual(599);
    expect(result.analysis.ink.width).toBeLessThanOrEqual(601);
    expect(result.analysis.ink.height).toBeGreaterThanOrEqual(299);
    expect(result.analysis.ink.height).toBeLessThanOrEqual(301);
  });

  it("refuses a PDF with more than one page", async () => {
    const pdf = await PDFDocument.create();
    pdf.addPage();
    pdf.addPage();
    const result = await analyzeArtwork(Buffer.from(await pdf.save()), { name: "two.pdf", type: "application/pdf" });
    expect(result).toEqual({ ok: false, message: expect.stringMatching(/2 pages/) });
  });
});

describe("hostile files get a clear message and nothing to store", () => {
  it("strips scripts, handlers and outside references from SVG", async () => {
    const svg = `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="100" height="100" onload="alert(1)">
      <script>alert(document.cookie)</script>
      <style>@import url(https://example.invalid/x.css); .a{stroke:url(#g)}</style>
      <image href="https://example.invalid/pixel.png" width="10" height="10"/>
      <rect class="a" width="100" height="100" fill="#0a0" onclick="steal()"/>
      <foreignObject><div xmlns="http://www.w3.org/1999/xhtml">hi</div></foreignObject>
    </svg>`;
    const result = await analyzeArtwork(Buffer.from(svg), { name: "trap.svg", type: "image/svg+xml" });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const clean = result.analysis.sanitizedSvg!;
    expect(clean).not.toMatch(/script|onload|onclick|example\.invalid|foreignObject|@import/i);
    expect(clean).toContain("url(#g)");
    expect(result.analysis.notes.join(" ")).toMatch(/Removed from the SVG.*script/);
  });

  it("keeps same-file references", () => {
    const { svg, removed } = sanitizeSvg(`<svg xmlns="http://www.w3.org/2000/svg"><defs><path id="p" d="M0 0h10"/></defs><use href="#p"/></svg>`);
    expect(svg).toContain('href="#p"');
    expect(removed.externalRefs).toBe(0);
  });

  it("refuses a pixel bomb from its header alone", async () => {
    const bomb = bombPng(50_000, 50_000);
    expect(bomb.length).toBeLessThan(2000);
    const result = await analyzeArtwork(bomb, { name: "tiny.png", type: "image/png" });
    expect(result).toEqual({ ok: false, message: expect.stringMatching(/50,000 × 50,000 pixels .*over the 100 megapixel limit/) });
  });

  it("refuses a file whose name claims one type but whose bytes are another", async () => {
    const jpeg = await sharp({ create: { width: 10, height: 10, channels: 3, background: "#abcdef" } }).jpeg().toBuffer();
    const result = await analyzeArtwork(jpeg, { name: "logo.png", type: "image/png" });
    expect(result).toEqual({ ok: false, message: expect.stringMatching(/named as a PNG image but its contents are a JPEG image/) });
  });

  it("refuses a truncated PNG", async () => {
    const png = await sharp({ create: { width: 400, height: 400, channels: 3, background: "#88aa22" } }).composite([{ input: Buffer.from(`<svg xmlns="http://www.w3.org/2000/svg" width="400" height="400"><circle cx="200" cy="200" r="150" fill="#000"/></svg>`) }]).png({ compressionLevel: 0 }).toBuffer();
    const result = await analyzeArtwork(png.subarray(0, Math.floor(png.length / 2)), { name: "cut.png", type: "image/png" });
    expect(result).toEqual({ ok: false, message: expect.stringMatching(/incomplete or damaged|damaged or cut short/) });
  });

  it("refuses a zero-byte file", async () => {
    expect(await analyzeArtwork(Buffer.alloc(0), { name: "empty.png", type: "image/png" })).toEqual({ ok: false, message: expect.stringMatching(/empty/) });
  });

  it("refuses a file over the 64 MB limit before reading it", async () => {
    const result = await analyzeArtwork(Buffer.alloc(MAX_UPLOAD_BYTES + 1), { name: "huge.png", type: "image/png" });
    expect(result).toEqual({ ok: false, message: expect.stringMatching(/limit is 64 MB/) });
  });

  it("refuses files that are not images", async () => {
    const result = await analyzeArtwork(Buffer.from("PK\u0003\u0004 not really a zip but close enough"), { name: "art.zip", type: "application/zip" });
    expect(result.ok).toBe(false);
  });
});
