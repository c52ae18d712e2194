/**
 * Demo scenario, seeded only into an empty database, built through the product's own code: the
 * same query functions and server helpers the sign-up, invitation, client, job, upload, proof and
 * editor actions call. So the demo never holds anything a new shop could not make. Everything in
 * it is invented: the shop, its people, its clients, their jobs and their art.
 *
 * Runs under the react-server condition (scripts/seed.ts starts it so), because the queries are
 * server-only modules.
 */
import bcrypt from "bcryptjs";
import { count } from "drizzle-orm";
import { storeArtwork } from "@/app/_server/artwork/ingest";
import { makeProof } from "@/app/_server/proof-make";
import { saveProofWithAccess } from "@/app/_server/proof-save";
import { DEMO_ART } from "@/lib/demo-art";
import type { SizeRunEntry } from "@/lib/pricing";
import { db } from "./client";
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_SHOP } from "./demo";
import { ensureLibraryBlanks, libraryBlankId } from "./library";
import { createClient } from "./queries/clients";
import { createJob, setJobStatus, type JobInput } from "./queries/jobs";
import { getProofDocument } from "./queries/proofs";
import { findShopBySlug } from "./queries/access";
import { listJobSizes, saveJobSizes } from "./queries/production";
import { acceptInvitation, createInvitation, createShopWithOwner, saveShopClock } from "./queries/shops";
import { createUser, findUserByEmail, markEmailVerified } from "./queries/users";
import * as schema from "./schema";

export { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_SHOP };

export async function isEmpty(): Promise<boolean> {
  const [row] = await db.select({ n: count() }).from(schema.shops);
  return (row?.n ?? 0) === 0;
}

const run = (sizes: Array<[string, number]>): SizeRunEntry[] => sizes.map(([size, quantity]) => ({ size, quantity }));

/** How the demo's makers left each print in the editor: width (height follows the art) and distance from the collar or top edge. */
type Tuned = { widthIn: number; belowCollarIn: number };

export async function seedDemo(): Promise<{ seeded: boolean }> {
  await ensureLibraryBlanks(db);
  if (!(await isEmpty())) return { seeded: false };
  const shop = await buildDemoShop({ shopName: DEMO_SHOP.name, emails: Object.fromEntries(DEMO_ACCOUNTS.map((a) => [a.role, a.email])) as DemoEmails, password: DEMO_PASSWORD });
  if (shop.slug !== DEMO_SHOP.slug) throw new Error(`The demo shop's slug came out as ${shop.slug}, not ${DEMO_SHOP.slug}.`);
  return { seeded: true };
}

export type DemoEmails = Record<(typeof DEMO_ACCOUNTS)[number]["role"], string>;

/**
 * The demo scenario as a new shop would build it: its shop name, its people's e-mails and their
 * password are the caller's, so a test can build its own copy of the demo and change it freely.
 * Returns the shop and the people's ids. The library blanks must be in place (seedDemo puts them there).
 */
