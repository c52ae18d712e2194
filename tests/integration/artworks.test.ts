import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { findArtwork, insertUploadedArtwork, listArtworks, replaceArtwork } from "@/db/queries/artworks";
import { placements, proofs } from "@/db/schema";
import { shopFactory } from "@/tests/support/factory";

const shops = shopFactory("artworks");

describe("art versions", () => {
  it("replaces art everywhere it is placed: width stays, height follows the new aspect, the change is noted", async () => {
    const s = await shops.build({ team: ["designer"] });
    const shopId = s.shop.id;
    const userId = s.designer!.id;
    const [tee] = await db.select().from(proofs).where(eq(proofs.id, s.proof.id));
    const [placement] = await db.select().from(placements).where(eq(placements.proofId, tee!.id));
    const oldArt = placement!.artworkId!;
    expect(oldArt).toBe(s.art.id);
    const newId = await insertUploadedArtwork({ shopId, name: "Crest wide", inkWidthPx: 4000, inkHeightPx: 2000, isVector: false, uploadedBy: userId });

    const result = await replaceArtwork({ shopId, oldId: oldArt, newId, userId });
    expect(result).toEqual({ placements: 1, proofs: 1 });
    const [after] = await db.select().from(placements).where(eq(placements.proofId, tee!.id));
    expect(after!.artworkId).toBe(newId);
    expect(after!.widthIn).toBe(placement!.widthIn);
    expect(after!.heightIn).toBeCloseTo(placement!.widthIn / 2, 9);
    const [teeAfter] = await db.select().from(proofs).where(eq(proofs.id, tee!.id));
    expect(teeAfter!.version).toBe(tee!.version + 1);
    const fresh = await findArtwork({ shopId, artworkId: newId });
    expect(fresh!.version).toBe(2);
    expect(fresh!.notes?.join(" ")).toMatch(/kept their width/);
    expect((await listArtworks({ shopId })).some((a) => a.id === oldArt)).toBe(false);
  });

  it("refuses art from another shop and leaves everything as it was", async () => {
    const s = await shops.build();
    const result = await replaceArtwork({ shopId: "not-this-shop", oldId: "a", newId: "b", userId: s.owner.id });
    expect(result).toEqual({ error: "That artwork is not in this shop's library." });
  });
});
