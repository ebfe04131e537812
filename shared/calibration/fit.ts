import { Matrix, QrDecomposition } from 'ml-matrix';
import { evaluatePolynomial } from './evaluate';
import type { CalibrationCurve } from './schema';

export interface PolynomialFit {
  /** Coefficients from the constant term up: y = Σ c[k]·x^k. */
  coefficients: number[];
  /** Coefficient of determination of the fit. */
  rSquared: number;
  /** Largest |measured − fitted| over the points, output unit. */
  maxResidual: number;
}

/**
 * Least-squares polynomial through calibration points, solved by QR decomposition of the
 * Vandermonde matrix (x scaled to |x| ≤ 1 first, which keeps it well conditioned).
 */
export function fitPolynomial(points: readonly { x: number; y: number }[], degree: number): PolynomialFit {
  if (!Number.isInteger(degree) || degree < 1 || degree > 10) throw new RangeError('"degree" must be an integer 1–10');
  const distinctX = new Set(points.map((p) => p.x)).size;
  if (distinctX <= degree) throw new RangeError(`"points": a degree-${degree} fit needs at least ${degree + 1} distinct x values, got ${distinctX}`);
  if (points.some((p) => !Number.isFinite(p.x) || !Number.isFinite(p.y))) throw new RangeError('"points" must be finite numbers');

  const scale = Math.max(...points.map((p) => Math.abs(p.x)));
  const vandermonde = new Matrix(points.map((p) => Array.from({ length: degree + 1 }, (_, k) => (p.x / scale) ** k)));
  const solution = new QrDecomposition(vandermonde).solve(Matrix.columnVector(points.map((p) => p.y)));
  const coefficients = solution.to1DArray().map((a, k) => a / scale ** k);

  const mean = points.reduce((sum, p) => sum + p.y, 0) / points.length;
  let ssRes = 0;
  let ssTot = 0;
  let maxResidual = 0;
  for (const p of points) {
    const residual = p.y - evaluatePolynomial(coefficients, p.x);
    ssRes += residual * residual;
    ssTot += (p.y - mean) ** 2;
    maxResidual = Math.max(maxResidual, Math.abs(residual));
  }
  return { coefficients, rSquared: ssTot === 0 ? 1 : 1 - ssRes / ssTot, maxResidual };
}

/** A fitted curve ready for a calibration: 'linear' for degree 1, 'polynomial' above. */
export function fitCurve(points: readonly { x: number; y: number }[], degree: number): CalibrationCurve {
  const { coefficients } = fitPolynomial(points, degree);
  return degree === 1 ? { kind: 'linear', c0: coefficients[0], c1: coefficients[1] } : { kind: 'polynomial', coefficients };
}
