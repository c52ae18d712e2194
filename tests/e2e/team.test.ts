/**
 * Team management in the browser, in a shop signed up here: invite someone, withdraw the
 * invitation (its e-mailed link stops working), and try to step down as the only owner.
 */
import AxeBuilder from "@axe-core/playwright";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { firstLink, launch, newContext, openSignUpLink, waitForMail } from "./support";

const LAST_OWNER = "A shop needs at least one owner. Make someone else an owner first.";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe("shop settings: the team", () => {
  it("invites someone, withdraws the invitation, and keeps the only owner an owner", async () => {
    const context = await newContext(browser, { viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const tag = `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
    const ownerName = "Marit Vos";

    const ownerEmail = `team-e2e-${tag}@example.test`;
    const signedUpAt = Date.now() - 1000;
    await page.goto("/sign-up");
    await page.getByLabel("Shop name").fill(`Bench Press Transfers ${tag}`);
    await page.getByLabel("Your name").fill(ownerName);
    await page.getByLabel("E-mail").fill(ownerEmail);
    await page.getByLabel("Password").fill("a-long-enough-password");
    await page.getByRole("button", { name: "Create shop" }).click();
    await openSignUpLink(page, ownerEmail, signedUpAt);
    await page.waitForURL(/\/shops\/bench-press-transfers/);
    const slug = new URL(page.url()).pathname.split("/")[2]!;

    await page.goto(`/shops/${slug}/settings`);
    await page.locator('form[aria-label="Invite a team member"][data-hydrated="true"]').waitFor();
    await page.locator('[data-hydrated="true"]').filter({ has: page.getByRole("list", { name: "Team members" }) }).waitFor();

    // Invite a press operator.
    const invitee = `team-e2e-press-${tag}@example.test`;
    const since = Date.now() - 1000;
    await page.getByLabel("E-mail").fill(invitee);
    await page.getByRole("radio", { name: /Production/ }).check();
    await page.getByRole("button", { name: "Send invitation" }).click();
    await page.getByRole("status").filter({ hasText: `Invitation sent to ${invitee}.` }).waitFor();
    const invitations = page.getByRole("list", { name: "Open invitations" });
    await invitations.getByText(invitee).waitFor();
    const mail = await waitForMail(invitee, /invited you/i, since);
    const link = firstLink(mail.text, "/invite/");

    // The page with a member and an open invitation has no serious accessibility findings.
    const axe = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
    expect(axe.violations.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => `${v.id}: ${v.help}`)).toEqual([]);

    // Withdraw it: the words say so, the list empties, and the e-mailed link no longer works.
    await page.getByRole("button", { name: `Withdraw the invitation to ${invitee}` }).click();
    await page.getByRole("status").filter({ hasText: `The invitation to ${invitee} is withdrawn; its link no longer works.` }).waitFor();
    await page.getByRole("heading", { name: "No open invitations" }).waitFor();
    const invitePage = await context.newPage();
    await invitePage.goto(link);
    await invitePage.getByRole("heading", { name: "This invitation cannot be used" }).waitFor();
    await invitePage.close();

    // The only owner tries to become a designer: asked first, then refused in words.
    const role = page.getByLabel(`Role of ${ownerName}`);
    await expect(role.inputValue()).resolves.toBe("owner");
    await role.selectOption("designer");
    await page.getByRole("button", { name: "Yes, change my role" }).click();
    await page.getByRole("alert").filter({ hasText: LAST_OWNER }).waitFor();
    await expect(role.inputValue()).resolves.toBe("owner");

    // Leaving the shop is refused the same way.
    await page.getByRole("button", { name: "Leave this shop" }).click();
    await page.getByRole("button", { name: "Yes, leave the shop" }).click();
    await page.getByRole("alert").filter({ hasText: LAST_OWNER }).waitFor();

    // Still the owner after a reload.
    await page.reload();
    await expect(page.getByLabel(`Role of ${ownerName}`).inputValue()).resolves.toBe("owner");
    await context.close();
  });
});
