import { describe, expect, it } from "vitest";
import { describeAudit } from "@/lib/audit-text";

// The sentences are our own wording for the overview's activity list.
describe("audit entries in words", () => {
  it.each([
    ["member.role-changed", { email: "ana@example.test", from: "owner", role: "designer" }, "The role of ana@example.test changed from owner to designer."],
    ["member.removed", { email: "ana@example.test", role: "production" }, "ana@example.test was removed from the team."],
    ["member.invitation-withdrawn", { email: "ben@example.test", role: "designer" }, "The invitation to ben@example.test was withdrawn."],
    ["member.removed", {}, "A member was removed from the team."],
    ["something.unknown", {}, "something unknown"],
  ])("%s %o", (action, detail, text) => {
    expect(describeAudit(action, detail)).toBe(text);
  });
});
