import { describe, expect, it } from 'vitest';
import {
  brinchHansen90Ultimate,
  brinchHansenUltimate,
  compareUltimateMethods,
  hyperbolicUltimate,
  logLogIntersection,
  settlementCriterionUltimate,
  tangentIntersection,
} from '@shared/interpretation/ultimate';
import { curve, expectNoNonFinite, expectRel, FITTED } from './tolerance';

// reference §C5, computed from the formula [calc]: s = 0.02q up to 300 kPa, then 6(q/300)⁴.
const C5 = curve([50, 100, 150, 200, 250, 300, 350, 400, 450], [1.0, 2.0, 3.0, 4.0, 5.0, 6.0, 11.1157, 18.963, 30.375]);
// reference §C6, computed from the published formula of Kondner (1963)/Chin (1970) [calc]: q = s/(0.01 + 0.002s).
const C6 = curve([83.333, 142.857, 222.222, 272.727, 307.692, 352.941, 380.952, 400.0, 413.793, 432.432], [1, 2, 4, 6, 8, 12, 16, 20, 24, 32]);

describe('log–log two-line intersection', () => {
  it('finds the SSE-minimising split and the intersection (reference §C5, computed from the formula [calc])', () => {
    const r = logLogIntersection(C5);
    expect(r.details?.chosenBy).toBe('leastSquares');
    expect(r.details?.firstLineEnd).toBe(4); // q = 50…250 on line 1, 300…450 on line 2
    expectRel(r.details?.firstLine.slope, 1.0, FITTED);
    expectRel(r.details?.secondLine.slope, 4.0, FITTED);
    expectRel(r.qUltKpa, 300.0, FITTED);
    expectRel(r.sUltMm, 6.0, FITTED);
    expect(r.fit?.measure).toBe('sse');
    expect(r.details?.candidates.length).toBe(6);
  });

  it('uses the engineer-chosen split when given (reference §C5: 300 kPa lies on both lines, so either split gives it)', () => {
    const r = logLogIntersection(C5, { firstLineEnd: 5 });
    expect(r.details?.chosenBy).toBe('engineer');
    expect(r.details?.candidates).toEqual([]);
    expectRel(r.qUltKpa, 300.0, FITTED);
  });

  it('leaves out the zero point and keeps indices of the given points', () => {
    const r = logLogIntersection([{ pressureKpa: 0, settlementMm: 0 }, ...C5]);
    expect(r.details?.excludedIndices).toEqual([0]);
    expect(r.details?.firstLineEnd).toBe(5);
    expectRel(r.qUltKpa, 300.0, FITTED);
  });

  it('returns null with a reason when there is no break or too few points', () => {
    // A straight log–log line s = 0.02q: both fitted lines have slope 1, the second is not steeper.
    const straight = logLogIntersection(curve([50, 100, 150, 200, 250, 300], [1, 2, 3, 4, 5, 6]));
    expect(straight.qUltKpa).toBeNull();
    expect(straight.reason).toMatch(/not steeper/);
    const few = logLogIntersection(curve([50, 100, 150], [1, 2, 5]));
    expect(few).toMatchObject({ qUltKpa: null, sUltMm: null, details: null });
    expect(few.reason).toMatch(/at least 4 points/);
  });

  it('rejects an impossible engineer split naming the option', () => {
    expect(() => logLogIntersection(C5, { firstLineEnd: 8 })).toThrow(/options\.firstLineEnd/);
  });
});

