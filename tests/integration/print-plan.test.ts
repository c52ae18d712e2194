/**
 * One print plan from the page to the files: a graded size's test print measures that size, the
 * spec sheet prints the plan's numbers and flags an overrun, and spares come from the job.
 * Each test builds its own shop (tests/support/factory.ts).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { loadJobPrints } from "@/app/_server/production/plans";
import { runExport } from "@/app/_server/production/run-export";
import { createExport, exportFile, saveGrading, saveJobSizes } from "@/db/queries/production";
import { planSizeText } from "@/lib/production/print-plan";
import { PDF_UNITS_PER_INCH } from "@/lib/units";
import { shopFactory, type BuiltShop } from "../support/factory";

const shops = shopFactory("print-plan");

type PdfJs = typeof import("pdfjs-dist/legacy/build/pdf.mjs");
let pdfjs: PdfJs;

async function open(bytes: Uint8Array) {
  return pdfjs.getDocument({ data: new Uint8Array(bytes), verbosity: 0 }).promise;
}

async function textOf(bytes: Uint8Array): Promise<string> {
  const doc = await open(bytes);
  let out = "";
  for (let n = 1; n <= doc.numPages; n++) {
    const content = await (await doc.getPage(n)).getTextContent();
    out += content.items.map((i) => ("str" in i ? i.str : "")).join(" ") + "\n";
  }
  return out.replace(/\s+/g, " ");
}

/** Widths in inches at which images are drawn, from each page's transforms (ISO 32000: 72 units per inch). */
async function drawnImageWidthsIn(bytes: Uint8Array): Promise<number[]> {
  const doc = await open(bytes);
  const widths: number[] = [];
  for (let n = 1; n <= doc.numPages; n++) {
    const list = await (await doc.getPage(n)).getOperatorList();
    let ctm = [1, 0, 0, 1, 0, 0];
    const stack: number[][] = [];
    list.fnArray.forEach((fn, i) => {
      const args = list.argsArray[i] as number[];
      if (fn === pdfjs.OPS.save) stack.push(ctm);
      else if (fn === pdfjs.OPS.restore) ctm = stack.pop() ?? ctm;
      else if (fn === pdfjs.OPS.transform) ctm = [ctm[0]! * args[0]! + ctm[2]! * args[1]!, ctm[1]! * args[0]! + ctm[3]! * args[1]!, ctm[0]! * args[2]! + ctm[2]! * args[3]!, ctm[1]! * args[2]! + ctm[3]! * args[3]!, 0, 0];
      else if (fn === pdfjs.OPS.paintImageXObject) widths.push(Math.abs(ctm[0]!) / PDF_UNITS_PER_INCH);
    });
  }
  return widths;
}

async function exportNow(s: BuiltShop, kind: "spec-sheet" | "test-print", params: Record<string, unknown> = {}) {
  const id = await createExport({ shopId: s.shop.id, jobId: s.job.id, kind, params, requestedBy: s.owner.id });
  await runExport(id);
  const file = await exportFile({ shopId: s.shop.id, exportId: id });
  expect(file?.state, `export ${kind}`).toBe("done");
  return new Uint8Array(file!.result!);
}

describe("the print plan in the files", () => {
  let s: BuiltShop;
  beforeAll(async () => {
    pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
    s = await shops.build({
      job: {
        method: "dtf",
        sizeRun: [
          { size: "XS", quantity: 2 },
          { size: "S", quantity: 6 },
          { size: "M", quantity: 10 },
          { size: "XL", quantity: 5 },
        ],
      },
    });
    await saveJobSizes({ jobId: s.job.id, sizes: [{ size: "XS", quantity: 2 }, { size: "S", quantity: 6 }, { size: "M", quantity: 10 }, { size: "XL", quantity: 5 }], sparePercent: 5 });
  });

  it("counts spares per size, rounded up, from the job (5 % of 2, 6, 10, 5 is 1 each: ceil)", async () => {
    const { prints } = (await loadJobPrints({ shopId: s.shop.id, jobId: s.job.id }))!;
    const plan = prints[0]!.plan;
    expect(plan.sizes.map((r) => [r.size, r.quantity, r.spares, r.toMake])).toEqual([
      ["XS", 2, 1, 3],
      ["S", 6, 1, 7],
      ["M", 10, 1, 11],
      ["XL", 5, 1, 6],
    ]);
  });

  it("a test print of a graded size measures that size, not the designed width", async () => {
    const before = (await loadJobPrints({ shopId: s.shop.id, jobId: s.job.id }))!.prints[0]!;
    const designed = before.placement.widthIn;
    // XS gets a narrower transfer than designed, on the 1/8 in grid the plan shows.
    const xsWidth = Math.floor((designed - 1.5) * 8) / 8;
    await saveGrading({ jobId: s.job.id, placementId: before.placement.id, transferCount: 2, assignment: { XS: xsWidth, S: designed, M: designed, XL: designed }, totalShortfall: 0 });
    const after = (await loadJobPrints({ shopId: s.shop.id, jobId: s.job.id }))!.prints[0]!;
    expect(after.plan.basis).toBe("graded");
    expect(after.plan.sizes.find((r) => r.size === "XS")!.widthIn).toBe(xsWidth);

    const pdf = await exportNow(s, "test-print", { proofId: s.proof.id, placementId: before.placement.id, size: "XS", paper: "tabloid", mirror: false, outline: false });
    const widths = await drawnImageWidthsIn(pdf);
    expect(widths.length).toBeGreaterThan(0);
    // Every tile draws the whole art at true size and clips it: its drawn width is the art's.
    for (const w of widths) expect(w).toBeCloseTo(xsWidth, 2);
    expect(await textOf(pdf)).toContain("size XS");
  });

  it("the spec sheet prints the plan's numbers for every size and flags a size over its print area", async () => {
    const loaded = (await loadJobPrints({ shopId: s.shop.id, jobId: s.job.id }))!;
    const print = loaded.prints[0]!;
    // XL gets a transfer far wider than its print area.
    await saveGrading({ jobId: s.job.id, placementId: print.placement.id, transferCount: 2, assignment: { XS: print.placement.widthIn, S: print.placement.widthIn, M: print.placement.widthIn, XL: 16 }, totalShortfall: 0 });
    const plan = (await loadJobPrints({ shopId: s.shop.id, jobId: s.job.id }))!.prints[0]!.plan;
    const xl = plan.sizes.find((r) => r.size === "XL")!;
    expect(xl.checks.map((c) => c.code)).toContain("too-wide");
    const text = await textOf(await exportNow(s, "spec-sheet"));
    for (const row of plan.sizes) {
      const shown = planSizeText(plan, row);
      // The spec sheet writes "W x H in" where the page writes "W in × H in": the same eighths.
      const [w, h] = shown.ink.split(" × ").map((t) => t.replace(/ in$/, ""));
      expect(text).toContain(`${w} x ${h} in`);
      expect(text).toContain(shown.count);
    }
    expect(text).toContain("Check: The art is 16 in wide");
    expect(text).toContain("Sizes are of the ink");
    // A date in the shop's clock, never a raw ISO timestamp.
    expect(text).not.toMatch(/\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/);
  });
});
