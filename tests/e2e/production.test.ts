import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launch, newContext, signIn } from "./support";
import { demoCopy, type DemoCopy } from "./demo-copy";
import { getPool } from "@/db/client";

let browser: Browser;
let demo: DemoCopy;
beforeAll(async () => {
  demo = await demoCopy("production");
  browser = await launch();
});
afterAll(async () => {
  await demo?.drop();
  await getPool().end();
  await browser?.close();
});

async function pdfPages(bytes: Buffer): Promise<Array<{ width: number; height: number; text: string }>> {
  const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
  const doc = await pdfjs.getDocument({ data: new Uint8Array(bytes), verbosity: 0 }).promise;
  const pages = [];
  for (let i = 1; i <= doc.numPages; i += 1) {
    const page = await doc.getPage(i);
    const viewport = page.getViewport({ scale: 1 });
    const text = (await page.getTextContent()).items.map((item) => ("str" in item ? item.str : "")).join(" ");
    pages.push({ width: viewport.width, height: viewport.height, text });
  }
  await doc.destroy();
  return pages;
}

describe("production exports", () => {
  it("grades the size run, and exports a spec sheet and a tiled test print with progress", async () => {
    const context = await newContext(browser, { viewport: { width: 1440, height: 1000 }, acceptDownloads: true });
    const page = await context.newPage();
    await signIn(page, demo.emails.production);
    await page.goto(`/shops/${demo.slug}/jobs`);
    await page.getByRole("link", { name: /Spring season team tees/ }).click();
    await page.getByRole("link", { name: "Production" }).click();
    await page.getByText(/Heat presses and transfer platens run hot enough to burn skin/).waitFor();
    await page.getByText(/waist or bottom drawstring may show at most 3 in/).waitFor();
    // Screen print: screens and film positives, no gang sheet.
    await page.getByTestId("screen-list").getByText(/film positive/).first().waitFor();
    expect(await page.getByRole("button", { name: "Gang sheet PNG" }).count()).toBe(0);
    // The press applies the plan's suggested grading with one screen size for the whole run.
    await page.getByLabel("Screen sizes to suggest").first().selectOption("1");
    await page.getByTestId("plan-suggestion").first().waitFor();
    // The suggestion's cost in trade words, not the maths behind it.
    expect(await page.getByTestId("plan-suggestion").first().textContent()).toMatch(/every size prints (at its best print size|within [\d /]+ in of its best print size)/);
    await page.getByRole("button", { name: "Use the suggested sizes" }).first().click();
    await page.getByRole("status").filter({ hasText: "The suggested sizes are now what the spec sheet" }).waitFor();
    await expect(page.getByTestId("plan-now").first().textContent()).resolves.toMatch(/^Printing \(saved sizes\): S1 /);
    const xsInk = (await page.locator("[data-testid=plan-row][data-size=XS] [data-testid=plan-ink]").first().textContent())!;

    // Spec sheet: queued, worked on by the worker with a progress bar, then ready.
    await page.getByRole("button", { name: "Make the spec sheet" }).click();
    const spec = page.locator("[data-testid=export-row][data-kind=spec-sheet]").first();
    await spec.waitFor();
    await page.locator("[data-testid=export-row][data-kind=spec-sheet][data-state=done]").first().waitFor({ timeout: 60_000 });
    const specHref = await spec.getByRole("link", { name: /Download/ }).getAttribute("href");
    const specPdf = Buffer.from(await (await page.request.get(specHref!)).body());
    const specPages = await pdfPages(specPdf);
    // US Letter: 8.5 × 11 in = 612 × 792 pt (ANSI/ASME Y14.1; ISO 32000: 72 units per inch).
    expect(specPages[0]!.width).toBeCloseTo(612, 1);
    expect(specPages[0]!.height).toBeCloseTo(792, 1);
    const allText = specPages.map((p) => p.text).join(" ");
    expect(allText).toContain("Spring season team tees");
    expect(allText).toContain("16 CFR 1120");
    // The spec sheet prints the page's numbers: XS's ink as the table shows it, and the screen's film.
    expect(allText).toContain(xsInk.replace(" in × ", " x "));
    expect(allText).toMatch(/Screen S1: .* film positive/);
    expect(allText).not.toMatch(/\d{4}-\d{2}-\d{2}T\d{2}:/);

    // Test print on A4: 210 × 297 mm = 595.28 × 841.89 pt (ISO 216, 25.4 mm per inch).
    await page.getByLabel("Paper").first().selectOption("a4");
    await page.getByRole("button", { name: "Make test print" }).first().click();
    const print = page.locator("[data-testid=export-row][data-kind=test-print]").first();
    await print.waitFor();
    await page.locator("[data-testid=export-row][data-kind=test-print][data-state=done]").first().waitFor({ timeout: 60_000 });
    // The row and the file both say what the print holds: location, size, paper, and when it was made.
    expect(await print.getByTestId("export-title").textContent()).toMatch(/^Test print \(PDF\) · Full front · size \S+ · A4$/);
    expect(await print.getByTestId("export-state").textContent()).toMatch(/^Ready · made \S/);
    const printLink = print.getByRole("link", { name: /Download/ });
    expect(await printLink.textContent()).toMatch(/^Download spring-season-team-tees-test-print-full-front-size-[a-z0-9]+-a4-\d{4}-\d{2}-\d{2}-\d{4}\.pdf$/);
    const printHref = await printLink.getAttribute("href");
    const printPdf = Buffer.from(await (await page.request.get(printHref!)).body());
    const printPages = await pdfPages(printPdf);
    expect(printPages.length).toBeGreaterThan(1);
    for (const p of printPages) {
      expect(Math.min(p.width, p.height)).toBeCloseTo(595.28, 1);
      expect(Math.max(p.width, p.height)).toBeCloseTo(841.89, 1);
    }

    // A DTF job: a forecast of the sheets before any file, then the gang sheet PNG at 300 ppi on a
    // 22 in roll: 6600 px wide (22 in × 300 ppi).
    await page.goto(`/shops/${demo.slug}/jobs`);
    await page.getByRole("link", { name: /Competition hoodies/ }).click();
    await page.getByRole("link", { name: "Production" }).click();
    const forecast = (await page.getByTestId("gang-forecast").textContent()) ?? "";
    const forecastSheets = Number(/(\d+) sheets? for 26 transfers/.exec(forecast)?.[1]);
    expect(forecastSheets).toBeGreaterThan(0);
    await page.getByRole("button", { name: "Gang sheet PNG" }).click();
    const gang = page.locator("[data-testid=export-row][data-kind=gang-sheet-png]").first();
    await gang.waitFor();
    await page.locator("[data-testid=export-row][data-kind=gang-sheet-png][data-state=done]").first().waitFor({ timeout: 120_000 });
    // One PNG per packed sheet, as many as the forecast said; the first and the last both open at 300 ppi.
    const gangLinks = gang.getByRole("link", { name: /Download/ });
    expect(await gangLinks.count()).toBe(forecastSheets);
    expect(await gang.getByTestId("export-summary").textContent()).toContain(`As made: ${forecastSheets} sheet`);
    const sharp = (await import("sharp")).default;
    for (const i of new Set([0, forecastSheets - 1])) {
      const gangHref = await gangLinks.nth(i).getAttribute("href");
      const gangPng = Buffer.from(await (await page.request.get(gangHref!)).body());
      const meta = await sharp(gangPng, { limitInputPixels: false }).metadata();
      expect(meta.width).toBe(6600);
      expect(meta.density).toBeCloseTo(300, 0);
    }
    await context.close();
  }, 300_000);
});
