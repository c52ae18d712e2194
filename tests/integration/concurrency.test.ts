import { AsyncLocalStorage } from "node:async_hooks";
import { randomInt } from "node:crypto";
import { and, eq, sql } from "drizzle-orm";
import { Client } from "pg";
import { beforeAll, describe, expect, it, vi } from "vitest";
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
const { makeProof } = await import("@/app/_server/proof-make");
const { db } = await import("@/db/client");
const { getProofDocument, saveProof } = await import("@/db/queries/proofs");
const { sendRevision } = await import("@/db/queries/review");
const { proofs } = await import("@/db/schema");
const { toEditorDoc } = await import("@/lib/editor/from-server");
const { shopFactory } = await import("@/tests/support/factory");
const { noteOnFailure } = await import("@/tests/support/failure-notes");
const { Arrivals, waitUntil } = await import("@/tests/support/wait");
type ProofDoc = import("@/lib/editor/document").ProofDoc;
type BuiltShop = import("@/tests/support/factory").BuiltShop;

const shops = shopFactory("concurrency");
let s: BuiltShop;

/**
 * How the two editors interleave is drawn from this seed (printed with any failure; repeat it with
 * INTERLEAVE_SEED=n): before each save an editor may wait until the other has finished a given
 * number of saves, so runs mix saves in flight together with saves one after the other.
 */
const INTERLEAVE_SEED = Number(process.env.INTERLEAVE_SEED ?? randomInt(1, 2 ** 31));
noteOnFailure("interleaving seed", `${INTERLEAVE_SEED} (repeat with INTERLEAVE_SEED=${INTERLEAVE_SEED})`);

/** A small seeded generator (mulberry32): the same seed, the same schedule. */
function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const who = (person: { id: string; email: string; name: string }): SessionUser => ({ id: person.id, email: person.email, name: person.name });

beforeAll(async () => {
  s = await shops.build({ team: ["designer", "production"] });
});

let proofCount = 0;

/** A proof of the test's own, made from the file's job as the designer would make it. */
async function newProof(): Promise<string> {
  proofCount += 1;
  const made = await makeProof({ shopId: s.shop.id, userId: s.designer!.id, jobId: s.job.id, name: `Concurrency check ${s.tag}-${proofCount}`, blankId: null, colourName: null, art: [{ location: "full-front", artworkId: s.art.id }] });
  if (!made.ok) throw new Error(made.error);
  return made.proofId;
}

async function saveAs(user: SessionUser, proofId: string, baseVersion: number, doc: ProofDoc) {
  return session.run(user, () => saveProofAction({ shopSlug: s.shop.slug, proofId, baseVersion, doc }));
}

function moved(doc: ProofDoc, belowCollarIn: number): ProofDoc {
  return { ...doc, placements: doc.placements.map((p, i) => (i === 0 ? { ...p, belowCollarIn } : p)) };
}

