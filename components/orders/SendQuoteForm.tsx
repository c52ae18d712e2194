"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { sendQuoteAction } from "@/app/shops/[shop]/jobs/actions";
import { Notice } from "./Notice";

export type QuoteMismatchNote = { key: string; message: string; blocking: boolean };

/**
 * Sends the price today as a quote. Where it and the job's proofs differ, the differences are
 * listed first with a link to the job's print locations; a quote billing fewer locations than the
 * proofs show cannot be sent (the action refuses it too).
 */
export function SendQuoteForm({
  shopSlug,
  jobId,
  replaces,
  mismatches = [],
  editLocationsHref,
}: {
  shopSlug: string;
  jobId: string;
  replaces: number | null;
  mismatches?: QuoteMismatchNote[];
  editLocationsHref?: string;
}) {
  const blocked = mismatches.some((m) => m.blocking);
  const router = useRouter();
  const [message, setMessage] = useState("");
  const [notice, setNotice] = useState<{ tone: "ok" | "warn" | "error"; text: string }>();
  const [pending, start] = useTransition();
  const send = () =>
    start(async () => {
      setNotice(undefined);
      const result = await sendQuoteAction({ shopSlug, jobId, message: message || undefined });
      if (!result.ok) {
        setNotice({ tone: "error", text: result.error });
        return;
      }
      const { number, emailed, recipients } = result.data;
      setNotice(
        recipients === 0
          ? { tone: "warn", text: `Quote Q${number} is saved, but this client has no contacts to e-mail. Add one on the client page.` }
          : emailed < recipients
            ? { tone: "warn", text: `Quote Q${number} is saved; ${recipients - emailed} of ${recipients} e-mails could not be sent.` }
            : { tone: "ok", text: `Quote Q${number} sent to ${recipients} ${recipients === 1 ? "contact" : "contacts"}.` },
      );
      setMessage("");
      router.refresh();
    });
  return (
    <div className="space-y-3">
      {mismatches.length > 0 ? (
        <div
          role={blocked ? "alert" : "status"}
          className={`space-y-1 rounded-lg px-3 py-2 text-sm ${blocked ? "bg-brick-100 text-brick-800" : "bg-ochre-100 text-ochre-800"}`}
          data-testid="quote-proof-mismatch"
        >
          <p className="font-medium">{blocked ? "This quote bills fewer print locations than the proofs show. Add them before sending." : "The quote and the proofs differ. Check before sending."}</p>
          <ul className="list-disc pl-5">
            {mismatches.map((m) => (
              <li key={m.key}>{m.message}</li>
            ))}
          </ul>
          {editLocationsHref ? (
            <p>
              <Link href={editLocationsHref} className="underline">
                Edit the job&apos;s print locations
              </Link>
            </p>
          ) : null}
        </div>
      ) : null}
      <div>
        <label htmlFor="quote-message" className="field-label">
          Message with the quote (optional)
        </label>
        <textarea id="quote-message" rows={2} className="field-input" maxLength={2000} value={message} onChange={(e) => setMessage(e.target.value)} />
      </div>
      <button type="button" className="btn-primary" onClick={send} disabled={pending || blocked}>
        {pending ? "Sending…" : replaces ? `Send as new quote (replaces Q${replaces})` : "Send quote to client"}
      </button>
      {notice ? <Notice tone={notice.tone} testId="send-quote-notice">{notice.text}</Notice> : null}
    </div>
  );
}
