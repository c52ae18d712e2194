import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { findArtwork, insertUploadedArtwork, listArtworks, replaceArtwork } from "@/db/queries/artworks";
import { artworks, placements, proofs, shops, users } from "@/db/schema";

async function demo() {
  const [shop] = await db.select().from(shops).where(eq(shops.slug, "quarry-street-print-co"));
  const [user] = await db.select().from(users).where(eq(users.email, "designer@chalkline.test"));
  return { shopId: shop!.id, userId: user!.id };
}

describe("art versions", () => {
  it("replaces art everywhere it is placed: width stays, height follows the new aspect, the change is noted", async () => {
    const { shopId, userId } = await demo();
    const [tee] = await db.select().from(proofs).where(eq(proofs.name, "Team tee"));
    const [placement] = await db.select().from(placements).where(eq(placements.proofId, tee!.id));
    const oldArt = placement!.artworkId!;
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

    // Put the demo back as it was for later tests.
    await db.update(placements).set({ artworkId: oldArt, heightIn: placement!.heightIn }).where(eq(placements.id, placement!.id));
    await db.update(artworks).set({ replacedById: null }).where(eq(artworks.id, oldArt));
    await db.delete(artworks).where(eq(artworks.id, newId));
  });

  it("refuses art from another shop and leaves everything as it was", async () => {
    const { userId } = await demo();
    const result = await replaceArtwork({ shopId: "not-this-shop", oldId: "a", newId: "b", userId });
    expect(result).toEqual({ error: "That artwork is not in this shop's library." });
  });
});
