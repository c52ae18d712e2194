"use client";

import { useEffect, useRef, useState } from "react";
import { listShareLinksAction, revokeShareLinkAction, shareProofAction, type ShareLinkView } from "@/app/shops/[shop]/proofs/[proofId]/share-actions";
import { PERMISSION_LABELS, type SharePermission } from "@/lib/review/approval";
import { CopyButton } from "@/components/ui/CopyButton";
import { formatShopDate, type ShopClock } from "@/lib/dates";

type Props = { open: boolean; onClose: () => void; shopSlug: string; proofId: string; defaultEmail: string | null; defaultName: string | null; clock?: ShopClock };

/** Send the current state to the client as a revision, by e-mail or as a link to copy. */
export function SharePanel({ open, onClose, shopSlug, proofId, defaultEmail, defaultName, clock = {} }: Props) {
  const dialog = useRef<HTMLDialogElement>(null);
  const [links, setLinks] = useState<ShareLinkView[]>([]);
  const [permission, setPermission] = useState<SharePermission>("approve");
  const [email, setEmail] = useState(defaultEmail ?? "");
  const [name, setName] = useState(defaultName ?? "");
  const [days, setDays] = useState<string>("30");
  const [message, setMessage] = useState("");
  const [result, setResult] = useState<{ url: string; letter: string; emailed: boolean | null; changes: { since: string; lines: string[] } | null } | null>(null);
  const [error, setError] = useState<string | null>(null);
  // The refusal is about the address: the e-mail field is marked and described by it.
  const [emailRefused, setEmailRefused] = useState(false);
  const [busy, setBusy] = useState(false);
  const [withdrawn, setWithdrawn] = useState<string | null>(null);

  async function refresh() {
    const r = await listShareLinksAction({ shopSlug, proofId });
    if (r.ok) setLinks(r.data);
  }

  useEffect(() => {
    const el = dialog.current;
    if (!el) return;
    if (open && !el.open) {
      el.showModal();
      void listShareLinksAction({ shopSlug, proofId }).then((r) => r.ok && setLinks(r.data));
    }
    if (!open && el.open) el.close();
  }, [open, shopSlug, proofId]);

  async function share(sendEmail: boolean) {
    setBusy(true);
    setError(null);
    const r = await shareProofAction({
      shopSlug,
      proofId,
      permission,
      expiresInDays: days ? Number(days) : null,
      recipientEmail: sendEmail && email.trim() ? email.trim() : null,
      recipientName: name.trim() || null,
      message: message.trim() || null,
    });
    setBusy(false);
    setEmailRefused(!r.ok && Boolean(r.fieldErrors?.recipientEmail?.length));
    if (!r.ok) return setError(r.error);
    setResult(r.data);
    await refresh();
  }

  return (
    <dialog ref={dialog} onClose={onClose} className="w-[min(40rem,95vw)] rounded-card border border-paper-300 bg-chalk p-0 shadow-lift backdrop:bg-ink-900/40" aria-labelledby="share-title">
      <div className="space-y-4 p-6">
        <div className="flex items-start justify-between">
          <h2 id="share-title" className="text-xl">
            Share with the client
          </h2>
          <button type="button" className="text-sm text-ink-500 hover:underline" onClick={onClose}>
            Close
          </button>
        </div>
        <p className="text-sm text-ink-600">Sharing freezes what is on screen now as the revision the client sees. Later edits wait until you share again.</p>
        <div className="grid gap-3 sm:grid-cols-2">
          <div>
            <label htmlFor="share-email" className="field-label">
              Client e-mail
            </label>
            <input
              id="share-email"
              type="email"
              className="field-input"
              value={email}
              aria-invalid={error && emailRefused ? true : undefined}
              aria-describedby={error && emailRefused ? "share-error" : undefined}
              onChange={(e) => setEmail(e.target.value)}
            />
          </div>
          <div>
            <label htmlFor="share-name" className="field-label">
              Their name
            </label>
            <input id="share-name" className="field-input" value={name} onChange={(e) => setName(e.target.value)} />
          </div>
          <div>
            <label htmlFor="share-permission" className="field-label">
              They may
            </label>
            <select id="share-permission" className="field-input" value={permission} onChange={(e) => setPermission(e.target.value as SharePermission)}>
              {(Object.keys(PERMISSION_LABELS) as SharePermission[]).map((p) => (
                <option key={p} value={p}>
                  {PERMISSION_LABELS[p]}
                </option>
              ))}
            </select>
          </div>
          <div>
            <label htmlFor="share-days" className="field-label">
              Link works for
            </label>
            <select id="share-days" className="field-input" value={days} onChange={(e) => setDays(e.target.value)}>
              <option value="7">7 days</option>
              <option value="30">30 days</option>
              <option value="90">90 days</option>
              <option value="">No end date</option>
            </select>
          </div>
        </div>
        <div>
          <label htmlFor="share-message" className="field-label">
            Message (optional)
          </label>
          <textarea id="share-message" className="field-input min-h-16" value={message} onChange={(e) => setMessage(e.target.value)} maxLength={1000} />
        </div>
        {error ? (
          <p id="share-error" role="alert" className="field-error">
            {error}
          </p>
        ) : null}
        <div className="flex flex-wrap gap-2">
          <button type="button" className="btn-primary" disabled={busy || !email.trim()} onClick={() => share(true)}>
            {busy ? "Sending…" : "Send by e-mail"}
          </button>
          <button type="button" className="btn-quiet" disabled={busy} onClick={() => share(false)}>
            Make a link to copy
          </button>
          {/* Progress is spoken politely; the result below is the panel's one status. */}
          <span aria-live="polite" className="self-center text-sm text-ink-600" data-testid="share-progress">
            {busy ? "Freezing this revision and making the link…" : withdrawn ? withdrawn : ""}
          </span>
        </div>
        {result ? (
          <div role="status" className="rounded-lg bg-patina-100 p-3 text-sm text-patina-800">
            <p>
              Revision {result.letter} is shared.{" "}
              {result.emailed === true ? "The e-mail is on its way." : result.emailed === false ? "The e-mail could not be sent; copy the link instead." : ""}
            </p>
            {result.changes ? (
              <div className="mt-2" data-testid="share-changes">
                <p className="font-medium">Changed since revision {result.changes.since}:</p>
                {result.changes.lines.length ? (
                  <ul className="ml-4 list-disc">
                    {result.changes.lines.map((line) => (
                      <li key={line}>{line}</li>
                    ))}
                  </ul>
                ) : (
                  <p>Nothing that shows on the garment.</p>
                )}
              </div>
            ) : null}
            <div className="mt-2 flex gap-2">
              <input readOnly value={result.url} className="field-input py-1 text-xs" aria-label="Review link" onFocus={(e) => e.currentTarget.select()} />
              <CopyButton text={result.url} what="Review link" />
            </div>
          </div>
        ) : null}
        {links.length ? (
          <section>
            <h3 className="text-sm font-semibold text-ink-700">Links for this proof</h3>
            <ul className="mt-2 divide-y divide-paper-200 text-sm">
              {links.map((l) => (
                <li key={l.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                  <span>
                    {l.recipientName ?? l.recipientEmail ?? "Copied link"} · {PERMISSION_LABELS[l.permission]}
                    <span className="block text-xs text-ink-500">
                      {l.revokedAt ? "Withdrawn" : l.expiresAt ? `Until ${formatShopDate(new Date(l.expiresAt), clock)}` : "No end date"}
                      {l.lastSeenLetter ? ` · last opened at revision ${l.lastSeenLetter}` : " · not opened yet"}
                    </span>
                  </span>
                  {!l.revokedAt ? (
                    <button
                      type="button"
                      className="text-xs font-medium text-brick-700 hover:underline"
                      onClick={async () => {
                        const r = await revokeShareLinkAction({ shopSlug, linkId: l.id });
                        if (!r.ok) setError(r.error);
                        else setWithdrawn(`The link for ${l.recipientName ?? l.recipientEmail ?? "copying"} is withdrawn; it no longer opens.`);
                        await refresh();
                      }}
                    >
                      Withdraw
                    </button>
                  ) : null}
                </li>
              ))}
            </ul>
          </section>
        ) : null}
      </div>
    </dialog>
  );
}
