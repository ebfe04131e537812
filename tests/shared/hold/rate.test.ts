import fc from 'fast-check';
import { linearRegression, linearRegressionLine } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { trailingRate } from '@shared/hold/rate';
import { seededRandom, upTo } from './synthetic';

// reference §C13 [calc]: mean settlement read on the IS 1888 schedule (schedule seen-2nd).
const IS_TIMES = [0, 1, 2.25, 4, 6.25, 9, 16, 25, 60];
const IS_SETTLEMENT = [3.1, 3.62, 3.8, 3.93, 4.03, 4.11, 4.23, 4.31, 4.45];
const IS_SERIES = IS_TIMES.map((tMin, i) => ({ tMin, settlementMm: IS_SETTLEMENT[i] }));

describe('trailingRate', () => {
  it('reproduces the C13 interval rates when the window equals the interval (reference §C13, calc)', () => {
    // reference §C13 [calc]: 0.5200, 0.1440, 0.07429, 0.04444, 0.02909, 0.01714 (9→16 min), 0.00889, 0.00400 mm/min
    const expected = [0.52, 0.144, 0.07429, 0.04444, 0.02909, 0.01714, 0.00889, 0.004];
    const rates = IS_TIMES.slice(1).map((t, i) => trailingRate(upTo(IS_SERIES, t), { windowMin: t - IS_TIMES[i] }).slopeMmPerMin);
    for (const [i, r] of rates.entries()) expect(r).toBeCloseTo(expected[i], 5);
  });

  it('fits a sparse manual series over the whole window, reaching back one reading (checked with simple-statistics)', () => {
    const rate = trailingRate(IS_SERIES, { windowMin: 10, untilMin: 16 });
    // Window [6, 16] holds 6.25, 9 and 16; 4 min is taken in so that the fit spans the window.
    expect(rate).toMatchObject({ points: 4, fromMin: 4, toMin: 16, coveredMin: 12 });
    // Independent check: simple-statistics' least-squares line through the same four readings.
    const { m } = linearRegression([4, 6.25, 9, 16].map((t, i) => [t, [3.93, 4.03, 4.11, 4.23][i]]));
    expect(rate.slopeMmPerMin).toBeCloseTo(m, 12);
    expect(rate.slopeMmPerMin).toBeCloseTo(0.023752, 5); // by hand: Sxy/Sxx = 1.93375/81.4119 [calc]
  });

  it('matches simple-statistics and the textbook standard error on a noisy 1 Hz window', () => {
    const random = seededRandom(7);
    const series = Array.from({ length: 1200 }, (_, i) => ({ tMin: i / 60, settlementMm: 5 + 0.013 * (i / 60) + (random() - 0.5) * 0.02 }));
    const rate = trailingRate(series, { windowMin: 10 });
    const window = series.filter((p) => p.tMin >= series.at(-1)!.tMin - 10 - 1e-9).map((p) => [p.tMin, p.settlementMm]);
    const line = linearRegression(window);
    // Standard error of an OLS slope, √(SSE/(n − 2)/Sxx) (any statistics text).
    const f = linearRegressionLine(line);
    const meanT = window.reduce((a, [t]) => a + t, 0) / window.length;
    const sse = window.reduce((a, [t, s]) => a + (s - f(t)) ** 2, 0);
    const sxx = window.reduce((a, [t]) => a + (t - meanT) ** 2, 0);
    expect(rate.points).toBe(window.length);
    expect(rate.slopeMmPerMin).toBeCloseTo(line.m, 10);
    expect(rate.slopeMmPerMin === null ? null : rate.standardErrorMmPerMin).toBeCloseTo(Math.sqrt(sse / (window.length - 2) / sxx), 10);
  });

  it('returns null with a reason when the data cannot give a rate', () => {
    expect(trailingRate([], { windowMin: 10 })).toMatchObject({ slopeMmPerMin: null, reason: 'no readings yet' });
    const short = trailingRate(upTo(IS_SERIES, 6.25), { windowMin: 10 });
    expect(short.slopeMmPerMin).toBeNull();
    expect(short.slopeMmPerMin === null && short.reason).toMatch(/less than the 10-min window/);
    expect(
      trailingRate(
        [
          { tMin: 0, settlementMm: 1 },
          { tMin: 5, settlementMm: 2 },
        ],
        { windowMin: 5, minPoints: 3 },
      ).slopeMmPerMin,
    ).toBeNull();
  });

  it('gives no standard error from two readings', () => {
    const rate = trailingRate(upTo(IS_SERIES, 16), { windowMin: 7 });
    expect(rate).toMatchObject({ points: 2, standardErrorMmPerMin: null });
  });

  it('throws naming the field for a bad window', () => {
    expect(() => trailingRate(IS_SERIES, { windowMin: 0 })).toThrow(/windowMin/);
    expect(() => trailingRate(IS_SERIES, { windowMin: 5, untilMin: Number.NaN })).toThrow(/untilMin/);
  });

  it('property: the rate of a straight line is its slope, whatever the sampling', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -2, max: 2, noNaN: true }),
        fc.double({ min: -50, max: 50, noNaN: true }),
        fc.uniqueArray(fc.double({ min: 0, max: 600, noNaN: true }), { minLength: 2, maxLength: 60 }),
        fc.double({ min: 0.5, max: 100, noNaN: true }),
        (slope, intercept, times, windowMin) => {
          const sorted = [...times].sort((a, b) => a - b);
          const series = sorted.map((t) => ({ tMin: t, settlementMm: intercept + slope * t }));
          const rate = trailingRate(series, { windowMin });
          if (rate.slopeMmPerMin === null) return sorted.at(-1)! - sorted[0] < windowMin + 1e-6 || rate.points < 2;
          return Math.abs(rate.slopeMmPerMin - slope) <= 1e-6 * (1 + Math.abs(slope));
        },
      ),
    );
  });

  it('property: the fit spans the whole window and ends at the last reading', () => {
    fc.assert(
      fc.property(fc.uniqueArray(fc.integer({ min: 0, max: 3600 }), { minLength: 2, maxLength: 80 }), fc.integer({ min: 1, max: 600 }), (seconds, windowS) => {
        const series = [...seconds].sort((a, b) => a - b).map((s) => ({ tMin: s / 60, settlementMm: Math.sqrt(s) }));
        const rate = trailingRate(series, { windowMin: windowS / 60 });
        if (rate.slopeMmPerMin === null) return true;
        return rate.toMin === series.at(-1)!.tMin && rate.coveredMin >= windowS / 60 - 1e-6;
      }),
    );
  });
});
