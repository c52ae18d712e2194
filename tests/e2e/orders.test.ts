import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { formatCents } from "@/lib/pricing";
import { launch, newContext, signIn, waitForMail } from "./support";
import { demoCopy, type DemoCopy } from "./demo-copy";
import { getPool } from "@/db/client";

let browser: Browser;
let demo: DemoCopy;
beforeAll(async () => {
  demo = await demoCopy("orders");
  browser = await launch();
});
afterAll(async () => {
  await demo?.drop();
  await getPool().end();
  await browser?.close();
});

/** Waits until the page's form or table runs in the browser, so typing is not lost to hydration. */
async function ready(page: Page) {
  await page.locator("[data-hydrated=true]").first().waitFor();
}

const money = (text: string | null) => Math.round(Number((text ?? "").replace(/[$,]/g, "")) * 100);

describe("orders, quotes and payments", () => {
  it("owner builds a job with a size run and sends the quote; the client accepts, pays the deposit on the checkout page, and gets a receipt", async () => {
    const since = Date.now();
    const shop = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const owner = await shop.newPage();
    await signIn(owner, demo.emails.owner);

    // A new job: youth and adult sizes in one run.
    await owner.goto(`/shops/${demo.slug}/jobs/new`);
    await ready(owner);
    await owner.getByRole("button", { name: "Create job" }).click();
    await expect.poll(() => owner.getByText("Give the job a title").count()).toBe(1);
    expect(await owner.locator(".field-error", { hasText: "Pick a client" }).count()).toBe(1);
    await owner.getByLabel("Title").fill("Autumn league tees");
    await owner.getByLabel("Client").selectOption({ label: "Eastfield Youth Soccer Club" });
    await owner.getByLabel("Due date").fill("2027-09-01");
    await owner.getByLabel("Garment style").selectOption({ index: 1 });
    await owner.getByLabel("Ink colours for Full front").fill("2");
    await owner.getByLabel("YM", { exact: true }).fill("10");
    await owner.getByLabel("YL", { exact: true }).fill("6");
    await owner.getByLabel("M", { exact: true }).fill("12");
    await owner.getByLabel("2XL", { exact: true }).fill("2");
    await expect.poll(() => owner.getByTestId("size-run-total").textContent()).toContain("30");
    // The estimate follows the form as it is typed.
    await expect.poll(() => owner.getByTestId("price-estimate").getByTestId("quote-total").count()).toBe(1);
    await owner.getByRole("button", { name: "Create job" }).click();
    await owner.waitForURL(/\/jobs\/[0-9a-f-]{36}(\?done=[a-z-]+)?$/);
    const jobId = new URL(owner.url()).pathname.split("/").pop()!;
    // The form confirms itself on the page it lands on, in a status a screen reader announces.
    expect(await owner.getByTestId("arrival-note").textContent()).toMatch(/^Job created\./);
    expect(await owner.getByTestId("arrival-note").getAttribute("role")).toBe("status");
    const run = await owner.getByTestId("job-size-run").textContent();
    expect(run).toContain("Youth");
    expect(run).toContain("Adult");

    // Send the quote.
    await owner.getByRole("button", { name: "Send quote to client" }).click();
    await expect.poll(() => owner.getByTestId("send-quote-notice").textContent()).toMatch(/Quote Q1 sent to 2 contacts/);
    await owner.reload();
    const panel = owner.getByTestId("job-money");
    expect(await panel.getByTestId("money-state").textContent()).toBe("Quote out");
    const quoteMail = await waitForMail(demo.emails.client, /Quote Q1 .*Autumn league tees/, since);
    expect(quoteMail.text).toContain(`/portal/jobs/${jobId}`);

    // The client accepts and pays the deposit on the payment page.
    const clientContext = await newContext(browser, { viewport: { width: 420, height: 900 } });
    const client = await clientContext.newPage();
    await signIn(client, demo.emails.client);
    await client.goto(`/portal/jobs/${jobId}`);
    await ready(client);
    const quote = client.getByTestId("quote-panel");
    const total = money(await quote.getByTestId("quote-total").textContent());
    const deposit = money(await quote.getByTestId("quote-deposit").textContent());
    expect(deposit).toBe(Math.round(total / 2));
    await quote.getByRole("button", { name: "Accept quote" }).click();
    await expect.poll(() => quote.getByRole("alert").textContent()).toMatch(/Type your full name/);
    await quote.getByLabel("Your full name").fill("Priya Castell");
    await quote.getByRole("button", { name: "Accept quote" }).click();
    await expect.poll(() => quote.getByRole("alert").textContent()).toMatch(/Tick the box/);
    await quote.getByRole("checkbox").check();
    await quote.getByRole("button", { name: "Accept quote" }).click();
    const payDeposit = quote.getByRole("button", { name: `Pay deposit: ${formatCents(deposit)}` });
    await payDeposit.waitFor();
    await payDeposit.click();
    await client.waitForURL(/\/pay\/cs_/);
    expect(await client.getByTestId("fake-pay-total").textContent()).toContain(formatCents(deposit).replace("$", ""));
    await client.getByTestId("fake-pay").click();
    await client.waitForURL(new RegExp(`/portal/jobs/${jobId}\\?checkout=cs_`));
    await client.getByText("Payment received").waitFor();
    expect(money(await client.getByTestId("client-paid").textContent())).toBe(deposit);
    expect(money(await client.getByTestId("client-balance").textContent())).toBe(total - deposit);
    expect(await client.getByRole("button", { name: /Pay balance/ }).count()).toBe(1);

    // The shop sees the deposit paid and the balance due.
    await owner.reload();
    expect(await panel.getByTestId("money-state").textContent()).toBe("Deposit paid");
    expect(money(await panel.getByTestId("paid-amount").textContent())).toBe(deposit);
    expect(money(await panel.getByTestId("balance-due").textContent())).toBe(total - deposit);
    expect(await panel.getByTestId("payment-list").textContent()).toContain("Paid");

    // The receipt is in the mailbox.
    const receipt = await waitForMail(demo.emails.client, /Receipt: .* paid for Autumn league tees/, since);
    expect(receipt.text).toContain(formatCents(deposit));
    expect(receipt.text).toContain(`Balance due: ${formatCents(total - deposit)}`);

    // Production sees the job and its quantities but no money.
    const pressContext = await newContext(browser);
    const press = await pressContext.newPage();
    await signIn(press, demo.emails.production);
    await press.goto(`/shops/${demo.slug}/jobs/${jobId}`);
    expect(await press.getByTestId("job-size-run").count()).toBe(1);
    expect(await press.getByTestId("job-money").count()).toBe(0);
    expect(await press.content()).not.toContain(formatCents(total));
    await press.goto(`/shops/${demo.slug}/prices`);
    expect(await press.getByText("This page is not open to you").count()).toBe(1);

    await Promise.all([shop.close(), clientContext.close(), pressContext.close()]);
  });

  it("clients are created with contacts, edited and archived; jobs filter, sort and move on the board", async () => {
    const context = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, demo.emails.designer);
    await page.goto(`/shops/${demo.slug}/clients/new`);
    await ready(page);
    await page.getByLabel("Name", { exact: true }).first().fill("Harbour Choir");
    await page.getByLabel("E-mail").fill("not-an-address");
    await page.getByRole("button", { name: "Create client" }).click();
    await page.getByText("Enter the contact's name").waitFor();
    await page.getByText("Enter a valid e-mail address").waitFor();
    await page.locator("#contact-0-name").fill("Odile Marsh");
    await page.getByLabel("E-mail").fill("odile@harbour-choir.test");
    await page.getByRole("button", { name: "Create client" }).click();
    await page.waitForURL(/\/clients\/[0-9a-f-]{36}(\?done=[a-z-]+)?$/);
    await ready(page);
    await page.getByRole("button", { name: "Add a contact" }).click();
    await page.locator("#contact-1-name").fill("Tam Ellory");
    await page.locator("#contact-1-email").fill("tam@harbour-choir.test");
    await page.getByRole("button", { name: "Save client" }).click();
    await page.getByText("Saved.").waitFor();
    await page.reload();
    await ready(page);
    expect(await page.getByTestId("contact-row").count()).toBe(2);
    await page.getByRole("button", { name: "Archive client" }).click();
    await page.getByText(/Archived\./).waitFor();
    await page.goto(`/shops/${demo.slug}/clients`);
    expect(await page.getByText("Harbour Choir").count()).toBe(0);
    await page.goto(`/shops/${demo.slug}/clients?archived=1`);
    expect(await page.getByText("Harbour Choir").count()).toBe(1);

    await page.goto(`/shops/${demo.slug}/jobs`);
    await ready(page);
    const table = page.getByTestId("job-table");
    const rowTexts = () => table.locator("tbody tr").allTextContents();
    // Other test files add jobs to the same shop, so look for ours by search before filtering.
    await page.getByLabel("Search").fill("autumn league");
    await page.getByLabel("Status").selectOption("drafting");
    // The list answers from the server: wait for the page of both filters, not a page between them.
    const allDrafting = async () => {
      const rows = await rowTexts();
      return rows.length > 0 && rows.every((row) => row.includes("Drafting"));
    };
    await expect.poll(async () => (await allDrafting()) && (await rowTexts()).join("|").includes("Autumn league tees")).toBe(true);
    await page.getByLabel("Search").fill("");
    await expect.poll(allDrafting).toBe(true);
    await page.getByLabel("Status").selectOption("");
    await page.getByLabel("Client").selectOption({ label: "Northgate Robotics Club" });
    await expect.poll(async () => (await rowTexts()).every((row) => row.includes("Northgate Robotics Club"))).toBe(true);
    expect((await rowTexts()).join("|")).toContain("Competition hoodies");
    await page.getByLabel("Client").selectOption("");
    await page.getByLabel("Search").fill("autumn");
    await expect.poll(() => table.locator("tbody tr").count()).toBe(1);
    await page.getByLabel("Search").fill("");
    const download = page.waitForEvent("download");
    await page.getByRole("button", { name: "Size runs as CSV" }).click();
    const file = await download;
    const csv = await (await file.createReadStream()).toArray();
    const text = Buffer.concat(csv.map((c) => Buffer.from(c))).toString("utf8");
    expect(text.split("\r\n")[0]).toMatch(/^Job,Client,Status,Due,.*,Total$/);
    expect(text).toContain("Competition hoodies");

    await page.goto(`/shops/${demo.slug}/jobs?view=board`);
    await ready(page);
    const saved = page.waitForResponse((r) => r.request().method() === "POST" && new URL(r.url()).pathname.endsWith("/jobs"));
    await page.getByLabel("Move to: Autumn league tees").selectOption("cleared");
    expect((await saved).status()).toBe(200);
    await expect.poll(() => page.getByRole("region", { name: "Cleared to print" }).textContent()).toContain("Autumn league tees");
    await page.reload();
    expect(await page.getByRole("region", { name: "Cleared to print" }).textContent()).toContain("Autumn league tees");
    await context.close();
  });

  it("the owner edits the price matrix; the designer sees it read-only", async () => {
    const context = await newContext(browser, { viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, demo.emails.owner);
    await page.goto(`/shops/${demo.slug}/prices`);
    await ready(page);
    await page.getByLabel("Deposit to start (%)").fill("40");
    await page.getByLabel("DTG, break 1, 1 location, per garment").fill("");
    await page.getByRole("button", { name: "Save prices" }).click();
    await page.getByText(/Some prices need fixing/).waitFor();
    await page.getByLabel("DTG, break 1, 1 location, per garment").fill("15.50");
    await page.getByRole("button", { name: "Save prices" }).click();
    await page.getByText(/Prices saved/).waitFor();
    await page.reload();
    await ready(page);
    expect(await page.getByLabel("Deposit to start (%)").inputValue()).toBe("40");
    expect(await page.getByLabel("DTG, break 1, 1 location, per garment").inputValue()).toBe("15.50");
    // Put the demo deposit back for the other tests.
    await page.getByLabel("Deposit to start (%)").fill("50");
    await page.getByRole("button", { name: "Save prices" }).click();
    await page.getByText(/Prices saved/).waitFor();
    await context.close();

    const designerContext = await newContext(browser);
    const designer = await designerContext.newPage();
    await signIn(designer, demo.emails.designer);
    await designer.goto(`/shops/${demo.slug}/prices`);
    await ready(designer);
    await designer.getByText("Only the owner can change them").waitFor();
    expect(await designer.getByRole("button", { name: "Save prices" }).count()).toBe(0);
    expect(await designer.getByLabel("Deposit to start (%)").isDisabled()).toBe(true);
    await designerContext.close();
  });
});
