/**
 * Reading untrusted input: a zod parse that never throws and refuses what PostgreSQL cannot
 * store. Every server action and route handler reads its input through `parseInput`.
 */
import { z } from "zod";

/** Values past this many nested levels or nodes are refused before a schema walks them. */
export const MAX_INPUT_DEPTH = 64;
export const MAX_INPUT_NODES = 200_000;

export const NUL_MESSAGE = "Text cannot contain the NUL character (U+0000).";
export const BROKEN_TEXT_MESSAGE = "Text contains a broken character (half of a surrogate pair).";
export const UNREADABLE_MESSAGE = "That could not be read.";

type Finding = { path: PropertyKey[]; message: string } | null;

/**
 * The first thing in a value that no schema should have to see: a NUL character or a lone
 * surrogate in a string or a key (PostgreSQL text and json refuse them), nesting deeper than MAX_INPUT_DEPTH, or more than
 * MAX_INPUT_NODES values. Walks without recursion, so hostile depth cannot exhaust the stack.
 */
export function inputProblem(value: unknown): Finding {
  const stack: Array<{ value: unknown; path: PropertyKey[] }> = [{ value, path: [] }];
  let nodes = 0;
  while (stack.length > 0) {
    const { value: at, path } = stack.pop()!;
    nodes += 1;
    if (nodes > MAX_INPUT_NODES) return { path: [], message: UNREADABLE_MESSAGE };
    if (typeof at === "string") {
      if (at.includes("\u0000")) return { path, message: NUL_MESSAGE };
      // PostgreSQL's json refuses a lone surrogate; it is no character anyone typed.
      if (!at.isWellFormed()) return { path, message: BROKEN_TEXT_MESSAGE };
      continue;
    }
    if (!at || typeof at !== "object") continue;
    if (path.length >= MAX_INPUT_DEPTH) return { path: [], message: UNREADABLE_MESSAGE };
    if (at instanceof Date || at instanceof Blob) continue;
    const entries: Array<[PropertyKey, unknown]> =
      at instanceof Map
        ? [...at.entries()].flatMap(([k, v], i) => [
            [i, k] as [PropertyKey, unknown],
            [i, v] as [PropertyKey, unknown],
          ])
        : at instanceof Set
          ? [...at].map((v, i) => [i, v] as [PropertyKey, unknown])
          : at instanceof FormData
            ? [...at.entries()].map(([k, v]) => [k, v] as [PropertyKey, unknown])
            : Array.isArray(at)
              ? at.map((v, i) => [i, v] as [PropertyKey, unknown])
              : Object.entries(at);
    for (const [key, child] of entries) {
      if (typeof key === "string" && (key.includes("\u0000") || !key.isWellFormed()))
        return { path, message: key.includes("\u0000") ? NUL_MESSAGE : BROKEN_TEXT_MESSAGE };
      stack.push({ value: child, path: [...path, key] });
    }
  }
  return null;
}

function failure<T>(path: PropertyKey[], message: string): z.ZodSafeParseResult<T> {
  return {
    success: false,
    error: new z.ZodError([{ code: "custom", path, message, input: undefined }]) as z.ZodError<T>,
  };
}

/**
 * `schema.safeParse(input)`, except that it refuses what `inputProblem` finds (with an issue at
 * that path, so field errors land on the field) and turns a schema that throws on a hostile value
 * (an object whose `toString` is not a function, say) into an ordinary refusal.
 */
export function parseInput<S extends z.ZodType>(
  schema: S,
  input: unknown,
): z.ZodSafeParseResult<z.output<S>> {
  const problem = inputProblem(input);
  if (problem) return failure(problem.path, problem.message);
  try {
    return schema.safeParse(input) as z.ZodSafeParseResult<z.output<S>>;
  } catch {
    return failure([], UNREADABLE_MESSAGE);
  }
}

/** The request's JSON body, or undefined when it is not JSON; never throws. */
export async function readJson(request: Request): Promise<unknown> {
  try {
    return (await request.json()) as unknown;
  } catch {
    return undefined;
  }
}
