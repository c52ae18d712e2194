/**
 * Local fake of the hosted upload service that the `uploadthing` SDK talks to.
 *
 * The app keeps using the real SDK (route handler, browser client, UTApi); in development and
 * tests the SDK's `ingestUrl` and `apiUrl` point here, so nothing leaves the machine.
 * Everything below follows what the SDK in node_modules actually sends and expects.
 *
 * One HTTP server on 127.0.0.1:<port> (node:http only) serves four groups of endpoints.
 *
 * Ingest (what the SDK's route handler and its browser/server clients call):
 *   POST /route-metadata          header x-uploadthing-api-key; body
 *                                 {fileKeys, metadata, isDev, callbackUrl, callbackSlug, awaitServerData}.
 *                                 isDev=false: answers {"ok":true}. isDev=true: keeps the response open
 *                                 and streams one JSON line {payload, signature, hook} per finished file
 *                                 (the SDK forwards each line to the app itself), then ends.
 *   HEAD /<fileKey>?<presigned>   signature checked; answers header x-ut-range-start = bytes already
 *                                 received (0, a partial upload's length, or the size when complete).
 *   PUT  /<fileKey>?<presigned>   signature + expiry checked (403 JSON on failure), `Range: bytes=N-`
 *                                 honoured (resume), body is multipart/form-data with a part named
 *                                 "file" (a raw body is accepted too). More bytes than the signed
 *                                 x-ut-file-size -> 413. Stored as <dir>/<key> + <dir>/<key>.json.
 *                                 Then the app's callback is delivered (see below) and, when the route
 *                                 awaits server data, the answer waits for the app's callback result:
 *                                 {key, name, size, type, url, appUrl, ufsUrl, fileHash, serverData}.
 *                                 A failed callback answers 200 {"error": "..."} (the browser client
 *                                 turns a body with `error` into an UPLOAD_FAILED error).
 *   POST /callback-result         header x-uploadthing-api-key; body {fileKey, callbackData} or
 *                                 {fileKey, error}; answers {"ok":true}.
 *
 * Callback to the app (production style, isDev=false):
 *   POST <callbackUrl>?slug=<callbackSlug>
 *     content-type: application/json
 *     uploadthing-hook: callback            ("error" for failed uploads, body {fileKey, error})
 *     x-uploadthing-signature: hmac-sha256=<hex HMAC-SHA256 of the raw body, keyed by the apiKey>
 *     body {status:"uploaded", metadata, origin:<this server>, file:{name, size, type, customId,
 *           key, url, appUrl, ufsUrl, fileHash}}
 *   The app runs onUploadComplete and POSTs its result to <origin>/callback-result.
 *   Only loopback callback hosts are accepted, so the fake can never reach the internet.
 *
 * Files:
 *   GET|HEAD /f/<key>             the stored bytes (content-type, content-length, single Range).
 *   GET|HEAD /a/<appId>/<key>     same (the form UTApi.generateSignedURL builds with
 *                                 ufsAppIdLocation "path"). Files with acl "private" need a valid
 *                                 `expires` + `signature` pair, as made by UTApi.generateSignedURL.
 *
 * UTApi (POST, header x-uploadthing-api-key): /v6/deleteFiles, /v6/getFileUrl, /v6/listFiles,
 *   /v6/renameFiles, /v6/updateACL, /v6/getUsageInfo, /v6/requestFileAccess.
 *
 * Other: GET /health -> {"ok":true,"files":N}; GET /files -> stored file records, newest first.
 * Every response carries permissive CORS headers (the browser PUTs from the app's origin).
 *
 *   tsx scripts/fakes/uploadthing.ts [--test]   runs until SIGINT/SIGTERM
 */
import { closeOnSignals, listenOnLoopback, trackSockets } from "../lib/loopback";
import { createHash, createHmac, randomBytes, randomUUID, timingSafeEqual } from "node:crypto";
import { createReadStream, createWriteStream, existsSync, mkdirSync, readFileSync, writeFileSync, type WriteStream } from "node:fs";
import fs from "node:fs/promises";
import http from "node:http";
import type { Socket } from "node:net";
import path from "node:path";
import { isMain, repoRoot, stderrLogger, type LogFn } from "../lib/proc";

// ---------------------------------------------------------------------------
// Defaults shared with other scripts
// ---------------------------------------------------------------------------

export interface UploadsTarget {
  port: number;
  /** Folder the uploaded files are stored in. */
  dir: string;
}

export const DEV_UPLOADS: Readonly<UploadsTarget> = Object.freeze({
  port: 2620,
  dir: path.join(repoRoot, ".data", "uploads"),
});

export const TEST_UPLOADS: Readonly<UploadsTarget> = Object.freeze({
  port: 2630,
  dir: path.join(repoRoot, ".data", "uploads-test"),
});

/** App id used with the fake; any string works, the SDK only uses it in keys and signed params. */
export const FAKE_APP_ID = "chalkline-local";

const HOST = "127.0.0.1";
const SIGNATURE_PREFIX = "hmac-sha256=";
const KEY_RE = /^[A-Za-z0-9_-]{1,256}$/;
const MAX_JSON_BYTES = 1024 * 1024;
/** After a file passes its signed size we keep reading (to answer cleanly) at most this much more. */
const OVERFLOW_DRAIN_BYTES = 16 * 1024 * 1024;
/** A refused request's body is read and discarded up to this size, so the client sees our answer. */
const DRAIN_LIMIT_BYTES = 160 * 1024 * 1024;
/** A PUT that arrives while the same file's previous PUT is still winding down waits this long. */
const TAKEOVER_WAIT_MS = 5_000;
const MAX_PART_HEADER_BYTES = 16 * 1024;

/**
 * The UPLOADTHING_TOKEN value for the fake: base64 of the JSON the SDK decodes
 * ({apiKey, appId, regions, ingestHost}; apiKey must start with "sk_").
 */
export function fakeToken({ apiKey, appId, ingestHost }: { apiKey: string; appId: string; ingestHost: string }): string {
  return Buffer.from(JSON.stringify({ apiKey, appId, regions: ["local"], ingestHost }), "utf8").toString("base64");
}

