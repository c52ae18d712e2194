import { describe, expect, it } from "vitest";
import { CATALOG, blanksFor, findBlank, findSizeRow } from "@/lib/garments/catalog";
import { GARMENT_CATEGORIES, isApparelMeasurements, type ApparelMeasurements } from "@/lib/garments/types";
import { apparelMeasurementsSchema, apparelMeasurementsSchemaFor, sizeRowSchemaFor, toteMeasurementsSchema } from "@/lib/garments/schemas";

const M_TEE: ApparelMeasurements = {
  chestWidth: 20,
  bodyLength: 29,
  shoulderWidth: 18,
  sleeveLength: 8.25,
  neckWidth: 7.25,
  frontNeckDrop: 3.5,
  backNeckDrop: 1,
};

function firstMessage(result: { success: boolean; error?: { issues: { message: string }[] } }): string {
  return result.error?.issues[0]?.message ?? "";
}

describe("measurement schemas", () => {
  it("accept a typical adult M tee", () => {
    expect(apparelMeasurementsSchema.safeParse(M_TEE).success).toBe(true);
  });

  it.each([
    [{ chestWidth: 0 }, "Chest width must be more than 0 in."],
    [{ chestWidth: -4 }, "Chest width must be more than 0 in."],
    [{ chestWidth: 200 }, "Chest width can't be more than 60 in."],
    [{ bodyLength: Number.NaN }, "Body length"],
    [{ sleeveLength: -1 }, "Sleeve length can't be negative; use 0 for sleeveless."],
    [{ frontNeckDrop: 30, bodyLength: 29 }, "Front neck drop can't be more than 15 in."],
    [{ frontNeckDrop: 12, bodyLength: 11, chestWidth: 20 }, "Front neck drop must be less than body length."],
    [{ neckWidth: 19 }, "Neck width must be less than shoulder width."],
    [{ bodyLength: 9 }, "Body length must be at least half the chest width."],
  ])("reject %o with a clear message", (patch, message) => {
    const result = apparelMeasurementsSchema.safeParse({ ...M_TEE, ...patch });
    expect(result.success).toBe(false);
    expect(firstMessage(result)).toContain(message);
  });

  it("need sleeves on a sleeved garment and none on a tank", () => {
    expect(apparelMeasurementsSchemaFor("unisex-tee").safeParse({ ...M_TEE, sleeveLength: 0 }).success).toBe(
      false,
    );
    expect(apparelMeasurementsSchemaFor("tank").safeParse({ ...M_TEE, sleeveLength: 0 }).success).toBe(true);
    const tank = apparelMeasurementsSchemaFor("tank").safeParse(M_TEE);
    expect(firstMessage(tank)).toBe("A tank has no sleeves; set sleeve length to 0.");
  });

  it.each([
    [{ width: 15, height: 16, handleLength: 22, handleWidth: 1, gusset: 0 }, true, ""],
    [
      { width: 15, height: 16, handleLength: 22, handleWidth: 1, gusset: -1 },
      false,
      "Gusset can't be negative",
    ],
    [
      { width: 15, height: 16, handleLength: 22, handleWidth: 5, gusset: 0 },
      false,
      "Handle width can't be more than 4 in.",
    ],
    [
      { width: 15, height: 4, handleLength: 22, handleWidth: 1, gusset: 10 },
      false,
      "Half the gusset must be less than the bag height.",
    ],
  ])("tote %o valid: %s", (tote, ok, message) => {
    const result = toteMeasurementsSchema.safeParse(tote);
    expect(result.success).toBe(ok);
    if (!ok) expect(firstMessage(result)).toContain(message);
  });
});

