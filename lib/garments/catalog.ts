import type { ApparelMeasurements, GarmentCategory, SizeGroup, SizeRow, ToteMeasurements } from "./types";

/** A garment colour as shown in the editor; names and hex values are our own. */
export interface GarmentColor {
  name: string;
  hex: string;
}

/** A blank garment style the shop decorates. */
export interface Blank {
  id: string;
  styleName: string;
  category: GarmentCategory;
  description: string;
  colors: GarmentColor[];
  sizes: SizeRow[];
}

// Our own palette for the demo blanks.
const CHALK: GarmentColor = { name: "Chalk", hex: "#F4F1EA" };
const CARBON: GarmentColor = { name: "Carbon", hex: "#1F2023" };
const DEEP_HARBOR: GarmentColor = { name: "Deep Harbor", hex: "#243247" };
const KILN_RED: GarmentColor = { name: "Kiln Red", hex: "#9A3B2E" };
const MOSS: GarmentColor = { name: "Moss", hex: "#56683F" };
const FOG_HEATHER: GarmentColor = { name: "Fog Heather", hex: "#B7B4AD" };
const GOLDENROD: GarmentColor = { name: "Goldenrod", hex: "#CF9B32" };
const PRIMROSE: GarmentColor = { name: "Primrose", hex: "#E9C7C5" };
const SKY_WASH: GarmentColor = { name: "Sky Wash", hex: "#A9C3D9" };
const OATMEAL: GarmentColor = { name: "Oatmeal", hex: "#DCCFB8" };
const RAW_CANVAS: GarmentColor = { name: "Raw Canvas", hex: "#E8DDC7" };

type ApparelColumns = { [K in keyof ApparelMeasurements]: readonly number[] };

/** Turns a column-per-measurement size chart into rows; every column must have one value per size. */
export function apparelRows(group: SizeGroup, sizes: readonly string[], columns: ApparelColumns): SizeRow[] {
  return sizes.map((size, i) => {
    const pick = (key: keyof ApparelMeasurements): number => {
      const value = columns[key][i];
      if (value === undefined) throw new Error(`Size chart column ${key} has no value for ${size}.`);
      return value;
    };
    const measurements: ApparelMeasurements = {
      chestWidth: pick("chestWidth"),
      bodyLength: pick("bodyLength"),
      shoulderWidth: pick("shoulderWidth"),
      sleeveLength: pick("sleeveLength"),
      neckWidth: pick("neckWidth"),
      frontNeckDrop: pick("frontNeckDrop"),
      backNeckDrop: pick("backNeckDrop"),
    };
    return { size, group, measurements };
  });
}

function toteRow(size: string, measurements: ToteMeasurements): SizeRow {
  return { size, group: "adult", measurements };
}

