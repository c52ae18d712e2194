/**
 * The authorization matrix: every page, route handler method and server action, with what each
 * actor gets. Pure data. `tests/unit/authz-matrix.test.ts` checks that it names every page, route
 * method and action in app/ (and nothing that is gone); `tests/e2e/authz.test.ts` requests the
 * page and route rows over HTTP from the production build; `tests/integration/authz.test.ts` calls
 * the action rows with the session mocked per actor.
 *
 * Each row's outcomes are one line, one token per actor, in ACTORS order:
 *
 *   200 201 400 401 403 404 410   the HTTP status (pages render the 403 and 404 pages)
 *   SI                            redirect to /sign-in?callbackUrl=…
 *   →/path                        redirect to that path ({placeholders} filled in)
 *   ok                            a server action answered { ok: true } (or redirected on success)
 *
 * For actions, 401/403/404 mean `{ ok: false, status }` with that status and no change in the database.
 */

export const ACTORS = ["owner", "designer", "production", "client", "link", "other", "anon"] as const;
export type Actor = (typeof ACTORS)[number];

export const ACTOR_NOTES: Record<Actor, string> = {
  owner: "owner@chalkline.test, owner of the demo shop",
  designer: "designer@chalkline.test, designer in the demo shop",
  production: "press@chalkline.test, production in the demo shop",
  client: "client@chalkline.test, signed in, a contact of the client Eastfield Youth Soccer Club",
  link: "no session; holds the approve link to {proofId} (sent in the path or, for quotes, the body)",
  other: "the owner of a second shop, signed in, using our ids",
  anon: "no session, no link",
};

export const HTTP_METHODS = ["GET", "HEAD", "POST", "PUT", "PATCH", "DELETE", "OPTIONS"] as const;
export type HttpMethod = (typeof HTTP_METHODS)[number];

/** Values substituted into `{name}` in paths, bodies and redirects; made by tests/authz/fixtures.ts. */
export const PLACEHOLDERS = {
  shop: "our shop's slug (the demo shop)",
  otherShop: "the second shop's slug",
  jobId: "our job for the signed-in client's club: proof sent, quote accepted",
  proofId: "the proof on {jobId}; revision A sent, share links made",
  unsentProofId: "a proof on the club's second job, never sent",
  siblingQuoteId: "the accepted quote of the club's second job (not the link's job)",
  secondClientJobId: "our job for another of our clients",
  clientId: "the club's client record in our shop",
  blankId: "our shop's own blank (a copy of a library blank)",
  artworkId: "the club's art, placed on {proofId}",
  secondClientArtworkId: "art of another of our clients, on no proof",
  exportId: "a finished production export of {jobId}",
  quoteId: "the accepted quote of {jobId}",
  linkToken: "approve link to {proofId}",
  viewToken: "view-only link to {proofId}",
  revokedToken: "withdrawn link to {proofId}",
  expiredToken: "expired link to {proofId}",
  inviteToken: "an open invitation to our shop",
  commentId: "a pinned note on {proofId}",
  device: "a screen calibration device key",
  utVersion: "the upload SDK's version, which its request header carries",
  mailKey: "the local mail catcher's key for this install (MAIL_FAKE_KEY)",
  otherJobId: "the second shop's job",
  otherProofId: "the second shop's proof (sent)",
  otherClientId: "the second shop's client",
  otherBlankId: "the second shop's own blank",
  otherArtworkId: "the second shop's art",
  otherExportId: "the second shop's finished export",
  otherQuoteId: "the second shop's accepted quote",
} as const;
export type Placeholder = keyof typeof PLACEHOLDERS;

export type HttpOutcome = 200 | 201 | 400 | 401 | 403 | 404 | 410 | "sign-in" | { redirect: string };
export type ActionOutcome = "ok" | 401 | 403 | 404;

type Common = {
  /** Answers the same whoever asks (public, or a bearer token in the path): no leak checks on 2xx. */
  open?: true;
  note?: string;
};
export type PageRow = Common & { kind: "page"; route: string; path: string; expect: Record<Actor, HttpOutcome> };
export type RouteRow = Common & {
  kind: "route";
  route: string;
  method: HttpMethod;
  path: string;
  body?: unknown;
  headers?: Record<string, string>;
  /** The link actor puts this token in the body's `link` field (quote routes take the link there). */
  linkInBody?: "linkToken" | "viewToken";
  expect: Record<Actor, HttpOutcome>;
};
export type ActionRow = Common & { kind: "action"; id: string; file: string; name: string; expect: Record<Actor, ActionOutcome> };
export type MatrixRow = PageRow | RouteRow | ActionRow;

