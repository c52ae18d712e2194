import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { blankFormSchemaFor, fieldErrorsOf } from "@/components/blanks/blank-form";
import { db } from "@/db/client";
import { libraryBlankId } from "@/db/library";
import { duplicateBlank, findBlank, listBlankCopies, listBlanks, updateBlank } from "@/db/queries/blanks";
import { blanks, type Blank, type BlankSizeRow } from "@/db/schema";
import type { ApparelMeasurements } from "@/lib/garments/types";
import { shopFactory } from "@/tests/support/factory";

const CREW_TEE = libraryBlankId("everyday-crew-tee");
const shops = shopFactory("blanks");

/** Our shop and another one, both made for this file. */
let ourShopId: string;
let otherShopId: string;

beforeAll(async () => {
  ourShopId = (await shops.build()).shop.id;
  otherShopId = (await shops.build()).shop.id;
});

async function rawBlank(id: string): Promise<Blank> {
  const [row] = await db.select().from(blanks).where(eq(blanks.id, id));
  return row!;
}

/** The chart with one measurement of one size changed. */
function withMeasurement(
  chart: BlankSizeRow[],
  size: string,
  key: keyof ApparelMeasurements,
  value: number,
): BlankSizeRow[] {
  return chart.map((row) =>
    row.size === size
      ? { ...row, measurements: { ...(row.measurements as ApparelMeasurements), [key]: value } }
      : row,
  );
}

function chestOf(blank: Blank, size: string): number | undefined {
  const row = blank.sizeChart.find((r) => r.size === size);
  return row ? (row.measurements as ApparelMeasurements).chestWidth : undefined;
}

describe("library blanks", () => {
  it("are seeded, shared and listed for every shop", async () => {
    const library = await rawBlank(CREW_TEE);
    expect(library.shopId).toBeNull();
    expect(library.name).toBe("Everyday Crew Tee");
    const [ourList, otherList] = await Promise.all([
      listBlanks({ shopId: ourShopId }),
      listBlanks({ shopId: otherShopId }),
    ]);
    expect(ourList.map((b) => b.id)).toContain(CREW_TEE);
    expect(otherList.map((b) => b.id)).toContain(CREW_TEE);
  });
});

describe("duplicateBlank", () => {
  it("creates a shop-owned copy with the same chart and colours, pointing back at its source", async () => {
    const library = await rawBlank(CREW_TEE);
    const copy = await duplicateBlank({ shopId: ourShopId, blankId: CREW_TEE });
    expect(copy).toBeDefined();
    expect(copy!.id).not.toBe(CREW_TEE);
    expect(copy!.shopId).toBe(ourShopId);
    expect(copy!.sourceBlankId).toBe(CREW_TEE);
    expect(copy!.category).toBe(library.category);
    expect(copy!.name).toContain(library.name);
    expect(copy!.sizeChart).toEqual(library.sizeChart);
    expect(copy!.colours).toEqual(library.colours);
    expect(
      (await listBlankCopies({ shopId: ourShopId, sourceBlankId: CREW_TEE })).map((b) => b.id),
    ).toContain(copy!.id);
    expect(
      (await listBlankCopies({ shopId: otherShopId, sourceBlankId: CREW_TEE })).map((b) => b.id),
    ).not.toContain(copy!.id);
  });

  it("refuses to copy another shop's blank", async () => {
    const theirs = await duplicateBlank({ shopId: otherShopId, blankId: CREW_TEE });
    expect(await duplicateBlank({ shopId: ourShopId, blankId: theirs!.id })).toBeUndefined();
  });
});

