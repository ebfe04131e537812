/**
 * Results that know their limits: straight lines never "fail", yields are not ultimates, extrapolations are
 * marked and never chosen, methods follow the procedure, k carries its plate, footings their shape factor,
 * repeated loading its per-cycle split, and the seating point is the curve's origin, never a measurement.
 */
import { analyzeRecord } from '@shared/interpretation/analyze-record';
import { clayLinearRatio, footingSettlement, footingUltimatePressure, plateSettlementForFooting, shapeCorrection, terzaghiPeckSandRatio } from '@shared/interpretation/scaling';
import { breakSignificance } from '@shared/interpretation/significance';
import { mnPerM3ToPci, pciToMnPerM3, subgradeModulusFromCbr } from '@shared/interpretation/subgrade';
import { hyperbolicUltimate, logLogIntersection, tangentIntersection } from '@shared/interpretation/ultimate';
import type { Branch } from '@shared/plans/stages';
import type { TestRecord } from '@shared/records/schema';
import { describe, expect, it } from 'vitest';
import { expectRel } from '../interpretation/tolerance';
import { reason, result } from './fixtures';
import { lcg, pavementTest, pointRecord as record, REPEATED_LOADING, repeatedLoadingTest, round2, steps, straightLineTo600 } from './synthetic';

describe('a straight load–settlement line never fails', () => {
  // The case: s = q/60 read to 0.01 mm, to 600 kPa (constructed here, [calc]).
  const analysis = analyzeRecord(straightLineTo600());

  it('finds no break: "failure not reached, q_ult ≥ 600 kPa", no yield chosen for design', () => {
    const methods = result(analysis.ultimate);
    expect(methods.find((m) => m.method === 'logLogIntersection')?.reason).toMatch(/^no significant break|not steeper/);
    expect(methods.find((m) => m.method === 'tangentIntersection')?.reason).toMatch(/^no significant break|not steeper/);
    expect(methods.filter((m) => m.standing === 'ultimate' || m.standing === 'yield')).toEqual([]);
    const chosen = result(analysis.chosenUltimate);
    expect(chosen).toMatchObject({ basis: 'lowerBound', qUltKpa: 600, method: null });
    expect(chosen.statement).toMatch(/^Failure not reached: q_ult ≥ 600\.0 kPa/);
  });

  it('holds for any slope, step and range (property test, 200 seeded straight lines read to 0.01 mm)', () => {
    const random = lcg(15);
    for (let trial = 0; trial < 200; trial++) {
      const stiffness = 20 + 180 * random(); // kPa/mm
      const count = 5 + Math.floor(11 * random());
      const qMax = 100 + 800 * random();
      const qs = Array.from({ length: count }, (_, i) => (qMax * (i + 1)) / count);
      const r = record('bearing-granular', { shape: 'circular', sizeMm: 600 }, [['seating', 5, 0], ...qs.map((q) => ['loading', q, (q - 5) / stiffness] as [Branch, number, number])]);
      const a = analyzeRecord(r);
      const standing = result(a.ultimate).filter((m) => m.standing === 'ultimate' || m.standing === 'yield');
      expect(standing.map((m) => `${m.method} ${m.qUltKpa} (k ${stiffness}, n ${count})`)).toEqual([]);
      expect(result(a.chosenUltimate).basis).toBe('lowerBound');
    }
  });

  it('an exact two-line curve is a significant break (reference §C5, constructed from the formula [calc])', () => {
    const qs = [50, 100, 150, 200, 250, 300, 350, 400, 450];
    const ss = [1, 2, 3, 4, 5, 6, 11.1157, 18.963, 30.375];
    const r = logLogIntersection(qs.map((q, i) => ({ pressureKpa: q, settlementMm: ss[i] })));
    expect(r.details?.significance?.significant).toBe(true);
    expectRel(r.qUltKpa, 300, 1e-3);
  });

  it('the F test of two lines against one: noise alone is not significant, and the floor is the reading resolution', () => {
    // One line y = x with ±0.001 alternating noise (well inside a floor of 0.01² per point).
    const xs = [1, 2, 3, 4, 5, 6, 7, 8];
    const ys = xs.map((x, i) => x + (i % 2 ? 0.001 : -0.001));
    const s = breakSignificance({ xs: xs.slice(0, 4), ys: ys.slice(0, 4) }, { xs: xs.slice(4), ys: ys.slice(4) }, 0.01 ** 2 * 4, 5);
    expect(s?.significant).toBe(false);
    // Closed tail of F(2, ν) (common statistical practice): P(F > f) = (1 + 2f/ν)^(−ν/2).
    expect(s?.pValue).toBeCloseTo((1 + (2 * (s?.f ?? 0)) / 4) ** -2, 12);
    expect(breakSignificance({ xs: [1, 2], ys: [1, 2] }, { xs: [3, 4], ys: [3, 4] }, 0)).toBeNull();
    const tangent = tangentIntersection(steps(50, 400, 50).map((q) => ({ pressureKpa: q, settlementMm: round2(q / 75) })));
    expect(tangent.qUltKpa).toBeNull();
  });
});

