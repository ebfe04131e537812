import { linearRegression } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { evaluateHold } from '@shared/hold/evaluate';
import type { HoldRule } from '@shared/schemas/plans';
import { ONE_HZ_MIN, quantise, sampleSeries, seededRandom, upTo } from './synthetic';

type RateRule = Extract<HoldRule, { kind: 'rate' }>;
const context = (nowMin: number) => ({ nowMin, stopLimitMm: 25 });

// reference §C13 [calc]: readings on the IS 1888 schedule (schedule seen-2nd).
const IS_TIMES = [0, 1, 2.25, 4, 6.25, 9, 16, 25, 60];
const IS_SERIES = IS_TIMES.map((tMin, i) => ({ tMin, settlementMm: [3.1, 3.62, 3.8, 3.93, 4.03, 4.11, 4.23, 4.31, 4.45][i] }));
const firstSatisfied = (rule: HoldRule) => IS_TIMES.find((t) => evaluateHold(rule, upTo(IS_SERIES, t), context(t)).verdict === 'satisfied');

describe('rate rule on the C13 readings', () => {
  it('is first satisfied at 16 min when the window is the 9→16 interval (reference §C13, calc: 0.01714 mm/min < 0.02)', () => {
    const rule: RateRule = { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 7, minHoldMin: 0 };
    expect(firstSatisfied(rule)).toBe(16);
    const at16 = evaluateHold(rule, IS_SERIES, context(16));
    expect(at16.evidence.kind === 'rate' && at16.evidence.currentRateMmPerMin).toBeCloseTo(0.01714, 5);
  });

  it('with the 10-min regression window of the granular profile, is first satisfied at 25 min (checked with simple-statistics)', () => {
    const rule: RateRule = { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 10, minHoldMin: 0 };
    expect(firstSatisfied(rule)).toBe(25);
    // At 25 min the window [15, 25] reaches back to the 9-min reading: slope of 9, 16, 25 min.
    const { m } = linearRegression([
      [9, 4.11],
      [16, 4.23],
      [25, 4.31],
    ]);
    const at25 = evaluateHold(rule, IS_SERIES, context(25));
    expect(at25.evidence.kind === 'rate' && at25.evidence.currentRateMmPerMin).toBeCloseTo(m, 12);
    expect(m).toBeLessThan(0.02);
  });

  it('waits for the minimum hold of 60 min (textbook IS 1888 practice, from memory)', () => {
    const rule: RateRule = { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 10, minHoldMin: 60 };
    expect(firstSatisfied(rule)).toBe(60);
    const at25 = evaluateHold(rule, IS_SERIES, context(25));
    expect(at25).toMatchObject({ verdict: 'settling', etaMin: 35 });
  });
});

describe('rate rule on an exponential approach with known τ', () => {
  // s = 1 + S·(1 − e^(−t/τ)), logged at 1 Hz. For a dense least-squares window of length w = 2h ending at T,
  // the slope is g·v(T − h) with v(t) = (S/τ)e^(−t/τ) and g = 3(a·cosh a − sinh a)/a³, a = h/τ [calc], so the
  // windowed rate reaches the threshold r at T = h + τ·ln(g·S/(τ·r)).
  const S = 2;
  const tau = 4;
  const rule: RateRule = { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 10, minHoldMin: 0 };
  const series = sampleSeries((t) => 1 + S * (1 - Math.exp(-t / tau)), 40, ONE_HZ_MIN);
  const h = rule.windowMin / 2;
  const a = h / tau;
  const g = (3 * (a * Math.cosh(a) - Math.sinh(a))) / a ** 3;
  const crossing = h + tau * Math.log((g * S) / (tau * rule.maxRateMmPerMin));

  it('is satisfied just after, and not just before, the analytic crossing', () => {
    expect(crossing).toBeCloseTo(18.48, 1);
    expect(evaluateHold(rule, upTo(series, crossing - 0.05), context(crossing - 0.05)).verdict).toBe('settling');
    expect(evaluateHold(rule, upTo(series, crossing + 0.05), context(crossing + 0.05)).verdict).toBe('satisfied');
  });

  it('estimates the time left from the decay of the rate, and τ itself', () => {
    for (const now of [15, 16.5, 18]) {
      const result = evaluateHold(rule, upTo(series, now), context(now));
      expect(result.verdict).toBe('settling');
      expect(now + (result.etaMin ?? Number.NaN)).toBeCloseTo(crossing, 1);
      expect(result.evidence.kind === 'rate' && result.evidence.decayTimeConstantMin).toBeCloseTo(tau, 2);
    }
  });

  it('adds the remaining minimum hold to the estimate', () => {
    const withHold = { ...rule, minHoldMin: 30 };
    const result = evaluateHold(withHold, upTo(series, 15), context(15));
    expect(result.etaMin).toBeCloseTo(15, 6);
  });

  it('has no estimate before two windows of rates exist', () => {
    expect(evaluateHold(rule, upTo(series, 12), context(12)).etaMin).toBeNull();
  });
});

