/**
 * Generated hostile input for the request fuzzers: values of every JSON type with the edge cases
 * that break servers (NUL, lone surrogates, huge strings, int32 and float limits, impossible dates,
 * `__proto__` keys, deep nesting), mutations of a valid body, and raw request bodies that are not
 * JSON at all. Shared by the direct-call fuzzer (integration) and the HTTP fuzzer (e2e).
 */
import fc from "fast-check";

export const NASTY_STRINGS = [
  "",
  " ",
  "\u0000",
  "a\u0000b",
  "%00",
  "\uD800",
  "\uDFFF\uD800",
  "\u202Eevil",
  "\r\n\r\n",
  "'; drop table shops; --",
  "\" or 1=1 --",
  "<script>alert(1)</script>",
  "../../../../etc/passwd",
  "${7*7}{{7*7}}",
  "NaN",
  "Infinity",
  "-0",
  "1e309",
  "0x7fffffff",
  "2147483648",
  "99999999999999999999999",
  "__proto__",
  "constructor",
  "prototype",
  "null",
  "undefined",
  "true",
  "[]",
  "{}",
  "2027-02-30",
  "0000-00-00",
  "9999-12-31",
  "275760-09-14",
  "-271821-04-19",
  "+020000-01-01",
  "2027-13-01",
  "full-front",
  "screen-print",
  "M",
  "XXXXXXXXL",
  "approved",
  "changes-requested",
  "deposit",
  "owner",
  "library-everyday-crew-tee",
  "#GGGGGG",
  "#12345",
  "\u{1F455}".repeat(300),
  "\u00A0\u2007\u202F",
  "a".repeat(81),
  "a".repeat(2001),
];

export const NASTY_NUMBERS = [
  0, -0, 1, -1, 0.5, -0.5, 1e-300, 0.1 + 0.2, 7, 12.000001, 60.0001, -60.0001, 99.99, 100, 101, 255, 256, 1000, 1001, 10_000,
  2 ** 31 - 1, 2 ** 31, -(2 ** 31), -(2 ** 31) - 1, 2 ** 32, 2 ** 53 - 1, 2 ** 53, 2 ** 53 + 2, -(2 ** 53), 8.64e15, 8.64e15 + 1,
  1e21, 1e308, -1e308, Number.MAX_VALUE, Number.MIN_VALUE, -Number.MAX_VALUE,
];

export const hostileString: fc.Arbitrary<string> = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom(...NASTY_STRINGS) },
  { weight: 2, arbitrary: fc.string({ maxLength: 40 }) },
  { weight: 1, arbitrary: fc.string({ unit: "binary", maxLength: 40 }) },
  { weight: 1, arbitrary: fc.string({ unit: "grapheme", maxLength: 20 }) },
  { weight: 1, arbitrary: fc.integer({ min: 81, max: 120_000 }).map((n) => "x".repeat(n)) },
  { weight: 1, arbitrary: fc.tuple(fc.string({ maxLength: 10 }), fc.constantFrom("\u0000", "\uD800", "\u0007")).map(([s, c]) => `${s}${c}${s}`) },
);

export const hostileNumber: fc.Arbitrary<number> = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom(...NASTY_NUMBERS) },
  { weight: 2, arbitrary: fc.integer() },
  { weight: 2, arbitrary: fc.double({ noNaN: true, noDefaultInfinity: true }) },
);

const key: fc.Arbitrary<string> = fc.oneof(
  { weight: 4, arbitrary: fc.string({ maxLength: 12 }) },
  { weight: 1, arbitrary: fc.constantFrom("__proto__", "constructor", "prototype", "toString", "valueOf", "length", "then", "id", "shopSlug", "\u0000") },
);

/** Any JSON value, shallow or nested, with hostile leaves. */
export const hostileJson: fc.Arbitrary<unknown> = fc.letrec<{ value: unknown }>((tie) => ({
  value: fc.oneof(
    { depthSize: "small", withCrossShrink: true },
    hostileString,
    hostileNumber,
    fc.boolean(),
    fc.constant(null),
    fc.array(tie("value"), { maxLength: 6 }),
    fc.dictionary(key, tie("value"), { maxKeys: 6 }),
  ),
})).value;

/** Nesting deeper than any schema expects: arrays or objects, thousands of levels. */
export const deepNesting: fc.Arbitrary<unknown> = fc
  .tuple(fc.integer({ min: 40, max: 3000 }), fc.boolean(), fc.constantFrom<unknown>(null, 1, "x", {}))
  .map(([depth, asArray, leaf]) => {
    let value: unknown = leaf;
    for (let i = 0; i < depth; i += 1) value = asArray ? [value] : { a: value };
    return value;
  });

