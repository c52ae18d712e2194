import { describe, expect, it } from "vitest";
import { z } from "zod";
import { BROKEN_TEXT_MESSAGE, inputProblem, MAX_INPUT_DEPTH, NUL_MESSAGE, parseInput, UNREADABLE_MESSAGE } from "@/lib/input";

const schema = z.object({ name: z.string().max(20), sizes: z.array(z.object({ size: z.string(), quantity: z.number().int() })) });

describe("parseInput", () => {
  it("parses what the schema accepts, as safeParse would", () => {
    expect(parseInput(schema, { name: "Relay tees", sizes: [{ size: "M", quantity: 4 }] })).toEqual({ success: true, data: { name: "Relay tees", sizes: [{ size: "M", quantity: 4 }] } });
  });

  it("refuses a NUL character with an issue at its field, since PostgreSQL text cannot store U+0000", () => {
    const result = parseInput(schema, { name: "ok", sizes: [{ size: "M\u0000", quantity: 1 }] });
    expect(result.success).toBe(false);
    expect(result.error!.issues).toEqual([expect.objectContaining({ path: ["sizes", 0, "size"], message: NUL_MESSAGE })]);
  });

  it("refuses a lone surrogate (not well-formed UTF-16, so not encodable as UTF-8 per the Unicode standard, ch. 3)", () => {
    expect(parseInput(schema, { name: "a\uD800", sizes: [] }).error!.issues[0]!.message).toBe(BROKEN_TEXT_MESSAGE);
    expect(parseInput(schema, { name: "a\uD83D\uDC55", sizes: [] }).success).toBe(true);
  });

  it("refuses NUL in keys, Map entries and FormData fields", () => {
    expect(inputProblem({ "a\u0000": 1 })).not.toBeNull();
    expect(inputProblem(new Map([["k", "v\u0000"]]))).not.toBeNull();
    const form = new FormData();
    form.append("name", "x\u0000");
    expect(inputProblem(form)).not.toBeNull();
  });

  it("refuses nesting past the depth limit without recursion", () => {
    let deep: unknown = "leaf";
    for (let i = 0; i < 100_000; i += 1) deep = [deep];
    expect(parseInput(schema, deep).error!.issues[0]!.message).toBe(UNREADABLE_MESSAGE);
    let ok: unknown = 1;
    for (let i = 0; i < MAX_INPUT_DEPTH - 1; i += 1) ok = { a: ok };
    expect(inputProblem(ok)).toBeNull();
  });

  it("turns a schema that throws on a hostile value into a refusal", () => {
    const throwing = z.string().transform(() => {
      throw new TypeError("Cannot convert object to primitive value");
    });
    expect(parseInput(throwing, "x")).toMatchObject({ success: false });
    // An object whose toString is not a function, as a JSON body can make.
    expect(parseInput(z.object({ name: z.string() }), { name: { toString: "x" } }).success).toBe(false);
  });
});
