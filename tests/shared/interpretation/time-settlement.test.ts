import { describe, expect, it } from 'vitest';
import { creepPerLogCycle, cyclicSplit, hyperbolicIncrementAt, hyperbolicTimeFit, settlementLogTime, settlementRootTime } from '@shared/interpretation/time-settlement';
import { expectRel, FITTED } from './tolerance';

const series = (times: number[], f: (t: number) => number) => times.map((tMin) => ({ tMin, settlementMm: f(tMin) }));

describe('s–log t and s–√t series', () => {
  it('transform the time axis and leave out t = 0 on the log axis', () => {
    const readings = series([0, 1, 4, 100], (t) => 2 + t / 100);
    expect(settlementLogTime(readings).map((r) => r.log10TMin)).toEqual([0, Math.log10(4), 2]);
    expect(settlementRootTime(readings).map((r) => r.sqrtTMin)).toEqual([0, 1, 2, 10]);
    expect(() => settlementRootTime([{ tMin: 2, settlementMm: 1 }, { tMin: 1, settlementMm: 1 }])).toThrow(/readings\[1\]\.tMin: readings must be in time order/);
  });
});

describe('creep per log cycle', () => {
  // Constructed from the published definition k_s = (s_b − s_a)/log10(t_b/t_a) (EN ISO 22477-1) [calc]:
  // s = 2 + 0.3·log10 t rises 0.3 mm per log cycle everywhere.
  const readings = series([1, 2, 5, 10, 20, 30, 60], (t) => 2 + 0.3 * Math.log10(t));

  it('is 0.3 mm per log cycle between any two times', () => {
    expectRel(creepPerLogCycle(readings, 1, 10).ksMm, 0.3, 1e-12);
    expectRel(creepPerLogCycle(readings, 10, 60).ksMm, 0.3, 1e-12);
  });

  it('returns null with a reason outside the readings and rejects a reversed window', () => {
    const r = creepPerLogCycle(readings, 10, 120);
    expect(r.ksMm).toBeNull();
    expect(r.reason).toMatch(/do not span 10–120 min/);
    expect(() => creepPerLogCycle(readings, 10, 5)).toThrow(/toMin/);
  });
});

describe('hyperbolic time fit', () => {
  // Constructed from the hyperbola t/Δs = a + b·t (Tan 1971; Sridharan et al. 1987) with a = 2 min/mm,
  // b = 0.5 /mm and a stage start at 3.0 mm [calc]: Δs_ult = 1/b = 2 mm; at 60 min Δs = 60/32 = 1.875 mm
  // = 93.75 % of ultimate; on the hyperbola at 10 min Δs = 10/7 = 1.428571 mm.
  const readings = series([0, 1, 2, 4, 8, 15, 30, 60], (t) => 3 + t / (2 + 0.5 * t));

  it('recovers a, b, the ultimate increment and the percentage reached', () => {
    const fit = hyperbolicTimeFit(readings);
    expectRel(fit.a, 2, FITTED);
    expectRel(fit.b, 0.5, FITTED);
    expectRel(fit.ultimateIncrementMm, 2, FITTED);
    expectRel(fit.percentOfUltimate, 93.75, FITTED);
    expectRel(hyperbolicIncrementAt(fit, 10), 1.428571, FITTED);
    expect(fit.startSettlementMm).toBe(3);
  });

  it('needs the start settlement or a reading at t = 0, and three readings after it', () => {
    expect(() => hyperbolicTimeFit(readings.slice(1))).toThrow(/options\.startSettlementMm/);
    expectRel(hyperbolicTimeFit(readings.slice(1), { startSettlementMm: 3 }).b, 0.5, FITTED);
    expect(() => hyperbolicTimeFit(readings.slice(0, 3))).toThrow(/readings: needs at least three readings/);
  });

  it('returns null with a reason when t/Δs does not rise', () => {
    // Accelerating settlement Δs = t²/10: t/Δs = 10/t falls with t.
    const fit = hyperbolicTimeFit(series([0, 1, 2, 4, 8], (t) => (t * t) / 10));
    expect(fit.ultimateIncrementMm).toBeNull();
    expect(fit.percentOfUltimate).toBeNull();
    expect(fit.reason).toMatch(/no ultimate settlement/);
  });
});

describe('cyclic split', () => {
  it('total, rebound, residual and elastic fraction per cycle (ASTM D1195 terms; arithmetic [calc])', () => {
    // Cycle 1: load 2.00, release 1.40 ⇒ rebound 0.60, residual 1.40, elastic 0.30.
    // Cycle 2: load 2.20, release 1.50 ⇒ rebound 0.70, residual 1.50 (+0.10), elastic 0.70/2.20 = 0.318182.
    const [c1, c2] = cyclicSplit([
      { loadedMm: 2.0, releasedMm: 1.4 },
      { loadedMm: 2.2, releasedMm: 1.5 },
    ]);
    expect(c1.cycle).toBe(1);
    expectRel(c1.reboundMm, 0.6, 1e-12);
    expectRel(c1.residualMm, 1.4, 1e-12);
    expectRel(c1.elasticFraction, 0.3, 1e-12);
    expectRel(c2.totalMm, 2.2, 1e-12);
    expectRel(c2.residualIncrementMm, 0.1, 1e-9);
    expectRel(c2.elasticFraction, 0.318182);
  });

  it('measures from a given zero, has no elastic fraction at zero total, and rejects bad input', () => {
    expectRel(cyclicSplit([{ loadedMm: 3.0, releasedMm: 2.4 }], 1.0)[0].totalMm, 2.0, 1e-12);
    expect(cyclicSplit([{ loadedMm: 0, releasedMm: 0 }])[0].elasticFraction).toBeNull();
    expect(() => cyclicSplit([])).toThrow(/cycles: needs at least one cycle/);
    expect(() => cyclicSplit([{ loadedMm: Number.NaN, releasedMm: 0 }])).toThrow(/cycles\[0\]\.loadedMm/);
  });
});
