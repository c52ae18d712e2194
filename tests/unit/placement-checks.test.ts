import { describe, expect, it } from "vitest";
import { CATALOG, findBlank, findSizeRow } from "@/lib/garments/catalog";
import { locationSpec, locationsFor, type PrintLocation } from "@/lib/garments/locations";
import { buildSilhouette, minEdgeBetween } from "@/lib/garments/silhouette";
import type {
  ApparelMeasurements,
  GarmentCategory,
  GarmentMeasurements,
  SizeGroup,
} from "@/lib/garments/types";
import { checkAcrossSizes, checkPlacement, type PlacementWarning } from "@/lib/placement/checks";
import { defaultPlacement, type Placement } from "@/lib/placement/model";
import { formatLength } from "@/lib/units";

// Thresholds the checks must keep, written here rather than imported from the code they test.
// Trade values (common practice, no published source):
/** An adult full front starts 3 to 3.5 in below the collar seam; the product's default is 3 in. */
const FULL_FRONT_TOP_IN = 3;
/** An adult tee's full front takes at most about 11.25 in across and 14 in down. */
const ADULT_FULL_FRONT_MAX = { widthIn: 11.25, heightIn: 14 };
/** Keep art this far inside the side seam and the armhole seam on adults. */
const SIDE_SEAM_CLEARANCE_IN = 2;
/** Keep art this far below the collar seam. */
const COLLAR_CLEARANCE_IN = 0.5;
/** Keep art this far above the hem stitching, a rib band or a leg opening. */
const HEM_CLEARANCE_IN = 1;
/** Keep hoodie front art this far above the pouch pocket. */
const POCKET_CLEARANCE_IN = 1;
/**
 * Limits are judged at the precision a message shows them: inches to the nearest 1/8 in, centimetres
 * to 0.1 cm (Chalkline's own formatLength). So 11.3 in reads 11 1/4 in and is within 11 1/4 in.
 */
const EIGHTH_IN = 0.125;
// Margins of the product's own (Chalkline defaults, no published source):
/** How far the top of the art may stray from a location's usual top before the check says so. */
const TOP_TOLERANCE_IN = 1.5;
/** Centered art nudged by less than this (one eighth of an inch) looks like a slip. */
const SLIGHT_OFFSET_IN = 0.125;
/** Art turned by less than this many degrees looks crooked rather than angled. */
const SLIGHT_TILT_DEG = 2;

interface Garment {
  category: GarmentCategory;
  group: SizeGroup;
  measurements: GarmentMeasurements;
  size: string;
}

function garment(blankId: string, size: string): Garment {
  const blank = findBlank(blankId)!;
  const row = findSizeRow(blank, size)!;
  return { category: blank.category, group: row.group, measurements: row.measurements, size: row.size };
}

const TEE_M = garment("everyday-crew-tee", "M");

function art(patch: Partial<Placement> = {}): Placement {
  return {
    id: "art",
    location: "full-front",
    artworkId: null,
    widthIn: 11,
    heightIn: 11,
    offsetFromCenterIn: 0,
    belowCollarIn: FULL_FRONT_TOP_IN,
    rotationDeg: 0,
    ...patch,
  };
}

function check(
  placement: Placement,
  g: Garment = TEE_M,
  extra: Partial<Parameters<typeof checkPlacement>[0]> = {},
) {
  return checkPlacement({ placement, ...g, ...extra });
}

function codes(warnings: PlacementWarning[]): string[] {
  return warnings.map((w) => w.code);
}

function find(warnings: PlacementWarning[], code: string): PlacementWarning {
  const w = warnings.find((x) => x.code === code);
  if (!w) throw new Error(`expected ${code}, got ${codes(warnings).join(", ") || "none"}`);
  return w;
}

function specFor(g: Garment, location: PrintLocation) {
  return locationSpec({ location, category: g.category, group: g.group, measurements: g.measurements });
}

