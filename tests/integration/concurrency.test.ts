import { AsyncLocalStorage } from "node:async_hooks";
import { and, eq } from "drizzle-orm";
import { Client } from "pg";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { SessionUser } from "@/app/_server/auth";

// The save below runs through the real server action: access from the database, checks, the
// versioned write. Only the session cookie lookup is replaced, by a per-call "signed-in person".
const session = new AsyncLocalStorage<SessionUser>();
vi.mock("@/app/_server/auth", () => ({
  getSessionUser: async () => session.getStore() ?? null,
  getAuthOptions: () => {
    throw new Error("not used in this test");
  },
}));

const { saveProofAction } = await import("@/app/shops/[shop]/proofs/[proofId]/actions");
const { CONFLICT_MESSAGE } = await import("@/app/_server/proof-save");
const { db } = await import("@/db/client");
const { getProofDocument, saveProof } = await import("@/db/queries/proofs");
const { sendRevision } = await import("@/db/queries/review");
const { placements, proofs, shops, users } = await import("@/db/schema");
const { toEditorDoc } = await import("@/lib/editor/from-server");
type ProofDoc = import("@/lib/editor/document").ProofDoc;

const SHOP = "quarry-street-print-co";
let shopId = "";
let proofId = "";

async function person(email: string): Promise<SessionUser> {
  const [row] = await db.select().from(users).where(eq(users.email, email));
  return { id: row!.id, email: row!.email, name: row!.name };
}

/** A proof of its own, copied from the demo tee, so the e2e tests never see these saves. */
async function copyDemoProof(name: string): Promise<string> {
  const [source] = await db.select().from(proofs).where(eq(proofs.name, "Team tee"));
  const id = crypto.randomUUID();
  await db.insert(proofs).values({ ...source!, id, name, revision: "A", version: 1, createdAt: new Date(), updatedAt: new Date() });
  const rows = await db.select().from(placements).where(eq(placements.proofId, source!.id));
  if (rows.length) await db.insert(placements).values(rows.map((p) => ({ ...p, id: crypto.randomUUID(), proofId: id })));
  return id;
}

async function saveAs(user: SessionUser, baseVersion: number, doc: ProofDoc) {
  return session.run(user, () => saveProofAction({ shopSlug: SHOP, proofId, baseVersion, doc }));
}

function moved(doc: ProofDoc, belowCollarIn: number): ProofDoc {
  return { ...doc, placements: doc.placements.map((p, i) => (i === 0 ? { ...p, belowCollarIn } : p)) };
}

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

beforeAll(async () => {
  const [shop] = await db.select().from(shops).where(eq(shops.slug, SHOP));
  shopId = shop!.id;
  proofId = await copyDemoProof(`Concurrency check ${Date.now()}`);
});

afterAll(async () => {
  if (proofId) await db.delete(proofs).where(eq(proofs.id, proofId));
});

