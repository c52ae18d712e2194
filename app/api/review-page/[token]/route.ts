import { keptReviewPage } from "@/app/_server/review-page-cache";
import { KEPT_HEADER, keptPageKeys } from "@/lib/kept-pages";

export const dynamic = "force-dynamic";

const notFound = () => new Response("Not found.", { status: 404, headers: { "content-type": "text/plain; charset=utf-8" } });

/**
 * A review link's page from the copy kept for its current state. Reached only through proxy.ts,
 * which rewrites plain visits to `/r/<token>` here with the render key and that request's nonce
 * (and puts the same nonce in the answer's policy); called any other way, it is not found.
 */
export async function GET(request: Request, { params }: { params: Promise<{ token: string }> }) {
  const keys = keptPageKeys(process.env);
  const nonce = request.headers.get("x-nonce");
  if (!keys || request.headers.get(KEPT_HEADER) !== keys.render || !nonce || !/^[A-Za-z0-9+/=]{16,64}$/.test(nonce)) return notFound();
  const { token } = await params;
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return notFound();
  try {
    return await keptReviewPage(keys, token, nonce);
  } catch (error) {
    // The page itself still works: send the visitor to its rendered form (a query is never kept).
    console.error("[review-page]", error instanceof Error ? error.message : error);
    return new Response(null, { status: 307, headers: { location: `/r/${token}?view=fresh` } });
  }
}
