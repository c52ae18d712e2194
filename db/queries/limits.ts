import "server-only";
import { createHash } from "node:crypto";
import type { Pool } from "pg";
import { RateLimiterPostgres, RateLimiterRes } from "rate-limiter-flexible";
import { getPool } from "@/db/client";

/** So many points per subject in a window of `durationSeconds`; the window starts at the first point. */
export type LimitRule = { name: string; points: number; durationSeconds: number };
export type LimitAnswer = { allowed: true; remaining: number } | { allowed: false; retryAfterSeconds: number };

/**
 * rate-limiter-flexible's PostgreSQL store, one per rule and pool, all writing the `rate_limits`
 * table of migration 0007 (hence `tableCreated`). Every app process shares the rows, each write is
 * one atomic upsert, and only rows whose window ended over an hour ago are ever deleted.
 */
const limiters = new WeakMap<Pool, Map<string, RateLimiterPostgres>>();

/**
 * The pool as the store sees it, with its statements sent unnamed. The store names each statement
 * (a prepared statement of the connection's session); behind a pooler in transaction mode the
 * next statement may run on another server connection, where that name "does not exist" or
 * "already exists". Unnamed, each statement is parsed where it runs.
 */
function unnamed(pool: Pool) {
  return { query: (q: { text: string; values?: unknown[] }) => pool.query({ text: q.text, values: q.values }) };
}

function limiter(rule: LimitRule, pool: Pool): RateLimiterPostgres {
  let byRule = limiters.get(pool);
  if (!byRule) limiters.set(pool, (byRule = new Map()));
  let found = byRule.get(rule.name);
  if (!found) {
    found = new RateLimiterPostgres({
      storeClient: unnamed(pool),
      storeType: "pool",
      tableName: "rate_limits",
      tableCreated: true,
      keyPrefix: rule.name,
      points: rule.points,
      duration: rule.durationSeconds,
      // The sweep of ended windows covers the whole table: the first store on a pool runs it for all.
      clearExpiredByTimeout: byRule.size === 0,
    });
    byRule.set(rule.name, found);
  }
  return found;
}

/** Subjects are e-mail addresses, client addresses and tokens: kept hashed, and short enough for the key column. */
function keyOf(subject: string): string {
  return createHash("sha256").update(subject).digest("base64url");
}

/** Takes one point for the subject; refused once the window's points are used (the point still counts). */
export async function consumeLimit({ rule, subject, pool = getPool() }: { rule: LimitRule; subject: string; pool?: Pool }): Promise<LimitAnswer> {
  try {
    const res = await limiter(rule, pool).consume(keyOf(subject));
    return { allowed: true, remaining: res.remainingPoints };
  } catch (error) {
    if (error instanceof RateLimiterRes) return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil(error.msBeforeNext / 1000)) };
    throw error;
  }
}

/** Gives a point back (a sign-in that worked is not a failure). */
export async function refundLimit({ rule, subject, pool = getPool() }: { rule: LimitRule; subject: string; pool?: Pool }): Promise<void> {
  const key = keyOf(subject);
  const current = await limiter(rule, pool).get(key);
  // Nothing to give back once the window has ended (a refund would start the next one below zero).
  if (current && current.consumedPoints > 0) await limiter(rule, pool).reward(key, 1);
}

/** Points used in the subject's current window (0 when none is open). */
export async function usedLimit({ rule, subject, pool = getPool() }: { rule: LimitRule; subject: string; pool?: Pool }): Promise<number> {
  return (await limiter(rule, pool).get(keyOf(subject)))?.consumedPoints ?? 0;
}
