import { linearRegression } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { evaluateHold } from '@shared/hold/evaluate';
import { hyperbolicTimeFit, timeToFraction } from '@shared/hold/hyperbolic';
import type { HoldRule } from '@shared/schemas/plans';
import { quantise, sampleSeries, seededRandom, upTo } from './synthetic';

// IS 1888 family for clay: 75 % of the stage's probable ultimate settlement, at least 60 min, 24 h cap
// (bearing-cohesive profile; from memory / common practice). Hyperbolic time fit per reference §B.8.
const rule: HoldRule = { kind: 'percentOfUltimate', percent: 75, minHoldMin: 60, maxHoldMin: 1440 };
const context = (nowMin: number) => ({ nowMin, stopLimitMm: 25, procedureId: 'bearing-cohesive' });

// A clay stage that follows the hyperbola exactly: Δs = t/(a + b·t), a = 20 min/mm, b = 0.2 /mm, so the
// ultimate is 1/b = 5 mm and 75 % is reached at t = p·a/(b·(1 − p)) = 0.75·20/(0.2·0.25) = 300 min [calc].
const A = 20;
const B = 0.2;
const clay = sampleSeries((t) => 7.5 + t / (A + B * t), 1500, 1);

describe('hyperbolic time fit', () => {
  it('recovers a and b of an exact hyperbola (checked with simple-statistics on t/Δs against t)', () => {
    const fit = hyperbolicTimeFit(upTo(clay, 120));
    expect(fit?.aMinPerMm).toBeCloseTo(A, 9);
    expect(fit?.bPerMm).toBeCloseTo(B, 12);
    expect(fit?.ultimateMm).toBeCloseTo(5, 9);
    const used = upTo(clay, 120).filter((p) => p.tMin > 0 && p.settlementMm - 7.5 >= 0.05);
    const { m, b } = linearRegression(used.map((p) => [p.tMin, p.tMin / (p.settlementMm - 7.5)]));
    expect(fit?.bPerMm).toBeCloseTo(m, 12);
    expect(fit?.aMinPerMm).toBeCloseTo(b, 9);
    expect(timeToFraction(fit!, 0.75)).toBeCloseTo(300, 6);
  });

  it('leaves out readings within a few gauge divisions of the start, and needs three readings', () => {
    expect(hyperbolicTimeFit(upTo(clay, 1))).toBeNull(); // Δs(1 min) = 0.0495 mm < 0.05 mm
    expect(hyperbolicTimeFit([])).toBeNull();
  });
});

describe('percent-of-ultimate rule', () => {
  it('is satisfied when 75 % is reached at the analytic 300 min, not before', () => {
    expect(evaluateHold(rule, upTo(clay, 299), context(299)).verdict).toBe('settling');
    const at301 = evaluateHold(rule, upTo(clay, 301), context(301));
    expect(at301.verdict).toBe('satisfied');
    expect(at301.evidence).toMatchObject({ kind: 'percentOfUltimate', satisfiedBy: 'percent' });
    expect(at301.evidence.kind === 'percentOfUltimate' && at301.evidence.percentOfUltimate).toBeCloseTo((100 * 301 * B) / (A + B * 301), 6);
  });

  it('predicts the time to 75 % from early readings', () => {
    const at120 = evaluateHold(rule, upTo(clay, 120), context(120));
    expect(at120.etaMin).toBeCloseTo(180, 4);
  });

  it('predicts it within 5 % from quantised, noisy 0.01 mm readings on a √t schedule', () => {
    const times = [0, 1, 2.25, 4, 6.25, 9, 16, 25, 36, 49, 64, 81, 100, 121, 144];
    const exact = times.map((t) => ({ tMin: t, settlementMm: 7.5 + t / (A + B * t) }));
    const noisy = quantise(exact, 0.01, seededRandom(3));
    const result = evaluateHold(rule, noisy, context(144));
    expect(144 + (result.etaMin ?? Number.NaN)).toBeGreaterThan(0.95 * 300);
    expect(144 + (result.etaMin ?? Number.NaN)).toBeLessThan(1.05 * 300);
  });

  it('is satisfied anyway at the 24 h cap, and says so', () => {
    // A slow stage: a = 400 min/mm, b = 0.2 /mm → 75 % only at 6000 min [calc].
    const slow = sampleSeries((t) => 3 + t / (400 + B * t), 1500, 5);
    expect(evaluateHold(rule, upTo(slow, 1435), context(1435))).toMatchObject({ verdict: 'settling', etaMin: 5 });
    const capped = evaluateHold(rule, upTo(slow, 1440), context(1440));
    expect(capped.verdict).toBe('satisfied');
    expect(capped.evidence).toMatchObject({ satisfiedBy: 'max-hold-cap', maxHoldMin: 1440 });
    expect(capped.evidence.kind === 'percentOfUltimate' && capped.evidence.percentOfUltimate).toBeLessThan(75);
  });

  it('waits for the minimum hold even when the percentage is reached early', () => {
    const fast = sampleSeries((t) => 1 + t / (1 + B * t), 120, 1);
    const at30 = evaluateHold(rule, upTo(fast, 30), context(30));
    expect(at30.verdict).toBe('settling');
    expect(at30.etaMin).toBeCloseTo(30, 9);
  });

  it('judges rebound on unloading the same way, measured upwards', () => {
    const rebound = sampleSeries((t) => 12 - t / (A + B * t), 400, 1);
    expect(evaluateHold(rule, upTo(rebound, 299), context(299)).verdict).toBe('settling');
    const at301 = evaluateHold(rule, upTo(rebound, 301), context(301));
    expect(at301).toMatchObject({ verdict: 'satisfied', evidence: { satisfiedBy: 'percent', fit: { direction: -1 } } });
    expect(at301.evidence.kind === 'percentOfUltimate' && at301.evidence.fit?.ultimateMm).toBeCloseTo(5, 9);
  });

  it('suspects failure when the stage is not converging (b ≤ 0)', () => {
    const accelerating = sampleSeries((t) => 5 + 0.01 * t + 0.0001 * t * t, 200, 1);
    const result = evaluateHold(rule, upTo(accelerating, 90), context(90));
    expect(result.verdict).toBe('failure-suspected');
    expect(result.evidence.failureSignals.map((s) => s.code)).toEqual(['no-finite-ultimate']);
  });
});
