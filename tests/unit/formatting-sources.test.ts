/**
 * Money and dates become text in two places only: lib/money.ts and lib/dates.ts. This reads the
 * product's own sources and refuses any other way of writing an amount or a date, so a page can
 * never again show 4.5 beside $8.50, or 12/4/2026 beside Dec 4, 2026.
 */
import { readdirSync, readFileSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import { describe, expect, it } from "vitest";

const ROOT = join(__dirname, "..", "..");
const DIRS = ["app", "components", "canvas", "lib", "db"];

function sources(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) out.push(...sources(path));
    else if (/\.(ts|tsx)$/.test(name)) out.push(path);
  }
  return out;
}

type Rule = { what: string; pattern: RegExp; allowedIn: string[] };

const RULES: Rule[] = [
  { what: "a platform date or number text (toLocaleString and kin)", pattern: /\.toLocale(Date|Time)?String\(/, allowedIn: [] },
  { what: "a date format of its own (Intl.DateTimeFormat)", pattern: /Intl\.DateTimeFormat\(/, allowedIn: ["lib/dates.ts"] },
  { what: "a money format of its own (currency style)", pattern: /style:\s*["']currency["']/, allowedIn: ["lib/money.ts"] },
  { what: "a number format of its own (Intl.NumberFormat)", pattern: /new Intl\.NumberFormat\(/, allowedIn: ["lib/money.ts", "lib/units.ts"] },
  { what: "an ISO date cut out of a timestamp", pattern: /toISOString\(\)\.slice\(/, allowedIn: [] },
  { what: "a dollar sign glued to a number", pattern: /\$\$\{|["'`]\$["'`]\s*\+|prefix="\$"/, allowedIn: [] },
  { what: "a stored date put in text as it is stored (2027-03-12)", pattern: /\$\{[\w.?!]*(dueDate|[a-z]At)\}/, allowedIn: [
    // A column in SQL, not text; and the spec sheet's "made" line, handed over already formatted by lib/dates.ts.
    "db/queries/orders.ts",
    "app/_server/production/spec-sheet.ts",
  ] },
  { what: "cents turned into text by hand", pattern: /[cC]ents\)?\s*\/\s*100\)?\.toFixed\(|\(\s*\w*[cC]ents\s*\/\s*100\s*\)\.toFixed/, allowedIn: [] },
];

const files = DIRS.flatMap((d) => sources(join(ROOT, d))).map((path) => ({ path: relative(ROOT, path).replaceAll("\\", "/"), text: readFileSync(path, "utf8") }));

describe("money and dates come from their two helpers only", () => {
  it("reads the sources it guards", () => {
    expect(files.length).toBeGreaterThan(100);
    expect(files.some((f) => f.path === "lib/money.ts")).toBe(true);
    expect(files.some((f) => f.path === "lib/dates.ts")).toBe(true);
  });

  it.each(RULES)("nowhere else: $what", (rule) => {
    const hits: string[] = [];
    for (const f of files) {
      if (rule.allowedIn.includes(f.path)) continue;
      f.text.split("\n").forEach((line, i) => {
        if (rule.pattern.test(line)) hits.push(`${f.path}:${i + 1}: ${line.trim().slice(0, 120)}`);
      });
    }
    expect(hits).toEqual([]);
  });

  it("catches the forms it refuses", () => {
    const bad = ['at.toLocaleString("en-US")', "new Intl.DateTimeFormat(locale)", 'x.toISOString().slice(0, 10)', "`$${total}`", '(p.amountCents / 100).toFixed(2)', '{ style: "currency", currency }'];
    for (const line of bad) expect(RULES.some((r) => r.pattern.test(line)), line).toBe(true);
    expect(RULES.some((r) => r.pattern.test("formatMoney(cents, { currency })"))).toBe(false);
  });
});