describe("acceptance: adult M unisex tee full front (common practice, no published source)", () => {
  it.each([
    [13, 10],
    [13, 13],
  ])(
    "%d x %d in, 3 in below the collar, centered: over the maximum and too close to the seam",
    (widthIn, heightIn) => {
      const warnings = check(art({ widthIn, heightIn }));
      const wide = find(warnings, "too-wide");
      const seam = find(warnings, "seam-clearance");
      expect(wide.severity).toBe("warning");
      expect(seam.severity).toBe("warning");
      expect(wide.message).toBe("The art is 13 in wide; a full front on size M takes at most 11 1/4 in.");
      expect(seam.details?.minClearanceIn).toBe(SIDE_SEAM_CLEARANCE_IN);
    },
  );

  it("11 x 11 in, 3 in below the collar, offset 0, rotation 0: no warnings", () => {
    expect(check(art())).toEqual([]);
  });
});

describe("plain words for art over a seam", () => {
  it("says how far the art runs over the seam, not a negative clearance", () => {
    const chest = (TEE_M.measurements as ApparelMeasurements).chestWidth;
    // 5/4 in wider than the chest: 5/8 in over each side seam when centred (geometry of the test itself).
    const seam = find(check(art({ widthIn: chest + 1.25, heightIn: 6, belowCollarIn: 10 })), "seam-clearance");
    expect(seam.severity).toBe("error");
    expect(seam.message).toMatch(/^The art runs 5\/8 in over the side seam on size M; keep it at least \d[\d /]* in inside the seam\.$/);
    expect(seam.message).not.toMatch(/clearance|-\d/);
  });
});

