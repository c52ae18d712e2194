import { NextResponse, type NextRequest } from "next/server";
import { createRouteHandler } from "uploadthing/next";
import { z } from "zod";
import { uploadthingConfig } from "@/app/_server/uploadthing-config";
import { parseInput, readJson } from "@/lib/input";
import { authorizeArtworkUpload, ourFileRouter } from "./core";

const handlers = createRouteHandler({ router: ourFileRouter, config: uploadthingConfig() });

export const GET = handlers.GET;

const DENIED_STATUS = { anonymous: 401, forbidden: 403, "not-found": 404 } as const;

/** What the browser SDK sends to start an upload; anything else is refused before the SDK reads it. */
const uploadRequestSchema = z.object({
  files: z
    .array(
      z.object({
        name: z.string().min(1).max(1024),
        size: z.number().int().min(0).max(Number.MAX_SAFE_INTEGER),
        type: z.string().max(255),
        lastModified: z.number().finite().optional(),
        customId: z.string().max(255).nullish(),
      }),
    )
    .min(1)
    .max(50),
  input: z.unknown(),
});

/**
 * Upload requests from the browser are authorised here, in the request's own context, before the
 * SDK sees them (see authorizeArtworkUpload). Callbacks from the upload service carry no session
 * and are verified by the SDK through their signature.
 */
export async function POST(req: NextRequest): Promise<Response> {
  const url = new URL(req.url);
  if (url.searchParams.get("actionType") === "upload" && !req.headers.has("uploadthing-hook")) {
    const request = parseInput(uploadRequestSchema, await readJson(req.clone()));
    if (!request.success) return NextResponse.json({ message: "That upload request could not be read." }, { status: 400 });
    const input = request.data.input;
    const shopSlug = input && typeof input === "object" ? (input as { shopSlug?: unknown }).shopSlug : undefined;
    if (typeof shopSlug === "string" && shopSlug.length > 0 && shopSlug.length <= 80) {
      const access = await authorizeArtworkUpload(req, shopSlug);
      // The SDK knows no "sign in" or "not found" error, so a refusal is answered here, in its error shape.
      if (access.kind !== "ok") return NextResponse.json({ message: access.message }, { status: DENIED_STATUS[access.kind] });
    }
  }
  return handlers.POST(req);
}
