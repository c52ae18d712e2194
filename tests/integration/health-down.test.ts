import { afterAll, beforeAll, describe, expect, it } from "vitest";

// Points this test file's pool at a port where nothing listens, so the database is "down".
const saved = process.env.DATABASE_URL;
beforeAll(() => {
  (globalThis as { chalklinePool?: unknown; chalklineDb?: unknown }).chalklinePool = undefined;
  (globalThis as { chalklineDb?: unknown }).chalklineDb = undefined;
  process.env.DATABASE_URL = "postgres://chalkline@127.0.0.1:9/nowhere";
});
afterAll(() => {
  process.env.DATABASE_URL = saved;
  (globalThis as { chalklinePool?: unknown }).chalklinePool = undefined;
  (globalThis as { chalklineDb?: unknown }).chalklineDb = undefined;
});

describe("health route with the database down", () => {
  it("answers 503 with db down instead of throwing", async () => {
    const { GET } = await import("@/app/api/health/route");
    const response = await GET();
    expect(response.status).toBe(503);
    expect(await response.json()).toMatchObject({ db: "down" });
  });
});