describe("each threshold at its edge (values written above, with their sources)", () => {
  const sil = buildSilhouette(TEE_M.category, TEE_M.measurements, "front");
  const chest = (TEE_M.measurements as ApparelMeasurements).chestWidth;
  // Below the underarm the body edge of the tee is straight at half the chest width, so art w wide
  // and centered there clears the side seam by chest / 2 − w / 2.
  const belowUnderarm = sil.chestLineY + 1;
  it.each([
    {
      name: "full front exactly 11.25 in wide",
      patch: { widthIn: ADULT_FULL_FRONT_MAX.widthIn },
      code: "too-wide",
      flagged: false,
    },
    {
      name: "full front 11.3 in wide, which reads 11 1/4 in",
      patch: { widthIn: ADULT_FULL_FRONT_MAX.widthIn + 0.05 },
      code: "too-wide",
      flagged: false,
    },
    {
      name: "full front 11.32 in wide, which reads 11 3/8 in",
      patch: { widthIn: ADULT_FULL_FRONT_MAX.widthIn + 0.07 },
      code: "too-wide",
      flagged: true,
      details: { maxWidthIn: ADULT_FULL_FRONT_MAX.widthIn },
    },
    {
      name: "full front exactly 14 in tall",
      patch: { heightIn: ADULT_FULL_FRONT_MAX.heightIn },
      code: "too-tall",
      flagged: false,
    },
    {
      name: "full front 14.06 in tall, which reads 14 in",
      patch: { heightIn: ADULT_FULL_FRONT_MAX.heightIn + 0.06 },
      code: "too-tall",
      flagged: false,
    },
    {
      name: "full front 14.07 in tall, which reads 14 1/8 in",
      patch: { heightIn: ADULT_FULL_FRONT_MAX.heightIn + 0.07 },
      code: "too-tall",
      flagged: true,
      details: { maxHeightIn: ADULT_FULL_FRONT_MAX.heightIn },
    },
    {
      name: "art exactly 2 in inside the side seams",
      patch: { widthIn: chest - 2 * SIDE_SEAM_CLEARANCE_IN, heightIn: 4, belowCollarIn: belowUnderarm },
      code: "seam-clearance",
      flagged: false,
    },
    {
      name: "art 1.95 in inside the side seams, which reads 2 in",
      patch: {
        widthIn: chest - 2 * (SIDE_SEAM_CLEARANCE_IN - 0.05),
        heightIn: 4,
        belowCollarIn: belowUnderarm,
      },
      code: "seam-clearance",
      flagged: false,
    },
    {
      name: "art 1.9 in inside the side seams, which reads 1 7/8 in",
      patch: {
        widthIn: chest - 2 * (SIDE_SEAM_CLEARANCE_IN - 0.1),
        heightIn: 4,
        belowCollarIn: belowUnderarm,
      },
      code: "seam-clearance",
      flagged: true,
      details: { minClearanceIn: SIDE_SEAM_CLEARANCE_IN, clearanceIn: SIDE_SEAM_CLEARANCE_IN - 0.1 },
    },
    {
      name: "art top exactly 1/2 in below the collar seam",
      patch: { widthIn: 4, heightIn: 4, belowCollarIn: COLLAR_CLEARANCE_IN },
      code: "collar-clearance",
      flagged: false,
    },
    {
      name: "art top 0.45 in below the collar seam, which reads 1/2 in",
      patch: { widthIn: 4, heightIn: 4, belowCollarIn: COLLAR_CLEARANCE_IN - 0.05 },
      code: "collar-clearance",
      flagged: false,
    },
    {
      name: "art top 0.4 in below the collar seam, which reads 3/8 in",
      patch: { widthIn: 4, heightIn: 4, belowCollarIn: COLLAR_CLEARANCE_IN - 0.1 },
      code: "collar-clearance",
      flagged: true,
      details: { minClearanceIn: COLLAR_CLEARANCE_IN, clearanceIn: COLLAR_CLEARANCE_IN - 0.1 },
    },
    {
      name: "art ending exactly 1 in above the hem",
      patch: { widthIn: 8, heightIn: 6, belowCollarIn: sil.hemY - 6 - HEM_CLEARANCE_IN },
      code: "hem-clearance",
      flagged: false,
    },
    {
      name: "art ending 0.95 in above the hem, which reads 1 in",
      patch: { widthIn: 8, heightIn: 6, belowCollarIn: sil.hemY - 6 - (HEM_CLEARANCE_IN - 0.05) },
      code: "hem-clearance",
      flagged: false,
    },
    {
      name: "art ending 0.9 in above the hem, which reads 7/8 in",
      patch: { widthIn: 8, heightIn: 6, belowCollarIn: sil.hemY - 6 - (HEM_CLEARANCE_IN - 0.1) },
      code: "hem-clearance",
      flagged: true,
      details: { minClearanceIn: HEM_CLEARANCE_IN, clearanceIn: HEM_CLEARANCE_IN - 0.1 },
    },
    {
      name: "top 1.55 in above the usual 3 in, which reads 1 1/2 in",
      patch: { heightIn: 8, belowCollarIn: FULL_FRONT_TOP_IN - TOP_TOLERANCE_IN - 0.05 },
      code: "top-too-high",
      flagged: false,
    },
    {
      name: "top 1.6 in above the usual 3 in, which reads 1 3/8 in below the collar",
      patch: { heightIn: 8, belowCollarIn: FULL_FRONT_TOP_IN - TOP_TOLERANCE_IN - 0.1 },
      code: "top-too-high",
      flagged: true,
    },
    {
      name: "top exactly 1.5 in above the usual 3 in",
      patch: { heightIn: 8, belowCollarIn: FULL_FRONT_TOP_IN - TOP_TOLERANCE_IN },
      code: "top-too-high",
      flagged: false,
    },
    {
      name: "top exactly 1.5 in below the usual 3 in",
      patch: { heightIn: 8, belowCollarIn: FULL_FRONT_TOP_IN + TOP_TOLERANCE_IN },
      code: "top-too-low",
      flagged: false,
    },
    {
      name: "centered art 0.12 in off center",
      patch: { offsetFromCenterIn: SLIGHT_OFFSET_IN - 0.005 },
      code: "slightly-off-center",
      flagged: true,
      details: { thresholdIn: SLIGHT_OFFSET_IN },
    },
    {
      name: "art turned 1.99°",
      patch: { widthIn: 6, heightIn: 6, rotationDeg: SLIGHT_TILT_DEG - 0.01 },
      code: "slight-tilt",
      flagged: true,
      details: { thresholdDeg: SLIGHT_TILT_DEG },
    },
  ])("$name: $code flagged $flagged", ({ patch, code, flagged, details }) => {
    const warnings = check(art(patch));
    expect(codes(warnings).includes(code), codes(warnings).join(", ") || "no warnings").toBe(flagged);
    if (!details) return;
    const found = find(warnings, code).details!;
    for (const [key, value] of Object.entries(details))
      expect(found[key] as number, key).toBeCloseTo(value, 9);
  });

  it("hoodie M: art ending 1 in or 0.95 in (reads 1 in) above the pouch pocket passes; 0.9 in is too close", () => {
    const hoodie = garment("campfire-pullover-hoodie", "M");
    const pocketTop = buildSilhouette(hoodie.category, hoodie.measurements, "front").pocketTopY!;
    const ends = (gap: number) => art({ heightIn: pocketTop - FULL_FRONT_TOP_IN - gap });
    expect(codes(check(ends(POCKET_CLEARANCE_IN), hoodie))).not.toContain("pocket-clearance");
    expect(codes(check(ends(POCKET_CLEARANCE_IN - 0.05), hoodie))).not.toContain("pocket-clearance");
    const close = find(check(ends(POCKET_CLEARANCE_IN - 0.1), hoodie), "pocket-clearance");
    expect(close.details?.minClearanceIn).toBe(POCKET_CLEARANCE_IN);
    expect(close.details?.clearanceIn as number).toBeCloseTo(POCKET_CLEARANCE_IN - 0.1, 9);
    expect(close.message).toContain("ends 7/8 in above the pouch pocket");
  });
});

