import "server-only";
import { createUploadthing, type FileRouter } from "uploadthing/next";
import { UploadThingError } from "uploadthing/server";
import { z } from "zod";
import { resolveShopAccess, type AccessResult } from "@/app/_server/access";
import { ingestUploadedArtwork } from "@/app/_server/artwork/ingest";
import { listClients } from "@/db/queries/clients";

const f = createUploadthing();

/** At most this many files per upload, whatever their types (the SDK's own count is per type). */
export const ARTWORK_MAX_FILES = 10;

const perType = { maxFileSize: "64MB", maxFileCount: ARTWORK_MAX_FILES } as const;

export const artworkUploadInput = z.object({
  shopSlug: z.string().min(1).max(80),
  clientId: z.string().max(80).nullable().optional(),
});

const grants = new WeakMap<Request, Map<string, Promise<AccessResult>>>();

/**
 * Whether the signed-in person may add art to the shop, resolved once per request and shop.
 *
 * The route handler calls this before handing the request to the SDK, because the SDK runs
 * `.middleware()` on its own scheduler, where the request-scoped session lookup (cookies) is not
 * guaranteed to see this request. The middleware then reuses the answer for the same Request.
 */
export function authorizeArtworkUpload(req: Request, shopSlug: string): Promise<AccessResult> {
  let bySlug = grants.get(req);
  if (!bySlug) {
    bySlug = new Map();
    grants.set(req, bySlug);
  }
  let result = bySlug.get(shopSlug);
  if (!result) {
    result = resolveShopAccess(shopSlug, "proofs.edit");
    bySlug.set(shopSlug, result);
  }
  return result;
}

export type ArtworkServerData = { artworkId: string } | { error: string };

export const ourFileRouter = {
  artwork: f({
    "image/png": perType,
    "image/jpeg": perType,
    "image/webp": perType,
    "image/svg+xml": perType,
    "application/pdf": perType,
  })
    .input(artworkUploadInput)
    .middleware(async ({ req, input, files }) => {
      if (files.length > ARTWORK_MAX_FILES) {
        throw new UploadThingError({ code: "TOO_MANY_FILES", message: `Upload at most ${ARTWORK_MAX_FILES} files at a time.` });
      }
      const result = await authorizeArtworkUpload(req, input.shopSlug);
      if (result.kind !== "ok") throw new UploadThingError({ code: "FORBIDDEN", message: result.message });
      const shopId = result.access.shop.id;
      const clientId = input.clientId ?? null;
      if (clientId) {
        const clients = await listClients({ shopId });
        if (!clients.some((c) => c.id === clientId)) {
          throw new UploadThingError({ code: "FORBIDDEN", message: "That client is not one of this shop's clients." });
        }
      }
      return { shopId, userId: result.access.actor.id, clientId };
    })
    .onUploadComplete(async ({ metadata, file }): Promise<ArtworkServerData> => {
      const result = await ingestUploadedArtwork({
        fileUrl: file.ufsUrl,
        fileKey: file.key,
        name: file.name,
        size: file.size,
        declaredType: file.type || null,
        shopId: metadata.shopId,
        userId: metadata.userId,
        clientId: metadata.clientId,
      });
      return result.ok ? { artworkId: result.artworkId } : { error: result.message };
    }),
} satisfies FileRouter;

export type OurFileRouter = typeof ourFileRouter;
