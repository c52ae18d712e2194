/**
 * Local fake of the payments API, used through the real `stripe` SDK.
 *
 * The app keeps using the official SDK; in development and tests it is pointed here:
 *   new Stripe(process.env.STRIPE_SECRET_KEY, { host: "127.0.0.1", port, protocol: "http" })
 * (host/port/protocol taken from STRIPE_FAKE_URL). Nothing leaves the machine: the server
 * listens on 127.0.0.1 only, and webhooks are delivered to loopback URLs only.
 *
 * API (form-encoded bodies, exactly as the SDK sends them; `Authorization: Bearer sk_test_…`;
 * errors as {"error": {type, message, param?, code?}} with 400/401/404 so the SDK raises
 * StripeInvalidRequestError / StripeAuthenticationError; Request-Id and Stripe-Version headers;
 * a POST repeated with the same Idempotency-Key and body is answered from memory, with another
 * body it is refused with an idempotency_error):
 *   POST /v1/checkout/sessions                mode=payment only. line_items[n][price_data][currency |
 *                                             unit_amount | product_data][name, description, metadata],
 *                                             line_items[n][quantity]; success_url, cancel_url,
 *                                             customer_email | customer, client_reference_id,
 *                                             metadata[…], payment_intent_data[metadata | description |
 *                                             receipt_email | statement_descriptor(_suffix) |
 *                                             capture_method=automatic(_async)], expires_at (30 min –
 *                                             24 h ahead; default 24 h), locale, submit_type,
 *                                             payment_method_types, expand[]=line_items|payment_intent.
 *                                             A handful of display options (billing_address_collection,
 *                                             allow_promotion_codes, custom_text, …) are accepted and
 *                                             ignored; any other parameter → 400 "Received unknown
 *                                             parameter". Total below 50 minor units → 400.
 *                                             → a checkout.session: status "open", payment_status
 *                                             "unpaid", url = <publicUrl>/pay/<id>.
 *   GET  /v1/checkout/sessions                limit (1–100), starting_after, status, payment_intent.
 *   GET  /v1/checkout/sessions/:id            expand[]=line_items|payment_intent.
 *   GET  /v1/checkout/sessions/:id/line_items
 *   POST /v1/checkout/sessions/:id/expire     open → expired, sends checkout.session.expired.
 *   GET  /v1/payment_intents/:id
 *   GET  /v1/events/:id, GET /v1/events       (limit, type)
 *
 * Hosted page (plain HTML of our own, labelled as a local test page):
 *   GET  /pay/:id                             amount, items, an e-mail field, "Pay" and "Decline".
 *   POST /pay/:id  action=pay [&email=…]      session → status "complete", payment_status "paid",
 *                                             a payment_intent (pi_…, status "succeeded", metadata from
 *                                             payment_intent_data[metadata]); then delivers
 *                                             checkout.session.completed and payment_intent.succeeded
 *                                             (in that order, each retried on failure) BEFORE answering
 *                                             303 → success_url with {CHECKOUT_SESSION_ID} replaced.
 *                                             The real service does not promise that order, so the app
 *                                             must not rely on the webhook having arrived first.
 *                                             Paying a completed session again only redirects.
 *   POST /pay/:id  action=decline             a declined card: the session STAYS OPEN (as it does when
 *                                             a real card is declined), no event is sent, 303 →
 *                                             cancel_url (or the page again, with a note).
 *   An open session past expires_at turns "expired" (checkout.session.expired) when next touched,
 *   or by a sweep once a minute.
 *
 * Webhooks: POST <webhookUrl>, body = the event as pretty-printed JSON,
 *   content-type: application/json; charset=utf-8
 *   Stripe-Signature: t=<unix seconds>,v1=<hex HMAC-SHA256 of "<t>.<raw body>", keyed by the
 *                     webhook secret>           (stripe.webhooks.constructEvent verifies it)
 *   Event: {id: "evt_…", object: "event", api_version, created, data: {object}, livemode: false,
 *           pending_webhooks, request: {id, idempotency_key}, type}. A non-2xx answer or a
 *   connection error is retried (default after 0.25 s, 1 s and 3 s: four attempts, each signed
 *   afresh); every attempt is logged in the event's file.
 *
 * Admin (loopback, no key): GET /health; GET /__fake/events (events with their delivery logs,
 *   newest first); POST /__fake/resend/:eventId (delivers the same event, same id and body, again:
 *   200 when delivered, 502 when not).
 *
 * Storage: <dir>/checkout_sessions/<id>.json, <dir>/payment_intents/<id>.json,
 *   <dir>/events/<id>.json, so a restarted fake keeps its sessions and events. Idempotency keys
 *   are kept in memory only.
 *
 *   tsx scripts/fakes/stripe.ts [--test]   runs until SIGINT/SIGTERM
 *     (webhook URL from STRIPE_WEBHOOK_URL, default http://localhost:3000/api/stripe/webhook, or
 *      port 3100 with --test; keys generated once into .data/stripe-fake-keys.json)
 */
import { closeOnSignals, listenOnLoopback, trackSockets } from "../lib/loopback";
import { createHash, createHmac, randomBytes, timingSafeEqual } from "node:crypto";
import { existsSync, mkdirSync, readdirSync, readFileSync, renameSync, writeFileSync } from "node:fs";
import http from "node:http";
import type { Socket } from "node:net";
import path from "node:path";
import { isMain, repoRoot, stderrLogger, type LogFn } from "../lib/proc";

// ---------------------------------------------------------------------------
// Defaults shared with other scripts
// ---------------------------------------------------------------------------

export interface StripeTarget {
  port: number;
  /** Folder the sessions, payment intents and events are stored in. */
  dir: string;
}

export const DEV_STRIPE: Readonly<StripeTarget> = Object.freeze({
  port: 2720,
  dir: path.join(repoRoot, ".data", "stripe"),
});

export const TEST_STRIPE: Readonly<StripeTarget> = Object.freeze({
  port: 2730,
  dir: path.join(repoRoot, ".data", "stripe-test"),
});

/** API version stamped on events when the request that caused them sent none. */
export const FAKE_API_VERSION = "2026-10-28.endive";
/** Webhook retry delays (ms) after the first attempt. */
export const DEFAULT_WEBHOOK_RETRY_DELAYS_MS: readonly number[] = Object.freeze([250, 1000, 3000]);

const HOST = "127.0.0.1";
const MAX_BODY_BYTES = 1024 * 1024;
const MAX_PARAMS = 2000;
const MAX_KEY_DEPTH = 6;
/** Smallest amount a session may total, in minor units (the service's USD minimum, $0.50: from memory, approximate). */
const MIN_TOTAL = 50;
const MAX_UNIT_AMOUNT = 99_999_999;
const MAX_QUANTITY = 999_999;
const DEFAULT_EXPIRY_S = 24 * 3600;
const MIN_EXPIRY_S = 30 * 60;
const IDEMPOTENCY_TTL_MS = 24 * 3600 * 1000;
const TEST_KEY_RE = /^(sk|rk)_test_[A-Za-z0-9_]{8,}$/;

// ---------------------------------------------------------------------------
// Keys and environment
// ---------------------------------------------------------------------------

export interface FakeStripeKeys {
  secretKey: string;
  webhookSecret: string;
}

function randomToken(length: number): string {
  const alphabet = "0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz";
  const bytes = randomBytes(length);
  let out = "";
  for (let i = 0; i < length; i++) out += alphabet[bytes[i]! % alphabet.length];
  return out;
}

/** A stable secret key + webhook secret for the fake, generated once into .data/ (never committed). */
export function fakeStripeKeys(): FakeStripeKeys {
  const dir = path.join(repoRoot, ".data");
  mkdirSync(dir, { recursive: true, mode: 0o755 });
  const file = path.join(dir, "stripe-fake-keys.json");
  if (existsSync(file)) {
    try {
      const stored = JSON.parse(readFileSync(file, "utf8")) as Partial<FakeStripeKeys>;
      if (
        typeof stored.secretKey === "string" &&
        TEST_KEY_RE.test(stored.secretKey) &&
        typeof stored.webhookSecret === "string"
      ) {
        return { secretKey: stored.secretKey, webhookSecret: stored.webhookSecret };
      }
    } catch {
      /* regenerate below */
    }
  }
  const keys = { secretKey: `sk_test_fake${randomToken(40)}`, webhookSecret: `whsec_${randomToken(40)}` };
  writeFileSync(file, `${JSON.stringify(keys, null, 2)}\n`, { mode: 0o600 });
  return keys;
}

