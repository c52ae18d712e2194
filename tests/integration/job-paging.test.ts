/**
 * The job list, board and portal page on the server: pages do not overlap and together hold every
 * job once, totals agree with the counts, search finds a job from a later page, and nothing of
 * another shop (or another client, in the portal) ever shows.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { seedLargeShop, type LargeShop } from "@/db/large-shop";
import { and, count, eq, inArray } from "drizzle-orm";
import { db } from "@/db/client";
import { countJobsByStatus, listBoardColumns, listJobPage, listJobsForClients, listJobSizeRuns, setJobStatus } from "@/db/queries/jobs";
import { jobs } from "@/db/schema";
import { listSharedProofsForClients } from "@/db/queries/review";
import { DEFAULT_JOB_LIST, JOB_SORTS, type JobListQuery } from "@/lib/job-list";
import { JOB_STATUSES } from "@/lib/jobs";
import { shopFactory, type BuiltShop } from "../support/factory";
import { noteOnFailure } from "../support/failure-notes";

const shops = shopFactory("job-paging");
const COUNTS = { jobs: 130, proofs: 260, notes: 400, clients: 9 };
let big: LargeShop;
let other: BuiltShop;

beforeAll(async () => {
  other = await shops.build({ clientAccount: true, sent: true });
  big = await seedLargeShop(COUNTS, { tag: shops.tag });
  shops.adopt({ shopIds: [big.shop.id], userIds: big.userIds });
}, 120_000);

noteOnFailure("paged shop", () => (big ? big.shop.slug : "not made"));

const list = (changes: Partial<JobListQuery>): JobListQuery => ({ ...DEFAULT_JOB_LIST, ...changes });

async function everyPage(query: Partial<JobListQuery>) {
  const pages = [];
  for (let page = 1; ; page += 1) {
    const got = await listJobPage({ shopId: big.shop.id, query: list({ ...query, page }) });
    if (got.rows.length === 0) return { pages, total: got.total };
    pages.push(got.rows);
  }
}

describe("the job list, paged on the server", () => {
  it.each(JOB_SORTS.flatMap((sort) => (["asc", "desc"] as const).map((dir) => [sort, dir] as const)))("by %s %s, the pages hold every job once", async (sort, dir) => {
    const { pages, total } = await everyPage({ sort, dir, pageSize: 25 });
    expect(total).toBe(COUNTS.jobs);
    expect(pages.map((p) => p.length)).toEqual([25, 25, 25, 25, 25, 5]);
    const ids = pages.flat().map((r) => r.id);
    expect(new Set(ids).size).toBe(COUNTS.jobs);
    expect(pages[1]!.map((r) => r.id)).not.toEqual(pages[0]!.map((r) => r.id));
  });

  it("keeps each order across pages", async () => {
    const byTitle = (await everyPage({ sort: "title", dir: "asc", pageSize: 50 })).pages.flat().map((r) => r.title);
    expect(byTitle).toEqual([...byTitle].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0)));
    const byClient = (await everyPage({ sort: "client", dir: "desc", pageSize: 10 })).pages.flat().map((r) => r.clientName);
    expect(byClient).toEqual([...byClient].sort((a, b) => (a < b ? 1 : a > b ? -1 : 0)));
    const byUpdated = (await everyPage({ sort: "updated", dir: "desc", pageSize: 10 })).pages.flat().map((r) => r.updatedAt.getTime());
    expect(byUpdated).toEqual([...byUpdated].sort((a, b) => b - a));
  });

  it("totals agree with the counts by status, with the counts given or counted", async () => {
    const counts = await countJobsByStatus({ shopId: big.shop.id });
    expect(JOB_STATUSES.reduce((n, s) => n + counts[s], 0)).toBe(COUNTS.jobs);
    for (const status of JOB_STATUSES) {
      const counted = await listJobPage({ shopId: big.shop.id, query: list({ status }) });
      const given = await listJobPage({ shopId: big.shop.id, query: list({ status }), statusCounts: counts });
      expect(counted.total).toBe(counts[status]);
      expect(given.total).toBe(counts[status]);
      expect(counted.rows.every((r) => r.status === status)).toBe(true);
    }
  });

  it("search finds a job that is on a later page, by its number, and a client's jobs by the client's name", async () => {
    const third = (await listJobPage({ shopId: big.shop.id, query: list({ page: 3, pageSize: 25 }) })).rows[4]!;
    const number = third.title.split(" ").pop()!;
    const found = await listJobPage({ shopId: big.shop.id, query: list({ q: number }) });
    expect(found.rows.map((r) => r.id)).toContain(third.id);
    expect(found.total).toBe(found.rows.length);
    expect(found.rows.every((r) => r.title.includes(number))).toBe(true);

    const byClient = await listJobPage({ shopId: big.shop.id, query: list({ q: big.contact.clientName.toUpperCase(), pageSize: 50 }) });
    const ofClient = await listJobPage({ shopId: big.shop.id, query: list({ clientId: big.contact.clientId, pageSize: 50 }) });
    expect(byClient.total).toBe(ofClient.total);
    expect(byClient.rows.map((r) => r.id).sort()).toEqual(ofClient.rows.map((r) => r.id).sort());

    const byGarment = await listJobPage({ shopId: big.shop.id, query: list({ q: "pullover", pageSize: 50 }) });
    expect(byGarment.total).toBeGreaterThan(0);
    expect(byGarment.rows.every((r) => /pullover/i.test(r.garmentName ?? ""))).toBe(true);

    // Pattern characters are matched as themselves.
    expect((await listJobPage({ shopId: big.shop.id, query: list({ q: "%" }) })).total).toBe(0);
    expect((await listJobPage({ shopId: big.shop.id, query: list({ q: "_" }) })).total).toBe(0);
  });

  it("search pages too, and the size-run export holds every job it finds", async () => {
    const q = "tees";
    const { pages, total } = await everyPage({ q, pageSize: 10, sort: "client" });
    expect(total).toBeGreaterThan(10);
    expect(new Set(pages.flat().map((r) => r.id)).size).toBe(total);
    const exported = await listJobSizeRuns({ shopId: big.shop.id, query: list({ q }) });
    expect(exported.length).toBe(total);
    expect(exported.every((r) => r.sizeRun.length > 0)).toBe(true);
  });

  it("never shows another shop's jobs, even when searched for by their title", async () => {
    const all = (await everyPage({ pageSize: 50 })).pages.flat();
    expect(all.some((r) => r.id === other.job.id)).toBe(false);
    expect((await listJobPage({ shopId: big.shop.id, query: list({ q: other.job.title }) })).total).toBe(0);
    expect((await listJobPage({ shopId: big.shop.id, query: list({ q: other.client.name }) })).total).toBe(0);
    expect((await listJobPage({ shopId: big.shop.id, query: list({ clientId: other.client.id }) })).total).toBe(0);
    const theirs = await listJobPage({ shopId: other.shop.id, query: list({}) });
    expect(theirs.rows.map((r) => r.id)).toEqual([other.job.id]);
  });

  it("sizes and money come with the page's rows", async () => {
    const { rows } = await listJobPage({ shopId: big.shop.id, query: list({ pageSize: 10 }) });
    expect(rows).toHaveLength(10);
    for (const r of rows) {
      expect(r.money).toBeDefined();
      expect(r.sizeRun.length).toBeGreaterThan(0);
    }
  });
});

describe("the board", () => {
  it("holds the newest few of each status, and only the shop's", async () => {
    const perColumn = 4;
    const rows = await listBoardColumns({ shopId: big.shop.id, perColumn });
    const counts = await countJobsByStatus({ shopId: big.shop.id });
    for (const status of JOB_STATUSES) {
      const column = rows.filter((r) => r.status === status);
      expect(column.length).toBe(Math.min(perColumn, counts[status]));
      const times = column.map((r) => r.updatedAt.getTime());
      expect(times).toEqual([...times].sort((a, b) => b - a));
      const newest = await listJobPage({ shopId: big.shop.id, query: list({ status, sort: "updated", dir: "desc", pageSize: 10 }) });
      expect(column.map((r) => r.id)).toEqual(newest.rows.slice(0, perColumn).map((r) => r.id));
    }
    expect(rows.some((r) => r.id === other.job.id)).toBe(false);
  });
});

describe("a client's portal", () => {
  it("pages the client's own jobs, with the shared proofs of that page's jobs only", async () => {
    const clientIds = [big.contact.clientId];
    const first = await listJobsForClients({ clientIds, page: 1, pageSize: 5 });
    const second = await listJobsForClients({ clientIds, page: 2, pageSize: 5 });
    const ofClient = await listJobPage({ shopId: big.shop.id, query: list({ clientId: big.contact.clientId }) });
    expect(first.total).toBe(ofClient.total);
    expect(first.rows).toHaveLength(5);
    expect(second.rows.length).toBeGreaterThan(0);
    expect(second.rows.map((r) => r.id).some((id) => first.rows.some((f) => f.id === id))).toBe(false);
    const ids = new Set(ofClient.rows.map((r) => r.id));
    expect([...first.rows, ...second.rows].every((r) => ids.has(r.id))).toBe(true);

    const shared = await listSharedProofsForClients({ clientIds, jobIds: first.rows.map((r) => r.id) });
    expect(shared.length).toBeGreaterThan(0);
    expect(shared.every((p) => first.rows.some((r) => r.id === p.jobId))).toBe(true);
    // Another client's job ids do not open its proofs.
    expect(await listSharedProofsForClients({ clientIds, jobIds: [other.job.id] })).toEqual([]);
    expect((await listJobsForClients({ clientIds: [other.client.id], page: 1, pageSize: 25 })).rows.map((r) => r.id)).toEqual([other.job.id]);
  });
});

describe("the counts per status the database keeps", () => {
  async function counted(shopId: string) {
    const rows = await db.select({ status: jobs.status, n: count() }).from(jobs).where(eq(jobs.shopId, shopId)).groupBy(jobs.status);
    return Object.fromEntries(JOB_STATUSES.map((s) => [s, rows.find((r) => r.status === s)?.n ?? 0]));
  }

  it("match a count of the jobs after a bulk insert, moves between statuses and deletions", async () => {
    // A shop of its own: this test moves and deletes jobs, which the paging tests must not see.
    const mine = await seedLargeShop({ jobs: 40, proofs: 40, notes: 40, clients: 3 }, { tag: `${shops.tag}c` });
    shops.adopt({ shopIds: [mine.shop.id], userIds: mine.userIds });
    const shopId = mine.shop.id;
    expect(await countJobsByStatus({ shopId })).toEqual(await counted(shopId));
    const [first, second] = (await listJobPage({ shopId, query: list({ page: 1 }) })).rows;
    const next = JOB_STATUSES.find((s) => s !== first!.status)!;
    await setJobStatus({ shopId, jobId: first!.id, status: next, actorUserId: mine.owner.id });
    expect(await countJobsByStatus({ shopId })).toEqual(await counted(shopId));
    await db.delete(jobs).where(and(eq(jobs.shopId, shopId), inArray(jobs.id, [second!.id])));
    expect(await countJobsByStatus({ shopId })).toEqual(await counted(shopId));
    // Another shop's counts never move with this one's.
    expect(await countJobsByStatus({ shopId: other.shop.id })).toEqual(await counted(other.shop.id));
  });
});