function parse<T>(line: string, token: (t: string) => T | undefined): Record<Actor, T> {
  const tokens = line.trim().split(/\s+/);
  if (tokens.length !== ACTORS.length) throw new Error(`matrix line "${line}" has ${tokens.length} outcomes, not ${ACTORS.length}`);
  return Object.fromEntries(
    ACTORS.map((actor, i) => {
      const value = token(tokens[i]!);
      if (value === undefined) throw new Error(`matrix line "${line}": "${tokens[i]}" is not an outcome`);
      return [actor, value];
    }),
  ) as Record<Actor, T>;
}

const HTTP_STATUSES = [200, 201, 400, 401, 403, 404, 410] as const;
export function httpOutcomes(line: string): Record<Actor, HttpOutcome> {
  return parse<HttpOutcome>(line, (t) => {
    if (t === "SI") return "sign-in";
    if (t.startsWith("→/")) return { redirect: t.slice(1) };
    const n = Number(t);
    return (HTTP_STATUSES as readonly number[]).includes(n) ? (n as HttpOutcome) : undefined;
  });
}
export function actionOutcomes(line: string): Record<Actor, ActionOutcome> {
  return parse<ActionOutcome>(line, (t) => (t === "ok" ? "ok" : t === "401" ? 401 : t === "403" ? 403 : t === "404" ? 404 : undefined));
}

function page(route: string, path: string, line: string, extra: Common = {}): PageRow {
  return { kind: "page", route, path, expect: httpOutcomes(line), ...extra };
}
function route(method: HttpMethod, route: string, path: string, line: string, extra: Common & Partial<Pick<RouteRow, "body" | "headers" | "linkInBody">> = {}): RouteRow {
  return { kind: "route", method, route, path, expect: httpOutcomes(line), ...extra };
}
function action(id: string, file: string, name: string, line: string, extra: Common = {}): ActionRow {
  return { kind: "action", id, file, name, expect: actionOutcomes(line), ...extra };
}

const SHOP = "/shops/[shop]";
const UPLOAD_HEADERS = { "x-uploadthing-package": "@uploadthing/react", "x-uploadthing-version": "{utVersion}" };
const UPLOAD_FILES = [{ name: "matrix.png", size: 68, type: "image/png", lastModified: 0 }];
const NOTE = { body: "Matrix: a pinned note", side: "front", xIn: 1, yIn: 6 };
const CHANGES = { decision: "changes-requested", letter: "A", fullName: "Priya Castell", comment: "Matrix: move the crest up an inch" };
const ACCEPT = { fullName: "Priya Castell", confirmed: true };

