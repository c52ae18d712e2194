/**
 * What the demo seed made, row by row, so `npm test` can tell whether a test changed it. Taken
 * right after seeding, when every row in the database is the seed's: the demo shop, its team and
 * their accounts, the client's account, clients and contacts, jobs and their size runs, art,
 * proofs, placements, the activity log, and the library blanks every shop shares. Rows added later
 * (by tests, in the demo shop or elsewhere) are not the seed's and are never compared.
 */
import { Client } from "pg";

type Row = Record<string, unknown>;
type TableRows = { key: string[]; rows: Map<string, Row> };
export type SeededRows = { tables: Map<string, TableRows>; count: number };

/**
 * Tables the database derives from others by trigger, never written by a test: a test's own job in
 * the demo shop moves the demo shop's count in `shop_job_counts` without touching a seeded job.
 */
const DERIVED_TABLES = new Set(["shop_job_counts"]);

/** Public tables with their primary key columns (none for a table without one), derived tables left out. */
async function tablesOf(client: Client): Promise<Array<{ table: string; key: string[] }>> {
  const result = await client.query<{ table: string; key: string[] | null }>(`
    select c.relname as table,
           (select array_agg(a.attname::text order by array_position(i.indkey::int2[], a.attnum))
              from pg_index i join pg_attribute a on a.attrelid = i.indrelid and a.attnum = any(i.indkey)
             where i.indrelid = c.oid and i.indisprimary) as key
      from pg_class c join pg_namespace n on n.oid = c.relnamespace
     where n.nspname = 'public' and c.relkind = 'r'
     order by c.relname`);
  return result.rows.filter((r) => !DERIVED_TABLES.has(r.table)).map((r) => ({ table: r.table, key: r.key ?? [] }));
}

const ident = (name: string) => `"${name.replace(/"/g, '""')}"`;

/** A row's identity as text: its primary key, or (without one) its whole content. */
function keyExpression(key: string[]): string {
  return key.length ? `row(${key.map((k) => `t.${ident(k)}`).join(", ")})::text` : "md5(to_jsonb(t)::text)";
}

async function withClient<T>(url: string, work: (client: Client) => Promise<T>): Promise<T> {
  const client = new Client({ connectionString: url });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

export async function recordSeededRows(url: string): Promise<SeededRows> {
  return withClient(url, async (client) => {
    const tables = new Map<string, TableRows>();
    let count = 0;
    for (const { table, key } of await tablesOf(client)) {
      const result = await client.query<{ key: string; row: Row }>(`select ${keyExpression(key)} as key, to_jsonb(t) as row from ${ident(table)} t`);
      if (!result.rows.length) continue;
      tables.set(table, { key, rows: new Map(result.rows.map((r) => [r.key, r.row])) });
      count += result.rows.length;
    }
    return { tables, count };
  });
}

/** A few words that say which row this is: its name, title, e-mail or the like. */
function labelOf(table: string, key: string[], row: Row): string {
  const ids = key.length ? key.map((k) => `${k} ${String(row[k])}`).join(", ") : "a row without a key";
  const named = ["name", "title", "email", "slug", "letter", "location", "size", "action"].find((k) => typeof row[k] === "string" && row[k]);
  return `${table} (${ids})${named ? ` "${String(row[named]).slice(0, 60)}"` : ""}`;
}

/**
 * Every seeded row that is no longer as it was: one line per row, naming the table, the row and
 * what happened to it (deleted, or which columns changed).
 */
export async function changedSeededRows(url: string, seeded: SeededRows): Promise<string[]> {
  return withClient(url, async (client) => {
    const lines: string[] = [];
    for (const [table, { key, rows }] of seeded.tables) {
      const result = await client.query<{ key: string; row: Row }>(`select ${keyExpression(key)} as key, to_jsonb(t) as row from ${ident(table)} t where ${keyExpression(key)} = any($1::text[])`, [[...rows.keys()]]);
      const now = new Map(result.rows.map((r) => [r.key, r.row]));
      for (const [id, before] of rows) {
        const after = now.get(id);
        if (!after) {
          lines.push(`${labelOf(table, key, before)}: deleted`);
          continue;
        }
        const columns = [...new Set([...Object.keys(before), ...Object.keys(after)])].filter((c) => JSON.stringify(before[c]) !== JSON.stringify(after[c]));
        if (columns.length) lines.push(`${labelOf(table, key, before)}: changed ${columns.join(", ")}`);
      }
    }
    return lines;
  });
}
