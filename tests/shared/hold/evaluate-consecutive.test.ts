import { describe, expect, it } from 'vitest';
import { evaluateHold } from '@shared/hold/evaluate';
import { intervalChanges } from '@shared/hold/rule-consecutive';
import type { HoldRule } from '@shared/schemas/plans';
import { ONE_HZ_MIN, sampleSeries, upTo } from './synthetic';

// ASTM D1196 / AASHTO T 222 family: at most 0.03 mm per minute for 3 consecutive minutes (from memory, reference §A.3).
const rule: HoldRule = { kind: 'consecutive', maxChangeMm: 0.03, intervalMin: 1, intervals: 3 };
const context = (nowMin: number) => ({ nowMin, stopLimitMm: 12.7 });

// reference §C13 [calc]: readings at t = 5…9 min.
const C13 = [5, 6, 7, 8, 9].map((tMin, i) => ({ tMin, settlementMm: [2.41, 2.45, 2.475, 2.498, 2.52][i] }));

describe('consecutive-interval rule', () => {
  it('is first satisfied at t = 9 min on the C13 readings (reference §C13, calc)', () => {
    const verdicts = C13.map((p) => evaluateHold(rule, upTo(C13, p.tMin), context(p.tMin)).verdict);
    expect(verdicts).toEqual(['settling', 'settling', 'settling', 'settling', 'satisfied']);
  });

  it('reports the 1-min increments 0.040, 0.025, 0.023, 0.022 mm (reference §C13, calc)', () => {
    const result = evaluateHold(rule, C13, context(9));
    const ev = result.evidence.kind === 'consecutive' ? result.evidence : null;
    expect(ev?.intervalsPassed).toBe(3);
    expect(ev?.recentIntervals.map((c) => c.changeMm)).toEqual([0.04, 0.025, 0.023, 0.022].map((d) => expect.closeTo(d, 9)));
    expect(ev?.recentIntervals.map((c) => c.withinLimit)).toEqual([false, true, true, true]);
  });

  it('counts a change of exactly the limit as within it (2.480 − 2.450 = 0.030 mm)', () => {
    const edge = [0, 1, 2, 3].map((tMin, i) => ({ tMin, settlementMm: [2.42, 2.45, 2.48, 2.51][i] }));
    expect(evaluateHold(rule, edge, context(3)).verdict).toBe('satisfied');
  });

  it('estimates the minutes left from the intervals still needed', () => {
    expect(evaluateHold(rule, upTo(C13, 8), context(8)).etaMin).toBe(1);
    expect(evaluateHold(rule, upTo(C13, 7), context(7.5)).etaMin).toBeCloseTo(1.5, 9);
  });

  it('snaps readings to interval boundaries by linear interpolation', () => {
    // Piecewise-linear settlement sampled off the boundaries: the interpolated boundary values are exact.
    const f = (t: number) => (t < 4.05 ? 1 + 0.1 * t : 1.405 + 0.02 * (t - 4.05)); // kink at a reading
    const offGrid = sampleSeries(f, 9.9, 0.3, 0.15);
    const changes = intervalChanges(offGrid, 1, 0.03);
    expect(changes[0]).toMatchObject({ fromMin: 1, toMin: 2 });
    for (const c of changes) expect(c.changeMm).toBeCloseTo(f(c.toMin) - f(c.fromMin), 12);
    expect(evaluateHold(rule, offGrid, context(9.9)).verdict).toBe('satisfied');
  });

  it('estimates the wait from the decaying rate before any interval passes', () => {
    // s = 2·(1 − e^(−t/2)): the change over [t, t + 1] is 2·(1 − e^(−1/2))·e^(−t/2), at most 0.03 mm from
    // t = 2·ln(2·(1 − e^(−1/2))/0.03) = 6.53 min [calc]: the intervals from the 7-min boundary pass; satisfied at 10 min.
    const series = sampleSeries((t) => 2 * (1 - Math.exp(-t / 2)), 12, ONE_HZ_MIN);
    const firstSatisfied = [6, 7, 8, 9, 10, 11].find((t) => evaluateHold(rule, upTo(series, t), context(t)).verdict === 'satisfied');
    expect(firstSatisfied).toBe(10);
    const at6 = evaluateHold(rule, upTo(series, 6), context(6));
    expect(at6.evidence.kind === 'consecutive' && at6.evidence.intervalsPassed).toBe(0);
    expect(6 + (at6.etaMin ?? Number.NaN)).toBeCloseTo(10, 6);
  });
});
