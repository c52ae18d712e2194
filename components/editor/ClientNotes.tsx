"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { formatShopDateTime, type ShopClock } from "@/lib/dates";

type Note = { id: string; parentId: string | null; body: string; authorName: string; authorRole: "shop" | "client"; revisionLetter: string; createdAt: string; resolvedAt: string | null; side: string | null };
type Payload = { comments: Note[]; revision: { letter: string; state: string } | null; approvals: Array<{ id: string; decision: string; fullName: string; revisionLetter: string; at: string }> };

/** The client's pinned notes, replies and decisions, refreshed without reloading. */
export function ClientNotes({ proofId, canReply, clock = {} }: { proofId: string; canReply: boolean; clock?: ShopClock }) {
  const base = `/api/review/proof/${proofId}/comments`;
  const client = useQueryClient();
  const key = ["notes", proofId];
  const query = useQuery<Payload>({
    queryKey: key,
    queryFn: async () => {
      const r = await fetch(base, { cache: "no-store" });
      if (!r.ok) throw new Error("Could not load the client's notes.");
      return (await r.json()) as Payload;
    },
    refetchInterval: 3_000,
  });
  const send = useMutation({
    mutationFn: async (body: Record<string, unknown>) => {
      const r = await fetch(base, { method: body.resolved === undefined ? "POST" : "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
      const json = (await r.json().catch(() => ({}))) as Payload & { error?: string };
      if (!r.ok) throw new Error(json.error ?? "Not saved.");
      return json;
    },
    onSuccess: (data) => client.setQueryData(key, { comments: data.comments, revision: data.revision, approvals: data.approvals }),
  });
  const notes = query.data?.comments ?? [];
  const threads = notes.filter((n) => !n.parentId);
  const decision = query.data?.approvals[0];
  return (
    <section id="client-notes" className="space-y-3 border-t border-paper-300 p-4" aria-label="Client notes">
      <h2 className="text-sm font-semibold uppercase tracking-wider text-ink-500">Client notes</h2>
      {query.data?.revision ? (
        <p className="text-xs text-ink-600">
          Revision {query.data.revision.letter} is with the client
          {query.data.revision.state === "approved" ? " and approved" : query.data.revision.state === "changes-requested" ? "; they asked for changes" : ""}.
        </p>
      ) : (
        <p className="text-xs text-ink-500">Nothing shared yet.</p>
      )}
      {decision ? (
        <p className="rounded-lg bg-paper-100 px-3 py-2 text-xs text-ink-700" data-testid="editor-decision">
          {decision.decision === "approved" ? "Approved" : "Changes asked for"} by {decision.fullName} · rev. {decision.revisionLetter} · {formatShopDateTime(new Date(decision.at), clock)}
        </p>
      ) : null}
      {send.error ? <p className="field-error">{send.error.message}</p> : null}
      <ol className="space-y-2">
        {threads.map((t, i) => (
          <li key={t.id} className={`rounded-lg border p-2 text-sm ${t.resolvedAt ? "border-paper-200 opacity-70" : "border-paper-300 bg-chalk"}`} data-testid="editor-note">
            <p>
              <span className="mr-1 inline-grid h-5 w-5 place-items-center rounded-full bg-brick-600 text-xs font-bold text-chalk">{i + 1}</span>
              <span className="font-medium">{t.authorName}</span> <span className="text-xs text-ink-500">rev. {t.revisionLetter}{t.side ? ` · ${t.side}` : ""}</span>
            </p>
            <p className="mt-1 whitespace-pre-wrap break-words">{t.body}</p>
            {notes
              .filter((r) => r.parentId === t.id)
              .map((r) => (
                <p key={r.id} className="mt-1 whitespace-pre-wrap break-words border-l-2 border-patina-300 pl-2 text-ink-700">
                  <span className="font-medium">{r.authorName}</span>: {r.body}
                </p>
              ))}
            {canReply ? (
              <div className="mt-2 flex flex-wrap items-center gap-2">
                <Reply onSend={(body) => send.mutateAsync({ body, parentId: t.id })} />
                <button type="button" className="text-xs text-ink-600 hover:underline" onClick={() => send.mutate({ commentId: t.id, resolved: !t.resolvedAt })}>
                  {t.resolvedAt ? "Reopen" : "Mark resolved"}
                </button>
              </div>
            ) : null}
          </li>
        ))}
      </ol>
    </section>
  );
}

function Reply({ onSend }: { onSend: (body: string) => Promise<unknown> }) {
  const [body, setBody] = useState("");
  return (
    <form
      className="flex flex-1 gap-1"
      onSubmit={async (e) => {
        e.preventDefault();
        if (!body.trim()) return;
        await onSend(body).then(() => setBody("")).catch(() => undefined);
      }}
    >
      <input className="field-input py-1 text-xs" value={body} onChange={(e) => setBody(e.target.value)} placeholder="Reply to the client" aria-label="Reply to the client" maxLength={2000} />
      <button type="submit" className="btn-quiet px-2 py-1 text-xs">
        Reply
      </button>
    </form>
  );
}
