import type { Calibration, CalibrationCurve } from './schema';

/** Which calibration branch applies: input rising (loading) or falling (unloading). */
export type Branch = 'rising' | 'falling';

/** Σ coefficients[k]·x^k by Horner's rule. */
export function evaluatePolynomial(coefficients: readonly number[], x: number): number {
  let y = 0;
  for (let k = coefficients.length - 1; k >= 0; k--) y = y * x + coefficients[k];
  return y;
}

/** Linear interpolation through points sorted by rising x; the end segments extend beyond them. */
export function interpolate(points: readonly { x: number; y: number }[], x: number): number {
  let lo = 0;
  let hi = points.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (points[mid].x <= x) lo = mid;
    else hi = mid;
  }
  const a = points[lo];
  const b = points[hi];
  return a.y + ((x - a.x) * (b.y - a.y)) / (b.x - a.x);
}

export function evaluateCurve(curve: CalibrationCurve, x: number): number {
  switch (curve.kind) {
    case 'linear':
      return curve.c0 + curve.c1 * x;
    case 'polynomial':
      return evaluatePolynomial(curve.coefficients, x);
    case 'table':
      return interpolate(curve.points, x);
  }
}

/** The curve serving this branch: the falling curve if there is one, else the main curve. */
export function branchCurve(calibration: Calibration, branch: Branch): CalibrationCurve {
  return branch === 'falling' && calibration.fallingCurve ? calibration.fallingCurve : calibration.curve;
}

/** Engineering value (output unit) of an instrument reading (input unit). */
export function applyCalibration(calibration: Calibration, x: number, branch: Branch = 'rising'): number {
  return evaluateCurve(branchCurve(calibration, branch), x);
}

/** Input span the calibration covers: its `range`, else the span of its table points, else unbounded. */
export function calibratedRange(calibration: Calibration): [number, number] {
  if (calibration.range) return calibration.range;
  const tables = [calibration.curve, calibration.fallingCurve].flatMap((c) => (c?.kind === 'table' ? [c.points] : []));
  if (tables.length === 0) return [-Infinity, Infinity];
  return [Math.max(...tables.map((p) => p[0].x)), Math.min(...tables.map((p) => p[p.length - 1].x))];
}

/** False when a reading lies outside the calibrated span (the value is then an extrapolation). */
export function inCalibratedRange(calibration: Calibration, x: number): boolean {
  const [lo, hi] = calibratedRange(calibration);
  return x >= lo && x <= hi;
}

/** Where a reading lies outside the calibrated span: the side and the end it passed. */
export interface OutsideSpan {
  side: 'below' | 'above';
  limit: number;
  range: [number, number];
}

/**
 * Whether a reading lies outside the calibrated span, allowing `marginFraction` of the span beyond
 * either end (an instrument at rest reads a little either side of its zero); null when inside, or when
 * the calibration has no finite span.
 */
export function outsideCalibratedSpan(calibration: Calibration, x: number, marginFraction = 0.01): OutsideSpan | null {
  const range = calibratedRange(calibration);
  const [lo, hi] = range;
  if (!Number.isFinite(hi - lo)) return null;
  const margin = marginFraction * (hi - lo);
  if (x < lo - margin) return { side: 'below', limit: lo, range };
  if (x > hi + margin) return { side: 'above', limit: hi, range };
  return null;
}

/** Branch state of one input: the current branch and the extreme reached on it. */
export interface BranchState {
  branch: Branch;
  /** Highest reading on the rising branch, lowest on the falling branch. */
  extreme: number;
}

/**
 * Follows the direction of pressure change. The branch turns when the reading moves back from the
 * extreme of the current branch by more than `deadband` (gauge flutter, pump pulses), so slow
 * drift and noise do not flip it.
 */
export function trackBranch(state: BranchState | undefined, reading: number, deadband = 0): BranchState {
  if (!state) return { branch: 'rising', extreme: reading };
  const { branch, extreme } = state;
  if (branch === 'rising') {
    if (reading >= extreme) return { branch, extreme: reading };
    return extreme - reading > deadband ? { branch: 'falling', extreme: reading } : state;
  }
  if (reading <= extreme) return { branch, extreme: reading };
  return reading - extreme > deadband ? { branch: 'rising', extreme: reading } : state;
}
