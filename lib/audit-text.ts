/**
 * Plain sentences for the shop's activity: who did what, on which job, with a link to it.
 * `describeActivity` is pure; the caller loads the names (db/queries/audit.ts `listActivity`).
 */
import { JOB_STATUS_LABELS, type JobStatus } from "./jobs";
import { formatCents } from "./money";

export type ActivityInput = {
  action: string;
  detail: Record<string, unknown>;
  actorName: string | null;
  job: { id: string; title: string } | null;
  proof: { id: string; name: string } | null;
  client: { id: string; name: string } | null;
};

/** A line in parts: words, and the one thing it is about as a link. */
export type ActivityPart = string | { text: string; href: string };

const ROLE_WORDS: Record<string, string> = { owner: "an owner", designer: "a designer", production: "production" };
const KIND_WORDS: Record<string, string> = { deposit: "deposit", full: "full payment", balance: "balance" };

const str = (v: unknown, fallback = "") => (typeof v === "string" && v.trim() ? v : typeof v === "number" ? String(v) : fallback);

function q(v: unknown): string {
  const s = str(v);
  return s ? `“${s}”` : "";
}

/** `seesMoney`: false for roles that see no prices; amounts are left out of their lines. */
export function describeActivity(e: ActivityInput, shopSlug: string, { seesMoney = true }: { seesMoney?: boolean } = {}): ActivityPart[] {
  const d = e.detail;
  const base = `/shops/${shopSlug}`;
  const who = e.actorName?.replace(/^share link · /, "") || "Someone";
  const jobLink: ActivityPart | null = e.job ? { text: e.job.title, href: `${base}/jobs/${e.job.id}` } : str(d.title) ? str(d.title) : null;
  const onJob = (words: string): ActivityPart[] => (jobLink ? [`${words} on `, jobLink, "."] : [`${words}.`]);
  const proofName = e.proof?.name ?? str(d.name);
  const clientLink: ActivityPart | null = e.client ? { text: e.client.name, href: `${base}/clients/${e.client.id}` } : str(d.name) ? str(d.name) : null;
  const team: ActivityPart = { text: "the team", href: `${base}/settings` };
  const role = ROLE_WORDS[str(d.role)] ?? str(d.role, "a member");

  switch (e.action) {
    case "shop.created":
      return [`${who} opened the shop.`];
    case "member.invited":
      return [`${who} invited ${str(d.email, "someone")} to join `, team, ` as ${role}.`];
    case "member.joined":
      return [`${who} joined `, team, ` as ${role}.`];
    case "member.role-changed":
      return [`${who} made ${str(d.email, "a member")} ${role} (was ${ROLE_WORDS[str(d.from)] ?? str(d.from, "another role")}) on `, team, "."];
    case "member.removed":
      return [`${who} took ${str(d.email, "a member")} off `, team, "."];
    case "member.invitation-withdrawn":
      return [`${who} withdrew the invitation to ${str(d.email, "someone")} for `, team, "."];
    case "client.created":
      return clientLink ? [`${who} added the client `, clientLink, "."] : [`${who} added a client.`];
    case "client.updated":
      return clientLink ? [`${who} updated the client `, clientLink, "."] : [`${who} updated a client.`];
    case "client.archived":
      return clientLink ? [`${who} archived the client `, clientLink, "."] : [`${who} archived a client.`];
    case "client.restored":
      return clientLink ? [`${who} brought back the client `, clientLink, "."] : [`${who} brought back a client.`];
    case "job.created":
      return jobLink ? [`${who} opened the job `, jobLink, "."] : [`${who} opened a job.`];
    case "job.updated":
      return jobLink ? [`${who} changed the details of `, jobLink, "."] : [`${who} changed a job.`];
    case "job.moved":
      return jobLink ? [`${who} moved `, jobLink, ` to ${JOB_STATUS_LABELS[str(d.status) as JobStatus] ?? "a new step"}.`] : [`${who} moved a job.`];
    case "prices.updated":
      return [`${who} changed the `, { text: "prices", href: `${base}/prices` }, "."];
    case "quote.sent":
      return onJob(`${who} sent quote Q${str(d.number)}`);
    case "quote.accepted":
      return onJob(`${who} accepted quote Q${str(d.number)}`);
    case "quote.held": {
      const missing = Array.isArray(d.missing) && d.missing.length ? d.missing.map(String).join(" and ") : "more locations";
      const why = `: the proof prints on the ${missing}, which the quote does not bill. Update the job's print locations and send a new quote.`;
      const head = `The client could not ${d.via === "checkout" ? "pay" : "accept"} quote Q${str(d.number)}`;
      return jobLink ? [`${head} on `, jobLink, why] : [`${head}${why}`];
    }
    case "payment.received": {
      const amount = seesMoney && typeof d.amountCents === "number" && Number.isSafeInteger(d.amountCents) ? ` of ${formatCents(d.amountCents, str(d.currency, "usd"))}` : "";
      return onJob(`The client paid the ${KIND_WORDS[str(d.kind)] ?? "payment"}${amount}`);
    }
    case "artwork.uploaded":
      return [`${who} uploaded the art ${q(d.name)}`.trimEnd() + " to the ", { text: "art library", href: `${base}/art` }, "."];
    case "artwork.replaced":
      return [`${who} replaced the art ${q(d.name)}`.trimEnd() + " in the ", { text: "art library", href: `${base}/art` }, "."];
    case "proof.created":
      return onJob(`${who} started the proof ${q(proofName)}`);
    case "proof.duplicated":
      return onJob(`${who} copied the proof ${q(d.from)} as ${q(proofName)}`);
    case "proof.saved":
      return onJob(`${who} saved revision ${str(d.revision)} of ${q(proofName) || "a proof"}`);
    case "proof.archived":
      return onJob(`${who} archived the proof ${q(proofName)}`);
    case "proof.restored":
      return onJob(`${who} brought back the proof ${q(proofName)}`);
    case "proof.revision-sent":
      return onJob(`${who} sent revision ${str(d.revision)} of ${q(proofName) || "a proof"} to the client`);
    case "proof.shared":
      return onJob(`${who} shared ${q(proofName) || "a proof"}${str(d.to) ? ` with ${str(d.to)}` : " as a link to copy"}`);
    case "share.revoked":
      return onJob(`${who} withdrew a review link to ${q(proofName) || "a proof"}`);
    case "proof.approved":
      return onJob(`${str(d.name, who)} approved revision ${str(d.revision)} of ${q(proofName) || "the proof"}`);
    case "proof.changes-requested":
      return onJob(`${str(d.name, who)} asked for changes to revision ${str(d.revision)} of ${q(proofName) || "the proof"}`);
    default:
      return onJob(`${who}: ${e.action.replace(/[._-]/g, " ")}`);
  }
}

/** The line as plain text (for e-mail, logs and tests). */
export function activityText(parts: ActivityPart[]): string {
  return parts.map((p) => (typeof p === "string" ? p : p.text)).join("");
}

/** Older callers: the sentence for an entry without loaded names. */
export function describeAudit(action: string, detail: Record<string, unknown> = {}): string {
  return activityText(describeActivity({ action, detail, actorName: null, job: null, proof: null, client: null }, ""));
}
