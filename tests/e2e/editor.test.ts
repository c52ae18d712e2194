import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launch, newContext, signIn } from "./support";
import { waitSaved } from "./editor-support";
import { demoCopy, type DemoCopy } from "./demo-copy";
import { getPool } from "@/db/client";

type ProofJson = {
  id: string;
  version: number;
  garment: { size: string; category: string };
  placements: Array<{ id: string; widthIn: number; heightIn: number; offsetFromCenterIn: number; belowCollarIn: number; rotationDeg: number; warnings: Array<{ code: string; message: string }> }>;
};

let browser: Browser;
let demo: DemoCopy;
beforeAll(async () => {
  demo = await demoCopy("editor");
  browser = await launch();
});
afterAll(async () => {
  await demo?.drop();
  await getPool().end();
  await browser?.close();
});

async function openTeeProof(page: Page, zoom = 0.3): Promise<string> {
  await page.goto(`/shops/${demo.slug}/jobs`);
  await page.getByRole("link", { name: /Spring season team tees/ }).click();
  await page.getByRole("link", { name: /Team tee/ }).click();
  await page.waitForURL(/\/proofs\//);
  const proofId = new URL(page.url()).pathname.split("/").pop()!;
  await page.goto(`/shops/${demo.slug}/proofs/${proofId}?zoom=${zoom}`);
  await page.locator("[data-testid=proof-canvas][data-scale]").waitFor();
  await page.waitForFunction(() => {
    const konva = (window as unknown as { Konva?: { stages: Array<{ findOne: (s: string) => unknown }> } }).Konva;
    return !!konva?.stages?.[0]?.findOne(".art");
  });
  return proofId;
}

async function canvasGeometry(page: Page) {
  const canvas = page.locator("[data-testid=proof-canvas]");
  const box = (await canvas.boundingBox())!;
  const scale = Number(await canvas.getAttribute("data-scale"));
  const originX = Number(await canvas.getAttribute("data-origin-x"));
  const originY = Number(await canvas.getAttribute("data-origin-y"));
  return { box, scale, originX, originY };
}

async function fetchProof(page: Page, id: string): Promise<ProofJson> {
  const response = await page.request.get(`/api/proofs/${id}`);
  expect(response.status()).toBe(200);
  return (await response.json()) as ProofJson;
}

async function calibrate(page: Page, cardPx: number) {
  await page.getByRole("button", { name: "Calibrate with a card" }).click();
  await page.getByLabel("Card width", { exact: true }).fill(String(cardPx));
  await page.getByRole("button", { name: "Use this calibration" }).click();
  await page.getByRole("dialog").waitFor({ state: "hidden" });
}

describe("true-scale editor", () => {
  it("moves art by the dragged inches, sizes it from the inspector, and keeps it after a reload", async () => {
    const context = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, demo.emails.designer);
    const proofId = await openTeeProof(page, 0.3);

    // Calibration: an ID-1 card is 85.60 mm wide (ISO/IEC 7810); 337.0 px across it is 100.0 px per inch.
    await calibrate(page, 337);
    await page.waitForFunction(() => Math.abs(Number(document.querySelector("[data-testid=proof-canvas]")?.getAttribute("data-scale")) - 30) < 0.05);
    const { box, scale, originX, originY } = await canvasGeometry(page);
    expect(scale).toBeCloseTo((337 / (85.6 / 25.4)) * 0.3, 2);

    const before = await fetchProof(page, proofId);
    const art = before.placements[0]!;
    const cx = box.x + originX + art.offsetFromCenterIn * scale;
    const cy = box.y + originY + (art.belowCollarIn + art.heightIn / 2) * scale;
    const dx = 90;
    const dy = 45;
    await page.mouse.move(cx, cy);
    await page.mouse.down();
    for (let i = 1; i <= 10; i += 1) await page.mouse.move(cx + (dx * i) / 10, cy + (dy * i) / 10);
    await page.mouse.up();
    await waitSaved(page);

    const after = await fetchProof(page, proofId);
    const moved = after.placements[0]!;
    expect(after.version).toBeGreaterThan(before.version);
    // Within 1/16 in of the measured drag.
    expect(Math.abs(moved.offsetFromCenterIn - (art.offsetFromCenterIn + dx / scale))).toBeLessThanOrEqual(1 / 16);
    expect(Math.abs(moved.belowCollarIn - (art.belowCollarIn + dy / scale))).toBeLessThanOrEqual(1 / 16);
    expect(moved.widthIn).toBeCloseTo(art.widthIn, 6);

    // Type 11 in into the width: the node becomes 11 in wide on the canvas at this scale.
    const width = page.getByLabel("Width", { exact: true });
    await width.fill("11");
    await width.press("Enter");
    await waitSaved(page);
    const nodeWidth = await page.evaluate(() => {
      const konva = (window as unknown as { Konva: { stages: Array<{ findOne: (s: string) => { width: () => number; scaleX: () => number } }> } }).Konva;
      const node = konva.stages[0]!.findOne(".art");
      return node.width() * node.scaleX();
    });
    expect(nodeWidth).toBeCloseTo(11 * scale, 1);
    const sized = (await fetchProof(page, proofId)).placements[0]!;
    expect(sized.widthIn).toBeCloseTo(11, 6);
    expect(sized.heightIn).toBeCloseTo(11 * (art.heightIn / art.widthIn), 6);

    await page.reload();
    await page.locator("[data-testid=proof-canvas][data-scale]").waitFor();
    const reloaded = (await fetchProof(page, proofId)).placements[0]!;
    expect(reloaded).toEqual(sized);
    await expect(page.getByLabel("Width", { exact: true }).inputValue()).resolves.toBe("11");
    await context.close();
  });

  it("nudges with the arrow keys by 1/8 in and by 1 in with shift, and undoes", async () => {
    const context = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, demo.emails.designer);
    const proofId = await openTeeProof(page);
    const start = (await fetchProof(page, proofId)).placements[0]!;
    await page.getByRole("heading", { name: "Team tee" }).click();
    await page.keyboard.press("ArrowDown");
    await page.keyboard.press("Shift+ArrowRight");
    await waitSaved(page);
    const nudged = (await fetchProof(page, proofId)).placements[0]!;
    expect(nudged.belowCollarIn).toBeCloseTo(start.belowCollarIn + 0.125, 6);
    expect(nudged.offsetFromCenterIn).toBeCloseTo(start.offsetFromCenterIn + 1, 6);
    await page.getByRole("button", { name: "Undo" }).click();
    await page.getByRole("button", { name: "Undo" }).click();
    await waitSaved(page);
    const undone = (await fetchProof(page, proofId)).placements[0]!;
    expect(undone.offsetFromCenterIn).toBeCloseTo(start.offsetFromCenterIn, 6);
    expect(undone.belowCollarIn).toBeCloseTo(start.belowCollarIn, 6);
    await context.close();
  });

  it("warns in words when art is too wide for the size, through the API and on screen", async () => {
    const context = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, demo.emails.owner);
    const proofId = await openTeeProof(page);
    const width = page.getByLabel("Width", { exact: true });
    await width.fill("13");
    await width.press("Enter");
    await page.locator("[data-code=too-wide]").waitFor();
    await waitSaved(page);
    const json = await fetchProof(page, proofId);
    expect(json.placements[0]!.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(["too-wide", "seam-clearance"]));
    await width.fill("10");
    await width.press("Enter");
    await waitSaved(page);
    await context.close();
  });

  it("refuses a stale save from a second session and offers the latest", async () => {
    const a = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const b = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const pageA = await a.newPage();
    const pageB = await b.newPage();
    await signIn(pageA, demo.emails.designer);
    await signIn(pageB, demo.emails.owner);
    const proofId = await openTeeProof(pageA);
    await openTeeProof(pageB);
    const belowA = pageA.getByLabel("Below collar");
    await belowA.fill("3.5");
    await belowA.press("Enter");
    await waitSaved(pageA);
    const belowB = pageB.getByLabel("Below collar");
    await belowB.fill("4");
    await belowB.press("Enter");
    await pageB.getByRole("alert").filter({ hasText: /Someone else saved this proof/ }).waitFor();
    expect((await fetchProof(pageA, proofId)).placements[0]!.belowCollarIn).toBe(3.5);
    await pageB.getByRole("button", { name: "Load the latest" }).click();
    await expect(pageB.getByLabel("Below collar").inputValue()).resolves.toBe("3.5");
    await belowA.fill("3");
    await belowA.press("Enter");
    await waitSaved(pageA);
    await a.close();
    await b.close();
  });

  it("keeps edits made offline and saves them when the connection returns", async () => {
    const context = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, demo.emails.designer);
    const proofId = await openTeeProof(page);
    await context.setOffline(true);
    const below = page.getByLabel("Below collar");
    await below.fill("3.25");
    await below.press("Enter");
    await page.locator("[data-testid=save-status][data-state=offline]").waitFor({ timeout: 15_000 });
    await context.setOffline(false);
    await waitSaved(page);
    expect((await fetchProof(page, proofId)).placements[0]!.belowCollarIn).toBe(3.25);
    await below.fill("3");
    await below.press("Enter");
    await waitSaved(page);
    await context.close();
  });

  it("lets production look but not edit, and hides another shop's proof", async () => {
    const context = await newContext(browser, { viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signIn(page, demo.emails.production);
    const proofId = await openTeeProof(page);
    await page.getByText("View only").waitFor();
    await expect(page.getByLabel("Width", { exact: true }).isDisabled()).resolves.toBe(true);
    await context.close();

    const anon = await newContext(browser);
    expect((await anon.request.get(`/api/proofs/${proofId}`)).status()).toBe(401);
    await anon.close();
  });
});
