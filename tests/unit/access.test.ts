import { describe, expect, it } from "vitest";
import { can, PERMISSIONS, shopNav } from "@/lib/access";

// The role rules come from the product brief (owner / designer / production / client), not an outside source.
describe("role permissions", () => {
  it("gives the owner every permission", () => {
    for (const permission of PERMISSIONS) expect(can("owner", permission)).toBe(true);
  });

  it.each([
    ["designer", "prices.view", true],
    ["designer", "prices.edit", false],
    ["designer", "shop.settings", false],
    ["production", "jobs.view", true],
    ["production", "prices.view", false],
    ["production", "proofs.edit", false],
    ["client", "shop.view", false],
  ] as const)("%s may %s: %s", (role, permission, expected) => {
    expect(can(role, permission)).toBe(expected);
  });

  it("builds navigation from the same table", () => {
    expect(shopNav("owner", "demo").map((item) => item.key)).toContain("settings");
    expect(shopNav("designer", "demo").map((item) => item.key)).not.toContain("settings");
    expect(shopNav("production", "demo").map((item) => item.key)).toEqual(["overview", "jobs", "art", "blanks"]);
  });
});
