import "server-only";
import { NextResponse } from "next/server";
import { consumeLimit, refundLimit, type LimitRule } from "@/db/queries/limits";
import { limitSubject } from "@/lib/client-address";

/**
 * Every limit, in one place. Counters live in PostgreSQL (`rate_limits`), shared by every app
 * process; a window opens with its first point and its count starts again once it ends. Sizes are
 * our own choice (common practice, no published source): room for a person who mistypes or clicks
 * twice, none for a script.
 */
export const LIMITS = {
  /** Password attempts that did not sign in, from one client address (IPv6: one /64). */
  signInAddress: { name: "sign-in-address", points: 10, durationSeconds: 10 * 60 },
  /** Password attempts that did not sign in, for one account, from every address together. */
  signInAccount: { name: "sign-in-account", points: 50, durationSeconds: 15 * 60 },
  /** Sign-in links asked for, per client address and per recipient. */
  signInLinkAddress: { name: "sign-in-link-address", points: 20, durationSeconds: 60 * 60 },
  signInLinkRecipient: { name: "sign-in-link-recipient", points: 5, durationSeconds: 60 * 60 },
  /** Invitation accepts, per client address and per invitation. */
  inviteAddress: { name: "invite-address", points: 20, durationSeconds: 15 * 60 },
  inviteToken: { name: "invite-token", points: 5, durationSeconds: 15 * 60 },
  /** New shops per e-mail address. */
  signUp: { name: "sign-up", points: 5, durationSeconds: 5 * 60 },
  /** Review notes: per link and address, per link from everywhere (each e-mails the shop), per signed-in person. */
  commentLinkAddress: { name: "comment-link-address", points: 12, durationSeconds: 60 },
  commentLink: { name: "comment-link", points: 60, durationSeconds: 60 * 60 },
  commentUser: { name: "comment-user", points: 12, durationSeconds: 60 },
  /** Approvals and change requests, per link or person and address. */
  decision: { name: "decision", points: 6, durationSeconds: 60 },
  /** A client accepting or paying a quote, per quote and address. */
  quoteAccept: { name: "quote-accept", points: 6, durationSeconds: 60 },
  checkout: { name: "checkout", points: 8, durationSeconds: 60 },
} satisfies Record<string, LimitRule>;

export type LimitCheck = { rule: LimitRule; subject: string };
export type Taken = { ok: true } | { ok: false; status: 429 | 503; retryAfterSeconds: number };

/** The subject for a per-address rule: the address, or its /64 for IPv6. */
export const addressSubject = (address: string | null) => limitSubject(address);

/**
 * Takes a point from each check in order and stops at the first one refused, so points are only
 * spent on the later (wider) checks by requests the earlier ones let through: one address that is
 * being refused does not use up an account's allowance. A database that does not answer refuses
 * with 503 rather than letting everything through.
 */
export async function takeLimits(...checks: LimitCheck[]): Promise<Taken> {
  try {
    for (const { rule, subject } of checks) {
      const answer = await consumeLimit({ rule, subject });
      if (!answer.allowed) return { ok: false, status: 429, retryAfterSeconds: answer.retryAfterSeconds };
    }
    return { ok: true };
  } catch (error) {
    console.error("[limits] the limit store did not answer:", error instanceof Error ? error.message : String(error));
    return { ok: false, status: 503, retryAfterSeconds: 5 };
  }
}

/** Gives back the points a request took (it turned out not to be a failure). Best effort. */
export async function refundLimits(...checks: LimitCheck[]): Promise<void> {
  try {
    for (const { rule, subject } of checks) await refundLimit({ rule, subject });
  } catch (error) {
    console.error("[limits] could not give back a point:", error instanceof Error ? error.message : String(error));
  }
}

export const UNAVAILABLE_MESSAGE = "We could not check that just now. Try again in a moment.";

/** The JSON answer for a refusal: 429 with the words given and Retry-After, or 503. */
export function limitResponse(taken: Extract<Taken, { ok: false }>, message: string, extra: Record<string, unknown> = {}): NextResponse {
  return NextResponse.json(
    { error: taken.status === 429 ? message : UNAVAILABLE_MESSAGE, ...extra },
    { status: taken.status, headers: { "Retry-After": String(taken.retryAfterSeconds), "Cache-Control": "no-store" } },
  );
}
