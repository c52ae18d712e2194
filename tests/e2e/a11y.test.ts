import AxeBuilder from "@axe-core/playwright";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { fetchProof, openTeeProof, waitSaved } from "./editor-support";
import { launch, newContext, signIn } from "./support";
import { demoCopy, type DemoCopy } from "./demo-copy";
import { getPool } from "@/db/client";

let browser: Browser;
let owner: BrowserContext;
let page: Page;
let demo: DemoCopy;
beforeAll(async () => {
  demo = await demoCopy("a11y");
  browser = await launch();
  owner = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
  page = await owner.newPage();
  await signIn(page, demo.emails.owner);
});
afterAll(async () => {
  await demo?.drop();
  await getPool().end();
  await browser?.close();
});

const TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa", "best-practice"];

/** Runs axe on the page as it is now; fails on serious or critical findings and prints the rest. */
async function audit(target: Page, label: string) {
  // Let client components settle (fonts, the lazily loaded canvas).
  await target.waitForLoadState("networkidle").catch(() => undefined);
  const results = await new AxeBuilder({ page: target }).withTags(TAGS).analyze();
  const lines = results.violations.map((v) => `${v.impact ?? "?"} ${v.id}: ${v.help} — ${v.nodes.map((n) => n.target.join(" ")).slice(0, 4).join(" | ")}`);
  if (lines.length) console.log(`[a11y] ${label}\n  ${lines.join("\n  ")}`);
  const blocking = results.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(blocking.map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`), label).toEqual([]);
  expect(await labelMismatches(target), `${label}: a visible label that is not its control's accessible name`).toEqual([]);
}

/**
 * Every visible label is the accessible name of its control (WCAG 2.5.3, label in name): for each
 * shown field with a <label>, and each shown button or link with words on it, the name a screen
 * reader or voice control uses must contain the words on screen. axe's own rule for this is
 * experimental and skips fields, so the page is read here too.
 */
async function labelMismatches(target: Page): Promise<string[]> {
  return target.evaluate(() => {
    const norm = (t: string) => t.toLowerCase().replace(/[^\p{L}\p{N}]+/gu, " ").trim();
    const shown = (el: Element) => (el as HTMLElement).getClientRects().length > 0 && getComputedStyle(el).visibility !== "hidden";
    // A label's own words, without the text of the controls inside it (a select's options).
    const ownText = (label: Element) => {
      const copy = label.cloneNode(true) as Element;
      copy.querySelectorAll("select, input, textarea, button, .sr-only, [aria-hidden=true]").forEach((c) => c.remove());
      return copy.textContent ?? "";
    };
    const nameOf = (el: Element, visible: string) => {
      const by = el.getAttribute("aria-labelledby");
      if (by) return by.split(/\s+/).map((id) => document.getElementById(id)?.textContent ?? "").join(" ");
      return el.getAttribute("aria-label") ?? visible;
    };
    const out: string[] = [];
    const describe = (el: Element) => `${el.tagName.toLowerCase()}${el.id ? `#${el.id}` : ""}`;
    for (const el of Array.from(document.querySelectorAll("input:not([type=hidden]), select, textarea"))) {
      if (!shown(el)) continue;
      const labels = Array.from((el as HTMLInputElement).labels ?? []);
      const visible = norm(labels.map(ownText).join(" "));
      if (!visible) continue;
      const name = norm(nameOf(el, visible));
      if (!name.includes(visible)) out.push(`${describe(el)}: shows "${visible}", named "${name}"`);
    }
    for (const el of Array.from(document.querySelectorAll("button, a[href], [role=button], [role=tab]"))) {
      if (!shown(el) || !(el.hasAttribute("aria-label") || el.hasAttribute("aria-labelledby"))) continue;
      const visible = norm((el as HTMLElement).innerText ?? "");
      // Symbols alone (+, −, ×) carry no words to match.
      if (!/\p{L}{2,}/u.test(visible)) continue;
      const name = norm(nameOf(el, visible));
      if (!name.includes(visible)) out.push(`${describe(el)}: shows "${visible}", named "${name}"`);
    }
    return out;
  });
}

async function proofIdOf(target: Page, jobTitle: RegExp, proofName: RegExp): Promise<string> {
  await target.goto(`/shops/${demo.slug}/jobs`);
  await target.getByRole("link", { name: jobTitle }).click();
  await target.getByRole("link", { name: proofName }).click();
  await target.waitForURL(/\/proofs\//);
  await target.locator("[data-testid=proof-canvas][data-scale]").waitFor();
  return new URL(target.url()).pathname.split("/").pop()!;
}

describe("accessibility of the main pages (axe, WCAG 2.2 AA)", () => {
  it("landing and sign-in pages, signed out", async () => {
    const anon = await newContext(browser);
    const visitor = await anon.newPage();
    await visitor.goto("/");
    await audit(visitor, "landing /");
    await visitor.goto("/sign-in");
    await audit(visitor, "/sign-in");
    await visitor.getByLabel("E-mail").fill(demo.emails.owner);
    await visitor.getByLabel("Password").fill("not-the-password");
    await visitor.getByRole("button", { name: "Sign in", exact: true }).click();
    await visitor.getByRole("alert").waitFor();
    await audit(visitor, "/sign-in with an error");
    await anon.close();
  });

  it("shop overview, blanks and art library", async () => {
    await page.goto(`/shops/${demo.slug}`);
    await audit(page, "shop overview");
    await page.goto(`/shops/${demo.slug}/blanks`);
    await audit(page, "blanks list");
    await page.goto(`/shops/${demo.slug}/art`);
    await audit(page, "art library");
    await page.goto(`/shops/${demo.slug}/settings`);
    await audit(page, "shop settings and team");
    await page.goto(`/shops/${demo.slug}/blanks`);
    await page.locator(`a[href^="/shops/${demo.slug}/blanks/"]`).first().click();
    await page.waitForURL(/\/blanks\/[^/]+$/);
    await audit(page, "blank editor");
  });

  it("jobs list and board, a job with its quote, the job form, clients and prices", async () => {
    await page.goto(`/shops/${demo.slug}/jobs`);
    await audit(page, "jobs list");
    await page.goto(`/shops/${demo.slug}/jobs?view=board`);
    await audit(page, "jobs board");
    await page.goto(`/shops/${demo.slug}/jobs/new`);
    await audit(page, "new job form");
    await page.getByRole("button", { name: "Create job" }).click();
    await page.locator(".field-error").first().waitFor();
    await audit(page, "new job form with errors");
    await page.goto(`/shops/${demo.slug}/jobs`);
    await page.getByRole("link", { name: /Spring season team tees/ }).click();
    await page.getByTestId("job-money").waitFor();
    await audit(page, "job page with quote and payments");
    await page.goto(`/shops/${demo.slug}/clients`);
    await audit(page, "clients");
    await page.goto(`/shops/${demo.slug}/clients/new`);
    await audit(page, "new client form");
    await page.goto(`/shops/${demo.slug}/prices`);
    await audit(page, "price matrix");
  });

  it("the client's jobs", async () => {
    const clientContext = await newContext(browser, { viewport: { width: 420, height: 900 } });
    const client = await clientContext.newPage();
    await signIn(client, demo.emails.client);
    await client.goto("/portal");
    await audit(client, "client portal");
    await client.getByRole("link", { name: /Spring season team tees/ }).click();
    await client.waitForURL(/\/portal\/jobs\//);
    await audit(client, "client job page");
    await clientContext.close();
  });

  it("the proof editor", async () => {
    await openTeeProof(page, 0.3, demo.slug);
    await audit(page, "editor");
    await page.getByRole("button", { name: "Share with client" }).click();
    await page.getByRole("dialog").waitFor();
    await audit(page, "editor: share dialog");
    await page.getByRole("button", { name: "Close" }).click();
    await page.getByRole("button", { name: "Calibrate with a card" }).click();
    await page.getByRole("dialog").waitFor();
    await audit(page, "editor: calibration dialog");
    await page.keyboard.press("Escape");
    await page.getByRole("dialog").waitFor({ state: "hidden" });
  });

  it("the client review page", async () => {
    await proofIdOf(page, /Market stall totes/, /Market tote/);
    await page.getByRole("button", { name: "Share with client" }).click();
    await page.getByRole("button", { name: "Make a link to copy" }).click();
    const url = await page.getByLabel("Review link").inputValue();
    await page.getByRole("button", { name: "Close" }).click();
    const anon = await newContext(browser, { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    const visitor = await anon.newPage();
    await visitor.goto(url);
    await visitor.locator("[data-testid=review-canvas] [data-testid=proof-canvas][data-scale]").waitFor();
    await audit(visitor, "review /r/<token>");
    await anon.close();
  });

  it("the production page", async () => {
    await page.goto(`/shops/${demo.slug}/jobs`);
    await page.getByRole("link", { name: /Spring season team tees/ }).click();
    await page.getByRole("link", { name: "Production" }).click();
    await page.getByTestId("plan-now").first().waitFor();
    await audit(page, "production");
  });
});

describe("the editor without a mouse", () => {
  it("reaches the art with Tab, nudges it with the arrow keys, and sizes and places it from the inspector fields", async () => {
    const context = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const keys = await context.newPage();
    await signIn(keys, demo.emails.designer);
    const proofId = await openTeeProof(keys, 0.3, demo.slug);
    const start = (await fetchProof(keys, proofId)).placements[0]!;

    /** Presses Tab until the focused element matches, as a keyboard user would. */
    async function tabTo(matches: (el: Element) => boolean, describe: string, max = 80) {
      for (let i = 0; i < max; i += 1) {
        await keys.keyboard.press("Tab");
        if (await keys.evaluate(`(${matches.toString()})(document.activeElement)`)) return;
      }
      throw new Error(`Tab never reached ${describe}`);
    }

    // From the top of the page: Tab to the garment canvas, which says which print is selected.
    await keys.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    await tabTo((el) => el.getAttribute("data-testid") === "canvas-focus", "the garment canvas");
    const described = await keys.evaluate(() => {
      const el = document.activeElement!;
      const ids = (el.getAttribute("aria-describedby") ?? "").split(/\s+/).filter(Boolean);
      return ids.map((id) => document.getElementById(id)?.textContent ?? "").join(" ");
    });
    expect(described).toMatch(/Full front/);
    // A visible focus ring while the canvas has keyboard focus.
    const outline = await keys.evaluate(() => getComputedStyle(document.activeElement!).outlineStyle);
    expect(outline).not.toBe("none");

    await keys.keyboard.press("ArrowRight");
    await keys.keyboard.press("ArrowDown");
    await keys.keyboard.press("ArrowDown");
    await waitSaved(keys);
    let now = (await fetchProof(keys, proofId)).placements[0]!;
    expect(now.offsetFromCenterIn).toBeCloseTo(start.offsetFromCenterIn + 0.125, 6);
    expect(now.belowCollarIn).toBeCloseTo(start.belowCollarIn + 0.25, 6);

    // On to the inspector: width, then the position fields, typed and confirmed with Enter.
    await tabTo((el) => el.id !== "" && document.querySelector(`label[for="${el.id}"]`)?.textContent?.trim() === "Width", "the Width field");
    await keys.keyboard.press("ControlOrMeta+A");
    await keys.keyboard.type("9");
    await keys.keyboard.press("Enter");
    await waitSaved(keys);
    await tabTo((el) => el.id !== "" && document.querySelector(`label[for="${el.id}"]`)?.textContent?.trim() === "From center", "the From center field");
    await keys.keyboard.press("ControlOrMeta+A");
    await keys.keyboard.type("-1.25");
    await keys.keyboard.press("Tab");
    await waitSaved(keys);
    await keys.keyboard.press("ControlOrMeta+A");
    await keys.keyboard.type("3.5");
    await keys.keyboard.press("Enter");
    await waitSaved(keys);
    now = (await fetchProof(keys, proofId)).placements[0]!;
    expect(now.widthIn).toBeCloseTo(9, 6);
    expect(now.heightIn).toBeCloseTo(9 * (start.heightIn / start.widthIn), 6);
    expect(now.offsetFromCenterIn).toBeCloseTo(-1.25, 6);
    expect(now.belowCollarIn).toBeCloseTo(3.5, 6);

    // Put the demo proof back for the tests after this one.
    const restore = keys.getByLabel("Width", { exact: true });
    await restore.fill(String(start.widthIn));
    await restore.press("Enter");
    await waitSaved(keys);
    for (const [label, value] of [
      ["From center", start.offsetFromCenterIn],
      ["Below collar", start.belowCollarIn],
    ] as const) {
      const field = keys.getByLabel(label, { exact: true });
      await field.fill(String(value));
      await field.press("Enter");
      await waitSaved(keys);
    }
    expect((await fetchProof(keys, proofId)).placements[0]).toMatchObject({ widthIn: start.widthIn, offsetFromCenterIn: start.offsetFromCenterIn, belowCollarIn: start.belowCollarIn });
    await context.close();
  });
});
