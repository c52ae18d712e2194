/**
 * Records the authorization matrix runs against, made fresh (with a random tag) by each test file
 * that needs them: jobs, proofs, art, quotes, exports and share links of our own in "our" shop,
 * and a second shop with its own owner and records. Our shop is a shop the test factory built
 * (tests/support/factory.ts), or else the demo shop, whose own records are read, never changed.
 */
import { randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { duplicateBlank, findBlank } from "@/db/queries/blanks";
import { createClient } from "@/db/queries/clients";
import { createJob, type JobInput } from "@/db/queries/jobs";
import { acceptQuote, sendQuote } from "@/db/queries/orders";
import { createExport, finishExport } from "@/db/queries/production";
import { getProofDocument } from "@/db/queries/proofs";
import { addComment, createShareLink, revokeShareLink, sendRevision } from "@/db/queries/review";
import { acceptInvitation, createInvitation, createShopWithOwner } from "@/db/queries/shops";
import { markEmailVerified } from "@/db/queries/users";
import { artworks, clients, memberships, placements, proofs, shops, users } from "@/db/schema";
import type { ShopRole } from "@/lib/access";
import { DEFAULT_PRICE_MATRIX, formatCents } from "@/lib/pricing";
import { quoteJob } from "@/lib/quotes";
import type { BuiltShop } from "@/tests/support/factory";
import type { Actor, Placeholder } from "./matrix";

export const DEMO_SHOP_SLUG = "quarry-street-print-co";
export const DEMO_PASSWORD = "chalkline-demo";
export const DEMO_EMAILS = {
  owner: "owner@chalkline.test",
  designer: "designer@chalkline.test",
  production: "press@chalkline.test",
  client: "client@chalkline.test",
} as const;
export const CLUB = "Eastfield Youth Soccer Club";
/** The library tee: its chart has an M and a full-front print area. */
export const LIBRARY_TEE = "library-everyday-crew-tee";

/** Ids the action inputs use beside the matrix's placeholders. */
type ExtraId = "siblingJobId" | "secondClientId" | "linkId" | "otherLinkId" | "otherSpareArtworkId";
type SignedInActor = Exclude<Actor, "link" | "anon">;
export type FixtureUser = { id: string; email: string; name: string | null };

export type AuthzFixture = {
  tag: string;
  shop: { id: string; slug: string };
  other: { id: string; slug: string };
  users: Record<SignedInActor, FixtureUser>;
  passwords: Record<SignedInActor, string>;
  /** Values for the matrix's {placeholders}, plus a few ids the action inputs use. */
  ids: Record<Placeholder | ExtraId, string>;
  /** Text that belongs to our shop: never in a response another shop's owner gets, nor in any refusal. */
  secrets: string[];
  /** Text of our other client's records: never in a response the signed-in client gets. */
  clientSecrets: string[];
  /** Money on our jobs: never in a response production gets. */
  money: string[];
};

/** A small vector mark, drawn for these tests. */
function markSvg(fill: string): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 120 80"><rect x="10" y="10" width="100" height="60" rx="12" fill="${fill}"/></svg>`;
}

export async function insertArt(shopId: string, clientId: string | null, name: string): Promise<string> {
  const [row] = await db
    .insert(artworks)
    .values({ shopId, clientId, name, kind: "generated", svg: markSvg("#2d5d7b"), inkWidthPx: 1200, inkHeightPx: 800, isVector: true, shape: "wide", mime: "image/svg+xml" })
    .returning({ id: artworks.id });
  return row!.id;
}

/** A job as its form sends it (the save action's input, without the shop). */
export function jobFormInput(title: string, clientId: string) {
  return {
    title,
    clientId,
    dueDate: "2027-05-01",
    method: "screen-print" as const,
    blankId: LIBRARY_TEE,
    garmentColour: "Deep Harbor",
    printLocations: [{ location: "full-front" as const, colours: 1 }],
    dtfAreaIn2: null,
    rush: false,
    notes: "",
    sizeRun: [
      { size: "S", quantity: 8 },
      { size: "M", quantity: 12 },
    ],
  };
}

function jobInput(title: string, clientId: string): JobInput {
  return { ...jobFormInput(title, clientId), notes: null };
}

/** A blank's values as its edit form sends them, from the stored blank. */
export function blankFormValues(blank: NonNullable<Awaited<ReturnType<typeof findBlank>>>, description: string) {
  return {
    name: blank.name,
    description,
    colours: blank.colours.map((c) => ({ name: c.name, hex: c.hex.toUpperCase() })),
    sizes: blank.sizeChart.map((row) => ({ size: row.size, group: row.group, measurements: { ...(row.measurements as unknown as Record<string, number>) } })),
  };
}

