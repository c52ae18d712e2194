/** Our own names for where a job stands, in order. */
export const JOB_STATUSES = ["drafting", "with-client", "cleared", "on-press", "packed", "collected"] as const;
export const DECORATION_METHODS = ["screen-print", "dtf", "dtg", "htv", "sublimation"] as const;

/** Labels for job states and decoration methods. The state names are our own. */
export const JOB_STATUS_LABELS = {
  drafting: "Drafting",
  "with-client": "With client",
  cleared: "Cleared to print",
  "on-press": "On press",
  packed: "Packed",
  collected: "Collected",
} as const;

export type JobStatus = keyof typeof JOB_STATUS_LABELS;

export const DECORATION_LABELS = {
  "screen-print": "Screen print",
  dtf: "DTF",
  dtg: "DTG",
  htv: "HTV",
  sublimation: "Sublimation",
} as const;

export type DecorationMethod = keyof typeof DECORATION_LABELS;