// prettier-ignore
export const PAGE_ROWS: PageRow[] = [
  //   route                                  path                                              owner designer production client link other anon
  page("/",                                   "/",                                              "→/shops/{shop} →/shops/{shop} →/shops/{shop} →/portal 200 →/shops/{otherShop} 200"),
  page("/sign-in",                            "/sign-in",                                       "→/shops/{shop} →/shops/{shop} →/shops/{shop} →/portal 200 →/shops/{otherShop} 200"),
  page("/sign-in/check-email",                "/sign-in/check-email",                           "200 200 200 200 200 200 200", { open: true }),
  page("/sign-up",                            "/sign-up",                                       "200 200 200 200 200 200 200", { open: true }),
  page("/dev/mailbox",                        "/dev/mailbox",                                   "404 404 404 404 404 404 404", { note: "without this install's key the mailbox is not there, whoever asks" }),
  page("/dev/mailbox",                        "/dev/mailbox?key={mailKey}",                     "200 200 200 200 200 200 200", { open: true, note: "development tool: exists only while the local mail catcher is configured (MAIL_FAKE_API without SMTP_URL), and only with its key" }),
  page("/dev/bare",                           "/dev/bare",                                      "200 200 200 200 200 200 200", { open: true, note: "the bench's framework floor: a page with no script of its own, there only while the local fakes are configured" }),
  page("/home",                               "/home",                                          "→/shops/{shop} →/shops/{shop} →/shops/{shop} →/portal SI →/shops/{otherShop} SI"),
  page("/welcome",                            "/welcome",                                       "→/shops/{shop} →/shops/{shop} →/shops/{shop} →/portal SI →/shops/{otherShop} SI"),
  page("/invite/[token]",                     "/invite/{inviteToken}",                          "200 200 200 200 200 200 200", { open: true, note: "the invitation token is the credential" }),
  page("/portal",                             "/portal",                                        "200 200 200 200 SI 200 SI", { note: "anyone signed in has a portal; members and the other owner see an empty list" }),
  page("/portal/jobs/[jobId]",                "/portal/jobs/{jobId}",                           "404 404 404 200 SI 404 SI"),
  page("/portal/jobs/[jobId]",                "/portal/jobs/{secondClientJobId}",               "404 404 404 404 SI 404 SI", { note: "another client's job in the same shop" }),
  page("/portal/jobs/[jobId]",                "/portal/jobs/{otherJobId}",                      "404 404 404 404 SI 404 SI"),
  page("/portal/proofs/[proofId]",            "/portal/proofs/{proofId}",                       "→/shops/{shop}/proofs/{proofId} →/shops/{shop}/proofs/{proofId} →/shops/{shop}/proofs/{proofId} 200 SI 404 SI"),
  page("/portal/proofs/[proofId]",            "/portal/proofs/{unsentProofId}",                 "→/shops/{shop}/proofs/{unsentProofId} →/shops/{shop}/proofs/{unsentProofId} →/shops/{shop}/proofs/{unsentProofId} 404 SI 404 SI", { note: "clients see only sent revisions" }),
  page("/r/[token]",                          "/r/{linkToken}",                                 "200 200 200 200 200 200 200", { open: true, note: "the link is the credential, whoever holds it" }),
  page("/r/[token]",                          "/r/{viewToken}",                                 "200 200 200 200 200 200 200", { open: true }),
  page("/r/[token]",                          "/r/{revokedToken}",                              "404 404 404 404 404 404 404"),
  page("/r/[token]",                          "/r/{expiredToken}",                              "404 404 404 404 404 404 404"),

  // The shop workspace: members by permission, a client of the shop 403, anyone else 404.
  page(`${SHOP}`,                             "/shops/{shop}",                                  "200 200 200 403 SI 404 SI"),
  page(`${SHOP}/art`,                         "/shops/{shop}/art",                              "200 200 200 403 SI 404 SI"),
  page(`${SHOP}/blanks`,                      "/shops/{shop}/blanks",                           "200 200 200 403 SI 404 SI"),
  page(`${SHOP}/blanks/[blankId]`,            "/shops/{shop}/blanks/{blankId}",                 "200 200 200 403 SI 404 SI"),
  page(`${SHOP}/clients`,                     "/shops/{shop}/clients",                          "200 200 403 403 SI 404 SI"),
  page(`${SHOP}/clients/new`,                 "/shops/{shop}/clients/new",                      "200 200 403 403 SI 404 SI"),
  page(`${SHOP}/clients/[clientId]`,          "/shops/{shop}/clients/{clientId}",               "200 200 403 403 SI 404 SI"),
  page(`${SHOP}/jobs`,                        "/shops/{shop}/jobs",                             "200 200 200 403 SI 404 SI"),
  page(`${SHOP}/jobs/new`,                    "/shops/{shop}/jobs/new",                         "200 200 403 403 SI 404 SI"),
  page(`${SHOP}/jobs/[jobId]`,                "/shops/{shop}/jobs/{jobId}",                     "200 200 200 403 SI 404 SI", { note: "production sees the job without its quote and payments" }),
  page(`${SHOP}/jobs/[jobId]/edit`,           "/shops/{shop}/jobs/{jobId}/edit",                "200 200 403 403 SI 404 SI"),
  page(`${SHOP}/jobs/[jobId]/production`,     "/shops/{shop}/jobs/{jobId}/production",          "200 200 200 403 SI 404 SI"),
  page(`${SHOP}/jobs/[jobId]/proofs/new`,     "/shops/{shop}/jobs/{jobId}/proofs/new",          "200 200 403 403 SI 404 SI", { note: "production and clients never make proofs" }),
  page(`${SHOP}/prices`,                      "/shops/{shop}/prices",                           "200 200 403 403 SI 404 SI", { note: "designers read prices, only the owner saves them" }),
  page(`${SHOP}/proofs/[proofId]`,            "/shops/{shop}/proofs/{proofId}",                 "200 200 200 403 SI 404 SI"),
  page(`${SHOP}/settings`,                    "/shops/{shop}/settings",                         "200 403 403 403 SI 404 SI"),

  // Another shop's records under our slug: not ours, so 404 (after the permission check).
  page(`${SHOP}/jobs/[jobId]`,                "/shops/{shop}/jobs/{otherJobId}",                "404 404 404 403 SI 404 SI"),
  page(`${SHOP}/jobs/[jobId]/edit`,           "/shops/{shop}/jobs/{otherJobId}/edit",           "404 404 403 403 SI 404 SI"),
  page(`${SHOP}/jobs/[jobId]/production`,     "/shops/{shop}/jobs/{otherJobId}/production",     "404 404 404 403 SI 404 SI"),
  page(`${SHOP}/jobs/[jobId]/proofs/new`,     "/shops/{shop}/jobs/{otherJobId}/proofs/new",     "404 404 403 403 SI 404 SI"),
  page(`${SHOP}/proofs/[proofId]`,            "/shops/{shop}/proofs/{otherProofId}",            "404 404 404 403 SI 404 SI"),
  page(`${SHOP}/clients/[clientId]`,          "/shops/{shop}/clients/{otherClientId}",          "404 404 403 403 SI 404 SI"),
  page(`${SHOP}/blanks/[blankId]`,            "/shops/{shop}/blanks/{otherBlankId}",            "404 404 404 403 SI 404 SI"),

  // The other owner in their own shop, with our ids: 404, never our data.
  page(`${SHOP}`,                             "/shops/{otherShop}",                             "404 404 404 404 SI 200 SI"),
  page(`${SHOP}/jobs/[jobId]`,                "/shops/{otherShop}/jobs/{jobId}",                "404 404 404 404 SI 404 SI"),
  page(`${SHOP}/jobs/[jobId]/edit`,           "/shops/{otherShop}/jobs/{jobId}/edit",           "404 404 404 404 SI 404 SI"),
  page(`${SHOP}/jobs/[jobId]/production`,     "/shops/{otherShop}/jobs/{jobId}/production",     "404 404 404 404 SI 404 SI"),
  page(`${SHOP}/jobs/[jobId]/proofs/new`,     "/shops/{otherShop}/jobs/{jobId}/proofs/new",     "404 404 404 404 SI 404 SI"),
  page(`${SHOP}/proofs/[proofId]`,            "/shops/{otherShop}/proofs/{proofId}",            "404 404 404 404 SI 404 SI"),
  page(`${SHOP}/clients/[clientId]`,          "/shops/{otherShop}/clients/{clientId}",          "404 404 404 404 SI 404 SI"),
  page(`${SHOP}/blanks/[blankId]`,            "/shops/{otherShop}/blanks/{blankId}",            "404 404 404 404 SI 404 SI"),
];