export async function insertProof(shopId: string, jobId: string, name: string, artworkId: string | null, userId: string): Promise<string> {
  const [proof] = await db
    .insert(proofs)
    .values({ shopId, jobId, name, blankId: LIBRARY_TEE, colourName: "Deep Harbor", colourHex: "#243247", size: "M", updatedBy: userId })
    .returning({ id: proofs.id });
  await db.insert(placements).values({
    id: `matrix-${proof!.id}`,
    proofId: proof!.id,
    location: "full-front",
    artworkId,
    widthIn: 10,
    heightIn: 20 / 3,
    offsetFromCenterIn: 0,
    belowCollarIn: 3,
    rotationDeg: 0,
    sortOrder: 0,
  });
  return proof!.id;
}

async function send(shopId: string, proofId: string, userId: string) {
  const document = await getProofDocument({ shopId, proofId });
  if (!document) throw new Error(`proof ${proofId} not found`);
  return sendRevision({ document, userId });
}

/** A quote for the job at the demo prices, accepted by the client, as the portal would leave it. */
export async function acceptedQuote(shopId: string, jobId: string, title: string, clientId: string, userId: string) {
  const input = jobInput(title, clientId);
  const priced = quoteJob({ ...input, method: "screen-print", garmentName: "Everyday Crew Tee" }, DEFAULT_PRICE_MATRIX, { taxExempt: false });
  if (!priced.ok || !priced.snapshot) throw new Error(priced.ok ? "no snapshot" : priced.message);
  const quote = await sendQuote({ shopId, jobId, snapshot: priced.snapshot, depositPercent: DEFAULT_PRICE_MATRIX.depositPercent, actorUserId: userId });
  await acceptQuote({ quoteId: quote.id, name: "Priya Castell", userId: null, via: "link", ip: "127.0.0.1", userAgent: "authz fixture" });
  return quote;
}

/** A finished two-sheet PNG gang sheet: file 1 on the export row, file 2 beside it, as the worker leaves them. */
export async function finishedExport(shopId: string, jobId: string, userId: string): Promise<string> {
  const id = await createExport({ shopId, jobId, kind: "gang-sheet-png", params: {}, requestedBy: userId });
  const png = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==", "base64");
  await finishExport(id, [1, 2].map((n) => ({ fileName: `matrix-gang-sheet-${n}-of-2.png`, mime: "image/png", bytes: png })));
  return id;
}

/** The password of every team member these fixtures add; hashed once per test process. */
export const MEMBER_PASSWORD = "a-long-enough-password";
let memberHash: Promise<string> | undefined;

/**
 * Adds a new person to a shop's team the way the product does: an invitation from the owner,
 * accepted with a new account. Returns the membership id (what the team actions take) and the user.
 */
export async function addTeamMember(input: { shopId: string; ownerId: string; email: string; name: string; role: ShopRole }): Promise<{ memberId: string; user: FixtureUser }> {
  memberHash ??= bcrypt.hash(MEMBER_PASSWORD, 10);
  const { token } = await createInvitation({ shopId: input.shopId, email: input.email, role: input.role, invitedBy: input.ownerId });
  const accepted = await acceptInvitation({ token, name: input.name, passwordHash: await memberHash });
  if (!accepted.ok) throw new Error(`${input.email} could not join: ${accepted.message}`);
  const [row] = await db
    .select({ memberId: memberships.id, id: users.id, email: users.email, name: users.name })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.shopId, input.shopId), eq(users.email, accepted.email)));
  return { memberId: row!.memberId, user: { id: row!.id, email: row!.email, name: row!.name } };
}

/** One shop's own working set: a client, a job, two pieces of art, a sent proof with a share link, an accepted quote, a finished export and a blank. */
export type ShopRecords = {
  clientId: string;
  jobId: string;
  artworkId: string;
  spareArtworkId: string;
  proofId: string;
  linkId: string;
  linkToken: string;
  quoteId: string;
  exportId: string;
  blankId: string;
};

/**
 * Builds a fresh working set in a shop through the product's own queries. Each call makes new
 * rows, so a test that changes them (the fuzzer, say) can start the next case from a known state.
 */
