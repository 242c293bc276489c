/** Validate at the edge: parse a request part with a zod schema or fail with 400 in our shape. */
import type { z } from 'zod';

import { ApiError, zodDetails } from './errors';

export function parseInput<S extends z.ZodType>(
  schema: S,
  value: unknown,
  what = 'body',
): z.infer<S> {
  const result = schema.safeParse(value);
  if (!result.success) {
    throw new ApiError(
      400,
      'invalid_input',
      `The request ${what} is not valid.`,
      zodDetails(result.error),
    );
  }
  return result.data;
}
