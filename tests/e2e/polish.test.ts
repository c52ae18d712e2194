import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getPool } from "@/db/client";
import { fetchProof, openTeeProof } from "./editor-support";
import { demoCopy, type DemoCopy } from "./demo-copy";
import { launch, newContext, signIn } from "./support";

let browser: Browser;
let demo: DemoCopy;
beforeAll(async () => {
  demo = await demoCopy("polish");
  browser = await launch();
});
afterAll(async () => {
  await demo?.drop();
  await getPool().end();
  await browser?.close();
});

describe("everyday polish a shop and its clients notice", () => {
  it("prices show two decimals in the shop's currency; activity lines say who did what and link to the job", async () => {
    const context = await newContext(browser, { viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signIn(page, demo.emails.owner);
    await page.goto(`/shops/${demo.slug}/prices`);
    const blank = page.getByLabel("Blank garment, each");
    await blank.waitFor();
    // The visible label is the field's accessible name, and money reads to the cent.
    expect(await blank.inputValue()).toMatch(/^\d+\.\d{2}$/);

    await page.goto(`/shops/${demo.slug}`);
    const lines = page.getByTestId("activity-line");
    await lines.first().waitFor();
    const texts = await lines.allTextContents();
    // No bare lines: each names who did it ("Someone" when they have left) and what it was about.
    for (const t of texts) {
      expect(t.trim().split(/\s+/).length, t).toBeGreaterThanOrEqual(4);
      expect(t, t).toMatch(/^[A-Z\p{Lu}]/u);
      expect(t, t).not.toMatch(/^(share revoked|payment received|quote accepted)\.?$|A new \w+ joined/i);
    }
    const linked = lines.locator("a[href*='/jobs/']").first();
    await linked.waitFor();
    await linked.click();
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}/);
    await context.close();
  });

  it("the board's status menus show their whole words, and a move confirms itself in a status", async () => {
    const context = await newContext(browser, { viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signIn(page, demo.emails.owner);
    await page.goto(`/shops/${demo.slug}/jobs?view=board`);
    await page.locator("[data-testid=job-board]").waitFor();
    await page.locator("[data-hydrated=true]").waitFor();
    const clipped = await page.locator("[data-testid=board-card] select").evaluateAll((selects) =>
      selects
        .map((el) => {
          const s = el as HTMLSelectElement;
          // The chosen option's words, measured in the select's own font, against the room inside it.
          const probe = document.createElement("span");
          const style = getComputedStyle(s);
          probe.style.font = style.font;
          probe.style.position = "absolute";
          probe.style.whiteSpace = "nowrap";
          probe.textContent = s.selectedOptions[0]?.textContent ?? "";
          document.body.appendChild(probe);
          const need = probe.getBoundingClientRect().width + parseFloat(style.paddingLeft) + parseFloat(style.paddingRight);
          probe.remove();
          return need > s.getBoundingClientRect().width + 0.5 ? `${probe.textContent} needs ${Math.ceil(need)} px, has ${Math.floor(s.getBoundingClientRect().width)}` : null;
        })
        .filter(Boolean),
    );
    expect(clipped).toEqual([]);
    // And nothing on a card is cut off by its column: each card fits inside its column, and its words inside it.
    const outside = await page.locator("[data-testid=board-card]").evaluateAll((cards) =>
      cards
        .map((card) => {
          const column = card.closest("section")!.getBoundingClientRect();
          const box = card.getBoundingClientRect();
          const fits = box.left >= column.left - 0.5 && box.right <= column.right + 0.5 && card.scrollWidth <= card.clientWidth + 1;
          return fits ? null : `${card.querySelector("a")?.textContent}: card ${Math.round(box.width)} px in a ${Math.round(column.width)} px column`;
        })
        .filter(Boolean),
    );
    expect(outside).toEqual([]);
    // Columns never run into each other or past the board.
    const overlaps = await page.locator("[data-testid=job-board]").evaluate((board) => {
      const boxes = Array.from(board.querySelectorAll(":scope > section")).map((s) => ({ name: s.getAttribute("aria-label"), r: s.getBoundingClientRect() }));
      const out: string[] = [];
      boxes.forEach((a, i) =>
        boxes.slice(i + 1).forEach((b) => {
          const apart = a.r.right <= b.r.left + 0.5 || b.r.right <= a.r.left + 0.5 || a.r.bottom <= b.r.top + 0.5 || b.r.bottom <= a.r.top + 0.5;
          if (!apart) out.push(`${a.name} overlaps ${b.name}`);
        }),
      );
      if (board.scrollWidth > board.clientWidth + 1) out.push(`the board is ${board.scrollWidth} px wide in ${board.clientWidth} px`);
      return out;
    });
    expect(overlaps).toEqual([]);
    // The first card of the first column moves one step on.
    const card = page.locator("[data-testid=board-card]").first();
    const title = (await card.getByRole("link").first().textContent())!.trim();
    const select = page.getByLabel(`Move to: ${title}`, { exact: true });
    const next = await select.evaluate((el) => {
      const s = el as HTMLSelectElement;
      return Array.from(s.options).find((o) => !o.disabled && o.value !== s.value)?.value ?? null;
    });
    expect(next).not.toBeNull();
    await select.selectOption(next!);
    await page.getByTestId("board-said").filter({ hasText: `${title} is now in` }).waitFor();
    expect(await page.getByTestId("board-said").getAttribute("role")).toBe("status");
    await context.close();
  });

  it("on a phone, Actual size opens on the middle of the print", async () => {
    const context = await newContext(browser, { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    const page = await context.newPage();
    await signIn(page, demo.emails.designer);
    const proofId = await openTeeProof(page, 0.3, demo.slug);
    const print = (await fetchProof(page, proofId)).placements[0]!;
    await page.getByRole("button", { name: "Actual size" }).click();
    const canvas = page.locator("[data-testid=proof-canvas]");
    await expect.poll(() => page.getByTestId("zoom-value").textContent()).toBe("100%");
    await expect
      .poll(async () => {
        const [scale, ox, oy, box] = await Promise.all([canvas.getAttribute("data-scale"), canvas.getAttribute("data-origin-x"), canvas.getAttribute("data-origin-y"), canvas.boundingBox()]);
        const s = Number(scale);
        // The print's middle, in stage pixels, against the middle of the canvas.
        const x = Number(ox) + print.offsetFromCenterIn * s;
        const y = Number(oy) + (print.belowCollarIn + print.heightIn / 2) * s;
        return Math.max(Math.abs(x - box!.width / 2), Math.abs(y - box!.height / 2));
      })
      .toBeLessThan(1);
    await context.close();
  });

  it("Copy says Copied, in words a screen reader hears", async () => {
    const context = await newContext(browser, { viewport: { width: 1280, height: 900 } });
    await context.grantPermissions(["clipboard-read", "clipboard-write"]);
    const page = await context.newPage();
    await signIn(page, demo.emails.designer);
    await openTeeProof(page, 0.3, demo.slug);
    await page.getByRole("button", { name: "Share with client" }).click();
    await page.getByRole("button", { name: "Make a link to copy" }).click();
    const link = await page.getByLabel("Review link").inputValue();
    await page.getByRole("button", { name: "Copy", exact: true }).click();
    await page.getByRole("button", { name: "Copied" }).waitFor();
    expect(await page.getByTestId("copy-said").textContent()).toBe("Review link copied.");
    expect(await page.evaluate(() => navigator.clipboard.readText())).toBe(link);
    await context.close();
  });
});
