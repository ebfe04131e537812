import fc from 'fast-check';
import { PolynomialRegression } from 'ml-regression-polynomial';
import { linearRegression } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { applyCalibration, type BranchState, inCalibratedRange, outsideCalibratedSpan, trackBranch } from '@shared/calibration/evaluate';
import { fitCurve, fitPolynomial } from '@shared/calibration/fit';
import { inverseCalibration, OutsideCalibratedRange } from '@shared/calibration/inverse';
import { type Calibration, calibrationSchema } from '@shared/calibration/schema';

/** A table curve from [x, y] pairs. */
const table = (...pairs: [number, number][]) => ({ kind: 'table' as const, points: pairs.map(([x, y]) => ({ x, y })) });

const jack = (curve: Calibration['curve'], extra: Partial<Calibration> = {}): Calibration =>
  calibrationSchema.parse({ inputUnit: 'MPa', outputUnit: 'kN', curve, ...extra });

describe('applyCalibration', () => {
  it('evaluates linear, polynomial and table curves', () => {
    expect(applyCalibration(jack({ kind: 'linear', c0: 0.35, c1: 4.92 }), 2)).toBeCloseTo(10.19, 12);
    expect(applyCalibration(jack({ kind: 'polynomial', coefficients: [1, -2, 0.5, 0.25] }), 2)).toBeCloseTo(1 - 4 + 2 + 2, 12);
    const tabled = jack(table([0, 0], [10, 48], [20, 97]));
    expect(applyCalibration(tabled, 15)).toBeCloseTo(72.5, 12);
    expect(applyCalibration(tabled, 10)).toBe(48);
    expect(applyCalibration(tabled, 25)).toBeCloseTo(121.5, 12); // end segment extended
    expect(inCalibratedRange(tabled, 25)).toBe(false);
    expect(inCalibratedRange(tabled, 20)).toBe(true);
  });

  it('reads the falling curve on falling pressure, the main curve otherwise', () => {
    const rising = table([0, 0], [40, 196]);
    const falling = table([0, 0], [40, 204]);
    const hysteretic = jack(rising, { fallingCurve: falling });
    expect(applyCalibration(hysteretic, 20, 'rising')).toBe(98);
    expect(applyCalibration(hysteretic, 20, 'falling')).toBe(102);
    expect(applyCalibration(jack(rising), 20, 'falling')).toBe(98);
  });
});

describe('trackBranch', () => {
  it('turns only when the pressure moves back from its extreme by more than the deadband', () => {
    const readings = [0, 5, 10, 9.95, 10.2, 10.1, 9.9, 9.95, 5, 5.05, 5.3];
    const branches: string[] = [];
    let state: BranchState | undefined;
    for (const p of readings) {
      state = trackBranch(state, p, 0.2);
      branches.push(state.branch[0]);
    }
    // rising to 10.2; 9.9 is 0.3 below the peak → falling; 9.95 is within 0.2 of the trough 9.9;
    // down to 5; 5.05 within deadband; 5.3 is 0.3 above the trough → rising.
    expect(branches.join('')).toBe('rrrrrrffffr');
  });

  it('with no deadband follows every change of direction', () => {
    const s1 = trackBranch(trackBranch(undefined, 10), 9.999);
    expect(s1).toEqual({ branch: 'falling', extreme: 9.999 });
    expect(trackBranch(s1, 9.999)).toEqual(s1);
    expect(trackBranch(s1, 10).branch).toBe('rising');
  });
});