// prettier-ignore
export const ROUTE_ROWS: RouteRow[] = [
  //    method  route                                       path                                                     owner designer production client link other anon
  route("GET",  "/api/artworks/[id]/[variant]",             "/api/artworks/{artworkId}/preview",                     "200 200 200 200 401 404 401"),
  route("GET",  "/api/artworks/[id]/[variant]",             "/api/artworks/{artworkId}/svg",                         "200 200 200 200 401 404 401"),
  route("GET",  "/api/artworks/[id]/[variant]",             "/api/artworks/{secondClientArtworkId}/thumbnail",       "200 200 200 404 401 404 401"),
  route("GET",  "/api/artworks/[id]/[variant]",             "/api/artworks/{otherArtworkId}/preview",                "404 404 404 404 401 200 401"),
  route("GET",  "/api/auth/[...nextauth]",                  "/api/auth/session",                                     "200 200 200 200 200 200 200", { open: true, note: "each caller reads only their own session" }),
  route("GET",  "/api/auth/[...nextauth]",                  "/api/auth/csrf",                                        "200 200 200 200 200 200 200", { open: true }),
  route("POST", "/api/auth/[...nextauth]",                  "/api/auth/session",                                     "400 400 400 400 400 400 400", { open: true, body: {}, note: "no CSRF token, no change (sign-in itself goes through the callback in every run)" }),
  route("GET",  "/api/exports/[id]",                        "/api/exports/{exportId}",                               "200 200 200 403 401 404 401"),
  route("GET",  "/api/exports/[id]/file",                   "/api/exports/{exportId}/file",                          "200 200 200 403 401 404 401"),
  route("GET",  "/api/exports/[id]/file",                   "/api/exports/{exportId}/file?n=2",                      "200 200 200 403 401 404 401"),
  route("GET",  "/api/exports/[id]/file",                   "/api/exports/{exportId}/file?n=3",                      "404 404 404 403 401 404 401"),
  route("GET",  "/api/exports/[id]/file",                   "/api/exports/{exportId}/file?n=0",                      "400 400 400 403 401 404 401"),
  route("GET",  "/api/exports/[id]/file",                   "/api/exports/{otherExportId}/file?n=2",                 "404 404 404 404 401 200 401"),
  route("GET",  "/api/exports/[id]",                        "/api/exports/{otherExportId}",                          "404 404 404 404 401 200 401"),
  route("GET",  "/api/exports/[id]/file",                   "/api/exports/{otherExportId}/file",                     "404 404 404 404 401 200 401"),
  route("GET",  "/api/health",                              "/api/health",                                           "200 200 200 200 200 200 200", { open: true }),
  route("GET",  "/api/me/calibration",                      "/api/me/calibration?device={device}",                   "200 200 200 200 401 200 401", { note: "each person's own calibration" }),
  route("PUT",  "/api/me/calibration",                      "/api/me/calibration",                                   "200 200 200 200 401 200 401", { body: { deviceKey: "{device}", deviceLabel: "Matrix screen", pxPerInch: 96 } }),
  route("GET",  "/api/proofs/[id]",                         "/api/proofs/{proofId}",                                 "200 200 200 404 401 404 401", { note: "the working copy is the shop's; clients read sent revisions through the review routes" }),
  route("GET",  "/api/proofs/[id]",                         "/api/proofs/{otherProofId}",                            "404 404 404 404 401 200 401"),
  route("GET",  `${SHOP}/jobs/size-runs`,                   "/shops/{shop}/jobs/size-runs",                          "200 200 200 403 401 404 401", { note: "the job list's size runs as CSV; production sees sizes, no money" }),
  route("GET",  `${SHOP}/jobs/size-runs`,                   "/shops/{shop}/jobs/size-runs?q=tee&status=drafting",    "200 200 200 403 401 404 401"),
  route("POST", "/api/quotes/[quoteId]/accept",             "/api/quotes/{quoteId}/accept",                          "404 404 404 200 200 404 401", { body: ACCEPT, linkInBody: "linkToken", note: "the quote is already accepted, so an allowed caller gets { already: true }; members manage quotes from the job page" }),
  route("POST", "/api/quotes/[quoteId]/accept",             "/api/quotes/{quoteId}/accept",                          "404 404 404 200 403 404 401", { body: ACCEPT, linkInBody: "viewToken", note: "a view link may read the quote, not accept it" }),
  route("POST", "/api/quotes/[quoteId]/accept",             "/api/quotes/{siblingQuoteId}/accept",                   "404 404 404 200 404 404 401", { body: ACCEPT, linkInBody: "linkToken", note: "the link reaches only its own proof's job" }),
  route("POST", "/api/quotes/[quoteId]/accept",             "/api/quotes/{otherQuoteId}/accept",                     "404 404 404 404 404 404 401", { body: ACCEPT, linkInBody: "linkToken" }),
  route("POST", "/api/quotes/[quoteId]/checkout",           "/api/quotes/{quoteId}/checkout",                        "404 404 404 200 200 404 401", { body: { kind: "deposit" }, linkInBody: "linkToken" }),
  route("POST", "/api/quotes/[quoteId]/checkout",           "/api/quotes/{siblingQuoteId}/checkout",                 "404 404 404 200 404 404 401", { body: { kind: "deposit" }, linkInBody: "linkToken" }),
  route("GET",  "/api/review-page/[token]",                "/api/review-page/{linkToken}",                          "404 404 404 404 404 404 404", { note: "reached only through the proxy's rewrite of /r/<token>, with this process's key; asked directly it is not there" }),
  route("GET",  "/api/review/[kind]/[key]/art/[artworkId]", "/api/review/link/{linkToken}/art/{artworkId}",          "200 200 200 200 200 200 200", { open: true }),
  route("GET",  "/api/review/[kind]/[key]/art/[artworkId]", "/api/review/link/{linkToken}/art/{secondClientArtworkId}", "404 404 404 404 404 404 404", { note: "art that is not on the link's proof" }),
  route("GET",  "/api/review/[kind]/[key]/art/[artworkId]", "/api/review/link/{linkToken}/art/{otherArtworkId}",     "404 404 404 404 404 404 404"),
  route("GET",  "/api/review/[kind]/[key]/art/[artworkId]", "/api/review/proof/{proofId}/art/{artworkId}",           "200 200 200 200 401 404 401"),
  route("GET",  "/api/review/[kind]/[key]/art/[artworkId]", "/api/review/proof/{otherProofId}/art/{otherArtworkId}", "404 404 404 404 401 200 401"),
  route("GET",  "/api/review/[kind]/[key]/comments",        "/api/review/link/{linkToken}/comments",                 "200 200 200 200 200 200 200", { open: true }),
  route("GET",  "/api/review/[kind]/[key]/comments",        "/api/review/link/{revokedToken}/comments",              "410 410 410 410 410 410 410"),
  route("GET",  "/api/review/[kind]/[key]/comments",        "/api/review/link/{expiredToken}/comments",              "410 410 410 410 410 410 410"),
  route("GET",  "/api/review/[kind]/[key]/comments",        "/api/review/link/matrix-no-such-link-0000000000/comments", "404 404 404 404 404 404 404"),
  route("GET",  "/api/review/[kind]/[key]/comments",        "/api/review/proof/{proofId}/comments",                  "200 200 200 200 401 404 401"),
  route("GET",  "/api/review/[kind]/[key]/comments",        "/api/review/proof/{unsentProofId}/comments",            "200 200 200 404 401 404 401", { note: "clients see only sent revisions" }),
  route("GET",  "/api/review/[kind]/[key]/comments",        "/api/review/proof/{otherProofId}/comments",             "404 404 404 404 401 200 401"),
  route("POST", "/api/review/[kind]/[key]/comments",        "/api/review/link/{linkToken}/comments",                 "201 201 201 201 201 201 201", { open: true, body: NOTE }),
  route("POST", "/api/review/[kind]/[key]/comments",        "/api/review/link/{viewToken}/comments",                 "403 403 403 403 403 403 403", { body: NOTE }),
  route("POST", "/api/review/[kind]/[key]/comments",        "/api/review/proof/{proofId}/comments",                  "201 201 403 201 401 404 401", { body: NOTE }),
  route("PATCH", "/api/review/[kind]/[key]/comments",       "/api/review/link/{linkToken}/comments",                 "403 403 403 403 403 403 403", { body: { commentId: "{commentId}", resolved: true }, note: "only the shop team resolves notes" }),
  route("PATCH", "/api/review/[kind]/[key]/comments",       "/api/review/proof/{proofId}/comments",                  "200 200 403 403 401 404 401", { body: { commentId: "{commentId}", resolved: true } }),
  route("POST", "/api/review/[kind]/[key]/decision",        "/api/review/link/{linkToken}/decision",                 "201 201 201 201 201 201 201", { open: true, body: CHANGES }),
  route("POST", "/api/review/[kind]/[key]/decision",        "/api/review/link/{viewToken}/decision",                 "403 403 403 403 403 403 403", { body: CHANGES }),
  route("POST", "/api/review/[kind]/[key]/decision",        "/api/review/proof/{proofId}/decision",                  "403 403 403 201 401 404 401", { body: CHANGES, note: "the shop never decides for its client" }),
  route("POST", "/api/stripe/webhook",                      "/api/stripe/webhook",                                   "400 400 400 400 400 400 400", { open: true, body: {}, note: "no session involved: only a valid signature is heard" }),
  route("GET",  "/api/uploadthing",                         "/api/uploadthing",                                      "200 200 200 200 200 200 200", { open: true, note: "the upload SDK's route description" }),
  route("POST", "/api/uploadthing",                         "/api/uploadthing?actionType=upload&slug=artwork",       "200 200 403 403 401 404 401", { headers: UPLOAD_HEADERS, body: { input: { shopSlug: "{shop}", clientId: null }, files: UPLOAD_FILES } }),
  route("POST", "/api/uploadthing",                         "/api/uploadthing?actionType=upload&slug=artwork",       "404 404 404 404 401 200 401", { headers: UPLOAD_HEADERS, body: { input: { shopSlug: "{otherShop}", clientId: null }, files: UPLOAD_FILES } }),
];

