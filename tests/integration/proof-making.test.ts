/**
 * Making proofs from an empty shop, and revisions that hold: a shop made here (never the demo rows)
 * gets a client, a job and art through the product's own queries, then every step goes through the
 * server actions with the session mocked as that shop's people.
 */
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { archiveProofAction, createProofAction, duplicateProofAction } from "@/app/shops/[shop]/jobs/[jobId]/proofs/actions";
import { saveProofAction } from "@/app/shops/[shop]/proofs/[proofId]/actions";
import { shareProofAction } from "@/app/shops/[shop]/proofs/[proofId]/share-actions";
import { db } from "@/db/client";
import { createClient } from "@/db/queries/clients";
import { createJob } from "@/db/queries/jobs";
import { getProductionDocument, getProofDocument, listProofsForJob } from "@/db/queries/proofs";
import { listRevisions, recordDecision } from "@/db/queries/review";
import { acceptInvitation, createInvitation, createShopWithOwner } from "@/db/queries/shops";
import { proofRevisions, shops, users } from "@/db/schema";
import { insertArt, LIBRARY_TEE } from "@/tests/authz/fixtures";
import { shopFactory } from "@/tests/support/factory";

const session = vi.hoisted(() => ({ user: null as null | { id: string; email: string; name: string | null } }));
vi.mock("@/app/_server/auth", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/app/_server/auth")>()),
  getSessionUser: async () => session.user,
}));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));

// The shops made here go again after the file (pass or fail), with everything in them.
const made = shopFactory("proof-making");
const tag = made.tag;
const people = {} as Record<"owner" | "designer" | "production", { id: string; email: string; name: string }>;
let shop: { id: string; slug: string };
let jobId = "";
let emptyJobId = "";
let artId = "";
let otherArtId = "";

beforeAll(async () => {
  const ownerEmail = `maker-${tag}@proofs.test`;
  const { userId, shopSlug } = await createShopWithOwner({ shopName: `Proof Yard ${tag}`, name: "Ines Dale", email: ownerEmail, passwordHash: "x" });
  made.adopt({ shopSlugs: [shopSlug], userIds: [userId] });
  const [row] = await db.select({ id: shops.id, slug: shops.slug }).from(shops).where(eq(shops.slug, shopSlug));
  shop = row!;
  people.owner = { id: userId, email: ownerEmail, name: "Ines Dale" };
  for (const role of ["designer", "production"] as const) {
    const email = `${role}-${tag}@proofs.test`;
    const { token } = await createInvitation({ shopId: shop.id, email, role, invitedBy: userId });
    const joined = await acceptInvitation({ token, name: `Pat ${role}`, passwordHash: "x" });
    if (!joined.ok) throw new Error(`could not add the ${role}: ${JSON.stringify(joined)}`);
    const [user] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
    people[role] = { id: user!.id, email, name: `Pat ${role}` };
    made.adopt({ userIds: [user!.id] });
  }
  const client = await createClient({ shopId: shop.id, actorUserId: userId, input: { name: `Harbour Rowing ${tag}`, notes: null, taxExempt: false, contacts: [{ name: "Ros Keel", email: `ros-${tag}@rowing.test`, phone: null }] } });
  const base = { clientId: client.id, dueDate: "2027-06-01", method: "dtf" as const, blankId: LIBRARY_TEE, garmentColour: "Kiln Red", dtfAreaIn2: 100, rush: false, notes: null };
  const job = await createJob({
    shopId: shop.id,
    actorUserId: userId,
    input: { ...base, title: `Regatta tees ${tag}`, printLocations: [{ location: "full-front", colours: 1 }, { location: "full-back", colours: 1 }], sizeRun: [{ size: "S", quantity: 4 }, { size: "M", quantity: 12 }, { size: "L", quantity: 10 }, { size: "XL", quantity: 2 }] },
  });
  jobId = job.id;
  emptyJobId = (await createJob({ shopId: shop.id, actorUserId: userId, input: { ...base, title: `Bare job ${tag}`, printLocations: [], sizeRun: [] } })).id;
  artId = await insertArt(shop.id, client.id, `Oar crest ${tag}`);
  otherArtId = await insertArt(shop.id, client.id, `Oar script ${tag}`);
});

afterAll(() => {
  session.user = null;
});

const as = (who: keyof typeof people | null) => (session.user = who ? people[who] : null);

async function makeProof(who: keyof typeof people = "designer") {
  as(who);
  const made = await createProofAction({ shopSlug: shop.slug, jobId, name: null, blankId: null, colourName: null, art: [{ location: "full-front", artworkId: artId }, { location: "full-back", artworkId: otherArtId }] });
  if (!made.ok) throw new Error(made.error);
  return made.data;
}

