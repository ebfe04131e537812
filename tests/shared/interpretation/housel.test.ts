import { PolynomialRegression } from 'ml-regression-polynomial';
import { describe, expect, it } from 'vitest';
import { houselFit, houselFootingLoad } from '@shared/interpretation/housel';
import { expectRel } from './tolerance';

describe('Housel perimeter–area method', () => {
  it('two plates solve Q = A·m + P·n exactly, and the constants carry to a footing', () => {
    // Constructed from the published relation (Housel 1929) with m = 200 kPa, n = 15 kN/m [calc]:
    // 0.3 m square: Q = 0.09·200 + 1.2·15 = 36 kN ⇒ 400 kPa; 0.6 m square: Q = 0.36·200 + 2.4·15 = 108 kN ⇒ 300 kPa.
    // A 2 m square footing then carries Q = 4·200 + 8·15 = 920 kN, i.e. 230 kPa.
    const fit = houselFit([
      { plate: { shape: 'square', sizeMm: 300 }, pressureKpa: 400 },
      { plate: { shape: 'square', sizeMm: 600 }, pressureKpa: 300 },
    ]);
    expectRel(fit.mKpa, 200, 1e-12);
    expectRel(fit.nKnPerM, 15, 1e-12);
    const footing = houselFootingLoad(fit, { shape: 'square', widthM: 2 });
    expectRel(footing.loadKn, 920, 1e-12);
    expectRel(footing.pressureKpa, 230, 1e-12);
  });

  it('circular plates: P/A = 4/D', () => {
    // [calc] m = 200, n = 15: Ø300 q = 200 + 15·13.333 = 400 kPa; Ø750 q = 200 + 15·5.333 = 280 kPa.
    const fit = houselFit([
      { plate: { shape: 'circular', sizeMm: 300 }, pressureKpa: 400 },
      { plate: { shape: 'circular', sizeMm: 750 }, pressureKpa: 280 },
    ]);
    expectRel(fit.mKpa, 200, 1e-12);
    expectRel(fit.nKnPerM, 15, 1e-12);
    // Rectangle 1.5 × 3 m [calc]: Q = 4.5·200 + 9·15 = 1035 kN.
    expectRel(houselFootingLoad(fit, { shape: 'rectangular', widthM: 1.5, lengthM: 3 }).loadKn, 1035, 1e-12);
  });

  it('three plates: least squares on q = m + n·(P/A), as ml-regression-polynomial (independent library) fits it', () => {
    const plates = [
      { plate: { shape: 'square', sizeMm: 300 }, pressureKpa: 405 },
      { plate: { shape: 'square', sizeMm: 450 }, pressureKpa: 330 },
      { plate: { shape: 'square', sizeMm: 600 }, pressureKpa: 298 },
    ] as const;
    const fit = houselFit(plates);
    const [m, n] = new PolynomialRegression([4 / 0.3, 4 / 0.45, 4 / 0.6], [405, 330, 298], 1).coefficients;
    expectRel(fit.mKpa, m, 1e-9);
    expectRel(fit.nKnPerM, n, 1e-9);
    expect(fit.plates).toBe(3);
    expect(fit.r2).toBeLessThan(1);
  });

  it('rejects one plate, two plates of the same size and bad pressures, naming the field', () => {
    const p300 = { plate: { shape: 'square', sizeMm: 300 }, pressureKpa: 400 } as const;
    expect(() => houselFit([p300])).toThrow(/plates: needs at least two plate sizes/);
    expect(() => houselFit([p300, { ...p300, pressureKpa: 390 }])).toThrow(/plates: needs at least 2 points with different x/);
    expect(() => houselFit([p300, { plate: { shape: 'square', sizeMm: 600 }, pressureKpa: 0 }])).toThrow(/plates\[1\]\.pressureKpa/);
    expect(() => houselFootingLoad({ mKpa: 200, nKnPerM: 15 }, { shape: 'rectangular', widthM: 2, lengthM: 0 })).toThrow(/footing\.lengthM/);
  });
});