/** A stable apiKey for the fake, generated once into .data/uploadthing-key (never committed). */
export function fakeApiKey(): string {
  const dir = path.join(repoRoot, ".data");
  mkdirSync(dir, { recursive: true, mode: 0o755 });
  const file = path.join(dir, "uploadthing-key");
  if (existsSync(file)) {
    const stored = readFileSync(file, "utf8").trim();
    if (stored.startsWith("sk_")) return stored;
  }
  const key = `sk_fake_${randomBytes(24).toString("hex")}`;
  writeFileSync(file, `${key}\n`, { mode: 0o600 });
  return key;
}

/**
 * Environment for an app that should use the fake. The SDK reads the UPLOADTHING_* variables
 * itself (so a bare `new UTApi()` works too); app/_server/uploadthing-config.ts passes the
 * same values explicitly to the route handler.
 */
export function fakeUploadsEnv(opts: { url: string; apiKey: string; appId: string; appUrl: string }): Record<string, string> {
  const url = opts.url.replace(/\/$/, "");
  const { host, port } = new URL(url);
  return {
    UPLOADTHING_FAKE_URL: url,
    UPLOADTHING_TOKEN: fakeToken({ apiKey: opts.apiKey, appId: opts.appId, ingestHost: host }),
    UPLOADTHING_INGEST_URL: url,
    UPLOADTHING_API_URL: url,
    UPLOADTHING_IS_DEV: "false",
    UPLOADTHING_CALLBACK_URL: `${opts.appUrl.replace(/\/$/, "")}/api/uploadthing`,
    // UTApi.generateSignedURL uses plain http only for hosts containing "local".
    UPLOADTHING_UFS_HOST: `localhost:${port}`,
    UPLOADTHING_UFS_APP_ID_LOCATION: "path",
  };
}

// ---------------------------------------------------------------------------
// Types
// ---------------------------------------------------------------------------

export interface StoredUpload {
  key: string;
  id: string;
  name: string;
  size: number;
  type: string;
  customId: string | null;
  acl: "public-read" | "private";
  contentDisposition: "inline" | "attachment";
  /** md5 (hex) of the bytes. */
  fileHash: string;
  /** ms since epoch */
  uploadedAt: number;
  slug: string | null;
}

export interface UploadthingFakeOptions extends UploadsTarget {
  apiKey: string;
  appId: string;
  log?: LogFn;
  /** How long a finished upload waits for the app's callback + result (default 120 s). */
  callbackTimeoutMs?: number;
  /** How long a finished upload with a slug waits for its route metadata to arrive (default 10 s). */
  metadataWaitMs?: number;
}

export interface UploadthingFake {
  close(): Promise<void>;
  /** Base URL, e.g. http://127.0.0.1:2620 */
  readonly url: string;
  readonly port: number;
  /** Stored files, newest first. */
  list(): StoredUpload[];
}

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

interface RouteRecord {
  key: string;
  callbackUrl: string;
  callbackSlug: string;
  metadata: Json;
  isDev: boolean;
  awaitServerData: boolean;
  /** Base URL the app reached us at; sent as `origin` so it posts its result back here. */
  origin: string;
  registeredAt: number;
  stream: DevStream | null;
}

interface DevStream {
  res: http.ServerResponse;
  remaining: Set<string>;
  open: boolean;
  timer: NodeJS.Timeout;
}

type CallbackOutcome = { ok: true; data: Json } | { ok: false; error: string };

interface SignedParams {
  appId: string;
  name: string;
  size: number;
  type: string;
  slug: string | null;
  customId: string | null;
  contentDisposition: "inline" | "attachment";
  acl: "public-read" | "private";
}

class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

class ClientGone extends Error {}

// ---------------------------------------------------------------------------
// Signing (the SDK's scheme: HMAC-SHA256 keyed by the apiKey, hex, "hmac-sha256=" prefix)
// ---------------------------------------------------------------------------

export function signPayload(payload: string, apiKey: string): string {
  return SIGNATURE_PREFIX + createHmac("sha256", apiKey).update(payload, "utf8").digest("hex");
}

function safeEqual(a: string, b: string): boolean {
  const x = Buffer.from(a, "utf8");
  const y = Buffer.from(b, "utf8");
  return x.length === y.length && timingSafeEqual(x, y);
}

/** Signs a URL the way the SDK does: `expires` (ms) first, then `signature` over the whole URL. */
function signUrl(url: string, apiKey: string, ttlSeconds: number): string {
  const u = new URL(url);
  u.searchParams.append("expires", String(Date.now() + ttlSeconds * 1000));
  u.searchParams.append("signature", signPayload(u.toString(), apiKey));
  return u.href;
}

/**
 * Checks `signature` (and `expires`) of a request URL. The SDK signs the full URL string as it
 * built it (origin + path + query without `signature`), so we rebuild it from the Host header.
 */
function checkUrlSignature(req: http.IncomingMessage, apiKey: string): URLSearchParams {
  const host = req.headers.host;
  if (!host) throw new HttpError(400, "Missing Host header");
  const raw = req.url ?? "/";
  let u: URL;
  try {
    u = new URL(raw, `http://${host}`);
  } catch {
    throw new HttpError(400, "Malformed URL");
  }
  const signature = u.searchParams.get("signature");
  if (!signature) throw new HttpError(403, "Missing signature");
  const candidates = new Set<string>();
  const canonical = new URL(u.href);
  canonical.searchParams.delete("signature");
  candidates.add(canonical.toString());
  const cut = raw.search(/[?&]signature=/);
  if (cut >= 0) candidates.add(`http://${host}${raw.slice(0, cut)}`);
  const valid = [...candidates].some((c) => safeEqual(signPayload(c, apiKey), signature));
  if (!valid) throw new HttpError(403, "Invalid signature");
  const expires = Number(u.searchParams.get("expires"));
  if (!Number.isFinite(expires)) throw new HttpError(403, "Missing or invalid expires");
  if (Date.now() > expires) throw new HttpError(403, "The presigned URL has expired");
  return u.searchParams;
}

/** The SDK encodes each x-ut-* value with encodeURIComponent before adding it to the query. */
function signedValue(params: URLSearchParams, name: string): string | null {
  const v = params.get(name);
  if (v === null) return null;
  try {
    return decodeURIComponent(v);
  } catch {
    throw new HttpError(400, `Malformed ${name}`);
  }
}

