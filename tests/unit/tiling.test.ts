import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  DEFAULT_TILE_MARGIN_IN,
  DEFAULT_TILE_OVERLAP_IN,
  MAX_TILE_PAGES,
  PAPER_SIZES,
  mirrorX,
  planTiles,
  rowLetters,
  tileCoverage,
  tileLabel,
  type PaperId,
  type Tile,
  type TilePlan,
} from "@/lib/production/tiling";
import { MM_PER_INCH } from "@/lib/units";
import { expectTiledArt } from "./oracles/tiling";

/**
 * Where an art point lands on the taped sheet, measured from the sheet's top-left corner
 * (pages laid edge to edge at one pitch: art area − overlap, the art area being the printable
 * area less the label band). Right-reading plans must put
 * every art point at its own art coordinates, whichever tile it is read from; mirrored plans
 * must put it at the reflection about the sheet's centre line.
 */
function sheetPosition(plan: TilePlan, tile: Tile, x: number, y: number) {
  const stepX = plan.pageWidthIn - 2 * plan.marginIn - plan.overlapIn;
  const stepY = plan.pageHeightIn - 2 * plan.marginIn - plan.labelBandIn - plan.overlapIn;
  const within = plan.mirrored ? tile.artX + tile.artWidth - x : x - tile.artX;
  return {
    x: tile.column * stepX + (tile.pageX - plan.marginIn) + within,
    y: tile.row * stepY + (tile.pageY - plan.marginIn) + (y - tile.artY),
  };
}

function sheetWidth(plan: TilePlan): number {
  const room = plan.pageWidthIn - 2 * plan.marginIn;
  return (plan.columns - 1) * (room - plan.overlapIn) + room;
}

describe("PAPER_SIZES", () => {
  it.each([
    // ANSI/ASME Y14.1 size A
    { id: "letter", w: 8.5, h: 11, standard: "ANSI/ASME Y14.1" },
    // ANSI/ASME Y14.1 size B (tabloid portrait / ledger landscape)
    { id: "tabloid", w: 11, h: 17, standard: "ANSI/ASME Y14.1" },
    // ISO 216 A4 = 210 × 297 mm, converted at 25.4 mm/in (NIST SP 811)
    { id: "a4", w: 210 / 25.4, h: 297 / 25.4, standard: "ISO 216" },
    // ISO 216 A3 = 297 × 420 mm, converted at 25.4 mm/in (NIST SP 811)
    { id: "a3", w: 297 / 25.4, h: 420 / 25.4, standard: "ISO 216" },
  ] as const)("$id is $w × $h in ($standard)", ({ id, w, h, standard }) => {
    const paper = PAPER_SIZES[id];
    expect(paper.id).toBe(id);
    expect(paper.widthIn).toBeCloseTo(w, 12);
    expect(paper.heightIn).toBeCloseTo(h, 12);
    expect(paper.widthIn).toBeLessThan(paper.heightIn); // stored portrait
    expect(paper.standard).toBe(standard);
  });

  it("converts ISO sizes back to whole millimetres", () => {
    // ISO 216: A4 210 × 297 mm, A3 297 × 420 mm; NIST SP 811: 25.4 mm per inch.
    expect(MM_PER_INCH).toBe(25.4);
    expect(PAPER_SIZES.a4.widthIn * MM_PER_INCH).toBeCloseTo(210, 10);
    expect(PAPER_SIZES.a4.heightIn * MM_PER_INCH).toBeCloseTo(297, 10);
    expect(PAPER_SIZES.a3.widthIn * MM_PER_INCH).toBeCloseTo(297, 10);
    expect(PAPER_SIZES.a3.heightIn * MM_PER_INCH).toBeCloseTo(420, 10);
  });

  it("uses our defaults for margin and overlap", () => {
    expect(DEFAULT_TILE_MARGIN_IN).toBe(0.25); // common practice, no published source
    expect(DEFAULT_TILE_OVERLAP_IN).toBe(0.5); // common practice, no published source
  });
});

describe("tile labels (our own scheme: row letters, column numbers)", () => {
  it.each([
    { row: 0, letters: "A" },
    { row: 1, letters: "B" },
    { row: 25, letters: "Z" },
    { row: 26, letters: "AA" },
    { row: 27, letters: "AB" },
    { row: 701, letters: "ZZ" },
    { row: 702, letters: "AAA" },
  ])("row $row is $letters", ({ row, letters }) => {
    expect(rowLetters(row)).toBe(letters);
  });

  it("puts the column number after the row letters", () => {
    expect(tileLabel(1, 1)).toBe("B2");
    expect(tileLabel(0, 9)).toBe("A10");
  });
});