describe("two sessions saving one proof at once", () => {
  it("keeps every acknowledged save, refuses stale ones with the conflict message, and ends on the last one", async () => {
    const owner = who(s.owner);
    const designer = who(s.designer!);
    const proofId = await newProof();
    const start = (await getProofDocument({ shopId: s.shop.id, proofId }))!;
    const startVersion = start.proof.version;

    type Ack = { by: string; version: number; doc: ProofDoc };
    const acks: Ack[] = [];
    const refusals: Array<{ by: string; baseVersion: number; version: number; doc: ProofDoc }> = [];
    const SAVES_EACH = 50;

    // How far each editor may run ahead of the other before its next save: 0 waits until the other
    // has finished as many saves, 3 hardly ever waits. Drawn per step from the interleaving seed.
    const draw = seeded(INTERLEAVE_SEED);
    const lead = [1, 2].map(() => Array.from({ length: SAVES_EACH }, () => Math.floor(draw() * 4)));
    const finished = [0, 0];
    const progress = new Arrivals<{ lane: number; done: number }>();

    // Each session is an editor: it holds the version it last saw, saves its own edit on top, and
    // when refused takes the latest from the server ("Load the latest") before its next edit.
    async function editor(user: SessionUser, lane: 1 | 2) {
      const other = lane === 1 ? 1 : 0;
      let version = startVersion;
      let doc = toEditorDoc(start);
      for (let i = 0; i < SAVES_EACH; i += 1) {
        const ahead = lead[lane - 1]![i]!;
        // Never a deadlock: an editor waits only while the other has done fewer saves than it has,
        // so the two can never both be waiting. On the first step neither waits: both save at once.
        const target = i - ahead;
        if (finished[other]! < target) await progress.next(`editor ${lane} to see editor ${other + 1} finish ${target} saves`, (p) => p.lane === other + 1 && p.done >= target);
        // Distinct values per session and step, so every saved state can be told apart.
        const next = moved(doc, lane * 10 + i / 8);
        const result = await saveAs(user, proofId, version, next);
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
        finished[lane - 1] = i + 1;
        progress.push({ lane, done: i + 1 });
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
    const final = (await getProofDocument({ shopId: s.shop.id, proofId }))!;
    expect(final.proof.version).toBe(last.version);
    expect(toEditorDoc(final)).toEqual(last.doc);

    // A save from the very first version is refused and changes nothing.
    const stale = await saveAs(owner, proofId, startVersion, moved(toEditorDoc(start), 0.5));
    expect(stale).toMatchObject({ ok: false, kind: "conflict", message: CONFLICT_MESSAGE, version: last.version });
    const after = (await getProofDocument({ shopId: s.shop.id, proofId }))!;
    expect(after.proof.version).toBe(last.version);
    expect(toEditorDoc(after)).toEqual(last.doc);
  });

  it("still checks who is saving: production and people from no shop are refused", async () => {
    const proofId = await newProof();
    const current = (await getProofDocument({ shopId: s.shop.id, proofId }))!;
    const doc = toEditorDoc(current);
    const version = current.proof.version;
    const press = who(s.production!);
    expect(await saveAs(press, proofId, version, moved(doc, 1))).toMatchObject({ ok: false, kind: "denied" });
    const stranger: SessionUser = { id: "no-such-user", email: "nobody@elsewhere.test", name: null };
    expect(await saveAs(stranger, proofId, version, moved(doc, 1))).toMatchObject({ ok: false, kind: "denied" });
    expect((await getProofDocument({ shopId: s.shop.id, proofId }))!.proof.version).toBe(version);
  });

  it("waits for an approval being recorded, then starts the next revision instead of editing the approved one", async () => {
    const owner = who(s.owner);
    const proofId = await newProof();
    const current = (await getProofDocument({ shopId: s.shop.id, proofId }))!;
    const letter = current.proof.revision;
    const sent = await sendRevision({ document: current, userId: owner.id });
    expect(sent).toMatchObject({ letter, state: "open" });

    // A second connection plays the approval: it holds the revision row while it decides.
    const approval = new Client({ connectionString: process.env.DATABASE_URL });
    await approval.connect();
    try {
      const [{ pid }] = (await approval.query<{ pid: number }>("select pg_backend_pid() as pid")).rows as [{ pid: number }];
      await approval.query("begin");
      await approval.query("select id from proof_revisions where proof_id = $1 and letter = $2 for update", [proofId, letter]);
      let settled = false;
      const save = saveProof({
        shopId: s.shop.id,
        proofId,
        baseVersion: current.proof.version,
        ...toEditorDoc(current),
        placements: moved(toEditorDoc(current), 2.25).placements,
        userId: owner.id,
      }).finally(() => {
        settled = true;
      });
      // The save is held at the approval's row lock: its session waits on the approval's (or, were
      // it not held, it would settle, and the next line says so).
      await waitUntil("the save to wait on the approval's lock", async () => {
        if (settled) return true;
        const blocked = await db.execute<{ pid: number }>(sql`select pid from pg_stat_activity where ${pid}::int = any(pg_blocking_pids(pid))`);
        return blocked.rows.length > 0;
      });
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