describe("two sessions saving one proof at once", () => {
  it("keeps every acknowledged save, refuses stale ones with the conflict message, and ends on the last one", async () => {
    const owner = await person("owner@chalkline.test");
    const designer = await person("designer@chalkline.test");
    const start = (await getProofDocument({ shopId, proofId }))!;
    const startVersion = start.proof.version;

    type Ack = { by: string; version: number; doc: ProofDoc };
    const acks: Ack[] = [];
    const refusals: Array<{ by: string; baseVersion: number; version: number; doc: ProofDoc }> = [];
    const SAVES_EACH = 50;

    // Each session is an editor: it holds the version it last saw, saves its own edit on top, and
    // when refused takes the latest from the server ("Load the latest") before its next edit.
    async function editor(user: SessionUser, lane: number) {
      let version = startVersion;
      let doc = toEditorDoc(start);
      for (let i = 0; i < SAVES_EACH; i += 1) {
        // Distinct values per session and step, so every saved state can be told apart.
        const next = moved(doc, lane * 10 + i / 8);
        const result = await saveAs(user, version, next);
        if (result.ok) {
          acks.push({ by: user.email, version: result.version, doc: next });
          version = result.version;
          doc = next;
        } else {
          expect(result.kind).toBe("conflict");
          if (result.kind !== "conflict") throw new Error(result.message);
          expect(result.message).toBe(CONFLICT_MESSAGE);
          expect(result.version).toBeGreaterThan(version);
          refusals.push({ by: user.email, baseVersion: version, version: result.version, doc: result.doc });
          version = result.version;
          doc = result.doc;
        }
        // Uneven gaps interleave the two sessions differently on every step.
        await pause(((i * 7 + lane * 3) % 5) * 2);
      }
    }

    await Promise.all([editor(owner, 1), editor(designer, 2)]);

    expect(acks.length + refusals.length).toBe(2 * SAVES_EACH);
    expect(acks.length).toBeGreaterThan(0);
    expect(refusals.length).toBeGreaterThan(0);

    // Each acknowledged save made exactly one new version: no two share a number and none is missing.
    const versions = acks.map((a) => a.version).sort((a, b) => a - b);
    expect(versions).toEqual(versions.map((_, i) => startVersion + 1 + i));
    // Each session saw its own versions strictly increase.
    for (const email of [owner.email, designer.email]) {
      const own = acks.filter((a) => a.by === email).map((a) => a.version);
      for (let i = 1; i < own.length; i += 1) expect(own[i]).toBeGreaterThan(own[i - 1]!);
    }
    // A refusal always shows an acknowledged save, the one at the version it reports: a refused
    // save never reaches the database, and the state handed back is one consistent save.
    const byVersion = new Map(acks.map((a) => [a.version, a.doc]));
    for (const r of refusals) expect(r.doc).toEqual(byVersion.get(r.version));

    // The proof ends on the last acknowledged save.
    const last = acks.reduce((a, b) => (b.version > a.version ? b : a));
    const final = (await getProofDocument({ shopId, proofId }))!;
    expect(final.proof.version).toBe(last.version);
    expect(toEditorDoc(final)).toEqual(last.doc);

    // A save from the very first version is refused and changes nothing.
    const stale = await saveAs(owner, startVersion, moved(toEditorDoc(start), 0.5));
    expect(stale).toMatchObject({ ok: false, kind: "conflict", message: CONFLICT_MESSAGE, version: last.version });
    const after = (await getProofDocument({ shopId, proofId }))!;
    expect(after.proof.version).toBe(last.version);
    expect(toEditorDoc(after)).toEqual(last.doc);
  });

  it("still checks who is saving: production and people from no shop are refused", async () => {
    const current = (await getProofDocument({ shopId, proofId }))!;
    const doc = toEditorDoc(current);
    const version = current.proof.version;
    const press = await person("press@chalkline.test");
    expect(await saveAs(press, version, moved(doc, 1))).toMatchObject({ ok: false, kind: "denied" });
    const stranger: SessionUser = { id: "no-such-user", email: "nobody@elsewhere.test", name: null };
    expect(await saveAs(stranger, version, moved(doc, 1))).toMatchObject({ ok: false, kind: "denied" });
    expect((await getProofDocument({ shopId, proofId }))!.proof.version).toBe(version);
  });

  it("waits for an approval being recorded, then starts the next revision instead of editing the approved one", async () => {
    const owner = await person("owner@chalkline.test");
    const current = (await getProofDocument({ shopId, proofId }))!;
    const letter = current.proof.revision;
    const sent = await sendRevision({ document: current, userId: owner.id });
    expect(sent).toMatchObject({ letter, state: "open" });

    // A second connection plays the approval: it holds the revision row while it decides.
    const approval = new Client({ connectionString: process.env.DATABASE_URL });
    await approval.connect();
    try {
      await approval.query("begin");
      await approval.query("select id from proof_revisions where proof_id = $1 and letter = $2 for update", [proofId, letter]);
      let settled = false;
      const save = saveProof({
        shopId,
        proofId,
        baseVersion: current.proof.version,
        ...toEditorDoc(current),
        placements: moved(toEditorDoc(current), 2.25).placements,
        userId: owner.id,
      }).finally(() => {
        settled = true;
      });
      await pause(300);
      expect(settled).toBe(false);
      await approval.query("update proof_revisions set state = 'approved' where proof_id = $1 and letter = $2", [proofId, letter]);
      await approval.query("commit");
      const result = await save;
      expect(result.kind).toBe("saved");
      if (result.kind !== "saved") return;
      expect(result.revision).not.toBe(letter);
      const [row] = await db.select({ revision: proofs.revision }).from(proofs).where(and(eq(proofs.id, proofId), eq(proofs.jobId, current.job.id)));
      expect(row!.revision).toBe(result.revision);
    } finally {
      await approval.query("rollback").catch(() => undefined);
      await approval.end();
    }
  });
});