describe("planTiles on Letter", () => {
  it("has an 8 × 10.5 in printable area in portrait with 0.25 in margins", () => {
    // ANSI/ASME Y14.1 Letter 8.5 × 11 in, less 2 × 0.25 in: 8 × 10.5 in.
    const plan = planTiles({ artWidthIn: 4, artHeightIn: 4, paper: "letter", orientation: "portrait" });
    expect(plan.pageWidthIn).toBe(8.5);
    expect(plan.pageHeightIn).toBe(11);
    expect(plan.printableWidthIn).toBeCloseTo(8, 12);
    expect(plan.printableHeightIn).toBeCloseTo(10.5, 12);
    expect(plan.pages).toBe(1);
    expect(plan.tiles).toEqual([
      {
        index: 0,
        row: 0,
        column: 0,
        label: "A1",
        artX: 0,
        artY: 0,
        artWidth: 4,
        artHeight: 4,
        pageX: 0.25,
        pageY: 0.25,
        joins: {},
      },
    ]);
  });

  it("tiles an 11 × 14 in design on 4 pages", () => {
    // By hand, 0.5 in overlap:
    //   portrait:  printable 8 × 10.5, step 7.5 × 10;
    //              columns ceil((11 − 0.5) / 7.5) = ceil(1.4) = 2, rows ceil((14 − 0.5) / 10) = ceil(1.35) = 2 → 4
    //   landscape: printable 10.5 × 8, step 10 × 7.5;
    //              columns ceil((11 − 0.5) / 10) = 2, rows ceil((14 − 0.5) / 7.5) = ceil(1.8) = 2 → 4
    // A tie, so auto keeps portrait. Slices across: [0, 8] and [7.5, 11]; down: [0, 10.5] and [10, 14].
    const plan = planTiles({ artWidthIn: 11, artHeightIn: 14, paper: PAPER_SIZES.letter });
    expect(plan.orientation).toBe("portrait");
    expect([plan.columns, plan.rows, plan.pages]).toEqual([2, 2, 4]);
    const rects = plan.tiles.map((t) => [t.label, t.artX, t.artY, t.artWidth, t.artHeight]);
    expect(rects).toEqual([
      ["A1", 0, 0, 8, 10.5],
      ["A2", 7.5, 0, 3.5, 10.5],
      ["B1", 0, 10, 8, 4],
      ["B2", 7.5, 10, 3.5, 4],
    ]);
    expect(plan.tiles.map((t) => t.joins)).toEqual([
      { right: "A2", below: "B1" },
      { below: "B2", left: "A1" },
      { right: "B2", above: "A1" },
      { left: "B1", above: "A2" },
    ]);
    const coverage = tileCoverage(plan);
    expect(coverage.coversArt).toBe(true);
    expect(coverage.insideArt).toBe(true);
    expect(coverage.insidePrintable).toBe(true);
    expect(coverage.horizontalOverlaps).toEqual([0.5, 0.5]);
    expect(coverage.verticalOverlaps).toEqual([0.5, 0.5]);
  });

  it("turns the page when that saves pages", () => {
    // 10 × 7 in, by hand: portrait columns ceil((10 − 0.5) / 7.5) = 2, rows 1 → 2 pages;
    // landscape 10 ≤ 10.5 and 7 ≤ 8 → 1 page.
    const plan = planTiles({ artWidthIn: 10, artHeightIn: 7, paper: "letter", orientation: "auto" });
    expect(plan.orientation).toBe("landscape");
    expect(plan.pages).toBe(1);
    expect(
      planTiles({ artWidthIn: 10, artHeightIn: 7, paper: "letter", orientation: "portrait" }).pages,
    ).toBe(2);
  });
});

