/**
 * Local e-mail catcher for development and tests.
 *
 * SMTP (no TLS, any or no AUTH) on 127.0.0.1:<smtpPort>; every message is
 * parsed and stored as JSON in <dir>/<id>.json, so it survives restarts.
 *
 * HTTP JSON API on 127.0.0.1:<httpPort>:
 *   GET    /health                      {"ok":true,"messages":N}
 *   GET    /messages[?to=addr][&since=id][&limit=n][&wait=ms]
 *                                       newest first; `to` matches To, Cc and envelope
 *                                       recipients case-insensitively; `wait` long-polls
 *                                       (max 30000 ms) until at least one match exists
 *   GET    /messages/<id>               one message
 *   GET    /messages/<id>/html          the HTML body, rendered (sandboxed) for a browser
 *   DELETE /messages[?to=addr]          delete all (or one recipient's) messages
 *   DELETE /messages/<id>               delete one message
 *   GET    /                            tiny HTML inbox for humans
 *
 *   tsx scripts/fakes/smtp.ts [--test]   runs until SIGINT/SIGTERM
 */
import { mkdirSync, readdirSync, readFileSync, renameSync, rmSync, writeFileSync } from "node:fs";
import http from "node:http";
import type { AddressInfo } from "node:net";
import path from "node:path";
import { randomBytes, timingSafeEqual } from "node:crypto";
import { simpleParser, type AddressObject, type EmailAddress, type ParsedMail } from "mailparser";
import {
  SMTPServer,
  type SMTPServerAddress,
  type SMTPServerDataStream,
  type SMTPServerSession,
} from "smtp-server";
import { isMain, repoRoot, stderrLogger, type LogFn } from "../lib/proc";

// ---------------------------------------------------------------------------
// Defaults shared with other scripts
// ---------------------------------------------------------------------------

export interface MailTarget {
  smtpPort: number;
  httpPort: number;
  /** Folder the messages are stored in. */
  dir: string;
}

export const DEV_MAIL: Readonly<MailTarget> = Object.freeze({
  smtpPort: 2526,
  httpPort: 2580,
  dir: path.join(repoRoot, ".data", "mail"),
});

export const TEST_MAIL: Readonly<MailTarget> = Object.freeze({
  smtpPort: 2536,
  httpPort: 2590,
  dir: path.join(repoRoot, ".data", "mail-test"),
});

const HOST = "127.0.0.1";
/** Maximum accepted message size (bytes). */
export const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;
const MAX_WAIT_MS = 30_000;

// ---------------------------------------------------------------------------
// Stored message shape
// ---------------------------------------------------------------------------

export interface StoredAttachment {
  filename: string | null;
  contentType: string;
  size: number;
}

export interface StoredMessage {
  /** `<ms since epoch, 13 digits>-<random>`; sorts by arrival time. */
  id: string;
  /** Arrival time (ISO 8601). */
  date: string;
  /** Sender address from the From header (or the envelope sender). */
  from: string;
  fromName: string | null;
  /** Addresses from the To header. */
  to: string[];
  /** Addresses from the Cc header. */
  cc: string[];
  /** SMTP envelope (includes Bcc recipients). */
  envelope: { from: string | null; to: string[] };
  subject: string;
  text: string | null;
  html: string | null;
  /** Selected headers, lower-case names. */
  headers: Record<string, string>;
  /** URLs found in the HTML hrefs and the text body, in order, de-duplicated. */
  links: string[];
  attachments: StoredAttachment[];
  /** Raw message size in bytes. */
  size: number;
}

export interface SmtpFakeOptions extends MailTarget {
  log?: LogFn;
  /**
   * The per-install key every HTTP request but /health must carry (header `x-fake-key` or query
   * `key`); without it the catcher answers 404, so nobody who reaches the port reads the mail.
   */
  key: string;
}

export interface SmtpFake {
  close(): Promise<void>;
  readonly smtpPort: number;
  readonly httpPort: number;
  /** Base URL of the HTTP API, e.g. http://127.0.0.1:2580 */
  readonly apiUrl: string;
  /** Messages currently stored, newest first, optionally for one recipient. */
  list(to?: string): StoredMessage[];
}

// ---------------------------------------------------------------------------
// Helpers
// ---------------------------------------------------------------------------

const ID_RE = /^\d{13}-[a-z0-9]{6,}$/;
let lastStamp = 0;

