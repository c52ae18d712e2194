import { describe, expect, it } from "vitest";
import { actionClientAddress } from "@/app/_server/client-address";

describe("server actions called outside a request (tests/support/action-address.ts)", () => {
  it("each come from an address of their own, so no test shares another's per-address limit", async () => {
    const first = await actionClientAddress();
    const second = await actionClientAddress();
    expect(first).toMatch(/^198\.18\.\d+\.\d+$/);
    expect(second).toMatch(/^198\.18\.\d+\.\d+$/);
    expect(second).not.toBe(first);
  });
});