describe("planTiles on other papers", () => {
  it("tiles a 20 × 20 in design on A4", () => {
    // ISO 216 A4 210 × 297 mm = 8.2677 × 11.6929 in (NIST SP 811); printable 7.7677 × 11.1929 in.
    // By hand: portrait columns ceil(19.5 / 7.2677) = ceil(2.68) = 3, rows ceil(19.5 / 10.6929) = ceil(1.82) = 2 → 6;
    // landscape is the same grid turned (2 × 3 = 6), so the tie keeps portrait.
    const plan = planTiles({ artWidthIn: 20, artHeightIn: 20, paper: "a4" });
    expect(plan.printableWidthIn).toBeCloseTo(210 / 25.4 - 0.5, 12);
    expect(plan.printableHeightIn).toBeCloseTo(297 / 25.4 - 0.5, 12);
    expect(plan.orientation).toBe("portrait");
    expect([plan.columns, plan.rows, plan.pages]).toEqual([3, 2, 6]);
    const last = plan.tiles[plan.tiles.length - 1]!;
    expect(last.label).toBe("B3");
    expect(last.artX + last.artWidth).toBeCloseTo(20, 12);
    expect(last.artY + last.artHeight).toBeCloseTo(20, 12);
    expect(tileCoverage(plan).coversArt).toBe(true);
  });

  it("chooses landscape Tabloid for a 16 × 24 in design", () => {
    // ANSI/ASME Y14.1 11 × 17 in. By hand: portrait printable 10.5 × 16.5 → columns ceil(15.5 / 10) = 2,
    // rows ceil(23.5 / 16) = 2 → 4; landscape printable 16.5 × 10.5 → columns 1 (16 ≤ 16.5),
    // rows ceil(23.5 / 10) = 3 → 3.
    const plan = planTiles({ artWidthIn: 16, artHeightIn: 24, paper: "tabloid" });
    expect(plan.orientation).toBe("landscape");
    expect([plan.columns, plan.rows, plan.pages]).toEqual([1, 3, 3]);
    expect(plan.tiles.map((t) => [t.artY, t.artHeight])).toEqual([
      [0, 10.5],
      [10, 10.5],
      [20, 4],
    ]);
  });

  it("fits a 12 × 16 in design on one A3 page", () => {
    // ISO 216 A3 297 × 420 mm = 11.6929 × 16.5354 in: printable 11.1929 × 16.0354 in, so 12 in across
    // needs two columns in portrait; landscape 16.0354 × 11.1929 needs two rows. Either way 2 pages.
    const plan = planTiles({ artWidthIn: 12, artHeightIn: 16, paper: "a3" });
    expect(plan.pages).toBe(2);
    expect(plan.orientation).toBe("portrait");
    expect(planTiles({ artWidthIn: 11, artHeightIn: 16, paper: "a3" }).pages).toBe(1);
  });

  it("accepts zero overlap and still covers the art", () => {
    const plan = planTiles({
      artWidthIn: 16,
      artHeightIn: 10,
      paper: "letter",
      orientation: "portrait",
      overlapIn: 0,
    });
    expect(plan.columns).toBe(2); // 16 / 8 = 2 exactly, by hand
    expect(tileCoverage(plan).horizontalOverlaps).toEqual([0]);
    expect(tileCoverage(plan).coversArt).toBe(true);
    expectTiledArt(plan);
  });

  it("does not add a sliver page when the art is an exact number of steps", () => {
    // Letter portrait, 0.1 in overlap: step 7.9 in. Art of 3 steps + overlap is 23.8 in, which
    // floating point makes 23.800000000000004 and (23.8 − 0.1) / 7.9 = 3.0000000000000004.
    // It must still be 3 columns, not a 4th page holding only the overlap strip.
    const artWidthIn = 3 * 7.9 + 0.1;
    expect((artWidthIn - 0.1) / 7.9).toBeGreaterThan(3);
    const plan = planTiles({
      artWidthIn,
      artHeightIn: 5,
      paper: "letter",
      orientation: "portrait",
      overlapIn: 0.1,
    });
    expect(plan.columns).toBe(3);
    const last = plan.tiles[2]!;
    expect(last.artWidth).toBeCloseTo(8, 9);
    expect(last.artWidth).toBeLessThanOrEqual(plan.printableWidthIn);
    expect(tileCoverage(plan).coversArt).toBe(true);
    expectTiledArt(plan);
  });
});

/**
 * Hand-worked plans. Paper sizes: Letter 8.5 × 11 in and Tabloid 11 × 17 in (ANSI/ASME Y14.1 sizes
 * A and B); A4 210 × 297 mm (ISO 216) = 8.2677 × 11.6929 in at 25.4 mm per inch (NIST SP 811).
 * Margin 0.25 in and overlap 0.5 in unless a row says otherwise (our defaults, common practice).
 * Arithmetic: printable = page − 2 × margin; step = printable − overlap; pages along an axis =
 * 1 if the art fits the printable length, else ceil((art − overlap) / step); slice i starts at
 * i × step and is a full printable length, except the last, which takes what is left.
 * pageX = margin, or in a mirrored plan margin + printable − slice width.
 */
