/**
 * Fresh shops for tests, made the way the product makes them (the same query functions and server
 * helpers the seed uses): sign-up of an owner with a password, team members by invitation, a client
 * with a contact, a job with a size run, art read as an upload is, a proof made from the job and,
 * if asked, sent to the client. A test that changes these rows changes only its own.
 *
 *   const shops = shopFactory("review");          // one per test file: a random tag, cleanup in afterAll
 *   const s = await shops.build({ sent: true });  // in beforeAll (per file) or in a test (per test)
 *
 * Every failure in the file names the tag and the shops built (tests/support/failure-notes.ts).
 * afterAll deletes each shop (its rows cascade) and the people made for it, whether or not the
 * tests passed; a shop made by hand in a test can join that cleanup through `adopt`.
 */
import { randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import { and, eq, gte, inArray, notExists } from "drizzle-orm";
import { afterAll } from "vitest";
import { storeArtwork } from "@/app/_server/artwork/ingest";
import { makeProof } from "@/app/_server/proof-make";
import { db } from "@/db/client";
import { findShopBySlug } from "@/db/queries/access";
import { createClient } from "@/db/queries/clients";
import { createJob, type JobInput } from "@/db/queries/jobs";
import { getProofDocument } from "@/db/queries/proofs";
import { sendRevision } from "@/db/queries/review";
import { acceptInvitation, createInvitation, createShopWithOwner } from "@/db/queries/shops";
import { createUser, findUserByEmail, markEmailVerified } from "@/db/queries/users";
import { clientContacts, memberships, shops, users } from "@/db/schema";
import type { SizeRunEntry } from "@/lib/pricing";
import { noteOnFailure } from "./failure-notes";

/** The library tee (its chart has an M and a full-front print area). */
export const FACTORY_BLANK = "library-everyday-crew-tee";

export type Person = { id: string; email: string; name: string; password: string };
export type TeamRole = "designer" | "production";

export type BuiltShop = {
  /** The factory's tag and this shop's number, in every name and address made for it. */
  tag: string;
  shop: { id: string; slug: string; name: string };
  owner: Person;
  designer: Person | null;
  production: Person | null;
  client: { id: string; name: string; contact: { id: string; name: string; email: string }; user: Person | null };
  job: { id: string; title: string; sizeRun: SizeRunEntry[] };
  art: { id: string; name: string };
  proof: { id: string; name: string; sentLetter: string | null };
};

export type ShopOptions = {
  /** Members who join by invitation from the owner. */
  team?: TeamRole[];
  /** The client's contact has an account of their own (signed up, e-mail proven), linked to the contact. */
  clientAccount?: boolean;
  /** The proof is sent to the client as revision A. */
  sent?: boolean;
  /** Changes to the job as its form would send it. */
  job?: Partial<Omit<JobInput, "clientId">>;
};

/** A small vector mark drawn for these tests: 3000 x 2000 px, 10 x 6.67 in at 300 ppi. */
function markSvg(tag: string): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" width="3000" height="2000" viewBox="0 0 3000 2000"><desc>${tag}</desc><rect x="100" y="100" width="2800" height="1800" rx="240" fill="#2d5d7b"/><circle cx="1500" cy="1000" r="600" fill="#f2c14e"/></svg>`;
}

const hashes = new Map<string, Promise<string>>();
const hashOf = (password: string) => {
  if (!hashes.has(password)) hashes.set(password, bcrypt.hash(password, 10));
  return hashes.get(password)!;
};

export type ShopFactory = {
  tag: string;
  /** The shops built so far, in order. */
  built: BuiltShop[];
  build: (options?: ShopOptions) => Promise<BuiltShop>;
  /** Adds shops (by id or slug) and people made some other way (a sign-up in the test, say) to this factory's cleanup. */
  adopt: (rows: { shopIds?: string[]; shopSlugs?: string[]; userIds?: string[] }) => void;
  /** Deletes everything this factory made so far (afterAll does it anyway). */
  cleanup: () => Promise<void>;
};

/**
 * One factory per test file (or per describe). Its tag is random and printed with every failure in
 * the file; the shops it builds are deleted in afterAll, pass or fail.
 */
