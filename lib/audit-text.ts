/** Plain sentences for audit log entries shown on the overview. */
const TEXT: Record<string, (d: Record<string, unknown>) => string> = {
  "shop.created": () => "The shop was created.",
  "member.invited": (d) => `${String(d.email ?? "Someone")} was invited as ${String(d.role ?? "a member")}.`,
  "member.joined": (d) => `A new ${String(d.role ?? "member")} joined the team.`,
  "client.created": (d) => `New client: ${String(d.name ?? "")}.`,
  "job.created": (d) => `New job: ${String(d.title ?? "")}.`,
  "quote.held": (d) =>
    `The client could not ${d.via === "checkout" ? "pay" : "accept"} quote Q${String(d.number ?? "")}${d.title ? ` for ${String(d.title)}` : ""}: the proof prints on the ${Array.isArray(d.missing) && d.missing.length ? d.missing.map(String).join(" and ") : "more locations"}, which the quote does not bill. Update the job's print locations and send a new quote.`,
  "proof.saved": (d) => `Proof ${String(d.revision ?? "")} was updated.`,
};

export function describeAudit(action: string, detail: Record<string, unknown> = {}): string {
  return TEXT[action]?.(detail) ?? action.replace(/[._]/g, " ");
}
