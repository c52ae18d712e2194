import "server-only";
import { sql } from "drizzle-orm";
import { db } from "../client";

/**
 * Set-based inserts for a shop with many rows (scripts/seed-large.ts, the bench and the plan test).
 * Each is one `INSERT … SELECT generate_series` statement: rows are spread over what the shop
 * already has (its clients, its jobs, its proofs) by their position, so the result is the same
 * every time for the same counts. Every name written here is invented.
 */

const TITLE_FIRST = ["Harbour", "Meadow", "Lantern", "Copper", "Juniper", "Granite", "Willow", "Saltmarsh", "Ember", "Quarry", "Orchard", "Tidewater", "Fernhill", "Kestrel", "Bramble", "Cobalt"];
const TITLE_SECOND = ["league tees", "choir hoodies", "staff polos", "fun run singlets", "reunion tees", "market totes", "crew sweatshirts", "open day tees", "relay vests", "volunteer tees", "band hoodies", "club caps", "festival tees", "tournament jerseys"];
const COLOURS = ["Deep Harbor", "Chalk White", "Heather Grey", "Forest", "Brick", "Sunflower", "Midnight", "Sage"];
const NOTE_BODIES = [
  "Can the print sit a little higher on the chest?",
  "Colours look right on screen; please match the ink to the swatch we sent.",
  "Move the crest half an inch toward the centre.",
  "Is the back print the same width on the small sizes?",
  "Looks good to us, ready when you are.",
  "Please check the spelling of the sponsor line.",
  "Could we try the white ink version as well?",
  "The sleeve mark is a touch too large.",
];

const textArray = (values: readonly string[]) => sql.raw(`ARRAY[${values.map((v) => `'${v.replace(/'/g, "''")}'`).join(", ")}]::text[]`);

/**
 * `count` jobs for the shop, dealt round its clients in turn, through every status and method; titles
 * end in the job's number, due dates spread over a year (every 17th has none), one job changed every
 * few minutes back from now. Each job gets a size run of three sizes.
 */
export async function insertBulkJobs({ shopId, count, blankIds, createdBy }: { shopId: string; count: number; blankIds: string[]; createdBy: string }): Promise<number> {
  const result = await db.execute(sql`
    with c as (select id, (row_number() over (order by name, id)) - 1 as n from clients where shop_id = ${shopId}),
         nc as (select count(*)::int as n from c)
    insert into jobs (id, shop_id, client_id, title, status, method, due_date, blank_id, garment_colour, print_locations, rush, created_by, created_at, updated_at)
    select gen_random_uuid()::text, ${shopId}, c.id,
           (${textArray(TITLE_FIRST)})[1 + g % ${TITLE_FIRST.length}] || ' ' || (${textArray(TITLE_SECOND)})[1 + (g / ${TITLE_FIRST.length}) % ${TITLE_SECOND.length}] || ' ' || g,
           (enum_range(null::job_status))[1 + (g * 7) % 6],
           (enum_range(null::decoration_method))[1 + (g / 3) % 5],
           case when g % 17 = 0 then null else current_date + ((g * 37) % 400 - 60) end,
           (${sql.raw(`ARRAY[${blankIds.map((b) => `'${b.replace(/'/g, "''")}'`).join(", ")}]::text[]`)})[1 + g % ${blankIds.length}],
           (${textArray(COLOURS)})[1 + g % ${COLOURS.length}],
           '[{"location":"full-front","colours":2}]'::jsonb,
           g % 23 = 0,
           ${createdBy},
           now() - (g * interval '4 minutes') - interval '1 day',
           now() - (g * interval '3 minutes') - ((g % 11) * interval '1 second')
      from generate_series(1, ${count}) as g
      join nc on true
      join c on c.n = g % nc.n
  `);
  await db.execute(sql`
    insert into job_sizes (job_id, size, quantity, sort_order)
    select j.id, s.size, 4 + (abs(hashtext(j.id)) + s.i * 5) % 20, s.i
      from jobs j
      cross join (values ('S', 0), ('M', 1), ('L', 2)) as s(size, i)
     where j.shop_id = ${shopId}
     on conflict do nothing
  `);
  return result.rowCount ?? 0;
}

