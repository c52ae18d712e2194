"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useId, useState, useTransition } from "react";
import { archiveProofAction, duplicateProofAction } from "@/app/shops/[shop]/jobs/[jobId]/proofs/actions";
import { proofStanding, type ProofStandingInput } from "@/lib/proofs/standing";

export type JobProofCard = ProofStandingInput & {
  id: string;
  name: string;
  size: string;
  colourName: string;
  blankName: string;
  blankId: string;
  updatedLabel: string;
  archived: boolean;
};

type Props = {
  shopSlug: string;
  jobId: string;
  proofs: JobProofCard[];
  blanks: Array<{ id: string; name: string; colours: Array<{ name: string; hex: string }> }>;
  canEdit: boolean;
};

const TONE: Record<ReturnType<typeof proofStanding>["tone"], string> = {
  draft: "bg-paper-200 text-ink-700",
  waiting: "bg-ochre-100 text-ochre-800",
  changes: "bg-brick-100 text-brick-800",
  approved: "bg-patina-100 text-patina-800",
  changed: "bg-brick-100 text-brick-800",
};

/** The job's proofs with where each stands, and copy and archive for the shop's makers. */
export function JobProofList({ shopSlug, jobId, proofs, blanks, canEdit }: Props) {
  const current = proofs.filter((p) => !p.archived);
  const archived = proofs.filter((p) => p.archived);
  const [announce, setAnnounce] = useState("");
  return (
    <>
      <p className="sr-only" role="status" aria-live="polite">
        {announce}
      </p>
      <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3" data-testid="job-proofs">
        {current.map((p) => (
          <ProofCard key={p.id} proof={p} shopSlug={shopSlug} blanks={blanks} canEdit={canEdit} onDone={setAnnounce} />
        ))}
      </ul>
      {archived.length ? (
        <details className="mt-4">
          <summary className="cursor-pointer text-sm text-ink-600">Archived proofs ({archived.length})</summary>
          <ul className="mt-3 grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
            {archived.map((p) => (
              <ArchivedCard key={p.id} proof={p} shopSlug={shopSlug} canEdit={canEdit} onDone={setAnnounce} />
            ))}
          </ul>
        </details>
      ) : null}
      {canEdit && current.length ? (
        <p className="mt-4">
          <Link href={`/shops/${shopSlug}/jobs/${jobId}/proofs/new`} className="btn-quiet px-3 py-1.5">
            Make another proof
          </Link>
        </p>
      ) : null}
    </>
  );
}

function ProofCard({ proof, shopSlug, blanks, canEdit, onDone }: { proof: JobProofCard; shopSlug: string; blanks: Props["blanks"]; canEdit: boolean; onDone: (text: string) => void }) {
  const router = useRouter();
  const id = useId();
  const standing = proofStanding(proof);
  const [copying, setCopying] = useState(false);
  const [blankId, setBlankId] = useState(proof.blankId);
  const blank = blanks.find((b) => b.id === blankId);
  const [colour, setColour] = useState(proof.colourName);
  const [error, setError] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  const colours = blank?.colours ?? [];
  const shownColour = colours.some((c) => c.name === colour) ? colour : (colours[0]?.name ?? "");
  const canArchive = canEdit && !proof.approvedLetter;

  function copy(event: React.FormEvent) {
    event.preventDefault();
    setError(null);
    startTransition(async () => {
      const result = await duplicateProofAction({ shopSlug, proofId: proof.id, name: null, blankId, colourName: shownColour || null });
      if (!result.ok) return setError(result.error);
      onDone(`Copied as ${result.data.name}.`);
      setCopying(false);
      router.refresh();
    });
  }

  function archive() {
    setError(null);
    startTransition(async () => {
      const result = await archiveProofAction({ shopSlug, proofId: proof.id, archived: true });
      if (!result.ok) return setError(result.error);
      onDone(`${proof.name} was archived.`);
      router.refresh();
    });
  }

  return (
    <li className="card flex flex-col p-5" aria-labelledby={`${id}-name`}>
      <Link href={`/shops/${shopSlug}/proofs/${proof.id}`} className="group block">
        <p id={`${id}-name`} className="font-medium text-ink-900 group-hover:underline">
          {proof.name} <span className="measure text-sm text-ink-500">rev. {proof.revision}</span>
        </p>
        <p className="mt-1 text-sm text-ink-600">
          {proof.blankName} · {proof.colourName} · designed at {proof.size}
        </p>
      </Link>
      <p className="mt-3">
        <span className={`rounded-full px-2.5 py-0.5 text-xs font-medium ${TONE[standing.tone]}`} data-testid="proof-standing">
          {standing.label}
        </span>
      </p>
      <p className="mt-2 text-sm text-ink-700">{standing.detail}</p>
      <p className="mt-2 text-xs text-ink-500">Updated {proof.updatedLabel}</p>
      {canEdit ? (
        <div className="mt-4 flex flex-wrap gap-2 border-t border-paper-200 pt-3">
          <button type="button" className="btn-quiet px-2.5 py-1 text-sm" aria-expanded={copying} onClick={() => setCopying((v) => !v)}>
            Copy for another colour or blank
          </button>
          {canArchive ? (
            <button type="button" className="btn-quiet px-2.5 py-1 text-sm" disabled={pending} onClick={archive}>
              Archive
            </button>
          ) : null}
        </div>
      ) : null}
      {copying ? (
        <form onSubmit={copy} className="mt-3 grid gap-2 rounded-lg bg-paper-100 p-3" aria-label={`Copy ${proof.name}`}>
          <label htmlFor={`${id}-blank`} className="field-label">
            Blank
          </label>
          <select id={`${id}-blank`} className="field-input" value={blankId} onChange={(e) => setBlankId(e.target.value)}>
            {blanks.map((b) => (
              <option key={b.id} value={b.id}>
                {b.name}
              </option>
            ))}
          </select>
          <label htmlFor={`${id}-colour`} className="field-label">
            Colour
          </label>
          <select id={`${id}-colour`} className="field-input" value={shownColour} onChange={(e) => setColour(e.target.value)}>
            {colours.map((c) => (
              <option key={c.name} value={c.name}>
                {c.name}
              </option>
            ))}
          </select>
          <button type="submit" className="btn-primary mt-1 px-3 py-1.5" disabled={pending}>
            {pending ? "Copying…" : "Make the copy"}
          </button>
        </form>
      ) : null}
      {error ? (
        <p role="alert" className="mt-3 rounded-lg bg-brick-100 p-2 text-sm text-brick-800">
          {error}
        </p>
      ) : null}
    </li>
  );
}

function ArchivedCard({ proof, shopSlug, canEdit, onDone }: { proof: JobProofCard; shopSlug: string; canEdit: boolean; onDone: (text: string) => void }) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [error, setError] = useState<string | null>(null);
  return (
    <li className="card p-4 text-sm">
      <p className="font-medium text-ink-800">
        {proof.name} <span className="measure text-ink-500">rev. {proof.revision}</span>
      </p>
      <p className="text-ink-600">
        {proof.blankName} · {proof.colourName}
      </p>
      {canEdit ? (
        <button
          type="button"
          className="btn-quiet mt-2 px-2.5 py-1"
          disabled={pending}
          onClick={() =>
            startTransition(async () => {
              const result = await archiveProofAction({ shopSlug, proofId: proof.id, archived: false });
              if (!result.ok) return setError(result.error);
              onDone(`${proof.name} is back on the job.`);
              router.refresh();
            })
          }
        >
          Bring back
        </button>
      ) : null}
      {error ? <p role="alert" className="mt-2 text-brick-800">{error}</p> : null}
    </li>
  );
}
