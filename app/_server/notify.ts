import "server-only";
import { proofContext, shopNotificationRecipients } from "@/db/queries/review";
import { appUrl } from "./config";
import { composeMail } from "./emails";
import { sendMailSafely } from "./mail";

/** Notifications never block or undo what caused them: failures are logged and reported, not thrown. */
type Context = NonNullable<Awaited<ReturnType<typeof proofContext>>>;

async function context(proofId: string): Promise<Context | undefined> {
  try {
    return await proofContext({ proofId });
  } catch (error) {
    console.error("[notify] could not load the proof", error);
    return undefined;
  }
}

const editorUrl = (c: Context) => `${appUrl()}/shops/${c.shopSlug}/proofs/${c.proofId}#client-notes`;
const jobUrl = (c: Context) => `${appUrl()}/shops/${c.shopSlug}/jobs/${c.jobId}`;
const portalUrl = (c: Context) => `${appUrl()}/portal/proofs/${c.proofId}`;

async function toShop(c: Context, mail: (to: string) => Parameters<typeof composeMail>[0]) {
  const people = await shopNotificationRecipients({ shopId: c.shopId }).catch(() => []);
  const results = await Promise.all(people.map((p) => sendMailSafely(composeMail(mail(p.email)))));
  return results.every((r) => r.sent);
}

export async function notifyProofSent(input: { proofId: string; to: string; recipientName: string | null; url: string; letter: string; message: string | null; senderName: string }) {
  const c = await context(input.proofId);
  if (!c) return false;
  const r = await sendMailSafely(
    composeMail({
      to: input.to,
      subject: `Proof to review: ${c.jobTitle} (revision ${input.letter})`,
      heading: `${c.shopName} sent you a proof`,
      paragraphs: [
        `${input.recipientName ? `Hi ${input.recipientName}, ` : ""}${input.senderName} at ${c.shopName} prepared revision ${input.letter} of “${c.proofName}” for ${c.jobTitle}.`,
        ...(input.message ? [input.message] : []),
        "Open it on your phone or computer to see the print on the garment at its real size, pin notes where you want changes, and approve it when it is right.",
      ],
      action: { label: "Review the proof", url: input.url },
      footnote: "Anyone with this link can open the proof, so forward it only to people who should see it.",
    }),
  );
  return r.sent;
}

export async function notifyClientComment(input: { proofId: string; author: string; body: string }) {
  const c = await context(input.proofId);
  if (!c) return false;
  return toShop(c, (to) => ({
    to,
    subject: `New note from ${input.author} on ${c.jobTitle}`,
    heading: `${input.author} left a note`,
    paragraphs: [`On “${c.proofName}” for ${c.clientName}:`, `“${input.body}”`],
    action: { label: "Open the proof", url: editorUrl(c) },
  }));
}

export async function notifyShopReply(input: { proofId: string; author: string; body: string; recipients: string[] }) {
  const c = await context(input.proofId);
  if (!c || input.recipients.length === 0) return false;
  const results = await Promise.all(
    [...new Set(input.recipients)].map((to) =>
      sendMailSafely(
        composeMail({
          to,
          subject: `${c.shopName} replied about ${c.jobTitle}`,
          heading: `${input.author} replied`,
          paragraphs: [`On “${c.proofName}”:`, `“${input.body}”`],
          action: { label: "See the proof", url: portalUrl(c) },
          footnote: "You can also keep using the review link from the first e-mail.",
        }),
      ),
    ),
  );
  return results.every((r) => r.sent);
}

export async function notifyDecision(input: { proofId: string; decision: "approved" | "changes-requested"; name: string; letter: string; comment: string | null; approverEmail: string | null }) {
  const c = await context(input.proofId);
  if (!c) return false;
  const approved = input.decision === "approved";
  const shopSent = await toShop(c, (to) => ({
    to,
    subject: approved ? `Approved: ${c.jobTitle}, revision ${input.letter}` : `Changes requested: ${c.jobTitle}, revision ${input.letter}`,
    heading: approved ? `${input.name} approved revision ${input.letter}` : `${input.name} asked for changes`,
    paragraphs: approved
      ? [`“${c.proofName}” for ${c.clientName} is approved. The revision is now locked; any further edit starts a new revision.`]
      : [`On “${c.proofName}” for ${c.clientName}, revision ${input.letter}:`, `“${input.comment ?? ""}”`],
    action: approved ? { label: "See the approval record", url: jobUrl(c) } : { label: "Open the proof", url: editorUrl(c) },
  }));
  if (approved && input.approverEmail) {
    await sendMailSafely(
      composeMail({
        to: input.approverEmail,
        subject: `You approved ${c.jobTitle}, revision ${input.letter}`,
        heading: "Thanks, your approval is recorded",
        paragraphs: [`${c.shopName} now has your approval of revision ${input.letter} of “${c.proofName}”. They will be in touch about production.`],
        action: { label: "See what you approved", url: portalUrl(c) },
      }),
    );
  }
  return shopSent;
}
