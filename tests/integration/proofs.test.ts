import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { getProofDocument, saveProof } from "@/db/queries/proofs";
import { proofs, shops } from "@/db/schema";
import { proofToJson } from "@/lib/editor/proof-view";
import type { Placement } from "@/lib/placement/model";
import { shopFactory } from "@/tests/support/factory";

const factory = shopFactory("proofs");

/** The demo's tee proof, read only: for the test of what the seed made. */
async function demoTeeProof() {
  const [shop] = await db.select().from(shops).where(eq(shops.slug, "quarry-street-print-co"));
  const [proof] = await db.select().from(proofs).where(and(eq(proofs.shopId, shop!.id), eq(proofs.name, "Team tee")));
  const document = await getProofDocument({ shopId: shop!.id, proofId: proof!.id });
  return { shopId: shop!.id, document: document! };
}

/** A proof of this test's own: the library tee in M, the factory's art on the full front. */
async function ownTeeProof() {
  const s = await factory.build();
  const document = await getProofDocument({ shopId: s.shop.id, proofId: s.proof.id });
  return { shopId: s.shop.id, document: document! };
}

describe("proof persistence", () => {
  it("loads the seeded demo proof with its blank and placement", async () => {
    const { document } = await demoTeeProof();
    expect(document.blank.category).toBe("unisex-tee");
    expect(document.placements).toHaveLength(1);
    expect(document.placements[0]).toMatchObject({ location: "full-front", widthIn: 10, belowCollarIn: 3, offsetFromCenterIn: 0 });
  });

  it("saves with the current version and refuses a stale save without changing anything", async () => {
    const { shopId, document } = await ownTeeProof();
    const base = document.proof.version;
    const moved: Placement[] = document.placements.map((p) => ({ ...p, belowCollarIn: 3.5 }));
    const first = await saveProof({ shopId, proofId: document.proof.id, baseVersion: base, size: "M", colourName: "Chalk", colourHex: "#F4F1EA", placements: moved, userId: document.proof.updatedBy! });
    expect(first).toMatchObject({ kind: "saved", version: base + 1 });

    const stale = await saveProof({ shopId, proofId: document.proof.id, baseVersion: base, size: "L", colourName: "Chalk", colourHex: "#F4F1EA", placements: [], userId: document.proof.updatedBy! });
    expect(stale.kind).toBe("conflict");
    if (stale.kind !== "conflict") return;
    expect(stale.current.proof.version).toBe(base + 1);
    expect(stale.current.proof.size).toBe("M");
    expect(stale.current.placements[0]!.belowCollarIn).toBe(3.5);

    // Saved from the version it now has, the first state goes through again.
    const again = await saveProof({ shopId, proofId: document.proof.id, baseVersion: base + 1, size: "M", colourName: document.proof.colourName, colourHex: document.proof.colourHex, placements: document.placements, userId: document.proof.updatedBy! });
    expect(again.kind).toBe("saved");
  });

  it("never saves into another shop's proof", async () => {
    const { document } = await ownTeeProof();
    const result = await saveProof({ shopId: "some-other-shop", proofId: document.proof.id, baseVersion: document.proof.version, size: "M", colourName: "x", colourHex: "#000000", placements: [], userId: document.proof.updatedBy! });
    expect(result.kind).toBe("missing");
    expect(await getProofDocument({ shopId: "some-other-shop", proofId: document.proof.id })).toBeUndefined();
  });

  it("shapes the JSON for the API with computed warnings per placement", async () => {
    const { document } = await ownTeeProof();
    // Common practice, no published source: adult full front at most 11.25 in wide; art keeps clear of the side seams.
    const wide = { ...document, placements: [{ ...document.placements[0]!, widthIn: 13, heightIn: 13 }] };
    const json = proofToJson(wide);
    expect(json.garment).toMatchObject({ category: "unisex-tee", size: "M" });
    const codes = json.placements[0]!.warnings.map((w) => w.code);
    expect(codes).toContain("too-wide");
    expect(codes).toContain("seam-clearance");
    const fine = proofToJson({ ...document, placements: [{ ...document.placements[0]!, widthIn: 11, heightIn: 11, belowCollarIn: 3, offsetFromCenterIn: 0, rotationDeg: 0 }] });
    expect(fine.placements[0]!.warnings).toEqual([]);
    expect(Object.keys(fine.placements[0]!)).toEqual(expect.arrayContaining(["widthIn", "heightIn", "offsetFromCenterIn", "belowCollarIn", "rotationDeg", "warnings"]));
  });
});