describe("updateBlank", () => {
  it("changes the shop's own copy and leaves the library blank as it was", async () => {
    const copy = (await duplicateBlank({ shopId: ourShopId, blankId: CREW_TEE }))!;
    const sizeChart = withMeasurement(copy.sizeChart, "M", "chestWidth", 20.5);
    const colours = [...copy.colours, { name: "Signal Orange", hex: "#D9622B" }];
    const updated = await updateBlank({
      shopId: ourShopId,
      blankId: copy.id,
      name: "Crew tee, supplier chart",
      description: null,
      colours,
      sizeChart,
    });
    expect(updated).toBeDefined();
    expect(updated!.name).toBe("Crew tee, supplier chart");
    expect(updated!.description).toBeNull();
    expect(chestOf(updated!, "M")).toBe(20.5);
    expect(updated!.updatedAt.getTime()).toBeGreaterThanOrEqual(copy.updatedAt.getTime());

    const reread = (await findBlank({ shopId: ourShopId, blankId: copy.id }))!;
    expect(chestOf(reread, "M")).toBe(20.5);
    expect(reread.colours.at(-1)).toEqual({ name: "Signal Orange", hex: "#D9622B" });
    // Only the one number moved.
    expect(withMeasurement(reread.sizeChart, "M", "chestWidth", 20)).toEqual(
      (await rawBlank(CREW_TEE)).sizeChart,
    );
    expect(chestOf(await rawBlank(CREW_TEE), "M")).toBe(20);
  });

  it("changes nothing and returns undefined for a library blank", async () => {
    const before = await rawBlank(CREW_TEE);
    const result = await updateBlank({
      shopId: ourShopId,
      blankId: CREW_TEE,
      name: "Hijacked",
      description: "no",
      colours: [{ name: "Nope", hex: "#000000" }],
      sizeChart: withMeasurement(before.sizeChart, "M", "chestWidth", 99),
    });
    expect(result).toBeUndefined();
    const after = await rawBlank(CREW_TEE);
    expect(after.name).toBe(before.name);
    expect(after.colours).toEqual(before.colours);
    expect(after.sizeChart).toEqual(before.sizeChart);
    expect(after.updatedAt.getTime()).toBe(before.updatedAt.getTime());
  });

  it("changes nothing and returns undefined for another shop's blank", async () => {
    const theirs = (await duplicateBlank({ shopId: otherShopId, blankId: CREW_TEE }))!;
    const result = await updateBlank({
      shopId: ourShopId,
      blankId: theirs.id,
      name: "Taken over",
      description: null,
      colours: theirs.colours,
      sizeChart: withMeasurement(theirs.sizeChart, "M", "chestWidth", 30),
    });
    expect(result).toBeUndefined();
    const after = await rawBlank(theirs.id);
    expect(after.name).toBe(theirs.name);
    expect(after.shopId).toBe(otherShopId);
    expect(chestOf(after, "M")).toBe(20);
  });
});

describe("findBlank and listBlanks", () => {
  it("hide another shop's blank and show a shop its own", async () => {
    const theirs = (await duplicateBlank({ shopId: otherShopId, blankId: CREW_TEE }))!;
    expect(await findBlank({ shopId: ourShopId, blankId: theirs.id })).toBeUndefined();
    expect((await findBlank({ shopId: otherShopId, blankId: theirs.id }))?.id).toBe(theirs.id);
    expect((await listBlanks({ shopId: ourShopId })).map((b) => b.id)).not.toContain(theirs.id);
    expect((await listBlanks({ shopId: otherShopId })).map((b) => b.id)).toContain(theirs.id);
    expect(await findBlank({ shopId: ourShopId, blankId: "no-such-blank" })).toBeUndefined();
  });
});

describe("the chart schema shared by the editor and the server action", () => {
  async function formValues() {
    const library = await rawBlank(CREW_TEE);
    return {
      name: library.name,
      description: library.description ?? "",
      colours: library.colours,
      sizes: library.sizeChart.map((row) => ({
        ...row,
        measurements: { ...(row.measurements as ApparelMeasurements) },
      })),
    };
  }

  it("accepts the library chart as it is", async () => {
    expect(blankFormSchemaFor("unisex-tee").safeParse(await formValues()).success).toBe(true);
  });

  it("refuses negative and missing numbers at the exact cell, with words a person can act on", async () => {
    const values = await formValues();
    values.sizes[2]!.measurements.chestWidth = -3;
    values.sizes[3]!.measurements.bodyLength = Number.NaN;
    const result = blankFormSchemaFor("unisex-tee").safeParse(values);
    expect(result.success).toBe(false);
    const errors = fieldErrorsOf(result.error!);
    expect(errors["sizes.2.measurements.chestWidth"]).toEqual(["Chest width must be more than 0 in."]);
    expect(errors["sizes.3.measurements.bodyLength"]).toEqual(["Body length must be a number of inches."]);
    // A bad number does not set off comparisons with its neighbours.
    expect(Object.keys(errors)).toHaveLength(2);
  });

  it("refuses repeated size names, an empty chart, no colours and a malformed hex", async () => {
    const values = await formValues();
    values.sizes[4]!.size = " m ";
    values.colours = [{ name: "Chalk", hex: "F4F1EA" }];
    const errors = fieldErrorsOf(blankFormSchemaFor("unisex-tee").safeParse(values).error!);
    expect(errors["sizes.4.size"]).toEqual(["Size m is listed twice."]);
    expect(errors["colours.0.hex"]).toEqual(["Use a six-digit hex colour such as #1F2023."]);

    const empty = fieldErrorsOf(
      blankFormSchemaFor("unisex-tee").safeParse({ ...values, sizes: [], colours: [] }).error!,
    );
    expect(empty.sizes).toEqual(["Add at least one size."]);
    expect(empty.colours).toEqual(["Add at least one colour."]);
  });
});
