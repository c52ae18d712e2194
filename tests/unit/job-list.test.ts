import { describe, expect, it } from "vitest";
import { containsPattern, DEFAULT_JOB_LIST, jobListSearch, pageCount, readJobListParams, readPage } from "@/lib/job-list";

const UUID = "0b9f8c1e-3a52-4e4b-9d6e-2f1c7a8b9c0d";

describe("the job list's question in the address", () => {
  it("reads nothing as the defaults and writes the defaults as nothing", () => {
    expect(readJobListParams({})).toEqual(DEFAULT_JOB_LIST);
    expect(jobListSearch(DEFAULT_JOB_LIST)).toBe("");
  });

  it("reads back what it writes", () => {
    const query = { q: "league tees", status: "on-press", clientId: UUID, dueFrom: "2027-01-01", dueTo: "2027-02-28", sort: "client", dir: "desc", page: 3, pageSize: 50 } as const;
    const search = jobListSearch(query);
    expect(readJobListParams(Object.fromEntries(new URLSearchParams(search)))).toEqual(query);
    expect(jobListSearch(query, "board").startsWith("?view=board&")).toBe(true);
  });

  it.each([
    ["an unknown status", { status: "lost" }, { status: null }],
    ["a client that is no id", { client: "'; drop table jobs" }, { clientId: null }],
    ["a date that is no date", { from: "2027-02-31x", to: "soon" }, { dueFrom: null, dueTo: null }],
    // Gregorian calendar: February has 28 days, 29 in a leap year (2028 is one, 2027 is not); no month has a day 0 or a 13th month.
    ["a day the calendar does not have", { from: "2027-02-30", to: "2027-02-29" }, { dueFrom: null, dueTo: null }],
    ["a month the calendar does not have", { from: "2027-13-01", to: "2027-00-10" }, { dueFrom: null, dueTo: null }],
    ["an unknown order", { sort: "price", dir: "sideways" }, { sort: "due", dir: "asc" }],
    ["a page below one", { page: "0" }, { page: 1 }],
    ["a page that is no number", { page: "two" }, { page: 1 }],
    ["a page size not offered", { size: "5000" }, { pageSize: 25 }],
    ["a blank search", { q: "   " }, { q: null }],
    ["a search with control characters", { q: "tee\u0000s" }, { q: "tee s" }],
    ["a repeated parameter (the first counts)", { status: ["packed", "drafting"] }, { status: "packed" }],
  ])("falls back on %s", (_what, params, expected) => {
    expect(readJobListParams(params)).toEqual({ ...DEFAULT_JOB_LIST, ...expected });
  });

  it("cuts a long search to 100 characters", () => {
    expect(readJobListParams({ q: "x".repeat(500) }).q).toHaveLength(100);
  });
});

describe("paging helpers", () => {
  it.each([
    [0, 25, 1],
    [25, 25, 1],
    [26, 25, 2],
    [20_000, 25, 800],
  ])("%i rows at %i a page make %i pages", (total, size, pages) => {
    expect(pageCount(total, size)).toBe(pages);
  });

  it("matches pattern characters as themselves", () => {
    expect(containsPattern("50%_off\\")).toBe("%50\\%\\_off\\\\%");
  });

  it.each([
    [undefined, 1],
    ["4", 4],
    [["2", "9"], 2],
    ["-1", 1],
    ["1.5", 1],
  ])("reads the portal page %j as %i", (value, page) => {
    expect(readPage(value as string | string[] | undefined)).toBe(page);
  });
});

describe("due dates in the address", () => {
  it("keeps a leap day in a leap year and the last day of each month", () => {
    // Gregorian calendar: 2028 is a leap year; April has 30 days, December 31.
    expect(readJobListParams({ from: "2028-02-29", to: "2027-04-30" })).toMatchObject({ dueFrom: "2028-02-29", dueTo: "2027-04-30" });
    expect(readJobListParams({ from: "2027-12-31" })).toMatchObject({ dueFrom: "2027-12-31" });
  });
});
