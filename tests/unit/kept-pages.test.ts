import { describe, expect, it } from "vitest";
import { keptPageKeys, keptReviewToken } from "@/lib/kept-pages";

const TOKEN = "Zq3_vR8-kT2mW9xY4bN7cD1e";

describe("which visits a kept review page answers", () => {
  it.each([
    ["GET", `/r/${TOKEN}`, "", TOKEN],
    ["GET", `/r/${TOKEN}`, "?checkout=paid", null],
    ["GET", `/r/${TOKEN}`, "?view=fresh", null],
    ["HEAD", `/r/${TOKEN}`, "", null],
    ["POST", `/r/${TOKEN}`, "", null],
    ["GET", `/r/${TOKEN}/extra`, "", null],
    ["GET", "/r/short", "", null],
    ["GET", `/r/${TOKEN}%3Cscript`, "", null],
    ["GET", `/portal/${TOKEN}`, "", null],
  ])("%s %s%s → %s", (method, pathname, search, expected) => {
    expect(keptReviewToken(method, pathname, search)).toBe(expected);
  });
});

describe("the kept-page secrets", () => {
  const env = { CHALKLINE_RENDER_KEY: "k", CHALKLINE_NONCE_STAND_IN: "s", CHALKLINE_SELF_URL: "http://127.0.0.1:3000" };
  it("are all needed, and can be turned off", () => {
    expect(keptPageKeys(env)).toEqual({ render: "k", standIn: "s", selfUrl: "http://127.0.0.1:3000" });
    expect(keptPageKeys({ ...env, CHALKLINE_SELF_URL: undefined })).toBeNull();
    expect(keptPageKeys({ ...env, CHALKLINE_KEEP_REVIEW_PAGES: "off" })).toBeNull();
  });
});
