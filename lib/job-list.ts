/**
 * What a page of the job list asks for: filters, order and page, read from the address and written
 * back to it. The server pages the list; the address holds the whole question, so a page can be
 * linked, reloaded and opened without script.
 */
import { z } from "zod";
import { JOB_STATUSES, type JobStatus } from "./jobs";

/** The orders the list can page by (each has an index, see db/schema/jobs.ts). */
export const JOB_SORTS = ["due", "title", "client", "status", "method", "updated"] as const;
export type JobSort = (typeof JOB_SORTS)[number];
export type SortDir = "asc" | "desc";

export const JOB_PAGE_SIZES = [10, 25, 50] as const;
export const DEFAULT_JOB_PAGE_SIZE = 25;
/** The newest this many jobs of each status show on the board; the rest are a link away. */
export const BOARD_COLUMN_SIZE = 20;
/** Jobs per page in a client's portal. */
export const PORTAL_PAGE_SIZE = 25;
/** Search text longer than this is cut (nobody types a job title that long). */
export const MAX_SEARCH_LENGTH = 100;

export type JobListFilter = {
  q: string | null;
  status: JobStatus | null;
  clientId: string | null;
  dueFrom: string | null;
  dueTo: string | null;
};

export type JobListQuery = JobListFilter & { sort: JobSort; dir: SortDir; page: number; pageSize: number };

export const DEFAULT_JOB_LIST: JobListQuery = { q: null, status: null, clientId: null, dueFrom: null, dueTo: null, sort: "due", dir: "asc", page: 1, pageSize: DEFAULT_JOB_PAGE_SIZE };

/** A calendar day as YYYY-MM-DD that exists (no 30 February: PostgreSQL refuses those). */
function isCalendarDay(s: string): boolean {
  const [y, m, d] = s.split("-").map(Number) as [number, number, number];
  // Day 0 of the next month is the last day of this one (Gregorian calendar, as Date.UTC counts).
  return y >= 1 && m >= 1 && m <= 12 && d >= 1 && d <= new Date(Date.UTC(y, m, 0)).getUTCDate();
}
const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/).refine(isCalendarDay);
const one = (v: unknown) => (Array.isArray(v) ? v[0] : v);
const text = z.preprocess(one, z.string().optional()).catch(undefined);

const schema = z.object({
  q: text.transform((s) => {
    const t = s?.replace(/[\u0000-\u001f]/g, " ").trim().slice(0, MAX_SEARCH_LENGTH);
    return t && t.isWellFormed() ? t : null;
  }),
  status: z.preprocess(one, z.enum(JOB_STATUSES).nullable().default(null)).catch(null),
  client: z.preprocess(one, z.string().uuid().nullable().default(null)).catch(null),
  from: z.preprocess(one, isoDate.nullable().default(null)).catch(null),
  to: z.preprocess(one, isoDate.nullable().default(null)).catch(null),
  sort: z.preprocess(one, z.enum(JOB_SORTS).default(DEFAULT_JOB_LIST.sort)).catch(DEFAULT_JOB_LIST.sort),
  dir: z.preprocess(one, z.enum(["asc", "desc"]).default(DEFAULT_JOB_LIST.dir)).catch(DEFAULT_JOB_LIST.dir),
  page: z.preprocess(one, z.coerce.number().int().min(1).max(1_000_000).default(1)).catch(1),
  size: z.preprocess(one, z.coerce.number().int().default(DEFAULT_JOB_PAGE_SIZE)).catch(DEFAULT_JOB_PAGE_SIZE),
});

/** The list's question from the address's search parameters. Anything unreadable falls back to its default; nothing throws. */
export function readJobListParams(params: Record<string, string | string[] | undefined>): JobListQuery {
  const p = schema.parse(params ?? {});
  return {
    q: p.q,
    status: p.status,
    clientId: p.client,
    dueFrom: p.from,
    dueTo: p.to,
    sort: p.sort,
    dir: p.dir,
    page: p.page,
    pageSize: (JOB_PAGE_SIZES as readonly number[]).includes(p.size) ? p.size : DEFAULT_JOB_PAGE_SIZE,
  };
}

/** The search parameters for a question, leaving out what is the default (`view` is the page's, kept as given). */
export function jobListSearch(query: Partial<JobListQuery>, view?: "board"): string {
  const q = { ...DEFAULT_JOB_LIST, ...query };
  const out = new URLSearchParams();
  if (view) out.set("view", view);
  if (q.q) out.set("q", q.q);
  if (q.status) out.set("status", q.status);
  if (q.clientId) out.set("client", q.clientId);
  if (q.dueFrom) out.set("from", q.dueFrom);
  if (q.dueTo) out.set("to", q.dueTo);
  if (q.sort !== DEFAULT_JOB_LIST.sort || q.dir !== DEFAULT_JOB_LIST.dir) {
    out.set("sort", q.sort);
    out.set("dir", q.dir);
  }
  if (q.pageSize !== DEFAULT_JOB_LIST.pageSize) out.set("size", String(q.pageSize));
  if (q.page > 1) out.set("page", String(q.page));
  const s = out.toString();
  return s ? `?${s}` : "";
}

/** How many pages `total` rows make, at least one. */
export function pageCount(total: number, pageSize: number): number {
  return Math.max(1, Math.ceil(total / pageSize));
}

/** `%text%` for ILIKE, with the pattern characters in the text matched as themselves. */
export function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** A single page number from the address (the portal's `?page=`), 1 when unreadable. */
export function readPage(value: string | string[] | undefined): number {
  const n = Number(one(value));
  return Number.isInteger(n) && n >= 1 && n <= 1_000_000 ? n : 1;
}
