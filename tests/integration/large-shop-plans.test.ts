/**
 * The job list, board, search and a client's portal on a shop of 20,000 jobs, 60,000 proofs and
 * 200,000 notes: every statement their queries send is caught on its way to PostgreSQL and
 * explained, and no plan may read a large table from end to end (a Seq Scan). The statements are
 * the product's own (the query functions the pages call), not copies.
 */
import type { Pool, QueryConfig } from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getPool } from "@/db/client";
import { LARGE_SHOP_SIZE, seedLargeShop, type LargeShop } from "@/db/large-shop";
import { listClientNames } from "@/db/queries/clients";
import { countJobsByStatus, listBoardColumns, listJobPage, listJobsForClients } from "@/db/queries/jobs";
import { listSharedProofsForClients } from "@/db/queries/review";
import { BOARD_COLUMN_SIZE, DEFAULT_JOB_LIST, JOB_SORTS, PORTAL_PAGE_SIZE, type JobListQuery } from "@/lib/job-list";
import { shopFactory } from "../support/factory";
import { noteOnFailure } from "../support/failure-notes";

/** Tables that grow with a shop's work; a plan must reach their rows through an index. */
const LARGE_TABLES = ["jobs", "job_sizes", "proofs", "proof_revisions", "proof_comments"];

type Caught = { what: string; text: string; values: unknown[] };
type PlanNode = { "Node Type": string; "Relation Name"?: string; Plans?: PlanNode[] };

const shops = shopFactory("large-shop-plans");
let large: LargeShop;
let pool: Pool;

beforeAll(async () => {
  large = await seedLargeShop(LARGE_SHOP_SIZE, { tag: shops.tag });
  shops.adopt({ shopIds: [large.shop.id], userIds: large.userIds });
  pool = getPool();
}, 180_000);

noteOnFailure("large shop", () => (large ? `${large.shop.slug}, ${large.counts.jobs} jobs` : "not made"));

afterAll(() => shops.cleanup(), 180_000);

/** Runs `fn` and returns every statement it sent through the pool, with its parameters. */
async function catchStatements(what: string, fn: () => Promise<unknown>): Promise<Caught[]> {
  const caught: Caught[] = [];
  const original = pool.query;
  pool.query = function (this: Pool, config: string | QueryConfig, values?: unknown) {
    const text = typeof config === "string" ? config : config.text;
    const params = (typeof config === "string" ? values : (config.values ?? values)) as unknown[] | undefined;
    caught.push({ what, text, values: params ?? [] });
    return (original as (...a: unknown[]) => unknown).call(this, config, values);
  } as typeof pool.query;
  try {
    await fn();
  } finally {
    pool.query = original;
  }
  return caught;
}

function seqScans(node: PlanNode, out: string[] = []): string[] {
  if (node["Node Type"] === "Seq Scan" && node["Relation Name"] && LARGE_TABLES.includes(node["Relation Name"])) out.push(node["Relation Name"]);
  for (const child of node.Plans ?? []) seqScans(child, out);
  return out;
}

async function explain(statement: Caught): Promise<{ scans: string[]; plan: PlanNode }> {
  const result = await pool.query<{ "QUERY PLAN": Array<{ Plan: PlanNode }> }>(`explain (format json) ${statement.text}`, statement.values);
  const plan = result.rows[0]!["QUERY PLAN"][0]!.Plan;
  return { scans: seqScans(plan), plan };
}

/** Every statement `fn` sends, explained; names each that reads a large table by Seq Scan. */
async function expectIndexed(what: string, fn: () => Promise<unknown>): Promise<number> {
  const statements = await catchStatements(what, fn);
  expect(statements.length, `${what} sent no statement`).toBeGreaterThan(0);
  const refused: string[] = [];
  for (const s of statements) {
    const { scans } = await explain(s);
    if (scans.length) refused.push(`${what}: Seq Scan on ${scans.join(", ")} in\n  ${s.text}`);
  }
  expect(refused, refused.join("\n\n")).toEqual([]);
  return statements.length;
}

