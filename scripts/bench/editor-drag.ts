/**
 * Frame times while dragging art in the editor: the 6000 × 6000 px upload placed on the team tee,
 * shown at true scale (zoom 1), dragged by playwright's mouse in many small steps. A
 * requestAnimationFrame loop in the page records frame timestamps; the gaps between them are the
 * frame times, read against the 16.7 ms of a 60 Hz display. Headless Chromium with --disable-gpu
 * rasterises in software, so these are a floor for a machine without GPU help, not a laptop figure.
 */
import type { Browser, Page } from "playwright-core";
import { benchContext, signIn, waitForArt } from "./browser";
import { BIG_ART_PX, type BenchFixture } from "./fixtures";
import { percentile, type Row } from "./table";

export const FRAME_BUDGET_MS = 1000 / 60;
const DRAG_STEPS = 300;
const WARMUP_STEPS = 40;

type Box = { x: number; y: number; width: number; height: number };
type KonvaNode = { getClientRect: () => Box; x: () => number; y: () => number };
type KonvaWindow = { Konva: { stages: Array<{ container: () => HTMLElement; findOne: (selector: string) => KonvaNode }> } };
type FrameWindow = { __benchFrames?: number[]; __benchFramesOn?: boolean };

/** Where to grab the art: the middle of the part of it that is on screen, in page pixels. */
async function grabPoint(page: Page): Promise<{ x: number; y: number; room: Box; art: { x: number; y: number } }> {
  return page.evaluate(() => {
    const stage = (window as unknown as KonvaWindow).Konva.stages[0]!;
    const node = stage.findOne(".art");
    const host = stage.container().getBoundingClientRect();
    const r = node.getClientRect();
    const left = Math.max(host.left + 40, host.left + r.x);
    const right = Math.min(host.right - 10, host.left + r.x + r.width);
    const top = Math.max(host.top + 40, host.top + r.y);
    const bottom = Math.min(host.bottom - 10, host.top + r.y + r.height);
    return { x: (left + right) / 2, y: (top + bottom) / 2, room: { x: host.left + 40, y: host.top + 40, width: host.width - 50, height: host.height - 50 }, art: { x: node.x(), y: node.y() } };
  });
}

async function artPosition(page: Page): Promise<{ x: number; y: number }> {
  return page.evaluate(() => {
    const node = (window as unknown as KonvaWindow).Konva.stages[0]!.findOne(".art");
    return { x: node.x(), y: node.y() };
  });
}

// Passed as source text: the bundler that runs this script would wrap a named callback in a helper
// the page does not have.
const START_FRAMES = `(() => {
  window.__benchFrames = [];
  window.__benchFramesOn = true;
  const tick = (t) => {
    window.__benchFrames.push(t);
    if (window.__benchFramesOn) requestAnimationFrame(tick);
  };
  requestAnimationFrame(tick);
})()`;

async function startFrames(page: Page): Promise<void> {
  await page.evaluate(START_FRAMES);
}

async function stopFrames(page: Page): Promise<number[]> {
  return page.evaluate(() => {
    const w = window as unknown as FrameWindow;
    w.__benchFramesOn = false;
    const t = w.__benchFrames ?? [];
    return t.slice(1).map((v, i) => v - t[i]!);
  });
}

/** A loop around the grab point (wide ellipse, twice round), ending 80 px right and 40 px down of it. */
async function drag(page: Page, from: { x: number; y: number }, room: Box, steps: number): Promise<void> {
  const rx = Math.min(180, (room.x + room.width - from.x) * 0.8, (from.x - room.x) * 0.8);
  const ry = Math.min(90, (room.y + room.height - from.y) * 0.8, (from.y - room.y) * 0.8);
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  for (let i = 1; i <= steps; i += 1) {
    const f = i / steps;
    const a = f * 4 * Math.PI;
    await page.mouse.move(from.x + rx * Math.sin(a) + 80 * f, from.y + ry * (1 - Math.cos(a)) * 0.5 + 40 * f);
  }
  await page.mouse.up();
}

export async function measureEditorDrag({ browser, baseUrl, fixture, password, log }: { browser: Browser; baseUrl: string; fixture: BenchFixture; password: string; log: (line: string) => void }): Promise<Row[]> {
  const context = await benchContext(browser, baseUrl);
  try {
    const page = await context.newPage();
    await signIn(page, fixture.designerEmail, password);
    await page.goto(`/shops/${fixture.shopSlug}/proofs/${fixture.proofId}?zoom=1`);
    await waitForArt(page);
    const scale = Number(await page.locator("[data-testid=proof-canvas]").first().getAttribute("data-scale"));

    // Idle frames first: how this headless Chromium paces rAF with nothing to draw.
    await startFrames(page);
    await page.waitForTimeout(1_000);
    const idle = await stopFrames(page);

    const grab = await grabPoint(page);
    log(`editor: ${scale.toFixed(1)} px/in, art grabbed at (${grab.x.toFixed(0)}, ${grab.y.toFixed(0)}); warm-up drag, then ${DRAG_STEPS} steps…`);
    await drag(page, grab, grab.room, WARMUP_STEPS);
    await page.waitForTimeout(1_500);

    const start = await grabPoint(page);
    const before = await artPosition(page);
    await startFrames(page);
    const t0 = Date.now();
    await drag(page, start, start.room, DRAG_STEPS);
    const dragMs = Date.now() - t0;
    const frames = await stopFrames(page);
    const after = await artPosition(page);
    const moved = Math.hypot(after.x - before.x, after.y - before.y);
    // The path ends about 89 px from where it began; the art must have followed (snapping may take a few px).
    if (moved < 40) throw new Error(`the drag did not move the art (moved ${moved.toFixed(1)} px); the pointer may have missed it`);
    if (frames.length < 20) throw new Error(`only ${frames.length} frames were recorded during the drag`);

    const p50 = percentile(frames, 50);
    const p95 = percentile(frames, 95);
    const over = frames.filter((f) => f > FRAME_BUDGET_MS * 1.5).length;
    const bench = `editor drag, ${fixture.previewPx.width}² preview of ${BIG_ART_PX}² px art`;
    const idleP50 = percentile(idle, 50);
    return [
      {
        benchmark: bench,
        subject: `frame p50 / p95, headless Chromium --disable-gpu (software raster), ${scale.toFixed(0)} px/in`,
        value: `${p50.toFixed(1)} / ${p95.toFixed(1)} ms (${frames.length} frames, ${DRAG_STEPS} moves in ${(dragMs / 1000).toFixed(1)} s)`,
        against: `16.7 ms budget at 60 Hz; idle rAF p50 ${idleP50.toFixed(1)} ms`,
        ratio: `p95 ${(p95 / FRAME_BUDGET_MS).toFixed(2)}× budget`,
      },
      {
        benchmark: bench,
        subject: "frames over 1.5× budget; longest frame",
        value: `${over} of ${frames.length} (${((over / frames.length) * 100).toFixed(0)}%); max ${Math.max(...frames).toFixed(1)} ms`,
        against: "16.7 ms budget at 60 Hz",
        ratio: `max ${(Math.max(...frames) / FRAME_BUDGET_MS).toFixed(2)}× budget`,
      },
    ];
  } finally {
    await context.close();
  }
}