export const CATALOG: readonly Blank[] = [
  {
    id: "everyday-crew-tee",
    styleName: "Everyday Crew Tee",
    category: "unisex-tee",
    description: "Midweight unisex short-sleeve tee with a ribbed crew collar.",
    colors: [CHALK, CARBON, DEEP_HARBOR, KILN_RED, FOG_HEATHER, MOSS],
    // Approximate, from memory; edit to the supplier's chart.
    sizes: apparelRows("adult", ["XS", "S", "M", "L", "XL", "2XL", "3XL", "4XL"], {
      chestWidth: [16.5, 18, 20, 22, 24, 26, 28, 30],
      bodyLength: [27, 28, 29, 30, 31, 32, 33, 34],
      shoulderWidth: [15.5, 17, 18, 19.5, 21, 22.5, 24, 25.5],
      sleeveLength: [7.75, 8, 8.25, 8.5, 8.75, 9, 9.25, 9.5],
      neckWidth: [6.75, 7, 7.25, 7.5, 7.75, 8, 8.25, 8.5],
      frontNeckDrop: [3.25, 3.5, 3.5, 3.75, 3.75, 4, 4, 4.25],
      backNeckDrop: [0.75, 1, 1, 1, 1, 1.25, 1.25, 1.25],
    }),
  },
  {
    id: "schoolyard-tee",
    styleName: "Schoolyard Tee",
    category: "youth-tee",
    description: "Youth short-sleeve tee cut from the same cloth as the adult crew tee.",
    colors: [CHALK, CARBON, DEEP_HARBOR, GOLDENROD, SKY_WASH],
    // Approximate, from memory; edit to the supplier's chart.
    sizes: apparelRows("youth", ["YXS", "YS", "YM", "YL", "YXL"], {
      chestWidth: [14, 15, 16.5, 18, 19],
      bodyLength: [19.5, 21, 22.5, 24, 25.5],
      shoulderWidth: [12.5, 13.5, 14.5, 15.5, 16.5],
      sleeveLength: [5.75, 6.25, 6.75, 7.25, 7.75],
      neckWidth: [5.75, 6, 6.25, 6.5, 6.75],
      frontNeckDrop: [2.5, 2.75, 2.75, 3, 3],
      backNeckDrop: [0.75, 0.75, 0.75, 1, 1],
    }),
  },
  {
    id: "little-steps-tee",
    styleName: "Little Steps Tee",
    category: "youth-tee",
    description: "Toddler short-sleeve tee.",
    colors: [CHALK, PRIMROSE, SKY_WASH, GOLDENROD],
    // Approximate, from memory; edit to the supplier's chart.
    sizes: apparelRows("toddler", ["2T", "3T", "4T", "5T"], {
      chestWidth: [11.5, 12, 12.5, 13],
      bodyLength: [14.5, 15.5, 16.5, 17.5],
      shoulderWidth: [10, 10.5, 11, 11.5],
      sleeveLength: [4.5, 4.75, 5, 5.25],
      neckWidth: [5, 5.25, 5.25, 5.5],
      frontNeckDrop: [2, 2, 2.25, 2.25],
      backNeckDrop: [0.5, 0.5, 0.75, 0.75],
    }),
  },
  {
    id: "contour-fit-tee",
    styleName: "Contour Fit Tee",
    category: "fitted-tee",
    description: "Slim short-sleeve tee shaped in at the waist.",
    colors: [CHALK, CARBON, PRIMROSE, MOSS, OATMEAL],
    // Approximate, from memory; edit to the supplier's chart.
    sizes: apparelRows("adult", ["XS", "S", "M", "L", "XL", "2XL"], {
      chestWidth: [15.5, 16.5, 17.5, 18.5, 20, 21.5],
      bodyLength: [24.5, 25.5, 26.25, 27, 27.75, 28.5],
      shoulderWidth: [13.5, 14.25, 15, 15.75, 16.5, 17.5],
      sleeveLength: [6, 6.25, 6.5, 6.75, 7, 7.25],
      neckWidth: [6.25, 6.5, 6.75, 7, 7.25, 7.5],
      frontNeckDrop: [3.25, 3.25, 3.5, 3.5, 3.75, 3.75],
      backNeckDrop: [0.75, 0.75, 0.75, 1, 1, 1],
    }),
  },
  {
    id: "allday-long-sleeve",
    styleName: "Allday Long Sleeve Tee",
    category: "long-sleeve-tee",
    description: "Unisex long-sleeve tee with ribbed cuffs.",
    colors: [CHALK, CARBON, DEEP_HARBOR, FOG_HEATHER],
    // Approximate, from memory; edit to the supplier's chart.
    sizes: apparelRows("adult", ["S", "M", "L", "XL", "2XL", "3XL"], {
      chestWidth: [18, 20, 22, 24, 26, 28],
      bodyLength: [28, 29, 30, 31, 32, 33],
      shoulderWidth: [17, 18, 19.5, 21, 22.5, 24],
      sleeveLength: [24.5, 25, 25.5, 26, 26.5, 27],
      neckWidth: [7, 7.25, 7.5, 7.75, 8, 8.25],
      frontNeckDrop: [3.5, 3.5, 3.75, 3.75, 4, 4],
      backNeckDrop: [1, 1, 1, 1, 1.25, 1.25],
    }),
  },
  {
    id: "fireside-crewneck",
    styleName: "Fireside Crewneck",
    category: "crewneck",
    description: "Fleece crewneck sweatshirt with ribbed waistband and cuffs.",
    colors: [FOG_HEATHER, CARBON, DEEP_HARBOR, MOSS, OATMEAL],
    // Approximate, from memory; edit to the supplier's chart.
    sizes: apparelRows("adult", ["S", "M", "L", "XL", "2XL", "3XL"], {
      chestWidth: [20, 22, 24, 26, 28, 30],
      bodyLength: [27, 28, 29, 30, 31, 32],
      shoulderWidth: [19, 20.5, 22, 23.5, 25, 26.5],
      sleeveLength: [23.5, 24, 24.5, 25, 25.5, 26],
      neckWidth: [7.25, 7.5, 7.75, 8, 8.25, 8.5],
      frontNeckDrop: [3.25, 3.25, 3.5, 3.5, 3.75, 3.75],
      backNeckDrop: [1, 1, 1, 1, 1.25, 1.25],
    }),
  },
  {
    id: "campfire-pullover-hoodie",
    styleName: "Campfire Pullover Hoodie",
    category: "hoodie",
    description: "Fleece pullover hoodie with a lined hood and a front pouch pocket.",
    colors: [FOG_HEATHER, CARBON, DEEP_HARBOR, KILN_RED, MOSS],
    // Approximate, from memory; edit to the supplier's chart.
    sizes: apparelRows("adult", ["S", "M", "L", "XL", "2XL", "3XL"], {
      chestWidth: [20, 22, 24, 26, 28, 30],
      bodyLength: [27, 28, 29, 30, 31, 32],
      shoulderWidth: [19.5, 21, 22.5, 24, 25.5, 27],
      sleeveLength: [23.5, 24, 24.5, 25, 25.5, 26],
      neckWidth: [7.25, 7.5, 7.75, 8, 8.25, 8.5],
      frontNeckDrop: [3.5, 3.5, 3.75, 3.75, 4, 4],
      backNeckDrop: [1.25, 1.25, 1.25, 1.25, 1.5, 1.5],
    }),
  },
  {
    id: "breezeway-tank",
    styleName: "Breezeway Tank",
    category: "tank",
    description: "Unisex tank with narrow straps and a deep armhole.",
    colors: [CHALK, CARBON, SKY_WASH, KILN_RED],
    // Approximate, from memory; edit to the supplier's chart. Shoulder width is outer strap edge to outer strap edge.
    sizes: apparelRows("adult", ["XS", "S", "M", "L", "XL", "2XL"], {
      chestWidth: [16.5, 18, 20, 22, 24, 26],
      bodyLength: [27, 28, 29, 30, 31, 32],
      shoulderWidth: [12, 12.5, 13, 13.5, 14, 14.5],
      sleeveLength: [0, 0, 0, 0, 0, 0],
      neckWidth: [8.5, 8.75, 9, 9.25, 9.5, 9.75],
      frontNeckDrop: [4.5, 4.75, 5, 5, 5.25, 5.5],
      backNeckDrop: [2, 2, 2.25, 2.25, 2.5, 2.5],
    }),
  },
  {
    id: "market-canvas-tote",
    styleName: "Market Canvas Tote",
    category: "tote",
    description: "Flat cotton canvas tote with two shoulder handles.",
    colors: [RAW_CANVAS, CARBON, DEEP_HARBOR],
    // Approximate, from memory; edit to the supplier's chart.
    sizes: [toteRow("One size", { width: 15, height: 16, handleLength: 22, handleWidth: 1, gusset: 0 })],
  },
  {
    id: "carryall-gusset-tote",
    styleName: "Carryall Gusset Tote",
    category: "tote",
    description: "Wide canvas tote with a bottom gusset.",
    colors: [RAW_CANVAS, MOSS, CARBON],
    // Approximate, from memory; edit to the supplier's chart.
    sizes: [toteRow("One size", { width: 18, height: 15, handleLength: 24, handleWidth: 1.25, gusset: 5 })],
  },
  {
    id: "cradle-bodysuit",
    styleName: "Cradle Bodysuit",
    category: "infant-bodysuit",
    description: "Short-sleeve infant bodysuit with a snap tab.",
    colors: [CHALK, PRIMROSE, SKY_WASH, OATMEAL],
    // Approximate, from memory; edit to the supplier's chart. Body length runs from the HPS to the bottom of the snap tab.
    sizes: apparelRows("infant", ["NB", "6M", "12M", "18M"], {
      chestWidth: [8, 9, 9.5, 10],
      bodyLength: [12.5, 14, 15.5, 16.5],
      shoulderWidth: [7, 7.5, 8, 8.5],
      sleeveLength: [2.75, 3, 3.25, 3.5],
      neckWidth: [4, 4.25, 4.5, 4.75],
      frontNeckDrop: [1.5, 1.5, 1.75, 1.75],
      backNeckDrop: [0.5, 0.5, 0.5, 0.5],
    }),
  },
];

export function findBlank(id: string): Blank | undefined {
  return CATALOG.find((b) => b.id === id);
}

export function blanksFor(category: GarmentCategory): Blank[] {
  return CATALOG.filter((b) => b.category === category);
}

export function findSizeRow(blank: Blank, size: string): SizeRow | undefined {
  return blank.sizes.find((row) => row.size === size);
}
