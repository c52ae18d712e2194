/**
 * What the browser and load measurements need in the freshly seeded test database: a 6000 × 6000 px
 * PNG analysed like an upload and placed on the demo team tee proof, that revision sent, and a
 * client share link to it. Goes through the app's own analysis and query functions.
 */
import sharp from "sharp";
import { DEMO_ACCOUNTS, DEMO_SHOP } from "../../db/demo";

export const BIG_ART_PX = 6000;

export type BenchFixture = {
  shopSlug: string;
  proofId: string;
  artworkId: string;
  /** The share token in clear; only its hash is stored. */
  reviewToken: string;
  designerEmail: string;
  pngBytes: number;
  previewPx: { width: number; height: number };
};

/** A 6000 × 6000 RGBA PNG: coloured bands inside a round, soft-edged ink area on a transparent ground. */
async function bigArtPng(): Promise<Buffer> {
  const n = BIG_ART_PX;
  const pixels = Buffer.alloc(n * n * 4);
  const c = n / 2;
  const r2 = (n * 0.46) ** 2;
  for (let y = 0; y < n; y += 1) {
    const dy = y - c;
    for (let x = 0; x < n; x += 1) {
      const dx = x - c;
      const i = (y * n + x) * 4;
      pixels[i] = (x >> 3) & 255;
      pixels[i + 1] = (y >> 4) & 255;
      pixels[i + 2] = ((x + y) >> 5) & 255;
      pixels[i + 3] = dx * dx + dy * dy < r2 ? 255 : 0;
    }
  }
  return sharp(pixels, { raw: { width: n, height: n, channels: 4 } }).png({ compressionLevel: 3 }).toBuffer();
}

export async function createBenchFixture(log: (line: string) => void): Promise<BenchFixture> {
  const { analyzeArtwork } = await import("../../app/_server/artwork/analyze");
  const { artworkColumns } = await import("../../app/_server/artwork/ingest");
  const { insertUploadedArtwork } = await import("../../db/queries/artworks");
  const { findShopBySlug } = await import("../../db/queries/access");
  const { findUserByEmail } = await import("../../db/queries/users");
  const { listJobPage } = await import("../../db/queries/jobs");
  const { DEFAULT_JOB_LIST } = await import("../../lib/job-list");
  const { getProofDocument, listProofsForJob, saveProof } = await import("../../db/queries/proofs");
  const { createShareLink, sendRevision } = await import("../../db/queries/review");

  const designerEmail = DEMO_ACCOUNTS.find((a) => a.role === "designer")!.email;
  const clientAccount = DEMO_ACCOUNTS.find((a) => a.role === "client")!;
  const shop = await findShopBySlug({ slug: DEMO_SHOP.slug });
  const designer = await findUserByEmail({ email: designerEmail });
  if (!shop || !designer) throw new Error("the demo shop or its designer is missing from the test database");
  const job = (await listJobPage({ shopId: shop.id, query: { ...DEFAULT_JOB_LIST, q: "Spring season team tees" } })).rows.find((j) => j.title === "Spring season team tees");
  const proofRow = job && (await listProofsForJob({ shopId: shop.id, jobId: job.id })).find((p) => p.name === "Team tee");
  if (!job || !proofRow) throw new Error("the demo team tee proof is missing from the test database");

  log(`making a ${BIG_ART_PX} × ${BIG_ART_PX} px PNG and analysing it like an upload…`);
  const png = await bigArtPng();
  const analysed = await analyzeArtwork(png, { name: "bench-6000.png", type: "image/png" });
  if (!analysed.ok) throw new Error(`the bench art was refused: ${analysed.message}`);
  const a = analysed.analysis;
  // No original in upload storage: the editor and the review page only ever draw the stored preview.
  const artworkId = await insertUploadedArtwork({
    ...artworkColumns(a),
    shopId: shop.id,
    clientId: job.clientId,
    name: "Bench 6000 px art",
    fileKey: null,
    fileUrl: null,
    uploadedBy: designer.id,
  });

  const before = await getProofDocument({ shopId: shop.id, proofId: proofRow.id });
  if (!before) throw new Error("the demo team tee proof could not be read back");
  const widthIn = 11;
  const placed = before.placements.map((p, i) =>
    i === 0 ? { ...p, artworkId, widthIn, heightIn: widthIn * (a.ink.height / a.ink.width), offsetFromCenterIn: 0, belowCollarIn: 3, rotationDeg: 0 } : p,
  );
  const saved = await saveProof({
    shopId: shop.id,
    proofId: proofRow.id,
    baseVersion: before.proof.version,
    size: before.proof.size,
    colourName: before.proof.colourName,
    colourHex: before.proof.colourHex,
    placements: placed,
    userId: designer.id,
  });
  if (saved.kind !== "saved") throw new Error(`placing the bench art on the proof did not save (${saved.kind})`);
  const document = await getProofDocument({ shopId: shop.id, proofId: proofRow.id });
  await sendRevision({ document: document!, userId: designer.id });
  const { token } = await createShareLink({
    shopId: shop.id,
    proofId: proofRow.id,
    permission: "approve",
    expiresAt: null,
    recipientEmail: clientAccount.email,
    recipientName: clientAccount.name,
    createdBy: designer.id,
  });
  return {
    shopSlug: shop.slug,
    proofId: proofRow.id,
    artworkId,
    reviewToken: token,
    designerEmail,
    pngBytes: png.length,
    previewPx: { width: a.previewWidth, height: a.previewHeight },
  };
}
