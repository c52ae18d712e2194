/**
 * One shop with a great many jobs, proofs and notes, for measuring and for plan checks
 * (`npm run db:seed-large`, the bench's `--only=large`, tests/integration/large-shop-plans.test.ts).
 *
 * What is cheap goes through the product's own code, as the demo seed does: sign-up of the owner,
 * a client contact with an account of their own, the clients, one job with art and a proof sent
 * to the client. The bulk (jobs, their size runs, proofs, sent revisions and notes) is then written
 * by set-based SQL (db/queries/bulk.ts) copying what that first proof looks like, and the tables are
 * analysed. Every name is invented.
 *
 * Runs under the react-server condition, because the queries are server-only modules.
 */
import { randomBytes } from "node:crypto";
import { performance } from "node:perf_hooks";
import bcrypt from "bcryptjs";
import { storeArtwork } from "@/app/_server/artwork/ingest";
import { makeProof } from "@/app/_server/proof-make";
import { db } from "./client";
import { ensureLibraryBlanks, libraryBlankId } from "./library";
import { findShopBySlug } from "./queries/access";
import { analyzeLargeTables, insertBulkJobs, insertBulkNotes, insertBulkProofs, insertBulkRevisions } from "./queries/bulk";
import { createClient } from "./queries/clients";
import { blankUsableByShop, createJob } from "./queries/jobs";
import { getProofDocument } from "./queries/proofs";
import { sendRevision } from "./queries/review";
import { createShopWithOwner } from "./queries/shops";
import { createUser, markEmailVerified } from "./queries/users";

export type LargeShopCounts = { jobs: number; proofs: number; notes: number; clients?: number };

export type LargeShop = {
  shop: { id: string; slug: string; name: string };
  password: string;
  owner: { id: string; email: string };
  /** A client contact with an account: their portal lists the first client's jobs. */
  contact: { userId: string; email: string; clientId: string; clientName: string };
  userIds: string[];
  counts: { jobs: number; proofs: number; revisions: number; notes: number; clients: number };
  ms: number;
};

export const LARGE_SHOP_SIZE = { jobs: 20_000, proofs: 60_000, notes: 200_000, clients: 300 } as const;

const CLIENT_FIRST = ["Northfield", "Alder", "Riverside", "Marlow", "Cinder", "Heron", "Blackthorn", "Foxglove", "Larkspur", "Millbrook", "Sandpiper", "Thistle", "Wren", "Elmstead", "Pebble"];
const CLIENT_SECOND = ["Rowing Club", "Community Choir", "Robotics Club", "Bakery", "Running Club", "Youth Theatre", "Cycling Club", "Brewing Co.", "Primary School", "Climbing Wall", "Food Market", "Swim Team", "Garden Society", "Book Fair", "Five-a-side League", "Dance Studio", "Scout Group", "Chess Club", "Makers Space", "Film Society"];

/** A small mark drawn for this shop: 3000 × 2000 px, 10 × 6.67 in at 300 ppi. */
const markSvg = (tag: string) =>
  `<svg xmlns="http://www.w3.org/2000/svg" width="3000" height="2000" viewBox="0 0 3000 2000"><desc>${tag}</desc><rect x="150" y="150" width="2700" height="1700" rx="300" fill="#3f6b4f"/><path d="M600 1500 L1500 400 L2400 1500 Z" fill="#e8d8a8"/></svg>`;

