import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launch, newContext, signIn } from "./support";
import { demoCopy, type DemoCopy } from "./demo-copy";
import { getPool } from "@/db/client";

const libraryTee = () => `/shops/${demo.slug}/blanks/library-everyday-crew-tee`;

let browser: Browser;
let demo: DemoCopy;
beforeAll(async () => {
  demo = await demoCopy("blanks");
  browser = await launch();
});
afterAll(async () => {
  await demo?.drop();
  await getPool().end();
  await browser?.close();
});

/** Waits until the page's client code is live, so clicks reach their handlers. */
async function settle(page: Page): Promise<void> {
  await page.waitForLoadState("networkidle");
}

async function openCopyOfLibraryTee(page: Page): Promise<string> {
  await page.goto(libraryTee());
  await settle(page);
  await page.getByRole("button", { name: "Make an editable copy" }).click();
  await page.waitForURL((url) => /\/blanks\/(?!library-)[^/]+$/.test(url.pathname));
  await settle(page);
  return new URL(page.url()).pathname;
}

/**
 * From now on, the page's server-action requests are sent with another context's session (and so as
 * another person); page loads stay as they are.
 */
async function sendActionsAs(page: Page, as: BrowserContext): Promise<void> {
  await page.route("**/*", async (route) => {
    const request = route.request();
    const headers = request.headers();
    if (request.method() === "POST" && headers["next-action"]) {
      // Drop this page's own cookies; the other context's request jar supplies its session.
      const rest = { ...headers };
      delete rest.cookie;
      const response = await as.request.fetch(request.url(), {
        method: "POST",
        headers: rest,
        data: request.postDataBuffer() ?? undefined,
      });
      await route.fulfill({ response });
    } else {
      await route.continue();
    }
  });
}

/** The cell of a read-only size chart for one size and one column. */
function chartCell(page: Page, size: string, column: number) {
  return page
    .getByRole("table")
    .getByRole("row")
    .filter({ has: page.getByRole("rowheader", { name: size, exact: true }) })
    .getByRole("cell")
    .nth(column);
}