/** Environment for an app that should use the fake. */
export function fakeStripeEnv(opts: {
  url: string;
  secretKey: string;
  webhookSecret: string;
}): Record<string, string> {
  return {
    STRIPE_FAKE_URL: opts.url.replace(/\/$/, ""),
    STRIPE_SECRET_KEY: opts.secretKey,
    STRIPE_WEBHOOK_SECRET: opts.webhookSecret,
  };
}

/** The SDK options that point it at a fake URL: `new Stripe(key, stripeClientOptions(url))`. */
export function stripeClientOptions(fakeUrl: string): { host: string; port: number; protocol: "http" } {
  const u = new URL(fakeUrl);
  return { host: u.hostname, port: Number(u.port || 80), protocol: "http" };
}

/**
 * The Stripe-Signature header for a payload: `t=<unix>,v1=<hex HMAC-SHA256 of "<t>.<payload>">`.
 * Handy for tests that call a webhook route directly.
 */
export function signWebhookPayload(
  payload: string,
  secret: string,
  timestamp = Math.floor(Date.now() / 1000),
): string {
  const v1 = createHmac("sha256", secret).update(`${timestamp}.${payload}`, "utf8").digest("hex");
  return `t=${timestamp},v1=${v1}`;
}

// ---------------------------------------------------------------------------
// Types
// ---------------------------------------------------------------------------

export interface StripeFakeOptions extends StripeTarget {
  /** Where events are POSTed (loopback only); null stores events without delivering them. */
  webhookUrl: string | null;
  webhookSecret: string;
  /** Base URL browsers reach the fake at (for session.url); default http://127.0.0.1:<port>. */
  publicUrl?: string;
  log?: LogFn;
  /** Key the admin endpoints (/__fake/…) require in `x-fake-key`; a random one when not given. */
  adminKey?: string;
  /** When set, only this secret key is accepted; otherwise any sk_test_… / rk_test_… key is. */
  secretKey?: string;
  /** Delays before each webhook retry; default 250, 1000, 3000 ms (four attempts). */
  webhookRetryDelaysMs?: readonly number[];
  /** Per-attempt webhook timeout; default 10 s. */
  webhookTimeoutMs?: number;
}

export interface DeliveryAttempt {
  attempt: number;
  /** ms since epoch */
  at: number;
  status: number | null;
  error: string | null;
}

export interface DeliveryResult {
  eventId: string;
  delivered: boolean;
  attempts: DeliveryAttempt[];
}

export type FakeEvent = {
  id: string;
  object: "event";
  api_version: string;
  created: number;
  data: { object: Record<string, unknown> };
  livemode: false;
  pending_webhooks: number;
  request: { id: string | null; idempotency_key: string | null };
  type: string;
};

export interface StoredEvent {
  event: FakeEvent;
  deliveries: DeliveryAttempt[];
}

export interface StripeFake {
  close(): Promise<void>;
  /** The key its admin endpoints (/__fake/…) require in the `x-fake-key` header. */
  readonly adminKey: string;
  /** Base URL, e.g. http://127.0.0.1:2720 */
  readonly url: string;
  readonly port: number;
  /** Stored events with their delivery logs, newest first. */
  events(): StoredEvent[];
  /** Delivers a stored event again (same id, same body). */
  resend(eventId: string): Promise<DeliveryResult>;
}

interface LineItemState {
  id: string;
  priceId: string;
  productId: string;
  name: string;
  description: string | null;
  currency: string;
  unitAmount: number;
  quantity: number;
  productMetadata: Record<string, string>;
}

interface SessionState {
  id: string;
  created: number;
  expiresAt: number;
  status: "open" | "complete" | "expired";
  paymentStatus: "unpaid" | "paid";
  currency: string;
  amountTotal: number;
  lineItems: LineItemState[];
  successUrl: string | null;
  cancelUrl: string | null;
  customerEmail: string | null;
  customer: string | null;
  payerEmail: string | null;
  clientReferenceId: string | null;
  metadata: Record<string, string>;
  paymentIntentData: {
    metadata: Record<string, string>;
    description: string | null;
    receiptEmail: string | null;
    statementDescriptor: string | null;
    statementDescriptorSuffix: string | null;
    captureMethod: string;
  };
  paymentIntentId: string | null;
  locale: string | null;
  submitType: string | null;
  paymentMethodTypes: string[];
  apiVersion: string;
}

interface PaymentIntentState {
  id: string;
  created: number;
  amount: number;
  currency: string;
  metadata: Record<string, string>;
  description: string | null;
  receiptEmail: string | null;
  statementDescriptor: string | null;
  statementDescriptorSuffix: string | null;
  captureMethod: string;
  clientSecret: string;
  latestCharge: string;
  paymentMethod: string;
}

/** An API error, answered in the service's JSON error shape. */
class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly param: string | null = null,
    readonly type: string = "invalid_request_error",
    readonly code: string | null = null,
  ) {
    super(message);
  }
}

/** An error on the hosted page, answered as HTML. */
class PageError extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

type FormValue = string | FormValue[] | { [key: string]: FormValue };
type FormObject = { [key: string]: FormValue };

// ---------------------------------------------------------------------------
// Small helpers
// ---------------------------------------------------------------------------

