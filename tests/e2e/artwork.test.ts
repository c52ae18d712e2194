import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type { Browser } from "playwright-core";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launch, newContext, signIn } from "./support";
import { demoCopy, type DemoCopy } from "./demo-copy";
import { getPool } from "@/db/client";

let browser: Browser;
const dir = mkdtempSync(path.join(tmpdir(), "chalkline-art-"));

let demo: DemoCopy;
beforeAll(async () => {
  demo = await demoCopy("artwork");
  browser = await launch();
});
afterAll(async () => {
  await demo?.drop();
  await getPool().end();
  await browser?.close();
});

/** A 3300 × 3300 px crest on a transparent canvas with empty margins, written at 300 ppi. */
async function makeCrest(): Promise<string> {
  const file = path.join(dir, "pennant-crest.png");
  const svg = Buffer.from(
    `<svg xmlns="http://www.w3.org/2000/svg" width="3300" height="3300"><circle cx="1650" cy="1650" r="1650" fill="#1d3557"/><circle cx="1650" cy="1650" r="1100" fill="#f1c453"/><rect x="1250" y="1250" width="800" height="800" fill="#e63946"/></svg>`,
  );
  const png = await sharp({ create: { width: 3700, height: 3500, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } })
    .composite([{ input: svg, left: 200, top: 100 }])
    .withMetadata({ density: 300 })
    .png()
    .toBuffer();
  writeFileSync(file, png);
  return file;
}

describe("artwork uploads", () => {
  it("uploads a PNG through the drop zone, shows progress to 100%, places it and grades its PPI", async () => {
    const crest = await makeCrest();
    const fake = path.join(dir, "sneaky.png");
    writeFileSync(fake, await sharp({ create: { width: 20, height: 20, channels: 3, background: "#345" } }).jpeg().toBuffer());
    const empty = path.join(dir, "empty.png");
    writeFileSync(empty, Buffer.alloc(0));

    const context = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, demo.emails.designer);
    await page.goto(`/shops/${demo.slug}/jobs`);
    await page.getByRole("link", { name: /Spring season team tees/ }).click();
    await page.getByRole("link", { name: /Team tee/ }).click();
    await page.waitForURL(/\/proofs\//);
    await page.locator("[data-testid=proof-canvas][data-scale]").waitFor();

    await page.getByText("Upload art for this client").click();
    const progress: number[] = [];
    const watcher = setInterval(async () => {
      const value = await page.locator('[data-testid=upload-row][data-name="pennant-crest.png"]').getAttribute("data-progress").catch(() => null);
      if (value !== null) progress.push(Number(value));
    }, 50);
    await page.getByLabel("Art files").setInputFiles([crest, fake, empty]);
    const done = page.locator('[data-testid=upload-row][data-name="pennant-crest.png"][data-state=done]');
    await done.waitFor({ timeout: 60_000 });
    clearInterval(watcher);
    expect(await done.getAttribute("data-progress")).toBe("100");
    expect(Math.max(...progress)).toBe(100);

    // Per-file errors: the others say why, clearly.
    await page.locator('[data-testid=upload-row][data-name="sneaky.png"][data-state=failed]').getByText(/named as a PNG image but its contents are a JPEG image/).waitFor({ timeout: 30_000 });
    await page.locator('[data-testid=upload-row][data-name="empty.png"][data-state=failed]').getByText(/The file is empty/).waitFor();

    // The new art appears in the editor once the page data refreshes; place it on the full front.
    await page.locator("#new-art option", { hasText: "pennant-crest" }).waitFor({ state: "attached", timeout: 15_000 });
    await page.locator("#new-art").selectOption({ label: "pennant-crest" });
    await page.locator("#new-loc").selectOption({ label: "Full front" });
    await page.getByRole("button", { name: "Place" }).click();
    const width = page.getByLabel("Width", { exact: true });
    await width.fill("11");
    await width.press("Enter");
    // The ink is 3300 px wide; at 11 in that is 300 ppi (effective PPI = ink pixels ÷ placed inches).
    const grade = page.getByTestId("ppi-grade");
    await expect(grade.getAttribute("data-grade")).resolves.toBe("ideal");
    await expect(grade.textContent()).resolves.toMatch(/300 ppi/);
    await width.fill("14");
    await width.press("Enter");
    await expect(page.getByTestId("ppi-grade").getAttribute("data-grade")).resolves.toBe("visible");
    await page.getByRole("button", { name: "Remove print" }).click();

    // The library shows the trimmed ink size, not the padded canvas.
    await page.goto(`/shops/${demo.slug}/art`);
    const card = page.locator('[data-testid=art-card][data-name="pennant-crest"]');
    await card.getByText("3300 × 3300 px", { exact: true }).waitFor();
    await card.getByText("3700 × 3500 px", { exact: true }).waitFor();
    await context.close();
  });

  it("refuses uploads from production, whose role cannot add art", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, demo.emails.production);
    const response = await page.request.post("/api/uploadthing?actionType=upload&slug=artwork", {
      data: { input: { shopSlug: demo.slug }, files: [{ name: "x.png", size: 10, type: "image/png", lastModified: Date.now() }] },
    });
    expect(response.status()).toBeGreaterThanOrEqual(400);
    expect(response.status()).toBeLessThan(500);
    await context.close();
  });
});