describe('inverseCalibration: inverse ∘ forward = identity', () => {
  const x = fc.double({ min: 0, max: 70, noNaN: true });

  it('linear', () => {
    fc.assert(
      fc.property(fc.double({ min: -5, max: 5, noNaN: true }), fc.double({ min: 0.1, max: 100, noNaN: true }), fc.boolean(), x, (c0, c1, neg, p) => {
        const cal = jack({ kind: 'linear', c0, c1: neg ? -c1 : c1 });
        expect(inverseCalibration(cal)(applyCalibration(cal, p))).toBeCloseTo(p, 9);
      }),
    );
  });

  it('polynomial, monotonic over its range (bisection)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -5, max: 5, noNaN: true }),
        fc.double({ min: 0.5, max: 10, noNaN: true }),
        fc.double({ min: 0, max: 0.05, noNaN: true }),
        fc.double({ min: 0, max: 0.001, noNaN: true }),
        x,
        (c0, c1, c2, c3, p) => {
          const cal = jack({ kind: 'polynomial', coefficients: [c0, c1, c2, c3] }, { range: [0, 70] });
          const y = applyCalibration(cal, p);
          const back = inverseCalibration(cal)(y);
          expect(back).toBeCloseTo(p, 8);
          expect(applyCalibration(cal, back)).toBeCloseTo(y, 8);
        },
      ),
    );
  });

  it('table, rising or falling, inside its points', () => {
    const steps = fc.array(fc.double({ min: 0.5, max: 20, noNaN: true }), { minLength: 2, maxLength: 12 });
    fc.assert(
      fc.property(steps, steps, fc.boolean(), fc.double({ min: 0, max: 1, noNaN: true }), (dx, dy, falling, at) => {
        const n = Math.min(dx.length, dy.length);
        const cumulative = (steps: number[]) => steps.slice(0, n).map((_, i) => steps.slice(0, i + 1).reduce((a, b) => a + b));
        const ys = cumulative(dy);
        const points = cumulative(dx).map((x, i) => ({ x, y: falling ? -ys[i] : ys[i] }));
        const cal = jack({ kind: 'table', points });
        const p = points[0].x + at * (points[n - 1].x - points[0].x);
        expect(inverseCalibration(cal)(applyCalibration(cal, p))).toBeCloseTo(p, 8);
      }),
    );
  });

  it('refuses what it cannot invert, with a reason', () => {
    expect(() => inverseCalibration(jack({ kind: 'polynomial', coefficients: [0, 1, 1] }))).toThrow(/"range"/);
    expect(() => inverseCalibration(jack({ kind: 'polynomial', coefficients: [0, -1, 1] }, { range: [0, 2] }))).toThrow(/not monotonic/);
    const inverse = inverseCalibration(jack({ kind: 'polynomial', coefficients: [0, 1, 1] }, { range: [0, 10] }));
    expect(() => inverse(200)).toThrow(OutsideCalibratedRange);
    expect(inverse(110)).toBeCloseTo(10, 9);
    expect(inverseCalibration(jack({ kind: 'polynomial', coefficients: [1, 2] }))(5)).toBe(2);
  });
});

describe('fitPolynomial', () => {
  // An invented jack calibration certificate: gauge MPa → reference load cell kN, slight curvature.
  const certificate = [
    [0, 0.4],
    [5, 24.1],
    [10, 48.3],
    [15, 72.2],
    [20, 96.6],
    [25, 120.5],
    [30, 144.2],
    [35, 168.9],
    [40, 192.4],
    [45, 216.0],
    [50, 239.1],
  ].map(([x, y]) => ({ x, y }));

  it.each([1, 2, 3])('degree %i agrees with ml-regression-polynomial (independent library)', (degree) => {
    const ours = fitPolynomial(certificate, degree);
    const theirs = new PolynomialRegression(
      certificate.map((p) => p.x),
      certificate.map((p) => p.y),
      degree,
    );
    expect(ours.coefficients).toEqual(theirs.coefficients.map((c) => expect.closeTo(c, 9)));
    expect(ours.rSquared).toBeGreaterThan(0.9999);
    expect(ours.rSquared).toBeLessThanOrEqual(1);
  });

  it('degree 1 agrees with simple-statistics linear regression (independent library)', () => {
    const { m, b } = linearRegression(certificate.map((p) => [p.x, p.y]));
    expect(fitCurve(certificate, 1)).toEqual({ kind: 'linear', c0: expect.closeTo(b, 9), c1: expect.closeTo(m, 9) });
    const residuals = certificate.map((p) => Math.abs(p.y - (b + m * p.x)));
    expect(fitPolynomial(certificate, 1).maxResidual).toBeCloseTo(Math.max(...residuals), 9);
  });

  it('reference §C8 first-loading fit: a0 = 0.002010, a1 = 4.985552, a2 = −2.474271', () => {
    // reference §C8 [calc], DIN 18134 constructed data, s (mm) against σ0 (MN/m²); 0.1 % for fitted values.
    const sigma = [0, 0.08, 0.16, 0.24, 0.32, 0.4, 0.5];
    const s = [0, 0.39, 0.73, 1.06, 1.35, 1.59, 1.88];
    const { coefficients } = fitPolynomial(
      sigma.map((x, i) => ({ x, y: s[i] })),
      2,
    );
    expect(coefficients[0]).toBeCloseTo(0.00201, 5); // a0 is given to 6 decimals
    expect(Math.abs(coefficients[1] / 4.985552 - 1)).toBeLessThan(1e-3);
    expect(Math.abs(coefficients[2] / -2.474271 - 1)).toBeLessThan(1e-3);
  });

  it('reference §C8 exact parabola s = 0.2 + 4σ − 2σ² is recovered exactly', () => {
    // reference §C8 [calc].
    const points = [0, 0.1, 0.2, 0.3, 0.4, 0.5].map((x) => ({ x, y: 0.2 + 4 * x - 2 * x * x }));
    const fit = fitPolynomial(points, 2);
    expect(fit.coefficients).toEqual([0.2, 4, -2].map((c) => expect.closeTo(c, 10)));
    expect(fit.rSquared).toBeCloseTo(1, 12);
    expect(fitCurve(points, 2)).toMatchObject({ kind: 'polynomial' });
  });

  it('refuses too few distinct points or a bad degree, naming the field', () => {
    expect(() =>
      fitPolynomial(
        [
          { x: 1, y: 1 },
          { x: 1, y: 2 },
          { x: 2, y: 3 },
        ],
        2,
      ),
    ).toThrow(/"points"/);
    expect(() => fitPolynomial(certificate, 0)).toThrow(/"degree"/);
    expect(() =>
      fitPolynomial(
        [
          { x: 0, y: Number.NaN },
          { x: 1, y: 1 },
        ],
        1,
      ),
    ).toThrow(/"points"/);
  });
});