function newId(): string {
  // Strictly increasing timestamp within this process keeps ids ordered.
  const now = Math.max(Date.now(), lastStamp + 1);
  lastStamp = now;
  return `${String(now).padStart(13, "0")}-${randomBytes(4).toString("hex")}`;
}

function flattenAddresses(value: AddressObject | AddressObject[] | undefined): EmailAddress[] {
  if (!value) return [];
  const out: EmailAddress[] = [];
  const walk = (list: EmailAddress[]) => {
    for (const a of list) {
      if (a.group) walk(a.group);
      else out.push(a);
    }
  };
  for (const obj of Array.isArray(value) ? value : [value]) walk(obj.value);
  return out;
}

function addresses(value: AddressObject | AddressObject[] | undefined): string[] {
  return flattenAddresses(value)
    .map((a) => a.address?.trim())
    .filter((a): a is string => !!a);
}

const KEPT_HEADERS = new Set([
  "message-id",
  "date",
  "reply-to",
  "in-reply-to",
  "references",
  "list-unsubscribe",
  "list-unsubscribe-post",
  "auto-submitted",
  "precedence",
  "content-type",
  "mime-version",
]);

function headerSubset(mail: ParsedMail): Record<string, string> {
  const out: Record<string, string> = {};
  for (const { key, line } of mail.headerLines) {
    const name = key.toLowerCase();
    if (!KEPT_HEADERS.has(name) && !name.startsWith("x-")) continue;
    const colon = line.indexOf(":");
    const value = (colon >= 0 ? line.slice(colon + 1) : line).replace(/\r?\n[ \t]+/g, " ").trim();
    out[name] = out[name] !== undefined ? `${out[name]}, ${value}` : value;
  }
  return out;
}