describe('yield, failure and extrapolation', () => {
  // Constructed [calc]: s = q/100 to 300 kPa, then 1/40 mm per kPa to 600 kPa — a bend, then carried.
  const bend = (q: number) => (q <= 300 ? q / 100 : 3 + (q - 300) / 40);
  // The same bend, then plunging: the last increment settles 1/5 mm per kPa (20 × the first).
  const plunge = (q: number) => (q <= 500 ? bend(q) : bend(500) + (q - 500) / 5);
  const curveOf = (f: (q: number) => number) =>
    record('bearing-cohesive', { shape: 'square', sizeMm: 300 }, [['seating', 0, 0], ...steps(50, 600, 50).map((q) => ['loading', q, f(q)] as [Branch, number, number])]);

  it('a bend below a pressure carried without failure signs is a yield pressure, not an ultimate, and is not chosen', () => {
    const a = analyzeRecord(curveOf(bend));
    expect(result(a.extent).failure.reached).toBe(false);
    const logLog = result(a.ultimate).find((m) => m.method === 'logLogIntersection');
    expect(logLog?.standing).toBe('yield');
    expect(logLog?.reason).toMatch(/^yield pressure, not an ultimate/);
    expect(result(a.chosenUltimate)).toMatchObject({ basis: 'lowerBound', qUltKpa: 600 });
  });

  it('on a test that plunges, the break is an ultimate and the lowest one is chosen, with q_ult/q_max', () => {
    const a = analyzeRecord(curveOf(plunge));
    expect(result(a.extent).failure.reached).toBe(true);
    const ultimates = result(a.ultimate).filter((m) => m.standing === 'ultimate');
    expect(ultimates.length).toBeGreaterThan(0);
    const chosen = result(a.chosenUltimate);
    expect(chosen.basis).toBe('lowest');
    expect(chosen.qUltKpa).toBe(Math.min(...ultimates.map((m) => m.qUltKpa as number)));
    expect(chosen.qOverQmax).toBeCloseTo(chosen.qUltKpa / 600, 12);
    for (const m of result(a.ultimate)) if (m.qUltKpa !== null) expect(m.qOverQmax).toBeCloseTo(m.qUltKpa / 600, 12);
    // The engineer may still carry the largest pressure carried, the lower bound, instead.
    const bound = result(analyzeRecord(curveOf(plunge), { ultimateMethod: 'largestPressure' }).chosenUltimate);
    expect(bound).toMatchObject({ basis: 'lowerBound', method: null, qUltKpa: 600 });
    expect(bound.statement).toMatch(/^The engineer’s choice, the largest pressure carried: q_ult ≥ 600\.0 kPa/);
  });

  it('an asymptote far beyond a small test is no result (q_ult/q_max above 2), and an extrapolated one is never chosen automatically', () => {
    // A compaction-size test: 1.85 mm at most on a 300 mm plate, stiffening slightly (constructed [calc]).
    const small = record(undefined, { shape: 'circular', sizeMm: 300 }, [
      ['seating', 0, 0],
      ...[40, 80, 120, 160, 200].map((q) => ['loading', q, (q / 120) * (1 + q / 2000)] as [Branch, number, number]),
    ]);
    const methods = result(analyzeRecord(small).ultimate);
    const hyperbolic = methods.find((m) => m.method === 'hyperbolic');
    expect(hyperbolic?.standing).toBe('beyondLimits');
    expect(hyperbolic?.qUltKpa).toBeNull();
    expect(hyperbolic?.indicativeKpa).toBeGreaterThan(400);
    expect(hyperbolic?.reason).toMatch(/^too far beyond the test to be a result \(q_ult\/q_max = \d+\.\d\d; limits 2 and 3\)/);
    expect(result(analyzeRecord(small).chosenUltimate).basis).toBe('lowerBound');
  });
});

