/**
 * The local upload fake against the real upload SDK, over HTTP, without a browser.
 *
 * A tiny app server (node:http -> the SDK's Next route handler with a permissive file router)
 * plays the app; this test plays the browser client exactly as the SDK's client does it
 * (POST ?actionType=upload, HEAD the presigned URL, PUT multipart with a Range header).
 */
import { createHash, randomBytes } from "node:crypto";
import { mkdtemp, readFile, rm } from "node:fs/promises";
import http from "node:http";
import type { AddressInfo } from "node:net";
import os from "node:os";
import path from "node:path";
import { generateSignedURL, verifySignature } from "@uploadthing/shared";
import * as Micro from "effect/Micro";
import * as Redacted from "effect/Redacted";
import { version as sdkVersion } from "uploadthing/client";
import { createRouteHandler, createUploadthing, type FileRouter } from "uploadthing/next";
import { UTApi, UTFile } from "uploadthing/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { z } from "zod";
import { uploadthingConfig } from "@/app/_server/uploadthing-config";
import { fakeToken, startUploadthingFake, type UploadthingFake } from "@/scripts/fakes/uploadthing";
import { Arrivals, waitUntil } from "@/tests/support/wait";

const APP_ID = "chalkline-test-app";
const API_KEY = `sk_test_${randomBytes(12).toString("hex")}`;
// A 1 × 1 PNG.
const PNG = Buffer.from(
  "iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==",
  "base64",
);

type Hook = { path: string; hook: string; signature: string; body: string };
type Presigned = { url: string; key: string; name: string; customId: string | null };

const hooks: Hook[] = [];
/** Upload callbacks the app's file router ran, and the fake's log lines: tests wait on these, never on time. */
const completions = new Arrivals<{ metadata: unknown; key: string; ufsUrl: string }>();
const fakeLog = new Arrivals<string>();
const savedEnv = { ...process.env };

let fake: UploadthingFake;
let dir: string;
let appServer: http.Server;
let appUrl = "";

const f = createUploadthing();
const router = {
  test: f({ image: { maxFileSize: "1MB", maxFileCount: 3 } })
    .input(z.object({ note: z.string() }))
    .middleware(({ input }) => ({ note: input.note, who: "tester" }))
    .onUploadComplete(({ metadata, file }) => {
      completions.push({ metadata, key: file.key, ufsUrl: file.ufsUrl });
      return { echoed: metadata.note, key: file.key };
    }),
  later: f({ blob: { maxFileSize: "1MB" } }, { awaitServerData: false }).onUploadComplete(({ file }) => {
    completions.push({ metadata: null, key: file.key, ufsUrl: file.ufsUrl });
    return { never: "seen by the client" };
  }),
} satisfies FileRouter;

let prodHandler: ReturnType<typeof createRouteHandler>;
let devHandler: ReturnType<typeof createRouteHandler>;

async function startApp(): Promise<void> {
  appServer = http.createServer((req, res) => {
    void (async () => {
      const chunks: Buffer[] = [];
      for await (const c of req) chunks.push(c as Buffer);
      const body = Buffer.concat(chunks).toString("utf8");
      const headers = new Headers();
      for (let i = 0; i < req.rawHeaders.length; i += 2) headers.append(req.rawHeaders[i]!, req.rawHeaders[i + 1]!);
      const hook = headers.get("uploadthing-hook");
      if (hook) hooks.push({ path: req.url ?? "", hook, signature: headers.get("x-uploadthing-signature") ?? "", body });
      const handler = req.url?.startsWith("/dev/") ? devHandler : prodHandler;
      const method = req.method ?? "GET";
      const request = new Request(`${appUrl}${req.url}`, { method, headers, body: method === "GET" || method === "HEAD" ? undefined : body });
      const response = await (method === "GET" ? handler.GET(request as never) : handler.POST(request as never));
      res.writeHead(response.status, Object.fromEntries(response.headers));
      res.end(Buffer.from(await response.arrayBuffer()));
    })().catch((error: unknown) => {
      res.writeHead(500, { "content-type": "text/plain" });
      res.end(String(error));
    });
  });
  await new Promise<void>((resolve) => appServer.listen(0, "127.0.0.1", resolve));
  appUrl = `http://localhost:${(appServer.address() as AddressInfo).port}`;
}

/** What the browser client does first: ask the app for presigned URLs. */
async function presign(
  slug: string,
  files: Array<{ name: string; size: number; type: string }>,
  input: unknown,
  prefix = "",
): Promise<Response> {
  return fetch(`${appUrl}${prefix}/api/uploadthing?actionType=upload&slug=${slug}`, {
    method: "POST",
    headers: { "content-type": "application/json", "x-uploadthing-package": "@uploadthing/react", "x-uploadthing-version": sdkVersion },
    body: JSON.stringify({ input, files: files.map((x) => ({ ...x, lastModified: Date.now() })) }),
  });
}

