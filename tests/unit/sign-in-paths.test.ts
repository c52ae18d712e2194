import { describe, expect, it } from "vitest";
import { checkEmailPath, localPath, shownEmail } from "@/lib/sign-in-paths";

describe("localPath", () => {
  // Browsers treat "//host" and "/\host" as another site (WHATWG URL parsing of scheme-relative urls).
  it.each([
    ["/shops/bench-press", "/shops/bench-press"],
    ["/invite/abc?x=1", "/invite/abc?x=1"],
    ["/", "/"],
    ["//elsewhere.test/path", undefined],
    ["/\\elsewhere.test", undefined],
    ["https://elsewhere.test/", undefined],
    ["shops/x", undefined],
    ["/a\nb", undefined],
    ["", undefined],
    [undefined, undefined],
  ])("%j → %j", (value, expected) => {
    expect(localPath(value)).toBe(expected);
  });
});

describe("checkEmailPath", () => {
  it("carries the address and the return path, encoded", () => {
    expect(checkEmailPath("ada+shop@example.test", "/shops/tidewater?tab=team")).toBe(
      "/sign-in/check-email?email=ada%2Bshop%40example.test&callbackUrl=%2Fshops%2Ftidewater%3Ftab%3Dteam",
    );
    expect(checkEmailPath("ada@example.test", "/home", true)).toBe("/sign-in/check-email?email=ada%40example.test&callbackUrl=%2Fhome&unsent=1");
  });
});

describe("shownEmail", () => {
  it.each([
    ["ada@example.test", "ada@example.test"],
    ["not an address", undefined],
    ["ada@", undefined],
    [`${"a".repeat(320)}@example.test`, undefined],
    [undefined, undefined],
  ])("%j → %j", (value, expected) => {
    expect(shownEmail(value)).toBe(expected);
  });
});
