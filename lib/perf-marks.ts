/**
 * Names of the User Timing marks (W3C User Timing) the pages set, read by `npm run bench`.
 * The browser's Largest Contentful Paint ignores a canvas, so the proof pages say themselves when
 * the garment and its art are on screen.
 */
export const PROOF_DRAWN_MARK = "chalkline:proof-drawn";
