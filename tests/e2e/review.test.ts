import { mkdirSync } from "node:fs";
import path from "node:path";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, firstLink, launch, newContext, signIn, waitForMail } from "./support";
import { demoCopy, type DemoCopy } from "./demo-copy";
import { getPool } from "@/db/client";

let browser: Browser;
let demo: DemoCopy;
beforeAll(async () => {
  demo = await demoCopy("review");
  browser = await launch();
});
afterAll(async () => {
  await demo?.drop();
  await getPool().end();
  await browser?.close();
});

async function openProof(page: Page, jobTitle: RegExp, proofName: RegExp) {
  await page.goto(`/shops/${demo.slug}/jobs`);
  await page.getByRole("link", { name: jobTitle }).click();
  await page.getByRole("link", { name: proofName }).click();
  await page.waitForURL(/\/proofs\//);
  await page.locator("[data-testid=proof-canvas][data-scale]").waitFor();
  return new URL(page.url()).pathname.split("/").pop()!;
}

async function tapGarment(page: Page, selector: string) {
  const canvas = page.locator(`${selector} [data-testid=proof-canvas][data-scale]`);
  await canvas.waitFor();
  // The stage is loaded on the client after the box is measured; tap only once it is drawn.
  await page.waitForFunction(() => ((window as unknown as { Konva?: { stages: unknown[] } }).Konva?.stages.length ?? 0) > 0);
  const box = (await canvas.boundingBox())!;
  const scale = Number(await canvas.getAttribute("data-scale"));
  const ox = Number(await canvas.getAttribute("data-origin-x"));
  const oy = Number(await canvas.getAttribute("data-origin-y"));
  // 2 in left of center, 8 in below the collar: on the body, clear of the art's middle.
  await page.mouse.click(box.x + ox - 2 * scale, box.y + oy + 8 * scale);
}

describe("client review", () => {
  it("shares by e-mail, takes a pinned note, shows replies live on both sides, and records an approval", async () => {
    const maker = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const makerPage = await maker.newPage();
    await signIn(makerPage, demo.emails.designer);
    const proofId = await openProof(makerPage, /Competition hoodies/, /Team hoodie/);

    const since = Date.now() - 1000;
    await makerPage.getByRole("button", { name: "Share with client" }).click();
    await makerPage.getByLabel("Client e-mail").fill("coach@northgate-robotics.test");
    await makerPage.getByLabel("Their name").fill("Ilse Moreau");
    await makerPage.getByRole("button", { name: "Send by e-mail" }).click();
    await makerPage.getByRole("status").filter({ hasText: /Revision A is shared/ }).waitFor();
    await makerPage.getByRole("button", { name: "Close" }).click();

    const invite = await waitForMail("coach@northgate-robotics.test", /Proof to review/, since);
    expect(invite.html).toContain("Review the proof");
    const link = firstLink(invite.text, "/r/");

    const client = await newContext(browser, { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    const clientPage = await client.newPage();
    const response = await clientPage.goto(link);
    expect(response?.status()).toBe(200);
    await clientPage.getByText("Waiting for your decision").waitFor();

    // Pin a note by tapping the garment.
    await tapGarment(clientPage, "[data-testid=review-canvas]");
    await clientPage.getByLabel("Note", { exact: true }).fill("Can the badge sit a little higher? <b>thanks</b>");
    await clientPage.getByRole("button", { name: "Pin note" }).click();
    await clientPage.getByTestId("note").filter({ hasText: "sit a little higher" }).waitFor();
    // Text is text: the markup shows as typed and makes no element.
    await expect(clientPage.locator("[data-testid=note] b").count()).resolves.toBe(0);

    // The maker sees it without reloading, and replies.
    const makerNote = makerPage.getByTestId("editor-note").filter({ hasText: "sit a little higher" });
    await makerNote.waitFor({ timeout: 15_000 });
    await makerNote.getByLabel("Reply to the client").fill("Moved it up half an inch in the next revision.");
    await makerNote.getByRole("button", { name: "Reply" }).click();
    await clientPage.getByTestId("reply").filter({ hasText: "half an inch" }).waitFor({ timeout: 15_000 });

    // Screenshot of the review page at phone width, for review by a person.
    const shots = path.join(process.cwd(), ".data", "screenshots");
    mkdirSync(shots, { recursive: true });
    await clientPage.screenshot({ path: path.join(shots, "review-phone.png"), fullPage: true });
    await clientPage.getByRole("button", { name: "On a person" }).click();
    await clientPage.getByRole("button", { name: "On a person", pressed: true }).waitFor();
    await clientPage.locator("[data-testid=review-canvas]").screenshot({ path: path.join(shots, "review-worn.png") });
    await clientPage.getByRole("button", { name: "On a person" }).click();

    // Approve by typing a full name and ticking the statement.
    const approvedSince = Date.now() - 1000;
    await clientPage.getByRole("tab", { name: "Approve" }).click();
    await clientPage.getByLabel("Your full name").fill("Ilse");
    await clientPage.getByRole("button", { name: "Approve revision A" }).click();
    await clientPage.getByRole("alert").filter({ hasText: /full name/ }).waitFor();
    await clientPage.getByLabel("Your full name").fill("Ilse Moreau");
    await clientPage.getByRole("button", { name: "Approve revision A" }).click();
    await clientPage.getByRole("alert").filter({ hasText: /Tick the box/ }).waitFor();
    await clientPage.getByRole("checkbox").check();
    await clientPage.getByRole("button", { name: "Approve revision A" }).click();
    await clientPage.getByTestId("decision-done").waitFor();

    const approvedMail = await waitForMail(demo.emails.owner, /Approved: Competition hoodies, revision A/, approvedSince);
    expect(approvedMail.text).toContain("/jobs/");
    await makerPage.goto(firstLink(approvedMail.text, "/jobs/").replace(/^https?:\/\/[^/]+/, BASE_URL));
    const record = makerPage.getByTestId("approval-record");
    await record.getByText(/Approved: Team hoodie, revision A/).waitFor();
    await record.getByText(/By Ilse Moreau/).waitFor();
    await record.getByText(/IP /).waitFor();

    // An approved revision is locked: the next edit starts revision B.
    await makerPage.goto(`/shops/${demo.slug}/proofs/${proofId}`);
    await makerPage.locator("[data-testid=proof-canvas][data-scale]").waitFor();
    const below = makerPage.getByLabel("Below collar");
    await below.fill("2.5");
    await below.press("Enter");
    await makerPage.getByTestId("revision-letter").filter({ hasText: "rev. B" }).waitFor({ timeout: 15_000 });

    await maker.close();
    await client.close();
  });

  it("gives withdrawn, expired and wrong links a clear 404 page, and the API says 410 for withdrawn ones", async () => {
    const maker = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const page = await maker.newPage();
    await signIn(page, demo.emails.owner);
    await openProof(page, /Market stall totes/, /Market tote/);
    await page.getByRole("button", { name: "Share with client" }).click();
    await page.getByRole("button", { name: "Make a link to copy" }).click();
    const url = await page.getByLabel("Review link").inputValue();
    const token = url.split("/r/")[1]!;

    const anon = await newContext(browser);
    const visitor = await anon.newPage();
    expect((await visitor.goto(url))?.status()).toBe(200);

    const withdrawButtons = page.getByRole("button", { name: "Withdraw" });
    const before = await withdrawButtons.count();
    await withdrawButtons.first().click();
    await expect.poll(() => withdrawButtons.count(), { timeout: 10_000 }).toBe(before - 1);
    const gone = await visitor.goto(url);
    expect(gone?.status()).toBe(404);
    await visitor.getByRole("heading", { name: "This review link does not work" }).waitFor();
    expect((await anon.request.get(`/api/review/link/${token}/comments`)).status()).toBe(410);

    const wrong = await visitor.goto(`/r/${token.slice(0, -4)}abcd`);
    expect(wrong?.status()).toBe(404);
    expect((await anon.request.get(`/api/review/link/${token.slice(0, -4)}abcd/comments`)).status()).toBe(404);
    await anon.close();
    await maker.close();
  });
});
