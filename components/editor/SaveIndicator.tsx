"use client";

import type { SaveStatus } from "./useAutosave";

type Props = { status: SaveStatus; editable: boolean; onTakeTheirs: () => void; onKeepMine: () => void; saves?: number; retries?: number };

/** Saved / saving / offline, in a few words, and the choice when someone else saved first. */
export function SaveIndicator({ status, editable, onTakeTheirs, onKeepMine, saves = 0, retries = 0 }: Props) {
  if (!editable) return <span className="rounded-full bg-paper-200 px-2.5 py-0.5 text-xs text-ink-600">View only</span>;
  if (status.kind === "conflict") {
    return (
      <div role="alert" className="flex flex-wrap items-center gap-2 rounded-lg border border-brick-300 bg-brick-100 px-3 py-1.5 text-sm text-brick-800">
        <span>{status.message}</span>
        <button type="button" className="btn-quiet px-2.5 py-1 text-xs" onClick={onTakeTheirs}>
          Load the latest
        </button>
        <button type="button" className="btn-quiet px-2.5 py-1 text-xs" onClick={onKeepMine}>
          Keep mine and save over it
        </button>
      </div>
    );
  }
  const look: Record<Exclude<SaveStatus["kind"], "conflict">, { text: string; tone: string }> = {
    saved: { text: "All changes saved", tone: "bg-patina-100 text-patina-800" },
    pending: { text: "Unsaved changes…", tone: "bg-paper-200 text-ink-700" },
    saving: { text: "Saving…", tone: "bg-paper-200 text-ink-700" },
    offline: { text: "Offline: changes kept, retrying", tone: "bg-ochre-100 text-ochre-800" },
    retrying: { text: "Not saved yet: changes kept, retrying", tone: "bg-ochre-100 text-ochre-800" },
    refused: { text: "Not saved", tone: "bg-brick-100 text-brick-800" },
  };
  const { text, tone } = look[status.kind];
  const detail = status.kind === "offline" || status.kind === "retrying" || status.kind === "refused" ? status.message : undefined;
  return (
    <span role="status" aria-live="polite" data-testid="save-status" data-state={status.kind} data-saves={saves} data-retries={retries} title={detail} className={`rounded-full px-2.5 py-0.5 text-xs font-medium ${tone}`}>
      {text}
      {status.kind === "refused" ? `: ${status.message.replace(/^Not saved: /, "")}` : ""}
    </span>
  );
}
