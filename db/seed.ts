/**
 * Demo scenario, seeded only into an empty database. Everything here is invented:
 * the shop, its people, its clients and their jobs.
 */
import bcrypt from "bcryptjs";
import { count } from "drizzle-orm";
import type { NodePgDatabase } from "drizzle-orm/node-postgres";
import { DEMO_ART } from "@/lib/demo-art";
import { ensureLibraryBlanks, libraryBlankId } from "./library";
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
  await ensureLibraryBlanks(db);
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

    const [teesJob, totesJob, hoodiesJob] = await tx
      .insert(schema.jobs)
      .values([
        { shopId, clientId: soccer!.id, title: "Spring season team tees", status: "drafting", method: "screen-print", dueDate: "2027-03-12", createdBy: userIds["designer@chalkline.test"], blankId: libraryBlankId("everyday-crew-tee"), garmentColour: "Deep Harbor", printLocations: [{ location: "full-front", colours: 2 }] },
        { shopId, clientId: bakery!.id, title: "Market stall totes", status: "with-client", method: "dtf", dueDate: "2027-02-20", createdBy: userIds["owner@chalkline.test"], blankId: libraryBlankId("market-canvas-tote"), garmentColour: "Raw Canvas", printLocations: [{ location: "tote-front", colours: 1 }], dtfAreaIn2: 33.3 },
        { shopId, clientId: robotics!.id, title: "Competition hoodies", status: "drafting", method: "dtf", dueDate: "2027-01-30", createdBy: userIds["owner@chalkline.test"], blankId: libraryBlankId("campfire-pullover-hoodie"), garmentColour: "Carbon", printLocations: [{ location: "full-front", colours: 1 }], dtfAreaIn2: 108 },
      ])
      .returning({ id: schema.jobs.id });

    const clientOf: Record<string, string> = { "eastfield-emblem": soccer!.id, "larkspur-wordmark": bakery!.id, "northgate-badge": robotics!.id };
    const art = await tx
      .insert(schema.artworks)
      .values(DEMO_ART.map((a) => ({ shopId, clientId: clientOf[a.key] ?? null, name: a.name, kind: "generated" as const, svg: a.svg, inkWidthPx: a.widthPx, inkHeightPx: a.heightPx, isVector: true, shape: a.shape, mime: "image/svg+xml" })))
      .returning({ id: schema.artworks.id, name: schema.artworks.name });
    const artId = (name: string) => art.find((a) => a.name === name)!.id;

    const [teeProof, toteProof, hoodieProof] = await tx
      .insert(schema.proofs)
      .values([
        { shopId, jobId: teesJob!.id, name: "Team tee", blankId: libraryBlankId("everyday-crew-tee"), colourName: "Deep Harbor", colourHex: "#243247", size: "M", updatedBy: userIds["designer@chalkline.test"] },
        { shopId, jobId: totesJob!.id, name: "Market tote", blankId: libraryBlankId("market-canvas-tote"), colourName: "Raw Canvas", colourHex: "#E8DDC7", size: "One size", updatedBy: userIds["owner@chalkline.test"] },
        { shopId, jobId: hoodiesJob!.id, name: "Team hoodie", blankId: libraryBlankId("campfire-pullover-hoodie"), colourName: "Carbon", colourHex: "#1F2023", size: "L", updatedBy: userIds["owner@chalkline.test"] },
      ])
      .returning({ id: schema.proofs.id });

    const run = (jobId: string, sizes: Array<[string, number]>) => sizes.map(([size, quantity], i) => ({ jobId, size, quantity, sortOrder: i }));
    await tx.insert(schema.jobSizes).values([
      ...run(teesJob!.id, [["XS", 2], ["S", 6], ["M", 10], ["L", 8], ["XL", 5], ["2XL", 3], ["3XL", 2], ["4XL", 1]]),
      ...run(hoodiesJob!.id, [["S", 3], ["M", 6], ["L", 6], ["XL", 4], ["2XL", 2]]),
      ...run(totesJob!.id, [["One size", 40]]),
    ]);

    await tx.insert(schema.placements).values([
      { id: "demo-tee-front", proofId: teeProof!.id, location: "full-front", artworkId: artId("Eastfield club emblem"), widthIn: 10, heightIn: 10, offsetFromCenterIn: 0, belowCollarIn: 3, rotationDeg: 0, sortOrder: 0 },
      { id: "demo-tote-front", proofId: toteProof!.id, location: "tote-front", artworkId: artId("Larkspur Lane wordmark"), widthIn: 10, heightIn: 10 / 3, offsetFromCenterIn: 0, belowCollarIn: 5, rotationDeg: 0, sortOrder: 0 },
      { id: "demo-hoodie-front", proofId: hoodieProof!.id, location: "full-front", artworkId: artId("Northgate robotics badge"), widthIn: 9, heightIn: 12, offsetFromCenterIn: 0, belowCollarIn: 3, rotationDeg: 0, sortOrder: 0 },
    ]);

    await tx.insert(schema.auditLog).values({ shopId, actorUserId: userIds["owner@chalkline.test"], action: "shop.created", subjectType: "shop", subjectId: shopId });
  });
  return { seeded: true };
}