describe('the zero (seating) correction: the seating point is the origin, never a measurement', () => {
  // The simulator's dense sand envelope (by construction: initial stiffness 220 kPa/mm, asymptote 1000 kPa),
  // gauges zeroed at the 7 kPa seating pressure, read to 0.01 mm [calc].
  const envelope = (q: number) => q / (220 * (1 - q / 1000));
  const sand = record('bearing-granular', { shape: 'square', sizeMm: 450 }, [
    ['seating', 7, 0],
    ...steps(100, 600, 100).map((q) => ['loading', q, envelope(q) - envelope(7)] as [Branch, number, number]),
  ]);
  const a = analyzeRecord(sand);

  it('recovers the envelope: asymptote within 5 %, initial stiffness within 10 % (zero offset of 0.03 mm and 0.01 mm rounding)', () => {
    const hyperbolic = result(a.ultimate).find((m) => m.method === 'hyperbolic');
    expectRel(hyperbolic?.qUltKpa, 1000, 0.05);
    const details = hyperbolic?.details as { initialStiffnessKpaPerMm: number };
    expectRel(details.initialStiffnessKpaPerMm, 220, 0.1);
    // The fit that took the seating point as a measurement (s/q = 0 at s = 0) fell well short: the 774 kPa.
    const biased = hyperbolicUltimate([{ pressureKpa: 7, settlementMm: 0 }, ...a.firstLoading.slice(1)]).qUltKpa as number;
    expect(biased).toBeLessThan(800);
    expect(a.zeroCorrection.statement).toMatch(/^Origin of the curve: the end of the seating stage, q = 7\.0 kPa, s = 0\.00 mm/);
  });

  it('shows a bedding correction where the first stages point above the origin, and applies it to nothing (common practice)', () => {
    // s = 0.5, 0.8, 1.1 mm at 50, 100, 150 kPa from an origin at 7 kPa: the line through the first two meets 7 kPa at 0.5 − 0.006·43 = 0.242 mm [calc].
    const bedded = analyzeRecord(record('bearing-granular', { shape: 'square', sizeMm: 450 }, [['seating', 7, 0], ['loading', 50, 0.5], ['loading', 100, 0.8], ['loading', 150, 1.1]]));
    expectRel(bedded.zeroCorrection.bedding?.interceptMm, 0.242);
    expect(bedded.zeroCorrection.bedding?.statement).toMatch(/^Bedding: .* s = 0\.24 mm; an engineer may deduct it as plate bedding \(not applied to any figure here\)\.$/);
    expect(bedded.firstLoading.map((p) => p.settlementMm)).toEqual([0, 0.5, 0.8, 1.1]); // not applied
    expect(a.zeroCorrection.bedding).toBeNull(); // the envelope starts at its origin
  });

  it('without a seating stage the curve still starts at its origin, so k is read below the first stage', () => {
    const noSeating = record('pavement-single', { shape: 'circular', sizeMm: 762 }, steps(100, 300, 100).map((q) => ['loading', q, q / 50] as [Branch, number, number]));
    const b = analyzeRecord(noSeating);
    expect(b.firstLoading[0]).toEqual({ pressureKpa: 0, settlementMm: 0 });
    expect(b.zeroCorrection.fromSeatingStage).toBe(false);
    expectRel(result(b.subgradeModulus.atPressure).kMnM3, 50); // 10 psi on s = q/50: k = 50 MN/m³ [calc]
  });
});

