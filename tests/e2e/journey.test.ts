/**
 * The whole job from nothing, in Chromium against the production build. No seeded row is used: the
 * shop is signed up here, and everything else (client, job, art, proof, link, quote, team) is made
 * through the product's own screens. Then the client reviews, approves and pays on a phone, the
 * press downloads its files, and a change after approval never reaches the press.
 */
import { writeFileSync, mkdirSync } from "node:fs";
import path from "node:path";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { formatCents } from "@/lib/pricing";
import { BASE_URL, firstLink, launch, newContext, openSignUpLink, waitForMail } from "./support";

let browser: Browser;
const contexts: BrowserContext[] = [];
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => {});
  await browser?.close();
});

const tag = `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
const PASSWORD = "a-long-enough-password";

async function context(options: Parameters<typeof newContext>[1] = {}) {
  const c = await newContext(browser, { viewport: { width: 1280, height: 900 }, acceptDownloads: true, ...options });
  contexts.push(c);
  return c;
}

async function hydrated(page: Page) {
  await page.locator("[data-hydrated=true]").first().waitFor();
}

async function canvasDrawn(page: Page) {
  await page.locator("[data-testid=proof-canvas][data-scale]").first().waitFor();
  await page.waitForFunction(() => ((window as unknown as { Konva?: { stages: unknown[] } }).Konva?.stages.length ?? 0) > 0);
}

async function proofJson(page: Page, proofId: string) {
  const response = await page.request.get(`/api/proofs/${proofId}`);
  expect(response.status()).toBe(200);
  return (await response.json()) as { revision: string; version: number; garment: { size: string }; placements: Array<{ location: string; widthIn: number }> };
}

/** Waits for the newest export row of a kind (the `count`th made) to finish and returns its file's bytes. */
async function download(page: Page, kind: string, count = 1): Promise<Buffer> {
  const rows = page.locator(`[data-testid=export-row][data-kind=${kind}]`);
  await expect.poll(() => rows.count(), { timeout: 30_000 }).toBe(count);
  const row = rows.first();
  await page.locator(`[data-testid=export-row][data-kind=${kind}][data-state=done]`).nth(count - 1).waitFor({ timeout: 120_000 });
  await expect.poll(() => row.getAttribute("data-state"), { timeout: 120_000 }).toBe("done");
  const links = row.getByRole("link", { name: /Download/ });
  expect(await links.count()).toBeGreaterThan(0);
  const response = await page.request.get((await links.first().getAttribute("href"))!);
  expect(response.status()).toBe(200);
  return Buffer.from(await response.body());
}

async function pdfText(bytes: Buffer): Promise<{ pages: number; text: string }> {
  const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
  const doc = await pdfjs.getDocument({ data: new Uint8Array(bytes), verbosity: 0 }).promise;
  const parts: string[] = [];
  for (let i = 1; i <= doc.numPages; i += 1) {
    parts.push((await (await doc.getPage(i)).getTextContent()).items.map((item) => ("str" in item ? item.str : "")).join(" "));
  }
  const pages = doc.numPages;
  await doc.destroy();
  return { pages, text: parts.join(" ") };
}

/** Art of our own for the test: a wide banner with a border, 1800 x 1200 px (6 x 4 in at 300 ppi). */
function artFile(): string {
  const dir = path.join(process.cwd(), ".data", "e2e");
  mkdirSync(dir, { recursive: true });
  const file = path.join(dir, `journey-${tag}.svg`);
  writeFileSync(
    file,
    `<svg xmlns="http://www.w3.org/2000/svg" width="1800" height="1200" viewBox="0 0 1800 1200"><rect x="40" y="40" width="1720" height="1120" rx="80" fill="#2f6b5e"/><circle cx="600" cy="600" r="300" fill="#f2c14e"/><rect x="1000" y="420" width="560" height="360" fill="#fbf7ef"/></svg>`,
  );
  return file;
}

describe("the whole job from an empty shop", () => {
  it("signs up, makes a job, a proof and a quote; the client pins, approves and pays on a phone; the press gets its files and keeps the approved revision", async () => {
    const since = Date.now() - 1000;
    const shop = await context();
    const owner = await shop.newPage();

    // --- Sign-up: a new shop with nobody and nothing in it.
    // The address is proven by the link e-mailed to it; opening it signs in and opens the shop.
    await owner.goto("/sign-up");
    await owner.getByLabel("Shop name").fill(`Tidewater Transfers ${tag}`);
    await owner.getByLabel("Your name").fill("Noor Halvorsen");
    await owner.getByLabel("E-mail").fill(`owner-${tag}@journey.test`);
    await owner.getByLabel("Password").fill(PASSWORD);
    await owner.getByRole("button", { name: "Create shop" }).click();
    await openSignUpLink(owner, `owner-${tag}@journey.test`, since);
    await owner.waitForURL(/\/shops\/tidewater-transfers/);
    const slug = new URL(owner.url()).pathname.split("/")[2]!;

    // --- A client with a contact.
    const clientEmail = `coach-${tag}@journey.test`;
    await owner.goto(`/shops/${slug}/clients/new`);
    await hydrated(owner);
    await owner.getByLabel("Name", { exact: true }).first().fill(`Lakeside Rowing ${tag}`);
    await owner.locator("#contact-0-name").fill("Ada Fenwick");
    await owner.getByLabel("E-mail").fill(clientEmail);
    await owner.getByRole("button", { name: "Create client" }).click();
    await owner.waitForURL(/\/clients\/[0-9a-f-]{36}(\?done=[a-z-]+)?$/);

    // --- A DTF job with a front and a back print and a size run.
    await owner.goto(`/shops/${slug}/jobs/new`);
    await hydrated(owner);
    await owner.getByLabel("Title").fill(`Regatta crew tees ${tag}`);
    await owner.getByLabel("Client").selectOption({ label: `Lakeside Rowing ${tag}` });
    await owner.getByLabel("Due date").fill("2027-07-01");
    await owner.getByLabel("Decoration method").selectOption("dtf");
    await owner.getByLabel("Garment style").selectOption({ label: "Everyday Crew Tee" });
    await owner.getByLabel("Garment colour").fill("Kiln Red");
    await owner.getByLabel("Transfer area per garment (in²)").fill("120");
    const back = owner.getByRole("checkbox", { name: "Full back" });
    await back.check();
    await owner.getByLabel("S", { exact: true }).fill("4");
    await owner.getByLabel("M", { exact: true }).fill("8");
    await owner.getByLabel("L", { exact: true }).fill("6");
    await expect.poll(() => owner.getByTestId("size-run-total").textContent()).toContain("18");
    await owner.getByRole("button", { name: "Create job" }).click();
    await owner.waitForURL(/\/jobs\/[0-9a-f-]{36}(\?done=[a-z-]+)?$/);
    const jobUrl = new URL(owner.url()).pathname;

    // --- Empty state: no proofs yet, and the way to make one.
    await owner.getByRole("heading", { name: "No proofs yet" }).waitFor();
    await owner.getByRole("link", { name: "Make a proof" }).click();
    await owner.waitForURL(/\/proofs\/new$/);
    await hydrated(owner);
    // A fresh upload for this client, chosen for both prints.
    await owner.getByLabel("Art files").setInputFiles(artFile());
    await owner.getByRole("status").filter({ hasText: "The uploaded art is chosen for every print." }).waitFor({ timeout: 60_000 });
    await expect(owner.getByLabel("Art for the full front").inputValue()).resolves.not.toBe("");
    await expect(owner.getByLabel("Art for the full back").inputValue()).resolves.not.toBe("");
    await owner.getByRole("button", { name: "Make proof and open the editor" }).click();
    await owner.waitForURL(/\/shops\/[^/]+\/proofs\/[0-9a-f-]{36}$/);
    const proofId = new URL(owner.url()).pathname.split("/").pop()!;
    await canvasDrawn(owner);
    const made = await proofJson(owner, proofId);
    // 18 pieces: piece 9 falls in M (S holds 1–4, M 5–12).
    expect(made.garment.size).toBe("M");
    expect(made.revision).toBe("A");
    expect(made.placements.map((p) => p.location)).toEqual(["full-front", "full-back"]);

    // --- Looking at another size is view state; a real edit is saved at the proof's own size.
    await owner.getByLabel("Size shown").selectOption("L");
    const width = owner.getByLabel("Width", { exact: true });
    await width.fill("9");
    await width.press("Enter");
    await owner.getByText("All changes saved").waitFor({ timeout: 15_000 });
    const edited = await proofJson(owner, proofId);
    expect(edited.garment.size).toBe("M");
    expect(edited.revision).toBe("A");
    expect(edited.placements[0]!.widthIn).toBe(9);

    // --- The quote: bills the front and the back, as the proof shows.
    await owner.goto(jobUrl);
    await owner.getByRole("button", { name: "Send quote to client" }).click();
    await expect.poll(() => owner.getByTestId("send-quote-notice").textContent()).toMatch(/Quote Q1 sent/);

    // --- Share a link.
    await owner.goto(`/shops/${slug}/proofs/${proofId}`);
    await canvasDrawn(owner);
    await owner.getByRole("button", { name: "Share with client" }).click();
    await owner.getByRole("button", { name: "Make a link to copy" }).click();
    const reviewUrl = await owner.getByLabel("Review link").inputValue();
    expect(reviewUrl).toContain("/r/");
    await owner.getByRole("button", { name: "Close" }).click();

    // --- The client on a phone: pin a note, approve, accept the quote and pay the deposit.
    const phone = await context({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    const client = await phone.newPage();
    expect((await client.goto(reviewUrl.replace(/^https?:\/\/[^/]+/, BASE_URL)))?.status()).toBe(200);
    const reviewCanvas = client.locator("[data-testid=review-canvas] [data-testid=proof-canvas][data-scale]");
    await reviewCanvas.waitFor();
    await client.waitForFunction(() => ((window as unknown as { Konva?: { stages: unknown[] } }).Konva?.stages.length ?? 0) > 0);
    const box = (await reviewCanvas.boundingBox())!;
    const scale = Number(await reviewCanvas.getAttribute("data-scale"));
    const ox = Number(await reviewCanvas.getAttribute("data-origin-x"));
    const oy = Number(await reviewCanvas.getAttribute("data-origin-y"));
    await client.mouse.click(box.x + ox - 2 * scale, box.y + oy + 8 * scale);
    await client.getByLabel("Note", { exact: true }).fill("Love it. Could the back print say our year?");
    await client.getByRole("button", { name: "Pin note" }).click();
    await client.getByTestId("note").filter({ hasText: "our year" }).waitFor();

    await client.getByRole("tab", { name: "Approve" }).click();
    const decision = client.getByRole("region", { name: "Decision" });
    await decision.getByLabel("Your full name").fill("Ada Fenwick");
    await decision.getByRole("checkbox").check();
    await decision.getByRole("button", { name: "Approve revision A" }).click();
    await client.getByTestId("decision-done").waitFor();

    const quote = client.getByTestId("quote-panel");
    await quote.waitFor();
    const deposit = Math.round(Number(((await quote.getByTestId("quote-deposit").textContent()) ?? "").replace(/[$,]/g, "")) * 100);
    expect(deposit).toBeGreaterThan(0);
    await quote.getByLabel("Your full name").fill("Ada Fenwick");
    await quote.getByRole("checkbox").check();
    await quote.getByRole("button", { name: "Accept quote" }).click();
    const pay = quote.getByRole("button", { name: `Pay deposit: ${formatCents(deposit)}` });
    await pay.waitFor();
    await pay.click();
    await client.waitForURL(/\/pay\/cs_/);
    await client.getByTestId("fake-pay").click();
    await client.waitForURL(/\/r\/[^?]+\?checkout=cs_/);
    await client.getByText("Payment received").first().waitFor();

    // --- The shop sees the approval and the deposit.
    await owner.goto(jobUrl);
    await owner.getByTestId("approval-record").getByText(/Approved: .*revision A/).waitFor();
    await expect(owner.getByTestId("money-state").textContent()).resolves.toBe("Deposit paid");

    // --- A press operator joins by invitation.
    const pressEmail = `press-${tag}@journey.test`;
    await owner.goto(`/shops/${slug}/settings`);
    await owner.locator('form[aria-label="Invite a team member"][data-hydrated="true"]').waitFor();
    await owner.getByLabel("E-mail").fill(pressEmail);
    await owner.getByRole("radio", { name: /Production/ }).check();
    await owner.getByRole("button", { name: "Send invitation" }).click();
    const invite = await waitForMail(pressEmail, /invited you/i, since);
    const pressContext = await context();
    const press = await pressContext.newPage();
    await press.goto(firstLink(invite.text, "/invite/").replace(/^https?:\/\/[^/]+/, BASE_URL));
    await hydrated(press);
    await press.getByLabel("Your name").fill("Oskar Brenn");
    await press.getByLabel("Choose a password").fill(PASSWORD);
    await press.getByRole("button", { name: "Accept and join" }).click();
    await press.waitForURL(new RegExp(`/shops/${slug}`));

    // --- Production: the spec sheet, a test print and the gang sheet, all from revision A.
    await press.goto(`${jobUrl}/production`);
    await press.getByTestId("production-revisions").getByText(/prints revision A, as the client approved it/).waitFor();
    expect(await press.getByTestId("newer-draft").count()).toBe(0);
    await press.getByRole("button", { name: "Make the spec sheet" }).click();
    const spec = await pdfText(await download(press, "spec-sheet"));
    expect(spec.text).toContain(`Regatta crew tees ${tag}`);
    // The front as approved: 9 in wide, the art's 1720 x 1120 px ink keeping its shape (9 x 5.86 in).
    expect(spec.text).toContain("9 x 5 7/8 in");
    await press.getByRole("button", { name: "Make test print" }).first().click();
    const testPrint = await pdfText(await download(press, "test-print"));
    expect(testPrint.pages).toBeGreaterThan(0);
    await press.getByRole("button", { name: "Gang sheet PDF" }).click();
    const gang = await pdfText(await download(press, "gang-sheet-pdf"));
    expect(gang.pages).toBeGreaterThan(0);
    const frontHeading = press.getByRole("region", { name: "Print sizes for Full front" }).getByRole("heading");
    await expect(frontHeading.textContent()).resolves.toMatch(/designed at 9 in ink width on size M/);

    // --- After approval: only looking changes nothing; a real change starts a draft the press never sees.
    await owner.goto(`/shops/${slug}/proofs/${proofId}`);
    await canvasDrawn(owner);
    await owner.getByLabel("Size shown").selectOption("S");
    await expect(owner.getByTestId("revision-letter").textContent()).resolves.toBe("rev. A");
    const widthAfter = owner.getByLabel("Width", { exact: true });
    await widthAfter.fill("11");
    await widthAfter.press("Enter");
    await owner.getByTestId("revision-letter").filter({ hasText: "rev. B" }).waitFor({ timeout: 15_000 });
    await owner.getByText("All changes saved").waitFor({ timeout: 15_000 });

    await owner.goto(jobUrl);
    await owner.getByTestId("changed-after-approval").getByText(/revision B is a draft; the client approved revision A/).waitFor();

    await press.goto(`${jobUrl}/production`);
    await press.getByTestId("newer-draft").getByText(/Revision B is a newer draft/).waitFor();
    await expect(press.getByRole("region", { name: "Print sizes for Full front" }).getByRole("heading").textContent()).resolves.toMatch(/designed at 9 in ink width on size M/);
    await press.getByRole("button", { name: "Make the spec sheet" }).click();
    const specAgain = await pdfText(await download(press, "spec-sheet", 2));
    expect(specAgain.text).toContain("9 x 5 7/8 in");
    expect(specAgain.text).toMatch(/proof revision\s+A/i);

    // --- Sharing again sends B beside A, with what changed in words; the press still prints A.
    await owner.goto(`/shops/${slug}/proofs/${proofId}`);
    await canvasDrawn(owner);
    await owner.getByRole("button", { name: "Share with client" }).click();
    await owner.getByRole("button", { name: "Make a link to copy" }).click();
    await owner.getByRole("status").filter({ hasText: "Revision B is shared." }).waitFor();
    await expect(owner.getByTestId("share-changes").textContent()).resolves.toMatch(/Changed since revision A:.*width 9 in → 11 in/);
    await press.reload();
    await press.getByTestId("production-revisions").getByText(/prints revision A, as the client approved it/).waitFor();

    // --- A designer joins and makes a second proof for the job (a hoodie): the editor opens with the canvas.
    const designerEmail = `designer-${tag}@journey.test`;
    await owner.goto(`/shops/${slug}/settings`);
    await owner.locator('form[aria-label="Invite a team member"][data-hydrated="true"]').waitFor();
    await owner.getByLabel("E-mail").fill(designerEmail);
    await owner.getByRole("radio", { name: /Designer/ }).check();
    await owner.getByRole("button", { name: "Send invitation" }).click();
    const designerInvite = await waitForMail(designerEmail, /invited you/i, since);
    const designerContext = await context();
    const designer = await designerContext.newPage();
    await designer.goto(firstLink(designerInvite.text, "/invite/").replace(/^https?:\/\/[^/]+/, BASE_URL));
    await hydrated(designer);
    await designer.getByLabel("Your name").fill("Lio Marchetti");
    await designer.getByLabel("Choose a password").fill(PASSWORD);
    await designer.getByRole("button", { name: "Accept and join" }).click();
    await designer.waitForURL(new RegExp(`/shops/${slug}`));
    await designer.goto(jobUrl);
    await designer.getByRole("link", { name: "Make another proof" }).click();
    await hydrated(designer);
    await designer.getByLabel("Blank").selectOption({ label: "Campfire Pullover Hoodie (pullover hoodie)" });
    await designer.getByRole("button", { name: "Make proof and open the editor" }).click();
    await designer.waitForURL(/\/shops\/[^/]+\/proofs\/[0-9a-f-]{36}$/);
    await canvasDrawn(designer);
    const hoodie = await proofJson(designer, new URL(designer.url()).pathname.split("/").pop()!);
    expect(hoodie.placements.map((p) => p.location)).toEqual(["full-front", "full-back"]);
    // The press cannot make proofs: the page is not open to production.
    expect((await press.goto(`${jobUrl}/proofs/new`))?.status()).toBe(403);
  }, 600_000);
});
