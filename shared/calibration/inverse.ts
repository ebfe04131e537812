import { type Branch, branchCurve, evaluatePolynomial, interpolate } from './evaluate';
import type { Calibration } from './schema';

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
    if (!(y >= yMin && y <= yMax)) throw new RangeError(`${y} lies outside the calibrated output ${yMin}…${yMax}`);
    return bisect(f, y, lo, hi);
  };
}

/**
 * The inverse of a calibration branch: engineering value → instrument reading (e.g. the gauge
 * pressure that gives a target jack force). Linear curves invert analytically, tables by swapping
 * their axes (extending the end segments like the forward direction), polynomials by bisection
 * within `range`, outside which they throw rather than guess.
 */
export function inverseCalibration(calibration: Calibration, branch: Branch = 'rising'): (y: number) => number {
  const curve = branchCurve(calibration, branch);
  switch (curve.kind) {
    case 'linear':
      return (y) => (y - curve.c0) / curve.c1;
    case 'table': {
      const swapped = curve.points.map(({ x, y }) => ({ x: y, y: x }));
      if (swapped[0].x > swapped[swapped.length - 1].x) swapped.reverse();
      return (y) => interpolate(swapped, y);
    }
    case 'polynomial':
      if (curve.coefficients.length === 2 && curve.coefficients[1] !== 0) {
        const [c0, c1] = curve.coefficients;
        return (y) => (y - c0) / c1;
      }
      return polynomialInverse(curve.coefficients, calibration.range);
  }
}
