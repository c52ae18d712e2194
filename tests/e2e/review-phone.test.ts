/**
 * The client's review link on a 390 × 844 phone: a tap brings the note form to the thumb, the
 * checkout result shows at the top of the page it comes back to, and a note can be pinned, moved
 * and posted with the keyboard alone. Each run builds its own shop, job, proof, link and quote
 * through the product's queries; the demo shop is not touched.
 */
import { randomBytes } from "node:crypto";
import { mkdirSync } from "node:fs";
import path from "node:path";
import AxeBuilder from "@axe-core/playwright";
import bcrypt from "bcryptjs";
import { eq } from "drizzle-orm";
import type { Browser, BrowserContext, Locator, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, getPool } from "@/db/client";
import { latestRevision, listComments } from "@/db/queries/review";
import { createShopWithOwner } from "@/db/queries/shops";
import { shops } from "@/db/schema";
import { LOCATION_LABELS } from "@/lib/garments/locations";
import { placementCenter, type Placement } from "@/lib/placement/model";
import { describePin } from "@/lib/review/pin";
import { buildShopRecords, type ShopRecords } from "@/tests/authz/fixtures";
import { PROOF_DRAWN_MARK } from "@/lib/perf-marks";
import { BASE_URL, launch, newContext } from "./support";

const PHONE = { width: 390, height: 844 };
/** Screenshots for review by a person, beside the other e2e screenshots. */
const SHOTS = path.join(process.cwd(), ".data", "screenshots");

let browser: Browser;
let records: ShopRecords;
let print: Placement;
let tag: string;

beforeAll(async () => {
  tag = randomBytes(3).toString("hex");
  const { userId, shopSlug } = await createShopWithOwner({
    shopName: `Thumbline Prints ${tag}`,
    name: "Wren Albescu",
    email: `wren-${tag}@thumbline-prints.test`,
    passwordHash: await bcrypt.hash(`thumbline-${tag}-password`, 10),
  });
  const [shop] = await db.select({ id: shops.id }).from(shops).where(eq(shops.slug, shopSlug));
  records = await buildShopRecords({ shopId: shop!.id, ownerId: userId, tag });
  const revision = await latestRevision({ proofId: records.proofId });
  print = revision!.snapshot.placements[0]!;
  browser = await launch();
  mkdirSync(SHOTS, { recursive: true });
});
afterAll(async () => {
  await browser?.close();
  await getPool().end();
});

async function openLink(context: BrowserContext, query = ""): Promise<Page> {
  const page = await context.newPage();
  const response = await page.goto(`/r/${records.linkToken}${query}`);
  expect(response?.status()).toBe(200);
  await page.locator("[data-testid=review][data-hydrated=true]").waitFor();
  return page;
}

/** The element's box, in CSS pixels from the viewport's top left corner. */
async function boxOf(locator: Locator) {
  const box = await locator.boundingBox();
  expect(box, "the element is laid out").toBeTruthy();
  return box!;
}

function insideViewport(box: { x: number; y: number; width: number; height: number }) {
  return box.y >= 0 && box.x >= 0 && box.y + box.height <= PHONE.height && box.x + box.width <= PHONE.width;
}

const isFocused = (locator: Locator) => locator.evaluate((el) => el === document.activeElement);

