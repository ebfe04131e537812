import { Matrix, solve } from 'ml-matrix';
import { linearRegression, rSquared } from 'simple-statistics';
import { InterpretationInputError, requireFinite } from './input-checks';

/** Straight line y = intercept + slope·x fitted by least squares. */
export interface LineFit {
  slope: number;
  intercept: number;
  /** Coefficient of determination (1 when the data are reproduced exactly, also for constant y). */
  r2: number;
  /** Sum of squared residuals, in units of y². */
  sse: number;
  n: number;
}

/** Parabola y = a0 + a1·x + a2·x² fitted by least squares. */
export interface QuadraticFit {
  a0: number;
  a1: number;
  a2: number;
  r2: number;
  sse: number;
  n: number;
}

function checkPairs(xs: readonly number[], ys: readonly number[], minDistinctX: number, field: string): void {
  if (xs.length !== ys.length) throw new InterpretationInputError(field, `has ${xs.length} x values but ${ys.length} y values`);
  for (const [i, x] of xs.entries()) requireFinite(x, `${field}[${i}].x`);
  for (const [i, y] of ys.entries()) requireFinite(y, `${field}[${i}].y`);
  const distinct = new Set(xs).size;
  if (distinct < minDistinctX) throw new InterpretationInputError(field, `needs at least ${minDistinctX} points with different x (got ${distinct})`);
}

/** Sum of squared residuals of `f` over the data. */
export function sumOfSquaredResiduals(xs: readonly number[], ys: readonly number[], f: (x: number) => number): number {
  return xs.reduce((sum, x, i) => sum + (ys[i] - f(x)) ** 2, 0);
}

/**
 * Coefficient of determination R² = 1 − SSE/SST (simple-statistics `rSquared`). When y is constant
 * SST = 0 and R² is undefined; 1 is returned because the data carry no spread to explain.
 */
export function coefficientOfDetermination(xs: readonly number[], ys: readonly number[], f: (x: number) => number): number {
  const mean = ys.reduce((a, b) => a + b, 0) / ys.length;
  if (ys.every((y) => Math.abs(y - mean) <= 1e-15 * Math.max(1, Math.abs(mean)))) return 1;
  return rSquared(
    xs.map((x, i) => [x, ys[i]]),
    f,
  );
}

/**
 * Ordinary least-squares straight line (simple-statistics `linearRegression`, `rSquared`).
 * Needs two or more points with different x; throws naming `field` otherwise.
 */
export function fitLine(xs: readonly number[], ys: readonly number[], field = 'points'): LineFit {
  checkPairs(xs, ys, 2, field);
  const { m: slope, b: intercept } = linearRegression(xs.map((x, i) => [x, ys[i]]));
  const f = (x: number) => intercept + slope * x;
  return { slope, intercept, r2: coefficientOfDetermination(xs, ys, f), sse: sumOfSquaredResiduals(xs, ys, f), n: xs.length };
}

/**
 * Linear least squares: the coefficients c minimising |A·c − y|² (ml-matrix `solve`: LU when A is
 * square, QR otherwise). Throws naming `field` when the system is rank deficient.
 */
export function leastSquares(design: readonly (readonly number[])[], y: readonly number[], field = 'points'): number[] {
  try {
    const c = solve(new Matrix(design.map((row) => [...row])), Matrix.columnVector([...y])).to1DArray();
    if (c.every(Number.isFinite)) return c;
  } catch {
    // ml-matrix throws a generic message for singular systems; rethrown below with the field named.
  }
  throw new InterpretationInputError(field, 'the points do not determine the fit (rank deficient: too few distinct or collinear positions)');
}

/**
 * Least-squares parabola y = a0 + a1·x + a2·x² (QR solution of the Vandermonde system with ml-matrix).
 * Needs three or more points with different x; throws naming `field` otherwise.
 */
export function fitQuadratic(xs: readonly number[], ys: readonly number[], field = 'points'): QuadraticFit {
  checkPairs(xs, ys, 3, field);
  const [a0, a1, a2] = leastSquares(
    xs.map((x) => [1, x, x * x]),
    ys,
    field,
  );
  const f = (x: number) => a0 + a1 * x + a2 * x * x;
  return { a0, a1, a2, r2: coefficientOfDetermination(xs, ys, f), sse: sumOfSquaredResiduals(xs, ys, f), n: xs.length };
}
