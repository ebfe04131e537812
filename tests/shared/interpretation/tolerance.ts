import { expect } from 'vitest';

/** Reference §C tolerances: 1e-3 relative for closed forms, 0.1 % for fitted values. */
export const CLOSED_FORM = 1e-3;
export const FITTED = 1e-3;

/** Asserts |actual − expected| ≤ rel·|expected| (and that actual is a finite number). */
export function expectRel(actual: number | null | undefined, expected: number, rel = CLOSED_FORM): void {
  expect(actual, 'expected a number').toBeTypeOf('number');
  expect(Number.isFinite(actual as number), `expected a finite number, got ${actual}`).toBe(true);
  expect(Math.abs((actual as number) - expected), `${actual} vs ${expected}`).toBeLessThanOrEqual(rel * Math.abs(expected));
}

/** Asserts that no number anywhere inside `value` is NaN or infinite. */
export function expectNoNonFinite(value: unknown, path = 'value'): void {
  if (typeof value === 'number') expect(Number.isFinite(value), `${path} is ${value}`).toBe(true);
  else if (Array.isArray(value)) for (const [i, v] of value.entries()) expectNoNonFinite(v, `${path}[${i}]`);
  else if (value !== null && typeof value === 'object') for (const [k, v] of Object.entries(value)) expectNoNonFinite(v, `${path}.${k}`);
}

/** Builds curve points from parallel arrays. */
export function curve(pressuresKpa: readonly number[], settlementsMm: readonly number[]) {
  return pressuresKpa.map((pressureKpa, i) => ({ pressureKpa, settlementMm: settlementsMm[i] }));
}
