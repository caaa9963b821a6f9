import type { FieldValues, Resolver } from 'react-hook-form';
import type { z } from 'zod';

/** A form check fetched when it is first needed; `preload` starts the fetch early (on focus, say). */
export interface LazyResolver<Input extends FieldValues, Output> {
  resolver: Resolver<Input, unknown, Output>;
  preload: () => void;
}

/**
 * A shared schema's form check (the same zod schema the server validates with, through the same
 * zodResolver) that is fetched with the first check rather than with the page. Zod and the schema
 * are a quarter of the sign-in page's code and nothing on it needs them before someone types
 * (a fast first load on a slow phone).
 *
 * When the check cannot be fetched (the connection dropped after the page loaded), the form is let
 * through unchecked: the server checks the same schema and its answer names the field and the problem
 * (lib/form-errors.ts), or the form's own failure notice says the connection is down.
 */
export function lazyZodResolver<S extends z.ZodType<unknown, FieldValues>>(
  loadSchema: () => Promise<S>,
): LazyResolver<z.input<S>, z.output<S>> {
  type Check = Resolver<z.input<S>, unknown, z.output<S>>;
  let loading: Promise<Check> | null = null;
  const load = (): Promise<Check> =>
    (loading ??= Promise.all([import('@hookform/resolvers/zod'), loadSchema()]).then(
      ([{ zodResolver }, schema]) => zodResolver(schema) as unknown as Check,
      (error: unknown) => {
        // A later check tries again.
        loading = null;
        throw error;
      },
    ));
  return {
    resolver: async (values, context, options) => {
      let check: Check;
      try {
        check = await load();
      } catch {
        return { values: values as z.output<S>, errors: {} };
      }
      return check(values, context, options);
    },
    preload: () => {
      load().catch(() => undefined);
    },
  };
}
