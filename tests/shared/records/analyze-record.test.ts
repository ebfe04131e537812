import { allowableBearingPressure, settlementAllowable, shearAllowable } from '@shared/interpretation/allowable';
import { analyzeRecord, cautionsFor, type RecordAnalysis, STANDING_CAUTIONS } from '@shared/interpretation/analyze-record';
import { settlementAtPressure } from '@shared/interpretation/curve';
import { checkEvRequirement, deformationModuli, evBranchesFromStages } from '@shared/interpretation/deformation-modulus';
import { rigidPlateModulus } from '@shared/interpretation/elastic';
import { reduceStages, stageSettlementSeries } from '@shared/interpretation/reduction';
import { footingUltimatePressure, scalingWarnings } from '@shared/interpretation/scaling';
import { creepPerLogCycle, hyperbolicTimeFit } from '@shared/interpretation/time-settlement';
import { compareUltimateMethods } from '@shared/interpretation/ultimate';
import { assessUltimate, testExtent } from '@shared/interpretation/ultimate-standing';
import type { Branch } from '@shared/plans/stages';
import { toStageReadings } from '@shared/records/readings';
import type { TestRecord } from '@shared/records/schema';
import { describe, expect, it } from 'vitest';
import { expectNoNonFinite, expectRel, FITTED } from '../interpretation/tolerance';
import { fixtureRecord, reason, result } from './fixtures';
import { weekLongClayRecord } from './synthetic';

/** A record with one reading per stage, straight from load–settlement points. */
function curveRecord(plate: TestRecord['plate'], points: readonly [Branch, number, number][]): TestRecord {
  return {
    format: 'settlescope-record',
    version: 1,
    plate,
    gauges: [{ key: 'g1' }],
    stages: points.map(([branch, q, s], index) => ({ index, branch, targetKpa: q, readings: [{ tMin: 2, pressureKpa: q, gauges: { g1: s } }] })),
  };
}

/** The first loading as the analysis builds it, from the interpretation functions called directly. */
function firstLoadingOf(record: TestRecord, rule = record.plan?.reduction) {
  const points = reduceStages(toStageReadings(record), rule);
  return evBranchesFromStages(points).firstLoading.map(({ pressureKpa, settlementMm }) => ({ pressureKpa, settlementMm }));
}