function readSignedParams(params: URLSearchParams, appId: string): SignedParams {
  const identifier = signedValue(params, "x-ut-identifier");
  if (identifier !== appId) throw new HttpError(403, "The presigned URL was made for another app");
  const sizeRaw = signedValue(params, "x-ut-file-size");
  const size = Number(sizeRaw);
  if (sizeRaw === null || !Number.isSafeInteger(size) || size < 0) throw new HttpError(400, "Missing or invalid x-ut-file-size");
  const cd = signedValue(params, "x-ut-content-disposition");
  const acl = signedValue(params, "x-ut-acl");
  return {
    appId,
    name: signedValue(params, "x-ut-file-name") ?? "file",
    size,
    type: signedValue(params, "x-ut-file-type") || "application/octet-stream",
    slug: signedValue(params, "x-ut-slug"),
    customId: signedValue(params, "x-ut-custom-id"),
    contentDisposition: cd === "attachment" ? "attachment" : "inline",
    acl: acl === "private" ? "private" : "public-read",
  };
}

// ---------------------------------------------------------------------------
// HTTP helpers
// ---------------------------------------------------------------------------

const EXPOSED_HEADERS =
  "x-ut-range-start, content-length, content-range, content-type, content-disposition, accept-ranges, etag";

function setCors(req: http.IncomingMessage, res: http.ServerResponse): void {
  res.setHeader("Access-Control-Allow-Origin", "*");
  res.setHeader("Access-Control-Expose-Headers", EXPOSED_HEADERS);
  if (req.method === "OPTIONS") {
    res.setHeader("Access-Control-Allow-Methods", "GET, HEAD, PUT, POST, OPTIONS");
    const asked = req.headers["access-control-request-headers"];
    res.setHeader(
      "Access-Control-Allow-Headers",
      typeof asked === "string" && asked.length < 2048
        ? asked
        : "range, content-type, x-uploadthing-version, x-uploadthing-api-key, b3, traceparent",
    );
    res.setHeader("Access-Control-Max-Age", "600");
    if (req.headers["access-control-request-private-network"]) res.setHeader("Access-Control-Allow-Private-Network", "true");
  }
}

function sendJson(res: http.ServerResponse, status: number, body: unknown): void {
  if (res.headersSent || res.destroyed) return;
  const text = JSON.stringify(body);
  res.writeHead(status, {
    "Content-Type": "application/json; charset=utf-8",
    "Content-Length": Buffer.byteLength(text),
    "Cache-Control": "no-store",
  });
  res.end(res.req.method === "HEAD" ? undefined : text);
}

function sendError(res: http.ServerResponse, status: number, message: string): void {
  sendJson(res, status, { error: message, message });
}

/** Reads and discards the rest of a request body (bounded), so the client can read our answer. */
async function drain(req: http.IncomingMessage, limit = DRAIN_LIMIT_BYTES): Promise<void> {
  if (req.readableEnded) return;
  let seen = 0;
  try {
    for await (const chunk of req) {
      seen += (chunk as Buffer).length;
      if (seen > limit) {
        req.destroy();
        return;
      }
    }
  } catch {
    /* client went away */
  }
}

async function readJson(req: http.IncomingMessage): Promise<unknown> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req) {
    size += (chunk as Buffer).length;
    if (size > MAX_JSON_BYTES) throw new HttpError(413, "Request body too large");
    chunks.push(chunk as Buffer);
  }
  const text = Buffer.concat(chunks).toString("utf8");
  if (!text.trim()) return {};
  try {
    return JSON.parse(text) as unknown;
  } catch {
    throw new HttpError(400, "Body is not valid JSON");
  }
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

function stringArray(v: unknown, field: string): string[] {
  if (!Array.isArray(v) || !v.every((x) => typeof x === "string")) throw new HttpError(400, `${field} must be an array of strings`);
  return v as string[];
}

function isLoopbackHost(hostname: string): boolean {
  const h = hostname.replace(/^\[|\]$/g, "").toLowerCase();
  return h === "localhost" || h.endsWith(".localhost") || h === "::1" || /^127\.\d{1,3}\.\d{1,3}\.\d{1,3}$/.test(h);
}

function parseRangeStart(header: string | undefined): number {
  if (header === undefined || header === "") return 0;
  const m = /^bytes=(\d+)-(\d*)$/.exec(header.trim());
  if (!m) throw new HttpError(400, `Unsupported Range header: ${header}`);
  const start = Number(m[1]);
  if (!Number.isSafeInteger(start)) throw new HttpError(400, `Unsupported Range header: ${header}`);
  return start;
}

function multipartBoundary(contentType: string | undefined): string | null {
  if (!contentType || !/^multipart\/form-data/i.test(contentType)) return null;
  const m = /;\s*boundary=(?:"([^"]+)"|([^;\s]+))/i.exec(contentType);
  const boundary = m?.[1] ?? m?.[2];
  if (!boundary || boundary.length > 200) throw new HttpError(400, "multipart/form-data without a usable boundary");
  return boundary;
}

function partName(headerBlock: string): string | null {
  for (const line of headerBlock.split("\r\n")) {
    const idx = line.indexOf(":");
    if (idx < 0 || line.slice(0, idx).trim().toLowerCase() !== "content-disposition") continue;
    const m = /(?:^|;)\s*name\s*=\s*(?:"([^"]*)"|([^;\s]*))/i.exec(line.slice(idx + 1));
    return m?.[1] ?? m?.[2] ?? null;
  }
  return null;
}

/**
 * Streams the part named "file" of a multipart body into `sink`, holding back only as many bytes
 * as could belong to the next delimiter. Returns whether the part was found and the body closed.
 */