describe("side seam and armhole clearance (2 in, common practice, no published source)", () => {
  const sil = buildSilhouette(TEE_M.category, TEE_M.measurements, "front");

  it("reports the clearance at the closest point, in inches", () => {
    const warnings = check(art({ widthIn: 11, offsetFromCenterIn: 1 }));
    const seam = find(warnings, "seam-clearance");
    const expected = minEdgeBetween(sil.bodyEdge, 3, 14)! - 6.5;
    expect(seam.details?.clearanceIn).toBeCloseTo(expected, 9);
    expect(seam.severity).toBe("warning");
    expect(seam.message).toContain(formatLength(expected, "in"));
    expect(seam.message).toContain("armhole seam");
    expect(seam.message).toContain("keep at least 2 in");
  });

  it("records a negative clearance, as an error, and says how far over the seam the art runs", () => {
    const warnings = check(art({ offsetFromCenterIn: 3 }));
    const seam = find(warnings, "seam-clearance");
    const expected = minEdgeBetween(sil.bodyEdge, 3, 14)! - 8.5;
    expect(expected).toBeLessThan(0);
    expect(seam.details?.clearanceIn).toBeCloseTo(expected, 9);
    expect(seam.severity).toBe("error");
    expect(seam.message).toContain(`runs ${formatLength(-expected, "in")} over the`);
  });

  it("names the side seam when the tight spot is below the underarm", () => {
    const top = sil.chestLineY + 1;
    const warnings = check(art({ widthIn: 17, heightIn: 4, belowCollarIn: top }));
    const seam = find(warnings, "seam-clearance");
    expect(seam.details?.seam).toBe("side seam");
    expect(seam.details?.clearanceIn).toBeCloseTo(
      (TEE_M.measurements as ApparelMeasurements).chestWidth / 2 - 17 / 2,
      9,
    );
  });

  it.each([
    [11, false],
    [11.5, true],
  ])("checks the turned outline, not its box: %d in square turned 45°", (side, flagged) => {
    // Diamond with its top corner 2 in below the collar; its side corners sit below the underarm.
    const halfDiagonal = side / Math.SQRT2;
    const centerY = 2 + halfDiagonal;
    const warnings = check(
      art({ widthIn: side, heightIn: side, rotationDeg: 45, belowCollarIn: centerY - side / 2 }),
    );
    expect(centerY).toBeGreaterThan(sil.chestLineY);
    expect(codes(warnings).includes("seam-clearance")).toBe(flagged);
    if (flagged) {
      const seam = find(warnings, "seam-clearance");
      expect(seam.details?.clearanceIn).toBeCloseTo(
        (TEE_M.measurements as ApparelMeasurements).chestWidth / 2 - halfDiagonal,
        9,
      );
      expect(seam.details?.seam).toBe("side seam");
    }
  });

  it.each([[{ offsetFromCenterIn: 30 }], [{ belowCollarIn: -30 }], [{ belowCollarIn: 40 }]])(
    "flags art entirely off the garment: %o",
    (patch) => {
      const warnings = check(art(patch));
      expect(find(warnings, "off-garment").severity).toBe("error");
      expect(codes(warnings)).not.toContain("seam-clearance");
    },
  );
});

