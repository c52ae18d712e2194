/**
 * The local payments fake against the real `stripe` SDK, over HTTP, without a browser and
 * without a database. A tiny node:http server in this file plays the app's webhook route.
 */
import { randomBytes } from "node:crypto";
import { mkdtemp, readdir, rm } from "node:fs/promises";
import http from "node:http";
import type { AddressInfo } from "node:net";
import os from "node:os";
import path from "node:path";
import Stripe from "stripe";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import {
  signWebhookPayload,
  startStripeFake,
  stripeClientOptions,
  type StripeFake,
} from "@/scripts/fakes/stripe";
import { noteOnFailure } from "@/tests/support/failure-notes";
import { Arrivals } from "@/tests/support/wait";

const SECRET_KEY = "sk_test_chalklineIntegration0123456789";
const WEBHOOK_SECRET = "whsec_chalklineIntegrationSecret";

type Hook = { rawBody: string; signature: string; contentType: string; type: string; id: string };

/** Webhook deliveries the receiver accepted, in order; a test can wait for the next one it expects. */
const hooks = new Arrivals<Hook>();
/** How many of the next webhook deliveries the receiver answers with 500. */
let failNext = 0;
let receiver: http.Server;
let receiverUrl = "";
let dir = "";
let fake: StripeFake;
let stripe: Stripe;

function startFake(): Promise<StripeFake> {
  return startStripeFake({
    port: 0,
    dir,
    webhookUrl: `${receiverUrl}/api/stripe/webhook`,
    webhookSecret: WEBHOOK_SECRET,
    secretKey: SECRET_KEY,
    webhookRetryDelaysMs: [20, 40, 80],
  });
}

function client(key = SECRET_KEY): Stripe {
  return new Stripe(key, { ...stripeClientOptions(fake.url), maxNetworkRetries: 0 });
}

async function createSession(
  extra: Partial<Stripe.Checkout.SessionCreateParams> = {},
): Promise<Stripe.Response<Stripe.Checkout.Session>> {
  return stripe.checkout.sessions.create({
    mode: "payment",
    line_items: [
      {
        price_data: { currency: "usd", unit_amount: 1250, product_data: { name: "Deposit: quote Q-1001" } },
        quantity: 2,
      },
      {
        price_data: {
          currency: "usd",
          unit_amount: 99,
          product_data: { name: "Screens", description: "4 screens" },
        },
        quantity: 1,
      },
    ],
    success_url: "http://localhost:3000/pay/done?session={CHECKOUT_SESSION_ID}",
    cancel_url: "http://localhost:3000/pay/cancelled",
    customer_email: "buyer@example.test",
    client_reference_id: "quote_1001",
    metadata: { quoteId: "q_1001", shopId: "shop_7" },
    payment_intent_data: {
      metadata: { quoteId: "q_1001", kind: "deposit" },
      description: "Deposit for quote Q-1001",
    },
    ...extra,
  });
}

async function submitPage(id: string, body: string): Promise<Response> {
  return fetch(`${fake.url}/pay/${id}`, {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body,
    redirect: "manual",
  });
}

beforeAll(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), "chalkline-payments-fake-"));
  receiver = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      if (failNext > 0) {
        failNext -= 1;
        res.writeHead(500).end("not now");
        return;
      }
      const rawBody = Buffer.concat(chunks).toString("utf8");
      const parsed = JSON.parse(rawBody) as { id: string; type: string };
      hooks.push({
        rawBody,
        signature: String(req.headers["stripe-signature"] ?? ""),
        contentType: String(req.headers["content-type"] ?? ""),
        type: parsed.type,
        id: parsed.id,
      });
      res.writeHead(200, { "content-type": "application/json" }).end('{"received":true}');
    });
  });
  await new Promise<void>((resolve) => receiver.listen(0, "127.0.0.1", resolve));
  receiverUrl = `http://127.0.0.1:${(receiver.address() as AddressInfo).port}`;
  fake = await startFake();
  stripe = client();
});

afterAll(async () => {
  await fake?.close();
  await new Promise<void>((resolve) => receiver?.close(() => resolve()));
  if (dir) await rm(dir, { recursive: true, force: true });
});

beforeEach(() => {
  hooks.clear();
  failNext = 0;
});

