/**
 * Waiting for a named event or state instead of for time. A wait has no clock of its own: it ends
 * when the thing it names happens, and if that never happens the test's own timeout ends it, with
 * the failure naming what was still awaited (tests/support/failure-notes.ts).
 */
import { setImmediate as nextTurn } from "node:timers/promises";
import { onTestFinished } from "vitest";
import { forgetNote, noteOnFailure } from "./failure-notes";

let pending = 0;

class WaitAbandoned extends Error {}

/**
 * Runs a wait with its name among the failure notes. `stop` is called when the test it belongs to
 * has finished (passed, failed or timed out), so no wait outlives its test.
 */
async function awaiting<T>(what: string, work: (finished: () => boolean, onFinish: (stop: () => void) => void) => Promise<T>): Promise<T> {
  const label = `still waiting (${(pending += 1)})`;
  noteOnFailure(label, what);
  let done = false;
  const stops: Array<() => void> = [];
  try {
    onTestFinished(() => {
      done = true;
      for (const stop of stops) stop();
    });
  } catch {
    // Outside a test (in a hook): the hook's own timeout ends the wait.
  }
  try {
    return await work(
      () => done,
      (stop) => stops.push(stop),
    );
  } finally {
    forgetNote(label);
  }
}

/**
 * Re-checks `probe` until it gives a value other than undefined/false, yielding to the event loop
 * between checks (and to I/O: a probe that queries the database waits for its answer each time).
 */
export function waitUntil<T>(what: string, probe: () => T | undefined | false | Promise<T | undefined | false>): Promise<T> {
  return awaiting(what, async (finished) => {
    for (;;) {
      const value = await probe();
      if (value !== undefined && value !== false) return value;
      if (finished()) throw new WaitAbandoned(`gave up waiting for ${what}: the test has finished`);
      await nextTurn();
    }
  });
}

/**
 * A list that tests can wait on: `push` adds an item and wakes every waiter whose match it is;
 * `next(what, match)` resolves with the first item, already here or yet to come, that matches.
 */
export class Arrivals<T> {
  readonly items: T[] = [];
  private waiters: Array<{ match: (item: T) => boolean; resolve: (item: T) => void }> = [];

  push(item: T): void {
    this.items.push(item);
    const woken = this.waiters.filter((w) => w.match(item));
    this.waiters = this.waiters.filter((w) => !w.match(item));
    for (const w of woken) w.resolve(item);
  }

  find(match: (item: T) => boolean): T | undefined {
    return this.items.find(match);
  }

  next(what: string, match: (item: T) => boolean): Promise<T> {
    const here = this.items.find(match);
    if (here !== undefined) return Promise.resolve(here);
    return awaiting(
      what,
      (_finished, onFinish) =>
        new Promise<T>((resolve, reject) => {
          const waiter = { match, resolve };
          this.waiters.push(waiter);
          onFinish(() => {
            this.waiters = this.waiters.filter((w) => w !== waiter);
            reject(new WaitAbandoned(`gave up waiting for ${what}: the test has finished`));
          });
        }),
    );
  }

  clear(): void {
    this.items.length = 0;
  }
}