describe("size limits", () => {
  it("flags art taller than the location's maximum", () => {
    const warnings = check(art({ heightIn: 15 }));
    expect(codes(warnings)).toEqual(["too-tall"]);
    expect(warnings[0]!.message).toBe("The art is 15 in tall; a full front on size M takes at most 14 in.");
  });

  it("judges a limit at the precision it shows: 11.3 in reads 11 1/4 in and passes; in cm it reads 28.7 against 28.6", () => {
    // 11.3 in = 28.702 cm and 11.25 in = 28.575 cm, each shown to 0.1 cm (NIST SP 811: 1 in = 2.54 cm).
    expect(codes(check(art({ widthIn: 11.3 })))).not.toContain("too-wide");
    const cm = find(check(art({ widthIn: 11.3 }), TEE_M, { unit: "cm" }), "too-wide");
    expect(cm.message).toBe("The art is 28.7 cm wide; a full front on size M takes at most 28.6 cm.");
    const inches = find(check(art({ widthIn: ADULT_FULL_FRONT_MAX.widthIn + EIGHTH_IN })), "too-wide");
    expect(inches.message).toBe("The art is 11 3/8 in wide; a full front on size M takes at most 11 1/4 in.");
  });

  it.each(["in", "cm"] as const)("no warning ever shows the same number twice (%s)", (unit) => {
    // Sweep width and clearances across their limits in steps finer than the display.
    const sil = buildSilhouette(TEE_M.category, TEE_M.measurements, "front");
    const belowUnderarm = sil.chestLineY + 1;
    const chest = (TEE_M.measurements as ApparelMeasurements).chestWidth;
    for (let k = -40; k <= 40; k++) {
      const d = k / 200;
      for (const placement of [
        art({ widthIn: ADULT_FULL_FRONT_MAX.widthIn + d }),
        art({ heightIn: ADULT_FULL_FRONT_MAX.heightIn + d }),
        art({ widthIn: chest - 2 * (SIDE_SEAM_CLEARANCE_IN + d), heightIn: 4, belowCollarIn: belowUnderarm }),
        art({ widthIn: 4, heightIn: 4, belowCollarIn: COLLAR_CLEARANCE_IN + d }),
        art({ widthIn: 8, heightIn: 6, belowCollarIn: sil.hemY - 6 - (HEM_CLEARANCE_IN + d) }),
      ]) {
        for (const w of check(placement, TEE_M, { unit })) {
          const numbers = w.message.match(/-?\d+(?:[ .]\d+)?(?:\/\d+)? (?:in|cm)/g) ?? [];
          if (numbers.length >= 2) expect(new Set(numbers).size, w.message).toBe(numbers.length);
        }
      }
    }
  });

  it("3XL takes art that S cannot", () => {
    const big = art({ widthIn: 12.5, heightIn: 12.5 });
    expect(check(big, garment("everyday-crew-tee", "3XL"))).toEqual([]);
    expect(codes(check(big, garment("everyday-crew-tee", "S")))).toContain("too-wide");
  });

  it("left chest: the adult default is too big for a youth tee; the youth default fits", () => {
    const youth = garment("schoolyard-tee", "YS");
    const adultDefault = defaultPlacement(specFor(TEE_M, "left-chest"), 1);
    expect(check(adultDefault)).toEqual([]);
    const onYouth = codes(check(adultDefault, youth));
    expect(onYouth).toContain("too-wide");
    expect(onYouth).toContain("seam-clearance");
    expect(check(defaultPlacement(specFor(youth, "left-chest"), 1), youth)).toEqual([]);
  });
});

