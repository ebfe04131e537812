import type { ZodType } from 'zod';
import { fromZod } from './errors';

/**
 * The whole resource after a PATCH: the stored input with the fields sent laid over it, checked against
 * the full schema (its rules across fields too). A field not sent keeps its stored value. 400 naming the
 * field when the result is not valid.
 */
export function patched<T>(schema: ZodType<T>, stored: object, patch: object): T {
  const result = schema.safeParse({ ...stored, ...patch });
  if (!result.success) throw fromZod(result.error, 'body');
  return result.data;
}
