import "server-only";
import Stripe from "stripe";
import { z } from "zod";

/**
 * The payments SDK client. With STRIPE_FAKE_URL (set by `npm start` / `npm test`) it talks to the
 * local fake on loopback; with only a real STRIPE_SECRET_KEY it talks to the hosted service.
 * Without a key, payments are off and the pages say so.
 */
let cached: { key: string; client: Stripe } | undefined;

export function paymentsConfigured(): boolean {
  return Boolean(process.env.STRIPE_SECRET_KEY && process.env.STRIPE_WEBHOOK_SECRET);
}

export function getStripe(): Stripe | null {
  const key = process.env.STRIPE_SECRET_KEY;
  if (!key) return null;
  const fake = process.env.STRIPE_FAKE_URL;
  const cacheKey = `${key}|${fake ?? ""}`;
  if (cached?.key === cacheKey) return cached.client;
  const options: Stripe.StripeConfig = { maxNetworkRetries: 2, timeout: 15_000, appInfo: { name: "Chalkline" } };
  if (fake) {
    const url = new URL(fake);
    if (!["127.0.0.1", "localhost", "::1"].includes(url.hostname)) throw new Error("STRIPE_FAKE_URL must point at loopback");
    Object.assign(options, { host: url.hostname, port: Number(url.port || 80), protocol: "http" as const });
  }
  cached = { key: cacheKey, client: new Stripe(key, options) };
  return cached.client;
}

export function webhookSecret(): string | null {
  return process.env.STRIPE_WEBHOOK_SECRET ?? null;
}

const text = z.string().max(500);
const optionalText = text.nullish();
const sessionObject = z.looseObject({
  id: text,
  payment_status: optionalText,
  metadata: z.record(text, text).nullish(),
  client_reference_id: optionalText,
  payment_intent: z.union([text, z.looseObject({ id: text })]).nullish(),
  customer_details: z.looseObject({ email: optionalText }).nullish(),
  customer_email: optionalText,
  amount_total: z.number().int().min(0).max(Number.MAX_SAFE_INTEGER).nullish(),
});
const intentObject = z.looseObject({
  id: text,
  metadata: z.record(text, text).nullish(),
  receipt_email: optionalText,
  amount: z.number().int().min(0).max(Number.MAX_SAFE_INTEGER).nullish(),
  amount_received: z.number().int().min(0).max(Number.MAX_SAFE_INTEGER).nullish(),
});
const SESSION_EVENTS = ["checkout.session.completed", "checkout.session.async_payment_succeeded", "checkout.session.expired"];

/**
 * The parts of a verified event that the webhook reads, checked before anything is applied. The
 * signature proves who sent it, not that it has the shape we expect: an event this cannot read is
 * refused (400), never half-applied.
 */
export const paymentEventSchema = z
  .looseObject({ id: z.string().min(1).max(255), type: z.string().min(1).max(255), data: z.looseObject({ object: z.looseObject({}) }) })
  .superRefine((event, ctx) => {
    const object = SESSION_EVENTS.includes(event.type) ? sessionObject : event.type === "payment_intent.succeeded" ? intentObject : null;
    if (!object) return;
    const parsed = object.safeParse(event.data.object);
    if (!parsed.success) for (const issue of parsed.error.issues) ctx.addIssue({ ...issue, path: ["data", "object", ...issue.path] } as never);
  });