async function save(proofId: string, change: (doc: Awaited<ReturnType<typeof docOf>>["doc"]) => Awaited<ReturnType<typeof docOf>>["doc"]) {
  const current = await docOf(proofId);
  const result = await saveProofAction({ shopSlug: shop.slug, proofId, baseVersion: current.version, doc: change(current.doc) });
  if (!result.ok) throw new Error(result.message);
  return result;
}

async function docOf(proofId: string) {
  const d = (await getProofDocument({ shopId: shop.id, proofId }))!;
  return { version: d.proof.version, revision: d.proof.revision, doc: { size: d.proof.size, colourName: d.proof.colourName, colourHex: d.proof.colourHex, placements: d.placements } };
}

async function share(proofId: string) {
  const result = await shareProofAction({ shopSlug: shop.slug, proofId, permission: "approve", expiresInDays: null, recipientEmail: null, recipientName: null, message: null });
  if (!result.ok) throw new Error(result.error);
  return result.data.letter;
}

describe("making a proof for a new job", () => {
  it("starts from the job's blank and colour, the middle of the run, and one print per location with the chosen art", async () => {
    const made = await makeProof();
    expect(made.url).toBe(`/shops/${shop.slug}/proofs/${made.proofId}`);
    const d = (await getProofDocument({ shopId: shop.id, proofId: made.proofId }))!;
    expect(d.blank.id).toBe(LIBRARY_TEE);
    expect(d.proof.colourName).toBe("Kiln Red");
    // 28 pieces: piece 14 falls in M (S holds 1–4, M 5–16).
    expect(d.proof.size).toBe("M");
    expect(d.proof.revision).toBe("A");
    expect(d.placements.map((p) => [p.location, p.artworkId])).toEqual([
      ["full-front", artId],
      ["full-back", otherArtId],
    ]);
  });

  it("gives a job without print locations one print, and says so", async () => {
    as("owner");
    const made = await createProofAction({ shopSlug: shop.slug, jobId: emptyJobId, name: "Trial", blankId: null, colourName: null, art: [] });
    expect(made.ok).toBe(true);
    if (!made.ok) return;
    expect(made.data.notes.join(" ")).toMatch(/no print locations yet/);
    expect((await getProofDocument({ shopId: shop.id, proofId: made.data.proofId }))!.placements).toHaveLength(1);
  });

  it("refuses production and people outside the shop, and stores nothing", async () => {
    const before = (await listProofsForJob({ shopId: shop.id, jobId, includeArchived: true })).length;
    as("production");
    expect(await createProofAction({ shopSlug: shop.slug, jobId, name: null, blankId: null, colourName: null, art: [] })).toMatchObject({ ok: false, status: 403 });
    as(null);
    expect(await createProofAction({ shopSlug: shop.slug, jobId, name: null, blankId: null, colourName: null, art: [] })).toMatchObject({ ok: false, status: 401 });
    expect((await listProofsForJob({ shopId: shop.id, jobId, includeArchived: true })).length).toBe(before);
  });

  it("refuses art from another shop with a message", async () => {
    const stranger = await createShopWithOwner({ shopName: `Elsewhere ${tag}`, name: "Vic Ray", email: `vic-${tag}@elsewhere.test`, passwordHash: "x" });
    made.adopt({ shopSlugs: [stranger.shopSlug], userIds: [stranger.userId] });
    const [theirs] = await db.select({ id: shops.id }).from(shops).where(eq(shops.slug, stranger.shopSlug));
    const foreignArt = await insertArt(theirs!.id, null, `Their mark ${tag}`);
    as("designer");
    const result = await createProofAction({ shopSlug: shop.slug, jobId, name: null, blankId: null, colourName: null, art: [{ location: "full-front", artworkId: foreignArt }] });
    expect(result).toMatchObject({ ok: false, error: "That art is not in this client's library." });
  });

  it("copies a proof for another colour with the same prints, and for another blank laid out afresh", async () => {
    const made = await makeProof();
    as("designer");
    const sameBlank = await duplicateProofAction({ shopSlug: shop.slug, proofId: made.proofId, name: null, blankId: null, colourName: "Chalk" });
    expect(sameBlank.ok).toBe(true);
    if (!sameBlank.ok) return;
    const source = (await getProofDocument({ shopId: shop.id, proofId: made.proofId }))!;
    const copy = (await getProofDocument({ shopId: shop.id, proofId: sameBlank.data.proofId }))!;
    expect(copy.proof.colourName).toBe("Chalk");
    expect(copy.placements.map(({ id: _id, ...rest }) => rest)).toEqual(source.placements.map(({ id: _id, ...rest }) => rest));
    expect(copy.placements.some((p) => source.placements.some((s) => s.id === p.id))).toBe(false);

    const hoodie = await duplicateProofAction({ shopSlug: shop.slug, proofId: made.proofId, name: "Hoodie", blankId: "library-campfire-pullover-hoodie", colourName: null });
    expect(hoodie.ok).toBe(true);
    if (!hoodie.ok) return;
    const h = (await getProofDocument({ shopId: shop.id, proofId: hoodie.data.proofId }))!;
    expect(h.blank.category).toBe("hoodie");
    expect(h.placements.map((p) => [p.location, p.artworkId])).toEqual([
      ["full-front", artId],
      ["full-back", otherArtId],
    ]);
  });

  it("archives a draft and brings it back; an approved proof cannot be archived", async () => {
    const draft = await makeProof();
    as("designer");
    expect(await archiveProofAction({ shopSlug: shop.slug, proofId: draft.proofId, archived: true })).toEqual({ ok: true, data: { archived: true } });
    expect((await listProofsForJob({ shopId: shop.id, jobId })).some((p) => p.id === draft.proofId)).toBe(false);
    expect(await archiveProofAction({ shopSlug: shop.slug, proofId: draft.proofId, archived: false })).toEqual({ ok: true, data: { archived: false } });

    const approved = await makeProof();
    const letter = await share(approved.proofId);
    expect((await recordDecision({ proofId: approved.proofId, letter, decision: "approved", fullName: "Ros Keel", statement: "ok", comment: null, ip: null, userAgent: null, shareLinkId: null, userId: null })).ok).toBe(true);
    as("designer");
    const refused = await archiveProofAction({ shopSlug: shop.slug, proofId: approved.proofId, archived: true });
    expect(refused).toMatchObject({ ok: false, status: 409 });
    expect(refused.ok ? "" : refused.error).toMatch(/Revision A of this proof is approved/);
  });
});

