/**
 * An address gives access only once whoever uses it has shown they read its mail, tried from the
 * attacker's side over HTTP and in Chromium against the production build: signing up with a
 * client contact's address gets none of that client's jobs or quotes, and an account made ahead
 * of a shop's invitation cannot be handed the invitation by its real recipient. The genuine
 * sign-up still ends in the shop, through the e-mailed link.
 */
import AxeBuilder from "@axe-core/playwright";
import { randomBytes } from "node:crypto";
import { readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { and, eq } from "drizzle-orm";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, getPool } from "@/db/client";
import { createClient } from "@/db/queries/clients";
import { createJob } from "@/db/queries/jobs";
import { findQuote, sendQuote } from "@/db/queries/orders";
import { createInvitation, createShopWithOwner } from "@/db/queries/shops";
import { findUserByEmail, markEmailVerified } from "@/db/queries/users";
import { clientContacts, invitations, memberships, shops } from "@/db/schema";
import { DEFAULT_PRICE_MATRIX } from "@/lib/pricing";
import { quoteJob } from "@/lib/quotes";
import { jobFormInput } from "@/tests/authz/fixtures";
import { BASE_URL, DEMO_PASSWORD, launch, newContext, openSignUpLink, signIn, signInOverHttp, tryPasswordSignIn } from "./support";

const repoRoot = fileURLToPath(new URL("../..", import.meta.url));
const tag = randomBytes(3).toString("hex");
const PASSWORD = "a-long-enough-password";
const jobTitle = `Lighthouse relay tees ${tag}`;

let browser: Browser;
const contexts: BrowserContext[] = [];
let shop: { id: string; slug: string; name: string };
let ownerId = "";
let quoteId = "";
let clientId = "";
/** A contact the shop filed under this address; nobody has an account with it yet. */
const contactEmail = `skipper-${tag}@harbour-relay.test`;

async function context() {
  const c = await newContext(browser, { viewport: { width: 1280, height: 900 } });
  contexts.push(c);
  return c;
}

/** Fills and sends the sign-up form; resolves once the form has gone wherever it goes next. */
async function signUp(page: Page, shopName: string, email: string) {
  await page.goto("/sign-up");
  await page.getByLabel("Shop name").fill(shopName);
  await page.getByLabel("Your name").fill("Vale Corrin");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByRole("button", { name: "Create shop" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-up"));
}

/** Serious or critical accessibility findings on the page as it is. */
async function axeFindings(page: Page): Promise<string[]> {
  const axe = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  return axe.violations.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => `${v.id}: ${v.help}`);
}

async function cookieHeader(c: BrowserContext): Promise<string> {
  return (await c.cookies()).map((k) => `${k.name}=${k.value}`).join("; ");
}

/** The build's id for a server action, as the browser's page would send it. */
function actionId(file: string, name: string): string {
  const manifest = JSON.parse(readFileSync(path.join(repoRoot, ".next", "server", "server-reference-manifest.json"), "utf8")) as {
    node: Record<string, { exportedName?: string; filename?: string }>;
  };
  const found = Object.entries(manifest.node).find(([, entry]) => entry.exportedName === name && entry.filename?.replace(/^\.\//, "") === file);
  if (!found) throw new Error(`the build lists no ${file}#${name}`);
  return found[0];
}

/** Calls the invitation's accept action through Next.js's action endpoint, as the invite page would. */
async function postAccept(token: string, args: Record<string, unknown>, cookie?: string): Promise<{ status: number; text: string }> {
  const headers: Record<string, string> = {
    "next-action": actionId("app/invite/[token]/actions.ts", "acceptInvitationAction"),
    "content-type": "text/plain;charset=UTF-8",
    accept: "text/x-component",
    origin: new URL(BASE_URL).origin,
  };
  if (cookie) headers.cookie = cookie;
  const response = await fetch(`${BASE_URL}/invite/${token}`, { method: "POST", headers, body: JSON.stringify([{ token, ...args }]) });
  return { status: response.status, text: await response.text() };
}

async function membershipsOf(email: string) {
  const user = await findUserByEmail({ email });
  if (!user) return [];
  return db.select().from(memberships).where(and(eq(memberships.shopId, shop.id), eq(memberships.userId, user.id)));
}

beforeAll(async () => {
  browser = await launch();
  const email = `harbour-owner-${tag}@harbour-prints.test`;
  const made = await createShopWithOwner({ shopName: `Harbour Relay Prints ${tag}`, name: "Ines Harrow", email, passwordHash: "not-used-here" });
  await markEmailVerified({ userId: made.userId });
  ownerId = made.userId;
  const [row] = await db.select({ id: shops.id, slug: shops.slug, name: shops.name }).from(shops).where(eq(shops.slug, made.shopSlug));
  shop = row!;
  const client = await createClient({ shopId: shop.id, actorUserId: ownerId, input: { name: `Harbour Relay Club ${tag}`, notes: null, taxExempt: false, contacts: [{ name: "Bram Skipper", email: contactEmail, phone: null }] } });
  clientId = client.id;
  const input = { ...jobFormInput(jobTitle, client.id), notes: null };
  const job = await createJob({ shopId: shop.id, actorUserId: ownerId, input });
  const priced = quoteJob({ ...input, garmentName: "Everyday Crew Tee" }, DEFAULT_PRICE_MATRIX, { taxExempt: false });
  if (!priced.ok || !priced.snapshot) throw new Error(priced.ok ? "no snapshot" : priced.message);
  quoteId = (await sendQuote({ shopId: shop.id, jobId: job.id, snapshot: priced.snapshot, depositPercent: DEFAULT_PRICE_MATRIX.depositPercent, actorUserId: ownerId })).id;
});

afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => {});
  await browser?.close();
  await getPool().end();
});

