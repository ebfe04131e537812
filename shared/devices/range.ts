/*
 * Readings against the range the instrument register gives (rangeMin–rangeMax in the instrument's
 * unit). A value far outside it is a wrong profile (word order, scale) or a broken instrument, never a
 * reading to pass on as good.
 */

export interface InstrumentRange {
  min: number | null;
  max: number | null;
  /** Unit of min and max, as the register states it. */
  unit: string;
}

/** Factors to a base unit per family; units of different families cannot be compared. */
const UNIT_FACTORS: Record<string, { family: string; factor: number }> = {
  mm: { family: 'length', factor: 1 },
  um: { family: 'length', factor: 0.001 },
  in: { family: 'length', factor: 25.4 },
  kpa: { family: 'pressure', factor: 1 },
  mpa: { family: 'pressure', factor: 1000 },
  bar: { family: 'pressure', factor: 100 },
  kn: { family: 'force', factor: 1 },
};

/** Flutter at the ends of the range is not a fault: 1 % of the span either side (common practice). */
export const RANGE_SLACK = 0.01;

/** `value` (in `unit`) converted to `to`, or undefined when the units are not of one family. */
export function convertUnit(value: number, unit: string, to: string): number | undefined {
  const a = UNIT_FACTORS[unit.trim().toLowerCase()];
  const b = UNIT_FACTORS[to.trim().toLowerCase()];
  if (!a || !b || a.family !== b.family) return undefined;
  return (value * a.factor) / b.factor;
}

/**
 * Why `value` (in `unit`) lies outside the instrument's range, or null when it lies within it (or when
 * the register gives no range, or one in a unit the value cannot be compared with).
 */
export function outsideInstrumentRange(value: number, unit: string, range: InstrumentRange): string | null {
  if (range.min == null && range.max == null) return null;
  const v = convertUnit(value, unit, range.unit);
  if (v === undefined) return null;
  const span = range.min != null && range.max != null ? range.max - range.min : Math.abs(range.max ?? range.min ?? 0);
  const slack = span * RANGE_SLACK;
  const shown = `${Number(v.toPrecision(6))} ${range.unit}`;
  const limits = `${range.min ?? '−∞'} – ${range.max ?? '∞'} ${range.unit}`;
  if ((range.min != null && v < range.min - slack) || (range.max != null && v > range.max + slack)) return `${shown} is outside ${limits}`;
  return null;
}