describe("checkout sessions through the SDK", () => {
  it("creates a session shaped like the real object", async () => {
    const s = await createSession();
    expect(s.id).toMatch(/^cs_test_[A-Za-z0-9]{20,}$/);
    expect(s).toMatchObject({
      object: "checkout.session",
      mode: "payment",
      status: "open",
      payment_status: "unpaid",
      currency: "usd",
      amount_total: 2599, // 2 × 1250 + 99
      amount_subtotal: 2599,
      livemode: false,
      customer_email: "buyer@example.test",
      client_reference_id: "quote_1001",
      metadata: { quoteId: "q_1001", shopId: "shop_7" },
      success_url: "http://localhost:3000/pay/done?session={CHECKOUT_SESSION_ID}",
      cancel_url: "http://localhost:3000/pay/cancelled",
      payment_intent: null,
      url: `${fake.url}/pay/${s.id}`,
    });
    expect(s.expires_at - s.created).toBe(24 * 3600);
    expect(s.lastResponse.requestId).toMatch(/^req_/);
  });

  it("fetches it, with line items expanded or listed", async () => {
    const created = await createSession();
    const got = await stripe.checkout.sessions.retrieve(created.id, { expand: ["line_items"] });
    expect(got.id).toBe(created.id);
    expect(got.line_items?.data.map((li) => [li.description, li.quantity, li.amount_total])).toEqual([
      ["Deposit: quote Q-1001", 2, 2500],
      ["Screens", 1, 99],
    ]);
    const items = await stripe.checkout.sessions.listLineItems(created.id);
    expect(items.data).toHaveLength(2);
    expect(items.data[0]?.price?.unit_amount).toBe(1250);
  });

  it("serves the hosted test page", async () => {
    const s = await createSession();
    const res = await fetch(s.url!);
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain("Local test payment page");
    expect(html).toContain("$25.99");
    expect(html).toContain('value="pay"');
    expect(html).toContain('value="decline"');
  });
});

