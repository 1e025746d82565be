import type { z } from 'zod';
import { fromZod } from '../http/errors';

/** Parses a JSON body (an absent body counts as `{}`) or throws a 400 naming the first bad field. */
export function parseBody<S extends z.ZodType>(schema: S, body: unknown): z.output<S> {
  const result = schema.safeParse(body ?? {});
  if (!result.success) throw fromZod(result.error);
  return result.data;
}