describe("e-mail ownership before access", () => {
  it("signing up with a client contact's address gets no password sign-in, none of the client's jobs, and cannot accept its quote", async () => {
    const attacker = await context();
    const page = await attacker.newPage();
    await signUp(page, `Borrowed Address Tees ${tag}`, contactEmail);

    // The password chosen at sign-up does not sign in: the address was never proven.
    const attempt = await tryPasswordSignIn(contactEmail, PASSWORD);
    expect(attempt.sessionEmail).toBeNull();
    expect(attempt.error).toBe("EmailUnproven");

    // Neither the browser that signed up nor the refused attempt reaches the client's jobs.
    for (const cookie of [await cookieHeader(attacker), attempt.cookie]) {
      const portal = await fetch(`${BASE_URL}/portal`, { headers: { cookie, accept: "text/html" }, redirect: "manual" });
      expect(portal.status).not.toBe(200);
      expect(await portal.text()).not.toContain(jobTitle);
      const accept = await fetch(`${BASE_URL}/api/quotes/${quoteId}/accept`, {
        method: "POST",
        headers: { cookie, "content-type": "application/json", "x-forwarded-for": "10.93.0.1" },
        body: JSON.stringify({ fullName: "Vale Corrin", confirmed: true }),
      });
      expect(accept.status).toBe(401);
    }
    expect((await findQuote({ quoteId }))?.state).toBe("sent");
    const [contact] = await db.select({ userId: clientContacts.userId }).from(clientContacts).where(and(eq(clientContacts.clientId, clientId), eq(clientContacts.email, contactEmail)));
    expect(contact!.userId).toBeNull();

    // The sign-in form says why in words and offers the link again.
    await page.goto("/portal");
    await page.waitForURL(/\/sign-in/);
    expect(await page.content()).not.toContain(jobTitle);
    await page.getByLabel("E-mail").fill(contactEmail);
    await page.getByLabel("Password").fill(PASSWORD);
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await page.getByRole("alert").filter({ hasText: `Open the link we e-mailed to ${contactEmail} first: it proves the address is yours.` }).waitFor();
    await page.getByRole("button", { name: "Send the link again" }).waitFor();
    expect(new URL(page.url()).pathname).toBe("/sign-in");
  });

  it("an account made ahead of a shop's invitation cannot be handed the invitation by anyone not signed in as it, and gains no membership", async () => {
    const squatted = `deckhand-${tag}@harbour-relay.test`;
    const attacker = await context();
    await signUp(await attacker.newPage(), `Early Claim Transfers ${tag}`, squatted);
    const { token, invitationId } = await createInvitation({ shopId: shop.id, email: squatted, role: "designer", invitedBy: ownerId });

    // The invitation's real recipient, not signed in, accepts as the page's action would be called.
    const anonymous = await postAccept(token, {});
    expect(anonymous.status).toBe(200);
    expect(anonymous.text).not.toContain('"ok":true');
    expect(anonymous.text).toContain(`Sign in as ${squatted} first`);
    // Offering a new name and password for the existing address changes nothing either.
    const renamed = await postAccept(token, { name: "Vale Corrin", password: PASSWORD });
    expect(renamed.text).not.toContain('"ok":true');
    // Someone else's session does not stand in for the invited account.
    const designer = await postAccept(token, {}, await signInOverHttp("designer@chalkline.test", DEMO_PASSWORD));
    expect(designer.text).not.toContain('"ok":true');

    expect(await membershipsOf(squatted)).toEqual([]);
    const [invite] = await db.select({ acceptedAt: invitations.acceptedAt }).from(invitations).where(eq(invitations.id, invitationId));
    expect(invite!.acceptedAt).toBeNull();

    // The page asks the recipient to sign in as that address first, and offers no accept button.
    const recipient = await (await context()).newPage();
    await recipient.goto(`/invite/${token}`);
    await recipient.getByRole("link", { name: `Sign in as ${squatted}` }).waitFor();
    expect(await recipient.getByRole("button", { name: "Accept and join" }).count()).toBe(0);
    expect(await axeFindings(recipient)).toEqual([]);
    // And the pre-registered password still signs nobody in.
    expect((await tryPasswordSignIn(squatted, PASSWORD)).sessionEmail).toBeNull();
    expect(await membershipsOf(squatted)).toEqual([]);
  });

  it("the genuine sign-up opens the e-mailed link, is signed in in its shop, and then signs in with its password and accepts an invitation", async () => {
    const email = `harbourmaster-${tag}@harbour-relay.test`;
    const shopName = `Tide Table Screens ${tag}`;
    const since = Date.now() - 1000;
    const owner = await context();
    const page = await owner.newPage();
    await signUp(page, shopName, email);
    await page.getByText(`We sent a link to ${email}.`).waitFor();
    await page.locator('[data-hydrated="true"]').getByRole("button", { name: "Send the link again" }).waitFor();
    expect(await axeFindings(page)).toEqual([]);
    const mail = await openSignUpLink(page, email, since);
    // The mail says what opening it confirms: the shop started with the address.
    expect(mail.text).toContain(`The shop “${shopName}” was started on Chalkline`);
    await page.waitForURL(/\/shops\/tide-table-screens/);
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Jobs" }).waitFor();
    expect((await findUserByEmail({ email }))!.emailVerified).toBeInstanceOf(Date);

    // The password works from now on.
    const later = await (await context()).newPage();
    await signIn(later, email, PASSWORD);
    await later.waitForURL(/\/shops\/tide-table-screens/);

    // Invited to another shop: signs in as the address first, comes back, and joins.
    const { token } = await createInvitation({ shopId: shop.id, email, role: "designer", invitedBy: ownerId });
    const fresh = await (await context()).newPage();
    await fresh.goto(`/invite/${token}`);
    await fresh.getByRole("link", { name: `Sign in as ${email}` }).click();
    await fresh.waitForURL(/\/sign-in\?/);
    await expect(fresh.getByLabel("E-mail").inputValue()).resolves.toBe(email);
    await fresh.getByLabel("Password").fill(PASSWORD);
    await fresh.getByRole("button", { name: "Sign in", exact: true }).click();
    await fresh.waitForURL(new RegExp(`/invite/${token}`));
    await fresh.locator('form[data-hydrated="true"]').waitFor();
    await fresh.getByRole("button", { name: "Accept and join" }).click();
    await fresh.waitForURL(new RegExp(`/shops/${shop.slug}`));
    expect(await membershipsOf(email)).toMatchObject([{ role: "designer" }]);
  });
});
