import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import type * as z4 from 'zod/v4/core';
import { isApiError } from './api-client';

/**
 * The nearest field a form shows for a server's dotted error path, walking up the path:
 * `loading.pressuresKpa.2` lands on `loading.pressuresKpa` when only the list is an input.
 */
export function nearestField(path: string, fields: readonly string[]): string | null {
  const parts = path.split('.');
  for (let n = parts.length; n > 0; n--) {
    const candidate = parts.slice(0, n).join('.');
    if (fields.includes(candidate)) return candidate;
  }
  return null;
}

/** Puts a failed save's message next to the field the server named, or above the form. */
export function showServerError<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, fields: readonly string[]): void {
  const message = error instanceof Error ? error.message : 'The request failed.';
  const field = isApiError(error) && error.field ? nearestField(error.field, fields) : null;
  // Beside its field a message need not name the field again ("code: already in use").
  if (field) setError(field as Path<T>, { type: 'server', message: message.replace(/^[\w.]+: /, '') }, { shouldFocus: true });
  else if (isApiError(error) && error.field) setError('root.server', { type: 'server', message: `${message} (${error.field})` });
  else setError('root.server', { type: 'server', message });
}

const COUNTED: Record<string, string> = { string: 'character', array: 'value' };

/** "100", "8 characters", "1 value". */
function limit(value: number | bigint, origin: string): string {
  const noun = COUNTED[origin];
  return noun ? `${value} ${noun}${value === 1 ? '' : 's'}` : String(value);
}

/**
 * Zod messages written for people at a form: an empty number box reads "required" rather than
 * "expected number, received NaN", and limits read "at least 100". Messages a schema sets itself win.
 */
export function readableIssue(issue: z4.$ZodRawIssue): string | undefined {
  switch (issue.code) {
    case 'invalid_type':
      return issue.input == null || issue.input === '' || Number.isNaN(issue.input) ? 'required' : `expected a ${issue.expected}`;
    case 'too_small':
      return `${issue.inclusive === false ? 'more than' : 'at least'} ${limit(issue.minimum, issue.origin)}`;
    case 'too_big':
      return `${issue.inclusive === false ? 'less than' : 'at most'} ${limit(issue.maximum, issue.origin)}`;
    case 'invalid_value':
      return 'choose one of the options';
    default:
      return undefined;
  }
}

/** Parse options for `zodResolver(schema, readableErrors)`. */
export const readableErrors = { error: readableIssue };

/**
 * Wraps a form's save so that a rejected request lands on the form: `handleSubmit(withServerErrors(
 * setError, FIELDS, async (input) => …))`.
 */
export function withServerErrors<T extends FieldValues, Input>(
  setError: UseFormSetError<T>,
  fields: readonly string[],
  save: (input: Input) => Promise<unknown>,
) {
  return async (input: Input): Promise<void> => {
    try {
      await save(input);
    } catch (error) {
      showServerError(error, setError, fields);
    }
  };
}
