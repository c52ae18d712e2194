import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { componentTestFiles } from "@/scripts/lib/test-files";

const root = path.resolve(import.meta.dirname, "..", "..");

describe("the component test project", () => {
  const files = componentTestFiles(root);

  it("holds test files (an empty project would pass while testing nothing)", () => {
    expect(files.length).toBeGreaterThan(0);
  });

  it("finds the files vitest.config.ts includes for it", () => {
    const config = readFileSync(path.join(root, "vitest.config.ts"), "utf8");
    expect(config).toContain('include: ["tests/component/**/*.test.tsx"]');
    expect(files.every((f) => f.endsWith(".test.tsx"))).toBe(true);
  });

  it.each(componentTestFiles(root))("%s declares at least one test", (file) => {
    const text = readFileSync(path.join(root, "tests", "component", file), "utf8");
    expect(text).toMatch(/\bit(?:\.each\([\s\S]*?\))?\(\s*["'`]/);
  });
});
