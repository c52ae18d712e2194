/** Plain sentences for audit log entries shown on the overview. */
const TEXT: Record<string, (d: Record<string, unknown>) => string> = {
  "shop.created": () => "The shop was created.",
  "member.invited": (d) => `${String(d.email ?? "Someone")} was invited as ${String(d.role ?? "a member")}.`,
  "member.joined": (d) => `A new ${String(d.role ?? "member")} joined the team.`,
  "member.role-changed": (d) => `The role of ${String(d.email ?? "a member")} changed from ${String(d.from ?? "another role")} to ${String(d.role ?? "a new one")}.`,
  "member.removed": (d) => `${String(d.email ?? "A member")} was removed from the team.`,
  "member.invitation-withdrawn": (d) => `The invitation to ${String(d.email ?? "someone")} was withdrawn.`,
  "client.created": (d) => `New client: ${String(d.name ?? "")}.`,
  "job.created": (d) => `New job: ${String(d.title ?? "")}.`,
  "quote.held": (d) =>
    `The client could not ${d.via === "checkout" ? "pay" : "accept"} quote Q${String(d.number ?? "")}${d.title ? ` for ${String(d.title)}` : ""}: the proof prints on the ${Array.isArray(d.missing) && d.missing.length ? d.missing.map(String).join(" and ") : "more locations"}, which the quote does not bill. Update the job's print locations and send a new quote.`,
  "proof.saved": (d) => `Proof ${String(d.revision ?? "")} was updated.`,
  "proof.created": (d) => `New proof: ${String(d.name ?? "")}.`,
  "proof.duplicated": (d) => `Proof ${String(d.from ?? "")} was copied as ${String(d.name ?? "")}.`,
  "proof.archived": (d) => `Proof ${String(d.name ?? "")} was archived.`,
  "proof.restored": (d) => `Proof ${String(d.name ?? "")} was brought back from the archive.`,
  "proof.revision-sent": (d) => `Revision ${String(d.revision ?? "")} was sent to the client.`,
};

export function describeAudit(action: string, detail: Record<string, unknown> = {}): string {
  return TEXT[action]?.(detail) ?? action.replace(/[._]/g, " ");
}
