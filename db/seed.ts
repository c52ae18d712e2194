/**
 * Demo scenario, seeded only into an empty database. Everything here is invented:
 * the shop, its people, its clients and their jobs.
 */
import bcrypt from "bcryptjs";
import { count } from "drizzle-orm";
import type { NodePgDatabase } from "drizzle-orm/node-postgres";
import * as schema from "./schema";

export const DEMO_PASSWORD = "chalkline-demo";

export const DEMO_ACCOUNTS = [
  { email: "owner@chalkline.test", name: "Maren Holt", role: "owner" },
  { email: "designer@chalkline.test", name: "Theo Okonkwo", role: "designer" },
  { email: "press@chalkline.test", name: "Sam Lindqvist", role: "production" },
  { email: "client@chalkline.test", name: "Priya Castell", role: "client" },
] as const;

export const DEMO_SHOP = { slug: "quarry-street", name: "Quarry Street Print Co." };

type Db = NodePgDatabase<typeof schema>;

export async function isEmpty(db: Db): Promise<boolean> {
  const [row] = await db.select({ n: count() }).from(schema.shops);
  return (row?.n ?? 0) === 0;
}

export async function seedDemo(db: Db): Promise<{ seeded: boolean }> {
  if (!(await isEmpty(db))) return { seeded: false };
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, 10);
  await db.transaction(async (tx) => {
    const userIds: Record<string, string> = {};
    for (const account of DEMO_ACCOUNTS) {
      const [user] = await tx
        .insert(schema.users)
        .values({ email: account.email, name: account.name, passwordHash, emailVerified: new Date() })
        .returning({ id: schema.users.id });
      userIds[account.email] = user!.id;
    }
    const [shop] = await tx.insert(schema.shops).values(DEMO_SHOP).returning({ id: schema.shops.id });
    const shopId = shop!.id;
    for (const account of DEMO_ACCOUNTS) {
      if (account.role === "client") continue;
      await tx.insert(schema.memberships).values({ shopId, userId: userIds[account.email]!, role: account.role });
    }

    const [soccer] = await tx
      .insert(schema.clients)
      .values({ shopId, name: "Eastfield Youth Soccer Club", notes: "Spring season kit. Youth and adult coach sizes." })
      .returning({ id: schema.clients.id });
    const [bakery] = await tx
      .insert(schema.clients)
      .values({ shopId, name: "Larkspur Lane Bakery", notes: "Staff tees and tote bags for the market stall." })
      .returning({ id: schema.clients.id });
    const [robotics] = await tx
      .insert(schema.clients)
      .values({ shopId, name: "Northgate Robotics Club", notes: "Competition hoodies, names on the back." })
      .returning({ id: schema.clients.id });

    await tx.insert(schema.clientContacts).values([
      { clientId: soccer!.id, name: "Priya Castell", email: "client@chalkline.test", userId: userIds["client@chalkline.test"] },
      { clientId: soccer!.id, name: "Jonah Brandt", email: "jonah.brandt@eastfield-soccer.test" },
      { clientId: bakery!.id, name: "Wren Adeyemi", email: "wren@larkspur-bakery.test" },
      { clientId: robotics!.id, name: "Ilse Moreau", email: "coach@northgate-robotics.test" },
    ]);

    await tx.insert(schema.jobs).values([
      { shopId, clientId: soccer!.id, title: "Spring season team tees", status: "drafting", method: "screen-print", dueDate: "2027-03-12", createdBy: userIds["designer@chalkline.test"] },
      { shopId, clientId: bakery!.id, title: "Market stall totes", status: "with-client", method: "dtf", dueDate: "2027-02-20", createdBy: userIds["owner@chalkline.test"] },
      { shopId, clientId: robotics!.id, title: "Competition hoodies", status: "cleared", method: "dtf", dueDate: "2027-01-30", createdBy: userIds["owner@chalkline.test"] },
    ]);

    await tx.insert(schema.auditLog).values({ shopId, actorUserId: userIds["owner@chalkline.test"], action: "shop.created", subjectType: "shop", subjectId: shopId });
  });
  return { seeded: true };
}
