import { type Branch, branchCurve, calibratedRange, evaluatePolynomial, interpolate } from './evaluate';
import type { Calibration } from './schema';

/**
 * An engineering value the calibration cannot turn back into a reading without leaving its calibrated
 * span. `needed` is the reading the curve would give if extended (null where it cannot say, e.g. a
 * polynomial beyond its range); `range` is the calibrated input span.
 */
export class OutsideCalibratedRange extends RangeError {
  constructor(
    readonly value: number,
    readonly needed: number | null,
    readonly range: readonly [number, number],
  ) {
    super(`${value} lies outside the calibrated range (input ${range[0]}…${range[1]})${needed === null ? '' : `: it would need ${needed}`}`);
    this.name = 'OutsideCalibratedRange';
  }
}

const MONOTONIC_SAMPLES = 256;

/** Root of a monotonic function on [lo, hi] by bisection, to the last representable digit. */
function bisect(f: (x: number) => number, target: number, lo: number, hi: number): number {
  const rising = f(hi) > f(lo);
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (mid === lo || mid === hi) break;
    if (f(mid) < target === rising) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

function polynomialInverse(coefficients: readonly number[], range: [number, number] | undefined): (y: number) => number {
  if (!range) throw new TypeError('"range" is required to invert a polynomial calibration');
  const [lo, hi] = range;
  const f = (x: number) => evaluatePolynomial(coefficients, x);
  const samples = Array.from({ length: MONOTONIC_SAMPLES + 1 }, (_, i) => f(lo + ((hi - lo) * i) / MONOTONIC_SAMPLES));
  const rising = samples[MONOTONIC_SAMPLES] > samples[0];
  if (samples.some((y, i) => i > 0 && y > samples[i - 1] !== rising)) {
    throw new RangeError('the polynomial calibration is not monotonic over its "range", so it has no single inverse');
  }
  const [yMin, yMax] = rising ? [samples[0], samples[MONOTONIC_SAMPLES]] : [samples[MONOTONIC_SAMPLES], samples[0]];
  return (y) => {
    if (!(y >= yMin && y <= yMax)) throw new OutsideCalibratedRange(y, null, range);
    return bisect(f, y, lo, hi);
  };
}

/** The inverse that refuses to leave the calibrated input span (with a hair of slack for rounding). */
function withinRange(calibration: Calibration, inverse: (y: number) => number): (y: number) => number {
  const range = calibratedRange(calibration);
  const [lo, hi] = range;
  const slack = Number.isFinite(hi - lo) ? (hi - lo) * 1e-9 : 0;
  return (y) => {
    const x = inverse(y);
    if (!(x >= lo - slack && x <= hi + slack)) throw new OutsideCalibratedRange(y, Number.isFinite(x) ? x : null, range);
    return x;
  };
}

/**
 * The inverse of a calibration branch: engineering value → instrument reading (e.g. the gauge
 * pressure that gives a target jack force). Linear curves invert analytically, tables by swapping
 * their axes, polynomials by bisection within `range`. Every kind throws {@link OutsideCalibratedRange}
 * for a value whose reading would lie outside the calibrated span (`range`, else a table's points):
 * the certificate says nothing there, so the curve is not extended.
 */
export function inverseCalibration(calibration: Calibration, branch: Branch = 'rising'): (y: number) => number {
  const curve = branchCurve(calibration, branch);
  switch (curve.kind) {
    case 'linear':
      return withinRange(calibration, (y) => (y - curve.c0) / curve.c1);
    case 'table': {
      const swapped = curve.points.map(({ x, y }) => ({ x: y, y: x }));
      if (swapped[0].x > swapped[swapped.length - 1].x) swapped.reverse();
      return withinRange(calibration, (y) => interpolate(swapped, y));
    }
    case 'polynomial':
      if (curve.coefficients.length === 2 && curve.coefficients[1] !== 0) {
        const [c0, c1] = curve.coefficients;
        return withinRange(calibration, (y) => (y - c0) / c1);
      }
      return polynomialInverse(curve.coefficients, calibration.range);
  }
}
