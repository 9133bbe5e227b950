/**
 * Request validation with zod: a failed parse becomes a 400 whose details name each field.
 */
import type { z } from 'zod';
import { badRequest } from './errors.js';

/** Parses `input` with `schema` or throws a 400 listing every problem with its field path. */
export function parseRequest<S extends z.ZodType>(schema: S, input: unknown, what = 'request'): z.infer<S> {
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const details = result.error.issues.map((issue) => ({
    field: issue.path.join('.') || '(body)',
    message: issue.message,
  }));
  const first = details[0];
  throw badRequest(`The ${what} is not valid: ${first.field}: ${first.message}`, details);
}