export async function buildDemoShop(opts: { shopName: string; emails: DemoEmails; password: string }): Promise<{ id: string; slug: string; userIds: Record<keyof DemoEmails, string> }> {
  const passwordHash = await bcrypt.hash(opts.password, 10);
  const account = (role: keyof DemoEmails) => ({ ...DEMO_ACCOUNTS.find((a) => a.role === role)!, email: opts.emails[role] });

  // Sign-up: the owner makes the shop, then proves the e-mail address.
  const owner = account("owner");
  const made = await createShopWithOwner({ shopName: opts.shopName, name: owner.name, email: owner.email, passwordHash });
  const shop = (await findShopBySlug({ slug: made.shopSlug }))!;
  const ownerId = made.userId;
  await markEmailVerified({ userId: ownerId });

  // The team joins by invitation.
  const ids: Record<string, string> = { owner: ownerId };
  for (const role of ["designer", "production"] as const) {
    const person = account(role);
    const { token } = await createInvitation({ shopId: shop.id, email: person.email, role, invitedBy: ownerId });
    const joined = await acceptInvitation({ token, name: person.name, passwordHash });
    if (!joined.ok) throw new Error(`The demo ${role} could not join: ${joined.message}`);
    ids[role] = (await findUserByEmail({ email: person.email }))!.id;
  }
  // The club's contact has an account of her own (her first sign-in made it); the club's contact list links to it.
  const clientPerson = account("client");
  const clientUser = await createUser({ email: clientPerson.email, name: clientPerson.name, passwordHash });
  await markEmailVerified({ userId: clientUser.id });

  const designerId = ids.designer!;
  const client = (name: string, notes: string, contacts: Array<{ name: string; email: string }>) =>
    createClient({ shopId: shop.id, actorUserId: ownerId, input: { name, notes, taxExempt: false, contacts: contacts.map((c) => ({ ...c, phone: null })) } });
  const soccer = await client("Eastfield Youth Soccer Club", "Spring season kit. Youth and adult coach sizes.", [
    { name: clientPerson.name, email: clientPerson.email },
    { name: "Jonah Brandt", email: "jonah.brandt@eastfield-soccer.test" },
  ]);
  const bakery = await client("Larkspur Lane Bakery", "Staff tees and tote bags for the market stall.", [{ name: "Wren Adeyemi", email: "wren@larkspur-bakery.test" }]);
  const robotics = await client("Northgate Robotics Club", "Competition hoodies, names on the back.", [{ name: "Ilse Moreau", email: "coach@northgate-robotics.test" }]);

  const job = (actorUserId: string, input: Omit<JobInput, "rush" | "notes" | "dtfAreaIn2"> & { dtfAreaIn2?: number }) =>
    createJob({ shopId: shop.id, actorUserId, input: { rush: false, notes: null, dtfAreaIn2: null, ...input } });
  const tees = await job(designerId, {
    title: "Spring season team tees",
    clientId: soccer.id,
    dueDate: "2027-03-12",
    method: "screen-print",
    blankId: libraryBlankId("everyday-crew-tee"),
    garmentColour: "Deep Harbor",
    printLocations: [{ location: "full-front", colours: 2 }],
    sizeRun: run([["XS", 2], ["S", 6], ["M", 10], ["L", 8], ["XL", 5], ["2XL", 3], ["3XL", 2], ["4XL", 1]]),
  });
  const totes = await job(ownerId, {
    title: "Market stall totes",
    clientId: bakery.id,
    dueDate: "2027-02-20",
    method: "dtf",
    blankId: libraryBlankId("market-canvas-tote"),
    garmentColour: "Raw Canvas",
    printLocations: [{ location: "tote-front", colours: 1 }],
    dtfAreaIn2: 33.3,
    sizeRun: run([["One size", 40]]),
  });
  const hoodies = await job(ownerId, {
    title: "Competition hoodies",
    clientId: robotics.id,
    dueDate: "2027-01-30",
    method: "dtf",
    blankId: libraryBlankId("campfire-pullover-hoodie"),
    garmentColour: "Carbon",
    printLocations: [{ location: "full-front", colours: 1 }],
    dtfAreaIn2: 108,
    sizeRun: run([["S", 3], ["M", 6], ["L", 6], ["XL", 4], ["2XL", 2]]),
  });

  // The art comes in as an upload does: analysed, ink measured and trimmed, previews made.
  const clientOf: Record<string, string> = { "eastfield-emblem": soccer.id, "larkspur-wordmark": bakery.id, "northgate-badge": robotics.id };
  const artId: Record<string, string> = {};
  for (const art of DEMO_ART) {
    const stored = await storeArtwork({ bytes: Buffer.from(art.svg), name: `${art.name}.svg`, declaredType: "image/svg+xml", shopId: shop.id, userId: designerId, clientId: clientOf[art.key] ?? null, fileKey: null, fileUrl: null });
    if (!stored.ok) throw new Error(`The demo art ${art.name} was refused: ${stored.message}`);
    artId[art.key] = stored.artworkId;
  }

  // Proofs are made from the jobs, then sized in the editor as the makers left them.
  const designerAccess = { shop: { id: shop.id, slug: shop.slug, name: shop.name, clock: { locale: shop.locale, timeZone: shop.timeZone } }, role: "designer" as const, actor: { id: designerId, email: account("designer").email, name: account("designer").name, memberships: [], contacts: [] } };
  const proof = async (jobId: string, name: string, art: string, location: string, tuned: Tuned) => {
    const outcome = await makeProof({ shopId: shop.id, userId: designerId, jobId, name, blankId: null, colourName: null, art: [{ location, artworkId: artId[art]! }] });
    if (!outcome.ok) throw new Error(`The demo proof ${name} could not be made: ${outcome.error}`);
    const document = (await getProofDocument({ shopId: shop.id, proofId: outcome.proofId }))!;
    const placements = document.placements.map((p) => ({ ...p, widthIn: tuned.widthIn, heightIn: (tuned.widthIn * p.heightIn) / p.widthIn, belowCollarIn: tuned.belowCollarIn }));
    const saved = await saveProofWithAccess(designerAccess, { proofId: outcome.proofId, baseVersion: document.proof.version, doc: { size: document.proof.size, colourName: document.proof.colourName, colourHex: document.proof.colourHex, placements } });
    if (!saved.ok) throw new Error(`The demo proof ${name} could not be saved: ${saved.message}`);
  };
  await proof(tees.id, "Team tee", "eastfield-emblem", "full-front", { widthIn: 10, belowCollarIn: 3 });
  await proof(totes.id, "Market tote", "larkspur-wordmark", "tote-front", { widthIn: 10, belowCollarIn: 5 });
  await proof(hoodies.id, "Team hoodie", "northgate-badge", "full-front", { widthIn: 9, belowCollarIn: 3 });

  // The shop keeps Central time, and orders 5 % spare transfers on its DTF jobs.
  await saveShopClock({ shopId: shop.id, locale: "en-US", timeZone: "America/Chicago" });
  for (const dtf of [totes, hoodies]) await saveJobSizes({ jobId: dtf.id, sizes: (await listJobSizes({ jobId: dtf.id })).map((s) => ({ size: s.size, quantity: s.quantity })), sparePercent: 5 });

  // The bakery's totes are with the client, as the owner marked them on the board.
  await setJobStatus({ shopId: shop.id, jobId: totes.id, status: "with-client", actorUserId: ownerId });
  return { id: shop.id, slug: shop.slug, userIds: { owner: ownerId, designer: designerId, production: ids.production!, client: clientUser.id } };
}