describe('methods by procedure, k for the plate used', () => {
  const pavement = pavementTest;

  it('a 300 mm pavement test: k labelled for 300 mm at 0.05 in, the 750 mm value only as a labelled conversion with its caution, no bearing methods', () => {
    const a = analyzeRecord(pavement(300));
    const k = result(a.subgradeModulus.atSettlement);
    expect(k.label).toBe('k, 300 mm plate');
    expect(k.settlementMm).toBe(1.27); // 0.05 in (ASTM D1196 / AASHTO T 222 family)
    expect(a.subgradeModulus.settlementBasis).toBe('0.05 in = 1.27 mm (ASTM D1196 / AASHTO T 222 family)');
    expectRel(k.kMnM3, (7 + 1.27 * 50) / 1.27); // p at 1.27 mm on s = (q − 7)/50 [calc]
    const large = result(a.subgradeModulus.standardPlate);
    expect(large.kind).toBe('converted');
    expect(large.label).toBe('k, 750 mm plate by the IRC:58 conversion');
    expectRel(large.kMnM3, (k.kMnM3 as number) / 2); // IRC:58 k_750 = ½ k_300 (from memory)
    expect(large.caution).toMatch(/^A conversion, not a measurement/);
    expect(reason(a.ultimate)).toMatch(/does not load the plate towards failure/);
    expect(reason(a.footing)).toMatch(/does not load the plate towards failure/);
  });

  it('the 762 mm value is the measurement on a 762 mm plate, and none is invented for a 450 mm plate', () => {
    expect(result(analyzeRecord(pavement(762)).subgradeModulus.standardPlate).kind).toBe('measured');
    expect(reason(analyzeRecord(pavement(450)).subgradeModulus.standardPlate)).toBe(
      'no standard conversion from a 450 mm plate to the 750/762 mm plate: test with the large plate for a design k',
    );
  });

  it('a CBR estimate from the 762 mm k round-trips the DMRB correlation, and the soaked k follows the consolidometer ratio (CRD-C 655)', () => {
    const a = analyzeRecord(pavementTest(762), { soakedSpecimens: { unsoakedMm: 0.5, soakedMm: 0.8 } });
    const k = result(a.subgradeModulus.atSettlement).kMnM3 as number;
    const cbr = result(a.subgradeModulus.cbrEstimate).cbrPercent;
    const back = subgradeModulusFromCbr(cbr).find((c) => c.name === 'DMRB')?.kMnM3;
    expectRel(back, k, 1e-9); // CBR ↔ k both ways (UK DMRB IAN 73/06)
    expectRel(result(a.subgradeModulus.soaked ?? { applies: false, reason: 'none' }).kMnM3, k * (0.5 / 0.8)); // k_s = k_u·d/d_s
    expect(analyzeRecord(pavementTest(762)).subgradeModulus.soaked).toBeNull();
    expect(reason(analyzeRecord(pavementTest(450)).subgradeModulus.cbrEstimate)).toMatch(/^no standard conversion from a 450 mm plate/);
  });

  it('a record naming no procedure shows every method with a note', () => {
    const a = analyzeRecord(record(undefined, { shape: 'circular', sizeMm: 300 }, [['seating', 0, 0], ...steps(50, 300, 50).map((q) => ['loading', q, q / 60] as [Branch, number, number])]));
    expect(a.procedure.note).toMatch(/^The procedure does not fix which methods apply/);
    expect(a.ultimate.applies && a.subgradeModulus.atSettlement.applies).toBe(true);
  });
});

