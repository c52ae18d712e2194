/**
 * Which test files a vitest project would find, for the runner's own checks. Dependency-free
 * (node: built-ins only), like the rest of scripts/lib.
 */
import { readdirSync } from "node:fs";
import path from "node:path";

/** The component project's files, as vitest.config.ts includes them: tests/component/**\/*.test.tsx. */
export function componentTestFiles(root: string): string[] {
  const dir = path.join(root, "tests", "component");
  let entries: string[];
  try {
    entries = readdirSync(dir, { recursive: true, encoding: "utf8" });
  } catch {
    return [];
  }
  return entries
    .map((f) => f.split(path.sep).join("/"))
    .filter((f) => f.endsWith(".test.tsx"))
    .sort();
}