export function shopFactory(label: string): ShopFactory {
  const tag = randomBytes(3).toString("hex");
  const password = `fixture-${tag}-password`;
  const shopIds = new Set<string>();
  const shopSlugs = new Set<string>();
  const userIds = new Set<string>();
  let count = 0;
  const built: BuiltShop[] = [];

  noteOnFailure(`${label} fixture`, () => `tag ${tag}${built.length ? `, shops ${built.map((b) => b.shop.slug).join(", ")}` : ""}`);

  async function person(email: string): Promise<Person> {
    const user = await findUserByEmail({ email });
    if (!user) throw new Error(`${email} was not made`);
    userIds.add(user.id);
    return { id: user.id, email: user.email, name: user.name ?? "", password };
  }

  async function build(options: ShopOptions = {}): Promise<BuiltShop> {
    count += 1;
    const t = `${tag}-${count}`;
    const passwordHash = await hashOf(password);
    const mail = (who: string) => `${who}-${t}@factory-${label.replace(/[^a-z0-9]+/gi, "-").toLowerCase()}.test`;

    // Sign-up: the owner makes the shop, then proves the e-mail address.
    const shopName = `Tidewater Prints ${t}`;
    const ownerEmail = mail("owner");
    const made = await createShopWithOwner({ shopName, name: "Ada Quill", email: ownerEmail, passwordHash });
    userIds.add(made.userId);
    const shopRow = (await findShopBySlug({ slug: made.shopSlug }))!;
    shopIds.add(shopRow.id);
    await markEmailVerified({ userId: made.userId });
    const owner = await person(ownerEmail);

    // The team joins by invitation.
    const team: Partial<Record<TeamRole, Person>> = {};
    for (const role of options.team ?? []) {
      const email = mail(role);
      const { token } = await createInvitation({ shopId: shopRow.id, email, role, invitedBy: owner.id });
      const joined = await acceptInvitation({ token, name: role === "designer" ? "Bram Elling" : "Cleo Varga", passwordHash });
      if (!joined.ok) throw new Error(`the ${role} of ${shopName} could not join: ${joined.message}`);
      team[role] = await person(email);
    }

    // The client's contact, with an account of their own when asked (their first sign-in made it).
    const contactEmail = mail("contact");
    let clientUser: Person | null = null;
    if (options.clientAccount) {
      const created = await createUser({ email: contactEmail, name: "Dina Marsh", passwordHash });
      userIds.add(created.id);
      await markEmailVerified({ userId: created.id });
      clientUser = await person(contactEmail);
    }
    const clientName = `Saltmarsh Rowing Club ${t}`;
    const client = await createClient({ shopId: shopRow.id, actorUserId: owner.id, input: { name: clientName, notes: null, taxExempt: false, contacts: [{ name: "Dina Marsh", email: contactEmail, phone: null }] } });
    const [contact] = await db.select({ id: clientContacts.id, name: clientContacts.name, email: clientContacts.email }).from(clientContacts).where(eq(clientContacts.clientId, client.id));

    const maker = team.designer ?? owner;
    const sizeRun: SizeRunEntry[] = options.job?.sizeRun ?? [
      { size: "S", quantity: 8 },
      { size: "M", quantity: 12 },
    ];
    const jobInput: JobInput = {
      title: `Regatta tees ${t}`,
      dueDate: "2027-05-01",
      method: "screen-print",
      blankId: FACTORY_BLANK,
      garmentColour: "Deep Harbor",
      printLocations: [{ location: "full-front", colours: 1 }],
      dtfAreaIn2: null,
      rush: false,
      notes: null,
      ...options.job,
      sizeRun,
      clientId: client.id,
    };
    const job = await createJob({ shopId: shopRow.id, actorUserId: maker.id, input: jobInput });

    // The art comes in as an upload does: analysed, ink measured, previews made.
    const artName = `Oar mark ${t}`;
    const stored = await storeArtwork({ bytes: Buffer.from(markSvg(t)), name: `${artName}.svg`, declaredType: "image/svg+xml", shopId: shopRow.id, userId: maker.id, clientId: client.id, fileKey: null, fileUrl: null });
    if (!stored.ok) throw new Error(`the art of ${shopName} was refused: ${stored.message}`);

    // A proof made from the job, with the art on its first print location.
    const location = jobInput.printLocations[0]?.location ?? "full-front";
    const proofName = `Regatta front ${t}`;
    const proof = await makeProof({ shopId: shopRow.id, userId: maker.id, jobId: job.id, name: proofName, blankId: null, colourName: null, art: [{ location, artworkId: stored.artworkId }] });
    if (!proof.ok) throw new Error(`the proof of ${shopName} could not be made: ${proof.error}`);
    let sentLetter: string | null = null;
    if (options.sent) {
      const document = (await getProofDocument({ shopId: shopRow.id, proofId: proof.proofId }))!;
      sentLetter = (await sendRevision({ document, userId: maker.id })).letter;
    }

    const shop: BuiltShop = {
      tag: t,
      shop: { id: shopRow.id, slug: shopRow.slug, name: shopRow.name },
      owner,
      designer: team.designer ?? null,
      production: team.production ?? null,
      client: { id: client.id, name: clientName, contact: contact!, user: clientUser },
      job: { id: job.id, title: jobInput.title, sizeRun },
      art: { id: stored.artworkId, name: artName },
      proof: { id: proof.proofId, name: proof.name, sentLetter },
    };
    built.push(shop);
    return shop;
  }

  async function cleanup(): Promise<void> {
    if (shopSlugs.size) {
      for (const row of await db.select({ id: shops.id }).from(shops).where(inArray(shops.slug, [...shopSlugs]))) shopIds.add(row.id);
      shopSlugs.clear();
    }
    const dropped = shopIds.size ? await db.select({ id: shops.id, createdAt: shops.createdAt }).from(shops).where(inArray(shops.id, [...shopIds])) : [];
    if (dropped.length) {
      const ids = dropped.map((d) => d.id);
      // People who joined these shops during the tests (by invitation, say) go too, unless they
      // are on another team or are older than the oldest of these shops (the demo's people are).
      const since = new Date(Math.min(...dropped.map((d) => d.createdAt.getTime())));
      const joined = await db
        .select({ id: users.id })
        .from(memberships)
        .innerJoin(users, eq(users.id, memberships.userId))
        .where(and(inArray(memberships.shopId, ids), gte(users.createdAt, since)));
      await db.delete(shops).where(inArray(shops.id, ids));
      const alone = joined.map((j) => j.id).filter((id) => !userIds.has(id));
      if (alone.length) {
        await db
          .delete(users)
          .where(and(inArray(users.id, alone), notExists(db.select({ id: memberships.id }).from(memberships).where(eq(memberships.userId, users.id)))));
      }
    }
    if (userIds.size) await db.delete(users).where(inArray(users.id, [...userIds]));
    shopIds.clear();
    userIds.clear();
  }

  afterAll(cleanup);

  return {
    tag,
    built,
    build,
    adopt: (rows) => {
      for (const id of rows.shopIds ?? []) shopIds.add(id);
      for (const slug of rows.shopSlugs ?? []) shopSlugs.add(slug);
      for (const id of rows.userIds ?? []) userIds.add(id);
    },
    cleanup,
  };
}
