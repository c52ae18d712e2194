import { drizzle } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import * as schema from "../db/schema";
import { seedDemo } from "../db/seed";

export async function runSeed(url: string): Promise<{ seeded: boolean }> {
  const pool = new Pool({ connectionString: url, max: 2 });
  try {
    return await seedDemo(drizzle(pool, { schema }));
  } finally {
    await pool.end();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error("DATABASE_URL is not set. Run `npm start`, which seeds the demo database itself.");
    process.exit(1);
  }
  const result = await runSeed(url);
  console.log(result.seeded ? "Demo data seeded." : "Database already has data; demo seed skipped.");
}
