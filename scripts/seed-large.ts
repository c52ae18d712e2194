/**
 * `npm run db:seed-large`: adds one shop with 20,000 jobs, 60,000 proofs and 200,000 proof notes
 * (db/large-shop.ts) to the database in DATABASE_URL, and prints how to sign in to it.
 * `--jobs=`, `--proofs=`, `--notes=` and `--clients=` change the counts.
 */
import { LARGE_SHOP_SIZE, seedLargeShop } from "../db/large-shop";

if (!process.env.DATABASE_URL) {
  console.error("DATABASE_URL is not set: point it at the database to add the large shop to (`npm start` prints it).");
  process.exit(1);
}
const arg = (name: string, fallback: number) => {
  const raw = process.argv.find((a) => a.startsWith(`--${name}=`))?.slice(name.length + 3);
  const n = raw === undefined ? fallback : Number(raw);
  if (!Number.isInteger(n) || n < 1) throw new Error(`--${name} must be a whole number above 0 (got "${raw}")`);
  return n;
};
const made = await seedLargeShop(
  { jobs: arg("jobs", LARGE_SHOP_SIZE.jobs), proofs: arg("proofs", LARGE_SHOP_SIZE.proofs), notes: arg("notes", LARGE_SHOP_SIZE.notes), clients: arg("clients", LARGE_SHOP_SIZE.clients) },
  { log: (line) => console.error(`[seed-large] ${line}`) },
);
console.log(
  `Large shop /shops/${made.shop.slug}: ${made.counts.jobs} jobs, ${made.counts.proofs} proofs (${made.counts.revisions} sent), ${made.counts.notes} notes, ${made.counts.clients} clients in ${(made.ms / 1000).toFixed(1)} s.\n` +
    `Owner ${made.owner.email}, client contact ${made.contact.email} (${made.contact.clientName}); password ${made.password}`,
);
process.exit(0);