export async function buildShopRecords({ shopId, ownerId, tag }: { shopId: string; ownerId: string; tag: string }): Promise<ShopRecords> {
  const client = await createClient({ shopId, actorUserId: ownerId, input: { name: `Mill Choir ${tag}`, notes: null, taxExempt: false, contacts: [{ name: "Cass Mill", email: `cass-${tag}@mill.test`, phone: null }] } });
  const job = await createJob({ shopId, actorUserId: ownerId, input: jobInput(`Mill choir tees ${tag}`, client.id) });
  const artworkId = await insertArt(shopId, client.id, `Mill note ${tag}`);
  const spareArtworkId = await insertArt(shopId, client.id, `Mill staff ${tag}`);
  const proofId = await insertProof(shopId, job.id, `Mill front ${tag}`, artworkId, ownerId);
  await send(shopId, proofId, ownerId);
  const link = await createShareLink({ shopId, proofId, permission: "approve", expiresAt: null, recipientEmail: null, recipientName: null, createdBy: ownerId });
  const quote = await acceptedQuote(shopId, job.id, `Mill choir tees ${tag}`, client.id, ownerId);
  const exportId = await finishedExport(shopId, job.id, ownerId);
  const blank = await duplicateBlank({ shopId, blankId: LIBRARY_TEE });
  return { clientId: client.id, jobId: job.id, artworkId, spareArtworkId, proofId, linkId: link.link.id, linkToken: link.token, quoteId: quote.id, exportId, blankId: blank!.id };
}

type OurActor = keyof typeof DEMO_EMAILS;

/** Our shop, its owner, designer, production member and the client's contact who can sign in, and that client. */
export type AuthzBase = {
  shop: { id: string; slug: string };
  users: Record<OurActor, FixtureUser>;
  passwords: Record<OurActor, string>;
  clubId: string;
};

/** A shop the factory built with a designer, production and a client account (team and clientAccount). */
export function authzBaseOf(built: BuiltShop): AuthzBase {
  const { designer, production } = built;
  const client = built.client.user;
  if (!designer || !production || !client) throw new Error("the matrix needs a shop built with a designer, production and a client account");
  const user = (p: { id: string; email: string; name: string }): FixtureUser => ({ id: p.id, email: p.email, name: p.name });
  return {
    shop: { id: built.shop.id, slug: built.shop.slug },
    users: { owner: user(built.owner), designer: user(designer), production: user(production), client: user(client) },
    passwords: { owner: built.owner.password, designer: designer.password, production: production.password, client: client.password },
    clubId: built.client.id,
  };
}

/** The demo shop and its people, read only. */
async function demoBase(): Promise<AuthzBase> {
  const [shop] = await db.select({ id: shops.id, slug: shops.slug }).from(shops).where(eq(shops.slug, DEMO_SHOP_SLUG));
  if (!shop) throw new Error("the demo shop is missing; the test stack seeds it");
  const demoUsers = {} as Record<OurActor, FixtureUser>;
  for (const [actor, email] of Object.entries(DEMO_EMAILS) as Array<[OurActor, string]>) {
    const [user] = await db.select({ id: users.id, email: users.email, name: users.name }).from(users).where(eq(users.email, email));
    if (!user) throw new Error(`demo user ${email} is missing`);
    demoUsers[actor] = user;
  }
  const [club] = await db.select({ id: clients.id }).from(clients).where(and(eq(clients.shopId, shop.id), eq(clients.name, CLUB)));
  if (!club) throw new Error(`the demo client ${CLUB} is missing`);
  return { shop, users: demoUsers, passwords: { owner: DEMO_PASSWORD, designer: DEMO_PASSWORD, production: DEMO_PASSWORD, client: DEMO_PASSWORD }, clubId: club.id };
}