async function readMultipartFile(
  body: AsyncIterable<Buffer>,
  boundary: string,
  sink: (bytes: Buffer) => Promise<void>,
): Promise<{ found: boolean; closed: boolean }> {
  const dashBoundary = Buffer.from(`--${boundary}`);
  const delimiter = Buffer.from(`\r\n--${boundary}`);
  const CRLF = Buffer.from("\r\n");
  const HEADER_END = Buffer.from("\r\n\r\n");
  let buf: Buffer = Buffer.alloc(0);
  let state: "preamble" | "boundary" | "headers" | "body" | "done" = "preamble";
  let inFile = false;
  let found = false;

  for await (const chunk of body) {
    if (state === "done") continue;
    buf = buf.length === 0 ? chunk : Buffer.concat([buf, chunk]);
    for (;;) {
      if (state === "preamble") {
        const i = buf.indexOf(dashBoundary);
        if (i < 0) {
          buf = buf.subarray(Math.max(0, buf.length - dashBoundary.length + 1));
          break;
        }
        buf = buf.subarray(i + dashBoundary.length);
        state = "boundary";
      } else if (state === "boundary") {
        if (buf.length < 2) break;
        if (buf[0] === 0x2d && buf[1] === 0x2d) {
          state = "done";
          buf = Buffer.alloc(0);
          break;
        }
        const i = buf.indexOf(CRLF);
        if (i < 0) {
          if (buf.length > 1024) throw new HttpError(400, "Malformed multipart body");
          break;
        }
        buf = buf.subarray(i + 2);
        state = "headers";
      } else if (state === "headers") {
        const i = buf.indexOf(HEADER_END);
        if (i < 0) {
          if (buf.length > MAX_PART_HEADER_BYTES) throw new HttpError(400, "Multipart part headers too long");
          break;
        }
        const name = partName(buf.subarray(0, i).toString("utf8"));
        buf = buf.subarray(i + 4);
        inFile = !found && name === "file";
        if (inFile) found = true;
        state = "body";
      } else {
        // body
        const i = buf.indexOf(delimiter);
        if (i < 0) {
          const safe = buf.length - (delimiter.length - 1);
          if (safe > 0) {
            if (inFile) await sink(buf.subarray(0, safe));
            buf = buf.subarray(safe);
          }
          break;
        }
        if (inFile) await sink(buf.subarray(0, i));
        inFile = false;
        buf = buf.subarray(i + delimiter.length);
        state = "boundary";
      }
    }
  }
  return { found, closed: state === "done" };
}

function writeChunk(out: WriteStream, bytes: Buffer): Promise<void> {
  return new Promise((resolve, reject) => {
    out.write(bytes, (err) => (err ? reject(err) : resolve()));
  });
}

function closeStream(out: WriteStream): Promise<void> {
  return new Promise((resolve) => {
    if (out.closed) return resolve();
    out.end(() => resolve());
    out.once("error", () => resolve());
  });
}

async function fileSize(p: string): Promise<number> {
  try {
    return (await fs.stat(p)).size;
  } catch {
    return 0;
  }
}

function md5File(p: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const hash = createHash("md5");
    createReadStream(p)
      .on("data", (d) => hash.update(d))
      .on("error", reject)
      .on("end", () => resolve(hash.digest("hex")));
  });
}

function contentDisposition(kind: "inline" | "attachment", name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]|["\\]/g, "_");
  return `${kind}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`;
}