describe("usual top (tolerance 1.5 in, Chalkline default)", () => {
  it.each([
    [FULL_FRONT_TOP_IN - TOP_TOLERANCE_IN - 0.25, "top-too-high", "warning"],
    [FULL_FRONT_TOP_IN + TOP_TOLERANCE_IN + 0.25, "top-too-low", "info"],
  ])("top %d in below the collar gives %s", (belowCollarIn, code, severity) => {
    const warnings = check(art({ belowCollarIn, heightIn: 8 }));
    expect(codes(warnings)).toEqual([code]);
    expect(warnings[0]!.severity).toBe(severity);
    expect(warnings[0]!.message).toContain("usually starts about 3 in below");
  });

  it.each([FULL_FRONT_TOP_IN - TOP_TOLERANCE_IN + 0.1, 3.5, FULL_FRONT_TOP_IN + TOP_TOLERANCE_IN - 0.1])(
    "top %d in is within tolerance",
    (belowCollarIn) => {
      expect(check(art({ belowCollarIn, heightIn: 8 }))).toEqual([]);
    },
  );
});

describe("collar, hem and pocket clearances (common practice, no published source)", () => {
  it("warns when the art's top is within 1/2 in of the collar seam", () => {
    const warnings = check(art({ belowCollarIn: COLLAR_CLEARANCE_IN / 2 }));
    expect(find(warnings, "collar-clearance").severity).toBe("warning");
    expect(codes(warnings)).toContain("top-too-high");
  });

  it("errors when the art runs into the neckline", () => {
    const warnings = check(art({ belowCollarIn: -0.5, widthIn: 4, heightIn: 4 }));
    const collar = find(warnings, "collar-clearance");
    expect(collar.severity).toBe("error");
    expect(collar.message).toContain("1/2 in into the neckline");
    expect(warnings[0]!.severity).toBe("error");
  });

  it("ignores the neckline for art beside it", () => {
    const chest = defaultPlacement(specFor(TEE_M, "left-chest"), 1);
    expect(check({ ...chest, belowCollarIn: 1.75 }).map((w) => w.code)).not.toContain("collar-clearance");
  });

  it("errors past the hem and warns close to it", () => {
    const sil = buildSilhouette(TEE_M.category, TEE_M.measurements, "front");
    const past = check(art({ belowCollarIn: sil.hemY - 5, heightIn: 6, widthIn: 8 }));
    expect(find(past, "hem-clearance").severity).toBe("error");
    const close = check(art({ belowCollarIn: sil.hemY - 6.5, heightIn: 6, widthIn: 8 }));
    const hem = find(close, "hem-clearance");
    expect(hem.severity).toBe("warning");
    expect(hem.details?.clearanceIn).toBeCloseTo(0.5, 9);
    expect(hem.message).toContain(`keep at least ${formatLength(HEM_CLEARANCE_IN, "in")}`);
  });

  describe("hoodie pouch pocket", () => {
    const hoodie = garment("campfire-pullover-hoodie", "M");
    const sil = buildSilhouette(hoodie.category, hoodie.measurements, "front");
    const room = sil.pocketTopY! - 3;

    it("a full front that stops 1 in above the pocket passes", () => {
      expect(check(art({ heightIn: room - POCKET_CLEARANCE_IN }), hoodie)).toEqual([]);
    });

    it("one that ends within 1 in of the pocket is too tall and too close", () => {
      const warnings = check(art({ heightIn: room - POCKET_CLEARANCE_IN / 2 }), hoodie);
      expect(codes(warnings)).toEqual(["too-tall", "pocket-clearance"]);
      expect(find(warnings, "pocket-clearance").severity).toBe("warning");
    });

    it("one that runs onto the pocket is an error", () => {
      const warnings = check(art({ heightIn: room + 1 }), hoodie);
      expect(find(warnings, "pocket-clearance").severity).toBe("error");
      expect(find(warnings, "pocket-clearance").message).toContain("1 in onto the pouch pocket");
    });

    it("the same 11 x 12 art fits the same-size tee", () => {
      expect(check(art({ heightIn: 12 }))).toEqual([]);
      expect(codes(check(art({ heightIn: 12 }), hoodie))).toContain("pocket-clearance");
    });
  });
});

