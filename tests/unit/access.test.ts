import { describe, expect, it } from "vitest";
import { can, keepsAnOwner, ownersAfter, PERMISSIONS, shopNav, type ShopRole, type TeamChange } from "@/lib/access";

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
    ["owner", "members.manage", true],
    ["designer", "members.manage", false],
    ["production", "members.manage", false],
    ["client", "members.manage", false],
  ] as const)("%s may %s: %s", (role, permission, expected) => {
    expect(can(role, permission)).toBe(expected);
  });

  it("builds navigation from the same table", () => {
    expect(shopNav("owner", "demo").map((item) => item.key)).toContain("settings");
    expect(shopNav("designer", "demo").map((item) => item.key)).not.toContain("settings");
    expect(shopNav("production", "demo").map((item) => item.key)).toEqual(["overview", "jobs", "art", "blanks"]);
  });
});

// The last-owner rule is a product rule (a shop always keeps an owner), no outside source.
describe("owners left after a team change", () => {
  it.each<[number, ShopRole, TeamChange, number]>([
    [1, "owner", { kind: "remove" }, 0],
    [1, "owner", { kind: "role", role: "designer" }, 0],
    [1, "owner", { kind: "role", role: "production" }, 0],
    [1, "owner", { kind: "role", role: "owner" }, 1],
    [2, "owner", { kind: "remove" }, 1],
    [2, "owner", { kind: "role", role: "designer" }, 1],
    [1, "designer", { kind: "remove" }, 1],
    [1, "designer", { kind: "role", role: "owner" }, 2],
    [1, "production", { kind: "role", role: "designer" }, 1],
  ])("%i owner(s), a %s, %o: %i left", (owners, role, change, left) => {
    expect(ownersAfter(owners, role, change)).toBe(left);
    expect(keepsAnOwner(owners, role, change)).toBe(left > 0);
  });
});
