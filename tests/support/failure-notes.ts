/**
 * Notes a failing test carries in its error message: the random tags, names and seeds a test file
 * made, and what a test was still waiting for. A test that fails names everything needed to find
 * its rows in the database or to repeat its random choices.
 *
 * Runs as a setup file of the integration project (vitest.config.ts); a test file imports
 * `noteOnFailure` from here to add its own notes. Module state is per test file (vitest isolates
 * files), so notes never leak from one file into another.
 */
import { beforeEach } from "vitest";

type Note = string | number | (() => string | number | undefined);
const notes = new Map<string, Note>();

/** Adds (or replaces) a note shown with every failure in this test file from now on. */
export function noteOnFailure(label: string, value: Note): void {
  notes.set(label, value);
}

export function forgetNote(label: string): void {
  notes.delete(label);
}

/** The notes as one line, e.g. "fixture tag 3fa9c1; interleaving seed 1234". */
export function failureNotes(): string {
  const parts: string[] = [];
  for (const [label, value] of notes) {
    const shown = typeof value === "function" ? value() : value;
    if (shown !== undefined && shown !== "") parts.push(`${label}: ${shown}`);
  }
  return parts.join("; ");
}

beforeEach(({ onTestFailed }) => {
  onTestFailed(({ task }) => {
    const text = failureNotes();
    if (!text) return;
    for (const error of task.result?.errors ?? []) {
      if (typeof error.message === "string" && !error.message.includes(text)) error.message = `${error.message}\n  [${text}]`;
    }
    console.error(`[failure notes] ${task.name}: ${text}`);
  });
});
