"use client";

import { useCallback, useEffect, useRef, useState } from "react";
import type { ProofDoc } from "@/lib/editor/document";
import type { SaveProofResponse } from "@/app/shops/[shop]/proofs/[proofId]/actions";
import type { EditorStore } from "./store";

export type SaveStatus =
  | { kind: "saved"; at: string | null }
  | { kind: "pending" }
  | { kind: "saving" }
  | { kind: "offline"; message: string; retryInMs: number }
  | { kind: "retrying"; message: string; retryInMs: number }
  | { kind: "conflict"; message: string; version: number; doc: ProofDoc }
  | { kind: "refused"; message: string };

type Saver = (input: { baseVersion: number; doc: ProofDoc; saveKey: string }) => Promise<SaveProofResponse>;

const DEBOUNCE_MS = 700;
const RETRY_STEPS_MS = [1_000, 2_000, 4_000, 8_000, 15_000];

function pendingKey(proofId: string) {
  return `chalkline.pending.${proofId}`;
}

/**
 * Debounced autosave with an optimistic version. Unsaved edits are mirrored to localStorage, so a
 * reload or a lost connection never loses them; failed saves are retried; a stale save is refused
 * by the server and the fresh state is offered instead of overwriting it.
 */
export function useAutosave(opts: { proofId: string; store: EditorStore; initialVersion: number; enabled: boolean; save: Saver; onSaved?: (revision: string) => void }) {
  const { proofId, store, enabled, save } = opts;
  const [status, setStatus] = useState<SaveStatus>({ kind: "saved", at: null });
  /** Saves stored since the editor opened: a count anyone waiting for "the next save" can watch. */
  const [saves, setSaves] = useState(0);
  /** Failed tries that were scheduled again, likewise a count to watch. */
  const [retries, setRetries] = useState(0);
  const version = useRef(opts.initialVersion);
  const savedDoc = useRef<ProofDoc>(store.getState().doc);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const attempt = useRef(0);
  /** The key of the save in progress: kept while the same edit is retried, so the server knows a repeat of a stored save. */
  const current = useRef<{ doc: ProofDoc; baseVersion: number; key: string } | null>(null);
  const inFlight = useRef(false);
  const blocked = useRef(false);
  const scheduleRef = useRef<() => void>(() => {});
  const flushRef = useRef<() => Promise<void>>(async () => {});
  const onSavedRef = useRef(opts.onSaved);
  useEffect(() => {
    onSavedRef.current = opts.onSaved;
  });

  const flush = useCallback(async () => {
    if (!enabled || inFlight.current || blocked.current) return;
    const doc = store.getState().doc;
    if (doc === savedDoc.current) {
      setStatus((s) => (s.kind === "saved" ? s : { kind: "saved", at: new Date().toISOString() }));
      return;
    }
    inFlight.current = true;
    setStatus({ kind: "saving" });
    let result: SaveProofResponse | null = null;
    if (!current.current || current.current.doc !== doc || current.current.baseVersion !== version.current) {
      current.current = { doc, baseVersion: version.current, key: crypto.randomUUID() };
    }
    try {
      result = await save({ baseVersion: version.current, doc, saveKey: current.current.key });
    } catch {
      result = null;
    }
    inFlight.current = false;
    if (!result) {
      const wait = RETRY_STEPS_MS[Math.min(attempt.current, RETRY_STEPS_MS.length - 1)]!;
      attempt.current += 1;
      setRetries((n) => n + 1);
      setStatus({ kind: "offline", message: "Can't reach Chalkline. Your edits are kept on this device and will be saved.", retryInMs: wait });
      timer.current = setTimeout(() => void flushRef.current(), wait);
      return;
    }
    attempt.current = 0;
    if (result.ok) {
      setSaves((n) => n + 1);
      version.current = result.version;
      onSavedRef.current?.(result.revision);
      savedDoc.current = doc;
      if (store.getState().doc === doc) {
        window.localStorage.removeItem(pendingKey(proofId));
        setStatus({ kind: "saved", at: result.savedAt });
      } else {
        scheduleRef.current();
      }
      return;
    }
    if (result.kind === "conflict") {
      blocked.current = true;
      setStatus({ kind: "conflict", message: result.message, version: result.version, doc: result.doc });
      return;
    }
    if (result.kind === "error") {
      // Chalkline answered but could not store the edit (its database is down): same retries.
      const wait = RETRY_STEPS_MS[Math.min(attempt.current, RETRY_STEPS_MS.length - 1)]!;
      attempt.current += 1;
      setRetries((n) => n + 1);
      setStatus({ kind: "retrying", message: result.message, retryInMs: wait });
      timer.current = setTimeout(() => void flushRef.current(), wait);
      return;
    }
    // Refused for a reason a retry will not fix: keep the edits, say why, wait for the next change.
    setStatus({ kind: "refused", message: result.message });
    savedDoc.current = doc;
  }, [enabled, proofId, save, store]);

  const schedule = useCallback(() => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void flush(), DEBOUNCE_MS);
  }, [flush]);
  useEffect(() => {
    scheduleRef.current = schedule;
    flushRef.current = flush;
  }, [schedule, flush]);

  useEffect(() => {
    if (!enabled) return;
    const unsubscribe = store.subscribe((state, previous) => {
      if (state.doc === previous.doc) return;
      window.localStorage.setItem(pendingKey(proofId), JSON.stringify({ baseVersion: version.current, doc: state.doc, at: Date.now() }));
      if (!blocked.current) setStatus({ kind: "pending" });
      schedule();
    });
    const online = () => {
      attempt.current = 0;
      void flush();
    };
    window.addEventListener("online", online);
    const beforeUnload = (event: BeforeUnloadEvent) => {
      if (store.getState().doc !== savedDoc.current) event.preventDefault();
    };
    window.addEventListener("beforeunload", beforeUnload);
    return () => {
      unsubscribe();
      window.removeEventListener("online", online);
      window.removeEventListener("beforeunload", beforeUnload);
      if (timer.current) clearTimeout(timer.current);
    };
  }, [enabled, flush, proofId, schedule, store]);

  /** Edits left on this device by an earlier visit: resume them if nobody saved since. */
  useEffect(() => {
    if (!enabled) return;
    const raw = window.localStorage.getItem(pendingKey(proofId));
    if (!raw) return;
    try {
      const pending = JSON.parse(raw) as { baseVersion: number; doc: ProofDoc };
      if (pending.baseVersion === version.current) {
        store.getState().replaceDoc(pending.doc);
      } else {
        blocked.current = true;
        setStatus({
          kind: "conflict",
          message: "Edits you made on this device earlier were not saved, and the proof has changed since.",
          version: version.current,
          doc: store.getState().doc,
        });
        // Keep the local edits on screen so nothing is lost; the maker chooses.
        store.getState().replaceDoc(pending.doc);
      }
    } catch {
      window.localStorage.removeItem(pendingKey(proofId));
    }
  }, [enabled, proofId, store]);

  /** Conflict: take the saved state from the server. */
  const takeTheirs = useCallback(() => {
    if (status.kind !== "conflict") return;
    version.current = status.version;
    savedDoc.current = status.doc;
    blocked.current = false;
    window.localStorage.removeItem(pendingKey(proofId));
    store.getState().replaceDoc(status.doc);
    savedDoc.current = store.getState().doc;
    setStatus({ kind: "saved", at: new Date().toISOString() });
  }, [proofId, status, store]);

  /** Conflict: keep what is on screen and save it as the newest version, on purpose. */
  const keepMine = useCallback(() => {
    if (status.kind !== "conflict") return;
    version.current = status.version;
    blocked.current = false;
    savedDoc.current = status.doc;
    void flush();
  }, [flush, status]);

  return { status, saves, retries, takeTheirs, keepMine, flush };
}
