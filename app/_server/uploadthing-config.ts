import "server-only";
import { appUrl } from "./config";

/**
 * Options for the upload SDK, shared by the route handler (`createRouteHandler({ config })`)
 * and `new UTApi(...)`.
 *
 * - With UPLOADTHING_FAKE_URL set (our scripts start a local fake of the upload service and set
 *   it, together with a matching UPLOADTHING_TOKEN), everything points at the fake: ingest and
 *   API requests, the callback URL, and file URLs.
 * - Otherwise nothing is overridden and the SDK uses the real service with UPLOADTHING_TOKEN.
 *
 * `isDev` is always false with the fake: the SDK then registers the route with a callback URL
 * and the fake calls the app back directly (the production flow), and the route handler awaits
 * onUploadComplete before answering. The SDK would otherwise switch to its dev-stream mode
 * whenever NODE_ENV is "development" (i.e. under `next dev`).
 */
export type UploadthingConfig = {
  token?: string;
  ingestUrl?: string;
  apiUrl?: string;
  isDev?: boolean;
  callbackUrl?: string;
  logFormat?: "json" | "logFmt" | "structured" | "pretty";
  ufsHost?: string;
  ufsAppIdLocation?: "subdomain" | "path";
};

/** Base URL of the local upload fake, or null when the real service is used. */
export function uploadsFakeUrl(): string | null {
  const url = process.env.UPLOADTHING_FAKE_URL?.trim();
  return url ? url.replace(/\/+$/, "") : null;
}

export function uploadthingConfig(): UploadthingConfig | undefined {
  const fake = uploadsFakeUrl();
  if (!fake) return undefined;
  let port: string;
  try {
    port = new URL(fake).port;
  } catch {
    throw new Error(`UPLOADTHING_FAKE_URL is not a URL: ${fake}`);
  }
  const config: UploadthingConfig = {
    ingestUrl: fake,
    apiUrl: fake,
    isDev: false,
    callbackUrl: `${appUrl()}/api/uploadthing`,
    // Only used by UTApi.generateSignedURL, which picks plain http for hosts containing "local".
    ufsHost: `localhost:${port}`,
    ufsAppIdLocation: "path",
  };
  // Keys are only set when they have a value: the SDK reads missing ones from UPLOADTHING_* variables.
  if (process.env.UPLOADTHING_TOKEN) config.token = process.env.UPLOADTHING_TOKEN;
  if (!process.env.UPLOADTHING_LOG_FORMAT) config.logFormat = "pretty";
  return config;
}