/** Wide values: long arrays, objects with many keys. */
export const wideValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.integer({ min: 200, max: 5000 }).map((n) => Array.from({ length: n }, (_, i) => ({ size: "M", quantity: i }))),
  fc.integer({ min: 200, max: 5000 }).map((n) => Object.fromEntries(Array.from({ length: n }, (_, i) => [`k${i}`, i]))),
  fc.integer({ min: 200, max: 3000 }).map((n) => Array.from({ length: n }, () => "M")),
);

type Path = Array<string | number>;

/** Every path into a JSON-like value, the root first. */
export function pathsOf(value: unknown, at: Path = [], out: Path[] = []): Path[] {
  out.push(at);
  if (Array.isArray(value)) value.forEach((v, i) => pathsOf(v, [...at, i], out));
  else if (value && typeof value === "object") for (const [k, v] of Object.entries(value)) pathsOf(v, [...at, k], out);
  return out;
}

function clone<T>(value: T): T {
  return value === undefined ? value : (JSON.parse(JSON.stringify(value)) as T);
}

type Op = { kind: "replace"; value: unknown } | { kind: "delete" } | { kind: "extra"; key: string; value: unknown } | { kind: "wrap" } | { kind: "stringify" } | { kind: "proto"; value: unknown };

const op: fc.Arbitrary<Op> = fc.oneof(
  { weight: 6, arbitrary: fc.oneof(hostileJson, deepNesting, wideValue).map((value) => ({ kind: "replace" as const, value })) },
  { weight: 2, arbitrary: fc.constant({ kind: "delete" as const }) },
  { weight: 1, arbitrary: fc.tuple(key, hostileJson).map(([k, value]) => ({ kind: "extra" as const, key: k, value })) },
  { weight: 1, arbitrary: fc.constant({ kind: "wrap" as const }) },
  { weight: 1, arbitrary: fc.constant({ kind: "stringify" as const }) },
  { weight: 1, arbitrary: hostileJson.map((value) => ({ kind: "proto" as const, value })) },
);

function apply(value: unknown, path: Path, change: Op): unknown {
  if (path.length === 0) {
    switch (change.kind) {
      case "replace":
        return change.value;
      case "delete":
        return undefined;
      case "wrap":
        return [value];
      case "stringify":
        return JSON.stringify(value ?? null);
      case "extra":
        return value && typeof value === "object" && !Array.isArray(value) ? { ...value, [change.key]: change.value } : value;
      case "proto":
        // JSON.parse makes "__proto__" an own key, as a request body would.
        return value && typeof value === "object" && !Array.isArray(value)
          ? { ...(JSON.parse(`{"__proto__": ${JSON.stringify(change.value ?? null)}}`) as object), ...value }
          : value;
    }
  }
  const [head, ...rest] = path;
  if (Array.isArray(value)) {
    const copy = [...value];
    const next = apply(copy[head as number], rest, change);
    if (next === undefined && rest.length === 0) copy.splice(head as number, 1);
    else copy[head as number] = next;
    return copy;
  }
  const record = { ...(value as Record<string, unknown>) };
  const next = apply(record[head as string], rest, change);
  if (next === undefined && rest.length === 0) delete record[head as string];
  else record[head as string] = next;
  return record;
}

function reaches(value: unknown, path: Path): boolean {
  let at: unknown = value;
  for (const step of path) {
    if (!at || typeof at !== "object" || !Object.hasOwn(at, step)) return false;
    at = (at as Record<string | number, unknown>)[step];
  }
  return true;
}

/** A valid body with one, two or three things wrong with it. */
export function mutationOf(base: unknown): fc.Arbitrary<unknown> {
  const paths = pathsOf(base);
  const one = fc.tuple(fc.integer({ min: 0, max: paths.length - 1 }), op);
  return fc.array(one, { minLength: 1, maxLength: 3 }).map((changes) => {
    let value = clone(base);
    for (const [i, change] of changes) {
      // Paths may have moved after an earlier change; apply only those that still lead somewhere.
      const path = paths[i]!;
      if (!reaches(value, path)) continue;
      value = apply(value, path, change);
    }
    return value;
  });
}

/** What a server action may be handed once React has decoded a request: more than JSON. */
export const actionValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom<unknown>(undefined, null, NaN, Infinity, -Infinity, 0n, 2n ** 70n, "", [], {}),
  fc.date({ noInvalidDate: false }),
  fc.tuple(hostileString, hostileJson).map(([k, v]) => new Map([[k, v]])),
  hostileJson.map((v) => new Set([v])),
  fc.dictionary(hostileString, hostileString, { maxKeys: 4 }).map((entries) => {
    const form = new FormData();
    for (const [k, v] of Object.entries(entries)) form.append(k, v);
    return form;
  }),
);