describe('footings: shape factors and the basis of the allowable pressure', () => {
  // A clay bearing test that plunges at 300 kPa on a 300 mm square plate [calc].
  const clay = (footing: TestRecord['footing']) =>
    record(
      'bearing-cohesive',
      { shape: 'square', sizeMm: 300 },
      [['seating', 0, 0], ...steps(50, 350, 50).map((q) => ['loading', q, q <= 250 ? q / 50 : 5 + (q - 250) / 2] as [Branch, number, number])],
      footing,
    );

  it('a strip footing from a square plate in clay: the factor 1/1.2 is shown and applied (Skempton 1951, s_c = 1 + 0.2·B/L, from memory)', () => {
    const a = analyzeRecord(clay({ shape: 'strip', widthM: 1.2, soilBehaviour: 'cohesive', factorOfSafety: 3, permissibleSettlementMm: 40 }));
    const chosen = result(a.chosenUltimate);
    const f = result(a.footing);
    const u = result(f.ultimate);
    expectRel(u.shape?.factor, 1 / 1.2);
    expectRel(u.qUltKpa, chosen.qUltKpa / 1.2);
    expect(u.formula).toContain('shape factor 0.833');
    expect(u.source).toContain('Skempton (1951)');
    expect(f.basis.statement).toMatch(
      /^Net pressure at founding level \(gross = net \+ γ·D_f = net \+ 0\.0 kPa\); factor of safety 3 on the net ultimate; footing settlement limit 40 mm; settlement scaled by the linear rule for clay from the 300 mm square plate to the 1\.2 m strip footing\./,
    );
  });

  it('the shape factor ratios: square → strip on sand 1/0.6 (De Beer 1970, Vesić 1973: 1 − 0.4·B/L, from memory); same shape gives 1', () => {
    expectRel(shapeCorrection('cohesionless', 0).factor, 1 / 0.6);
    expect(shapeCorrection('cohesive', 1).factor).toBe(1);
    expect(footingUltimatePressure(400, 0.3, 1.5, 'cohesive', 1).qUltKpa).toBe(400);
    const rectangle = result(analyzeRecord(clay({ shape: 'rectangular', widthM: 1.2, soilBehaviour: 'cohesive' })).footing);
    expect(reason(rectangle.ultimate)).toBe('footing.lengthM: a rectangular footing needs its length for the shape factor');
    const withLength = result(analyzeRecord(clay({ shape: 'rectangular', widthM: 1.2, lengthM: 2.4, soilBehaviour: 'cohesive' })).footing);
    expectRel(result(withLength.ultimate).shape?.factor, 1.1 / 1.2); // s_c = 1 + 0.2·0.5 [calc]
  });

  it('scaling invariances (property tests): a footing as wide as the plate settles as the plate; settlement scaling round-trips', () => {
    const random = lcg(7);
    for (let i = 0; i < 100; i++) {
      const bp = 0.2 + random();
      const bf = 0.3 + 5 * random();
      expect(terzaghiPeckSandRatio(bp, bp)).toBeCloseTo(1, 12);
      expect(clayLinearRatio(bp, bp)).toBe(1);
      const s = 0.5 + 20 * random();
      for (const scaling of [{ kind: 'terzaghiPeckSand' }, { kind: 'clayLinear' }, { kind: 'bond', exponentN: 0.3 }] as const) {
        expect(plateSettlementForFooting(footingSettlement(s, bp, bf, scaling).settlementMm, bp, bf, scaling).settlementMm).toBeCloseTo(s, 9);
      }
      // Clay q_ult does not depend on width; sand q_ult scales with it (Das; common practice).
      expect(footingUltimatePressure(300, bp, bf, 'cohesive').qUltKpa).toBe(300);
      expect(footingUltimatePressure(300, bp, bf, 'cohesionless').qUltKpa).toBeCloseTo((300 * bf) / bp, 9);
      const k = 1 + 200 * random();
      expect(pciToMnPerM3(mnPerM3ToPci(k))).toBeCloseTo(k, 9);
    }
  });
});

describe('repeated loading: the per-cycle split and k from the cycle the procedure names', () => {
  // Constructed [calc]: three levels, six applications each; application r of level q settles
  // q/50 + 0.05·(r − 1) + 0.3·level, and each release leaves 40 % of that.
  const { levels, loaded } = REPEATED_LOADING;
  const repeated = repeatedLoadingTest();
  const stages = repeated.stages.map((st) => [st.branch, st.targetKpa, st.readings[0].gauges.g1] as [Branch, number, number]);

  it('splits every cycle into total, rebound and residual deflection', () => {
    const cycles = result(analyzeRecord(repeated).cycles);
    expect(cycles).toHaveLength(18);
    const c = cycles[7]; // level 140, second application
    expect([c.levelKpa, c.application]).toEqual([140, 2]);
    expectRel(c.totalMm, round2(loaded(140, 1, 2)));
    expectRel(c.residualMm, round2(0.4 * loaded(140, 1, 2)));
    expectRel(c.reboundMm, c.totalMm - c.residualMm);
  });

  it('builds the loading curve from the first application of each level, not from all repetitions, and takes k from it', () => {
    const a = analyzeRecord(repeated);
    expect(a.subgradeModulus.application).toBe(1);
    expect(a.firstLoading.map((p) => p.settlementMm)).toEqual([0, ...levels.map((q, level) => round2(loaded(q, level, 1)))]);
    const sixth = analyzeRecord(repeated, { kApplication: 6 });
    expect(sixth.firstLoading.map((p) => p.settlementMm)).toEqual([0, ...levels.map((q, level) => round2(loaded(q, level, 6)))]);
    expect(result(sixth.subgradeModulus.atSettlement).kMnM3).not.toBe(result(a.subgradeModulus.atSettlement).kMnM3);
  });

  it('a single-loading test has no cycles to split, and says why', () => {
    expect(reason(analyzeRecord(record('pavement-single', { shape: 'circular', sizeMm: 762 }, stages)).cycles)).toMatch(/only repeated-loading tests are split cycle by cycle$/);
  });
});