describe("review link on a phone", () => {
  it("shows the garment and its art in the page's HTML, before any script, and marks when the client could see them", async () => {
    // Without scripts: the server's HTML already draws the garment with the art on it.
    const html = await (await fetch(`${BASE_URL}/r/${records.linkToken}`)).text();
    const poster = /<div[^>]*data-testid="proof-poster"[^>]*>([\s\S]*?)<\/svg>/.exec(html)?.[1] ?? "";
    expect(poster).toMatch(/<path d="M/);
    expect(poster).toMatch(/<image [^>]*elementtiming="proof-poster-art"/);
    const context = await newContext(browser, { viewport: PHONE, isMobile: true, hasTouch: true });
    const page = await openLink(context);
    // The page marks the moment; the canvas takes the poster's place once it has drawn the art.
    await page.waitForFunction((name) => performance.getEntriesByName(name).length > 0, PROOF_DRAWN_MARK);
    const at = await page.evaluate((name) => performance.getEntriesByName(name)[0]!.startTime, PROOF_DRAWN_MARK);
    expect(at).toBeGreaterThan(0);
    await page.locator("[data-testid=proof-poster]").waitFor({ state: "detached" });
    await context.close();
  });

  it("after a tap pins a note, the note box has the focus and is on screen", async () => {
    const context = await newContext(browser, { viewport: PHONE, isMobile: true, hasTouch: true });
    const page = await openLink(context);
    const canvas = page.locator("[data-testid=review-canvas] [data-testid=proof-canvas][data-scale]");
    await canvas.waitFor();
    await page.waitForFunction(() => ((window as unknown as { Konva?: { stages: unknown[] } }).Konva?.stages.length ?? 0) > 0);
    await canvas.scrollIntoViewIfNeeded();
    const box = await boxOf(canvas);
    const scale = Number(await canvas.getAttribute("data-scale"));
    const ox = Number(await canvas.getAttribute("data-origin-x"));
    const oy = Number(await canvas.getAttribute("data-origin-y"));
    // 2 in right of centre, 9 in below the collar: on the body, inside the canvas box.
    const at = { x: box.x + ox + 2 * scale, y: box.y + oy + 9 * scale };
    expect(at.y).toBeLessThan(PHONE.height);
    await page.touchscreen.tap(at.x, at.y);

    const note = page.getByRole("textbox", { name: "Note", exact: true });
    await note.waitFor();
    await expect.poll(() => isFocused(note), { timeout: 5_000 }).toBe(true);
    // A smooth scroll may still be under way: wait for the box to settle inside the viewport.
    await expect.poll(async () => insideViewport(await boxOf(note)), { timeout: 5_000 }).toBe(true);
    const noteBox = await boxOf(note);
    expect(noteBox.y).toBeGreaterThanOrEqual(0);
    expect(noteBox.y + noteBox.height).toBeLessThanOrEqual(PHONE.height);
    await page.screenshot({ path: path.join(SHOTS, "review-phone-tapped.png") });
    // The form says where the pin went, in words.
    await expect.poll(() => page.getByTestId("pin-position").textContent()).toMatch(/^Pin at 2 in right of centre, 9 in below the collar$/);

    const body = `Tapped note ${tag}: a touch lower, please.`;
    await page.keyboard.type(body);
    await page.getByRole("button", { name: "Pin note" }).click();
    await page.getByTestId("note").filter({ hasText: body }).waitFor();
    const stored = (await listComments({ proofId: records.proofId })).find((c) => c.body === body);
    expect(stored?.side).toBe("front");
    expect(stored!.xIn!).toBeCloseTo(2, 1);
    expect(stored!.yIn!).toBeCloseTo(9, 1);
    await context.close();
  });

  it("after checkout, the payment result is at the top of the page, announced and focused", async () => {
    const context = await newContext(browser, { viewport: PHONE, isMobile: true, hasTouch: true });
    const page = await openLink(context);
    const quote = page.getByTestId("quote-panel");
    await page.locator("[data-testid=quote-panel][data-hydrated=true]").waitFor();

    // A declined card first: back with nothing charged, said at the top.
    await quote.getByRole("button", { name: /^Pay deposit/ }).click();
    await page.waitForURL(/\/pay\/cs_/);
    await page.getByTestId("fake-decline").click();
    await page.waitForURL((url) => url.pathname === `/r/${records.linkToken}` && url.searchParams.get("checkout") === "cancelled");
    const cancelled = page.getByRole("status").filter({ hasText: "The payment was not completed" });
    await cancelled.waitFor();
    await expect.poll(() => isFocused(cancelled)).toBe(true);
    const cancelledBox = await boxOf(cancelled);
    expect(cancelledBox.y).toBeGreaterThanOrEqual(0);
    expect(cancelledBox.y + cancelledBox.height).toBeLessThanOrEqual(PHONE.height / 3);

    // Then paid.
    await page.locator("[data-testid=quote-panel][data-hydrated=true]").waitFor();
    await quote.getByRole("button", { name: /^Pay deposit/ }).click();
    await page.waitForURL(/\/pay\/cs_/);
    await page.getByTestId("fake-pay").click();
    await page.waitForURL((url) => url.pathname === `/r/${records.linkToken}` && /^cs_/.test(url.searchParams.get("checkout") ?? ""));
    const paid = page.getByRole("status").filter({ hasText: "Payment received" });
    await paid.waitFor();
    await expect.poll(() => isFocused(paid)).toBe(true);
    expect(await page.evaluate(() => window.scrollY)).toBeLessThan(PHONE.height / 3);
    const paidBox = await boxOf(paid);
    expect(paidBox.y).toBeGreaterThanOrEqual(0);
    expect(paidBox.y + paidBox.height).toBeLessThanOrEqual(PHONE.height / 3);
    expect(await page.getByTestId("checkout-result").count()).toBe(1);
    await page.screenshot({ path: path.join(SHOTS, "review-phone-paid.png") });

    // Its link goes down to the quote, with the deposit shown as paid.
    await paid.getByRole("link", { name: "See the quote" }).click();
    await expect.poll(async () => (await boxOf(quote)).y).toBeLessThan(PHONE.height / 2);
    expect(await quote.getByTestId("quote-state").textContent()).toBe("Deposit paid");
    await context.close();
  });

  it("pins a note with the keyboard alone, moves it with the arrow keys and stores where it ended", async () => {
    const context = await newContext(browser, { viewport: PHONE, isMobile: true });
    const page = await openLink(context);
    const chooser = page.getByRole("button", { name: "Choose a spot for a note" });
    await chooser.waitFor();

    // Tab to the chooser, as a keyboard user would.
    let reached = false;
    for (let i = 0; i < 60 && !reached; i++) {
      await page.keyboard.press("Tab");
      reached = await isFocused(chooser);
    }
    expect(reached, "Tab reaches the note chooser").toBe(true);
    expect(await chooser.getAttribute("aria-expanded")).toBe("false");
    await page.keyboard.press("Enter");
    await expect.poll(() => chooser.getAttribute("aria-expanded")).toBe("true");
    const spots = page.getByRole("list", { name: "Spots on the front to pin a note on" });
    await spots.waitFor();
    const printButton = spots.getByRole("button", { name: new RegExp(`^${LOCATION_LABELS[print.location]}`) });
    expect(await printButton.count()).toBe(1);
    await page.keyboard.press("Tab");
    expect(await isFocused(printButton)).toBe(true);
    await page.keyboard.press("Enter");

    // The pin sits at the middle of the print, and the keyboard is on it.
    const pad = page.getByRole("application", { name: "Pin position" });
    await expect.poll(() => isFocused(pad)).toBe(true);
    await expect.poll(async () => insideViewport(await boxOf(page.getByTestId("note-composer")))).toBe(true);
    const centre = placementCenter(print);
    const position = page.getByRole("status").filter({ hasText: /^Pin at / });
    expect(await position.textContent()).toBe(describePin(centre, "in"));

    // Three eighths right, then one inch down and two eighths up.
    await page.keyboard.press("ArrowRight");
    await page.keyboard.press("ArrowRight");
    await page.keyboard.press("ArrowRight");
    await page.keyboard.press("Shift+ArrowDown");
    await page.keyboard.press("ArrowUp");
    await page.keyboard.press("ArrowUp");
    const moved = { x: centre.x + 3 / 8, y: centre.y + 1 - 2 / 8 };
    await expect.poll(() => position.textContent()).toBe(describePin(moved, "in"));
    await page.screenshot({ path: path.join(SHOTS, "review-phone-keyboard-pin.png") });
    expect(await position.textContent()).toMatch(/^Pin at 3\/8 in right of centre, \d+( \d\/\d)? in below the collar$/);

    // On to the note, the name, and post: all keys.
    await page.keyboard.press("Tab");
    expect(await isFocused(page.getByRole("textbox", { name: "Note", exact: true }))).toBe(true);
    const body = `Keyboard note ${tag}: check the spacing here.`;
    await page.keyboard.type(body);
    await page.keyboard.press("Tab");
    expect(await isFocused(page.getByRole("textbox", { name: "Your name" }))).toBe(true);
    await page.keyboard.type("Noor Halvorsen");
    await page.keyboard.press("Tab");
    expect(await isFocused(page.getByRole("button", { name: "Pin note" }))).toBe(true);

    // The open form has proper names throughout.
    const axe = await new AxeBuilder({ page }).include("[data-testid=note-composer]").include("[data-testid=review-canvas] ~ div").analyze();
    const blocking = axe.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
    expect(blocking.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`)).toEqual([]);

    await page.keyboard.press("Enter");
    await page.getByTestId("note").filter({ hasText: body }).waitFor();
    // The form is gone and the keyboard is back on the chooser.
    await expect.poll(() => isFocused(chooser)).toBe(true);

    const stored = (await listComments({ proofId: records.proofId })).find((c) => c.body === body);
    expect(stored?.side).toBe("front");
    expect(stored?.authorName).toBe("Noor Halvorsen");
    expect(stored!.xIn!).toBeCloseTo(moved.x, 9);
    expect(stored!.yIn!).toBeCloseTo(moved.y, 9);
    await context.close();
  });
});