/** `count` proofs dealt round the shop's jobs ("Front 1", "Front 2"… per job), copying garment and colour from a proof the product made. */
export async function insertBulkProofs({ shopId, count, template }: { shopId: string; count: number; template: { blankId: string; colourName: string; colourHex: string; size: string } }): Promise<number> {
  const result = await db.execute(sql`
    with j as (select id, (row_number() over (order by updated_at desc, id)) - 1 as n from jobs where shop_id = ${shopId}),
         nj as (select count(*)::int as n from j)
    insert into proofs (id, shop_id, job_id, revision, name, blank_id, colour_name, colour_hex, size, created_at, updated_at)
    select gen_random_uuid()::text, ${shopId}, j.id, 'A', 'Mock-up ' || (1 + (g - 1) / nj.n), ${template.blankId}, ${template.colourName}, ${template.colourHex}, ${template.size},
           now() - (g * interval '2 minutes'), now() - (g * interval '1 minute')
      from generate_series(1, ${count}) as g
      join nj on true
      join j on j.n = (g - 1) % nj.n
     on conflict do nothing
  `);
  return result.rowCount ?? 0;
}

/**
 * Revision A sent, with a snapshot the product made, for the first proof of every job past drafting,
 * so the client's portal lists proofs to review.
 */
export async function insertBulkRevisions({ shopId, snapshot, sentBy }: { shopId: string; snapshot: unknown; sentBy: string }): Promise<number> {
  const result = await db.execute(sql`
    insert into proof_revisions (id, proof_id, letter, snapshot, state, sent_at, sent_by)
    select gen_random_uuid()::text, p.id, 'A', ${JSON.stringify(snapshot)}::jsonb, 'open', p.updated_at, ${sentBy}
      from proofs p
      join jobs j on j.id = p.job_id
     where p.shop_id = ${shopId} and p.name = 'Mock-up 1' and j.status <> 'drafting'
     on conflict do nothing
  `);
  return result.rowCount ?? 0;
}

/** `count` notes on the shop's proofs (dealt round them in turn), from the shop and the client by turns. */
export async function insertBulkNotes({ shopId, count }: { shopId: string; count: number }): Promise<number> {
  const result = await db.execute(sql`
    with p as (select id, (row_number() over (order by id)) - 1 as n from proofs where shop_id = ${shopId}),
         np as (select count(*)::int as n from p)
    insert into proof_comments (id, proof_id, revision_letter, side, x_in, y_in, body, author_name, author_role, created_at)
    select gen_random_uuid()::text, p.id, 'A', case when g % 3 = 0 then 'back' else 'front' end, ((g % 21) - 10) * 0.5, 2 + (g % 13),
           (${textArray(NOTE_BODIES)})[1 + g % ${NOTE_BODIES.length}],
           case when g % 2 = 0 then 'Rowan Tilly' else 'Imke Farrow' end,
           case when g % 2 = 0 then 'shop' else 'client' end,
           now() - (g * interval '20 seconds')
      from generate_series(1, ${count}) as g
      join np on true
      join p on p.n = (g - 1) % np.n
  `);
  return result.rowCount ?? 0;
}

/**
 * Fresh planner statistics and visibility maps for the tables a large shop fills, so plans read
 * the new rows as they are (and index-only scans can skip the heap). VACUUM runs outside a
 * transaction, statement by statement.
 */
export async function analyzeLargeTables(): Promise<void> {
  for (const table of ["clients", "jobs", "job_sizes", "proofs", "proof_revisions", "proof_comments"]) {
    await db.execute(sql.raw(`vacuum (analyze) ${table}`));
  }
}
