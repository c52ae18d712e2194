import { generateReactHelpers } from "@uploadthing/react";
import type { OurFileRouter } from "@/app/api/uploadthing/core";

/**
 * Typed upload helpers for the browser. `useUploadThing("artwork", opts).startUpload(files,
 * { shopSlug, clientId })` asks /api/uploadthing for presigned URLs, PUTs each file to the upload
 * service (a local fake in dev/tests) and resolves with one result per file; each result's
 * `serverData` is `{ artworkId }` or `{ error }` (see ArtworkServerData).
 */
export const { useUploadThing, uploadFiles } = generateReactHelpers<OurFileRouter>({ url: "/api/uploadthing" });
