/**
 * A copy of the demo scenario of a test file's own: the same clients, jobs, art and proofs, built
 * by the seed's own code into a new shop with its own people (tagged e-mails, the demo password).
 * The test changes its copy freely; the seeded demo is never touched. `drop()` removes the copy.
 */
import { randomBytes } from "node:crypto";
import { inArray, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { DEMO_PASSWORD } from "@/db/demo";
import { buildDemoShop, type DemoEmails } from "@/db/seed";
import { shops, users } from "@/db/schema";

export type DemoCopy = { tag: string; id: string; slug: string; emails: DemoEmails; password: string; drop: () => Promise<void> };

export async function demoCopy(label: string): Promise<DemoCopy> {
  const tag = randomBytes(3).toString("hex");
  const emails: DemoEmails = {
    owner: `owner-${tag}@${label}.copy.test`,
    designer: `designer-${tag}@${label}.copy.test`,
    production: `press-${tag}@${label}.copy.test`,
    client: `client-${tag}@${label}.copy.test`,
  };
  const made = await buildDemoShop({ shopName: `Quarry Street ${label} ${tag}`, emails, password: DEMO_PASSWORD });
  console.log(`[demo copy] ${label}: shop ${made.slug}, tag ${tag}`);
  return {
    tag,
    id: made.id,
    slug: made.slug,
    emails,
    password: DEMO_PASSWORD,
    drop: async () => {
      await db.delete(shops).where(eq(shops.id, made.id));
      await db.delete(users).where(inArray(users.id, Object.values(made.userIds)));
    },
  };
}