describe("seed catalog", () => {
  it.each(GARMENT_CATEGORIES.map((c) => [c]))("has at least one %s blank", (category) => {
    expect(blanksFor(category).length).toBeGreaterThan(0);
  });

  it("has unique blank ids and style names", () => {
    expect(new Set(CATALOG.map((b) => b.id)).size).toBe(CATALOG.length);
    expect(new Set(CATALOG.map((b) => b.styleName)).size).toBe(CATALOG.length);
  });

  it.each(CATALOG.map((b) => [b.id, b]))("%s: every size row passes its category's schema", (_id, blank) => {
    const schema = sizeRowSchemaFor(blank.category);
    for (const row of blank.sizes) {
      const result = schema.safeParse(row);
      expect(result.success, `${blank.id} ${row.size}: ${firstMessage(result)}`).toBe(true);
    }
    expect(new Set(blank.sizes.map((r) => r.size)).size).toBe(blank.sizes.length);
  });

  it.each(CATALOG.map((b) => [b.id, b]))("%s: colours have names and #RRGGBB values", (_id, blank) => {
    expect(blank.colors.length).toBeGreaterThanOrEqual(3);
    for (const color of blank.colors) {
      expect(color.name.trim().length).toBeGreaterThan(0);
      expect(color.hex).toMatch(/^#[0-9A-F]{6}$/);
    }
    expect(new Set(blank.colors.map((c) => c.name)).size).toBe(blank.colors.length);
  });

  it.each(CATALOG.filter((b) => b.category !== "tote").map((b) => [b.id, b]))(
    "%s: chest and body length grow with size",
    (_id, blank) => {
      const rows = blank.sizes.map((r) => r.measurements).filter(isApparelMeasurements);
      for (let i = 1; i < rows.length; i++) {
        expect(rows[i]!.chestWidth).toBeGreaterThan(rows[i - 1]!.chestWidth);
        expect(rows[i]!.bodyLength).toBeGreaterThan(rows[i - 1]!.bodyLength);
      }
    },
  );

  it("lists the unisex tee XS to 4XL, chest about 18 at S growing about 2 per size (from memory, approximate)", () => {
    const tee = findBlank("everyday-crew-tee")!;
    expect(tee.sizes.map((r) => r.size)).toEqual(["XS", "S", "M", "L", "XL", "2XL", "3XL", "4XL"]);
    const s = findSizeRow(tee, "S")!.measurements as ApparelMeasurements;
    const xl = findSizeRow(tee, "XL")!.measurements as ApparelMeasurements;
    expect(s.chestWidth).toBeCloseTo(18, 0);
    expect(s.bodyLength).toBeCloseTo(28, 0);
    expect((xl.chestWidth - s.chestWidth) / 3).toBeCloseTo(2, 0);
    expect((xl.bodyLength - s.bodyLength) / 3).toBeCloseTo(1, 0);
  });

  it("covers youth XS to XL (chest about 14 to 19), toddler 2T to 5T and infant NB to 18M", () => {
    const youth = findBlank("schoolyard-tee")!;
    expect(youth.sizes.every((r) => r.group === "youth")).toBe(true);
    const chests = youth.sizes.map((r) => (r.measurements as ApparelMeasurements).chestWidth);
    expect(Math.min(...chests)).toBeCloseTo(14, 0);
    expect(Math.max(...chests)).toBeCloseTo(19, 0);
    const toddler = findBlank("little-steps-tee")!;
    expect(toddler.sizes.map((r) => r.size)).toEqual(["2T", "3T", "4T", "5T"]);
    expect(toddler.sizes.every((r) => r.group === "toddler")).toBe(true);
    const infant = blanksFor("infant-bodysuit")[0]!;
    expect(infant.sizes.map((r) => r.size)).toEqual(["NB", "6M", "12M", "18M"]);
    expect(infant.sizes.every((r) => r.group === "infant")).toBe(true);
  });

  it("has a one-size 15 x 16 in tote", () => {
    const tote = findBlank("market-canvas-tote")!;
    expect(tote.sizes).toHaveLength(1);
    expect(tote.sizes[0]!.measurements).toMatchObject({ width: 15, height: 16 });
  });
});