describe('analyzeRecord on the sand bearing test (450 mm square plate, footing 1.5 m)', () => {
  const record = fixtureRecord('sand-bearing-450-square.json');
  const analysis = analyzeRecord(record);
  const curve = firstLoadingOf(record);

  it('reduces each stage to its end-of-hold point and takes the seating point and the loading stages as the first loading', () => {
    expect(analysis.reduction.points).toEqual(reduceStages(toStageReadings(record)));
    expect(analysis.firstLoading).toEqual(curve);
    expect(curve).toHaveLength(7);
  });

  it('fits the measured stages only (the seating point is the origin), and carries q_ult ≥ q_max to the footing as the test did not fail', () => {
    const [origin, ...measured] = curve;
    const extent = testExtent(measured, origin, 45);
    const direct = compareUltimateMethods(measured, 450, { origin }).map((r) => assessUltimate(r, extent));
    expect(result(analysis.ultimate)).toEqual(direct);
    expect(result(analysis.extent)).toEqual(extent);
    expect(extent.failure.reached).toBe(false); // 23.9 mm of the 45 mm criterion (10 % of 450 mm, common practice)
    // No break stands out from 0.01 mm reading noise on six points; the hyperbola lies beyond 600 kPa.
    expect(direct.filter((r) => r.standing === 'ultimate')).toEqual([]);
    expect(direct.find((r) => r.method === 'hyperbolic')?.standing).toBe('extrapolated');
    const chosen = result(analysis.chosenUltimate);
    expect(chosen).toMatchObject({ method: null, basis: 'lowerBound', qUltKpa: 600, qOverQmax: 1 });
    expect(chosen.statement).toMatch(/^Failure not reached: q_ult ≥ 600\.0 kPa, the largest pressure carried/);
  });

  it('scales to the footing with the scaling, shear and settlement functions called directly', () => {
    const footing = result(analysis.footing);
    const chosen = result(analysis.chosenUltimate);
    const scaledUltimate = footingUltimatePressure(chosen.qUltKpa, 0.45, 1.5, 'cohesionless', 1);
    expect(result(footing.ultimate)).toEqual({ ...scaledUltimate, fromMethod: null, lowerBound: true });
    expect(scaledUltimate.shape?.factor).toBe(1); // square plate to square footing: no shape change
    const shear = shearAllowable({ qUltFootingKpa: scaledUltimate.qUltKpa, factorOfSafety: 3, unitWeightKnM3: 18, foundationDepthM: 1 });
    expect(result(footing.shear)).toEqual(shear);
    const settlement = settlementAllowable({
      curve,
      plateWidthM: 0.45,
      footingWidthM: 1.5,
      scaling: { kind: 'terzaghiPeckSand' },
      permissibleSettlementMm: 25,
    });
    expect(result(footing.settlement)).toEqual(settlement);
    expect(result(footing.allowable)).toEqual(allowableBearingPressure(shear, settlement));
    expect(analysis.scalingWarnings).toEqual(
      scalingWarnings({
        soil: 'cohesionless',
        plateWidthM: 0.45,
        footingWidthM: 1.5,
        scaling: { kind: 'terzaghiPeckSand' },
        scalesUltimate: true,
        waterTableBelowTestM: 4.5,
      }),
    );
  });

  it('shows no k on a bearing test, saying why, and gives E from the 0.3–0.7 secant of the first loading', () => {
    expect(reason(analysis.subgradeModulus.atSettlement)).toMatch(/^not shown for this procedure \(Bearing test.*\): k is read on pavement and modulus tests/);
    expect(reason(analysis.subgradeModulus.atPressure)).toBe(reason(analysis.subgradeModulus.atSettlement));
    const e = result(analysis.elasticModulus);
    const [from, to] = [0.3 * 600, 0.7 * 600];
    const direct = rigidPlateModulus({
      plate: record.plate,
      deltaPressureKpa: to - from,
      deltaSettlementMm: (settlementAtPressure(curve, to) as number) - (settlementAtPressure(curve, from) as number),
      poisson: 0.3,
    });
    expect(e.eMpa).toBeCloseTo(direct.eMpa, 10);
    expect([e.fromKpa, e.toKpa, e.poisson]).toEqual([from, to, 0.3]);
  });

  it('gives the unload–reload modulus from the first unloading, 600 to 0 kPa (EN 1997-2 K.2 rigid-plate formula)', () => {
    const points = analysis.reduction.points;
    const [top, bottom] = [points[6], points[8]];
    const direct = rigidPlateModulus({
      plate: record.plate,
      deltaPressureKpa: top.pressureKpa - bottom.pressureKpa,
      deltaSettlementMm: top.settlementMm - bottom.settlementMm,
      poisson: 0.3,
    });
    const eur = result(analysis.unloadReloadModulus);
    expect(eur.eMpa).toBeCloseTo(direct.eMpa, 10);
    expect([eur.toKpa, eur.fromKpa]).toEqual([top.pressureKpa, bottom.pressureKpa]);
    expect(eur.eMpa).toBeGreaterThan(result(analysis.elasticModulus).eMpa); // stiffer on unloading than on first loading
  });

  it('says why Ev is not shown on a bearing test, and why not on a square plate', () => {
    expect(reason(analysis.deformationModuli)).toMatch(/: Ev1 and Ev2 need the two-cycle deformation-modulus procedure$/);
    const unnamed = { ...record, plan: undefined };
    expect(reason(analyzeRecord(unnamed).deformationModuli)).toBe('Ev (DIN 18134) is defined for a circular plate');
  });

  it('evaluates creep over the last log cycle and the hyperbolic time fit of every loading stage', () => {
    expect(analysis.timeSettlement.map((t) => t.index)).toEqual([1, 2, 3, 4, 5, 6]);
    const last = analysis.timeSettlement[5];
    const series = stageSettlementSeries(toStageReadings(record)[6]);
    expect(result(last.creep)).toEqual(creepPerLogCycle(series, 9, 90));
    expect(result(last.hyperbolicFit)).toEqual(hyperbolicTimeFit(series));
    for (const t of analysis.timeSettlement) expect(result(t.creep).ksMm).toBeGreaterThan(0);
  });

  it('includes the standing cautions, and every figure keeps its formula and source', () => {
    expect(analysis.cautions.map((c) => c.code)).toEqual(STANDING_CAUTIONS.map((c) => c.code));
    expect(analysis.cautions).toEqual(cautionsFor(record.plate, record.footing));
    // Common practice: the pressure bulb reaches about two widths, the footing's own, not the plate's.
    expect(analysis.cautions.find((c) => c.code === 'deeper_soil')?.message).toBe(
      'The 1.5 m footing stresses the soil to about 3.00 m below its base (two footing widths), the 450 mm plate only to about 0.90 m below the test level (two plate widths): a weaker layer between those depths does not show in this test.',
    );
    const footing = result(analysis.footing);
    const figures = [
      ...result(analysis.ultimate),
      result(analysis.chosenUltimate),
      result(footing.ultimate),
      result(footing.shear),
      result(footing.settlement),
      result(analysis.elasticModulus),
      ...analysis.timeSettlement.flatMap((t) => [result(t.creep), result(t.hyperbolicFit)]),
      analysis.reduction,
    ];
    for (const figure of figures) {
      expect(figure.formula.length).toBeGreaterThan(5);
      expect(figure.source.length).toBeGreaterThan(5);
    }
    expectNoNonFinite(analysis);
  });

  it('lets the engineer choose the method carried to the footing', () => {
    const chosen = result(analyzeRecord(record, { ultimateMethod: 'hyperbolic' }).chosenUltimate);
    expect(chosen).toMatchObject({ basis: 'engineer', standing: 'extrapolated' });
    expect(chosen.qUltKpa).toBe(compareUltimateMethods(curve.slice(1), 450, { origin: curve[0] })[2].qUltKpa);
    expect(chosen.statement).toMatch(/an extrapolated value, taken as the engineer chose\.$/);
    expect(reason(analyzeRecord(record, { ultimateMethod: 'settlementCriterion' }).chosenUltimate)).toMatch(
      /^Settlement criterion \(10 % of width\): not reached/,
    );
  });
});