describe("paying through the hosted page", () => {
  it("completes the session, signs the webhook, then redirects to success_url", async () => {
    const s = await createSession();
    const res = await submitPage(s.id, "action=pay&email=payer%40example.test");
    expect(res.status).toBe(303);
    expect(res.headers.get("location")).toBe(`http://localhost:3000/pay/done?session=${s.id}`);

    // Delivered before the redirect: both events are already here, in order.
    expect(hooks.items.map((h) => h.type)).toEqual(["checkout.session.completed", "payment_intent.succeeded"]);
    const [completedHook, succeededHook] = hooks.items as [Hook, Hook];
    expect(completedHook.contentType).toBe("application/json; charset=utf-8");
    expect(completedHook.signature).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);

    const event = stripe.webhooks.constructEvent(
      completedHook.rawBody,
      completedHook.signature,
      WEBHOOK_SECRET,
    );
    expect(event.id).toMatch(/^evt_/);
    expect(event).toMatchObject({ object: "event", type: "checkout.session.completed", livemode: false });
    expect(typeof event.api_version).toBe("string");
    if (event.type !== "checkout.session.completed") throw new Error("unexpected event type");
    const session = event.data.object;
    expect(session).toMatchObject({
      id: s.id,
      status: "complete",
      payment_status: "paid",
      amount_total: 2599,
      client_reference_id: "quote_1001",
      metadata: { quoteId: "q_1001", shopId: "shop_7" },
      url: null,
    });
    expect(session.customer_details?.email).toBe("payer@example.test");
    expect(session.payment_intent).toMatch(/^pi_/);

    const piEvent = stripe.webhooks.constructEvent(
      succeededHook.rawBody,
      succeededHook.signature,
      WEBHOOK_SECRET,
    );
    if (piEvent.type !== "payment_intent.succeeded") throw new Error("unexpected event type");
    expect(piEvent.data.object).toMatchObject({
      id: session.payment_intent,
      status: "succeeded",
      amount: 2599,
      amount_received: 2599,
      currency: "usd",
      metadata: { quoteId: "q_1001", kind: "deposit" },
      description: "Deposit for quote Q-1001",
    });

    const after = await stripe.checkout.sessions.retrieve(s.id, { expand: ["payment_intent"] });
    expect(after).toMatchObject({ status: "complete", payment_status: "paid", url: null });
    expect((after.payment_intent as Stripe.PaymentIntent).status).toBe("succeeded");
    const pi = await stripe.paymentIntents.retrieve(session.payment_intent as string);
    expect(pi.metadata).toEqual({ quoteId: "q_1001", kind: "deposit" });
  });

  it("a tampered body, a wrong secret or an old timestamp fails constructEvent", async () => {
    const s = await createSession();
    await submitPage(s.id, "action=pay");
    const hook = hooks.items[0]!;
    const tampered = hook.rawBody.replace('"amount_total": 2599', '"amount_total": 1');
    expect(tampered).not.toBe(hook.rawBody);
    expect(() => stripe.webhooks.constructEvent(tampered, hook.signature, WEBHOOK_SECRET)).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
    expect(() => stripe.webhooks.constructEvent(hook.rawBody, hook.signature, "whsec_someone_else")).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
    const old = signWebhookPayload(hook.rawBody, WEBHOOK_SECRET, Math.floor(Date.now() / 1000) - 3600);
    expect(() => stripe.webhooks.constructEvent(hook.rawBody, old, WEBHOOK_SECRET)).toThrow(/tolerance/);
    // and the helper agrees with the SDK's own scheme
    const fresh = signWebhookPayload(hook.rawBody, WEBHOOK_SECRET);
    expect(stripe.webhooks.constructEvent(hook.rawBody, fresh, WEBHOOK_SECRET).id).toBe(hook.id);
  });

  it("paying a completed session again only redirects, without new events", async () => {
    const s = await createSession();
    await submitPage(s.id, "action=pay");
    const count = hooks.items.length;
    const again = await submitPage(s.id, "action=pay");
    expect(again.status).toBe(303);
    expect(hooks.items.length).toBe(count);
  });

  it("decline keeps the session open and sends the browser to cancel_url", async () => {
    const s = await createSession();
    const res = await submitPage(s.id, "action=decline");
    expect(res.status).toBe(303);
    expect(res.headers.get("location")).toBe("http://localhost:3000/pay/cancelled");
    expect(hooks.items).toEqual([]);
    const after = await stripe.checkout.sessions.retrieve(s.id);
    expect(after).toMatchObject({ status: "open", payment_status: "unpaid", url: s.url });
  });
});

describe("webhook delivery", () => {
  it("resend delivers the same event id and body again", async () => {
    const s = await createSession();
    await submitPage(s.id, "action=pay");
    const first = hooks.find((h) => h.type === "checkout.session.completed")!;
    const res = await fetch(`${fake.url}/__fake/resend/${first.id}`, { method: "POST", headers: { "x-fake-key": fake.adminKey } });
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ eventId: first.id, delivered: true });
    const again = hooks.items.filter((h) => h.id === first.id);
    expect(again).toHaveLength(2);
    expect(again[1]!.rawBody).toBe(first.rawBody);
    expect(stripe.webhooks.constructEvent(again[1]!.rawBody, again[1]!.signature, WEBHOOK_SECRET).id).toBe(
      first.id,
    );

    const missing = await fetch(`${fake.url}/__fake/resend/evt_nope`, { method: "POST", headers: { "x-fake-key": fake.adminKey } });
    expect(missing.status).toBe(404);
  });

  it("retries a failing endpoint and logs every attempt", async () => {
    failNext = 2;
    const s = await createSession();
    await submitPage(s.id, "action=pay");
    const completed = hooks.find((h) => h.type === "checkout.session.completed")!;
    const stored = fake.events().find((e) => e.event.id === completed.id)!;
    expect(stored.deliveries.map((d) => d.status)).toEqual([500, 500, 200]);
  });

  it("expiring a session through the SDK sends checkout.session.expired", async () => {
    const s = await createSession();
    const expired = await stripe.checkout.sessions.expire(s.id);
    expect(expired).toMatchObject({ id: s.id, status: "expired", url: null });
    const hook = await hooks.next("the checkout.session.expired webhook", (h) => h.type === "checkout.session.expired");
    const event = stripe.webhooks.constructEvent(hook.rawBody, hook.signature, WEBHOOK_SECRET);
    expect((event.data.object as Stripe.Checkout.Session).id).toBe(s.id);
    await expect(stripe.checkout.sessions.expire(s.id)).rejects.toBeInstanceOf(
      Stripe.errors.StripeInvalidRequestError,
    );
    const page = await fetch(s.url!);
    expect(await page.text()).toContain("expired");
  });
});

