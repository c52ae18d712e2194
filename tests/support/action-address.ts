/**
 * Server actions called directly in integration tests run outside a request, so they would all share
 * the "unknown" client address, and so one per-address limit, whatever order the files run in. Each
 * such call comes from an address of its own instead (the benchmarking range 198.18.0.0/15, RFC 2544, which no real client has), as each call
 * from a real browser would. A test about per-address limits on actions mocks this itself.
 */
import { vi } from "vitest";

const calls = vi.hoisted(() => ({ seq: 0 }));
vi.mock("@/app/_server/client-address", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/app/_server/client-address")>()),
  actionClientAddress: async () => {
    calls.seq += 1;
    return `198.18.${(calls.seq >> 8) & 255}.${calls.seq & 255}`;
  },
}));