describe('tangent intersection', () => {
  it('meets at the break of a bilinear curve', () => {
    // Constructed [calc]: s = 0.02q to 300 kPa, then s = 6 + 0.1(q − 300). Initial tangent through
    // q = 100, 150, 200 is s = 0.02q; final through 400, 450, 500 is s = 0.1q − 24; they cross where
    // 0.02q = 0.1q − 24 ⇒ q = 300 kPa, s = 6 mm.
    const r = tangentIntersection(curve([100, 150, 200, 300, 400, 450, 500], [2, 3, 4, 6, 16, 21, 26]));
    expectRel(r.qUltKpa, 300, 1e-9);
    expectRel(r.sUltMm, 6, 1e-9);
    expectRel(r.details?.initial.slope, 0.02, 1e-9);
    expectRel(r.details?.final.slope, 0.1, 1e-9);
  });

  it('returns null with a reason for too few points or a straight curve', () => {
    expect(tangentIntersection(curve([1, 2, 3, 4, 5], [1, 2, 3, 5, 8])).reason).toMatch(/at least 6 points/);
    const straight = tangentIntersection(curve([1, 2, 3, 4, 5, 6], [1, 2, 3, 4, 5, 6]));
    expect(straight.qUltKpa).toBeNull();
    expect(straight.reason).toMatch(/not steeper/);
  });

  it('rejects a tangent of fewer than two points naming the option', () => {
    expect(() => tangentIntersection(C5, { initialPoints: 1 })).toThrow(/options\.initialPoints/);
  });
});

describe('hyperbolic (Chin–Kondner)', () => {
  it('regression, asymptote and the 10 %-of-width criterion (reference §C6, computed from the published formula of Kondner (1963)/Chin (1970) [calc])', () => {
    const r = hyperbolicUltimate(C6, 30);
    expectRel(r.details?.a, 0.01, FITTED);
    expectRel(r.details?.b, 0.002, FITTED);
    expectRel(r.qUltKpa, 500.0, FITTED);
    expectRel(r.details?.initialStiffnessKpaPerMm, 100, FITTED);
    expectRel(r.details?.atCriterion?.byHyperbolaKpa, 428.571, FITTED);
    expectRel(r.details?.atCriterion?.byInterpolationKpa, 427.773, FITTED);
    expect(r.fit?.measure).toBe('r2');
    expect(r.fit?.value).toBeGreaterThan(0.9999);
  });

  it('returns null with a reason when s/q does not rise (no asymptote) or too few points', () => {
    // Stiffening curve q = 100·s²: s/q = 1/(100·s) falls as s grows ⇒ b < 0.
    const stiffening = hyperbolicUltimate(curve([100, 400, 900, 1600], [1, 2, 3, 4]));
    expect(stiffening.qUltKpa).toBeNull();
    expect(stiffening.reason).toMatch(/no asymptote/);
    expect(hyperbolicUltimate(curve([0, 100, 200], [0, 1, 3])).reason).toMatch(/at least three points with q > 0/);
  });
});

describe('settlement criterion', () => {
  it('reads q at 10 % of the plate width by linear interpolation (reference §C6 [calc])', () => {
    const r = settlementCriterionUltimate(C6, 300);
    expectRel(r.qUltKpa, 427.773);
    expect(r.sUltMm).toBe(30);
    expect(r.label).toBe('Settlement criterion (10 % of width)');
  });

  it('interpolates on the C5 curve', () => {
    // reference §C5 data [calc]: 30 mm lies between (400, 18.963) and (450, 30.375):
    // q = 400 + 50·(30 − 18.963)/(30.375 − 18.963) = 448.357 kPa.
    expectRel(settlementCriterionUltimate(C5, 300).qUltKpa, 448.357);
  });

  it('accepts an absolute settlement such as 25 mm', () => {
    // Between (400, 18.963) and (450, 30.375): q = 400 + 50·6.037/11.412 = 426.450 kPa [calc].
    const r = settlementCriterionUltimate(C5, 300, { settlementMm: 25 });
    expectRel(r.qUltKpa, 426.45);
    expect(r.details?.fractionOfWidth).toBeNull();
  });

  it('returns null with a reason when the criterion is not reached', () => {
    const r = settlementCriterionUltimate(C5, 450); // 45 mm criterion, test stopped at 30.375 mm
    expect(r.qUltKpa).toBeNull();
    expect(r.reason).toMatch(/not reached.*30\.375 mm.*45 mm/);
  });
});