describe("hand-worked plans on Letter, A4 and Tabloid", () => {
  interface Row {
    name: string;
    options: Parameters<typeof planTiles>[0];
    orientation: "portrait" | "landscape";
    page: [number, number];
    printable: [number, number];
    /** The printable area less the label band; the printable area itself when there is none. */
    artArea?: [number, number];
    /** [art start, art size, page x] per column, in sheet order. */
    columns: Array<[number, number, number]>;
    /** [art start, art size] per row. */
    rows: Array<[number, number]>;
    pageY: number;
  }
  const rows: Row[] = [
    {
      // Letter portrait: printable 8.5 − 0.5 = 8 by 11 − 0.5 = 10.5; step 7.5 by 10.
      // Across ceil((11 − 0.5) / 7.5) = ceil(1.4) = 2; down ceil((14 − 0.5) / 10) = ceil(1.35) = 2.
      // Landscape (printable 10.5 × 8, step 10 × 7.5): ceil(10.5 / 10) = 2 by ceil(13.5 / 7.5) = 2,
      // also 4, so auto keeps portrait.
      name: "Letter, 11 × 14 in, auto",
      options: { artWidthIn: 11, artHeightIn: 14, paper: "letter" },
      orientation: "portrait",
      page: [8.5, 11],
      printable: [8, 10.5],
      columns: [
        [0, 8, 0.25], // full width
        [7.5, 3.5, 0.25], // starts 1 × 7.5; 11 − 7.5 = 3.5 left
      ],
      rows: [
        [0, 10.5],
        [10, 4], // starts 1 × 10; 14 − 10 = 4 left
      ],
      pageY: 0.25,
    },
    {
      // Letter: portrait needs ceil(19.5 / 7.5) = ceil(2.6) = 3 by ceil(29.5 / 10) = ceil(2.95) = 3 = 9;
      // landscape (printable 10.5 × 8, step 10 × 7.5) needs ceil(19.5 / 10) = ceil(1.95) = 2 by
      // ceil(29.5 / 7.5) = ceil(3.93) = 4 = 8, so auto turns the page.
      name: "Letter, 20 × 30 in, auto",
      options: { artWidthIn: 20, artHeightIn: 30, paper: "letter" },
      orientation: "landscape",
      page: [11, 8.5],
      printable: [10.5, 8],
      columns: [
        [0, 10.5, 0.25],
        [10, 10, 0.25], // 20 − 10 = 10 left
      ],
      rows: [
        [0, 8],
        [7.5, 8],
        [15, 8],
        [22.5, 7.5], // starts 3 × 7.5 = 22.5; 30 − 22.5 = 7.5 left
      ],
      pageY: 0.25,
    },
    {
      // Letter with a 0.5 in margin and 1 in overlap: printable 7.5 × 10, step 6.5 × 9.
      // Across (14 − 1) / 6.5 = 2 exactly: 2 pages, no sliver; down ceil((20 − 1) / 9) = ceil(2.11) = 3.
      // Landscape (printable 10 × 7.5, step 9 × 6.5): ceil(13 / 9) = 2 by ceil(19 / 6.5) = ceil(2.92) = 3,
      // also 6, so portrait.
      name: "Letter, 14 × 20 in, 0.5 in margin, 1 in overlap",
      options: { artWidthIn: 14, artHeightIn: 20, paper: "letter", marginIn: 0.5, overlapIn: 1 },
      orientation: "portrait",
      page: [8.5, 11],
      printable: [7.5, 10],
      columns: [
        [0, 7.5, 0.5],
        [6.5, 7.5, 0.5], // 14 − 6.5 = 7.5 left: exactly a full page
      ],
      rows: [
        [0, 10],
        [9, 10],
        [18, 2], // starts 2 × 9 = 18; 20 − 18 = 2 left
      ],
      pageY: 0.5,
    },
    {
      // A4 portrait: printable 8.2677 − 0.5 = 7.7677 by 11.6929 − 0.5 = 11.1929; step 7.2677 × 10.6929.
      // Across ceil(19.5 / 7.2677) = ceil(2.68) = 3; down ceil(19.5 / 10.6929) = ceil(1.82) = 2: 6 pages.
      // Landscape is the same grid turned (2 × 3 = 6), so auto keeps portrait.
      name: "A4, 20 × 20 in, auto",
      options: { artWidthIn: 20, artHeightIn: 20, paper: "a4" },
      orientation: "portrait",
      page: [8.267717, 11.692913], // 210 / 25.4, 297 / 25.4
      printable: [7.767717, 11.192913],
      columns: [
        [0, 7.767717, 0.25],
        [7.267717, 7.767717, 0.25], // starts 1 × 7.267717
        [14.535433, 5.464567, 0.25], // starts 2 × 7.267717 = 14.535433; 20 − 14.535433 = 5.464567 left
      ],
      rows: [
        [0, 11.192913],
        [10.692913, 9.307087], // 20 − 10.692913 = 9.307087 left
      ],
      pageY: 0.25,
    },
    {
      // Letter-size art does not fit one A4 page: 8 in > 7.7677 in printable across, so portrait needs
      // ceil((8 − 0.5) / 7.2677) = ceil(1.03) = 2 by 1 (11 ≤ 11.1929); landscape needs 1 by
      // ceil((11 − 0.5) / 7.2677) = ceil(1.44) = 2. A tie: portrait.
      name: "A4, 8 × 11 in, auto",
      options: { artWidthIn: 8, artHeightIn: 11, paper: "a4" },
      orientation: "portrait",
      page: [8.267717, 11.692913],
      printable: [7.767717, 11.192913],
      columns: [
        [0, 7.767717, 0.25],
        [7.267717, 0.732283, 0.25], // 8 − 7.267717 = 0.732283 left
      ],
      rows: [[0, 11]],
      pageY: 0.25,
    },
    {
      // The same plan mirrored: column 1 shows the last slice, drawn against the right margin at
      // 0.25 + (7.767717 − 0.732283) = 7.285433; column 2 shows the first slice at 0.25.
      name: "A4, 8 × 11 in, mirrored",
      options: { artWidthIn: 8, artHeightIn: 11, paper: "a4", mirror: true },
      orientation: "portrait",
      page: [8.267717, 11.692913],
      printable: [7.767717, 11.192913],
      columns: [
        [7.267717, 0.732283, 7.285433],
        [0, 7.767717, 0.25], // 0.25 + (7.767717 − 7.767717) = 0.25
      ],
      rows: [[0, 11]],
      pageY: 0.25,
    },
    {
      // Tabloid portrait: printable 10.5 × 16.5, step 10 × 16: ceil(15.5 / 10) = 2 by ceil(23.5 / 16) = 2 = 4;
      // landscape: printable 16.5 × 10.5, step 16 × 10: 1 (16 ≤ 16.5) by ceil(23.5 / 10) = ceil(2.35) = 3 = 3.
      name: "Tabloid, 16 × 24 in, auto",
      options: { artWidthIn: 16, artHeightIn: 24, paper: "tabloid" },
      orientation: "landscape",
      page: [17, 11],
      printable: [16.5, 10.5],
      columns: [[0, 16, 0.25]], // fits: the whole width
      rows: [
        [0, 10.5],
        [10, 10.5],
        [20, 4], // 24 − 20 = 4 left
      ],
      pageY: 0.25,
    },
    {
      // Tabloid, portrait asked for: ceil((30 − 0.5) / 10) = ceil(2.95) = 3 by ceil((40 − 0.5) / 16) =
      // ceil(2.47) = 3 = 9 pages (landscape would take ceil(29.5 / 16) = 2 by ceil(39.5 / 10) = 4 = 8).
      name: "Tabloid, 30 × 40 in, portrait",
      options: { artWidthIn: 30, artHeightIn: 40, paper: "tabloid", orientation: "portrait" },
      orientation: "portrait",
      page: [11, 17],
      printable: [10.5, 16.5],
      columns: [
        [0, 10.5, 0.25],
        [10, 10.5, 0.25],
        [20, 10, 0.25], // 30 − 20 = 10 left
      ],
      rows: [
        [0, 16.5],
        [16, 16.5],
        [32, 8], // 40 − 32 = 8 left
      ],
      pageY: 0.25,
    },
    {
      // A 1.5 in label band on Letter: portrait art area 8 × (10.5 − 1.5) = 8 × 9, step 7.5 × 8.5.
      // Across ceil(10.5 / 7.5) = 2; down ceil(13.5 / 8.5) = ceil(1.59) = 2: 4 pages. Landscape art area
      // 10.5 × (8 − 1.5) = 10.5 × 6.5, step 10 × 6: ceil(10.5 / 10) = 2 by ceil(13.5 / 6) = 3 = 6. Portrait.
      name: "Letter, 11 × 14 in, 1.5 in label band",
      options: { artWidthIn: 11, artHeightIn: 14, paper: "letter", labelBandIn: 1.5 },
      orientation: "portrait",
      page: [8.5, 11],
      printable: [8, 10.5],
      artArea: [8, 9],
      columns: [
        [0, 8, 0.25],
        [7.5, 3.5, 0.25],
      ],
      rows: [
        [0, 9], // the art stops 1.5 in above the printable area's lower edge
        [8.5, 5.5], // starts 1 × 8.5; 14 − 8.5 = 5.5 left
      ],
      pageY: 0.25,
    },
    {
      // Without a band, 10 × 7 in fits one landscape Letter page (10 ≤ 10.5, 7 ≤ 8, worked above). A 1.25 in
      // band leaves a landscape art area of 10.5 × 6.75: ceil((7 − 0.5) / 6.25) = 2 rows = 2 pages; portrait
      // 8 × 9.25: ceil((10 − 0.5) / 7.5) = 2 columns by 1 row = 2 pages. A tie: portrait.
      name: "Letter, 10 × 7 in, 1.25 in label band, auto",
      options: { artWidthIn: 10, artHeightIn: 7, paper: "letter", labelBandIn: 1.25 },
      orientation: "portrait",
      page: [8.5, 11],
      printable: [8, 10.5],
      artArea: [8, 9.25],
      columns: [
        [0, 8, 0.25],
        [7.5, 2.5, 0.25], // 10 − 7.5 = 2.5 left
      ],
      rows: [[0, 7]],
      pageY: 0.25,
    },
    {
      // A4 with a 1 in band: portrait art area 7.767717 × 10.192913 needs 2 × ceil(10.5 / 9.692913) = 2 × 2 = 4;
      // landscape art area 11.192913 × 6.767717 needs 1 (8 ≤ 11.19) by ceil(10.5 / 6.267717) = ceil(1.68) = 2
      // = 2. Mirrored, the one column's 8 in slice sits against the right margin:
      // 0.25 + (11.192913 − 8) = 3.442913.
      name: "A4, 8 × 11 in, 1 in label band, mirrored",
      options: { artWidthIn: 8, artHeightIn: 11, paper: "a4", labelBandIn: 1, mirror: true },
      orientation: "landscape",
      page: [11.692913, 8.267717], // 297 / 25.4, 210 / 25.4
      printable: [11.192913, 7.767717],
      artArea: [11.192913, 6.767717],
      columns: [[0, 8, 3.442913]],
      rows: [
        [0, 6.767717],
        [6.267717, 4.732283], // 11 − 6.267717 = 4.732283 left
      ],
      pageY: 0.25,
    },
  ];

  it.each(rows)("$name", ({ options, orientation, page, printable, artArea, columns, rows: down, pageY }) => {
    const plan = planTiles(options);
    expect(plan.orientation).toBe(orientation);
    expect(plan.pageWidthIn).toBeCloseTo(page[0], 5);
    expect(plan.pageHeightIn).toBeCloseTo(page[1], 5);
    expect(plan.printableWidthIn).toBeCloseTo(printable[0], 5);
    expect(plan.printableHeightIn).toBeCloseTo(printable[1], 5);
    expect(plan.artAreaWidthIn).toBeCloseTo((artArea ?? printable)[0], 5);
    expect(plan.artAreaHeightIn).toBeCloseTo((artArea ?? printable)[1], 5);
    expect(plan.labelBandIn).toBe(options.labelBandIn ?? 0);
    expect([plan.columns, plan.rows, plan.pages]).toEqual([
      columns.length,
      down.length,
      columns.length * down.length,
    ]);
    for (const t of plan.tiles) {
      const [artX, artWidth, pageX] = columns[t.column]!;
      const [artY, artHeight] = down[t.row]!;
      expect(t.artX, `${t.label} art x`).toBeCloseTo(artX, 5);
      expect(t.artWidth, `${t.label} art width`).toBeCloseTo(artWidth, 5);
      expect(t.pageX, `${t.label} page x`).toBeCloseTo(pageX, 5);
      expect(t.artY, `${t.label} art y`).toBeCloseTo(artY, 5);
      expect(t.artHeight, `${t.label} art height`).toBeCloseTo(artHeight, 5);
      expect(t.pageY, `${t.label} page y`).toBeCloseTo(pageY, 5);
    }
    expectTiledArt(plan);
  });

  it("counts the same pages when auto is told the other orientation (hand values above)", () => {
    // Letter 20 × 30 in portrait: 3 × 3 = 9; Tabloid 30 × 40 in landscape: 2 × 4 = 8 (worked above).
    expect(
      planTiles({ artWidthIn: 20, artHeightIn: 30, paper: "letter", orientation: "portrait" }).pages,
    ).toBe(9);
    expect(
      planTiles({ artWidthIn: 30, artHeightIn: 40, paper: "tabloid", orientation: "landscape" }).pages,
    ).toBe(8);
  });
});

