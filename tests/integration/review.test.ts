import { and, eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { getProofDocument, saveProof } from "@/db/queries/proofs";
import { createShareLink, hashShareToken, lookupShareToken, recordDecision, revokeShareLink, sendRevision } from "@/db/queries/review";
import { proofRevisions, proofs, shareLinks } from "@/db/schema";
import { shopFactory } from "@/tests/support/factory";
import { waitUntil } from "@/tests/support/wait";

const shops = shopFactory("review");

/** A shop of this test's own, with its proof unsent; the owner acts. */
async function ownProof() {
  const s = await shops.build();
  const document = (await getProofDocument({ shopId: s.shop.id, proofId: s.proof.id }))!;
  return { shopId: s.shop.id, userId: s.owner.id, document };
}

const decision = (proofId: string, letter: string, kind: "approved" | "changes-requested" = "approved") => ({
  proofId,
  letter,
  decision: kind,
  fullName: "Wren Adeyemi",
  statement: "checked",
  comment: kind === "approved" ? null : "Make it bigger",
  ip: "127.0.0.1",
  userAgent: "test",
  shareLinkId: null,
  userId: null,
});

describe("share links", () => {
  it("stores only a hash of a 256-bit token, and tells expired and withdrawn links apart from missing ones", async () => {
    const { shopId, userId, document } = await ownProof();
    const { token, link } = await createShareLink({ shopId, proofId: document.proof.id, permission: "comment", expiresAt: null, recipientEmail: null, recipientName: null, createdBy: userId });
    expect(Buffer.from(token, "base64url").length).toBe(32);
    const [row] = await db.select().from(shareLinks).where(eq(shareLinks.id, link.id));
    expect(row!.tokenHash).toBe(hashShareToken(token));
    expect(JSON.stringify(row)).not.toContain(token);
    expect((await lookupShareToken(token)).state).toBe("ok");
    expect((await lookupShareToken(`${token.slice(0, -1)}x`)).state).toBe("missing");

    await revokeShareLink({ shopId, linkId: link.id, userId });
    expect((await lookupShareToken(token)).state).toBe("revoked");

    const expired = await createShareLink({ shopId, proofId: document.proof.id, permission: "view", expiresAt: new Date(Date.now() - 1000), recipientEmail: null, recipientName: null, createdBy: userId });
    expect((await lookupShareToken(expired.token)).state).toBe("expired");
  });
});

describe("approval", () => {
  it("approves one revision once, locks it, and starts the next letter on the next edit", async () => {
    const { shopId, userId, document } = await ownProof();
    const revision = await sendRevision({ document, userId });
    const first = await recordDecision(decision(document.proof.id, revision.letter));
    expect(first.ok).toBe(true);
    expect(await recordDecision(decision(document.proof.id, revision.letter))).toEqual({ ok: false, message: `Revision ${revision.letter} is already approved.` });

    const fresh = (await getProofDocument({ shopId, proofId: document.proof.id }))!;
    const saved = await saveProof({ shopId, proofId: fresh.proof.id, baseVersion: fresh.proof.version, size: fresh.proof.size, colourName: fresh.proof.colourName, colourHex: fresh.proof.colourHex, placements: fresh.placements, userId });
    expect(saved.kind === "saved" && saved.revision).toBe("B");
    // Sharing again never reopens the approved snapshot.
    const again = await sendRevision({ document: fresh, userId });
    expect(again.state).toBe("approved");
  });

  it("refuses a decision on a revision that has been replaced", async () => {
    const { shopId, userId, document } = await ownProof();
    const a = await sendRevision({ document, userId });
    await recordDecision(decision(document.proof.id, a.letter, "changes-requested"));
    await db.update(proofs).set({ revision: "Z" }).where(eq(proofs.id, document.proof.id));
    const moved = (await getProofDocument({ shopId, proofId: document.proof.id }))!;
    // Revisions are ordered by when they were sent: Z must be sent after A, by the database's clock.
    await waitUntil("the database clock to pass revision A's send time", async () => {
      const [row] = await db
        .select({ past: sql<boolean>`clock_timestamp() > ${proofRevisions.sentAt}` })
        .from(proofRevisions)
        .where(and(eq(proofRevisions.proofId, document.proof.id), eq(proofRevisions.letter, a.letter)));
      return row?.past === true;
    });
    await sendRevision({ document: moved, userId });
    const stale = await recordDecision(decision(document.proof.id, a.letter));
    expect(stale).toEqual({ ok: false, message: `Revision ${a.letter} has been replaced by revision Z. Look at the newest one first.` });
  });
});
