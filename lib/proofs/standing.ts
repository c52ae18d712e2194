/**
 * Where a proof stands with its client, in words: a draft, a revision out for review, approved, or
 * changed after approval (what production prints is then still the approved letter).
 */
export type RevisionState = "open" | "approved" | "changes-requested";

export type ProofStandingInput = {
  /** The proof's working letter. */
  revision: string;
  lastSent: { letter: string; state: RevisionState } | null;
  approvedLetter: string | null;
};

export type ProofStanding = {
  tone: "draft" | "waiting" | "approved" | "changed" | "changes";
  /** A short label for a badge. */
  label: string;
  /** One or two sentences for the card. */
  detail: string;
  changedAfterApproval: boolean;
};

export function proofStanding({ revision, lastSent, approvedLetter }: ProofStandingInput): ProofStanding {
  if (approvedLetter && revision !== approvedLetter) {
    return {
      tone: "changed",
      label: "Changed after approval",
      detail: `Revision ${revision} is a draft made after the client approved revision ${approvedLetter}. Production prints revision ${approvedLetter} until ${revision} is approved.`,
      changedAfterApproval: true,
    };
  }
  if (approvedLetter) return { tone: "approved", label: `Approved, revision ${approvedLetter}`, detail: `The client approved revision ${approvedLetter}. Production prints it.`, changedAfterApproval: false };
  if (!lastSent) return { tone: "draft", label: "Draft", detail: `Revision ${revision} has not been sent to the client yet.`, changedAfterApproval: false };
  const unsent = revision !== lastSent.letter ? ` Revision ${revision} has changes not sent yet.` : "";
  if (lastSent.state === "changes-requested") {
    return { tone: "changes", label: "Changes asked for", detail: `The client asked for changes on revision ${lastSent.letter}.${unsent}`, changedAfterApproval: false };
  }
  return { tone: "waiting", label: `With the client, revision ${lastSent.letter}`, detail: `Revision ${lastSent.letter} is with the client for review.${unsent}`, changedAfterApproval: false };
}
