/** The statement a client ticks to approve a revision (our own wording). */
export const APPROVAL_STATEMENT = "I checked the size, placement, colours and spelling on this revision and approve it for production.";

export const PERMISSION_LABELS = {
  view: "Look only",
  comment: "Look and leave notes",
  approve: "Notes and approval",
} as const;

export type SharePermission = keyof typeof PERMISSION_LABELS;