describe("the label band", () => {
  it("keeps the art above it, and tileCoverage notices a tile pushed into it", () => {
    // Letter portrait (ANSI/ASME Y14.1, 8.5 × 11 in), 0.25 in margins, 2 in band: art area 8 × (10.5 − 2) = 8 × 8.5.
    const options = {
      artWidthIn: 6,
      artHeightIn: 8.5,
      paper: "letter" as const,
      orientation: "portrait" as const,
      labelBandIn: 2,
    };
    const plan = planTiles(options);
    expect(plan.pages).toBe(1);
    expect(plan.artAreaHeightIn).toBe(8.5);
    expect(tileCoverage(plan).insidePrintable).toBe(true);
    const pushed = { ...plan, tiles: plan.tiles.map((t) => ({ ...t, pageY: t.pageY + 0.1 })) };
    expect(tileCoverage(pushed).insidePrintable).toBe(false);
    // 8.6 in down no longer fits: ceil((8.6 − 0.5) / (8.5 − 0.5)) = ceil(1.01) = 2 rows, by hand.
    expect(planTiles({ ...options, artHeightIn: 8.6 }).rows).toBe(2);
  });
});

describe("mirrored plans (HTV, sublimation)", () => {
  const plain = planTiles({ artWidthIn: 11, artHeightIn: 14, paper: "letter" });
  const mirrored = mirrorX(plain);

  it("puts the rightmost slice of the art in column 1", () => {
    const a1 = mirrored.tiles.find((t) => t.label === "A1")!;
    expect(mirrored.mirrored).toBe(true);
    expect(a1.column).toBe(0);
    expect([a1.artX, a1.artWidth]).toEqual([7.5, 3.5]);
    expect(a1.artX + a1.artWidth).toBe(plain.artWidthIn);
    // The narrow slice sits against the right margin: 0.25 + (8 − 3.5) = 4.75 (by hand).
    expect(a1.pageX).toBeCloseTo(4.75, 12);
    const a2 = mirrored.tiles.find((t) => t.label === "A2")!;
    expect([a2.artX, a2.artWidth, a2.pageX]).toEqual([0, 8, 0.25]);
  });

  it("is undone by mirroring again", () => {
    expect(mirrorX(mirrored)).toStrictEqual(plain);
    expect(planTiles({ artWidthIn: 11, artHeightIn: 14, paper: "letter", mirror: true })).toStrictEqual(
      mirrored,
    );
  });

  it("keeps labels, rows and neighbours in place", () => {
    expect(mirrored.tiles.map((t) => [t.label, t.row, t.column, t.joins])).toEqual(
      plain.tiles.map((t) => [t.label, t.row, t.column, t.joins]),
    );
    expectTiledArt(mirrored);
    const coverage = tileCoverage(mirrored);
    expect(coverage.coversArt).toBe(true);
    expect(coverage.insidePrintable).toBe(true);
    expect(coverage.horizontalOverlaps).toEqual([0.5, 0.5]);
  });

  it("reflects the whole taped sheet", () => {
    const width = sheetWidth(mirrored); // 7.5 + 8 = 15.5 in, by hand
    expect(width).toBe(15.5);
    for (const t of mirrored.tiles) {
      const p = sheetPosition(mirrored, t, t.artX, t.artY);
      expect(p.x).toBeCloseTo(width - t.artX, 12);
      expect(p.y).toBeCloseTo(t.artY, 12);
    }
  });
});

