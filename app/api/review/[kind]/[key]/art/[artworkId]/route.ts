import { NextResponse } from "next/server";
import { isRecordId, resolveReview } from "@/app/_server/review";
import { getArtworkImage } from "@/db/queries/artworks";
import { latestRevision } from "@/db/queries/review";

export const dynamic = "force-dynamic";

/** Art previews for reviewers, limited to art that is on the proof they may see. */
export async function GET(request: Request, { params }: { params: Promise<{ kind: string; key: string; artworkId: string }> }) {
  const { kind, key, artworkId } = await params;
  if (!isRecordId(artworkId)) return NextResponse.json({ error: "Not found." }, { status: 404 });
  const access = await resolveReview(kind, key);
  if (!access.ok) return NextResponse.json({ error: access.message }, { status: access.status });
  const revision = await latestRevision({ proofId: access.reviewer.proofId });
  const placed = revision?.snapshot.placements.some((p) => p.artworkId === artworkId);
  if (!placed && access.reviewer.kind !== "shop") return NextResponse.json({ error: "Not found." }, { status: 404 });
  // ?size=small: the 256 px copy the page shows first on a slow connection; otherwise the full preview.
  const small = new URL(request.url).searchParams.get("size") === "small";
  const image = await getArtworkImage({ shopId: access.reviewer.shopId, artworkId, variant: small ? "thumbnail" : "preview" });
  if (!image) return NextResponse.json({ error: "Not found." }, { status: 404 });
  const headers = { "Cache-Control": "private, max-age=600", "X-Content-Type-Options": "nosniff" };
  if (image.data) return new NextResponse(new Uint8Array(image.data), { headers: { ...headers, "Content-Type": "image/webp" } });
  if (image.svg) return new NextResponse(image.svg, { headers: { ...headers, "Content-Type": "image/svg+xml; charset=utf-8", "Content-Security-Policy": "default-src 'none'; style-src 'unsafe-inline'; img-src data:" } });
  return NextResponse.json({ error: "Not found." }, { status: 404 });
}
