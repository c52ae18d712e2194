import { NextResponse } from "next/server";
import { z } from "zod";
import { getActor } from "@/app/_server/access";
import { artSentToClients, artworkShop, getArtworkImage } from "@/db/queries/artworks";
import { can } from "@/lib/access";
import { parseInput } from "@/lib/input";

export const dynamic = "force-dynamic";

const paramsSchema = z.object({ id: z.string().min(1).max(80), variant: z.enum(["preview", "thumbnail", "svg"]) });
const notFound = () => NextResponse.json({ error: "Not found." }, { status: 404 });

/** The drawing preview, the thumbnail, or the sanitised SVG of one artwork, for people who may see it. */
export async function GET(_request: Request, { params }: { params: Promise<{ id: string; variant: string }> }) {
  const parsed = parseInput(paramsSchema, await params);
  if (!parsed.success) return notFound();
  const actor = await getActor();
  if (!actor) return NextResponse.json({ error: "Sign in to continue." }, { status: 401 });
  const owner = await artworkShop({ artworkId: parsed.data.id });
  if (!owner) return notFound();
  const member = actor.memberships.find((m) => m.shopId === owner.shopId);
  if (!(member && can(member.role, "jobs.view"))) {
    // A client sees art filed under their own record, or art placed on a revision sent to them; never the shop's other art.
    const mine = actor.contacts.filter((c) => c.shopId === owner.shopId).map((c) => c.clientId);
    const filedUnderMine = owner.clientId !== null && mine.includes(owner.clientId);
    if (!filedUnderMine && !(await artSentToClients({ artworkId: parsed.data.id, clientIds: mine }))) return notFound();
  }

  const image = await getArtworkImage({ shopId: owner.shopId, artworkId: parsed.data.id, variant: parsed.data.variant === "thumbnail" ? "thumbnail" : "preview" });
  if (!image) return notFound();
  const headers = { "Cache-Control": "private, max-age=3600", "X-Content-Type-Options": "nosniff" };
  if (parsed.data.variant === "svg") {
    if (!image.svg) return notFound();
    return new NextResponse(image.svg, {
      headers: { ...headers, "Content-Type": "image/svg+xml; charset=utf-8", "Content-Security-Policy": "default-src 'none'; style-src 'unsafe-inline'; img-src data:" },
    });
  }
  if (!image.data) {
    if (!image.svg) return notFound();
    return new NextResponse(image.svg, { headers: { ...headers, "Content-Type": "image/svg+xml; charset=utf-8", "Content-Security-Policy": "default-src 'none'; style-src 'unsafe-inline'; img-src data:" } });
  }
  return new NextResponse(new Uint8Array(image.data), { headers: { ...headers, "Content-Type": "image/webp", "Content-Length": String(image.data.length) } });
}