describe("planTiles input errors", () => {
  it.each([
    { name: "zero art width", opts: { artWidthIn: 0, artHeightIn: 5 }, message: /art width/ },
    { name: "negative art height", opts: { artWidthIn: 5, artHeightIn: -1 }, message: /art height/ },
    { name: "NaN art width", opts: { artWidthIn: NaN, artHeightIn: 5 }, message: /art width/ },
    { name: "infinite art height", opts: { artWidthIn: 5, artHeightIn: Infinity }, message: /art height/ },
    { name: "negative margin", opts: { artWidthIn: 5, artHeightIn: 5, marginIn: -0.1 }, message: /margin/ },
    {
      name: "margin too big",
      opts: { artWidthIn: 5, artHeightIn: 5, marginIn: 4.25 },
      message: /no printable area/,
    },
    { name: "negative overlap", opts: { artWidthIn: 5, artHeightIn: 5, overlapIn: -1 }, message: /overlap/ },
    // Letter's short printable side is 8 in; an 8 in overlap leaves no step.
    {
      name: "overlap as big as the page",
      opts: { artWidthIn: 5, artHeightIn: 5, overlapIn: 8 },
      message: /smaller than/,
    },
    {
      name: "negative label band",
      opts: { artWidthIn: 5, artHeightIn: 5, labelBandIn: -0.5 },
      message: /label band/,
    },
    {
      name: "NaN label band",
      opts: { artWidthIn: 5, artHeightIn: 5, labelBandIn: NaN },
      message: /label band/,
    },
    // Letter's short printable side is 8.5 − 2 × 0.25 = 8 in; an 8 in band leaves nothing for the art.
    {
      name: "label band as deep as the page",
      opts: { artWidthIn: 5, artHeightIn: 5, labelBandIn: 8 },
      message: /no room for art/,
    },
    // 8 − 7 = 1 in of art area across the short side: a 1 in overlap leaves no step.
    {
      name: "overlap as big as the room left above the band",
      opts: { artWidthIn: 5, artHeightIn: 5, labelBandIn: 7, overlapIn: 1 },
      message: /smaller than/,
    },
    {
      name: "too many pages",
      opts: { artWidthIn: 60, artHeightIn: 60, overlapIn: 7.9 },
      message: new RegExp(`more than the ${MAX_TILE_PAGES}`),
    },
  ])("rejects $name", ({ opts, message }) => {
    const call = () => planTiles({ paper: "letter", ...opts });
    expect(call).toThrow(RangeError);
    expect(call).toThrow(message);
  });

  it("rejects an unknown paper id", () => {
    expect(() => planTiles({ artWidthIn: 5, artHeightIn: 5, paper: "b5" as PaperId })).toThrow(RangeError);
  });
});

