import "server-only";
import Stripe from "stripe";

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
