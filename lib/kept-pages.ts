/**
 * Review pages kept per state (app/_server/review-page-cache.ts): the secrets and the rules that
 * proxy.ts and the route that serves kept pages share. The app's own server (scripts/serve.ts)
 * makes the secrets at start; without them (a bare `next start`) every view renders as before.
 *
 * A kept page is rendered once with a stand-in nonce that never leaves the server, and each answer
 * puts that request's fresh nonce in its place: the Content Security Policy stays per response.
 */
export const RENDER_HEADER = "x-chalkline-render";
export const KEPT_HEADER = "x-chalkline-kept";
/** Says whether an answer came from a kept page or was rendered for it (tests and the bench read it). */
export const KEPT_STATE_HEADER = "x-review-page";

export type KeptPageKeys = { render: string; standIn: string; selfUrl: string };

export function keptPageKeys(env: Record<string, string | undefined>): KeptPageKeys | null {
  const render = env.CHALKLINE_RENDER_KEY;
  const standIn = env.CHALKLINE_NONCE_STAND_IN;
  const selfUrl = env.CHALKLINE_SELF_URL;
  if (env.CHALKLINE_KEEP_REVIEW_PAGES === "off" || !render || !standIn || !selfUrl) return null;
  return { render, standIn, selfUrl };
}

/** The token of a plain review-link visit that a kept page can answer, else null (queries, other paths). */
export function keptReviewToken(method: string, pathname: string, search: string): string | null {
  if (method !== "GET" || search !== "") return null;
  const m = /^\/r\/([A-Za-z0-9_-]{20,100})$/.exec(pathname);
  return m ? m[1]! : null;
}