/** Argument for a server action: a mutation of a valid input most of the time. */
export function actionInput(base: unknown): fc.Arbitrary<unknown> {
  return fc.oneof(
    { weight: 6, arbitrary: mutationOf(base) },
    { weight: 2, arbitrary: hostileJson },
    { weight: 1, arbitrary: actionValue },
    { weight: 1, arbitrary: deepNesting },
  );
}

export type RawBody = { text: string; contentType: string | null; label: string };

const CONTENT_TYPES = ["application/json", "application/json; charset=utf-8", "text/plain", "application/x-www-form-urlencoded", "multipart/form-data; boundary=x", null] as const;

/** A request body as bytes on the wire: JSON, broken JSON, or not JSON at all. */
export function rawBody(base: unknown): fc.Arbitrary<RawBody> {
  const json = (label: string) => (value: unknown) => ({ text: JSON.stringify(value ?? null), contentType: "application/json", label });
  return fc.oneof(
    { weight: 6, arbitrary: mutationOf(base).map(json("mutated")) },
    { weight: 2, arbitrary: hostileJson.map(json("json")) },
    { weight: 1, arbitrary: deepNesting.map(json("deep")) },
    { weight: 1, arbitrary: wideValue.map(json("wide")) },
    {
      weight: 2,
      arbitrary: fc.tuple(fc.oneof(hostileString, fc.constantFrom("", "{", "[", '{"a":', "nul", '{"a":1}}', "\uFEFF{}", '{"__proto__":{"admin":true}}', "1".repeat(400))), fc.constantFrom(...CONTENT_TYPES)).map(([text, contentType]) => ({ text, contentType, label: "raw" })),
    },
    {
      weight: 1,
      arbitrary: fc.tuple(mutationOf(base), fc.integer({ min: 1, max: 40 })).map(([value, cut]) => {
        const text = JSON.stringify(value ?? null);
        return { text: text.slice(0, Math.max(0, text.length - cut)), contentType: "application/json", label: "truncated" };
      }),
    },
  );
}

/** Values for a path segment or a query parameter. */
export const hostileSegment: fc.Arbitrary<string> = fc.oneof(
  hostileString.filter((s) => s.length <= 4000),
  fc.constantFrom("..", ".", "%2e%2e", "%00", "a%00b", "%", "%zz", "\u0000", "a/b", " "),
);

/** Text in a response that gives the server's insides away. */
export function leaks(text: string): string | null {
  const patterns: Array<[RegExp, string]> = [
    [/\n\s+at [^\n]+[(:]\S+:\d+/, "a stack frame"],
    [/\bat (?:async )?[\w.<>$]+ \((?:file:\/\/|\/|node:)/, "a stack frame"],
    [/node_modules/, "a node_modules path"],
    [/\/work\/|\/home\/|\/tmp\//, "a server path"],
    [/\.tsx?:\d+/, "a source location"],
    [/\b(?:TypeError|ReferenceError|SyntaxError|RangeError): /, "an exception name"],
    [/duplicate key value|violates (?:foreign key|unique|check|not-null) constraint|invalid input syntax|invalid byte sequence|relation "\w+"/i, "a database error"],
  ];
  for (const [pattern, what] of patterns) if (pattern.test(text)) return `${what}: ${text.match(pattern)![0].slice(0, 120)}`;
  return null;
}

/**
 * Every leaf of a valid input set, in turn, to every edge value of another type or range: numbers
 * to the number edges, strings to the string edges, and any node to null, [] and {}. Deterministic;
 * at most `limit` cases, spread evenly over the list.
 */
export function boundaryCases(base: unknown, limit = 600): unknown[] {
  const cases: unknown[] = [];
  for (const at of pathsOf(base)) {
    let node: unknown = base;
    for (const step of at) node = (node as Record<string | number, unknown>)[step];
    const values: unknown[] = [null, [], {}];
    if (typeof node === "number") values.push(...NASTY_NUMBERS, "1", true);
    else if (typeof node === "string") values.push(...NASTY_STRINGS, 0, 2 ** 31);
    else if (typeof node === "boolean") values.push("true", 1, 0);
    for (const value of values) cases.push(apply(clone(base), at, { kind: "replace", value }));
  }
  if (cases.length <= limit) return cases;
  const step = cases.length / limit;
  return Array.from({ length: limit }, (_, i) => cases[Math.floor(i * step)]);
}
