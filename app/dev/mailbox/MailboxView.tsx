"use client";

import { useState } from "react";
import { formatShopDateTime } from "@/lib/dates";

export type CaughtMessage = { id: string; date: string; from: string; to: string[]; subject: string; text: string; html: string | null };

export function MailboxView({ messages }: { messages: CaughtMessage[] }) {
  const [openId, setOpenId] = useState<string | undefined>(messages[0]?.id);
  const open = messages.find((m) => m.id === openId);
  if (messages.length === 0) {
    return <p className="mt-8 rounded-card border border-dashed border-ink-200 p-8 text-center text-ink-600">No e-mail yet.</p>;
  }
  return (
    <div className="mt-6 grid gap-4 md:grid-cols-[20rem_1fr]">
      <ul className="card max-h-[70vh] divide-y divide-paper-200 overflow-auto" aria-label="Messages">
        {messages.map((m) => (
          <li key={m.id}>
            <button
              type="button"
              onClick={() => setOpenId(m.id)}
              aria-current={m.id === openId ? "true" : undefined}
              className={`block w-full px-4 py-3 text-left text-sm ${m.id === openId ? "bg-patina-100" : "hover:bg-paper-50"}`}
            >
              <span className="block truncate font-medium" data-testid="mail-subject">
                {m.subject}
              </span>
              <span className="block truncate text-xs text-ink-500">to {m.to.join(", ")}</span>
              <span className="block text-xs text-ink-400">{formatShopDateTime(new Date(m.date))}</span>
            </button>
          </li>
        ))}
      </ul>
      {open ? (
        <article className="card min-w-0 p-5" aria-label="Message">
          <h2 className="text-lg">{open.subject}</h2>
          <p className="mt-1 text-xs text-ink-500">
            From {open.from} to {open.to.join(", ")}
          </p>
          {open.html ? (
            <iframe title="HTML part" sandbox="" srcDoc={open.html} className="mt-4 h-96 w-full rounded-lg border border-paper-300 bg-white" />
          ) : null}
          <details className="mt-4" open={!open.html}>
            <summary className="cursor-pointer text-sm font-medium text-ink-700">Text part</summary>
            <pre className="mt-2 whitespace-pre-wrap break-words rounded-lg bg-paper-100 p-3 text-sm" data-testid="mail-text">
              {open.text}
            </pre>
          </details>
        </article>
      ) : null}
    </div>
  );
}