async function presignOne(name: string, bytes: Buffer, type = "image/png", slug = "test", prefix = ""): Promise<Presigned> {
  const res = await presign(slug, [{ name, size: bytes.length, type }], slug === "test" ? { note: `note for ${name}` } : null, prefix);
  expect(res.status).toBe(200);
  const list = (await res.json()) as Presigned[];
  expect(list).toHaveLength(1);
  return list[0]!;
}

/** The browser client's PUT: multipart field "file", Range header, SDK version header. */
async function put(url: string, bytes: Buffer, type: string, name: string, start = 0): Promise<Response> {
  const form = new FormData();
  form.append("file", new Blob([new Uint8Array(bytes.subarray(start))], { type }), name);
  return fetch(url, { method: "PUT", body: form, headers: { Range: `bytes=${start}-`, "x-uploadthing-version": sdkVersion } });
}

async function rangeStart(url: string): Promise<{ status: number; start: number }> {
  const res = await fetch(url, { method: "HEAD" });
  return { status: res.status, start: Number(res.headers.get("x-ut-range-start") ?? "0") };
}

const md5 = (b: Buffer) => createHash("md5").update(b).digest("hex");
const sdkVerifies = (body: string, signature: string) => Micro.runPromise(verifySignature(body, signature, Redacted.make(API_KEY)));

async function signedByHand(key: string, data: Record<string, string | number>, ttlInSeconds?: number): Promise<string> {
  return Micro.runPromise(
    generateSignedURL(`${fake.url}/${key}`, Redacted.make(API_KEY), { ttlInSeconds, data: { "x-ut-identifier": APP_ID, ...data } }),
  );
}

/**
 * Sends the first `sent` bytes of a multipart PUT body, waits until the fake has stored them (all
 * but the few it holds back while it looks for the closing boundary), then drops the connection.
 */
