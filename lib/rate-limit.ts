/** Token bucket arithmetic, kept pure so it can be tested without clocks or servers. */
export type Bucket = { tokens: number; updatedAt: number };

export function refill(
  bucket: Bucket | undefined,
  rule: { capacity: number; refillPerMinute: number },
  now: number,
): Bucket {
  if (!bucket) return { tokens: rule.capacity, updatedAt: now };
  const elapsedMinutes = Math.max(0, now - bucket.updatedAt) / 60_000;
  return { tokens: Math.min(rule.capacity, bucket.tokens + elapsedMinutes * rule.refillPerMinute), updatedAt: now };
}
