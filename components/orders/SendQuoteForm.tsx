"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { sendQuoteAction } from "@/app/shops/[shop]/jobs/actions";
import { Notice } from "./Notice";

export function SendQuoteForm({ shopSlug, jobId, replaces }: { shopSlug: string; jobId: string; replaces: number | null }) {
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
      <div>
        <label htmlFor="quote-message" className="field-label">
          Message with the quote (optional)
        </label>
        <textarea id="quote-message" rows={2} className="field-input" maxLength={2000} value={message} onChange={(e) => setMessage(e.target.value)} />
      </div>
      <button type="button" className="btn-primary" onClick={send} disabled={pending}>
        {pending ? "Sending…" : replaces ? `Send as new quote (replaces Q${replaces})` : "Send quote to client"}
      </button>
      {notice ? <Notice tone={notice.tone} testId="send-quote-notice">{notice.text}</Notice> : null}
    </div>
  );
}
