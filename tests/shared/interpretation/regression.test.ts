import { PolynomialRegression } from 'ml-regression-polynomial';
import { describe, expect, it } from 'vitest';
import { InterpretationInputError } from '@shared/interpretation/input-checks';
import { fitLine, fitQuadratic, leastSquares } from '@shared/interpretation/regression';
import { expectRel } from './tolerance';

describe('fitLine', () => {
  it('reproduces a hand-worked least-squares line', () => {
    // Hand calculation [calc]: x = 1..5, y = 2,4,5,4,5; x̄ = 3, ȳ = 4, Sxy = 6, Sxx = 10 ⇒ slope 0.6,
    // intercept 4 − 0.6·3 = 2.2; residuals −0.8, 0.6, 1, −0.6, −0.2 ⇒ SSE 2.4; SST 6 ⇒ R² = 1 − 2.4/6 = 0.6.
    const fit = fitLine([1, 2, 3, 4, 5], [2, 4, 5, 4, 5]);
    expectRel(fit.slope, 0.6, 1e-12);
    expectRel(fit.intercept, 2.2, 1e-12);
    expectRel(fit.sse, 2.4, 1e-12);
    expectRel(fit.r2, 0.6, 1e-12);
    expect(fit.n).toBe(5);
  });

  it('agrees with ml-regression-polynomial (independent library, degree 1)', () => {
    const xs = [50, 100, 150, 200, 250, 300, 350];
    const ys = [0.41, 0.95, 1.38, 2.02, 2.44, 3.11, 3.49];
    const fit = fitLine(xs, ys);
    const other = new PolynomialRegression(xs, ys, 1);
    expectRel(fit.intercept, other.coefficients[0], 1e-9);
    expectRel(fit.slope, other.coefficients[1], 1e-9);
  });

  it('gives R² = 1, not NaN, for constant data', () => {
    expect(fitLine([1, 2, 3], [4, 4, 4]).r2).toBe(1);
  });

  it('rejects too few distinct x, mismatched lengths and non-numbers, naming the field', () => {
    expect(() => fitLine([2, 2, 2], [1, 2, 3], 'pts')).toThrow(/pts: needs at least 2 points with different x/);
    expect(() => fitLine([1, 2], [1], 'pts')).toThrow(InterpretationInputError);
    expect(() => fitLine([1, Number.NaN], [1, 2], 'pts')).toThrow(/pts\[1\]\.x/);
  });
});

describe('fitQuadratic', () => {
  it('recovers an exact parabola', () => {
    // Constructed: y = 0.2 + 4x − 2x² sampled at x = 0 … 0.5 [calc].
    const xs = [0, 0.1, 0.2, 0.3, 0.4, 0.5];
    const fit = fitQuadratic(
      xs,
      xs.map((x) => 0.2 + 4 * x - 2 * x * x),
    );
    expectRel(fit.a0, 0.2, 1e-9);
    expectRel(fit.a1, 4, 1e-9);
    expectRel(fit.a2, -2, 1e-9);
    expectRel(fit.r2, 1, 1e-12);
  });

  it('agrees with ml-regression-polynomial (independent library, degree 2) on scattered data in kPa', () => {
    const xs = [0, 40, 95, 150, 210, 260, 330, 400, 480];
    const ys = [0.02, 0.61, 1.31, 1.98, 2.49, 3.05, 3.56, 4.21, 4.69];
    const fit = fitQuadratic(xs, ys);
    const [c0, c1, c2] = new PolynomialRegression(xs, ys, 2).coefficients;
    expectRel(fit.a0, c0, 1e-8);
    expectRel(fit.a1, c1, 1e-8);
    expectRel(fit.a2, c2, 1e-8);
  });

  it('needs three distinct x', () => {
    expect(() => fitQuadratic([1, 1, 2, 2], [1, 2, 3, 4], 'branch')).toThrow(/branch: needs at least 3 points with different x/);
  });
});

describe('leastSquares', () => {
  it('reports a rank-deficient system as an input error naming the field', () => {
    // Three gauges on one line cannot define a plane.
    expect(() => leastSquares([[1, 0, 0], [1, 1, 0], [1, 2, 0]], [1, 2, 3], 'gauges')).toThrow(/gauges: the points do not determine the fit/);
  });
});
