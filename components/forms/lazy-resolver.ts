import type { FieldValues, Resolver } from "react-hook-form";

/**
 * A form resolver whose schema (and zod with it) loads on the first check, not with the page: a
 * form checks on submit, so the smallest pages leave the validator out of their first load.
 * The chunk loads once; a failed load is tried again on the next check.
 */
export function lazyResolver<T extends FieldValues>(load: () => Promise<Resolver<T>>): Resolver<T> {
  let loading: Promise<Resolver<T>> | undefined;
  return async (values, context, options) => {
    loading ??= load().catch((error: unknown) => {
      loading = undefined;
      throw error;
    });
    return (await loading)(values, context, options);
  };
}