describe("slips (Chalkline defaults)", () => {
  it.each([
    [0.06, true],
    [-0.1, true],
    [SLIGHT_OFFSET_IN, false],
    [0.5, false],
    [0, false],
  ])("centered art %d in off center flagged: %s", (offsetFromCenterIn, flagged) => {
    const warnings = check(art({ offsetFromCenterIn }));
    expect(codes(warnings).includes("slightly-off-center")).toBe(flagged);
    if (flagged)
      expect(find(warnings, "slightly-off-center").message).toMatch(/^The art is 0\.\d+ in off center/);
  });

  it("does not call a left chest off center", () => {
    const chest = defaultPlacement(specFor(TEE_M, "left-chest"), 1);
    expect(check({ ...chest, offsetFromCenterIn: chest.offsetFromCenterIn + 0.05 })).toEqual([]);
  });

  it.each([
    [1, true],
    [-1.5, true],
    [SLIGHT_TILT_DEG, false],
    [15, false],
    [0, false],
    [180, false],
  ])("art turned %d° flagged as a slight tilt: %s", (rotationDeg, flagged) => {
    const warnings = check(art({ rotationDeg, widthIn: 6, heightIn: 6 }));
    expect(codes(warnings).includes("slight-tilt")).toBe(flagged);
  });

  it("measures a sleeve's tilt from the sleeve's own axis", () => {
    const sleeve = defaultPlacement(specFor(TEE_M, "left-sleeve"), 1);
    expect(check(sleeve)).toEqual([]);
    expect(codes(check({ ...sleeve, rotationDeg: sleeve.rotationDeg + 1 }))).toEqual(["slight-tilt"]);
  });
});

describe("print areas for sleeves, pouch and tote", () => {
  it("flags sleeve art that leaves its print area", () => {
    const sleeve = defaultPlacement(specFor(TEE_M, "left-sleeve"), 1);
    const warnings = check({ ...sleeve, offsetFromCenterIn: sleeve.offsetFromCenterIn + 3 });
    expect(find(warnings, "outside-print-area").details?.overhangIn).toBeGreaterThan(0);
  });

  it("flags a short-sleeve print wider than about 3.5 in (from memory)", () => {
    const sleeve = defaultPlacement(specFor(TEE_M, "left-sleeve"), 1);
    expect(codes(check({ ...sleeve, widthIn: 4.5 }))).toEqual(["too-wide", "outside-print-area"]);
  });

  it("flags tote art bigger than the bag's print area", () => {
    const tote = garment("market-canvas-tote", "One size");
    const spec = specFor(tote, "tote-front");
    expect(check(defaultPlacement(spec, 1), tote)).toEqual([]);
    const big = check({ ...defaultPlacement(spec, 1), widthIn: 14 }, tote);
    expect(codes(big)).toEqual(["too-wide", "outside-print-area"]);
  });
});

describe("size switching", () => {
  it("says which limit breaks when art that fit S does not fit XS", () => {
    const warnings = check(art(), garment("everyday-crew-tee", "XS"), {
      previousSize: { size: "S", measurements: garment("everyday-crew-tee", "S").measurements },
    });
    const sw = find(warnings, "size-switch");
    expect(sw.severity).toBe("warning");
    expect(sw.details?.limits).toEqual(["too-wide", "seam-clearance"]);
    expect(sw.message).toBe(
      "This placement fits size S but not size XS: wider than the maximum, too close to the side seam.",
    );
  });

  it("stays quiet when the previous size did not fit either, or this one fits", () => {
    const xs = garment("everyday-crew-tee", "XS");
    const quiet1 = check(art({ widthIn: 13 }), xs, {
      previousSize: { size: "S", measurements: garment("everyday-crew-tee", "S").measurements },
    });
    expect(codes(quiet1)).not.toContain("size-switch");
    const quiet2 = check(art(), TEE_M, { previousSize: { size: "XS", measurements: xs.measurements } });
    expect(quiet2).toEqual([]);
  });

  it("checks a placement across a whole size run", () => {
    const blank = findBlank("everyday-crew-tee")!;
    const result = checkAcrossSizes({ placement: art(), category: blank.category, sizes: blank.sizes });
    expect(result.map((r) => r.size)).toEqual(blank.sizes.map((r) => r.size));
    expect(result.map((r) => r.fits)).toEqual([false, true, true, true, true, true, true, true]);
    const reversed = checkAcrossSizes({
      placement: art(),
      category: blank.category,
      sizes: [...blank.sizes].reverse(),
    });
    const last = reversed[reversed.length - 1]!;
    expect(last.size).toBe("XS");
    expect(codes(last.warnings)).toContain("size-switch");
  });
});