describe("errors the SDK turns into its own error classes", () => {
  it("a bad API key → StripeAuthenticationError", async () => {
    const bad = client("sk_test_notTheRightKey000000");
    const error = await bad.checkout.sessions.create({ mode: "payment" }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
    expect((error as Stripe.errors.StripeError).statusCode).toBe(401);
    const live = await client("sk_live_0000000000000000")
      .checkout.sessions.retrieve("cs_test_x")
      .catch((e: unknown) => e);
    expect(live).toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
  });

  it("bad parameters → StripeInvalidRequestError naming the param", async () => {
    const error = await stripe.checkout.sessions
      .create({
        mode: "payment",
        line_items: [
          { price_data: { currency: "usd", unit_amount: 500, product_data: { name: "" } }, quantity: 1 },
        ],
      })
      .catch((e: unknown) => e);
    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect((error as Stripe.errors.StripeError).param).toBe("line_items[0][price_data][product_data][name]");
    expect((error as Stripe.errors.StripeError).statusCode).toBe(400);

    const unknown = await stripe.checkout.sessions
      .create({ mode: "payment", line_items: [], bogus: "x" } as Stripe.Checkout.SessionCreateParams)
      .catch((e: unknown) => e);
    expect((unknown as Stripe.errors.StripeError).message).toContain("Received unknown parameter: bogus");

    const tooSmall = await createSession({
      line_items: [
        { price_data: { currency: "usd", unit_amount: 12, product_data: { name: "Tiny" } }, quantity: 1 },
      ],
    }).catch((e: unknown) => e);
    expect((tooSmall as Stripe.errors.StripeError).code).toBe("amount_too_small");
  });

  it("an unknown session → 404 resource_missing", async () => {
    const error = await stripe.checkout.sessions.retrieve("cs_test_doesNotExist").catch((e: unknown) => e);
    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(error).toMatchObject({ statusCode: 404, code: "resource_missing" });
  });

  it("the same idempotency key replays; with other parameters it is refused", async () => {
    const key = `idem-${randomBytes(6).toString("hex")}`;
    noteOnFailure("idempotency key", key);
    const a = await stripe.checkout.sessions.create(
      {
        mode: "payment",
        line_items: [
          { price_data: { currency: "usd", unit_amount: 700, product_data: { name: "A" } }, quantity: 1 },
        ],
      },
      { idempotencyKey: key },
    );
    const b = await stripe.checkout.sessions.create(
      {
        mode: "payment",
        line_items: [
          { price_data: { currency: "usd", unit_amount: 700, product_data: { name: "A" } }, quantity: 1 },
        ],
      },
      { idempotencyKey: key },
    );
    expect(b.id).toBe(a.id);
    const c = await stripe.checkout.sessions
      .create(
        {
          mode: "payment",
          line_items: [
            { price_data: { currency: "usd", unit_amount: 800, product_data: { name: "A" } }, quantity: 1 },
          ],
        },
        { idempotencyKey: key },
      )
      .catch((e: unknown) => e);
    expect(c).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
  });
});

describe("storage", () => {
  it("keeps sessions and events across a restart", async () => {
    const s = await createSession();
    await submitPage(s.id, "action=pay");
    const eventId = hooks.items[0]!.id;
    expect(await readdir(path.join(dir, "checkout_sessions"))).toContain(`${s.id}.json`);
    await fake.close();
    fake = await startFake();
    stripe = client();
    const again = await stripe.checkout.sessions.retrieve(s.id);
    expect(again).toMatchObject({ status: "complete", payment_status: "paid" });
    const event = await stripe.events.retrieve(eventId);
    expect(event.type).toBe("checkout.session.completed");
    const res = await fetch(`${fake.url}/__fake/resend/${eventId}`, { method: "POST", headers: { "x-fake-key": fake.adminKey } });
    expect(res.status).toBe(200);
    expect(hooks.items.filter((h) => h.id === eventId)).toHaveLength(2);
  });
});