describe('rate rule on quantised, noisy gauge readings', () => {
  // 0.01 mm resolution with ±1 division of noise: the regression rate must not flap between verdicts.
  const rule: RateRule = { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 10, minHoldMin: 0 };
  const clean = sampleSeries((t) => 2 + 1.5 * (1 - Math.exp(-t / 3)), 45, ONE_HZ_MIN);

  it.each([1, 2, 3])('changes verdict once, from settling to satisfied, near the noise-free time (seed %i)', (seed) => {
    const noisy = quantise(clean, 0.01, seededRandom(seed));
    const verdicts: { t: number; verdict: string }[] = [];
    for (let i = 600; i < noisy.length; i += 1) {
      const t = noisy[i].tMin;
      verdicts.push({ t, verdict: evaluateHold(rule, noisy.slice(0, i + 1), context(t)).verdict });
    }
    const changes = verdicts.filter((v, i) => i > 0 && v.verdict !== verdicts[i - 1].verdict);
    expect(verdicts[0].verdict).toBe('settling');
    expect(changes).toHaveLength(1);
    expect(changes[0].verdict).toBe('satisfied');
    const cleanSwitch = verdicts.find((v) => evaluateHold(rule, upTo(clean, v.t), context(v.t)).verdict === 'satisfied')!.t;
    expect(Math.abs(changes[0].t - cleanSwitch)).toBeLessThan(1);
  });
});

describe('rate rule failure suspicion (rate not decaying — common practice)', () => {
  const granular: RateRule = { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 10, minHoldMin: 60 };

  it('flags a steady creep above the threshold once the check applies (after max(min hold, 3 windows) = 60 min)', () => {
    const creep = quantise(
      sampleSeries((t) => 6 + 0.05 * t, 90, ONE_HZ_MIN),
      0.01,
      seededRandom(11),
    );
    const early = evaluateHold(granular, upTo(creep, 59), context(59));
    expect(early.verdict).toBe('settling');
    const late = evaluateHold(granular, upTo(creep, 61), context(61));
    expect(late.verdict).toBe('failure-suspected');
    expect(late.etaMin).toBeNull();
    expect(late.evidence.failureSignals.map((s) => s.code)).toEqual(['rate-not-decaying']);
    expect(late.evidence.failureSignals[0].source.tag).toBe('common practice');
  });

  it('flags an accelerating settlement', () => {
    const runaway = sampleSeries((t) => 6 + 0.03 * t + 0.0004 * t * t, 90, ONE_HZ_MIN);
    expect(evaluateHold(granular, upTo(runaway, 70), context(70)).verdict).toBe('failure-suspected');
  });

  it('does not flag a slowly decaying logarithmic creep (rate falls by more than 10 % per window)', () => {
    const logCreep = sampleSeries((t) => 6 + 2 * Math.log(1 + t), 90, ONE_HZ_MIN);
    const result = evaluateHold(granular, upTo(logCreep, 61), context(61));
    expect(result.verdict).toBe('settling');
    const ev = result.evidence.kind === 'rate' ? result.evidence : null;
    expect(Math.abs(ev!.currentRateMmPerMin!)).toBeGreaterThan(0.02);
    expect(Math.abs(ev!.currentRateMmPerMin!)).toBeLessThan(0.9 * Math.abs(ev!.previousRateMmPerMin!));
  });

  it('judges rebound on unloading by the magnitude of the rate', () => {
    const rebound = sampleSeries((t) => 8 - 0.6 * (1 - Math.exp(-t / 4)), 40, ONE_HZ_MIN);
    const result = evaluateHold({ ...granular, minHoldMin: 0 }, upTo(rebound, 12), context(12));
    expect(result.verdict).toBe('settling');
    expect(result.evidence.kind === 'rate' && result.evidence.currentRateMmPerMin).toBeLessThan(-0.02);
    expect(evaluateHold({ ...granular, minHoldMin: 0 }, rebound, context(40)).verdict).toBe('satisfied');
  });
});
