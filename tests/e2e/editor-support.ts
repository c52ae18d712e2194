import type { Page } from "playwright-core";
import { expect } from "vitest";
import { DEMO_SHOP } from "./support";

export type ProofJson = {
  id: string;
  version: number;
  garment: { size: string; category: string };
  placements: Array<{ id: string; widthIn: number; heightIn: number; offsetFromCenterIn: number; belowCollarIn: number; rotationDeg: number }>;
};

/** Opens the "Team tee" proof of a shop built like the demo from its jobs list and waits for its art to be drawn. */
export async function openTeeProof(page: Page, zoom = 0.3, shopSlug: string = DEMO_SHOP): Promise<string> {
  await page.goto(`/shops/${shopSlug}/jobs`);
  await page.getByRole("link", { name: /Spring season team tees/ }).click();
  await page.getByRole("link", { name: /Team tee/ }).click();
  await page.waitForURL(/\/proofs\//);
  const proofId = new URL(page.url()).pathname.split("/").pop()!;
  await page.goto(`/shops/${shopSlug}/proofs/${proofId}?zoom=${zoom}`);
  await waitForArt(page);
  return proofId;
}

export async function waitForArt(page: Page): Promise<void> {
  await page.locator("[data-testid=proof-canvas][data-scale]").waitFor();
  await page.waitForFunction(() => {
    const konva = (window as unknown as { Konva?: { stages: Array<{ findOne: (s: string) => unknown }> } }).Konva;
    return !!konva?.stages?.[0]?.findOne(".art");
  });
}

export async function fetchProof(page: Page, id: string): Promise<ProofJson> {
  const response = await page.request.get(`/api/proofs/${id}`);
  expect(response.status()).toBe(200);
  return (await response.json()) as ProofJson;
}

/**
 * Waits for the edit just made to be stored: the indicator's count of stored saves goes past the
 * count it showed when this was called (the autosave waits 700 ms before it sends, so the count
 * read here is always from before the edit's save), and it says "saved" again.
 */
export async function waitSaved(page: Page, timeout = 15_000): Promise<void> {
  const status = page.locator("[data-testid=save-status]");
  const before = Number(await status.getAttribute("data-saves"));
  await expect
    .poll(async () => {
      const [saves, state] = await Promise.all([status.getAttribute("data-saves"), status.getAttribute("data-state")]);
      return Number(saves) > before && state === "saved";
    }, { timeout, message: `no save was stored after the edit (saves were ${before})` })
    .toBe(true);
}