export async function seedLargeShop(counts: LargeShopCounts, options: { tag?: string; log?: (line: string) => void } = {}): Promise<LargeShop> {
  const began = performance.now();
  const log = options.log ?? (() => undefined);
  const tag = options.tag ?? randomBytes(3).toString("hex");
  const password = `large-${tag}-password`;
  const passwordHash = await bcrypt.hash(password, 10);

  // Sign-up: the owner makes the shop and proves the e-mail address.
  const shopName = `Foundry Lane Print Works ${tag}`;
  const ownerEmail = `owner-${tag}@large-shop.test`;
  const made = await createShopWithOwner({ shopName, name: "Marta Quill", email: ownerEmail, passwordHash });
  await markEmailVerified({ userId: made.userId });
  const shopRow = (await findShopBySlug({ slug: made.shopSlug }))!;
  const shopId = shopRow.id;

  // The first client's contact signs up on their own; the shop then files them under the client.
  const contactEmail = `contact-${tag}@large-shop.test`;
  const contactUser = await createUser({ email: contactEmail, name: "Odile Penhallow", passwordHash });
  await markEmailVerified({ userId: contactUser.id });

  const clientCount = Math.max(1, counts.clients ?? LARGE_SHOP_SIZE.clients);
  const clientIds: string[] = [];
  let firstClientName = "";
  for (let i = 0; i < clientCount; i += 1) {
    const name = `${CLIENT_FIRST[i % CLIENT_FIRST.length]} ${CLIENT_SECOND[Math.floor(i / CLIENT_FIRST.length) % CLIENT_SECOND.length]}${i >= CLIENT_FIRST.length * CLIENT_SECOND.length ? ` ${Math.floor(i / (CLIENT_FIRST.length * CLIENT_SECOND.length)) + 1}` : ""}`;
    const contacts = i === 0 ? [{ name: "Odile Penhallow", email: contactEmail, phone: null }] : [];
    const client = await createClient({ shopId, actorUserId: made.userId, input: { name, notes: null, taxExempt: false, contacts } });
    clientIds.push(client.id);
    if (i === 0) firstClientName = name;
  }
  log(`large shop ${made.shopSlug}: owner, contact and ${clientCount} clients made`);

  // One job, art and proof the way the product makes them, sent as revision A: the pattern for the bulk rows.
  // The library blanks are written only into a database that lacks them (rewriting them would touch every shop's library).
  const blankIds = [libraryBlankId("everyday-crew-tee"), libraryBlankId("campfire-pullover-hoodie"), libraryBlankId("market-canvas-tote")];
  const present = await Promise.all(blankIds.map((blankId) => blankUsableByShop({ shopId, blankId })));
  if (present.some((b) => !b)) await ensureLibraryBlanks(db);
  const job = await createJob({
    shopId,
    actorUserId: made.userId,
    input: { title: `Foundry open day tees ${tag}`, clientId: clientIds[0]!, dueDate: null, method: "screen-print", blankId: blankIds[0]!, garmentColour: "Chalk White", printLocations: [{ location: "full-front", colours: 2 }], dtfAreaIn2: null, rush: false, notes: null, sizeRun: [{ size: "M", quantity: 10 }] },
  });
  const stored = await storeArtwork({ bytes: Buffer.from(markSvg(tag)), name: `Foundry mark ${tag}.svg`, declaredType: "image/svg+xml", shopId, userId: made.userId, clientId: clientIds[0]!, fileKey: null, fileUrl: null });
  if (!stored.ok) throw new Error(`the large shop's art was refused: ${stored.message}`);
  const proof = await makeProof({ shopId, userId: made.userId, jobId: job.id, name: "Open day front", blankId: null, colourName: null, art: [{ location: "full-front", artworkId: stored.artworkId }] });
  if (!proof.ok) throw new Error(`the large shop's first proof could not be made: ${proof.error}`);
  const document = (await getProofDocument({ shopId, proofId: proof.proofId }))!;
  const sent = await sendRevision({ document, userId: made.userId });

  // The bulk, set-based. The product-made job, proof and revision count toward the totals.
  const jobs = 1 + (await insertBulkJobs({ shopId, count: Math.max(0, counts.jobs - 1), blankIds, createdBy: made.userId }));
  const proofs = 1 + (await insertBulkProofs({ shopId, count: Math.max(0, counts.proofs - 1), template: { blankId: document.proof.blankId, colourName: document.proof.colourName, colourHex: document.proof.colourHex, size: document.proof.size } }));
  const revisions = 1 + (await insertBulkRevisions({ shopId, snapshot: sent.snapshot, sentBy: made.userId }));
  const notes = await insertBulkNotes({ shopId, count: counts.notes });
  log(`large shop ${made.shopSlug}: ${jobs} jobs, ${proofs} proofs, ${revisions} sent revisions, ${notes} notes written; analysing…`);
  await analyzeLargeTables();

  return {
    shop: { id: shopId, slug: shopRow.slug, name: shopRow.name },
    password,
    owner: { id: made.userId, email: ownerEmail },
    contact: { userId: contactUser.id, email: contactEmail, clientId: clientIds[0]!, clientName: firstClientName },
    userIds: [made.userId, contactUser.id],
    counts: { jobs, proofs, revisions, notes, clients: clientCount },
    ms: performance.now() - began,
  };
}
