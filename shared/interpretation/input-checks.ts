/**
 * Input checks shared by the interpretation methods. Bad input throws an error that names the field;
 * a result that the data cannot support is returned as `null` with a reason instead (never NaN).
 */

/** Thrown for input an interpretation method cannot use; `field` names the offending input. */
export class InterpretationInputError extends Error {
  override readonly name = 'InterpretationInputError';

  constructor(
    readonly field: string,
    reason: string,
  ) {
    super(`${field}: ${reason}`);
  }
}

/** Returns `value` when it is a finite number, else throws naming `field`. */
export function requireFinite(value: number, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) throw new InterpretationInputError(field, `must be a finite number (got ${value})`);
  return value;
}

/** Returns `value` when it is finite and > 0, else throws naming `field`. */
export function requirePositive(value: number, field: string): number {
  if (requireFinite(value, field) <= 0) throw new InterpretationInputError(field, `must be greater than zero (got ${value})`);
  return value;
}

/** Returns `value` when it is finite and ≥ 0, else throws naming `field`. */
export function requireNonNegative(value: number, field: string): number {
  if (requireFinite(value, field) < 0) throw new InterpretationInputError(field, `must not be negative (got ${value})`);
  return value;
}

/** Returns `value` when it lies in [min, max], else throws naming `field`. */
export function requireInRange(value: number, min: number, max: number, field: string): number {
  if (requireFinite(value, field) < min || value > max) throw new InterpretationInputError(field, `must lie between ${min} and ${max} (got ${value})`);
  return value;
}
