import "server-only";
import { refill, type Bucket } from "@/lib/rate-limit";

// Per-process buckets. Behind a load balancer each instance limits on its own, which is still a bound.
const buckets = new Map<string, Bucket>();

export function takeToken(key: string, rule: { capacity: number; refillPerMinute: number }): boolean {
  const now = Date.now();
  const bucket = refill(buckets.get(key), rule, now);
  if (bucket.tokens < 1) {
    buckets.set(key, bucket);
    return false;
  }
  buckets.set(key, { ...bucket, tokens: bucket.tokens - 1 });
  if (buckets.size > 50_000) buckets.clear();
  return true;
}