describe('analyzeRecord on the two-cycle modulus test (300 mm circular plate)', () => {
  const record = fixtureRecord('modulus-two-cycle-300.json');
  const analysis = analyzeRecord(record);

  it('reads each stage at 2 min as the record asks, and gives Ev1, Ev2 as deformationModuli does', () => {
    expect(analysis.reduction.rule).toEqual({ kind: 'atTime', minutes: 2 });
    const points = reduceStages(toStageReadings(record), { kind: 'atTime', minutes: 2 });
    const { firstLoading, secondLoading } = evBranchesFromStages(points);
    const strip = (ps: typeof points) => ps.map(({ pressureKpa, settlementMm }) => ({ pressureKpa, settlementMm }));
    const direct = deformationModuli({ firstLoading: strip(firstLoading), secondLoading: strip(secondLoading ?? []), plateDiameterMm: 300 });
    const moduli = result(analysis.deformationModuli);
    expect(moduli).toEqual({ ...direct, statement: expect.any(String) });
    expect(moduli.statement).toBe('300 mm circular plate; σ0max of the first loading for Ev1 and Ev2 (σ0max = 500 kPa); stages read 2 min after each target was reached.');
    expect(moduli.ev1.evMnM2).toBeGreaterThan(0);
    expect(moduli.ratio).toBeGreaterThan(1);
  });

  it('checks Ev2 and Ev2/Ev1 against the requirement the engineer enters, and asks for one otherwise', () => {
    const requirement = { name: 'contract', minEv2MnM2: 45, maxRatio: 2.2 }; // invented contract values
    const checked = analyzeRecord(record, { evRequirement: requirement });
    expect(result(checked.evAcceptance)).toEqual(checkEvRequirement(result(checked.deformationModuli), requirement));
    expect(reason(analysis.evAcceptance)).toMatch(/^no requirement entered/);
  });

  it('shows no bearing methods on a modulus test, and says why', () => {
    for (const finding of [analysis.footing, analysis.ultimate, analysis.chosenUltimate]) expect(reason(finding)).toMatch(/^not shown for this procedure \(Deformation modulus.*\): this procedure does not load the plate towards failure/);
    expect(analysis.scalingWarnings).toEqual([]);
  });
});