describe("revisions that hold", () => {
  it("looking at another size saves nothing; the size stays the proof's own", async () => {
    const made = await makeProof();
    const before = await docOf(made.proofId);
    // The editor sends only document edits; a size switch is view state and never reaches the server.
    // A save of the unchanged document keeps the size and the letter.
    as("designer");
    await save(made.proofId, (doc) => doc);
    const after = await docOf(made.proofId);
    expect(after.doc.size).toBe(before.doc.size);
    expect(after.revision).toBe("A");
  });

  it("a sent revision never changes: the next edit starts B, and sharing again sends B beside A", async () => {
    const made = await makeProof();
    as("designer");
    expect(await share(made.proofId)).toBe("A");
    // Sharing again with no change hands out the same letter.
    expect(await share(made.proofId)).toBe("A");
    const [sentA] = await db.select().from(proofRevisions).where(eq(proofRevisions.proofId, made.proofId));
    const widthA = sentA!.snapshot.placements[0]!.widthIn;

    const edited = await save(made.proofId, (doc) => ({ ...doc, placements: doc.placements.map((p, i) => (i === 0 ? { ...p, widthIn: p.widthIn - 1, heightIn: p.heightIn - 1 } : p)) }));
    expect(edited.ok && edited.revision).toBe("B");
    // Still B for the next edits until B is sent.
    const again = await save(made.proofId, (doc) => ({ ...doc, placements: doc.placements.map((p, i) => (i === 0 ? { ...p, belowCollarIn: p.belowCollarIn + 0.5 } : p)) }));
    expect(again.ok && again.revision).toBe("B");
    expect(await share(made.proofId)).toBe("B");

    const revisions = await listRevisions({ proofId: made.proofId });
    expect(revisions.map((r) => r.letter)).toEqual(["A", "B"]);
    expect(revisions[0]!.snapshot.placements[0]!.widthIn).toBe(widthA);
    expect(revisions[1]!.snapshot.placements[0]!.widthIn).toBe(widthA - 1);
  });

  it("after approval, production keeps the approved revision and names the newer draft", async () => {
    const made = await makeProof();
    as("designer");
    const letter = await share(made.proofId);
    const approvedWidth = (await docOf(made.proofId)).doc.placements[0]!.widthIn;
    expect((await recordDecision({ proofId: made.proofId, letter, decision: "approved", fullName: "Ros Keel", statement: "Approved as shown", comment: null, ip: null, userAgent: null, shareLinkId: null, userId: null })).ok).toBe(true);

    as("designer");
    const edited = await save(made.proofId, (doc) => ({ ...doc, placements: doc.placements.map((p, i) => (i === 0 ? { ...p, widthIn: approvedWidth + 2 } : p)) }));
    expect(edited.ok && edited.revision).toBe("B");

    const printed = (await getProductionDocument({ shopId: shop.id, proofId: made.proofId }))!;
    expect(printed.approvedLetter).toBe("A");
    expect(printed.newerDraft).toBe("B");
    expect(printed.document.proof.revision).toBe("A");
    expect(printed.document.placements[0]!.widthIn).toBe(approvedWidth);
    const listed = (await listProofsForJob({ shopId: shop.id, jobId })).find((p) => p.id === made.proofId)!;
    expect(listed).toMatchObject({ revision: "B", approvedLetter: "A", lastSent: { letter: "A", state: "approved" } });
  });
});
