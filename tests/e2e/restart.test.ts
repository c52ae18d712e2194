import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startCluster, stopCluster, testCluster, waitForHealth } from "./db-control";
import { fetchProof, openTeeProof, waitForArt, waitSaved } from "./editor-support";
import { launch, newContext, signIn } from "./support";
import { demoCopy, type DemoCopy } from "./demo-copy";
import { getPool } from "@/db/client";

const cluster = testCluster();
let browser: Browser;
let demo: DemoCopy;
beforeAll(async () => {
  demo = await demoCopy("restart");
  browser = await launch();
});
afterAll(async () => {
  await demo?.drop();
  await getPool().end();
  await browser?.close();
});

describe("database restart during an editing session", () => {
  // Only the cluster `npm test` started may be stopped; an outside database is left alone.
  it.skipIf(!cluster)("keeps an edit made while the database is down, says it is not saved, and saves it by itself once it is back", async () => {
    const target = cluster!;
    const context = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    try {
      await signIn(page, demo.emails.designer);
      const proofId = await openTeeProof(page, 0.3, demo.slug);
      const before = (await fetchProof(page, proofId)).placements[0]!;
      await page.locator("[data-testid=save-status][data-state=saved]").waitFor();

      await stopCluster(target);
      const down = await waitForHealth(503);
      expect(down.body).toMatchObject({ status: "degraded", db: "down" });

      // Nudge right by 1/8 in from the keyboard; autosave cannot store it.
      await page.getByRole("heading", { name: "Team tee" }).click();
      await page.keyboard.press("ArrowRight");
      const status = page.getByTestId("save-status");
      // Between tries the indicator says "Saving…"; read the retrying state in one go.
      const retrying = await page.waitForFunction(
        () => {
          const el = document.querySelector("[data-testid=save-status][data-state=retrying]");
          return el ? { text: el.textContent ?? "", title: el.getAttribute("title") ?? "" } : null;
        },
        undefined,
        { timeout: 15_000 },
      );
      const shown = (await retrying.jsonValue())!;
      expect(shown.text).toMatch(/Not saved yet.*retrying/);
      expect(shown.title).toMatch(/database did not answer/);
      // The edit stays on screen and on this device while it waits.
      expect(Number(await page.getByLabel("From center").inputValue())).toBeCloseTo(before.offsetFromCenterIn + 0.125, 3);
      const pending = await page.evaluate((id) => window.localStorage.getItem(`chalkline.pending.${id}`), proofId);
      const kept = JSON.parse(pending ?? "null") as { doc: { placements: Array<{ offsetFromCenterIn: number }> } } | null;
      expect(kept?.doc.placements[0]?.offsetFromCenterIn).toBeCloseTo(before.offsetFromCenterIn + 0.125, 6);
      // Still not saved after a few retries: between tries it is "saving", then "retrying" again.
      // Two more tries seen to fail (the indicator counts them), and still nothing stored.
      const triedBefore = Number(await status.getAttribute("data-retries"));
      await expect.poll(async () => Number(await status.getAttribute("data-retries")), { timeout: 20_000 }).toBeGreaterThanOrEqual(triedBefore + 2);
      await expect(status.getAttribute("data-state")).resolves.toMatch(/^(retrying|saving)$/);
      await expect(status.getAttribute("data-saves")).resolves.toBe("0");

      await startCluster(target);
      const up = await waitForHealth(200);
      expect(up.body).toMatchObject({ status: "ok", db: "ok" });

      // No click, no reload: the retry goes through by itself.
      await page.locator("[data-testid=save-status][data-state=saved]").waitFor({ timeout: 45_000 });
      const saved = (await fetchProof(page, proofId)).placements[0]!;
      expect(saved.offsetFromCenterIn).toBeCloseTo(before.offsetFromCenterIn + 0.125, 6);
      expect(saved.belowCollarIn).toBeCloseTo(before.belowCollarIn, 6);

      await page.reload();
      await waitForArt(page);
      expect(Number(await page.getByLabel("From center").inputValue())).toBeCloseTo(before.offsetFromCenterIn + 0.125, 3);
      expect((await fetchProof(page, proofId)).placements[0]!.offsetFromCenterIn).toBeCloseTo(before.offsetFromCenterIn + 0.125, 6);

      // Put the demo proof back for the tests after this one.
      await page.getByRole("heading", { name: "Team tee" }).click();
      await page.keyboard.press("ArrowLeft");
      await waitSaved(page);
      expect((await fetchProof(page, proofId)).placements[0]!.offsetFromCenterIn).toBeCloseTo(before.offsetFromCenterIn, 6);

      // The export queue reconnected too: the worker still makes a spec sheet (on a job the
      // production tests do not use).
      await page.goto(`/shops/${demo.slug}/jobs`);
      await page.getByRole("link", { name: /Market stall totes/ }).click();
      await page.getByRole("link", { name: "Production" }).click();
      const done = page.locator("[data-testid=export-row][data-kind=spec-sheet][data-state=done]");
      await page.getByRole("button", { name: "Make the spec sheet" }).waitFor();
      const doneBefore = await done.count();
      await page.getByRole("button", { name: "Make the spec sheet" }).click();
      await expect.poll(() => done.count(), { timeout: 90_000, interval: 1_000 }).toBeGreaterThan(doneBefore);
    } finally {
      // Whatever happened above, the database is running again before the next test starts.
      await startCluster(target);
      await waitForHealth(200, 60_000);
      await context.close();
    }
  }, 180_000);
});