describe('analyzeRecord against the reference §C check values, through a record', () => {
  it('Ev1 = 60.025, Ev2 = 134.877 MN/m², ratio 2.2470 (reference §C8, constructed from the DIN 18134 formula [calc])', () => {
    const record = curveRecord({ shape: 'circular', sizeMm: 300 }, [
      ['seating', 0, 0],
      ...[80, 160, 240, 320, 400, 500].map((q, i) => ['loading', q, [0.39, 0.73, 1.06, 1.35, 1.59, 1.88][i]] as [Branch, number, number]),
      ['unloading', 250, 1.82],
      ['unloading', 125, 1.72],
      ['unloading', 0, 1.45],
      ...[80, 160, 240, 320, 400].map((q, i) => ['reloading', q, [1.62, 1.77, 1.92, 2.04, 2.16][i]] as [Branch, number, number]),
    ]);
    const moduli = result(analyzeRecord(record).deformationModuli);
    expectRel(moduli.ev1.evMnM2, 60.025, FITTED);
    expectRel(moduli.ev2?.evMnM2, 134.877, FITTED);
    expectRel(moduli.ratio, 2.247, FITTED);
  });

  it('k = 57.684 MN/m³ = 212.51 pci at 1.25 mm on a 762 mm plate (reference §C7 [calc])', () => {
    const settlements = [0.32, 0.66, 1.02, 1.4, 1.82];
    const record = curveRecord({ shape: 'circular', sizeMm: 762 }, [
      ['seating', 0, 0],
      ...[20, 40, 60, 80, 100].map((q, i) => ['loading', q, settlements[i]] as [Branch, number, number]),
    ]);
    const k = result(analyzeRecord(record).subgradeModulus.atSettlement);
    expectRel(k.kMnM3, 57.684);
    expectRel(k.kPci, 212.51);
  });

  it('log–log intersection at q = 300 kPa, s = 6 mm (reference §C5 [calc])', () => {
    const qs = [50, 100, 150, 200, 250, 300, 350, 400, 450];
    const ss = [1, 2, 3, 4, 5, 6, 11.1157, 18.963, 30.375];
    const record = curveRecord(
      { shape: 'square', sizeMm: 300 },
      qs.map((q, i) => ['loading', q, ss[i]]),
    );
    const logLog = result(analyzeRecord(record).ultimate).find((r) => r.method === 'logLogIntersection');
    expectRel(logLog?.qUltKpa, 300, FITTED);
    expectRel(logLog?.sUltMm, 6, FITTED);
  });

  it('hyperbolic q_ult = 500 kPa; 10 % of a 300 mm plate: 428.571 kPa on the hyperbola, 427.773 kPa by interpolation (reference §C6 [calc])', () => {
    const ss = [1, 2, 4, 6, 8, 12, 16, 20, 24, 32];
    const qs = [83.333, 142.857, 222.222, 272.727, 307.692, 352.941, 380.952, 400, 413.793, 432.432];
    const record = curveRecord(
      { shape: 'circular', sizeMm: 300 },
      qs.map((q, i) => ['loading', q, ss[i]]),
    );
    const methods = result(analyzeRecord(record).ultimate);
    const hyperbolic = methods.find((r) => r.method === 'hyperbolic');
    expectRel(hyperbolic?.qUltKpa, 500, FITTED);
    expectRel(methods.find((r) => r.method === 'settlementCriterion')?.qUltKpa, 427.773, FITTED);
  });
});