const A = {
  signUp: "app/(auth)/sign-up/actions.ts",
  invite: "app/invite/[token]/actions.ts",
  art: "app/shops/[shop]/art/actions.ts",
  blanks: "app/shops/[shop]/blanks/actions.ts",
  clients: "app/shops/[shop]/clients/actions.ts",
  jobs: "app/shops/[shop]/jobs/actions.ts",
  production: "app/shops/[shop]/jobs/[jobId]/production/actions.ts",
  makeProof: "app/shops/[shop]/jobs/[jobId]/proofs/actions.ts",
  prices: "app/shops/[shop]/prices/actions.ts",
  proof: "app/shops/[shop]/proofs/[proofId]/actions.ts",
  share: "app/shops/[shop]/proofs/[proofId]/share-actions.ts",
  settings: "app/shops/[shop]/settings/actions.ts",
};

/**
 * Row ids say what the input is: "ours" is our shop and our records; "their-slug" is the other
 * shop's slug with our record ids; "their-ids" is our slug with the other shop's record ids.
 */
// prettier-ignore
export const ACTION_ROWS: ActionRow[] = [
  //     id                             file          export                       owner designer production client link other anon
  action("sign-up",                     A.signUp,     "signUpAction",              "ok ok ok ok ok ok ok", { open: true, note: "anyone may start a shop" }),
  action("accept-invitation",           A.invite,     "acceptInvitationAction",    "ok ok ok ok ok ok ok", { open: true, note: "the token is the credential; each actor gets a fresh one" }),
  action("accept-invitation/taken",     A.invite,     "acceptInvitationAction",    "403 403 403 403 401 403 401", { note: "an account already has the invited address: only that account, signed in, may accept" }),
  action("replace-art/ours",            A.art,        "replaceArtworkAction",      "ok ok 403 403 401 404 401"),
  action("replace-art/their-slug",      A.art,        "replaceArtworkAction",      "404 404 404 404 401 404 401"),
  action("replace-art/their-ids",       A.art,        "replaceArtworkAction",      "404 404 403 403 401 404 401"),
  action("duplicate-blank/ours",        A.blanks,     "duplicateBlankAction",      "ok ok 403 403 401 404 401"),
  action("duplicate-blank/their-slug",  A.blanks,     "duplicateBlankAction",      "404 404 404 404 401 404 401"),
  action("duplicate-blank/their-ids",   A.blanks,     "duplicateBlankAction",      "404 404 403 403 401 404 401"),
  action("update-blank/ours",           A.blanks,     "updateBlankAction",         "ok ok 403 403 401 404 401"),
  action("update-blank/their-slug",     A.blanks,     "updateBlankAction",         "404 404 404 404 401 404 401"),
  action("update-blank/their-ids",      A.blanks,     "updateBlankAction",         "404 404 403 403 401 404 401"),
  action("create-client/ours",          A.clients,    "createClientAction",        "ok ok 403 403 401 404 401"),
  action("update-client/ours",          A.clients,    "updateClientAction",        "ok ok 403 403 401 404 401"),
  action("update-client/their-slug",    A.clients,    "updateClientAction",        "404 404 404 404 401 404 401"),
  action("update-client/their-ids",     A.clients,    "updateClientAction",        "404 404 403 403 401 404 401"),
  action("archive-client/ours",         A.clients,    "setClientArchivedAction",   "ok ok 403 403 401 404 401"),
  action("archive-client/their-slug",   A.clients,    "setClientArchivedAction",   "404 404 404 404 401 404 401"),
  action("archive-client/their-ids",    A.clients,    "setClientArchivedAction",   "404 404 403 403 401 404 401"),
  action("create-job/ours",             A.jobs,       "saveJobAction",             "ok ok 403 403 401 404 401"),
  action("update-job/ours",             A.jobs,       "saveJobAction",             "ok ok 403 403 401 404 401"),
  action("update-job/their-slug",       A.jobs,       "saveJobAction",             "404 404 404 404 401 404 401"),
  action("update-job/their-ids",        A.jobs,       "saveJobAction",             "404 404 403 403 401 404 401"),
  action("job-to-press/ours",           A.jobs,       "setJobStatusAction",        "ok ok ok 403 401 404 401", { note: "production moves jobs between the press steps" }),
  action("job-to-drafting/ours",        A.jobs,       "setJobStatusAction",        "ok ok 403 403 401 404 401", { note: "and no further" }),
  action("job-to-press/their-slug",     A.jobs,       "setJobStatusAction",        "404 404 404 404 401 404 401"),
  action("job-to-press/their-ids",      A.jobs,       "setJobStatusAction",        "404 404 404 403 401 404 401"),
  action("send-quote/ours",             A.jobs,       "sendQuoteAction",           "ok ok 403 403 401 404 401", { note: "production never prices" }),
  action("send-quote/their-slug",       A.jobs,       "sendQuoteAction",           "404 404 404 404 401 404 401"),
  action("send-quote/their-ids",        A.jobs,       "sendQuoteAction",           "404 404 403 403 401 404 401"),
  action("save-size-run/ours",          A.production, "saveSizeRunAction",         "ok ok 403 403 401 404 401"),
  action("save-size-run/their-slug",    A.production, "saveSizeRunAction",         "404 404 404 404 401 404 401"),
  action("save-size-run/their-ids",     A.production, "saveSizeRunAction",         "404 404 403 403 401 404 401"),
  action("save-grading/ours",           A.production, "saveGradingAction",         "ok ok ok 403 401 404 401"),
  action("save-grading/their-slug",     A.production, "saveGradingAction",         "404 404 404 404 401 404 401"),
  action("save-grading/their-ids",      A.production, "saveGradingAction",         "404 404 404 403 401 404 401"),
  action("request-export/ours",         A.production, "requestExportAction",       "ok ok ok 403 401 404 401"),
  action("request-export/their-slug",   A.production, "requestExportAction",       "404 404 404 404 401 404 401"),
  action("request-export/their-ids",    A.production, "requestExportAction",       "404 404 404 403 401 404 401"),
  action("retry-export/ours",           A.production, "retryExportAction",         "ok ok ok 403 401 404 401"),
  action("retry-export/their-slug",     A.production, "retryExportAction",         "404 404 404 404 401 404 401"),
  action("retry-export/their-ids",      A.production, "retryExportAction",         "404 404 404 403 401 404 401"),
  action("save-prices/ours",            A.prices,     "savePricesAction",          "ok 403 403 403 401 404 401"),
  action("create-proof/ours",           A.makeProof,  "createProofAction",         "ok ok 403 403 401 404 401", { note: "production and clients never make proofs" }),
  action("create-proof/their-slug",     A.makeProof,  "createProofAction",         "404 404 404 404 401 404 401"),
  action("create-proof/their-ids",      A.makeProof,  "createProofAction",         "404 404 403 403 401 404 401"),
  action("duplicate-proof/ours",        A.makeProof,  "duplicateProofAction",      "ok ok 403 403 401 404 401"),
  action("duplicate-proof/their-slug",  A.makeProof,  "duplicateProofAction",      "404 404 404 404 401 404 401"),
  action("duplicate-proof/their-ids",   A.makeProof,  "duplicateProofAction",      "404 404 403 403 401 404 401"),
  action("archive-proof/ours",          A.makeProof,  "archiveProofAction",        "ok ok 403 403 401 404 401", { note: "a draft proof; an approved one is refused with 409" }),
  action("archive-proof/their-slug",    A.makeProof,  "archiveProofAction",        "404 404 404 404 401 404 401"),
  action("archive-proof/their-ids",     A.makeProof,  "archiveProofAction",        "404 404 403 403 401 404 401"),
  action("save-proof/ours",             A.proof,      "saveProofAction",           "ok ok 403 403 401 404 401"),
  action("save-proof/their-slug",       A.proof,      "saveProofAction",           "404 404 404 404 401 404 401"),
  action("save-proof/their-ids",        A.proof,      "saveProofAction",           "404 404 403 403 401 404 401"),
  action("share-proof/ours",            A.share,      "shareProofAction",          "ok ok 403 403 401 404 401"),
  action("share-proof/their-slug",      A.share,      "shareProofAction",          "404 404 404 404 401 404 401"),
  action("share-proof/their-ids",       A.share,      "shareProofAction",          "404 404 403 403 401 404 401"),
  action("list-share-links/ours",       A.share,      "listShareLinksAction",      "ok ok ok 403 401 404 401"),
  action("list-share-links/their-slug", A.share,      "listShareLinksAction",      "404 404 404 404 401 404 401"),
  action("list-share-links/their-ids",  A.share,      "listShareLinksAction",      "404 404 404 403 401 404 401"),
  action("revoke-share-link/ours",      A.share,      "revokeShareLinkAction",     "ok ok 403 403 401 404 401"),
  action("revoke-share-link/their-slug", A.share,     "revokeShareLinkAction",     "404 404 404 404 401 404 401"),
  action("revoke-share-link/their-ids", A.share,      "revokeShareLinkAction",     "404 404 403 403 401 404 401"),
  action("invite-member/ours",          A.settings,   "inviteMemberAction",        "ok 403 403 403 401 404 401"),
  action("save-shop-clock/ours",        A.settings,   "saveShopClockAction",       "ok 403 403 403 401 404 401"),
  action("change-member-role/ours",     A.settings,   "changeMemberRoleAction",    "ok 403 403 403 401 404 401", { note: "a member the fixtures added to our shop, never a demo member" }),
  action("change-member-role/their-slug", A.settings, "changeMemberRoleAction",    "404 404 404 404 401 404 401"),
  action("change-member-role/their-ids", A.settings,  "changeMemberRoleAction",    "404 403 403 403 401 404 401"),
  action("remove-member/ours",          A.settings,   "removeMemberAction",        "ok 403 403 403 401 404 401", { note: "a member the fixtures added to our shop, never a demo member" }),
  action("remove-member/their-slug",    A.settings,   "removeMemberAction",        "404 404 404 404 401 404 401"),
  action("remove-member/their-ids",     A.settings,   "removeMemberAction",        "404 403 403 403 401 404 401"),
  action("withdraw-invitation/ours",    A.settings,   "withdrawInvitationAction",  "ok 403 403 403 401 404 401"),
  action("withdraw-invitation/their-slug", A.settings, "withdrawInvitationAction", "404 404 404 404 401 404 401"),
  action("withdraw-invitation/their-ids", A.settings, "withdrawInvitationAction",  "404 403 403 403 401 404 401"),
];