function errorText(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

// ---------------------------------------------------------------------------
// The fake
// ---------------------------------------------------------------------------

export async function startUploadthingFake(opts: UploadthingFakeOptions): Promise<UploadthingFake> {
  const { apiKey, appId, dir } = opts;
  const log: LogFn = opts.log ?? (() => {});
  const callbackTimeoutMs = opts.callbackTimeoutMs ?? 120_000;
  const metadataWaitMs = opts.metadataWaitMs ?? 10_000;
  if (!apiKey.startsWith("sk_")) throw new Error("The fake's apiKey must start with sk_ (the SDK refuses other tokens)");
  mkdirSync(dir, { recursive: true, mode: 0o755 });

  const files = new Map<string, StoredUpload>();
  const routes = new Map<string, RouteRecord>();
  const metadataWaiters = new Map<string, Array<() => void>>();
  const resultWaiters = new Map<string, (outcome: CallbackOutcome) => void>();
  const earlyResults = new Map<string, CallbackOutcome>();
  const finished = new Map<string, Record<string, unknown>>();
  /** Keys with a PUT in progress, and a promise that settles when it is done. */
  const active = new Map<string, Promise<void>>();
  const streams = new Set<DevStream>();
  const sockets = new Set<Socket>();
  let baseUrl = "";

  // Files that survived a restart.
  for (const entry of await fs.readdir(dir).catch(() => [] as string[])) {
    if (!entry.endsWith(".json")) continue;
    const key = entry.slice(0, -5);
    if (!KEY_RE.test(key) || !existsSync(path.join(dir, key))) continue;
    try {
      const rec = JSON.parse(await fs.readFile(path.join(dir, entry), "utf8")) as StoredUpload;
      if (rec && rec.key === key && typeof rec.size === "number") files.set(key, rec);
    } catch {
      log(`ignoring unreadable record ${entry}`);
    }
  }

  const fileUrl = (key: string) => `${baseUrl}/f/${key}`;
  const dataPath = (key: string) => path.join(dir, key);
  const partPath = (key: string) => path.join(dir, `${key}.part`);
  const sidecarPath = (key: string) => path.join(dir, `${key}.json`);

  async function saveSidecar(rec: StoredUpload): Promise<void> {
    const tmp = path.join(dir, `.${rec.key}.${randomBytes(4).toString("hex")}.tmp`);
    await fs.writeFile(tmp, `${JSON.stringify(rec, null, 2)}\n`);
    await fs.rename(tmp, sidecarPath(rec.key));
  }

  function uploadedFileData(rec: StoredUpload) {
    const url = fileUrl(rec.key);
    return {
      name: rec.name,
      size: rec.size,
      type: rec.type,
      customId: rec.customId,
      key: rec.key,
      url,
      appUrl: url,
      ufsUrl: url,
      fileHash: rec.fileHash,
    };
  }

  function requireApiKey(req: http.IncomingMessage): void {
    const given = req.headers["x-uploadthing-api-key"];
    if (typeof given !== "string" || !safeEqual(given, apiKey)) throw new HttpError(403, "Invalid or missing x-uploadthing-api-key");
  }

  // --- route metadata -----------------------------------------------------

  function waitForRoute(key: string): Promise<RouteRecord | null> {
    const existing = routes.get(key);
    if (existing) return Promise.resolve(existing);
    return new Promise((resolve) => {
      const list = metadataWaiters.get(key) ?? [];
      const timer = setTimeout(() => {
        const l = metadataWaiters.get(key);
        if (l) metadataWaiters.set(key, l.filter((f) => f !== done));
        resolve(routes.get(key) ?? null);
      }, metadataWaitMs);
      const done = () => {
        clearTimeout(timer);
        resolve(routes.get(key) ?? null);
      };
      list.push(done);
      metadataWaiters.set(key, list);
    });
  }

  async function handleRouteMetadata(req: http.IncomingMessage, res: http.ServerResponse): Promise<void> {
    requireApiKey(req);
    const body = await readJson(req);
    if (!isRecord(body)) throw new HttpError(400, "Body must be a JSON object");
    const fileKeys = stringArray(body.fileKeys, "fileKeys");
    if (fileKeys.length === 0) throw new HttpError(400, "fileKeys is empty");
    for (const key of fileKeys) if (!KEY_RE.test(key)) throw new HttpError(400, `Invalid file key: ${key}`);
    if (typeof body.callbackUrl !== "string") throw new HttpError(400, "callbackUrl must be a string");
    let callback: URL;
    try {
      callback = new URL(body.callbackUrl);
    } catch {
      throw new HttpError(400, `callbackUrl is not a URL: ${body.callbackUrl}`);
    }
    if (!/^https?:$/.test(callback.protocol)) throw new HttpError(400, "callbackUrl must be http(s)");
    if (!isLoopbackHost(callback.hostname)) {
      throw new HttpError(400, `The local upload fake only calls back to loopback hosts, not ${callback.host}. Set APP_URL to http://localhost:<port>.`);
    }
    if (typeof body.callbackSlug !== "string" || !body.callbackSlug) throw new HttpError(400, "callbackSlug must be a non-empty string");
    const isDev = body.isDev === true;
    const record = {
      callbackUrl: callback.toString(),
      callbackSlug: body.callbackSlug,
      metadata: (body.metadata ?? {}) as Json,
      isDev,
      awaitServerData: body.awaitServerData !== false,
      origin: req.headers.host ? `http://${req.headers.host}` : baseUrl,
      registeredAt: Date.now(),
    };

    let stream: DevStream | null = null;
    if (isDev) {
      res.writeHead(200, { "Content-Type": "application/x-ndjson", "Cache-Control": "no-store" });
      res.flushHeaders();
      const s: DevStream = {
        res,
        remaining: new Set(fileKeys),
        open: true,
        timer: setTimeout(() => endStream(s), 60 * 60 * 1000),
      };
      s.timer.unref();
      res.on("close", () => {
        s.open = false;
        clearTimeout(s.timer);
        streams.delete(s);
      });
      streams.add(s);
      stream = s;
    }
    for (const key of fileKeys) {
      routes.set(key, { key, ...record, stream });
      const waiters = metadataWaiters.get(key);
      metadataWaiters.delete(key);
      waiters?.forEach((w) => w());
    }
    log(`route metadata: ${fileKeys.length} file(s) for "${record.callbackSlug}"${isDev ? " (dev stream)" : ""}`);
    if (!isDev) sendJson(res, 200, { ok: true });
  }

  function endStream(s: DevStream): void {
    if (!s.open) return;
    s.open = false;
    clearTimeout(s.timer);
    streams.delete(s);
    if (!s.res.writableEnded) s.res.end();
  }

  function settleStreamKey(route: RouteRecord): void {
    const s = route.stream;
    if (!s) return;
    s.remaining.delete(route.key);
    if (s.remaining.size === 0) endStream(s);
  }

  // --- callbacks to the app -----------------------------------------------

  function waitForResult(key: string): { promise: Promise<CallbackOutcome>; cancel: () => void } {
    let timer: NodeJS.Timeout | undefined;
    const promise = new Promise<CallbackOutcome>((resolve) => {
      const early = earlyResults.get(key);
      if (early) {
        earlyResults.delete(key);
        resolve(early);
        return;
      }
      timer = setTimeout(() => {
        resultWaiters.delete(key);
        resolve({ ok: false, error: `The app did not report a result for this upload within ${Math.round(callbackTimeoutMs / 1000)} s` });
      }, callbackTimeoutMs);
      resultWaiters.set(key, (outcome) => {
        clearTimeout(timer);
        resultWaiters.delete(key);
        resolve(outcome);
      });
    });
    return {
      promise,
      cancel: () => {
        clearTimeout(timer);
        resultWaiters.delete(key);
      },
    };
  }

  async function postHook(route: RouteRecord, hook: "callback" | "error", payload: string): Promise<void> {
    const signature = signPayload(payload, apiKey);
    if (route.isDev && route.stream?.open) {
      route.stream.res.write(`${JSON.stringify({ payload, signature, hook })}\n`);
      return;
    }
    const target = new URL(route.callbackUrl);
    target.searchParams.set("slug", route.callbackSlug);
    const started = Date.now();
    const response = await fetch(target, {
      method: "POST",
      headers: { "content-type": "application/json", "uploadthing-hook": hook, "x-uploadthing-signature": signature },
      body: payload,
      signal: AbortSignal.timeout(callbackTimeoutMs),
    });
    const text = await response.text().catch(() => "");
    if (!response.ok) {
      let detail = text.slice(0, 300);
      try {
        const parsed = JSON.parse(text) as unknown;
        if (isRecord(parsed) && typeof parsed.message === "string") detail = parsed.message;
      } catch {
        /* not JSON */
      }
      throw new Error(`the app answered ${response.status}${detail ? `: ${detail}` : ""}`);
    }
    log(`${hook} delivered to ${target.pathname}?slug=${route.callbackSlug} (${response.status}, ${Date.now() - started} ms)`);
  }

  async function deliverCallback(route: RouteRecord, rec: StoredUpload): Promise<CallbackOutcome> {
    const payload = JSON.stringify({
      status: "uploaded",
      metadata: route.metadata,
      file: uploadedFileData(rec),
      origin: route.origin,
    });
    const wait = waitForResult(rec.key);
    try {
      await postHook(route, "callback", payload);
    } catch (error) {
      wait.cancel();
      const message = `Could not deliver the upload callback: ${errorText(error)}`;
      log(`${rec.key}: ${message}`);
      return { ok: false, error: message };
    }
    return wait.promise;
  }

  function notifyError(route: RouteRecord | undefined, key: string, message: string): void {
    if (!route) return;
    postHook(route, "error", JSON.stringify({ fileKey: key, error: message }))
      .catch((error: unknown) => log(`${key}: could not deliver the error hook: ${errorText(error)}`))
      .finally(() => settleStreamKey(route));
  }

  async function handleCallbackResult(req: http.IncomingMessage, res: http.ServerResponse): Promise<void> {
    requireApiKey(req);
    const body = await readJson(req);
    if (!isRecord(body) || typeof body.fileKey !== "string") throw new HttpError(400, "Body must be {fileKey, callbackData} or {fileKey, error}");
    const key = body.fileKey;
    if (!routes.has(key)) throw new HttpError(404, `No upload is waiting for a result for ${key}`);
    const outcome: CallbackOutcome =
      typeof body.error === "string" ? { ok: false, error: body.error } : { ok: true, data: (body.callbackData ?? null) as Json };
    const waiter = resultWaiters.get(key);
    if (waiter) waiter(outcome);
    else earlyResults.set(key, outcome);
    sendJson(res, 200, { ok: true });
  }

  // --- presigned uploads ----------------------------------------------------

  function presignedFor(req: http.IncomingMessage, key: string): SignedParams {
    if (!KEY_RE.test(key)) throw new HttpError(400, "Invalid file key");
    return readSignedParams(checkUrlSignature(req, apiKey), appId);
  }

  async function handleUploadHead(req: http.IncomingMessage, res: http.ServerResponse, key: string): Promise<void> {
    presignedFor(req, key);
    const stored = files.get(key);
    const start = stored ? stored.size : await fileSize(partPath(key));
    res.writeHead(200, { "x-ut-range-start": String(start), "Content-Length": "0", "Cache-Control": "no-store" });
    res.end();
  }

  async function handleUploadPut(req: http.IncomingMessage, res: http.ServerResponse, key: string): Promise<void> {
    const signed = presignedFor(req, key);

    const done = finished.get(key);
    if (done) {
      // A retry after the upload already finished: answer the same again.
      await drain(req);
      sendJson(res, 200, done);
      return;
    }
    // A resumed upload can arrive before the interrupted one has been wound down.
    const previous = active.get(key);
    if (previous) {
      await Promise.race([previous, new Promise((r) => setTimeout(r, TAKEOVER_WAIT_MS))]);
      if (active.has(key)) {
        await drain(req);
        throw new HttpError(409, "This file is already being uploaded");
      }
      const answered = finished.get(key);
      if (answered) {
        await drain(req);
        sendJson(res, 200, answered);
        return;
      }
    }
    let release = () => {};
    active.set(key, new Promise<void>((resolve) => (release = resolve)));
    try {
      const stored = files.get(key);
      if (stored) {
        // The bytes are here but the app has not accepted them yet (or we restarted): try again.
        await drain(req);
        await finishUpload(res, stored);
      } else {
        await receive(req, res, key, signed);
      }
    } finally {
      active.delete(key);
      release();
    }
  }

  async function receive(req: http.IncomingMessage, res: http.ServerResponse, key: string, signed: SignedParams): Promise<void> {
    const start = parseRangeStart(req.headers.range);
    const boundary = multipartBoundary(req.headers["content-type"]);
    const part = partPath(key);
    const have = await fileSize(part);
    if (start > have) {
      await drain(req);
      throw new HttpError(416, `Range starts at byte ${start} but only ${have} byte(s) were received; HEAD the URL for x-ut-range-start`);
    }
    if (start < have) await fs.truncate(part, start);
    if (start > signed.size) {
      await drain(req);
      throw new HttpError(416, `Range starts after the end of the ${signed.size}-byte file`);
    }

    const out = createWriteStream(part, { flags: start === 0 ? "w" : "a" });
    let received = start;
    let overflow = 0;
    const sink = async (bytes: Buffer) => {
      if (bytes.length === 0) return;
      if (overflow > 0 || received + bytes.length > signed.size) {
        overflow += bytes.length;
        if (overflow > OVERFLOW_DRAIN_BYTES) throw new HttpError(413, "Too large");
        return;
      }
      received += bytes.length;
      await writeChunk(out, bytes);
    };

    let found = true;
    let closed = true;
    try {
      const body = (async function* () {
        try {
          for await (const chunk of req) yield chunk as Buffer;
        } catch {
          throw new ClientGone("client went away");
        }
        if (!req.complete) throw new ClientGone("client went away");
      })();
      if (boundary) ({ found, closed } = await readMultipartFile(body, boundary, sink));
      else for await (const chunk of body) await sink(chunk);
    } catch (error) {
      await closeStream(out);
      if (error instanceof ClientGone) {
        log(`${key}: upload interrupted after ${received} of ${signed.size} bytes (resumable)`);
        return;
      }
      if (error instanceof HttpError && error.status === 413) overflow = Math.max(overflow, 1);
      else throw error;
    }
    await closeStream(out);

    if (overflow > 0) {
      await fs.rm(part, { force: true });
      const message = `The file is larger than the ${signed.size} bytes it was signed for`;
      log(`${key}: refused, ${message.toLowerCase()}`);
      notifyError(routes.get(key), key, message);
      sendError(res, 413, message);
      if (!req.complete) res.on("finish", () => req.destroy());
      return;
    }
    if (!found) throw new HttpError(400, 'The multipart body has no part named "file"');
    if (!closed) throw new HttpError(400, `The multipart body ended early after ${received} of ${signed.size} bytes; resume from x-ut-range-start`);
    if (received < signed.size) {
      throw new HttpError(400, `Received ${received} of ${signed.size} bytes; resume from x-ut-range-start`);
    }

    const rec: StoredUpload = {
      key,
      id: randomUUID(),
      name: signed.name,
      size: signed.size,
      type: signed.type,
      customId: signed.customId,
      acl: signed.acl,
      contentDisposition: signed.contentDisposition,
      fileHash: await md5File(part),
      uploadedAt: Date.now(),
      slug: signed.slug,
    };
    await fs.rename(part, dataPath(key));
    await saveSidecar(rec);
    files.set(key, rec);
    log(`stored ${key} "${rec.name}" (${rec.type}, ${rec.size} bytes)`);

    await finishUpload(res, rec);
  }

  /** Tells the app about a stored file (when its route registered metadata) and answers the client. */
  async function finishUpload(res: http.ServerResponse, rec: StoredUpload): Promise<void> {
    const key = rec.key;
    const base = uploadedFileData(rec);
    const route = rec.slug ? await waitForRoute(key) : routes.get(key);
    if (!route) {
      if (rec.slug) log(`${key}: no route metadata arrived for "${rec.slug}"; no callback sent`);
      const answer = { ...base, serverData: null };
      finished.set(key, answer);
      sendJson(res, 200, answer);
      return;
    }
    if (!route.awaitServerData) {
      const answer = { ...base, serverData: null };
      finished.set(key, answer);
      sendJson(res, 200, answer);
      void deliverCallback(route, rec).finally(() => settleStreamKey(route));
      return;
    }
    const outcome = await deliverCallback(route, rec);
    settleStreamKey(route);
    if (outcome.ok) {
      const answer = { ...base, serverData: outcome.data };
      finished.set(key, answer);
      sendJson(res, 200, answer);
    } else {
      // The browser client turns a 2xx body with `error` into an UPLOAD_FAILED error with this message.
      sendJson(res, 200, { ...base, error: outcome.error, serverData: null });
    }
  }

  // --- serving files --------------------------------------------------------

  async function serveFile(req: http.IncomingMessage, res: http.ServerResponse, key: string): Promise<void> {
    const rec = KEY_RE.test(key) ? files.get(key) : undefined;
    if (!rec || !existsSync(dataPath(key))) throw new HttpError(404, "File not found");
    const query = new URL(req.url ?? "/", "http://x").searchParams;
    if (rec.acl === "private" || query.has("signature")) checkUrlSignature(req, apiKey);

    const headers: Record<string, string | number> = {
      "Content-Type": rec.type,
      "Content-Disposition": contentDisposition(rec.contentDisposition, rec.name),
      "Accept-Ranges": "bytes",
      ETag: `"${rec.fileHash}"`,
      "Cache-Control": rec.acl === "private" ? "private, no-store" : "public, max-age=3600",
      "X-Content-Type-Options": "nosniff",
      "Content-Security-Policy": "default-src 'none'; img-src data:; style-src 'unsafe-inline'; sandbox",
    };
    let start = 0;
    let end = rec.size - 1;
    let status = 200;
    const range = req.headers.range;
    if (range && rec.size > 0) {
      const m = /^bytes=(\d*)-(\d*)$/.exec(range.trim());
      if (m && (m[1] || m[2])) {
        if (m[1]) {
          start = Number(m[1]);
          end = m[2] ? Math.min(Number(m[2]), rec.size - 1) : rec.size - 1;
        } else {
          start = Math.max(0, rec.size - Number(m[2]));
        }
        if (start > end || start >= rec.size) {
          res.writeHead(416, { "Content-Range": `bytes */${rec.size}` });
          res.end();
          return;
        }
        status = 206;
        headers["Content-Range"] = `bytes ${start}-${end}/${rec.size}`;
      }
    }
    headers["Content-Length"] = rec.size === 0 ? 0 : end - start + 1;
    res.writeHead(status, headers);
    if (req.method === "HEAD" || rec.size === 0) {
      res.end();
      return;
    }
    await new Promise<void>((resolve) => {
      const stream = createReadStream(dataPath(key), { start, end });
      stream.on("error", () => {
        res.destroy();
        resolve();
      });
      res.on("close", () => {
        stream.destroy();
        resolve();
      });
      stream.pipe(res);
    });
  }

  // --- UTApi ----------------------------------------------------------------

  function findByKeyOrCustomId(body: Record<string, unknown>): StoredUpload[] {
    if (body.fileKeys !== undefined) return stringArray(body.fileKeys, "fileKeys").flatMap((k) => files.get(k) ?? []);
    if (body.customIds !== undefined) {
      const ids = new Set(stringArray(body.customIds, "customIds"));
      return [...files.values()].filter((f) => f.customId !== null && ids.has(f.customId));
    }
    throw new HttpError(400, "Expected fileKeys or customIds");
  }

  function findOne(update: unknown): StoredUpload | undefined {
    if (!isRecord(update)) throw new HttpError(400, "Each update must be an object");
    if (typeof update.fileKey === "string") return files.get(update.fileKey);
    if (typeof update.customId === "string") return [...files.values()].find((f) => f.customId === update.customId);
    throw new HttpError(400, "Each update needs fileKey or customId");
  }

  function sortedFiles(): StoredUpload[] {
    return [...files.values()].sort((a, b) => b.uploadedAt - a.uploadedAt);
  }

  async function deleteStored(rec: StoredUpload): Promise<void> {
    files.delete(rec.key);
    finished.delete(rec.key);
    await Promise.all([fs.rm(dataPath(rec.key), { force: true }), fs.rm(sidecarPath(rec.key), { force: true })]);
  }

  async function handleApi(req: http.IncomingMessage, res: http.ServerResponse, op: string): Promise<void> {
    requireApiKey(req);
    const raw = await readJson(req);
    const body = isRecord(raw) ? raw : {};
    switch (op) {
      case "deleteFiles": {
        const targets = findByKeyOrCustomId(body);
        for (const rec of targets) await deleteStored(rec);
        if (targets.length) log(`deleted ${targets.length} file(s)`);
        return sendJson(res, 200, { success: true, deletedCount: targets.length });
      }
      case "getFileUrl":
        return sendJson(res, 200, { data: findByKeyOrCustomId(body).map((f) => ({ key: f.key, url: fileUrl(f.key) })) });
      case "listFiles": {
        const limit = typeof body.limit === "number" && body.limit > 0 ? Math.floor(body.limit) : 500;
        const offset = typeof body.offset === "number" && body.offset > 0 ? Math.floor(body.offset) : 0;
        const all = sortedFiles();
        const page = all.slice(offset, offset + limit);
        return sendJson(res, 200, {
          hasMore: offset + page.length < all.length,
          files: page.map((f) => ({
            id: f.id,
            customId: f.customId,
            key: f.key,
            name: f.name,
            size: f.size,
            status: "Uploaded",
            uploadedAt: f.uploadedAt,
          })),
        });
      }
      case "renameFiles": {
        const updates = Array.isArray(body.updates) ? body.updates : [];
        for (const u of updates) {
          const rec = findOne(u);
          const newName = isRecord(u) ? u.newName : undefined;
          if (rec && typeof newName === "string" && newName) {
            rec.name = newName;
            await saveSidecar(rec);
          }
        }
        return sendJson(res, 200, { success: true });
      }
      case "updateACL": {
        const updates = Array.isArray(body.updates) ? body.updates : [];
        for (const u of updates) {
          const rec = findOne(u);
          const acl = isRecord(u) ? u.acl : undefined;
          if (rec && (acl === "public-read" || acl === "private")) {
            rec.acl = acl;
            await saveSidecar(rec);
          }
        }
        return sendJson(res, 200, { success: true });
      }
      case "getUsageInfo": {
        const total = [...files.values()].reduce((n, f) => n + f.size, 0);
        return sendJson(res, 200, { totalBytes: total, appTotalBytes: total, filesUploaded: files.size, limitBytes: 100 * 1024 ** 3 });
      }
      case "requestFileAccess": {
        const rec = findOne(body);
        if (!rec) throw new HttpError(404, "File not found");
        const ttl = typeof body.expiresIn === "number" && body.expiresIn > 0 ? body.expiresIn : 3600;
        const url = signUrl(fileUrl(rec.key), apiKey, ttl);
        return sendJson(res, 200, { url, ufsUrl: url });
      }
      default:
        throw new HttpError(404, `Unknown API operation: ${op}`);
    }
  }

  // --- router -----------------------------------------------------------------

  async function route(req: http.IncomingMessage, res: http.ServerResponse): Promise<void> {
    setCors(req, res);
    const method = req.method ?? "GET";
    if (method === "OPTIONS") {
      res.writeHead(204, { "Content-Length": "0" });
      res.end();
      return;
    }
    let pathname: string;
    try {
      pathname = new URL(req.url ?? "/", "http://x").pathname;
    } catch {
      throw new HttpError(400, "Malformed URL");
    }
    const parts = pathname.split("/").filter(Boolean);

    if (method === "GET" && pathname === "/health") return sendJson(res, 200, { ok: true, files: files.size });
    if (method === "GET" && pathname === "/files") return sendJson(res, 200, sortedFiles());
    if (method === "POST" && pathname === "/route-metadata") return handleRouteMetadata(req, res);
    if (method === "POST" && pathname === "/callback-result") return handleCallbackResult(req, res);
    if (method === "POST" && parts[0] === "v6" && parts.length === 2) return handleApi(req, res, parts[1]!);
    if ((method === "GET" || method === "HEAD") && parts[0] === "f" && parts.length === 2) return serveFile(req, res, parts[1]!);
    if ((method === "GET" || method === "HEAD") && parts[0] === "a" && parts.length === 3) {
      if (parts[1] !== appId) throw new HttpError(404, "File not found");
      return serveFile(req, res, parts[2]!);
    }
    if (parts.length === 1 && KEY_RE.test(parts[0]!)) {
      if (method === "HEAD") return handleUploadHead(req, res, parts[0]!);
      if (method === "PUT") return handleUploadPut(req, res, parts[0]!);
    }
    await drain(req, MAX_JSON_BYTES);
    throw new HttpError(404, `No route for ${method} ${pathname}`);
  }

  const server = http.createServer((req, res) => {
    req.on("error", () => {});
    res.on("error", () => {});
    route(req, res).catch(async (error: unknown) => {
      if (error instanceof HttpError) {
        if (!req.readableEnded && error.status !== 413) await drain(req);
        sendError(res, error.status, error.message);
        return;
      }
      log(`error handling ${req.method} ${req.url?.split("?")[0]}: ${errorText(error)}`);
      sendError(res, 500, `Upload fake error: ${errorText(error)}`);
    });
  });
  server.requestTimeout = 0;
  server.headersTimeout = 60_000;
  trackSockets(server, sockets);
  const port = await listenOnLoopback(server, opts.port, "upload fake", log);
  baseUrl = `http://${HOST}:${port}`;

  // Forget route metadata that nobody used (presigned URLs live an hour by default).
  const sweeper = setInterval(() => {
    const cutoff = Date.now() - 6 * 3600 * 1000;
    for (const [key, r] of routes) if (r.registeredAt < cutoff && !resultWaiters.has(key)) routes.delete(key);
  }, 10 * 60 * 1000);
  sweeper.unref();

  let closing: Promise<void> | null = null;
  return {
    url: baseUrl,
    port,
    list: () => sortedFiles(),
    close() {
      closing ??= new Promise<void>((resolve) => {
        clearInterval(sweeper);
        for (const s of [...streams]) endStream(s);
        for (const waiter of [...resultWaiters.values()]) waiter({ ok: false, error: "The upload fake is shutting down" });
        server.close(() => resolve());
        server.closeAllConnections();
        for (const socket of sockets) socket.destroy();
      });
      return closing;
    },
  };
}

// ---------------------------------------------------------------------------
// CLI
// ---------------------------------------------------------------------------

async function main(argv: string[]): Promise<void> {
  const unknown = argv.filter((a) => a !== "--test");
  if (unknown.length > 0) {
    process.stderr.write(`unknown argument(s): ${unknown.join(" ")}\nusage: tsx scripts/fakes/uploadthing.ts [--test]\n`);
    process.exitCode = 2;
    return;
  }
  const target = argv.includes("--test") ? TEST_UPLOADS : DEV_UPLOADS;
  const log = stderrLogger("uploads");
  const apiKey = fakeApiKey();
  const fake = await startUploadthingFake({ ...target, apiKey, appId: FAKE_APP_ID, log });
  log(`UPLOADTHING_TOKEN=${fakeToken({ apiKey, appId: FAKE_APP_ID, ingestHost: new URL(fake.url).host })}`);
  log(`UPLOADTHING_FAKE_URL=${fake.url}; ${fake.list().length} stored file(s) in ${target.dir}   (Ctrl-C to stop)`);
  closeOnSignals("uploads", () => fake.close(), log);
}

if (isMain(import.meta.url)) {
  main(process.argv.slice(2)).catch((err: unknown) => {
    process.stderr.write(`uploads: ${errorText(err)}\n`);
    process.exit(1);
  });
}
