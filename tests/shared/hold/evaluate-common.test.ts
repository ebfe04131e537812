import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateHold } from '@shared/hold/evaluate';
import { findProfile } from '@shared/procedures/profiles';
import type { HoldRule } from '@shared/schemas/plans';
import { sampleSeries, upTo } from './synthetic';

const settled = sampleSeries((t) => 4 + 0.5 * (1 - Math.exp(-t)), 120, 0.5);
const granularDefault = findProfile('bearing-granular')!.defaults.holdRule;

describe('fixed-duration rule', () => {
  // DIN 18134 family: each stage held about 120 s (from memory, reference §A.3).
  const rule: HoldRule = { kind: 'fixed', durationMin: 2 };
  it('counts down to the set duration', () => {
    expect(evaluateHold(rule, upTo(settled, 1.5), { nowMin: 1.5, stopLimitMm: 5 })).toMatchObject({
      verdict: 'settling',
      etaMin: 0.5,
      evidence: { remainingMin: 0.5 },
    });
    expect(evaluateHold(rule, upTo(settled, 2), { nowMin: 2, stopLimitMm: 5 })).toMatchObject({ verdict: 'satisfied', etaMin: 0 });
  });
});

describe('failure checks common to every rule', () => {
  it('suspects failure at the stop limit even when the rule is satisfied', () => {
    const result = evaluateHold(granularDefault, settled, { nowMin: 120, stopLimitMm: 4.4 });
    expect(result.verdict).toBe('failure-suspected');
    expect(result.etaMin).toBeNull();
    expect(result.evidence.failureSignals.map((s) => s.code)).toEqual(['stop-limit']);
  });

  it('suspects failure when the pressure cannot be held', () => {
    const result = evaluateHold({ kind: 'fixed', durationMin: 2 }, settled, { nowMin: 3, stopLimitMm: 25, pressureHoldable: false });
    expect(result.evidence.failureSignals.map((s) => s.code)).toEqual(['pressure-not-holdable']);
  });

  it("suspects failure when the hold overruns the plan's termination time unsatisfied", () => {
    const slow = sampleSeries((t) => 4 + 0.03 * t, 200, 1);
    const rule: HoldRule = { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 10, minHoldMin: 0 };
    const options = { stopLimitMm: 25, maxHoldMin: 120, creepCheck: { afterMin: 1e6 } };
    expect(evaluateHold(rule, upTo(slow, 119), { ...options, nowMin: 119 }).verdict).toBe('settling');
    expect(evaluateHold(rule, upTo(slow, 120), { ...options, nowMin: 120 }).evidence.failureSignals.map((s) => s.code)).toEqual(['hold-overrun']);
  });

  it('ignores readings after now', () => {
    const result = evaluateHold(granularDefault, settled, { nowMin: 30, stopLimitMm: 25 });
    expect(result.evidence).toMatchObject({ heldMin: 30, readings: 61, latestSettlementMm: settled[60].settlementMm });
  });

  it('is settling with no readings yet', () => {
    expect(evaluateHold(granularDefault, [], { nowMin: 0, stopLimitMm: 25 })).toMatchObject({
      verdict: 'settling',
      evidence: { currentRateMmPerMin: null, rateUnavailableReason: 'no readings yet', latestSettlementMm: null },
    });
  });
});

describe('criterion', () => {
  it('names the source of the default in the profile wording', () => {
    const { criterion } = evaluateHold(granularDefault, settled, { nowMin: 120, stopLimitMm: 25 });
    expect(criterion.matchesDefault).toBe(true);
    expect(criterion.text).toMatch(
      /^Settlement rate below 0\.02 mm\/min \(least-squares slope over 10 min\), held at least 60 min\. Default from IS 1888:1982/,
    );
    expect(criterion.text).toContain('[secondary]');
    expect(criterion.sources.map((s) => s.setting)).toEqual(['holdRule.maxRateMmPerMin', 'holdRule.minHoldMin', 'holdRule.windowMin']);
  });

  it("says when the plan sets its own values, and uses the plan's own profile when it documents the rule", () => {
    const rule: HoldRule = { kind: 'consecutive', maxChangeMm: 0.02, intervalMin: 1, intervals: 3 };
    const { criterion } = evaluateHold(rule, settled, { nowMin: 10, stopLimitMm: 25, procedureId: 'pavement-repeated' });
    expect(criterion.matchesDefault).toBe(false);
    expect(criterion.text).toContain('This plan sets its own values.');
    expect(criterion.sources).toEqual(findProfile('pavement-repeated')!.sources.filter((s) => s.setting === 'holdRule'));
  });

  it('labels the 24 h cap of the clay rule in its text', () => {
    const rule = findProfile('bearing-cohesive')!.defaults.holdRule;
    expect(evaluateHold(rule, settled, { nowMin: 10, stopLimitMm: 25 }).criterion.text).toContain('satisfied in any case after 1440 min');
  });
});