function errorText(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

function nowS(): number {
  return Math.floor(Date.now() / 1000);
}

function newId(prefix: string, length = 24): string {
  return `${prefix}_${randomToken(length)}`;
}

function isLoopbackHost(hostname: string): boolean {
  const h = hostname.replace(/^\[|\]$/g, "").toLowerCase();
  return (
    h === "localhost" || h.endsWith(".localhost") || h === "::1" || /^127\.\d{1,3}\.\d{1,3}\.\d{1,3}$/.test(h)
  );
}

function safeEqual(a: string, b: string): boolean {
  const x = Buffer.from(a, "utf8");
  const y = Buffer.from(b, "utf8");
  return x.length === y.length && timingSafeEqual(x, y);
}

function maskKey(key: string): string {
  return key.length > 12
    ? `${key.slice(0, 8)}${"*".repeat(Math.min(20, key.length - 12))}${key.slice(-4)}`
    : "****";
}

function escapeHtml(s: string): string {
  return s.replace(
    /[&<>"']/g,
    (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!,
  );
}

/** Minor units as text: "$12.34" for usd, "12.34 EUR" otherwise (two-decimal currencies). */
function money(amount: number, currency: string): string {
  const whole = Math.floor(amount / 100)
    .toString()
    .replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  const text = `${whole}.${String(amount % 100).padStart(2, "0")}`;
  return currency === "usd" ? `$${text}` : `${text} ${currency.toUpperCase()}`;
}

function sleep(ms: number, signal: AbortSignal): Promise<void> {
  return new Promise((resolve) => {
    if (signal.aborted) return resolve();
    const timer = setTimeout(done, ms);
    function done() {
      clearTimeout(timer);
      signal.removeEventListener("abort", done);
      resolve();
    }
    signal.addEventListener("abort", done, { once: true });
  });
}

function writeJsonAtomic(file: string, value: unknown): void {
  const tmp = `${file}.${process.pid}.${randomToken(6)}.tmp`;
  writeFileSync(tmp, `${JSON.stringify(value, null, 2)}\n`, { mode: 0o644 });
  renameSync(tmp, file);
}

function readJsonDir<T>(dir: string, log: LogFn): T[] {
  if (!existsSync(dir)) return [];
  const out: T[] = [];
  for (const name of readdirSync(dir)) {
    if (!name.endsWith(".json")) continue;
    try {
      out.push(JSON.parse(readFileSync(path.join(dir, name), "utf8")) as T);
    } catch (error) {
      log(`skipping unreadable ${path.join(dir, name)}: ${errorText(error)}`);
    }
  }
  return out;
}


// ---------------------------------------------------------------------------
// Form bodies (the SDK's bracket encoding: a[b][0][c]=v)
// ---------------------------------------------------------------------------

const FORBIDDEN_KEYS = new Set(["__proto__", "prototype", "constructor"]);

function parseKey(raw: string): string[] {
  const m = /^([^[\]]+)((?:\[[^[\]]*\])*)$/.exec(raw);
  if (!m) throw new ApiError(400, `Invalid parameter name: ${raw}`, raw);
  const tokens = [m[1]!];
  for (const part of m[2]!.matchAll(/\[([^[\]]*)\]/g)) tokens.push(part[1]!);
  if (tokens.length > MAX_KEY_DEPTH) throw new ApiError(400, `Parameter nested too deeply: ${raw}`, raw);
  return tokens;
}

type Tree = { [key: string]: Tree | string };

/** Parses a form-encoded body or query into nested objects; numeric keys become arrays (not under metadata). */
export function parseForm(text: string): FormObject {
  const root: Tree = Object.create(null) as Tree;
  let count = 0;
  for (const [rawKey, value] of new URLSearchParams(text)) {
    if (++count > MAX_PARAMS) throw new ApiError(400, "Too many parameters");
    const tokens = parseKey(rawKey);
    let node = root;
    for (let i = 0; i < tokens.length; i++) {
      let token = tokens[i]!;
      if (token === "") token = String(Object.keys(node).filter((k) => /^\d+$/.test(k)).length);
      if (FORBIDDEN_KEYS.has(token)) throw new ApiError(400, `Invalid parameter name: ${rawKey}`, rawKey);
      if (i === tokens.length - 1) {
        if (typeof node[token] === "object")
          throw new ApiError(400, `Invalid value for ${rawKey}: expected a hash`, rawKey);
        node[token] = value;
      } else {
        const child = node[token];
        if (child === undefined) node[token] = Object.create(null) as Tree;
        else if (typeof child === "string")
          throw new ApiError(
            400,
            `Invalid value for ${tokens.slice(0, i + 1).join("[")}: expected a hash`,
            rawKey,
          );
        node = node[token] as Tree;
      }
    }
  }
  return normalizeTree(root, null) as FormObject;
}

function normalizeTree(node: Tree | string, name: string | null): FormValue {
  if (typeof node === "string") return node;
  const keys = Object.keys(node);
  if (name !== "metadata" && keys.length > 0 && keys.every((k) => /^\d+$/.test(k))) {
    return keys.sort((a, b) => Number(a) - Number(b)).map((k) => normalizeTree(node[k]!, k));
  }
  const out: FormObject = {};
  for (const k of keys) out[k] = normalizeTree(node[k]!, k);
  return out;
}

function isFormObject(v: FormValue | undefined): v is FormObject {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

function checkKnown(obj: FormObject, allowed: ReadonlySet<string>, prefix: string): void {
  for (const key of Object.keys(obj)) {
    if (!allowed.has(key)) {
      const param = prefix ? `${prefix}[${key}]` : key;
      throw new ApiError(400, `Received unknown parameter: ${param}`, param);
    }
  }
}

function optString(obj: FormObject, key: string, param: string, max = 5000): string | null {
  const v = obj[key];
  if (v === undefined || v === "") return null;
  if (typeof v !== "string") throw new ApiError(400, `Invalid string: ${param} must be a string`, param);
  if (v.length > max)
    throw new ApiError(400, `Invalid string: ${param} must be at most ${max} characters`, param);
  return v;
}

function optInteger(obj: FormObject, key: string, param: string): number | null {
  const v = optString(obj, key, param, 32);
  if (v === null) return null;
  if (!/^-?\d+$/.test(v)) throw new ApiError(400, `Invalid integer: ${v}`, param);
  return Number(v);
}

function optObject(obj: FormObject, key: string, param: string): FormObject | null {
  const v = obj[key];
  if (v === undefined || v === "") return null;
  if (!isFormObject(v)) throw new ApiError(400, `Invalid object: ${param} must be a hash`, param);
  return v;
}

function optArray(obj: FormObject, key: string, param: string): FormValue[] | null {
  const v = obj[key];
  if (v === undefined || v === "") return null;
  if (!Array.isArray(v)) throw new ApiError(400, `Invalid array: ${param} must be an array`, param);
  return v;
}

function metadataOf(obj: FormObject, key: string, param: string): Record<string, string> {
  const m = optObject(obj, key, param);
  const out: Record<string, string> = {};
  if (!m) return out;
  const keys = Object.keys(m);
  if (keys.length > 50) throw new ApiError(400, `Invalid ${param}: at most 50 keys`, param);
  for (const k of keys) {
    const v = m[k];
    if (typeof v !== "string")
      throw new ApiError(400, `Invalid ${param}[${k}]: metadata values must be strings`, `${param}[${k}]`);
    if (k.length > 40)
      throw new ApiError(400, `Invalid ${param}: keys must be at most 40 characters`, `${param}[${k}]`);
    if (v.length > 500)
      throw new ApiError(
        400,
        `Invalid ${param}[${k}]: values must be at most 500 characters`,
        `${param}[${k}]`,
      );
    if (v !== "") out[k] = v;
  }
  return out;
}

function urlParam(obj: FormObject, key: string): string | null {
  const v = optString(obj, key, key, 5000);
  if (v === null) return null;
  let u: URL;
  try {
    u = new URL(v);
  } catch {
    throw new ApiError(400, `Not a valid URL: ${key}`, key, "invalid_request_error", "url_invalid");
  }
  if (u.protocol !== "http:" && u.protocol !== "https:")
    throw new ApiError(400, `Not a valid URL: ${key}`, key, "invalid_request_error", "url_invalid");
  return v;
}

function emailParam(obj: FormObject, key: string, param: string): string | null {
  const v = optString(obj, key, param, 512);
  if (v === null) return null;
  if (!/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(v))
    throw new ApiError(400, `Invalid email address: ${v}`, param, "invalid_request_error", "email_invalid");
  return v;
}

const EXPANDABLE = new Set(["line_items", "payment_intent"]);

function expandOf(params: FormObject): Set<string> {
  const list = optArray(params, "expand", "expand") ?? [];
  const out = new Set<string>();
  list.forEach((v, i) => {
    if (typeof v !== "string" || !EXPANDABLE.has(v)) {
      throw new ApiError(
        400,
        `This property cannot be expanded (${typeof v === "string" ? v : "?"}).`,
        `expand[${i}]`,
      );
    }
    out.add(v);
  });
  return out;
}

// ---------------------------------------------------------------------------
// Checkout Session creation
// ---------------------------------------------------------------------------

const SESSION_PARAMS = new Set([
  "mode",
  "line_items",
  "success_url",
  "cancel_url",
  "customer_email",
  "customer",
  "client_reference_id",
  "metadata",
  "payment_intent_data",
  "expires_at",
  "expand",
  "locale",
  "submit_type",
  "payment_method_types",
  "ui_mode",
  "currency",
  // accepted, no effect in the fake:
  "billing_address_collection",
  "allow_promotion_codes",
  "phone_number_collection",
  "custom_text",
  "customer_creation",
  "automatic_tax",
  "invoice_creation",
  "consent_collection",
  "tax_id_collection",
  "payment_method_options",
]);
const LINE_ITEM_PARAMS = new Set(["price_data", "price", "quantity", "adjustable_quantity", "tax_rates"]);
const PRICE_DATA_PARAMS = new Set([
  "currency",
  "unit_amount",
  "unit_amount_decimal",
  "product_data",
  "product",
  "tax_behavior",
  "recurring",
]);
const PRODUCT_DATA_PARAMS = new Set(["name", "description", "images", "metadata", "tax_code", "unit_label"]);
const PAYMENT_INTENT_DATA_PARAMS = new Set([
  "metadata",
  "description",
  "receipt_email",
  "statement_descriptor",
  "statement_descriptor_suffix",
  "capture_method",
  "setup_future_usage",
]);

function parseLineItems(params: FormObject): { items: LineItemState[]; currency: string; total: number } {
  const list = optArray(params, "line_items", "line_items");
  if (!list || list.length === 0)
    throw new ApiError(400, "Missing required param: line_items.", "line_items");
  if (list.length > 100) throw new ApiError(400, "Invalid line_items: at most 100 items", "line_items");
  let currency: string | null = null;
  let total = 0;
  const items = list.map((raw, i): LineItemState => {
    const p = `line_items[${i}]`;
    if (!isFormObject(raw)) throw new ApiError(400, `Invalid object: ${p} must be a hash`, p);
    checkKnown(raw, LINE_ITEM_PARAMS, p);
    if (raw.price !== undefined) {
      throw new ApiError(
        400,
        `No such price: '${String(raw.price)}' (the local fake keeps no price catalogue; use price_data)`,
        `${p}[price]`,
        "invalid_request_error",
        "resource_missing",
      );
    }
    const pd = optObject(raw, "price_data", `${p}[price_data]`);
    if (!pd) throw new ApiError(400, `Missing required param: ${p}[price_data].`, `${p}[price_data]`);
    checkKnown(pd, PRICE_DATA_PARAMS, `${p}[price_data]`);
    if (pd.recurring !== undefined)
      throw new ApiError(
        400,
        `${p}[price_data][recurring] is not allowed in payment mode.`,
        `${p}[price_data][recurring]`,
      );
    if (pd.product !== undefined) {
      throw new ApiError(
        400,
        `No such product (the local fake keeps no product catalogue; use product_data)`,
        `${p}[price_data][product]`,
        "invalid_request_error",
        "resource_missing",
      );
    }
    const cur = optString(pd, "currency", `${p}[price_data][currency]`, 3);
    if (!cur)
      throw new ApiError(
        400,
        `Missing required param: ${p}[price_data][currency].`,
        `${p}[price_data][currency]`,
      );
    if (!/^[a-z]{3}$/.test(cur))
      throw new ApiError(400, `Invalid currency: ${cur}`, `${p}[price_data][currency]`);
    if (currency !== null && cur !== currency)
      throw new ApiError(400, "All line items must use the same currency.", `${p}[price_data][currency]`);
    currency = cur;
    let unit = optInteger(pd, "unit_amount", `${p}[price_data][unit_amount]`);
    const decimal = optString(pd, "unit_amount_decimal", `${p}[price_data][unit_amount_decimal]`, 32);
    if (unit !== null && decimal !== null) {
      throw new ApiError(
        400,
        "You may only specify one of these parameters: unit_amount, unit_amount_decimal.",
        `${p}[price_data][unit_amount]`,
      );
    }
    if (decimal !== null) {
      if (!/^\d+(\.0+)?$/.test(decimal)) {
        throw new ApiError(
          400,
          `The local fake supports whole-unit unit_amount_decimal only: ${decimal}`,
          `${p}[price_data][unit_amount_decimal]`,
        );
      }
      unit = Number(decimal.split(".")[0]);
    }
    if (unit === null)
      throw new ApiError(
        400,
        `Missing required param: ${p}[price_data][unit_amount].`,
        `${p}[price_data][unit_amount]`,
      );
    if (unit < 0 || unit > MAX_UNIT_AMOUNT) {
      throw new ApiError(
        400,
        `Invalid ${p}[price_data][unit_amount]: must be between 0 and ${MAX_UNIT_AMOUNT}`,
        `${p}[price_data][unit_amount]`,
      );
    }
    const pdp = optObject(pd, "product_data", `${p}[price_data][product_data]`);
    if (!pdp)
      throw new ApiError(
        400,
        `Missing required param: ${p}[price_data][product_data].`,
        `${p}[price_data][product_data]`,
      );
    checkKnown(pdp, PRODUCT_DATA_PARAMS, `${p}[price_data][product_data]`);
    const name = optString(pdp, "name", `${p}[price_data][product_data][name]`, 250);
    if (!name)
      throw new ApiError(
        400,
        `Missing required param: ${p}[price_data][product_data][name].`,
        `${p}[price_data][product_data][name]`,
      );
    const quantity = optInteger(raw, "quantity", `${p}[quantity]`);
    if (quantity === null)
      throw new ApiError(400, `Missing required param: ${p}[quantity].`, `${p}[quantity]`);
    if (quantity < 1 || quantity > MAX_QUANTITY)
      throw new ApiError(
        400,
        `Invalid ${p}[quantity]: must be between 1 and ${MAX_QUANTITY}`,
        `${p}[quantity]`,
      );
    total += unit * quantity;
    return {
      id: newId("li"),
      priceId: newId("price"),
      productId: newId("prod", 14),
      name,
      description: optString(pdp, "description", `${p}[price_data][product_data][description]`),
      currency: cur,
      unitAmount: unit,
      quantity,
      productMetadata: metadataOf(pdp, "metadata", `${p}[price_data][product_data][metadata]`),
    };
  });
  return { items, currency: currency!, total };
}

function createSessionState(params: FormObject, apiVersion: string): SessionState {
  checkKnown(params, SESSION_PARAMS, "");
  const mode = optString(params, "mode", "mode", 32);
  if (!mode) throw new ApiError(400, "Missing required param: mode.", "mode");
  if (mode !== "payment")
    throw new ApiError(400, `The local fake supports mode=payment only (got ${mode}).`, "mode");
  const uiMode = optString(params, "ui_mode", "ui_mode", 32);
  if (uiMode !== null && uiMode !== "hosted" && uiMode !== "hosted_page") {
    throw new ApiError(
      400,
      `The local fake supports the hosted page only (got ui_mode=${uiMode}).`,
      "ui_mode",
    );
  }
  const { items, currency, total } = parseLineItems(params);
  const topCurrency = optString(params, "currency", "currency", 3);
  if (topCurrency !== null && topCurrency !== currency)
    throw new ApiError(400, "currency must match the line items' currency.", "currency");
  if (total < MIN_TOTAL) {
    throw new ApiError(
      400,
      `The Checkout Session's total must be at least ${money(MIN_TOTAL, currency)} (got ${money(total, currency)}).`,
      "line_items",
      "invalid_request_error",
      "amount_too_small",
    );
  }
  if (total > MAX_UNIT_AMOUNT)
    throw new ApiError(
      400,
      `The Checkout Session's total must be at most ${money(MAX_UNIT_AMOUNT, currency)}.`,
      "line_items",
      "invalid_request_error",
      "amount_too_large",
    );

  const customerEmail = emailParam(params, "customer_email", "customer_email");
  const customer = optString(params, "customer", "customer", 255);
  if (customerEmail && customer)
    throw new ApiError(
      400,
      "You may only specify one of these parameters: customer, customer_email.",
      "customer_email",
    );

  const created = nowS();
  const expiresAtParam = optInteger(params, "expires_at", "expires_at");
  let expiresAt = created + DEFAULT_EXPIRY_S;
  if (expiresAtParam !== null) {
    // a few seconds of slack for clock skew between the app and the fake
    if (expiresAtParam < created + MIN_EXPIRY_S - 5 || expiresAtParam > created + DEFAULT_EXPIRY_S + 5) {
      throw new ApiError(400, "expires_at must be between 30 minutes and 24 hours from now.", "expires_at");
    }
    expiresAt = expiresAtParam;
  }

  const pid = optObject(params, "payment_intent_data", "payment_intent_data") ?? {};
  checkKnown(pid, PAYMENT_INTENT_DATA_PARAMS, "payment_intent_data");
  const captureMethod =
    optString(pid, "capture_method", "payment_intent_data[capture_method]", 32) ?? "automatic_async";
  if (captureMethod !== "automatic" && captureMethod !== "automatic_async") {
    throw new ApiError(
      400,
      `The local fake supports automatic capture only (got ${captureMethod}).`,
      "payment_intent_data[capture_method]",
    );
  }

  const pmTypes = optArray(params, "payment_method_types", "payment_method_types");
  const paymentMethodTypes = pmTypes
    ? pmTypes.map((t, i) => {
        if (typeof t !== "string" || !t)
          throw new ApiError(400, "Invalid payment_method_types", `payment_method_types[${i}]`);
        return t;
      })
    : ["card"];

  return {
    id: `cs_test_${randomToken(58)}`,
    created,
    expiresAt,
    status: "open",
    paymentStatus: "unpaid",
    currency,
    amountTotal: total,
    lineItems: items,
    successUrl: urlParam(params, "success_url"),
    cancelUrl: urlParam(params, "cancel_url"),
    customerEmail,
    customer,
    payerEmail: null,
    clientReferenceId: optString(params, "client_reference_id", "client_reference_id", 200),
    metadata: metadataOf(params, "metadata", "metadata"),
    paymentIntentData: {
      metadata: metadataOf(pid, "metadata", "payment_intent_data[metadata]"),
      description: optString(pid, "description", "payment_intent_data[description]", 1000),
      receiptEmail: emailParam(pid, "receipt_email", "payment_intent_data[receipt_email]"),
      statementDescriptor: optString(
        pid,
        "statement_descriptor",
        "payment_intent_data[statement_descriptor]",
        22,
      ),
      statementDescriptorSuffix: optString(
        pid,
        "statement_descriptor_suffix",
        "payment_intent_data[statement_descriptor_suffix]",
        22,
      ),
      captureMethod,
    },
    paymentIntentId: null,
    locale: optString(params, "locale", "locale", 16),
    submitType: optString(params, "submit_type", "submit_type", 16),
    paymentMethodTypes,
    apiVersion,
  };
}

// ---------------------------------------------------------------------------
// Wire objects
// ---------------------------------------------------------------------------

function renderPaymentIntent(pi: PaymentIntentState): Record<string, unknown> {
  return {
    id: pi.id,
    object: "payment_intent",
    amount: pi.amount,
    amount_capturable: 0,
    amount_details: { tip: {} },
    amount_received: pi.amount,
    application: null,
    application_fee_amount: null,
    automatic_payment_methods: null,
    canceled_at: null,
    cancellation_reason: null,
    capture_method: pi.captureMethod,
    client_secret: pi.clientSecret,
    confirmation_method: "automatic",
    created: pi.created,
    currency: pi.currency,
    customer: null,
    description: pi.description,
    last_payment_error: null,
    latest_charge: pi.latestCharge,
    livemode: false,
    metadata: pi.metadata,
    next_action: null,
    on_behalf_of: null,
    payment_method: pi.paymentMethod,
    payment_method_options: {},
    payment_method_types: ["card"],
    processing: null,
    receipt_email: pi.receiptEmail,
    review: null,
    setup_future_usage: null,
    shipping: null,
    source: null,
    statement_descriptor: pi.statementDescriptor,
    statement_descriptor_suffix: pi.statementDescriptorSuffix,
    status: "succeeded",
    transfer_data: null,
    transfer_group: null,
  };
}

function renderLineItems(s: SessionState): Record<string, unknown> {
  return {
    object: "list",
    data: s.lineItems.map((li) => ({
      id: li.id,
      object: "item",
      amount_discount: 0,
      amount_subtotal: li.unitAmount * li.quantity,
      amount_tax: 0,
      amount_total: li.unitAmount * li.quantity,
      currency: li.currency,
      description: li.name,
      price: {
        id: li.priceId,
        object: "price",
        active: false,
        billing_scheme: "per_unit",
        created: s.created,
        currency: li.currency,
        custom_unit_amount: null,
        livemode: false,
        lookup_key: null,
        metadata: {},
        nickname: null,
        product: li.productId,
        recurring: null,
        tax_behavior: "unspecified",
        tiers_mode: null,
        transform_quantity: null,
        type: "one_time",
        unit_amount: li.unitAmount,
        unit_amount_decimal: String(li.unitAmount),
      },
      quantity: li.quantity,
    })),
    has_more: false,
    url: `/v1/checkout/sessions/${s.id}/line_items`,
  };
}

// ---------------------------------------------------------------------------
// The hosted page
// ---------------------------------------------------------------------------

const PAGE_STYLE = `
  body { margin: 0; font: 16px/1.45 system-ui, sans-serif; background: #eef0e8; color: #1d2118; }
  main { max-width: 34rem; margin: 2.5rem auto; padding: 1.5rem 1.75rem; background: #fff; border: 2px dashed #7a8a4a; }
  .tag { margin: 0 0 1rem; padding: .4rem .6rem; background: #fff6c9; border: 1px solid #d8c25a; font-size: .85rem; }
  h1 { margin: 0 0 1rem; font-size: 1.6rem; }
  table { width: 100%; border-collapse: collapse; margin-bottom: 1rem; }
  td, th { padding: .35rem 0; border-bottom: 1px solid #dde0d4; text-align: left; vertical-align: top; }
  td.n, th.n { text-align: right; white-space: nowrap; }
  label { display: block; margin: 1rem 0; font-size: .9rem; }
  input { display: block; width: 100%; box-sizing: border-box; margin-top: .25rem; padding: .45rem; font: inherit; }
  .actions { display: flex; gap: .75rem; }
  button { flex: 1; padding: .7rem; font: inherit; font-weight: 600; cursor: pointer; border: 2px solid #1d2118; }
  button.pay { background: #2f5d1e; color: #fff; }
  button.decline { background: #fff; color: #1d2118; }
  .note { padding: .5rem .6rem; background: #fde3dc; border: 1px solid #d77b62; }
  .fine { margin-top: 1.25rem; color: #5b6151; font-size: .8rem; word-break: break-all; }
`;

function page(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex"><title>${escapeHtml(title)}</title><style>${PAGE_STYLE}</style></head>
<body><main>
<p class="tag"><strong>Local test payment page.</strong> Served by the payments fake on this machine: no card is charged and no money moves.</p>
${body}
</main></body>
</html>`;
}

function sessionPage(s: SessionState, note: string | null): string {
  const total = money(s.amountTotal, s.currency);
  const rows = s.lineItems
    .map(
      (li) =>
        `<tr><td>${escapeHtml(li.name)}${li.description ? `<br><small>${escapeHtml(li.description)}</small>` : ""}</td>` +
        `<td class="n">${li.quantity} × ${money(li.unitAmount, li.currency)}</td><td class="n">${money(li.unitAmount * li.quantity, li.currency)}</td></tr>`,
    )
    .join("");
  const table = `<table><thead><tr><th>Item</th><th class="n">Qty</th><th class="n">Amount</th></tr></thead><tbody>${rows}</tbody>
<tfoot><tr><th colspan="2">Total</th><th class="n" data-testid="fake-pay-total">${total}</th></tr></tfoot></table>`;
  const ref = s.clientReferenceId ? `<p>Reference: ${escapeHtml(s.clientReferenceId)}</p>` : "";
  const fine = `<p class="fine">Session ${escapeHtml(s.id)} · status ${s.status} · expires ${new Date(s.expiresAt * 1000).toISOString()}</p>`;
  if (s.status === "complete") {
    const back = s.successUrl
      ? `<p><a href="${escapeHtml(fillSessionId(s.successUrl, s.id))}">Continue</a></p>`
      : "";
    return page(
      `Paid: ${total}`,
      `<h1>Paid ${total}</h1>${table}${ref}<p>This test payment is complete.</p>${back}${fine}`,
    );
  }
  if (s.status === "expired") {
    const back = s.cancelUrl ? `<p><a href="${escapeHtml(s.cancelUrl)}">Go back</a></p>` : "";
    return page(`Expired: ${total}`, `<h1>This payment link has expired</h1>${table}${ref}${back}${fine}`);
  }
  const email = s.customerEmail ?? s.paymentIntentData.receiptEmail ?? "";
  const noteHtml = note ? `<p class="note" role="status">${escapeHtml(note)}</p>` : "";
  const form = `<form method="post" action="/pay/${encodeURIComponent(s.id)}">
<label>E-mail for the receipt<input type="email" name="email" value="${escapeHtml(email)}" autocomplete="off"></label>
<div class="actions"><button class="pay" type="submit" name="action" value="pay" data-testid="fake-pay">Pay ${total}</button>
<button class="decline" type="submit" name="action" value="decline" data-testid="fake-decline">Decline</button></div>
</form>`;
  return page(`Pay ${total}`, `<h1>Pay ${total}</h1>${noteHtml}${table}${ref}${form}${fine}`);
}

function decodePart(part: string): string {
  try {
    return decodeURIComponent(part);
  } catch {
    throw new ApiError(400, `Malformed URL segment: ${part}`);
  }
}

function fillSessionId(url: string, id: string): string {
  return url.split("{CHECKOUT_SESSION_ID}").join(id);
}

// ---------------------------------------------------------------------------
// Server
// ---------------------------------------------------------------------------

export async function startStripeFake(opts: StripeFakeOptions): Promise<StripeFake> {
  const log = opts.log ?? (() => {});
  const adminKey = opts.adminKey ?? randomBytes(24).toString("base64url");
  const retryDelays = [...(opts.webhookRetryDelaysMs ?? DEFAULT_WEBHOOK_RETRY_DELAYS_MS)];
  const webhookTimeoutMs = opts.webhookTimeoutMs ?? 10_000;
  if (!opts.webhookSecret) throw new Error("A webhook secret is required");
  let webhookTarget: URL | null = null;
  if (opts.webhookUrl) {
    webhookTarget = new URL(opts.webhookUrl);
    if (webhookTarget.protocol !== "http:")
      throw new Error(`Webhook URL must be http:// on loopback: ${opts.webhookUrl}`);
    if (!isLoopbackHost(webhookTarget.hostname))
      throw new Error(`Webhook URL must point at this machine (loopback only): ${opts.webhookUrl}`);
  }
  if (opts.secretKey !== undefined && !TEST_KEY_RE.test(opts.secretKey))
    throw new Error("secretKey must be a test-mode key (sk_test_… or rk_test_…)");

  const dirs = {
    sessions: path.join(opts.dir, "checkout_sessions"),
    intents: path.join(opts.dir, "payment_intents"),
    events: path.join(opts.dir, "events"),
  };
  for (const d of Object.values(dirs)) mkdirSync(d, { recursive: true, mode: 0o755 });

  const sessions = new Map<string, SessionState>();
  const intents = new Map<string, PaymentIntentState>();
  const events = new Map<string, StoredEvent>();
  for (const s of readJsonDir<SessionState>(dirs.sessions, log)) if (s?.id) sessions.set(s.id, s);
  for (const pi of readJsonDir<PaymentIntentState>(dirs.intents, log)) if (pi?.id) intents.set(pi.id, pi);
  for (const e of readJsonDir<StoredEvent>(dirs.events, log)) if (e?.event?.id) events.set(e.event.id, e);

  const idempotency = new Map<string, { fingerprint: string; status: number; body: string; at: number }>();
  const sockets = new Set<Socket>();
  const abort = new AbortController();
  let deliveryChain: Promise<unknown> = Promise.resolve();
  let baseUrl = "";
  let publicUrl = "";

  const saveSession = (s: SessionState) => writeJsonAtomic(path.join(dirs.sessions, `${s.id}.json`), s);
  const saveIntent = (pi: PaymentIntentState) =>
    writeJsonAtomic(path.join(dirs.intents, `${pi.id}.json`), pi);
  const saveEvent = (e: StoredEvent) => writeJsonAtomic(path.join(dirs.events, `${e.event.id}.json`), e);

  function renderSession(s: SessionState, expand: ReadonlySet<string> = new Set()): Record<string, unknown> {
    const paid = s.paymentStatus === "paid";
    const email = s.payerEmail ?? s.customerEmail;
    const pi = s.paymentIntentId ? intents.get(s.paymentIntentId) : undefined;
    return {
      id: s.id,
      object: "checkout.session",
      adaptive_pricing: { enabled: false },
      after_expiration: null,
      allow_promotion_codes: null,
      amount_subtotal: s.amountTotal,
      amount_total: s.amountTotal,
      automatic_tax: { enabled: false, liability: null, provider: null, status: null },
      billing_address_collection: null,
      cancel_url: s.cancelUrl,
      client_reference_id: s.clientReferenceId,
      client_secret: null,
      collected_information: null,
      consent: null,
      consent_collection: null,
      created: s.created,
      currency: s.currency,
      currency_conversion: null,
      custom_fields: [],
      custom_text: {
        after_submit: null,
        shipping_address: null,
        submit: null,
        terms_of_service_acceptance: null,
      },
      customer: s.customer,
      customer_account: null,
      customer_creation: s.customer ? null : "if_required",
      customer_details:
        paid || email
          ? { address: null, email: email ?? null, name: null, phone: null, tax_exempt: "none", tax_ids: [] }
          : null,
      customer_email: s.customerEmail,
      discounts: [],
      expires_at: s.expiresAt,
      invoice: null,
      invoice_creation: null,
      livemode: false,
      locale: s.locale,
      metadata: s.metadata,
      mode: "payment",
      origin_context: null,
      payment_intent: expand.has("payment_intent") && pi ? renderPaymentIntent(pi) : s.paymentIntentId,
      payment_link: null,
      payment_method_collection: "if_required",
      payment_method_configuration_details: null,
      payment_method_options: {},
      payment_method_types: s.paymentMethodTypes,
      payment_status: s.paymentStatus,
      permissions: null,
      phone_number_collection: { enabled: false },
      recovered_from: null,
      saved_payment_method_options: null,
      setup_intent: null,
      shipping_address_collection: null,
      shipping_cost: null,
      shipping_options: [],
      status: s.status,
      submit_type: s.submitType,
      subscription: null,
      success_url: s.successUrl,
      total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
      ui_mode: "hosted_page",
      url: s.status === "open" ? `${publicUrl}/pay/${s.id}` : null,
      wallet_options: null,
      ...(expand.has("line_items") ? { line_items: renderLineItems(s) } : {}),
    };
  }

  function createEvent(
    type: string,
    object: Record<string, unknown>,
    apiVersion: string,
    request: FakeEvent["request"],
  ): StoredEvent {
    const stored: StoredEvent = {
      event: {
        id: newId("evt"),
        object: "event",
        api_version: apiVersion,
        created: nowS(),
        data: { object },
        livemode: false,
        pending_webhooks: webhookTarget ? 1 : 0,
        request,
        type,
      },
      deliveries: [],
    };
    events.set(stored.event.id, stored);
    saveEvent(stored);
    return stored;
  }

  function postOnce(body: string, signature: string): Promise<number> {
    const target = webhookTarget!;
    return new Promise((resolve, reject) => {
      const req = http.request(
        {
          hostname: target.hostname.replace(/^\[|\]$/g, ""),
          port: target.port || 80,
          path: `${target.pathname}${target.search}`,
          method: "POST",
          agent: false,
          signal: abort.signal,
          timeout: webhookTimeoutMs,
          headers: {
            "Content-Type": "application/json; charset=utf-8",
            "Content-Length": Buffer.byteLength(body),
            "Stripe-Signature": signature,
            "User-Agent": "chalkline-payments-fake/1",
            Accept: "*/*; q=0.5, application/json",
            "Cache-Control": "no-cache",
          },
        },
        (res) => {
          res.resume();
          res.on("end", () => resolve(res.statusCode ?? 0));
          res.on("error", reject);
        },
      );
      req.on("timeout", () => req.destroy(new Error(`no answer within ${webhookTimeoutMs} ms`)));
      req.on("error", reject);
      req.end(body);
    });
  }

  async function deliverNow(stored: StoredEvent): Promise<DeliveryResult> {
    const attempts: DeliveryAttempt[] = [];
    const result = (delivered: boolean): DeliveryResult => ({
      eventId: stored.event.id,
      delivered,
      attempts,
    });
    if (!webhookTarget) return result(false);
    const body = JSON.stringify(stored.event, null, 2);
    for (let attempt = 1; attempt <= retryDelays.length + 1; attempt++) {
      if (attempt > 1) await sleep(retryDelays[attempt - 2]!, abort.signal);
      if (abort.signal.aborted) break;
      const record: DeliveryAttempt = { attempt, at: Date.now(), status: null, error: null };
      try {
        record.status = await postOnce(body, signWebhookPayload(body, opts.webhookSecret));
        if (record.status < 200 || record.status > 299) record.error = `HTTP ${record.status}`;
      } catch (error) {
        record.error = errorText(error);
      }
      attempts.push(record);
      stored.deliveries.push(record);
      const ok = record.error === null;
      log(
        `webhook ${stored.event.type} ${stored.event.id} → ${record.status ?? record.error} (attempt ${attempt})`,
      );
      if (ok) {
        saveEvent(stored);
        return result(true);
      }
    }
    saveEvent(stored);
    return result(false);
  }

  /** Deliveries run one at a time, in the order events were made. */
  function deliver(stored: StoredEvent): Promise<DeliveryResult> {
    const run = deliveryChain.then(() => deliverNow(stored));
    deliveryChain = run.catch(() => undefined);
    return run;
  }

  function expireIfDue(s: SessionState): void {
    if (s.status !== "open" || nowS() < s.expiresAt) return;
    s.status = "expired";
    saveSession(s);
    void deliver(
      createEvent("checkout.session.expired", renderSession(s), s.apiVersion, {
        id: null,
        idempotency_key: null,
      }),
    );
  }

  function getSession(id: string): SessionState {
    const s = sessions.get(id);
    if (!s)
      throw new ApiError(
        404,
        `No such checkout.session: '${id}'`,
        "session",
        "invalid_request_error",
        "resource_missing",
      );
    expireIfDue(s);
    return s;
  }

  // --- API --------------------------------------------------------------------

  function authenticate(req: http.IncomingMessage): void {
    const header = req.headers.authorization ?? "";
    let key = "";
    const bearer = /^Bearer\s+(\S+)$/i.exec(header);
    const basic = /^Basic\s+(\S+)$/i.exec(header);
    if (bearer) key = bearer[1]!;
    else if (basic) key = Buffer.from(basic[1]!, "base64").toString("utf8").split(":")[0] ?? "";
    if (!key) {
      throw new ApiError(
        401,
        "You did not provide an API key. Send it as a Bearer token in the Authorization header.",
      );
    }
    if (/^(sk|rk)_live_/.test(key))
      throw new ApiError(401, "This local fake accepts test-mode keys only; a live key was sent.");
    const valid = opts.secretKey !== undefined ? safeEqual(key, opts.secretKey) : TEST_KEY_RE.test(key);
    if (!valid)
      throw new ApiError(
        401,
        `Invalid API Key provided: ${maskKey(key)}`,
        null,
        "invalid_request_error",
        "api_key_invalid",
      );
  }

  function apiList<T>(
    all: T[],
    params: FormObject,
    idOf: (t: T) => string,
    render: (t: T) => unknown,
    url: string,
  ) {
    const limitRaw = optInteger(params, "limit", "limit");
    const limit = limitRaw ?? 10;
    if (limit < 1 || limit > 100)
      throw new ApiError(400, "Invalid limit: must be between 1 and 100", "limit");
    let start = 0;
    const after = optString(params, "starting_after", "starting_after", 255);
    if (after) {
      const i = all.findIndex((t) => idOf(t) === after);
      if (i < 0)
        throw new ApiError(
          400,
          `No such object: '${after}'`,
          "starting_after",
          "invalid_request_error",
          "resource_missing",
        );
      start = i + 1;
    }
    const page = all.slice(start, start + limit);
    return { object: "list", data: page.map(render), has_more: start + limit < all.length, url };
  }

  type ApiAnswer = { status: number; body: unknown };

  function handleApi(
    method: string,
    pathname: string,
    params: FormObject,
    req: http.IncomingMessage,
    requestId: string,
    apiVersion: string,
  ): ApiAnswer {
    const parts = pathname.split("/").filter(Boolean).map(decodePart); // ["v1", ...]
    const idemKey =
      typeof req.headers["idempotency-key"] === "string" ? req.headers["idempotency-key"] : null;
    const [, resource, sub, id, action, ...rest] = parts;
    if (rest.length === 0 && resource === "checkout" && sub === "sessions") {
      if (method === "POST" && id === undefined) {
        const expand = expandOf(params);
        const s = createSessionState(params, apiVersion);
        sessions.set(s.id, s);
        saveSession(s);
        log(`session ${s.id} created: ${money(s.amountTotal, s.currency)}`);
        return { status: 200, body: renderSession(s, expand) };
      }
      if (method === "GET" && id === undefined) {
        const status = optString(params, "status", "status", 16);
        const piFilter = optString(params, "payment_intent", "payment_intent", 255);
        for (const s of sessions.values()) expireIfDue(s);
        const all = [...sessions.values()]
          .filter((s) => (!status || s.status === status) && (!piFilter || s.paymentIntentId === piFilter))
          .sort((a, b) => b.created - a.created);
        const expand = new Set([...expandOf(params)].filter((e) => e !== "line_items"));
        return {
          status: 200,
          body: apiList(
            all,
            params,
            (s) => s.id,
            (s) => renderSession(s, expand),
            "/v1/checkout/sessions",
          ),
        };
      }
      if (id !== undefined) {
        const s = getSession(id);
        if (method === "GET" && action === undefined)
          return { status: 200, body: renderSession(s, expandOf(params)) };
        if (method === "GET" && action === "line_items") {
          const list = renderLineItems(s) as { data: unknown[] };
          return {
            status: 200,
            body: apiList(
              list.data,
              params,
              (li) => (li as { id: string }).id,
              (li) => li,
              `/v1/checkout/sessions/${s.id}/line_items`,
            ),
          };
        }
        if (method === "POST" && action === "expire") {
          const expand = expandOf(params);
          if (s.status !== "open") {
            throw new ApiError(
              400,
              `Only Checkout Sessions with status "open" can be expired; this one is "${s.status}".`,
              null,
              "invalid_request_error",
              "checkout_session_not_open",
            );
          }
          s.status = "expired";
          saveSession(s);
          void deliver(
            createEvent("checkout.session.expired", renderSession(s), s.apiVersion, {
              id: requestId,
              idempotency_key: idemKey,
            }),
          );
          log(`session ${s.id} expired by request`);
          return { status: 200, body: renderSession(s, expand) };
        }
      }
    }
    if (
      rest.length === 0 &&
      resource === "payment_intents" &&
      sub !== undefined &&
      id === undefined &&
      method === "GET"
    ) {
      const pi = intents.get(sub);
      if (!pi)
        throw new ApiError(
          404,
          `No such payment_intent: '${sub}'`,
          "intent",
          "invalid_request_error",
          "resource_missing",
        );
      return { status: 200, body: renderPaymentIntent(pi) };
    }
    if (rest.length === 0 && resource === "events" && id === undefined && method === "GET") {
      if (sub !== undefined) {
        const e = events.get(sub);
        if (!e)
          throw new ApiError(
            404,
            `No such event: '${sub}'`,
            "id",
            "invalid_request_error",
            "resource_missing",
          );
        return { status: 200, body: e.event };
      }
      const type = optString(params, "type", "type", 100);
      const all = [...events.values()]
        .filter((e) => !type || e.event.type === type)
        .sort((a, b) => b.event.created - a.event.created);
      return {
        status: 200,
        body: apiList(
          all,
          params,
          (e) => e.event.id,
          (e) => e.event,
          "/v1/events",
        ),
      };
    }
    throw new ApiError(404, `Unrecognized request URL (${method}: ${pathname}).`);
  }

  async function readBody(req: http.IncomingMessage): Promise<string> {
    const chunks: Buffer[] = [];
    let size = 0;
    for await (const chunk of req) {
      size += (chunk as Buffer).length;
      if (size > MAX_BODY_BYTES) throw new ApiError(413, "Request body too large");
      chunks.push(chunk as Buffer);
    }
    return Buffer.concat(chunks).toString("utf8");
  }

  function sendJson(
    res: http.ServerResponse,
    status: number,
    text: string,
    headers: Record<string, string> = {},
  ): void {
    if (res.headersSent || res.destroyed) return;
    res.writeHead(status, {
      "Content-Type": "application/json; charset=utf-8",
      "Content-Length": Buffer.byteLength(text),
      "Cache-Control": "no-cache, no-store",
      ...headers,
    });
    res.end(text);
  }

  function errorBody(error: ApiError): string {
    const e: Record<string, unknown> = { type: error.type, message: error.message };
    if (error.param) e.param = error.param;
    if (error.code) e.code = error.code;
    return JSON.stringify({ error: e }, null, 2);
  }

  async function api(req: http.IncomingMessage, res: http.ServerResponse, url: URL): Promise<void> {
    const requestId = newId("req", 14);
    const method = req.method ?? "GET";
    const apiVersion =
      typeof req.headers["stripe-version"] === "string" && req.headers["stripe-version"]
        ? req.headers["stripe-version"]
        : FAKE_API_VERSION;
    const headers: Record<string, string> = { "Request-Id": requestId, "Stripe-Version": apiVersion };
    const idemKey =
      typeof req.headers["idempotency-key"] === "string" ? req.headers["idempotency-key"] : null;
    try {
      const raw = method === "POST" ? await readBody(req) : url.search.slice(1);
      authenticate(req);
      if (method === "POST") {
        const ct = (req.headers["content-type"] ?? "application/x-www-form-urlencoded")
          .split(";")[0]!
          .trim()
          .toLowerCase();
        if (raw && ct !== "application/x-www-form-urlencoded") {
          throw new ApiError(
            400,
            `Invalid request: bodies must be form-encoded (application/x-www-form-urlencoded), not ${ct}.`,
          );
        }
      } else if (method !== "GET" && method !== "DELETE") {
        throw new ApiError(404, `Unrecognized request URL (${method}: ${url.pathname}).`);
      }
      let fingerprint = "";
      if (method === "POST" && idemKey) {
        headers["Idempotency-Key"] = idemKey;
        fingerprint = createHash("sha256").update(`${url.pathname}\n${raw}`).digest("hex");
        const cached = idempotency.get(idemKey);
        if (cached && Date.now() - cached.at < IDEMPOTENCY_TTL_MS) {
          if (cached.fingerprint !== fingerprint) {
            throw new ApiError(
              400,
              `Idempotency-Key ${idemKey} was already used with other parameters or another path.`,
              null,
              "idempotency_error",
            );
          }
          sendJson(res, cached.status, cached.body, { ...headers, "Idempotent-Replayed": "true" });
          return;
        }
      }
      let status: number;
      let text: string;
      try {
        const answer = handleApi(method, url.pathname, parseForm(raw), req, requestId, apiVersion);
        status = answer.status;
        text = JSON.stringify(answer.body, null, 2);
      } catch (error) {
        if (!(error instanceof ApiError) || error.status >= 500) throw error;
        status = error.status;
        text = errorBody(error);
      }
      if (fingerprint && idemKey) {
        idempotency.set(idemKey, { fingerprint, status, body: text, at: Date.now() });
        if (idempotency.size > 10_000) idempotency.delete(idempotency.keys().next().value!);
      }
      sendJson(res, status, text, headers);
    } catch (error) {
      if (error instanceof ApiError) {
        sendJson(res, error.status, errorBody(error), headers);
        return;
      }
      log(`error handling ${method} ${url.pathname}: ${errorText(error)}`);
      sendJson(
        res,
        500,
        errorBody(new ApiError(500, `Payments fake error: ${errorText(error)}`, null, "api_error")),
        headers,
      );
    }
  }

  // --- hosted page ---------------------------------------------------------------

  function sendHtml(res: http.ServerResponse, status: number, html: string): void {
    if (res.headersSent || res.destroyed) return;
    res.writeHead(status, {
      "Content-Type": "text/html; charset=utf-8",
      "Content-Length": Buffer.byteLength(html),
      "Cache-Control": "no-store",
      "X-Frame-Options": "DENY",
      "Content-Security-Policy":
        "default-src 'none'; style-src 'unsafe-inline'; form-action 'self' http: https:",
    });
    res.end(html);
  }

  function redirect(res: http.ServerResponse, location: string): void {
    res.writeHead(303, { Location: location, "Content-Length": 0, "Cache-Control": "no-store" });
    res.end();
  }

  async function payPage(req: http.IncomingMessage, res: http.ServerResponse, id: string): Promise<void> {
    const s = sessions.get(id);
    if (!s) throw new PageError(404, "There is no payment session with this id.");
    expireIfDue(s);
    if (req.method === "GET" || req.method === "HEAD") {
      sendHtml(res, 200, sessionPage(s, null));
      return;
    }
    if (req.method !== "POST") throw new PageError(405, "Use GET to view or POST to pay or decline.");
    const chunks: Buffer[] = [];
    let size = 0;
    for await (const chunk of req) {
      size += (chunk as Buffer).length;
      if (size > 64 * 1024) throw new PageError(413, "Form too large.");
      chunks.push(chunk as Buffer);
    }
    const form = new URLSearchParams(Buffer.concat(chunks).toString("utf8"));
    const action = form.get("action");
    if (action === "pay") {
      if (s.status === "complete") {
        if (s.successUrl) redirect(res, fillSessionId(s.successUrl, s.id));
        else sendHtml(res, 200, sessionPage(s, null));
        return;
      }
      if (s.status !== "open") throw new PageError(410, "This payment session has expired.");
      const email = (form.get("email") ?? "").trim();
      if (email && !/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(email)) {
        sendHtml(res, 400, sessionPage(s, "That e-mail address does not look right."));
        return;
      }
      // Everything below runs before the first await, so a second click cannot pay twice.
      const pd = s.paymentIntentData;
      const pi: PaymentIntentState = {
        id: newId("pi"),
        created: nowS(),
        amount: s.amountTotal,
        currency: s.currency,
        metadata: pd.metadata,
        description: pd.description,
        receiptEmail: pd.receiptEmail ?? (email || s.customerEmail),
        statementDescriptor: pd.statementDescriptor,
        statementDescriptorSuffix: pd.statementDescriptorSuffix,
        captureMethod: pd.captureMethod,
        clientSecret: "",
        latestCharge: newId("ch"),
        paymentMethod: newId("pm"),
      };
      pi.clientSecret = `${pi.id}_secret_${randomToken(25)}`;
      intents.set(pi.id, pi);
      saveIntent(pi);
      s.status = "complete";
      s.paymentStatus = "paid";
      s.paymentIntentId = pi.id;
      s.payerEmail = email || s.customerEmail;
      saveSession(s);
      log(`session ${s.id} paid: ${money(s.amountTotal, s.currency)} (${pi.id})`);
      const request = { id: null, idempotency_key: null };
      const completed = createEvent("checkout.session.completed", renderSession(s), s.apiVersion, request);
      const succeeded = createEvent(
        "payment_intent.succeeded",
        renderPaymentIntent(pi),
        s.apiVersion,
        request,
      );
      await Promise.all([deliver(completed), deliver(succeeded)]);
      if (s.successUrl) redirect(res, fillSessionId(s.successUrl, s.id));
      else sendHtml(res, 200, sessionPage(s, null));
      return;
    }
    if (action === "decline") {
      if (s.status !== "open") {
        sendHtml(res, 409, sessionPage(s, null));
        return;
      }
      log(`session ${s.id}: test card declined; session stays open`);
      if (s.cancelUrl) redirect(res, s.cancelUrl);
      else
        sendHtml(
          res,
          200,
          sessionPage(s, "Declined (test). Nothing was charged; the session is still open."),
        );
      return;
    }
    throw new PageError(400, "Unknown action: use action=pay or action=decline.");
  }

  // --- routing -------------------------------------------------------------------

  async function route(req: http.IncomingMessage, res: http.ServerResponse): Promise<void> {
    const url = new URL(req.url ?? "/", baseUrl);
    const { pathname } = url;
    const method = req.method ?? "GET";
    if (pathname.startsWith("/v1/")) return api(req, res, url);
    const pay = /^\/pay\/([^/]+)$/.exec(pathname);
    if (pay) return payPage(req, res, decodePart(pay[1]!));
    if (pathname === "/health" && method === "GET") {
      sendJson(res, 200, JSON.stringify({ ok: true, sessions: sessions.size, events: events.size }));
      return;
    }
    // The admin endpoints list customers' e-mail addresses and replay events: key holders only.
    if (pathname.startsWith("/__fake/")) {
      const given = Buffer.from(String(req.headers["x-fake-key"] ?? ""));
      const want = Buffer.from(adminKey);
      if (!(given.length === want.length && timingSafeEqual(given, want))) {
        sendJson(res, 404, JSON.stringify({ error: { type: "invalid_request_error", message: "Unrecognized request URL." } }));
        return;
      }
    }
    if (pathname === "/__fake/events" && method === "GET") {
      const list = [...events.values()].sort((a, b) => b.event.created - a.event.created);
      sendJson(res, 200, JSON.stringify(list, null, 2));
      return;
    }
    const resend = /^\/__fake\/resend\/([^/]+)$/.exec(pathname);
    if (resend && method === "POST") {
      const stored = events.get(decodePart(resend[1]!));
      if (!stored) {
        sendJson(
          res,
          404,
          errorBody(
            new ApiError(
              404,
              `No such event: '${resend[1]}'`,
              "id",
              "invalid_request_error",
              "resource_missing",
            ),
          ),
        );
        return;
      }
      const result = await deliver(stored);
      sendJson(res, result.delivered ? 200 : 502, JSON.stringify(result, null, 2));
      return;
    }
    sendJson(res, 404, errorBody(new ApiError(404, `Unrecognized request URL (${method}: ${pathname}).`)));
  }

  const server = http.createServer((req, res) => {
    req.on("error", () => {});
    res.on("error", () => {});
    route(req, res).catch((error: unknown) => {
      if (error instanceof PageError) {
        sendHtml(res, error.status, page("Test payment", `<h1>${escapeHtml(error.message)}</h1>`));
        return;
      }
      if (error instanceof ApiError && error.status < 500) {
        sendJson(res, error.status, errorBody(error));
        return;
      }
      log(`error handling ${req.method} ${req.url?.split("?")[0]}: ${errorText(error)}`);
      if (!res.headersSent)
        sendJson(
          res,
          500,
          errorBody(new ApiError(500, `Payments fake error: ${errorText(error)}`, null, "api_error")),
        );
      else res.destroy();
    });
  });
  server.headersTimeout = 60_000;
  trackSockets(server, sockets);
  const port = await listenOnLoopback(server, opts.port, "payments fake", log);
  baseUrl = `http://${HOST}:${port}`;
  publicUrl = (opts.publicUrl ?? baseUrl).replace(/\/$/, "");

  const sweeper = setInterval(() => {
    for (const s of sessions.values()) expireIfDue(s);
    const cutoff = Date.now() - IDEMPOTENCY_TTL_MS;
    for (const [k, v] of idempotency) if (v.at < cutoff) idempotency.delete(k);
  }, 60_000);
  sweeper.unref();
  for (const s of sessions.values()) expireIfDue(s);

  let closing: Promise<void> | null = null;
  return {
    url: baseUrl,
    port,
    adminKey,
    events: () => [...events.values()].sort((a, b) => b.event.created - a.event.created),
    resend(eventId: string) {
      const stored = events.get(eventId);
      if (!stored) return Promise.reject(new Error(`No such event: ${eventId}`));
      return deliver(stored);
    },
    close() {
      closing ??= new Promise<void>((resolve) => {
        clearInterval(sweeper);
        abort.abort();
        server.close(() => {
          void deliveryChain.finally(() => resolve());
        });
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
    process.stderr.write(
      `unknown argument(s): ${unknown.join(" ")}\nusage: tsx scripts/fakes/stripe.ts [--test]\n`,
    );
    process.exitCode = 2;
    return;
  }
  const test = argv.includes("--test");
  const target = test ? TEST_STRIPE : DEV_STRIPE;
  const log = stderrLogger("payments");
  const keys = fakeStripeKeys();
  const webhookUrl =
    process.env.STRIPE_WEBHOOK_URL ?? `http://localhost:${test ? 3100 : 3000}/api/stripe/webhook`;
  const fake = await startStripeFake({
    ...target,
    webhookUrl,
    webhookSecret: keys.webhookSecret,
    secretKey: keys.secretKey,
    publicUrl: process.env.STRIPE_FAKE_PUBLIC_URL,
    adminKey: process.env.FAKES_KEY,
    log,
  });
  for (const [k, v] of Object.entries(fakeStripeEnv({ url: fake.url, ...keys }))) log(`${k}=${v}`);
  log(
    `webhooks → ${webhookUrl}; ${fake.events().length} stored event(s) in ${target.dir}   (Ctrl-C to stop)`,
  );
  closeOnSignals("payments", () => fake.close(), log);
}

if (isMain(import.meta.url)) {
  main(process.argv.slice(2)).catch((err: unknown) => {
    process.stderr.write(`payments: ${errorText(err)}\n`);
    process.exit(1);
  });
}