describe("planTiles properties", () => {
  const options = fc.record({
    artWidthIn: fc.double({ min: 0.25, max: 60, noNaN: true, noDefaultInfinity: true }),
    artHeightIn: fc.double({ min: 0.25, max: 60, noNaN: true, noDefaultInfinity: true }),
    paper: fc.constantFrom<PaperId>("letter", "a4", "tabloid", "a3"),
    marginIn: fc.double({ min: 0, max: 0.75, noNaN: true, noDefaultInfinity: true }),
    overlapIn: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 2, noNaN: true, noDefaultInfinity: true })),
    labelBandIn: fc.oneof(
      fc.constant(0),
      fc.double({ min: 0, max: 3, noNaN: true, noDefaultInfinity: true }),
    ),
    orientation: fc.constantFrom("portrait" as const, "landscape" as const, "auto" as const),
    mirror: fc.boolean(),
  });

  it("covers the art, stays on the page and overlaps neighbours by exactly the overlap", () => {
    fc.assert(
      fc.property(options, (opts) => {
        const plan = planTiles(opts);
        expect(plan.pages).toBe(plan.columns * plan.rows);
        expect(plan.tiles).toHaveLength(plan.pages);
        expect(plan.mirrored).toBe(opts.mirror);
        for (const t of plan.tiles) {
          for (const v of [t.artX, t.artY, t.artWidth, t.artHeight, t.pageX, t.pageY]) {
            expect(Number.isFinite(v)).toBe(true);
          }
          expect(t.artWidth).toBeGreaterThan(0);
          expect(t.artHeight).toBeGreaterThan(0);
          expect(t.artWidth).toBeLessThanOrEqual(plan.artAreaWidthIn + 1e-9);
          expect(t.artHeight).toBeLessThanOrEqual(plan.artAreaHeightIn + 1e-9);
          // Nothing of the art in the label band (from the band's top down to the printable edge).
          expect(t.pageY + t.artHeight).toBeLessThanOrEqual(
            plan.marginIn + plan.printableHeightIn - opts.labelBandIn + 1e-9,
          );
          expect(t.index).toBe(t.row * plan.columns + t.column);
          expect(t.label).toBe(tileLabel(t.row, t.column));
        }
        expect(new Set(plan.tiles.map((t) => t.label)).size).toBe(plan.pages);
        expectTiledArt(plan);
        const coverage = tileCoverage(plan);
        expect(coverage.coversArt).toBe(true);
        expect(coverage.insideArt).toBe(true);
        expect(coverage.insidePrintable).toBe(true);
        expect(coverage.horizontalOverlaps).toHaveLength((plan.columns - 1) * plan.rows);
        expect(coverage.verticalOverlaps).toHaveLength(plan.columns * (plan.rows - 1));
        for (const o of [...coverage.horizontalOverlaps, ...coverage.verticalOverlaps]) {
          expect(o).toBeCloseTo(opts.overlapIn, 7);
        }
      }),
      { numRuns: 200 },
    );
  }, 30_000);

  it("registers every tile on one taped sheet (reflected when mirrored)", () => {
    fc.assert(
      fc.property(
        options,
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (opts, u, v) => {
          const plan = planTiles(opts);
          const width = sheetWidth(plan);
          for (const t of plan.tiles) {
            const x = t.artX + u * t.artWidth;
            const y = t.artY + v * t.artHeight;
            const p = sheetPosition(plan, t, x, y);
            expect(p.x).toBeCloseTo(plan.mirrored ? width - x : x, 7);
            expect(p.y).toBeCloseTo(y, 7);
          }
        },
      ),
      { numRuns: 200 },
    );
  }, 30_000);

  it("uses the fewest pages with auto orientation, preferring portrait on a tie", () => {
    fc.assert(
      fc.property(options, (opts) => {
        const auto = planTiles({ ...opts, orientation: "auto" });
        const portrait = planTiles({ ...opts, orientation: "portrait" });
        const landscape = planTiles({ ...opts, orientation: "landscape" });
        expect(auto.pages).toBe(Math.min(portrait.pages, landscape.pages));
        if (portrait.pages <= landscape.pages) expect(auto.orientation).toBe("portrait");
      }),
      { numRuns: 200 },
    );
  }, 30_000);

  it("is exactly undone by mirroring twice", () => {
    fc.assert(
      fc.property(options, (opts) => {
        const plan = planTiles(opts);
        expect(mirrorX(mirrorX(plan))).toStrictEqual(plan);
        const flipped = mirrorX(plan);
        const first = flipped.tiles.find((t) => t.row === 0 && t.column === 0)!;
        const source = plan.tiles.find((t) => t.row === 0 && t.column === plan.columns - 1)!;
        expect(first.artX).toBe(source.artX);
        expect(first.artWidth).toBe(source.artWidth);
      }),
      { numRuns: 200 },
    );
  }, 30_000);
});
