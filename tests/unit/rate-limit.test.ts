import { describe, expect, it } from "vitest";
import { refill } from "@/lib/rate-limit";

describe("token bucket refill", () => {
  const rule = { capacity: 10, refillPerMinute: 5 };
  it("starts full", () => expect(refill(undefined, rule, 0).tokens).toBe(10));
  it("refills in proportion to elapsed time and caps at capacity", () => {
    expect(refill({ tokens: 0, updatedAt: 0 }, rule, 30_000).tokens).toBeCloseTo(2.5);
    expect(refill({ tokens: 9, updatedAt: 0 }, rule, 600_000).tokens).toBe(10);
  });
  it("never goes backwards when the clock does", () => {
    expect(refill({ tokens: 3, updatedAt: 1000 }, rule, 0).tokens).toBe(3);
  });
});