describe("the blank library", () => {
  it("lets the owner copy a library tee, fix one number, and keep it", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, demo.emails.owner);
    await page
      .getByRole("navigation", { name: "Main" })
      .getByRole("link", { name: "Blanks", exact: true })
      .click();
    await page.waitForURL(/\/blanks$/);
    await page.getByRole("heading", { name: "Unisex tee" }).waitFor();
    await expect(page.getByText("Measurements are approximate").count()).resolves.toBe(1);

    const card = page
      .getByRole("link")
      .filter({ has: page.getByRole("heading", { name: "Everyday Crew Tee", exact: true }) });
    await expect(card.getByText("Library", { exact: true }).count()).resolves.toBe(1);
    await expect(card.getByText("XS–4XL").count()).resolves.toBe(1);
    await card.click();
    await page.waitForURL((url) => url.pathname === libraryTee());
    await settle(page);

    await page.getByRole("heading", { level: 1, name: "Everyday Crew Tee" }).waitFor();
    await page.getByText("Approximate — edit to your supplier's chart").waitFor();
    // Library blanks are read-only: a chart to read, no inputs. Group is column 0, chest width column 1.
    await expect(chartCell(page, "M", 1).textContent()).resolves.toBe("20");
    await expect(page.getByRole("textbox").count()).resolves.toBe(0);
    await page.getByRole("radio", { name: "cm" }).click();
    await expect(chartCell(page, "M", 1).textContent()).resolves.toBe("50.8");

    await page.getByRole("button", { name: "Make an editable copy" }).click();
    await page.waitForURL((url) => /\/blanks\/(?!library-)[^/]+$/.test(url.pathname));
    await settle(page);
    const copyPath = new URL(page.url()).pathname;
    await page.getByRole("heading", { level: 1, name: "Everyday Crew Tee (our chart)" }).waitFor();
    await expect(page.getByText("Our copy", { exact: true }).count()).resolves.toBe(1);

    const chest = page.getByLabel("M chest width", { exact: true });
    await expect(chest.inputValue()).resolves.toBe("20");
    await chest.fill("20.5");
    // The outline follows the numbers as they are typed.
    await page.getByRole("img", { name: /Size M, front/ }).waitFor();
    await expect(page.locator("dd", { hasText: "20.5 in" }).count()).resolves.toBe(1);
    await page.getByRole("button", { name: "Save blank" }).click();
    await page
      .getByRole("status")
      .filter({ hasText: /^Saved at / })
      .waitFor();

    await page.reload();
    await settle(page);
    await expect(page.getByLabel("M chest width", { exact: true }).inputValue()).resolves.toBe("20.5");

    // The library tee still reads 20.
    await page.goto(libraryTee());
    await expect(chartCell(page, "M", 1).textContent()).resolves.toBe("20");
    await expect(
      page.getByRole("link", { name: "Everyday Crew Tee (our chart)" }).count(),
    ).resolves.toBeGreaterThan(0);

    // The copy is listed as the shop's own.
    await page.goto(`/shops/${demo.slug}/blanks`);
    const ours = page
      .getByRole("link")
      .filter({ has: page.getByRole("heading", { name: "Everyday Crew Tee (our chart)", exact: true }) });
    await expect(ours.first().getByText("Our copy", { exact: true }).count()).resolves.toBe(1);
    expect(copyPath).toMatch(/\/blanks\//);
    await context.close();
  });

  it("refuses a negative or missing number with a clear message and saves nothing", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, demo.emails.owner);
    await openCopyOfLibraryTee(page);

    const chest = page.getByLabel("M chest width", { exact: true });
    await chest.fill("-3");
    await chest.blur();
    await page.getByText("Chest width must be more than 0 in.", { exact: true }).waitFor();
    await page.getByText("Fix the numbers for M to see its outline.").waitFor();

    const length = page.getByLabel("L body length", { exact: true });
    await length.fill("");
    await page.getByRole("button", { name: "Save blank" }).click();
    const alert = page.getByRole("alert").filter({ hasText: "Not saved" });
    await alert.waitFor();
    await expect(alert.textContent()).resolves.toContain("Size M: Chest width must be more than 0 in.");
    await expect(alert.textContent()).resolves.toContain("Size L: Body length must be a number of inches.");
    // What was typed is still there.
    await expect(chest.inputValue()).resolves.toBe("-3");
    await expect(
      page.getByLabel("M chest width", { exact: true }).getAttribute("aria-invalid"),
    ).resolves.toBe("true");

    await page.reload();
    await settle(page);
    await expect(page.getByLabel("M chest width", { exact: true }).inputValue()).resolves.toBe("20");
    await expect(page.getByLabel("L body length", { exact: true }).inputValue()).resolves.toBe("30");
    await context.close();
  });

  it("reads sizes typed in centimetres or as fractions, and adds and removes size rows", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, demo.emails.owner);
    await openCopyOfLibraryTee(page);

    await page.getByLabel("S chest width", { exact: true }).fill("18 1/2");
    await page.getByRole("radio", { name: "cm" }).click();
    await expect(page.getByLabel("S chest width", { exact: true }).inputValue()).resolves.toBe("46.99");
    await page.getByLabel("XL chest width", { exact: true }).fill("62");
    await page.getByRole("radio", { name: "in" }).click();
    await expect(page.getByLabel("XL chest width", { exact: true }).inputValue()).resolves.toBe("24.4094");

    await page.getByRole("button", { name: "Remove size 4XL" }).click();
    await page.getByRole("button", { name: "Add a size" }).click();
    await page.getByRole("button", { name: "Save blank" }).click();
    await page.getByText("Give the size a name, such as M or 2T.").first().waitFor();
    await page.getByLabel("Row 8 size name").fill("3XL");
    await page.getByText("Size 3XL is listed twice.").first().waitFor();
    await page.getByLabel("Row 8 size name").fill("Tall L");
    await page.getByRole("button", { name: "Save blank" }).click();
    await page
      .getByRole("status")
      .filter({ hasText: /^Saved at / })
      .waitFor();

    await page.reload();
    await settle(page);
    await expect(page.getByLabel("S chest width", { exact: true }).inputValue()).resolves.toBe("18.5");
    await expect(page.getByLabel("Row 8 size name").inputValue()).resolves.toBe("Tall L");
    await expect(page.getByLabel("4XL chest width", { exact: true }).count()).resolves.toBe(0);
    await context.close();
  });

  it("shows production the chart with no edit controls, and refuses their copy and save", async () => {
    const press = await newContext(browser);
    const pressPage = await press.newPage();
    await signIn(pressPage, demo.emails.production);
    const response = await pressPage.goto(libraryTee());
    expect(response?.status()).toBe(200);
    await settle(pressPage);
    await pressPage.getByRole("heading", { level: 1, name: "Everyday Crew Tee" }).waitFor();
    await expect(chartCell(pressPage, "M", 1).textContent()).resolves.toBe("20");
    await expect(pressPage.getByRole("button", { name: "Make an editable copy" }).count()).resolves.toBe(0);
    await expect(pressPage.getByRole("button", { name: "Save blank" }).count()).resolves.toBe(0);
    await expect(pressPage.getByRole("textbox").count()).resolves.toBe(0);
    await pressPage.goto(`/shops/${demo.slug}/blanks`);
    const copiesBefore = await pressPage.getByText("Our copy", { exact: true }).count();
    expect((await pressPage.goto(`/shops/${demo.slug}/blanks/no-such-blank`))?.status()).toBe(404);

    // Server actions sent from an owner's page with a production session: the server still says no.
    const owner = await newContext(browser);
    const page = await owner.newPage();
    await signIn(page, demo.emails.owner);
    const copyPath = await openCopyOfLibraryTee(page);
    await sendActionsAs(page, press);

    await page.goto(libraryTee());
    await settle(page);
    await page.getByRole("button", { name: "Make an editable copy" }).click();
    await page
      .getByRole("alert")
      .filter({ hasText: "Your role in this shop does not allow this." })
      .waitFor();
    expect(new URL(page.url()).pathname).toBe(libraryTee());
    await pressPage.goto(`/shops/${demo.slug}/blanks`);
    // One copy more than before: the owner's, made before the switch; none from production.
    await expect(pressPage.getByText("Our copy", { exact: true }).count()).resolves.toBe(copiesBefore + 1);

    // Production sees the owner's copy read-only...
    await pressPage.goto(copyPath);
    await settle(pressPage);
    await pressPage.getByRole("heading", { level: 1, name: "Everyday Crew Tee (our chart)" }).waitFor();
    await expect(pressPage.getByRole("button", { name: "Save blank" }).count()).resolves.toBe(0);
    await expect(pressPage.getByRole("textbox").count()).resolves.toBe(0);

    // ...and a save sent with their session is refused, keeping what was typed.
    await page.goto(copyPath);
    await settle(page);
    await page.getByLabel("M chest width", { exact: true }).fill("25");
    await page.getByRole("button", { name: "Save blank" }).click();
    await page
      .getByRole("alert")
      .filter({ hasText: "Your role in this shop does not allow this." })
      .waitFor();
    await expect(page.getByLabel("M chest width", { exact: true }).inputValue()).resolves.toBe("25");
    await page.unrouteAll();
    await page.reload();
    await settle(page);
    await expect(page.getByLabel("M chest width", { exact: true }).inputValue()).resolves.toBe("20");

    await Promise.all([press.close(), owner.close()]);
  });
});
