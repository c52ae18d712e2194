/**
 * The page and route rows of the authorization matrix (tests/authz/matrix.ts), over HTTP against
 * the production build. Each actor signs in once through the credentials callback; every row is
 * requested as every actor with redirects left unfollowed, and the status (or redirect) must be the
 * row's. Refusals, and anything another shop's owner gets, must not carry our records' text;
 * production's answers carry no money; the signed-in client sees nothing of our other clients.
 */
import { version as uploadSdkVersion } from "uploadthing/client";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db, getPool } from "@/db/client";
import { approvals, payments, proofComments } from "@/db/schema";
import { buildAuthzFixture, type AuthzFixture } from "@/tests/authz/fixtures";
import { ACTORS, PAGE_ROWS, ROUTE_ROWS, fill, outcomeLabel, rowLabel, type Actor, type HttpOutcome, type PageRow, type RouteRow } from "@/tests/authz/matrix";
import { BASE_URL, fetchFrom, signInOverHttp } from "./support";

let f: AuthzFixture;
let ids: Record<string, string>;
const cookies = {} as Record<Actor, string | null>;

type Answer = { status: number; location: string | null; text: string };

async function ask(row: PageRow | RouteRow, actor: Actor): Promise<Answer> {
  const method = row.kind === "route" ? row.method : "GET";
  // One address per actor, as if each were on their own device; per-address rate limits stay apart.
  const from = `127.0.77.${ACTORS.indexOf(actor) + 1}`;
  const headers: Record<string, string> = {};
  const cookie = cookies[actor];
  if (cookie) headers.cookie = cookie;
  let body: string | undefined;
  if (row.kind === "page") headers.accept = "text/html";
  else {
    Object.assign(headers, fill(row.headers ?? {}, ids));
    if (row.body !== undefined) {
      let value = fill(row.body, ids) as Record<string, unknown>;
      if (actor === "link" && row.linkInBody) value = { ...value, link: ids[row.linkInBody] };
      body = JSON.stringify(value);
      headers["content-type"] = "application/json";
    }
  }
  const response = await fetchFrom(from, `${BASE_URL}${fill(row.path, ids)}`, { method, headers, body });
  return { status: response.status, location: response.headers.get("location"), text: await response.text() };
}

const isRedirect = (status: number) => status >= 300 && status < 400;

function describeAnswer(answer: Answer): string {
  if (isRedirect(answer.status)) return `${answer.status} → ${answer.location ? new URL(answer.location, BASE_URL).pathname : "(no location)"}`;
  return String(answer.status);
}

function matches(expected: HttpOutcome, answer: Answer): boolean {
  if (typeof expected === "number") return answer.status === expected;
  if (!isRedirect(answer.status) || !answer.location) return false;
  const to = new URL(answer.location, BASE_URL);
  if (expected === "sign-in") return to.pathname === "/sign-in" && to.searchParams.has("callbackUrl");
  return to.pathname === fill(expected.redirect, ids);
}

/** What must never be in this answer for this actor. */
function leaks(row: PageRow | RouteRow, actor: Actor, answer: Answer): string[] {
  const found: string[] = [];
  const refused = answer.status >= 400 || isRedirect(answer.status);
  const look = (what: string, texts: string[]) => {
    for (const t of texts) if (answer.text.includes(t)) found.push(`${actor}: ${what} "${t}" in the ${answer.status} answer`);
  };
  if (refused || (actor === "other" && !row.open)) look("our", f.secrets);
  if (actor === "client" && !row.open) look("another client's", f.clientSecrets);
  if (actor === "production" && !row.open) look("money", f.money);
  return found;
}

beforeAll(async () => {
  f = await buildAuthzFixture();
  ids = { ...f.ids, utVersion: uploadSdkVersion };
  for (const actor of ACTORS) {
    cookies[actor] = actor === "link" || actor === "anon" ? null : await signInOverHttp(f.users[actor].email, f.passwords[actor]);
  }
});

afterAll(async () => {
  await getPool().end();
});

describe("authorization matrix: pages and route handlers over HTTP", () => {
  it.each([...PAGE_ROWS, ...ROUTE_ROWS].map((row) => [rowLabel(row), row] as const))("%s", async (_label, row) => {
    const problems: string[] = [];
    for (const actor of ACTORS) {
      const answer = await ask(row, actor);
      const expected = row.expect[actor];
      if (!matches(expected, answer)) problems.push(`${actor}: expected ${outcomeLabel(expected)}, got ${describeAnswer(answer)} ${answer.status >= 400 ? answer.text.slice(0, 120) : ""}`.trim());
      problems.push(...leaks(row, actor, answer));
    }
    expect(problems).toEqual([]);
  });

  it("kept exactly the writes the matrix allows", async () => {
    // Notes on the proof: the fixture's pin, 7 through the approve link, owner + designer + client
    // signed in, and the 8 change requests (7 by link, 1 by the client), each with its note.
    const notes = await db.select({ id: proofComments.id }).from(proofComments).where(eq(proofComments.proofId, f.ids.proofId));
    expect(notes).toHaveLength(1 + 7 + 3 + 8);
    const decisions = await db.select({ id: approvals.id }).from(approvals).where(eq(approvals.proofId, f.ids.proofId));
    expect(decisions).toHaveLength(8);
    // One open deposit checkout per quote the payer may reach; a second request reuses it.
    expect(await db.select({ id: payments.id }).from(payments).where(eq(payments.quoteId, f.ids.quoteId))).toHaveLength(1);
    expect(await db.select({ id: payments.id }).from(payments).where(eq(payments.quoteId, f.ids.siblingQuoteId))).toHaveLength(1);
    expect(await db.select({ id: payments.id }).from(payments).where(eq(payments.quoteId, f.ids.otherQuoteId))).toHaveLength(0);
    // The resolve by the owner and the designer stands; nobody else touched the other shop's proof.
    const [pin] = await db.select().from(proofComments).where(eq(proofComments.id, f.ids.commentId));
    expect(pin!.resolvedBy).toBe(f.users.designer.id);
    expect(await db.select({ id: proofComments.id }).from(proofComments).where(eq(proofComments.proofId, f.ids.otherProofId))).toHaveLength(0);
  });
});