describe('reference values behind the limits', () => {
  it('clay shape factor 1 + 0.2·B/L agrees with N_c of a square and a strip on the surface (Skempton 1951: 6.2 and 5.14, from memory)', () => {
    // Prandtl's strip N_c = π + 2 = 5.14 (closed form); Skempton's chart gives about 6.2 for a square at the surface.
    expectRel(shapeCorrection('cohesive', 1, 0).factor, 6.2 / (Math.PI + 2), 0.01);
  });

  it('sand shape factor 1 − 0.4·B/L: 0.6 for a square, 1 for a strip (Vesić 1973, from memory)', () => {
    expect(shapeCorrection('cohesionless', 1, 0).footingFactor).toBeCloseTo(0.6, 12);
    expect(shapeCorrection('cohesionless', 0, 0).footingFactor).toBe(1);
  });

  it('the ASTM settlement basis of k is 0.05 in = 1.27 mm exactly (1 in = 25.4 mm by definition)', () => {
    expect(result(analyzeRecord(pavementTest(762)).subgradeModulus.atSettlement).settlementMm).toBeCloseTo(0.05 * 25.4, 12);
  });

  it('the Terzaghi & Peck sand ratio tends to 4 for wide footings from a 0.3 m plate (Terzaghi & Peck 1967, common textbook statement)', () => {
    expectRel(terzaghiPeckSandRatio(0.3, 1000), 4, 0.01);
  });
});

describe('undrained shear strength of a clay from the ultimate carried forward (EN 1997-2 K.1: c_u = p_u/6 for a circular plate at the surface)', () => {
  const clayTest = (f: (q: number) => number) =>
    record('bearing-cohesive', { shape: 'circular', sizeMm: 300 }, [['seating', 0, 0], ...steps(50, 350, 50).map((q) => ['loading', q, f(q)] as [Branch, number, number])]);

  it('c_u = q_ult/6 when the test failed, and a lower bound c_u ≥ q_max/6 when it did not', () => {
    const failed = analyzeRecord(clayTest((q) => (q <= 250 ? q / 50 : 5 + (q - 250) / 2)));
    const chosen = result(failed.chosenUltimate);
    expect(chosen.basis).toBe('lowest');
    const cu = result(failed.undrainedStrength);
    expectRel(cu.cuKpa, chosen.qUltKpa / 6);
    expect(cu.lowerBound).toBe(false);
    const carried = result(analyzeRecord(clayTest((q) => q / 50)).undrainedStrength);
    expect(carried.lowerBound).toBe(true);
    expect(carried.statement).toMatch(/^c_u ≥ 58\.3 kPa from q_ult ≥ 350\.0 kPa with N_c = 6/); // 350/6 [calc]
  });

  it('is not given on sand or for a square plate, and says why', () => {
    expect(reason(analyzeRecord(straightLineTo600()).undrainedStrength)).toMatch(/^a clay strength needs a clay/);
    const square = record('bearing-cohesive', { shape: 'square', sizeMm: 300 }, [['seating', 0, 0], ...steps(50, 300, 50).map((q) => ['loading', q, q / 50] as [Branch, number, number])]);
    expect(reason(analyzeRecord(square).undrainedStrength)).toMatch(/circular plate; this plate is square$/);
  });
});