describe("messages and robustness", () => {
  it("formats message numbers in centimetres when asked; details stay in inches", () => {
    const warnings = check(art({ widthIn: 13, heightIn: 10 }), TEE_M, { unit: "cm" });
    const wide = find(warnings, "too-wide");
    expect(wide.message).toBe("The art is 33.0 cm wide; a full front on size M takes at most 28.6 cm.");
    expect(wide.details?.widthIn).toBe(13);
  });

  it("refuses a location the garment does not offer", () => {
    expect(codes(check(art({ location: "pouch" })))).toEqual(["location-not-offered"]);
  });

  it("reports an invalid placement instead of computing NaN", () => {
    const warnings = check(art({ widthIn: Number.NaN }));
    expect(codes(warnings)).toEqual(["invalid-placement"]);
    expect(warnings[0]!.details?.field).toBe("widthIn");
  });

  const cases = CATALOG.flatMap((blank) =>
    blank.sizes.flatMap((row) =>
      locationsFor(blank.category).map(
        (location) => [blank.id, row.size, location, blank.category, row] as const,
      ),
    ),
  );

  it.each(cases)(
    "%s %s %s: the default placement passes every check",
    (_id, _size, location, category, row) => {
      const spec = locationSpec({ location, category, group: row.group, measurements: row.measurements });
      const placement = defaultPlacement(spec, 1.25);
      expect(
        checkPlacement({
          placement,
          category,
          group: row.group,
          measurements: row.measurements,
          size: row.size,
        }),
      ).toEqual([]);
    },
  );

  it.each(cases)(
    "%s %s %s: bad placements give finite numbers and plain messages",
    (_id, _size, location, category, row) => {
      const spec = locationSpec({ location, category, group: row.group, measurements: row.measurements });
      const base = defaultPlacement(spec, 1);
      // `warns`: whether the placement must draw at least one warning, so the loop below has
      // something to read (undefined where it depends on the garment).
      for (const { patch, warns } of [
        // 30 in square is past every location's maximum.
        { patch: { widthIn: 30, heightIn: 30 }, warns: true },
        { patch: { offsetFromCenterIn: base.offsetFromCenterIn + 7, rotationDeg: 37 }, warns: undefined },
        // 4 in above the collar (or the tote's top edge): every location has a check that says so.
        { patch: { belowCollarIn: -4, rotationDeg: -1 }, warns: true },
        // A nudge under 1/8 in is a slip only where the art is centered.
        { patch: { offsetFromCenterIn: base.offsetFromCenterIn + 0.05 }, warns: spec.anchor === "center" },
      ]) {
        const warnings = checkPlacement({
          placement: { ...base, ...patch },
          category,
          group: row.group,
          measurements: row.measurements,
          size: row.size,
          previousSize: { size: "other", measurements: row.measurements as ApparelMeasurements },
        });
        if (warns) expect(codes(warnings).length, JSON.stringify(patch)).toBeGreaterThan(0);
        for (const w of warnings) {
          expect(w.message).not.toMatch(/NaN|undefined|Infinity/);
          expect(w.message).toMatch(/^[A-Z].*\.$/);
          for (const value of Object.values(w.details ?? {})) {
            if (typeof value === "number") expect(Number.isFinite(value)).toBe(true);
          }
        }
        const order = warnings.map((w) => ({ error: 0, warning: 1, info: 2 })[w.severity]);
        expect(order).toEqual([...order].sort((a, b) => a - b));
      }
    },
  );
});