describe('calibrationSchema', () => {
  const base = { inputUnit: 'bar', outputUnit: 'kN' };

  it('accepts each curve kind and an optional falling curve and range', () => {
    for (const curve of [{ kind: 'linear', c0: 0.35, c1: 4.92 }, { kind: 'polynomial', coefficients: [0.1, 0.49, -0.0001] }, table([0, 0], [100, 49])]) {
      expect(calibrationSchema.safeParse({ ...base, curve, fallingCurve: curve, range: [0, 700] }).success).toBe(true);
    }
  });

  it.each([
    [
      {
        curve: table([0, 0], [10, 5], [10, 6]),
      },
      'curve.points.2.x',
    ],
    [
      {
        curve: table([0, 0], [10, 5], [20, 4]),
      },
      'curve.points.2.y',
    ],
    [{ curve: table([0, 0]) }, 'curve.points'],
    [{ curve: { kind: 'linear', c0: 1, c1: 0 } }, 'curve.c1'],
    [{ curve: { kind: 'spline' } }, 'curve.kind'],
    [{ curve: { kind: 'linear', c0: 1, c1: 2 }, range: [5, 1] }, 'range'],
    [{ curve: { kind: 'linear', c0: 1, c1: 2 }, inputUnit: 'psi' }, 'inputUnit'],
    [{ curve: { kind: 'linear', c0: 1, c1: Number.POSITIVE_INFINITY } }, 'curve.c1'],
  ])('%# rejects bad input naming %s', (patch, field) => {
    const result = calibrationSchema.safeParse({ ...base, ...patch });
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((i) => i.path.join('.'))).toContain(field);
  });
});

describe('inverseCalibration stays inside the calibrated range, whatever the curve', () => {
  // A jack certified to 50 MPa (invented figures): 4.92 kN per MPa.
  const line = jack({ kind: 'linear', c0: 0.35, c1: 4.92 }, { range: [0, 50] });

  it('a linear curve with a range: inside gives the reading, beyond throws with what it would need', () => {
    expect(inverseCalibration(line)(0.35 + 4.92 * 40)).toBeCloseTo(40, 9);
    expect(inverseCalibration(line)(0.35 + 4.92 * 50)).toBeCloseTo(50, 9);
    const beyond = (() => {
      try {
        inverseCalibration(line)(0.35 + 4.92 * 63.5);
      } catch (err) {
        return err;
      }
    })();
    expect(beyond).toBeInstanceOf(OutsideCalibratedRange);
    expect((beyond as OutsideCalibratedRange).needed).toBeCloseTo(63.5, 9);
    expect((beyond as OutsideCalibratedRange).range).toEqual([0, 50]);
  });

  it('a table is not extended beyond its points, rising or falling, on either end', () => {
    for (const points of [
      [{ x: 0, y: 0 }, { x: 10, y: 50 }, { x: 20, y: 96 }],
      [{ x: 0, y: 96 }, { x: 10, y: 50 }, { x: 20, y: 0 }],
    ]) {
      const inverse = inverseCalibration(jack({ kind: 'table', points }));
      expect(inverse(50)).toBeCloseTo(10, 9);
      expect(() => inverse(120)).toThrow(OutsideCalibratedRange);
      expect(() => inverse(-5)).toThrow(OutsideCalibratedRange);
    }
  });

  it('a linear curve without a range is not bounded (an ideal ram has no certificate)', () => {
    expect(inverseCalibration(jack({ kind: 'linear', c0: 0, c1: 5 }))(500)).toBe(100);
  });
});

describe('outsideCalibratedSpan', () => {
  const line = jack({ kind: 'linear', c0: 0, c1: 5 }, { range: [0, 50] });
  it('names the side and the end passed, with 1 % of the span as slack by default', () => {
    expect(outsideCalibratedSpan(line, 25)).toBeNull();
    expect(outsideCalibratedSpan(line, 50.4)).toBeNull();
    expect(outsideCalibratedSpan(line, 50.6)).toEqual({ side: 'above', limit: 50, range: [0, 50] });
    expect(outsideCalibratedSpan(line, -0.6)).toEqual({ side: 'below', limit: 0, range: [0, 50] });
    expect(outsideCalibratedSpan(line, 50.1, 0)).toMatchObject({ side: 'above' });
  });
  it('has nothing to say of a calibration without a span', () => {
    expect(outsideCalibratedSpan(jack({ kind: 'linear', c0: 0, c1: 5 }), 1e6)).toBeNull();
  });
});
