import { describe, expect, it } from "vitest";
import { activityText, describeActivity, describeAudit, type ActivityInput } from "@/lib/audit-text";

// The sentences are our own wording for the overview's activity list: who did what, on which job.
const job = { id: "job-7", title: "Harbour rowing club singlets" };
const proof = { id: "proof-3", name: "Crew front" };
const entry = (action: string, over: Partial<ActivityInput> = {}): ActivityInput => ({ action, detail: {}, actorName: "Ines Marlow", job: null, proof: null, client: null, ...over });

describe("activity lines", () => {
  it.each([
    ["share.revoked", entry("share.revoked", { job, proof }), "Ines Marlow withdrew a review link to “Crew front” on Harbour rowing club singlets."],
    ["payment.received", entry("payment.received", { actorName: "Payments", job, detail: { kind: "deposit", amountCents: 19740, currency: "usd" } }), "The client paid the deposit of $197.40 on Harbour rowing club singlets."],
    ["quote.accepted", entry("quote.accepted", { actorName: "Dana Whitcombe", job, detail: { number: 4 } }), "Dana Whitcombe accepted quote Q4 on Harbour rowing club singlets."],
    ["member.joined", entry("member.joined", { actorName: "Pell Arden", detail: { role: "production" } }), "Pell Arden joined the team as production."],
    ["proof.revision-sent", entry("proof.revision-sent", { job, proof, detail: { revision: "B" } }), "Ines Marlow sent revision B of “Crew front” to the client on Harbour rowing club singlets."],
    ["proof.approved", entry("proof.approved", { actorName: "share link · Dana Whitcombe", job, proof, detail: { revision: "B", name: "Dana Whitcombe" } }), "Dana Whitcombe approved revision B of “Crew front” on Harbour rowing club singlets."],
    ["job.moved", entry("job.moved", { job, detail: { status: "on-press" } }), "Ines Marlow moved Harbour rowing club singlets to On press."],
  ])("%s", (_, input, text) => {
    expect(activityText(describeActivity(input, "quay-print"))).toBe(text);
  });

  it("leaves the amount out for a role that sees no prices", () => {
    const paid = entry("payment.received", { job, detail: { kind: "balance", amountCents: 5000 } });
    expect(activityText(describeActivity(paid, "s", { seesMoney: false }))).toBe("The client paid the balance on Harbour rowing club singlets.");
  });

  it("links the job it is about", () => {
    const parts = describeActivity(entry("quote.sent", { job, detail: { number: 2 } }), "quay-print");
    expect(parts).toContainEqual({ text: job.title, href: "/shops/quay-print/jobs/job-7" });
  });

  it("links the team page for team changes, and the client for client changes", () => {
    expect(describeActivity(entry("member.invited", { detail: { email: "ben@example.test", role: "designer" } }), "s")).toContainEqual({ text: "the team", href: "/shops/s/settings" });
    expect(describeActivity(entry("client.created", { client: { id: "c1", name: "Ferry lane juniors" } }), "s")).toContainEqual({ text: "Ferry lane juniors", href: "/shops/s/clients/c1" });
  });

  it.each([
    ["member.role-changed", { email: "ana@example.test", from: "owner", role: "designer" }, "Someone made ana@example.test a designer (was an owner) on the team."],
    ["member.removed", {}, "Someone took a member off the team."],
    ["something.unknown", {}, "Someone: something unknown."],
  ])("without loaded names: %s %o", (action, detail, text) => {
    expect(describeAudit(action, detail)).toBe(text);
  });
});
