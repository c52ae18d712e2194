/**
 * Screenshots of a running app for review: `tsx scripts/screenshot.ts <path> <out.png> [--as email] [--width 1280] [--height 800]`.
 * Several pages in one sign-in: `--pages /a,/b,/c --dir out/` writes out/<width>-<page>.png for each
 * (a page given as "name=/path" is saved under that name).
 */
import { chromium } from "playwright-core";

const args = process.argv.slice(2);
const flag = (name: string, fallback?: string) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? args[i + 1] : fallback;
};
const [target = "/", out = "screenshot.png"] = args.filter((a, i) => !a.startsWith("--") && !args[i - 1]?.startsWith("--"));
const base = flag("base", "http://localhost:3000")!;
const as = flag("as");

const browser = await chromium.launch({
  executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
  args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
});
const context = await browser.newContext({
  baseURL: base,
  viewport: { width: Number(flag("width", "1280")), height: Number(flag("height", "800")) },
  deviceScaleFactor: Number(flag("scale", "1")),
});
const page = await context.newPage();
if (as) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(as);
  await page.getByLabel("Password").fill(flag("password", "chalkline-demo")!);
  await page.getByRole("button", { name: "Sign in", exact: true }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
}
const pages = flag("pages");
const shots: Array<{ path: string; out: string }> = pages
  ? pages.split(",").map((entry) => {
      const eq = entry.indexOf("=");
      // "name=/path?a=b": the name is before the first "=", the path (with its own "=") after it.
      const [name, path] = eq > 0 && entry.startsWith("/") === false ? [entry.slice(0, eq), entry.slice(eq + 1)] : [entry.replace(/[^A-Za-z0-9]+/g, "-").replace(/^-|-$/g, "") || "home", entry];
      return { path, out: `${flag("dir", ".")}/${flag("width", "1280")}-${name}.png` };
    })
  : [{ path: target, out }];
for (const shot of shots) {
  const response = await page.goto(shot.path);
  await page.waitForLoadState("networkidle").catch(() => undefined);
  await page.waitForTimeout(Number(flag("wait", "800")));
  await page.screenshot({ path: shot.out, fullPage: args.includes("--full") });
  console.log(`${response?.status()} ${page.url()} -> ${shot.out}`);
}
await browser.close();