const list = (changes: Partial<JobListQuery>): JobListQuery => ({ ...DEFAULT_JOB_LIST, ...changes });

describe("a large shop's pages read through indexes", () => {
  it("was seeded at full size", () => {
    expect(large.counts).toMatchObject({ jobs: LARGE_SHOP_SIZE.jobs, proofs: LARGE_SHOP_SIZE.proofs, notes: LARGE_SHOP_SIZE.notes });
  });

  it.each(JOB_SORTS.flatMap((sort) => (["asc", "desc"] as const).map((dir) => [sort, dir] as const)))("the job list sorted by %s %s, first and a later page", async (sort, dir) => {
    const statusCounts = await countJobsByStatus({ shopId: large.shop.id });
    for (const page of [1, 7]) await expectIndexed(`job list by ${sort} ${dir}, page ${page}`, () => listJobPage({ shopId: large.shop.id, query: list({ sort, dir, page }), statusCounts }));
  });

  it("the job list filtered by status, client and due dates, at each page size", async () => {
    const shopId = large.shop.id;
    const statusCounts = await countJobsByStatus({ shopId });
    await expectIndexed("job list, status (total from the counts)", () => listJobPage({ shopId, query: list({ status: "on-press" }), statusCounts }));
    await expectIndexed("job list, status (counted)", () => listJobPage({ shopId, query: list({ status: "on-press" }) }));
    await expectIndexed("job list, client", () => listJobPage({ shopId, query: list({ clientId: large.contact.clientId }) }));
    await expectIndexed("job list, due from and by", () => listJobPage({ shopId, query: list({ dueFrom: "2027-01-01", dueTo: "2027-01-31" }) }));
    await expectIndexed("job list, status and client", () => listJobPage({ shopId, query: list({ status: "packed", clientId: large.contact.clientId, sort: "updated", dir: "desc" }) }));
    for (const pageSize of [10, 50]) await expectIndexed(`job list, ${pageSize} a page`, () => listJobPage({ shopId, query: list({ pageSize }), statusCounts }));
    await expectIndexed("job list, client filter's names", () => listClientNames({ shopId }));
    await expectIndexed("job counts by status", () => countJobsByStatus({ shopId }));
  });

  it("search by a job's number, a title word, a client's name and a garment", async () => {
    const shopId = large.shop.id;
    for (const q of ["12345", "choir", large.contact.clientName, "Pullover"]) {
      await expectIndexed(`search "${q}"`, () => listJobPage({ shopId, query: list({ q }) }));
      await expectIndexed(`search "${q}", newest first`, () => listJobPage({ shopId, query: list({ q, sort: "updated", dir: "desc" }) }));
    }
  });

  it("the board", async () => {
    const shopId = large.shop.id;
    await expectIndexed("board columns", () => listBoardColumns({ shopId, perColumn: BOARD_COLUMN_SIZE }));
    await expectIndexed("board counts", () => countJobsByStatus({ shopId }));
  });

  it("a client's portal, first and second page, with the page's shared proofs", async () => {
    const clientIds = [large.contact.clientId];
    for (const page of [1, 2]) {
      const { rows } = await listJobsForClients({ clientIds, page, pageSize: PORTAL_PAGE_SIZE });
      expect(rows.length).toBeGreaterThan(0);
      await expectIndexed(`portal page ${page}`, () => listJobsForClients({ clientIds, page, pageSize: PORTAL_PAGE_SIZE }));
      await expectIndexed(`portal page ${page}, shared proofs`, () => listSharedProofsForClients({ clientIds, jobIds: rows.map((r) => r.id) }));
    }
  });

  it("names a Seq Scan when a statement reads a large table whole", async () => {
    // The check itself: a statement with no usable index is caught and named.
    const statements = await catchStatements("a whole-table read", () => pool.query("select count(*) from proof_comments where body like '%crest%'"));
    const { scans } = await explain(statements[0]!);
    expect(scans).toEqual(["proof_comments"]);
  });
});