async function interruptedPut(url: string, bytes: Buffer, sent: number): Promise<void> {
  const boundary = "----chalklineboundary";
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="large.png"\r\nContent-Type: image/png\r\n\r\n`);
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  const target = new URL(url);
  let req: http.ClientRequest | undefined;
  const dropped = new Promise<void>((resolve) => {
    req = http.request({
      host: target.hostname,
      port: target.port,
      path: `${target.pathname}${target.search}`,
      method: "PUT",
      headers: {
        "content-type": `multipart/form-data; boundary=${boundary}`,
        "content-length": head.length + bytes.length + tail.length,
        range: "bytes=0-",
      },
    });
    req.on("error", () => resolve());
    req.on("close", () => resolve());
    req.write(head);
    req.write(bytes.subarray(0, sent));
  });
  // The multipart reader keeps back one byte less than a delimiter line until more arrive.
  const heldBack = `\r\n--${boundary}`.length - 1;
  await waitUntil(`the fake to store ${sent - heldBack} of the ${sent} bytes sent`, async () => (await rangeStart(url)).start >= sent - heldBack);
  req!.destroy();
  await dropped;
}

beforeAll(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), "chalkline-uploads-"));
  fake = await startUploadthingFake({
    port: 0,
    dir,
    apiKey: API_KEY,
    appId: APP_ID,
    callbackTimeoutMs: 5000,
    metadataWaitMs: 2000,
    log: (l) => fakeLog.push(l),
  });
  await startApp();
  process.env.UPLOADTHING_FAKE_URL = fake.url;
  process.env.UPLOADTHING_TOKEN = fakeToken({ apiKey: API_KEY, appId: APP_ID, ingestHost: new URL(fake.url).host });
  process.env.APP_URL = appUrl;
  process.env.UPLOADTHING_LOG_LEVEL = "Error";
  const config = uploadthingConfig();
  expect(config).toMatchObject({ ingestUrl: fake.url, apiUrl: fake.url, isDev: false, callbackUrl: `${appUrl}/api/uploadthing` });
  prodHandler = createRouteHandler({ router, config });
  devHandler = createRouteHandler({ router, config: { ...config, isDev: true, callbackUrl: `${appUrl}/dev/api/uploadthing` } });
});

afterAll(async () => {
  await fake?.close();
  await new Promise<void>((resolve) => (appServer ? appServer.close(() => resolve()) : resolve()));
  for (const k of ["UPLOADTHING_FAKE_URL", "UPLOADTHING_TOKEN", "APP_URL", "UPLOADTHING_LOG_LEVEL"]) {
    if (savedEnv[k] === undefined) delete process.env[k];
    else process.env[k] = savedEnv[k];
  }
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe("upload round trip through the SDK", () => {
  it("signs, stores, serves back byte-identical, and calls back with a signature the SDK verifies", async () => {
    const presigned = await presignOne("dot.png", PNG);
    const signed = new URL(presigned.url);
    expect(`${signed.origin}${signed.pathname}`).toBe(`${fake.url}/${presigned.key}`);
    expect(signed.searchParams.get("signature")).toMatch(/^hmac-sha256=[0-9a-f]{64}$/);
    expect(signed.searchParams.get("x-ut-file-size")).toBe(String(PNG.length));
    expect(signed.searchParams.get("x-ut-slug")).toBe("test");

    expect(await rangeStart(presigned.url)).toEqual({ status: 200, start: 0 });

    const res = await put(presigned.url, PNG, "image/png", "dot.png");
    expect(res.status).toBe(200);
    const body = (await res.json()) as Record<string, unknown>;
    const fileUrl = `${fake.url}/f/${presigned.key}`;
    expect(body).toMatchObject({ ufsUrl: fileUrl, url: fileUrl, appUrl: fileUrl, fileHash: md5(PNG) });
    expect(body.serverData).toEqual({ echoed: "note for dot.png", key: presigned.key });
    expect(body).not.toHaveProperty("error");

    // Stored with its sidecar.
    expect(Buffer.compare(await readFile(path.join(dir, presigned.key)), PNG)).toBe(0);
    const sidecar = JSON.parse(await readFile(path.join(dir, `${presigned.key}.json`), "utf8")) as Record<string, unknown>;
    expect(sidecar).toMatchObject({ key: presigned.key, name: "dot.png", size: PNG.length, type: "image/png", customId: null });

    // Served back.
    const back = await fetch(fileUrl);
    expect(back.status).toBe(200);
    expect(back.headers.get("content-type")).toBe("image/png");
    expect(back.headers.get("content-length")).toBe(String(PNG.length));
    expect(Buffer.compare(Buffer.from(await back.arrayBuffer()), PNG)).toBe(0);
    const ranged = await fetch(fileUrl, { headers: { Range: "bytes=0-7" } });
    expect(ranged.status).toBe(206);
    expect(Buffer.compare(Buffer.from(await ranged.arrayBuffer()), PNG.subarray(0, 8))).toBe(0);

    // The callback the app received, checked with the SDK's own verification.
    const hook = hooks.find((h) => h.hook === "callback" && h.body.includes(presigned.key));
    expect(hook).toBeDefined();
    expect(hook!.path).toBe("/api/uploadthing?slug=test");
    expect(await sdkVerifies(hook!.body, hook!.signature)).toBe(true);
    expect(await sdkVerifies(hook!.body.replace("dot.png", "dog.png"), hook!.signature)).toBe(false);
    const payload = JSON.parse(hook!.body) as { status: string; origin: string; metadata: unknown; file: Record<string, unknown> };
    expect(payload.status).toBe("uploaded");
    expect(payload.origin).toBe(fake.url);
    expect(payload.metadata).toEqual({ note: "note for dot.png", who: "tester" });
    expect(payload.file).toMatchObject({ key: presigned.key, name: "dot.png", size: PNG.length, type: "image/png", ufsUrl: fileUrl });
    expect(completions.find((c) => c.key === presigned.key)).toMatchObject({ ufsUrl: fileUrl });

    // A retried PUT (e.g. the answer was lost) gets the same answer and no second callback.
    const callbacksBefore = hooks.length;
    const again = await put(presigned.url, PNG, "image/png", "dot.png");
    expect(((await again.json()) as Record<string, unknown>).serverData).toEqual(body.serverData);
    expect(hooks.length).toBe(callbacksBefore);
  });

  it("refuses tampered, foreign and expired signatures with a 403 JSON error", async () => {
    const presigned = await presignOne("tamper.png", PNG);
    const badSig = presigned.url.replace(/signature=hmac-sha256%3D([0-9a-f])/, (_m, c: string) => `signature=hmac-sha256%3D${c === "0" ? "1" : "0"}`);
    expect(badSig).not.toBe(presigned.url);
    const res = await put(badSig, PNG, "image/png", "tamper.png");
    expect(res.status).toBe(403);
    expect(await res.json()).toMatchObject({ error: "Invalid signature" });
    expect((await rangeStart(badSig)).status).toBe(403);

    const biggerLimit = presigned.url.replace(`x-ut-file-size=${PNG.length}`, "x-ut-file-size=99999999");
    expect((await put(biggerLimit, PNG, "image/png", "tamper.png")).status).toBe(403);

    const otherKey = await Micro.runPromise(
      generateSignedURL(`${fake.url}/foreignkey`, Redacted.make("sk_someone_else"), { data: { "x-ut-identifier": APP_ID, "x-ut-file-size": 1 } }),
    );
    expect((await put(otherKey, PNG.subarray(0, 1), "image/png", "x.png")).status).toBe(403);

    const expired = await signedByHand("expiredkey", { "x-ut-file-size": PNG.length, "x-ut-file-name": "old.png" }, -5);
    const expiredRes = await put(expired, PNG, "image/png", "old.png");
    expect(expiredRes.status).toBe(403);
    expect(((await expiredRes.json()) as { error: string }).error).toMatch(/expired/);

    // Nothing was stored for any of these.
    expect(fake.list().some((f) => f.key === presigned.key || f.key === "expiredkey")).toBe(false);
  });

  it("enforces the signed size", async () => {
    const url = await signedByHand("toolargekey", { "x-ut-file-size": 10, "x-ut-file-name": "big.png", "x-ut-file-type": "image/png" });
    const res = await put(url, randomBytes(100), "image/png", "big.png");
    expect(res.status).toBe(413);
    expect(((await res.json()) as { error: string }).error).toMatch(/larger than the 10 bytes/);
    expect(fake.list().some((f) => f.key === "toolargekey")).toBe(false);

    const short = await signedByHand("tooshortkey", { "x-ut-file-size": 10, "x-ut-file-name": "short.png" });
    const shortRes = await put(short, randomBytes(4), "image/png", "short.png");
    expect(shortRes.status).toBe(400);
    expect(await rangeStart(short)).toEqual({ status: 200, start: 4 });
  });

  it("resumes an interrupted upload from x-ut-range-start", async () => {
    const bytes = Buffer.concat([PNG, randomBytes(400 * 1024)]);
    const presigned = await presignOne("large.png", bytes);

    await interruptedPut(presigned.url, bytes, 200 * 1024);
    await fakeLog.next("the fake to notice the interruption", (l) => l.startsWith(`${presigned.key}: upload interrupted`));

    const { status, start } = await rangeStart(presigned.url);
    expect(status).toBe(200);
    expect(start).toBeGreaterThan(0);
    expect(start).toBeLessThanOrEqual(200 * 1024);

    const res = await put(presigned.url, bytes, "image/png", "large.png", start);
    expect(res.status).toBe(200);
    const body = (await res.json()) as { serverData: unknown; fileHash: string };
    expect(body.serverData).toEqual({ echoed: "note for large.png", key: presigned.key });
    expect(body.fileHash).toBe(md5(bytes));
    expect(Buffer.compare(Buffer.from(await (await fetch(`${fake.url}/f/${presigned.key}`)).arrayBuffer()), bytes)).toBe(0);
    expect(await rangeStart(presigned.url)).toEqual({ status: 200, start: bytes.length });
  });

  it("lets a quick resume take over from an interrupted PUT that is still winding down", async () => {
    const bytes = randomBytes(300 * 1024);
    const presigned = await presignOne("quick.png", bytes);
    await interruptedPut(presigned.url, bytes, 120 * 1024);
    const { start } = await rangeStart(presigned.url);
    const res = await put(presigned.url, bytes, "image/png", "quick.png", start);
    expect(res.status).toBe(200);
    expect(((await res.json()) as { fileHash: string }).fileHash).toBe(md5(bytes));
  });

  it("answers at once for routes that do not await server data, then calls back", async () => {
    const data = Buffer.from("plain bytes");
    const presigned = await presignOne("notes.txt", data, "text/plain", "later");
    const res = await put(presigned.url, data, "text/plain", "notes.txt");
    expect(res.status).toBe(200);
    expect(((await res.json()) as { serverData: unknown }).serverData).toBeNull();
    await completions.next("the upload callback", (c) => c.key === presigned.key);
  });

  it("also works in the SDK's dev-stream mode (isDev true)", async () => {
    const presigned = await presignOne("dev.png", PNG, "image/png", "test", "/dev");
    const res = await put(presigned.url, PNG, "image/png", "dev.png");
    expect(res.status).toBe(200);
    expect(((await res.json()) as { serverData: unknown }).serverData).toEqual({ echoed: "note for dev.png", key: presigned.key });
    // The SDK held the route-metadata request open and forwarded the streamed callback itself.
    expect(fakeLog.items).toContain('route metadata: 1 file(s) for "test" (dev stream)');
    expect(fakeLog.items.some((l) => l.startsWith("callback delivered") && l.includes("/dev/"))).toBe(false);
    const hook = hooks.find((h) => h.path === "/dev/api/uploadthing?slug=test" && h.body.includes(presigned.key));
    expect(hook).toBeDefined();
    expect(await sdkVerifies(hook!.body, hook!.signature)).toBe(true);
  });

  it("surfaces a callback that cannot be delivered as an error body", async () => {
    const key = "unreachablecallbackkey";
    const reg = await fetch(`${fake.url}/route-metadata`, {
      method: "POST",
      headers: { "content-type": "application/json", "x-uploadthing-api-key": API_KEY },
      body: JSON.stringify({ fileKeys: [key], metadata: {}, isDev: false, callbackUrl: "http://127.0.0.1:9/api/uploadthing", callbackSlug: "test", awaitServerData: true }),
    });
    expect(await reg.json()).toEqual({ ok: true });
    const url = await signedByHand(key, { "x-ut-file-size": PNG.length, "x-ut-file-name": "x.png", "x-ut-slug": "test" });
    const res = await put(url, PNG, "image/png", "x.png");
    expect(res.status).toBe(200);
    expect(((await res.json()) as { error: string }).error).toMatch(/Could not deliver the upload callback/);
  });
});

describe("UTApi against the fake", () => {
  it("uploads, lists, resolves URLs, signs private access and deletes", async () => {
    const utapi = new UTApi({ ...uploadthingConfig(), logLevel: "Error" });
    const uploaded = await utapi.uploadFiles(new UTFile([new Uint8Array(PNG)], "server.png", { customId: "art-1" }));
    expect(uploaded.error).toBeNull();
    const key = uploaded.data!.key;
    expect(uploaded.data!.ufsUrl).toBe(`${fake.url}/f/${key}`);

    const listed = await utapi.listFiles();
    expect(listed.files.find((f) => f.key === key)).toMatchObject({ name: "server.png", customId: "art-1", status: "Uploaded" });
    expect((await utapi.getFileUrls(key)).data).toEqual([{ key, url: `${fake.url}/f/${key}` }]);

    await utapi.updateACL(key, "private");
    expect((await fetch(`${fake.url}/f/${key}`)).status).toBe(403);
    const { ufsUrl } = await utapi.generateSignedURL(key, { expiresIn: 60 });
    const signedBack = await fetch(ufsUrl);
    expect(signedBack.status).toBe(200);
    expect(Buffer.compare(Buffer.from(await signedBack.arrayBuffer()), PNG)).toBe(0);
    expect((await fetch(ufsUrl.replace(/signature=hmac-sha256%3D./, "signature=hmac-sha256%3Dz"))).status).toBe(403);

    expect(await utapi.deleteFiles("art-1", { keyType: "customId" })).toEqual({ success: true, deletedCount: 1 });
    expect((await fetch(`${fake.url}/f/${key}`)).status).toBe(404);
  });

  it("answers bad requests with JSON errors and keeps running", async () => {
    const noKey = await fetch(`${fake.url}/route-metadata`, { method: "POST", body: "{}" });
    expect(noKey.status).toBe(403);
    expect(await noKey.json()).toHaveProperty("error");
    const badJson = await fetch(`${fake.url}/v6/listFiles`, { method: "POST", headers: { "x-uploadthing-api-key": API_KEY }, body: "{" });
    expect(badJson.status).toBe(400);
    const foreignCallback = await fetch(`${fake.url}/route-metadata`, {
      method: "POST",
      headers: { "x-uploadthing-api-key": API_KEY },
      body: JSON.stringify({ fileKeys: ["k1"], callbackUrl: "https://example.com/api/uploadthing", callbackSlug: "x" }),
    });
    expect(foreignCallback.status).toBe(400);
    expect((await fetch(`${fake.url}/nowhere/at/all`)).status).toBe(404);
    expect((await fetch(`${fake.url}/f/missing`)).status).toBe(404);
    const noSig = await fetch(`${fake.url}/somekey`, { method: "PUT", body: "x" });
    expect(noSig.status).toBe(403);
    const preflight = await fetch(`${fake.url}/somekey`, {
      method: "OPTIONS",
      headers: { origin: appUrl, "access-control-request-method": "PUT", "access-control-request-headers": "range,x-uploadthing-version,b3,traceparent" },
    });
    expect(preflight.status).toBe(204);
    expect(preflight.headers.get("access-control-allow-origin")).toBe("*");
    expect(preflight.headers.get("access-control-allow-headers")).toContain("range");
    expect(await (await fetch(`${fake.url}/health`)).json()).toMatchObject({ ok: true });
  });
});