function decodeEntities(s: string): string {
  return s
    .replace(/&amp;/gi, "&")
    .replace(/&quot;/gi, '"')
    .replace(/&#39;|&apos;/gi, "'")
    .replace(/&lt;/gi, "<")
    .replace(/&gt;/gi, ">");
}

function extractLinks(html: string | null, text: string | null): string[] {
  const seen = new Set<string>();
  if (html) {
    for (const m of html.matchAll(/href\s*=\s*(?:"([^"]*)"|'([^']*)')/gi)) {
      const href = decodeEntities((m[1] ?? m[2] ?? "").trim());
      if (/^https?:\/\//i.test(href)) seen.add(href);
    }
  }
  if (text) {
    for (const m of text.matchAll(/https?:\/\/[^\s<>"'\]]+/gi)) {
      seen.add(m[0].replace(/[).,;:!?]+$/, ""));
    }
  }
  return [...seen];
}

function toStored(id: string, mail: ParsedMail, session: SMTPServerSession, size: number): StoredMessage {
  const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : null;
  const sender = flattenAddresses(mail.from)[0];
  const html = typeof mail.html === "string" ? mail.html : null;
  const text = mail.text ?? null;
  return {
    id,
    date: new Date().toISOString(),
    from: sender?.address ?? envelopeFrom ?? "",
    fromName: sender?.name || null,
    to: addresses(mail.to),
    cc: addresses(mail.cc),
    envelope: {
      from: envelopeFrom,
      to: session.envelope.rcptTo.map((r: SMTPServerAddress) => r.address),
    },
    subject: mail.subject ?? "",
    text,
    html,
    headers: headerSubset(mail),
    links: extractLinks(html, text),
    attachments: mail.attachments.map((a) => ({
      filename: a.filename ?? null,
      contentType: a.contentType,
      size: a.size,
    })),
    size,
  };
}

function recipientsOf(m: StoredMessage): string[] {
  return [...m.to, ...m.cc, ...m.envelope.to].map((a) => a.toLowerCase());
}

function matchesRecipient(m: StoredMessage, to: string | null | undefined): boolean {
  if (!to) return true;
  return recipientsOf(m).includes(to.trim().toLowerCase());
}

function escapeHtml(s: string): string {
  return s.replace(
    /[&<>"']/g,
    (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c] ?? c,
  );
}

function listenError(kind: string, port: number, err: NodeJS.ErrnoException): Error {
  if (err.code === "EADDRINUSE") {
    return new Error(
      `${kind} port ${port} on ${HOST} is already in use. Is another mail catcher running (npm run fakes)? ` +
        "Stop it or choose another port.",
      { cause: err },
    );
  }
  if (err.code === "EACCES") {
    return new Error(`Not allowed to listen on ${HOST}:${port} (${kind}); pick a port above 1024.`, {
      cause: err,
    });
  }
  return new Error(`Could not listen on ${HOST}:${port} (${kind}): ${err.message}`, { cause: err });
}

// ---------------------------------------------------------------------------
// Store
// ---------------------------------------------------------------------------

class MessageStore {
  private readonly byId = new Map<string, StoredMessage>();
  private waiters = new Set<(m: StoredMessage) => void>();

  constructor(
    private readonly dir: string,
    private readonly log: LogFn,
  ) {}

  load(): void {
    mkdirSync(this.dir, { recursive: true });
    for (const name of readdirSync(this.dir)) {
      if (name.endsWith(".json.tmp")) {
        rmSync(path.join(this.dir, name), { force: true });
        continue;
      }
      if (!name.endsWith(".json")) continue;
      const id = name.slice(0, -".json".length);
      if (!ID_RE.test(id)) continue;
      try {
        const msg = JSON.parse(readFileSync(path.join(this.dir, name), "utf8")) as StoredMessage;
        if (msg && msg.id === id) this.byId.set(id, msg);
        else this.log(`skipping ${name}: id does not match file name`);
      } catch (err) {
        this.log(`skipping unreadable ${name}: ${(err as Error).message}`);
      }
    }
  }

  get size(): number {
    return this.byId.size;
  }

  add(m: StoredMessage): void {
    const file = path.join(this.dir, `${m.id}.json`);
    const tmp = `${file}.tmp`;
    mkdirSync(this.dir, { recursive: true });
    writeFileSync(tmp, JSON.stringify(m, null, 2));
    renameSync(tmp, file);
    this.byId.set(m.id, m);
    for (const w of [...this.waiters]) w(m);
  }

  get(id: string): StoredMessage | undefined {
    return this.byId.get(id);
  }

  list(opts: { to?: string | null; since?: string | null; limit?: number } = {}): StoredMessage[] {
    const since = opts.since ?? null;
    const out = [...this.byId.values()]
      .filter((m) => matchesRecipient(m, opts.to) && (since === null || m.id > since))
      .sort((a, b) => (a.id < b.id ? 1 : a.id > b.id ? -1 : 0));
    return opts.limit !== undefined ? out.slice(0, opts.limit) : out;
  }

  delete(ids: string[]): number {
    let n = 0;
    for (const id of ids) {
      if (this.byId.delete(id)) n++;
      rmSync(path.join(this.dir, `${id}.json`), { force: true });
    }
    return n;
  }

  /** Resolve with the first new message satisfying `match`, or null after `ms`. */
  waitFor(
    match: (m: StoredMessage) => boolean,
    ms: number,
  ): { promise: Promise<StoredMessage | null>; cancel(): void } {
    let done: (v: StoredMessage | null) => void = () => undefined;
    const promise = new Promise<StoredMessage | null>((resolve) => {
      done = resolve;
    });
    const waiter = (m: StoredMessage) => {
      if (match(m)) finish(m);
    };
    const timer = setTimeout(() => finish(null), ms);
    const finish = (v: StoredMessage | null) => {
      clearTimeout(timer);
      this.waiters.delete(waiter);
      done(v);
    };
    this.waiters.add(waiter);
    return { promise, cancel: () => finish(null) };
  }
}

// ---------------------------------------------------------------------------
// HTTP API
// ---------------------------------------------------------------------------

function sendJson(res: http.ServerResponse, status: number, body: unknown): void {
  const data = JSON.stringify(body, null, 2);
  res.writeHead(status, {
    "content-type": "application/json; charset=utf-8",
    "content-length": Buffer.byteLength(data),
    "cache-control": "no-store",
  });
  res.end(data);
}

function sendHtml(res: http.ServerResponse, status: number, html: string, sandbox = false): void {
  res.writeHead(status, {
    "content-type": "text/html; charset=utf-8",
    "content-length": Buffer.byteLength(html),
    "cache-control": "no-store",
    ...(sandbox
      ? {
          "content-security-policy":
            "sandbox; default-src 'none'; img-src data: https: http:; style-src 'unsafe-inline'",
        }
      : {}),
  });
  res.end(html);
}

function inboxPage(messages: StoredMessage[], key: string): string {
  const q = `?key=${encodeURIComponent(key)}`;
  const rows = messages
    .map(
      (m) =>
        `<tr><td>${escapeHtml(m.date.replace("T", " ").slice(0, 19))}</td><td>${escapeHtml(m.from)}</td>` +
        `<td>${escapeHtml([...m.to, ...m.cc].join(", ") || m.envelope.to.join(", "))}</td>` +
        `<td><a href="/messages/${m.id}/html${q}">${escapeHtml(m.subject || "(no subject)")}</a> ` +
        `<a href="/messages/${m.id}${q}">json</a></td></tr>`,
    )
    .join("\n");
  return `<!doctype html><html><head><meta charset="utf-8"><title>Local mail (${messages.length})</title>
<style>body{font:14px system-ui,sans-serif;margin:2rem}table{border-collapse:collapse;width:100%}
td,th{text-align:left;padding:.35rem .6rem;border-bottom:1px solid #ddd}th{background:#f4f4f4}</style></head>
<body><h1>Local mail</h1><p>${messages.length} message(s). Newest first.</p>
<table><tr><th>Received (UTC)</th><th>From</th><th>To</th><th>Subject</th></tr>
${rows || '<tr><td colspan="4">No messages yet.</td></tr>'}</table></body></html>`;
}

function parseIntParam(v: string | null, max: number): number | undefined {
  if (v === null || v === "") return undefined;
  const n = Number.parseInt(v, 10);
  if (!Number.isFinite(n) || n < 0) return undefined;
  return Math.min(n, max);
}

/** Whether a request carries the catcher's key, compared in constant time. */
export function carriesKey(req: http.IncomingMessage, url: URL, key: string): boolean {
  const given = String(req.headers["x-fake-key"] ?? url.searchParams.get("key") ?? "");
  const a = Buffer.from(given);
  const b = Buffer.from(key);
  return a.length === b.length && timingSafeEqual(a, b);
}

function createHttpHandler(store: MessageStore, log: LogFn, pending: Set<() => void>, key: string) {
  return async (req: http.IncomingMessage, res: http.ServerResponse): Promise<void> => {
    const url = new URL(req.url ?? "/", `http://${HOST}`);
    const method = req.method ?? "GET";
    const parts = url.pathname.split("/").filter(Boolean);
    const notAllowed = (allowed: string) => {
      res.setHeader("allow", allowed);
      sendJson(res, 405, { error: `method ${method} not allowed`, allowed: allowed.split(", ") });
    };

    if (parts[0] === "health" && parts.length === 1) {
      if (method !== "GET") return notAllowed("GET");
      return sendJson(res, 200, { ok: true });
    }
    // Without the key the catcher is not there at all: no mail, no count, no hint.
    if (!carriesKey(req, url, key)) return sendJson(res, 404, { error: "not found" });
    if (parts.length === 0) {
      if (method !== "GET") return notAllowed("GET");
      return sendHtml(res, 200, inboxPage(store.list(), key));
    }
    if (parts[0] !== "messages" || parts.length > 3) {
      return sendJson(res, 404, { error: "not found", path: url.pathname });
    }

    const to = url.searchParams.get("to");
    if (parts.length === 1) {
      if (method === "GET") {
        const since = url.searchParams.get("since");
        const limit = parseIntParam(url.searchParams.get("limit"), 10_000);
        const wait = parseIntParam(url.searchParams.get("wait"), MAX_WAIT_MS);
        const query = { to, since, limit };
        let found = store.list(query);
        if (found.length === 0 && wait) {
          const w = store.waitFor((m) => matchesRecipient(m, to) && (since === null || m.id > since), wait);
          pending.add(w.cancel);
          req.on("close", w.cancel);
          await w.promise;
          pending.delete(w.cancel);
          if (res.destroyed) return;
          found = store.list(query);
        }
        return sendJson(res, 200, found);
      }
      if (method === "DELETE") {
        const deleted = store.delete(store.list({ to }).map((m) => m.id));
        log(`deleted ${deleted} message(s)${to ? ` for ${to}` : ""}`);
        return sendJson(res, 200, { deleted });
      }
      return notAllowed("GET, DELETE");
    }

    const id = parts[1] ?? "";
    const msg = ID_RE.test(id) ? store.get(id) : undefined;
    if (parts.length === 3) {
      if (parts[2] !== "html") return sendJson(res, 404, { error: "not found", path: url.pathname });
      if (method !== "GET") return notAllowed("GET");
      if (!msg) return sendJson(res, 404, { error: "message not found", id });
      const body = msg.html ?? `<pre>${escapeHtml(msg.text ?? "")}</pre>`;
      return sendHtml(res, 200, body, true);
    }
    if (method === "GET") {
      return msg ? sendJson(res, 200, msg) : sendJson(res, 404, { error: "message not found", id });
    }
    if (method === "DELETE") {
      if (!msg) return sendJson(res, 404, { error: "message not found", id });
      store.delete([id]);
      return sendJson(res, 200, { deleted: 1 });
    }
    return notAllowed("GET, DELETE");
  };
}

// ---------------------------------------------------------------------------
// Server
// ---------------------------------------------------------------------------

/** Start the SMTP catcher and its HTTP API. Both bind 127.0.0.1 only. */
export async function startSmtpFake(opts: SmtpFakeOptions): Promise<SmtpFake> {
  const log = opts.log ?? stderrLogger("mail");
  for (const [name, port] of [
    ["smtpPort", opts.smtpPort],
    ["httpPort", opts.httpPort],
  ] as const) {
    if (!Number.isInteger(port) || port < 0 || port > 65535) {
      throw new Error(`${name} must be an integer port number (got ${String(port)})`);
    }
  }
  if (!opts.dir || !path.isAbsolute(opts.dir)) {
    throw new Error(`dir must be an absolute path (got ${JSON.stringify(opts.dir)})`);
  }

  const store = new MessageStore(opts.dir, log);
  try {
    store.load();
  } catch (err) {
    throw new Error(`Cannot use mail folder ${opts.dir}: ${(err as Error).message}`, { cause: err });
  }

  const smtp = new SMTPServer({
    secure: false,
    disabledCommands: ["STARTTLS"],
    hideSTARTTLS: true,
    authOptional: true,
    allowInsecureAuth: true,
    size: MAX_MESSAGE_BYTES,
    banner: "Chalkline local mail catcher",
    disableReverseLookup: true,
    logger: false,
    closeTimeout: 2_000,
    onAuth(auth, _session, callback) {
      // Accept any credentials: this server only exists to capture mail locally.
      callback(null, { user: auth.username || "anonymous" });
    },
    onData(stream: SMTPServerDataStream, session: SMTPServerSession, callback: (err?: Error | null) => void) {
      const chunks: Buffer[] = [];
      let size = 0;
      stream.on("data", (chunk: Buffer) => {
        size += chunk.length;
        if (size <= MAX_MESSAGE_BYTES) chunks.push(chunk);
      });
      stream.on("error", (err: Error) => callback(err));
      stream.on("end", () => {
        if (stream.sizeExceeded || size > MAX_MESSAGE_BYTES) {
          const err = new Error(`Message exceeds the ${MAX_MESSAGE_BYTES} byte limit`) as Error & {
            responseCode: number;
          };
          err.responseCode = 552;
          callback(err);
          return;
        }
        const raw = Buffer.concat(chunks);
        simpleParser(raw)
          .then((mail) => {
            const m = toStored(newId(), mail, session, raw.length);
            store.add(m);
            log(`received ${m.id} from ${m.from || "?"} to ${m.envelope.to.join(", ")}: ${m.subject}`);
            callback();
          })
          .catch((err: unknown) => {
            log(`could not parse/store a message: ${(err as Error).message}`);
            const e = new Error("Could not store message") as Error & { responseCode: number };
            e.responseCode = 451;
            callback(e);
          });
      });
    },
  });

  const pending = new Set<() => void>();
  if (!opts.key || opts.key.length < 16) throw new Error("The mail catcher needs a key of at least 16 characters.");
  const handler = createHttpHandler(store, log, pending, opts.key);
  const web = http.createServer((req, res) => {
    handler(req, res).catch((err: unknown) => {
      log(`http error: ${(err as Error).message}`);
      if (!res.headersSent) sendJson(res, 500, { error: "internal error", message: (err as Error).message });
      else res.destroy();
    });
  });

  await new Promise<void>((resolve, reject) => {
    const onError = (err: NodeJS.ErrnoException) => reject(listenError("SMTP", opts.smtpPort, err));
    smtp.once("error", onError);
    smtp.listen(opts.smtpPort, HOST, () => {
      smtp.off("error", onError);
      resolve();
    });
  });
  smtp.on("error", (err: Error) => log(`smtp: ${err.message}`));

  try {
    await new Promise<void>((resolve, reject) => {
      const onError = (err: NodeJS.ErrnoException) => reject(listenError("HTTP", opts.httpPort, err));
      web.once("error", onError);
      web.listen(opts.httpPort, HOST, () => {
        web.off("error", onError);
        resolve();
      });
    });
  } catch (err) {
    await new Promise<void>((r) => smtp.close(() => r()));
    throw err;
  }
  web.on("error", (err: Error) => log(`http: ${err.message}`));

  const smtpPort = (smtp.server.address() as AddressInfo).port;
  const httpPort = (web.address() as AddressInfo).port;
  const apiUrl = `http://${HOST}:${httpPort}`;
  log(`SMTP on ${HOST}:${smtpPort}, API on ${apiUrl} (${store.size} stored message(s) in ${opts.dir})`);

  let closing: Promise<void> | null = null;
  return {
    smtpPort,
    httpPort,
    apiUrl,
    list: (to?: string) => store.list({ to }),
    close() {
      closing ??= (async () => {
        for (const cancel of [...pending]) cancel();
        await Promise.all([
          new Promise<void>((r) => smtp.close(() => r())),
          new Promise<void>((r) => {
            web.close(() => r());
            web.closeAllConnections();
          }),
        ]);
      })();
      return closing;
    },
  };
}

// ---------------------------------------------------------------------------
// Client helpers (for tests and scripts)
// ---------------------------------------------------------------------------

/**
 * Fetch messages for `to` from a running catcher, waiting up to `timeoutMs`
 * for at least one to arrive. Newest first; throws if none arrived in time.
 */
export async function waitForMail(opts: {
  httpPort: number;
  key: string;
  to: string;
  /** Only messages with an id greater than this. */
  since?: string;
  timeoutMs?: number;
}): Promise<StoredMessage[]> {
  const timeoutMs = opts.timeoutMs ?? 10_000;
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const wait = Math.max(0, Math.min(MAX_WAIT_MS, deadline - Date.now()));
    const qs = new URLSearchParams({ to: opts.to, wait: String(wait) });
    if (opts.since) qs.set("since", opts.since);
    const res = await fetch(`http://${HOST}:${opts.httpPort}/messages?${qs.toString()}`, { headers: { "x-fake-key": opts.key } }).catch(
      (err: unknown) => {
        throw new Error(`Mail catcher not reachable on ${HOST}:${opts.httpPort}: ${(err as Error).message}`, {
          cause: err,
        });
      },
    );
    if (!res.ok) throw new Error(`Mail catcher answered HTTP ${res.status} for /messages`);
    const list = (await res.json()) as StoredMessage[];
    if (list.length > 0) return list;
    if (Date.now() >= deadline) throw new Error(`No e-mail for ${opts.to} arrived within ${timeoutMs} ms`);
  }
}

// ---------------------------------------------------------------------------
// CLI
// ---------------------------------------------------------------------------

async function main(argv: string[]): Promise<void> {
  const unknown = argv.filter((a) => a !== "--test");
  if (unknown.length > 0) {
    process.stderr.write(
      `unknown argument(s): ${unknown.join(" ")}\nusage: tsx scripts/fakes/smtp.ts [--test]\n`,
    );
    process.exitCode = 2;
    return;
  }
  const target = argv.includes("--test") ? TEST_MAIL : DEV_MAIL;
  const log = stderrLogger("mail");
  const key = process.env.FAKES_KEY ?? randomBytes(24).toString("base64url");
  const fake = await startSmtpFake({ ...target, log, key });
  log(`inbox: ${fake.apiUrl}/?key=${key}   (Ctrl-C to stop)`);
  const stop = (signal: NodeJS.Signals) => {
    log(`${signal}: shutting down`);
    fake.close().then(
      () => process.exit(0),
      (err: unknown) => {
        process.stderr.write(`mail: error while closing: ${(err as Error).message}\n`);
        process.exit(1);
      },
    );
  };
  process.once("SIGINT", stop);
  process.once("SIGTERM", stop);
}

if (isMain(import.meta.url)) {
  main(process.argv.slice(2)).catch((err: unknown) => {
    process.stderr.write(`mail: ${(err as Error).message}\n`);
    process.exit(1);
  });
}