export const MATRIX: MatrixRow[] = [...PAGE_ROWS, ...ROUTE_ROWS, ...ACTION_ROWS];

/** "{name}" placeholders in a path, body or redirect. */
export function placeholdersIn(value: unknown): string[] {
  const text = typeof value === "string" ? value : JSON.stringify(value ?? null);
  return [...text.matchAll(/\{([A-Za-z]+)\}/g)].map((m) => m[1]!);
}

/** Fills "{name}" placeholders in strings, deeply. Unknown names throw. */
export function fill<T>(value: T, ids: Record<string, string>): T {
  if (typeof value === "string") {
    return value.replace(/\{([A-Za-z]+)\}/g, (_, name: string) => {
      const v = ids[name];
      if (v === undefined) throw new Error(`no value for {${name}}`);
      return v;
    }) as T;
  }
  if (Array.isArray(value)) return value.map((v) => fill(v, ids)) as T;
  if (value && typeof value === "object") return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, fill(v, ids)])) as T;
  return value;
}

/** How a row reads in test names and failure messages. */
export function rowLabel(row: MatrixRow): string {
  if (row.kind === "page") return `page ${row.path}`;
  if (row.kind === "route") return `${row.method} ${row.path}${row.linkInBody && row.linkInBody !== "linkToken" ? ` (link: ${row.linkInBody})` : ""}`;
  return `action ${row.name} [${row.id}]`;
}

export function outcomeLabel(outcome: HttpOutcome | ActionOutcome): string {
  if (outcome === "sign-in") return "SI";
  if (typeof outcome === "object") return `→${outcome.redirect}`;
  return String(outcome);
}
