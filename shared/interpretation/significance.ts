import { fitLine } from './regression';

/** Whether two straight lines fit a set of points significantly better than one, after reading noise. */
export interface BreakSignificance {
  /** F = ((SSE₁ − SSE₂)/2) / (SSE₂′/(n − 4)), SSE₂′ = SSE₂ but not below the noise floor. */
  f: number;
  /** Probability of an F this large from one straight line plus noise (F(2, n − 4)), before the correction for the splits tried. */
  pValue: number;
  /** Significance level the p-value is held to: α divided by the number of splits tried (Bonferroni). */
  threshold: number;
  significant: boolean;
  /** Squared residuals expected from reading resolution alone, in the fit's units². */
  noiseFloor: number;
}

/** Overall significance level of a break, common statistical practice. */
export const BREAK_ALPHA = 0.05;

/**
 * Extra-sum-of-squares F test of two lines against one (common statistical practice): the points of
 * `first` and `second` fitted by one line (2 parameters) and by a line each (4 parameters). For two extra
 * parameters the F distribution has the closed tail P(F > f) = (1 + 2f/ν)^(−ν/2), ν = n − 4. The two-line
 * SSE is not allowed below `noiseFloor` (what rounding of the readings alone produces), so that a straight
 * line read to 0.01 mm shows no break; the level is divided by `splitsTried` because the split was searched.
 * Needs at least five points (ν ≥ 1); returns null with fewer.
 */
export function breakSignificance(
  first: { xs: readonly number[]; ys: readonly number[] },
  second: { xs: readonly number[]; ys: readonly number[] },
  noiseFloor: number,
  splitsTried = 1,
): BreakSignificance | null {
  const n = first.xs.length + second.xs.length;
  const nu = n - 4;
  if (nu < 1) return null;
  const one = fitLine([...first.xs, ...second.xs], [...first.ys, ...second.ys]);
  const two = fitLine(first.xs, first.ys).sse + fitLine(second.xs, second.ys).sse;
  const denominator = Math.max(two, noiseFloor, Number.MIN_VALUE) / nu;
  const f = Math.max(0, one.sse - two) / 2 / denominator;
  const pValue = (1 + (2 * f) / nu) ** (-nu / 2);
  const threshold = BREAK_ALPHA / Math.max(1, splitsTried);
  return { f, pValue, threshold, significant: pValue < threshold, noiseFloor };
}

/** Standard deviation of rounding a reading to `resolution`: resolution/√12 (uniform rounding error). */
export function roundingSd(resolution: number): number {
  return resolution / Math.sqrt(12);
}