describe('bad input', () => {
  it('throws naming the field', () => {
    const context = { nowMin: 5, stopLimitMm: 25 };
    expect(() => evaluateHold({ ...granularDefault, windowMin: -1 } as HoldRule, settled, context)).toThrow(/^rule\.windowMin:/);
    expect(() => evaluateHold(granularDefault, [settled[2], settled[1]], context)).toThrow(/^series\[1\]\.tMin:/);
    expect(() => evaluateHold(granularDefault, [{ tMin: 0, settlementMm: Number.NaN }], context)).toThrow(/^series\[0\]\.settlementMm:/);
    expect(() => evaluateHold(granularDefault, settled, { ...context, nowMin: Number.NaN })).toThrow(/^context\.nowMin:/);
    expect(() => evaluateHold(granularDefault, settled, { ...context, stopLimitMm: 0 })).toThrow(/^context\.stopLimitMm:/);
  });
});

describe('properties', () => {
  const arbitrarySeries = fc
    .array(fc.tuple(fc.double({ min: 0, max: 5, noNaN: true }), fc.double({ min: -0.5, max: 1, noNaN: true })), { minLength: 0, maxLength: 40 })
    .map((steps) => {
      let t = 0;
      let s = 3;
      return steps.map(([dt, ds]) => {
        t += dt;
        s += ds;
        return { tMin: t, settlementMm: s };
      });
    });

  it('never satisfies a rate or percent rule before its minimum hold (or, for percent, its cap)', () => {
    const rule = fc.oneof(
      fc.record({
        kind: fc.constant('rate' as const),
        maxRateMmPerMin: fc.double({ min: 0.001, max: 10, noNaN: true }),
        windowMin: fc.double({ min: 0.1, max: 60, noNaN: true }),
        minHoldMin: fc.double({ min: 0, max: 200, noNaN: true }),
      }),
      fc.record({
        kind: fc.constant('percentOfUltimate' as const),
        percent: fc.double({ min: 50, max: 99, noNaN: true }),
        minHoldMin: fc.double({ min: 0, max: 200, noNaN: true }),
        maxHoldMin: fc.double({ min: 1, max: 400, noNaN: true }),
      }),
    );
    fc.assert(
      fc.property(rule, arbitrarySeries, fc.double({ min: 0, max: 250, noNaN: true }), (r, series, nowMin) => {
        const result = evaluateHold(r, series, { nowMin, stopLimitMm: 1000 });
        if (result.verdict !== 'satisfied') return true;
        const earliest = r.kind === 'rate' ? r.minHoldMin : Math.min(r.minHoldMin, r.maxHoldMin);
        return nowMin >= earliest - 1e-6;
      }),
    );
  });

  it('always suspects failure once the settlement reaches the stop limit, and gives no time estimate then', () => {
    fc.assert(
      fc.property(arbitrarySeries, fc.double({ min: 0.5, max: 30, noNaN: true }), (series, stopLimitMm) => {
        const nowMin = series.at(-1)?.tMin ?? 0;
        const result = evaluateHold(granularDefault, series, { nowMin, stopLimitMm });
        const reached = series.length > 0 && series.at(-1)!.settlementMm >= stopLimitMm;
        return reached
          ? result.verdict === 'failure-suspected' && result.etaMin === null
          : !result.evidence.failureSignals.some((s) => s.code === 'stop-limit');
      }),
    );
  });

  it('gives a non-negative time estimate, and 0 exactly when satisfied', () => {
    fc.assert(
      fc.property(arbitrarySeries, fc.double({ min: 0, max: 250, noNaN: true }), (series, nowMin) => {
        const result = evaluateHold({ kind: 'consecutive', maxChangeMm: 0.3, intervalMin: 1, intervals: 3 }, series, { nowMin, stopLimitMm: 1000 });
        if (result.etaMin === null) return result.verdict !== 'satisfied';
        return result.etaMin >= 0 && (result.verdict !== 'satisfied' || result.etaMin === 0);
      }),
    );
  });
});
