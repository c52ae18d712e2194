/** Debian's Chromium through playwright-core, launched as the end-to-end tests launch it. */
import { existsSync } from "node:fs";
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";

export const CHROMIUM = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";

export async function launchChromium(): Promise<Browser> {
  if (!existsSync(CHROMIUM)) throw new Error(`Chromium is missing at ${CHROMIUM}; install Debian's chromium or set CHROMIUM_PATH`);
  return chromium.launch({
    executablePath: CHROMIUM,
    headless: true,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run"],
  });
}

export async function benchContext(browser: Browser, baseURL: string): Promise<BrowserContext> {
  const context = await browser.newContext({ baseURL, viewport: { width: 1440, height: 1000 }, deviceScaleFactor: 1 });
  context.setDefaultTimeout(30_000);
  return context;
}

export async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in", exact: true }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
}

type KonvaWindow = { Konva?: { stages: Array<{ findOne: (selector: string) => { image: () => HTMLImageElement | undefined } | undefined }> } };

/** Waits until the Konva stage has drawn the placed art with its image loaded. */
export async function waitForArt(page: Page): Promise<void> {
  await page.locator("[data-testid=proof-canvas][data-scale]").first().waitFor();
  await page.waitForFunction(() => {
    const konva = (window as unknown as KonvaWindow).Konva;
    const image = konva?.stages?.[0]?.findOne(".art")?.image();
    return !!image && image.complete && image.naturalWidth > 0;
  });
}