describe('Brinch Hansen 80 %', () => {
  it('recovers q_u and s_u from a curve of the Brinch Hansen form', () => {
    // Constructed from the published form √s/q = C1·s + C2 (Brinch Hansen 1963) with C1 = 2×10⁻⁴,
    // C2 = 5×10⁻³ [calc]: q_u = 1/(2√(C1·C2)) = 1/(2·10⁻³) = 500 kPa, s_u = C2/C1 = 25 mm;
    // identity check: q(s_u/4 = 6.25) = 2.5/(1.25×10⁻³ + 5×10⁻³) = 400 = 0.8·q_u.
    const s = [1, 2, 4, 8, 12, 16, 20, 25];
    const r = brinchHansenUltimate(
      curve(
        s.map((x) => Math.sqrt(x) / (2e-4 * x + 5e-3)),
        s,
      ),
    );
    expectRel(r.qUltKpa, 500, 1e-9);
    expectRel(r.sUltMm, 25, 1e-9);
    expectRel(r.details?.settlementAt80PercentMm, 6.25, 1e-9);
    const { c1, c2 } = r.details as { c1: number; c2: number };
    expectRel(Math.sqrt(6.25) / (c1 * 6.25 + c2), 0.8 * 500, 1e-9);
    expect(r.details?.extrapolated).toBe(false);
    expect(r.reason).toBeNull();
  });

  it('returns null with a reason when C1 or C2 is not positive', () => {
    // A linear curve s = 0.02q gives √s/q = 0.02/√s, which falls with s ⇒ C1 < 0.
    const r = brinchHansenUltimate(curve([50, 100, 150, 200, 250], [1, 2, 3, 4, 5]));
    expect(r.qUltKpa).toBeNull();
    expect(r.reason).toMatch(/C1 and C2 must both be positive/);
  });
});

describe('compareUltimateMethods', () => {
  it('returns every method side by side with its source', () => {
    const all = compareUltimateMethods(C6, 300);
    expect(all.map((r) => r.method)).toEqual(['logLogIntersection', 'tangentIntersection', 'hyperbolic', 'settlementCriterion', 'brinchHansen80', 'brinchHansen90']);
    all.forEach((r) => {
      expect(r.source.length).toBeGreaterThan(10);
      expect(r.formula.length).toBeGreaterThan(10);
    });
    expectRel(all[2].qUltKpa, 500, FITTED);
    expectRel(all[3].qUltKpa, 427.773);
    expectNoNonFinite(all);
  });

  it('never leaks NaN with too few points: every method says why it has no value', () => {
    const all = compareUltimateMethods(curve([0, 100], [0, 1.5]), 300);
    expectNoNonFinite(all);
    all.forEach((r) => {
      expect(r.qUltKpa).toBeNull();
      expect(r.reason).toBeTruthy();
    });
  });

  it('rejects a curve that is not a loading branch, naming the point', () => {
    expect(() => compareUltimateMethods(curve([100, 200, 150], [1, 2, 2.5]), 300)).toThrow(/points\[2\]\.pressureKpa: pressures must rise/);
    expect(() => compareUltimateMethods(curve([100, 200], [1, Number.NaN]), 300)).toThrow(/points\[1\]\.settlementMm/);
    expect(() => compareUltimateMethods(C5, 0)).toThrow(/plateWidthMm/);
  });
});

describe('Brinch Hansen 90 %', () => {
  it('on a hyperbola q = s/(a + b·s) the criterion s(q) = 2·s(0.9q) gives q = 0.8/(0.9·b) (closed form [calc]; Brinch Hansen 1963)', () => {
    // a = 0.01 mm/kPa, b = 1/500: q_u = 0.8·500/0.9 = 444.44 kPa; the curve from its origin, every 5 kPa to 495 kPa.
    const qs = Array.from({ length: 100 }, (_, i) => 5 * i);
    const points = qs.map((q) => ({ pressureKpa: q, settlementMm: (0.01 * q) / (1 - q / 500) }));
    const r = brinchHansen90Ultimate(points);
    expectRel(r.qUltKpa, 400 / 0.9, 2e-3); // linear interpolation between 5 kPa points
    expectRel(r.sUltMm, 2 * r.details!.settlementAt90PercentMm);
  });

  it('is not reached on a straight line, and says so', () => {
    const r = brinchHansen90Ultimate(curve([0, 100, 200, 300], [0, 1, 2, 3]));
    expect(r.qUltKpa).toBeNull();
    expect(r.reason).toMatch(/^not reached/);
  });
});