/** The matrix's records, added to our shop (the demo shop when no base is given) and a second shop made here. */
export async function buildAuthzFixture(base?: AuthzBase): Promise<AuthzFixture> {
  const tag = randomBytes(3).toString("hex");
  const ours = base ?? (await demoBase());
  const { shop, users: ourUsers, passwords } = ours;
  const club = { id: ours.clubId };
  const ownerId = ourUsers.owner.id;
  const designerId = ourUsers.designer.id;

  // Ours: two jobs for the club (one sent and quoted, one with an unsent proof and its own quote),
  // and a job for another client of ours that the club's contact must never see.
  const second = await createClient({ shopId: shop.id, actorUserId: ownerId, input: { name: `Matrix Rowing Club ${tag}`, notes: null, taxExempt: false, contacts: [{ name: "Rowan Pike", email: `rowan-${tag}@rowing.test`, phone: null }] } });
  const jobTitle = `Matrix pennant tees ${tag}`;
  const job = await createJob({ shopId: shop.id, actorUserId: ownerId, input: jobInput(jobTitle, club.id) });
  const siblingTitle = `Matrix warm-up tees ${tag}`;
  const sibling = await createJob({ shopId: shop.id, actorUserId: ownerId, input: jobInput(siblingTitle, club.id) });
  const secondTitle = `Matrix regatta tees ${tag}`;
  const secondJob = await createJob({ shopId: shop.id, actorUserId: ownerId, input: jobInput(secondTitle, second.id) });

  const artName = `Matrix crest ${tag}`;
  const artworkId = await insertArt(shop.id, club.id, artName);
  const secondArtName = `Matrix oars ${tag}`;
  const secondClientArtworkId = await insertArt(shop.id, second.id, secondArtName);

  const proofName = `Matrix front ${tag}`;
  const proofId = await insertProof(shop.id, job.id, proofName, artworkId, designerId);
  const unsentName = `Matrix draft ${tag}`;
  const unsentProofId = await insertProof(shop.id, sibling.id, unsentName, artworkId, designerId);
  await send(shop.id, proofId, designerId);

  const link = await createShareLink({ shopId: shop.id, proofId, permission: "approve", expiresAt: null, recipientEmail: null, recipientName: "Priya Castell", createdBy: designerId });
  const view = await createShareLink({ shopId: shop.id, proofId, permission: "view", expiresAt: null, recipientEmail: null, recipientName: null, createdBy: designerId });
  const revoked = await createShareLink({ shopId: shop.id, proofId, permission: "approve", expiresAt: null, recipientEmail: null, recipientName: null, createdBy: designerId });
  await revokeShareLink({ shopId: shop.id, linkId: revoked.link.id, userId: designerId });
  const expired = await createShareLink({ shopId: shop.id, proofId, permission: "approve", expiresAt: new Date(Date.now() - 60_000), recipientEmail: null, recipientName: null, createdBy: designerId });
  const noteBody = `Matrix pinned note ${tag}`;
  const comment = await addComment({ proofId, revisionLetter: "A", parentId: null, side: "front", xIn: 0, yIn: 6, body: noteBody, authorName: "Theo Okonkwo", authorRole: "shop", authorUserId: designerId, shareLinkId: null });

  const quote = await acceptedQuote(shop.id, job.id, jobTitle, club.id, ownerId);
  const siblingQuote = await acceptedQuote(shop.id, sibling.id, siblingTitle, club.id, ownerId);
  const exportId = await finishedExport(shop.id, job.id, ownerId);
  const blank = await duplicateBlank({ shopId: shop.id, blankId: LIBRARY_TEE });
  const invite = await createInvitation({ shopId: shop.id, email: `invitee-${tag}@example.test`, role: "designer", invitedBy: ownerId });

  // The other shop, with an owner who can sign in and records of its own.
  const otherPassword = `matrix-${tag}-password`;
  const otherEmail = `matrix-owner-${tag}@other-shop.test`;
  const { userId: otherOwnerId, shopSlug: otherSlug } = await createShopWithOwner({ shopName: `Matrix Mill Prints ${tag}`, name: "Odile Marsh", email: otherEmail, passwordHash: await bcrypt.hash(otherPassword, 10) });
  // Signed up and opened the e-mailed link, so the password works.
  await markEmailVerified({ userId: otherOwnerId });
  const [otherShop] = await db.select({ id: shops.id, slug: shops.slug }).from(shops).where(eq(shops.slug, otherSlug));
  const their = await buildShopRecords({ shopId: otherShop!.id, ownerId: otherOwnerId, tag });
  const ids = {
    shop: shop.slug,
    otherShop: otherSlug,
    jobId: job.id,
    proofId,
    unsentProofId,
    siblingQuoteId: siblingQuote.id,
    secondClientJobId: secondJob.id,
    clientId: club.id,
    blankId: blank!.id,
    artworkId,
    secondClientArtworkId,
    exportId,
    quoteId: quote.id,
    linkToken: link.token,
    viewToken: view.token,
    revokedToken: revoked.token,
    expiredToken: expired.token,
    inviteToken: invite.token,
    commentId: comment.id,
    device: `matrix-${tag}-screen`,
    utVersion: "",
    mailKey: process.env.MAIL_FAKE_KEY ?? "",
    otherJobId: their.jobId,
    otherProofId: their.proofId,
    otherClientId: their.clientId,
    otherBlankId: their.blankId,
    otherArtworkId: their.artworkId,
    otherExportId: their.exportId,
    otherQuoteId: their.quoteId,
    // Used by action inputs only.
    siblingJobId: sibling.id,
    secondClientId: second.id,
    linkId: link.link.id,
    otherLinkId: their.linkId,
    otherSpareArtworkId: their.spareArtworkId,
  };

  return {
    tag,
    shop,
    other: otherShop!,
    users: { ...ourUsers, other: { id: otherOwnerId, email: otherEmail, name: "Odile Marsh" } },
    passwords: { ...passwords, other: otherPassword },
    ids,
    secrets: [jobTitle, siblingTitle, secondTitle, proofName, unsentName, artName, secondArtName, noteBody, `Matrix Rowing Club ${tag}`],
    clientSecrets: [secondTitle, secondArtName, `Matrix Rowing Club ${tag}`],
    money: [...new Set([formatCents(quote.totalCents), formatCents(quote.depositCents), formatCents(siblingQuote.totalCents)]), "totalCents", "depositCents", "balanceCents"],
  };
}