describe('methods that do not apply come back with a reason, never a throw', () => {
  it('a record with no loading stage', () => {
    const record = curveRecord({ shape: 'circular', sizeMm: 300 }, [['seating', 10, 0]]);
    record.footing = { shape: 'square', widthM: 2, soilBehaviour: 'cohesive' };
    const analysis = analyzeRecord(record);
    for (const finding of [
      analysis.ultimate,
      analysis.chosenUltimate,
      analysis.subgradeModulus.atSettlement,
      analysis.elasticModulus,
      analysis.deformationModuli,
    ]) {
      expect(reason(finding)).toBe('the record has no loading stages');
    }
    const footing = result(analysis.footing);
    for (const finding of [footing.ultimate, footing.shear, footing.settlement, footing.allowable])
      expect(reason(finding)).toBe('the record has no loading stages');
    expect(analysis.timeSettlement).toEqual([]);
  });

  it('a reading time the stages do not reach, pressures that fall, a stage without a reading at t = 0', () => {
    const record = curveRecord({ shape: 'square', sizeMm: 450 }, [
      ['loading', 100, 1],
      ['loading', 200, 2.5],
      ['loading', 150, 3],
    ]);
    expect(reason(analyzeRecord(record, { reduction: { kind: 'atTime', minutes: 1 } }).ultimate)).toBe(
      "no stage points: rule.minutes: the stage's first reading is at 2 min, after 1 min",
    );
    const analysis = analyzeRecord(record);
    // A loading stage below an earlier one is a reload: the first loading keeps the rising stages only.
    expect(analysis.firstLoading.map((p) => p.pressureKpa)).toEqual([0, 100, 200]);
    expect(reason(analysis.timeSettlement[0].hyperbolicFit)).toBe(
      'no reading at t = 0 (when the target was reached): the stage’s starting settlement is unknown',
    );
    expect(reason(analysis.timeSettlement[0].creep)).toBe('the readings span no time after t = 0');
  });

  it('Ev on a circular plate without a second loading', () => {
    const record = curveRecord({ shape: 'circular', sizeMm: 300 }, [
      ['loading', 100, 0.5],
      ['loading', 200, 1.1],
      ['loading', 300, 1.8],
    ]);
    expect(reason(analyzeRecord(record).deformationModuli)).toBe('needs a reloading branch after the first loading (a two-cycle test)');
  });
});

describe('a week-long record (~10,000 readings)', () => {
  const record = weekLongClayRecord();
  let analysis: RecordAnalysis;

  it('is analysed whole: every 24-hour hold gets its creep and time fit, the clay footing its warnings', () => {
    analysis = analyzeRecord(record);
    expect(analysis.summary.readings).toBe(10_092);
    expect(analysis.timeSettlement).toHaveLength(7);
    for (const stage of analysis.timeSettlement) {
      expect(stage.readings).toBe(1441);
      expect(result(stage.creep).ksMm).toBeGreaterThan(0);
      expect(result(stage.hyperbolicFit).percentOfUltimate).toBeGreaterThan(50);
    }
    expect(result(analysis.footing).scaling).toEqual({ kind: 'clayLinear' });
    expect(analysis.scalingWarnings.map((w) => w.code)).toContain('clay_long_term');
    expect(result(analysis.elasticModulus).poisson).toBe(0.5);
    expectNoNonFinite(analysis);
  });
});
