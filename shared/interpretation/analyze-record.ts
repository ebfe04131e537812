import type { Plate } from '../domain/plate';
import { toStageReadings } from '../records/readings';
import type { RecordFooting, TestRecord } from '../records/schema';
import {
  type AllowableBearingPressure,
  allowableBearingPressure,
  designFootingWidth,
  type FootingWidth,
  type SettlementAllowable,
  type ShearAllowable,
  settlementAllowable,
  shearAllowable,
} from './allowable';
import { type CurvePoint, checkLoadingCurve, settlementAtPressure } from './curve';
import {
  checkEvRequirement,
  type DeformationModuli,
  deformationModuli,
  type EvAcceptance,
  type EvRequirement,
  evBranchesFromStages,
  type Sigma0MaxConvention,
} from './deformation-modulus';
import { type ElasticModulus, rigidPlateModulus } from './elastic';
import { type ClayStrengthResult, undrainedShearStrength } from './clay-strength';
import { InterpretationInputError, requireInRange } from './input-checks';
import { type MethodGroup, type ProcedureReading, procedureReading } from './procedure-methods';
import { type ReductionRule, reduceStages, type StagePoint, type StageReadings, stageSettlementSeries } from './reduction';
import {
  breadthOverLength,
  footingUltimatePressure,
  type ScalingWarning,
  type SettlementScaling,
  type ShapeCorrection,
  scalingName,
  scalingWarnings,
} from './scaling';
import { type CbrEstimate, type CorrectedModulus, cbrFromK762, FIXED_PRESSURE_KPA, kForStandardPlate, saturationCorrection, kLabel, type StandardPlateK, type SubgradeModulus, subgradeModulusAtPressure, subgradeModulusAtSettlement } from './subgrade';
import { type CreepCoefficient, type CycleSplit, creepPerLogCycle, cyclicSplit, type HyperbolicTimeFit, hyperbolicTimeFit } from './time-settlement';
import { type CompareUltimateOptions, compareUltimateMethods, criterionSettlementMm, type UltimateMethod } from './ultimate';
import { type AssessedUltimate, assessUltimate, type ChosenUltimate, chooseUltimate, type TestExtent, testExtent, type UltimateChoice } from './ultimate-standing';

export type { ChosenUltimate } from './ultimate-standing';

/** A method's result, or why it does not apply to this record. */
export type Finding<T> = { applies: true; result: T } | { applies: false; reason: string };

/** A caution shown beside the results. */
export interface Caution {
  code: string;
  message: string;
}

/** Options of {@link analyzeRecord}. */
export interface AnalyzeRecordOptions {
  /** Which reading stands for each stage. Default: the record's `plan.reduction`, else the procedure's rule (2 min for the modulus test), else the end of each hold. */
  reduction?: ReductionRule;
  /** Options of the ultimate-pressure methods (log–log split, tangent points, settlement criterion, reading resolution). Default: each method's own. */
  ultimate?: CompareUltimateOptions;
  /** The method whose ultimate pressure is scaled to the footing, or the largest pressure carried. Default: the lowest that stands as an ultimate within the test, else q_ult ≥ q_max. */
  ultimateMethod?: UltimateChoice;
  /** Footing settlement scaling. Default: Terzaghi & Peck's sand rule for cohesionless soil, the linear rule for cohesive soil. */
  scaling?: SettlementScaling;
  /** Poisson's ratio for the elastic modulus. Default 0.5 when the footing's soil is cohesive, else 0.3 (EN 1997-2 Annex K.2). */
  poisson?: number;
  /** Secant range of the elastic modulus, as fractions of the first loading's largest pressure. Default [0.3, 0.7]. */
  elasticRange?: readonly [number, number];
  /** σ0max convention of Ev2. Default 'firstLoadingMax'. */
  evConvention?: Sigma0MaxConvention;
  /** Creep window [from, to], minutes since the stage's target was reached. Default: the last log cycle of each hold. */
  creepWindowMin?: readonly [number, number];
  /** Which application of each load level makes the loading curve and k (repeated-loading tests). Default: the procedure's (1, the first). */
  kApplication?: number;
  /** Settlement at which k is read, mm. Default: the procedure's basis (1.27 mm = 0.05 in for the ASTM pavement family, else 1.25 mm). */
  kSettlementMm?: number;
  /** Column load on a square footing, kN: when given, the footing width that keeps the settlement within the limit. */
  columnLoadKn?: number;
  /** Deformations of unsoaked and soaked consolidometer specimens under the test pressure, mm: k corrected to soaked conditions (US Army Corps CRD-C 655). */
  soakedSpecimens?: { unsoakedMm: number; soakedMm: number };
  /** The contract's Ev requirement: when given, Ev2 and Ev2/Ev1 are checked against it. */
  evRequirement?: EvRequirement;
}

/** The origin of the load–settlement curve: the seating point, where the gauges were zeroed. */
export interface ZeroCorrection {
  origin: CurvePoint;
  /** True when the record has a seating stage; false when the origin is taken from the plan or as q = 0. */
  fromSeatingStage: boolean;
  /** One sentence every view prints. */
  statement: string;
  /** The bedding correction an engineer may deduct (shown, never applied); null when the start of the curve shows no bedding. */
  bedding: BeddingCorrection | null;
}

/** A bedding correction: where the straight line through the first stages meets the origin's pressure. */
export interface BeddingCorrection {
  /** Settlement at the origin's pressure on the line through the first two loading stages, mm (> 0: bedding). */
  interceptMm: number;
  statement: string;
  formula: string;
  source: string;
}

/** Scaling of the plate results to the record's footing (reference §B.3, §B.4). */
export interface FootingAnalysis {
  footing: RecordFooting;
  plateWidthM: number;
  plateLabel: string;
  scaling: SettlementScaling;
  scalingName: string;
  ultimate: Finding<{ qUltKpa: number; fromMethod: UltimateMethod | null; lowerBound: boolean; shape: ShapeCorrection | null; formula: string; source: string }>;
  shear: Finding<ShearAllowable>;
  settlement: Finding<SettlementAllowable>;
  allowable: Finding<AllowableBearingPressure>;
  /** What the allowable pressure is and rests on: net or gross, factor of safety, settlement limit, scaling rule, plate. */
  basis: { pressure: 'net'; factorOfSafety: number; permissibleSettlementMm: number; statement: string };
  /** Square footing width for the column load of the options; null when none was given. */
  widthForColumnLoad: Finding<FootingWidth & { columnLoadKn: number }> | null;
}

/** Young's modulus from the first loading's secant, with the range it used. */
export interface SecantElasticModulus extends ElasticModulus {
  poisson: number;
  fromKpa: number;
  toKpa: number;
  fromMm: number;
  toMm: number;
}

/** k labelled with the plate it was measured on. */
export type LabelledModulus = SubgradeModulus & { label: string };

/** k of the plate used, and its 750/762 mm plate value where one is measured or named. */
export interface SubgradeAnalysis {
  plateMm: number;
  /** Which application of each load level the curve takes (1 = the first). */
  application: number;
  /** The settlement basis and the convention that fixes it. */
  settlementBasis: string;
  atSettlement: Finding<LabelledModulus>;
  atPressure: Finding<LabelledModulus>;
  standardPlate: Finding<Exclude<StandardPlateK, { kind: 'none' }>>;
  /** CBR estimated from the 750/762 mm plate's k (a correlation, information only). */
  cbrEstimate: Finding<CbrEstimate>;
  /** k of the plate used corrected to soaked conditions from consolidometer deformations, when they are given. */
  soaked: Finding<CorrectedModulus> | null;
}

/** Deformation moduli with what they depend on stated. */
export type StatedModuli = DeformationModuli & { statement: string };

/** One load–release cycle of a repeated-loading test. */
export interface LoadCycle extends CycleSplit {
  levelKpa: number;
  /** 1-based application of this load level. */
  application: number;
  loadStage: number;
  releaseStage: number;
}

/** Time–settlement evaluation of one loading or reloading stage (reference §B.8). */
export interface StageTimeSettlement {
  index: number;
  branch: StagePoint['branch'];
  targetKpa: number;
  readings: number;
  lastTMin: number;
  creep: Finding<CreepCoefficient>;
  hyperbolicFit: Finding<HyperbolicTimeFit>;
}

/** The version of the analysis's shape; saved analyses without it are of the first shape. */
export const ANALYSIS_VERSION = 2;

/** Everything Settlescope can say about one test record. */
export interface RecordAnalysis {
  analysisVersion: typeof ANALYSIS_VERSION;
  summary: {
    metadata: NonNullable<TestRecord['metadata']>;
    procedureId: string | null;
    plate: Plate;
    gauges: string[];
    stages: number;
    readings: number;
  };
  /** How the procedure is read: which methods are shown and why the others are not. */
  procedure: ProcedureReading;
  reduction: { rule: ReductionRule; points: StagePoint[]; formula: string; source: string };
  zeroCorrection: ZeroCorrection;
  /** The corrected first loading: the origin, then the loading stages (one application per level); the curve every method reads. */
  firstLoading: CurvePoint[];
  /** The extent of the test (largest pressure and settlement) and its failure signs. */
  extent: Finding<TestExtent>;
  ultimate: Finding<AssessedUltimate[]>;
  chosenUltimate: Finding<ChosenUltimate>;
  footing: Finding<FootingAnalysis>;
  subgradeModulus: SubgradeAnalysis;
  deformationModuli: Finding<StatedModuli>;
  /** Ev2 and Ev2/Ev1 against the contract's requirement entered by the engineer. */
  evAcceptance: Finding<EvAcceptance>;
  elasticModulus: Finding<SecantElasticModulus>;
  /** Undrained shear strength of a clay from the ultimate carried forward (circular plate at the surface); a lower bound when q_ult ≥ q_max is carried. */
  undrainedStrength: Finding<ClayStrengthResult & { lowerBound: boolean; statement: string }>;
  /** E on unloading (bearing tests): the soil's stiffness on reloading. */
  unloadReloadModulus: Finding<SecantElasticModulus>;
  cycles: Finding<LoadCycle[]>;
  timeSettlement: StageTimeSettlement[];
  scalingWarnings: ScalingWarning[];
  cautions: Caution[];
}

const DEEPER_SOIL_GENERAL =
  'A footing stresses the soil to about two footing widths below its base, the plate only to about two plate widths: a weaker layer below the plate’s reach does not show in this test.';

/** The cautions that stand beside every result; `deeper_soil` is stated with the test's own depths by {@link cautionsFor}. */
export const STANDING_CAUTIONS: readonly Caution[] = [
  { code: 'one_spot', message: 'The results describe the soil under one plate, at one spot and one depth; the ground elsewhere on the site may differ.' },
  { code: 'deeper_soil', message: DEEPER_SOIL_GENERAL },
  {
    code: 'clay_long_term',
    message: 'On clay, long-term consolidation settlement is not captured by a 24-hour hold; estimate it from laboratory consolidation tests.',
  },
  {
    code: 'rig_hazards',
    message:
      'The hydraulic system and the reaction load (kentledge, anchors, vehicle) are hazards: keep clear of a loaded column and check the reaction before each test.',
  },
  { code: 'judgement', message: 'Apply these figures under the local codes and the judgement of a licensed geotechnical engineer.' },
];

const m2 = (x: number) => x.toFixed(2);

/** The standing cautions with the depth caution worked out for this plate and footing (about 2 B below each). */
export function cautionsFor(plate: Plate, footing: RecordFooting | undefined): Caution[] {
  const bp = plate.sizeMm / 1000;
  const plateText = `the ${plate.sizeMm} mm plate only to about ${m2(2 * bp)} m below the test level (two plate widths)`;
  const message = footing
    ? `The ${footing.widthM} m footing stresses the soil to about ${m2(2 * footing.widthM)} m below its base (two footing widths), ${plateText}: a weaker layer between those depths does not show in this test.`
    : `A footing stresses the soil to about two footing widths below its base, ${plateText}: a weaker layer below the plate’s reach does not show in this test.`;
  return STANDING_CAUTIONS.map((c) => (c.code === 'deeper_soil' ? { code: c.code, message } : c));
}

const notApplicable = (reason: string): { applies: false; reason: string } => ({ applies: false, reason });

/** Runs a method; input it cannot use becomes a reason instead of a throw. */
function attempt<T>(method: () => T): Finding<T> {
  try {
    return { applies: true, result: method() };
  } catch (error) {
    if (error instanceof InterpretationInputError) return notApplicable(error.message);
    throw error;
  }
}

const f1 = (x: number) => x.toFixed(1);

/**
 * The zero (seating) correction, common practice: the gauges are zeroed at the seating pressure, so the
 * seating point is the curve's origin, not a measurement. Without a seating stage the origin is the plan's
 * seating pressure (or q = 0) at s = 0, taken as the zero reading.
 */
export function zeroCorrection(points: readonly StagePoint[], planSeatingKpa: number | undefined): ZeroCorrection {
  const seating = points.filter((p) => p.branch === 'seating').at(-1);
  const tail = 'It is no measurement: no fit uses it; readings between it and the first stage are interpolated from it.';
  if (seating) {
    const origin = { pressureKpa: seating.pressureKpa, settlementMm: seating.settlementMm };
    return {
      origin,
      bedding: null,
      fromSeatingStage: true,
      statement: `Origin of the curve: the end of the seating stage, q = ${f1(origin.pressureKpa)} kPa, s = ${origin.settlementMm.toFixed(2)} mm (the gauges are zeroed at the seating pressure). ${tail}`,
    };
  }
  const firstLoad = points.find((p) => p.branch !== 'seating')?.pressureKpa ?? 0;
  const q0 = planSeatingKpa !== undefined && planSeatingKpa < firstLoad ? planSeatingKpa : 0;
  return {
    origin: { pressureKpa: q0, settlementMm: 0 },
    bedding: null,
    fromSeatingStage: false,
    statement: `The record has no seating stage: the curve starts from q = ${f1(q0)} kPa, s = 0 (${q0 > 0 ? 'the plan’s seating pressure' : 'no load'}), taken as the zero reading. ${tail}`,
  };
}

/** Smallest intercept shown as bedding: about three times the 0.01 mm reading resolution. */
const BEDDING_SHOWN_MM = 0.03;

/**
 * Bedding correction (common practice, shown, not applied): the line through the first two loading stages,
 * extended back to the origin's pressure; a positive settlement there is taken up by the plate bedding in
 * rather than by the soil. Null with fewer than two stages or an intercept below {@link BEDDING_SHOWN_MM}.
 */
export function beddingCorrection(measured: readonly CurvePoint[], origin: CurvePoint): BeddingCorrection | null {
  if (measured.length < 2) return null;
  const [p1, p2] = measured;
  const slope = (p2.settlementMm - p1.settlementMm) / (p2.pressureKpa - p1.pressureKpa);
  const interceptMm = p1.settlementMm - slope * (p1.pressureKpa - origin.pressureKpa) - origin.settlementMm;
  if (!(interceptMm >= BEDDING_SHOWN_MM)) return null;
  return {
    interceptMm,
    statement: `Bedding: the line through the first two loading stages meets the origin’s pressure at s = ${interceptMm.toFixed(2)} mm; an engineer may deduct it as plate bedding (not applied to any figure here).`,
    formula: 's_bed = s1 − (s2 − s1)/(q2 − q1)·(q1 − q0) − s0',
    source: 'Common practice: extend the straight early part of the curve back to the starting pressure',
  };
}

/**
 * The loading curve of one application per load level: the `application`-th loading stage at each target,
 * in test order, keeping only pressures above every earlier one (a repeated or re-approached level appears once).
 */
export function loadingEnvelope(points: readonly StagePoint[], targets: ReadonlyMap<number, number>, application = 1): StagePoint[] {
  const seen = new Map<number, number>();
  const out: StagePoint[] = [];
  for (const p of points) {
    if (p.branch !== 'loading') continue;
    const level = targets.get(p.index) ?? p.pressureKpa;
    const n = (seen.get(level) ?? 0) + 1;
    seen.set(level, n);
    if (n === application && (out.length === 0 || p.pressureKpa > out[out.length - 1].pressureKpa)) out.push(p);
  }
  return out;
}

/**
 * The load–release cycles of a repeated-loading test (reference §B.9; ASTM D1195 terms): each loading stage
 * followed by a release, split into total, rebound and residual deflection from the curve's origin.
 * Throws when no load level is applied more than once.
 */
export function repeatedCycles(points: readonly StagePoint[], targets: ReadonlyMap<number, number>, origin: CurvePoint): LoadCycle[] {
  const pairs: { level: number; load: StagePoint; release: StagePoint }[] = [];
  points.forEach((p, i) => {
    const next = points[i + 1];
    if (p.branch === 'loading' && next?.branch === 'unloading') pairs.push({ level: targets.get(p.index) ?? p.pressureKpa, load: p, release: next });
  });
  const counts = new Map<number, number>();
  for (const pair of pairs) counts.set(pair.level, (counts.get(pair.level) ?? 0) + 1);
  if (![...counts.values()].some((n) => n > 1)) throw new InterpretationInputError('stages', 'no load level is applied and released more than once');
  const splits = cyclicSplit(
    pairs.map((p) => ({ loadedMm: p.load.settlementMm, releasedMm: p.release.settlementMm })),
    origin.settlementMm,
  );
  const seen = new Map<number, number>();
  return pairs.map((pair, i) => {
    const application = (seen.get(pair.level) ?? 0) + 1;
    seen.set(pair.level, application);
    return { ...splits[i], levelKpa: pair.level, application, loadStage: pair.load.index, releaseStage: pair.release.index };
  });
}

function defaultScaling(footing: RecordFooting): SettlementScaling {
  return footing.soilBehaviour === 'cohesive' ? { kind: 'clayLinear' } : { kind: 'terzaghiPeckSand' };
}

function plateName(plate: Plate): string {
  return `${plate.sizeMm} mm ${plate.shape} plate`;
}

interface CorrectedCurve {
  /** The measured loading points (no origin): what fits use. */
  measured: readonly CurvePoint[];
  /** Origin then measured points: what interpolation reads. */
  withOrigin: readonly CurvePoint[];
  problem: string | null;
}

function analyzeFooting(
  footing: RecordFooting,
  plate: Plate,
  curve: CorrectedCurve,
  chosen: Finding<ChosenUltimate>,
  scaling: SettlementScaling,
  columnLoadKn: number | undefined,
): FootingAnalysis {
  const plateWidthM = plate.sizeMm / 1000;
  const ultimate: FootingAnalysis['ultimate'] = chosen.applies
    ? attempt(() => {
        const bOverL = breadthOverLength(footing.shape, footing.widthM, footing.lengthM);
        return {
          ...footingUltimatePressure(chosen.result.qUltKpa, plateWidthM, footing.widthM, footing.soilBehaviour, bOverL),
          fromMethod: chosen.result.method,
          lowerBound: chosen.result.basis === 'lowerBound',
        };
      })
    : notApplicable(chosen.reason);
  const shear: Finding<ShearAllowable> = ultimate.applies
    ? attempt(() =>
        shearAllowable({
          qUltFootingKpa: ultimate.result.qUltKpa,
          factorOfSafety: footing.factorOfSafety,
          unitWeightKnM3: footing.unitWeightKnM3,
          foundationDepthM: footing.foundationDepthM,
        }),
      )
    : notApplicable(ultimate.reason);
  const permissibleSettlementMm = footing.permissibleSettlementMm ?? 25;
  const settlement: Finding<SettlementAllowable> =
    curve.problem === null
      ? attempt(() => settlementAllowable({ curve: curve.withOrigin, plateWidthM, footingWidthM: footing.widthM, scaling, permissibleSettlementMm }))
      : notApplicable(curve.problem);
  const allowable: Finding<AllowableBearingPressure> = !shear.applies
    ? notApplicable(shear.reason)
    : !settlement.applies
      ? notApplicable(settlement.reason)
      : attempt(() => allowableBearingPressure(shear.result, settlement.result));
  const factorOfSafety = footing.factorOfSafety ?? 3;
  const overburden = (footing.unitWeightKnM3 ?? 0) * (footing.foundationDepthM ?? 0);
  const lowerBound = ultimate.applies && ultimate.result.lowerBound ? ' The shear check rests on the lower bound q_ult ≥ q_max, so it is on the safe side.' : '';
  const statement =
    `Net pressure at founding level (gross = net + γ·D_f = net + ${f1(overburden)} kPa); factor of safety ${factorOfSafety} on the net ultimate; ` +
    `footing settlement limit ${permissibleSettlementMm} mm; settlement scaled by ${scalingName(scaling)} from the ${plateName(plate)} to the ${footing.widthM} m ${footing.shape} footing.${lowerBound}`;
  const widthForColumnLoad =
    columnLoadKn === undefined
      ? null
      : curve.problem !== null
        ? notApplicable(curve.problem)
        : attempt(() => ({
            ...designFootingWidth({ columnLoadKn, curve: curve.withOrigin, plateWidthM, scaling, permissibleSettlementMm }),
            columnLoadKn,
          }));
  return {
    footing,
    plateWidthM,
    plateLabel: plateName(plate),
    scaling,
    scalingName: scalingName(scaling),
    ultimate,
    shear,
    settlement,
    allowable,
    basis: { pressure: 'net', factorOfSafety, permissibleSettlementMm, statement },
    widthForColumnLoad,
  };
}

/** E from the secant of the first loading between two fractions of its largest pressure (reference §B.7; EN 1997-2 K.2). */
function secantElasticModulus(curve: readonly CurvePoint[], plate: Plate, poisson: number, range: readonly [number, number]): SecantElasticModulus {
  const [low, high] = [requireInRange(range[0], 0, 1, 'elasticRange[0]'), requireInRange(range[1], 0, 1, 'elasticRange[1]')];
  if (!(high > low)) throw new InterpretationInputError('elasticRange', 'the upper fraction must exceed the lower');
  const qMax = Math.max(...curve.map((p) => p.pressureKpa));
  const [fromKpa, toKpa] = [low * qMax, high * qMax];
  const [fromMm, toMm] = [settlementAtPressure(curve, fromKpa), settlementAtPressure(curve, toKpa)];
  if (fromMm === null || toMm === null)
    throw new InterpretationInputError('firstLoading', `the curve does not span ${+fromKpa.toFixed(1)}–${+toKpa.toFixed(1)} kPa`);
  const modulus = rigidPlateModulus({ plate, deltaPressureKpa: toKpa - fromKpa, deltaSettlementMm: toMm - fromMm, poisson });
  const secant = `Δq, Δs: secant of the first loading between ${low} and ${high} of its largest pressure (linear interpolation from the curve's origin)`;
  return { ...modulus, formula: `${modulus.formula}; ${secant}`, poisson, fromKpa, toKpa, fromMm, toMm };
}

/**
 * Unload–reload modulus (common practice): E from the secant of the first unloading, between the last
 * loading point before it and its last point, by the rigid-plate formula (EN 1997-2 K.2). It reflects the
 * soil's stiffness on reloading, not on first loading.
 */
export function unloadModulus(points: readonly StagePoint[], plate: Plate, poisson: number): SecantElasticModulus {
  const first = points.findIndex((p, i) => p.branch === 'unloading' && i > 0 && points[i - 1].branch === 'loading');
  if (first < 0) throw new InterpretationInputError('stages', 'no unloading follows a loading stage');
  let last = first;
  while (points[last + 1]?.branch === 'unloading') last++;
  const [top, bottom] = [points[first - 1], points[last]];
  const [dq, ds] = [top.pressureKpa - bottom.pressureKpa, top.settlementMm - bottom.settlementMm];
  if (!(dq > 0 && ds > 0)) throw new InterpretationInputError('stages', `the first unloading (${+top.pressureKpa.toFixed(1)} to ${+bottom.pressureKpa.toFixed(1)} kPa) shows no rebound`);
  const modulus = rigidPlateModulus({ plate, deltaPressureKpa: dq, deltaSettlementMm: ds, poisson });
  return {
    ...modulus,
    formula: `${modulus.formula}; Δq, Δs: secant of the first unloading, from the last loading point to the end of the unloading`,
    source: `${modulus.source}; common practice for the unload–reload modulus`,
    poisson,
    fromKpa: bottom.pressureKpa,
    toKpa: top.pressureKpa,
    fromMm: bottom.settlementMm,
    toMm: top.settlementMm,
  };
}

/** Creep over [from, to], by default the last log cycle of the hold: t_b = the last reading, t_a = t_b/10 or the first reading after t = 0 if later. */
function stageCreep(series: ReturnType<typeof stageSettlementSeries>, window: readonly [number, number] | undefined): Finding<CreepCoefficient> {
  const last = series[series.length - 1].tMin;
  const firstAfterZero = series.find((r) => r.tMin > 0)?.tMin;
  if (window === undefined && (firstAfterZero === undefined || firstAfterZero >= last)) return notApplicable('the readings span no time after t = 0');
  const [from, to] = window ?? [Math.max(last / 10, firstAfterZero as number), last];
  return attempt(() => creepPerLogCycle(series, from, to));
}

function stageTimeSettlement(stage: StageReadings, options: AnalyzeRecordOptions): StageTimeSettlement {
  const series = stageSettlementSeries(stage, `stages[${stage.index}]`);
  const hyperbolicFit: Finding<HyperbolicTimeFit> =
    series[0].tMin === 0
      ? attempt(() => hyperbolicTimeFit(series))
      : notApplicable('no reading at t = 0 (when the target was reached): the stage’s starting settlement is unknown');
  return {
    index: stage.index,
    branch: stage.branch,
    targetKpa: stage.targetKpa,
    readings: series.length,
    lastTMin: series[series.length - 1].tMin,
    creep: stageCreep(series, options.creepWindowMin),
    hyperbolicFit,
  };
}

/** Why there is no first loading to feed the loading-curve methods, or null when there is. */
function curveProblem(reduction: Finding<StagePoint[]>, envelope: readonly CurvePoint[], withOrigin: readonly CurvePoint[]): string | null {
  if (!reduction.applies) return `no stage points: ${reduction.reason}`;
  if (!reduction.result.some((p) => p.branch === 'loading')) return 'the record has no loading stages';
  if (envelope.length === 0) return 'no load level has the application asked for';
  try {
    checkLoadingCurve(withOrigin, 'firstLoading');
  } catch (error) {
    if (error instanceof InterpretationInputError) return error.message;
    throw error;
  }
  return null;
}

/**
 * Interprets a whole test record (PRODUCT §7). Reduces the readings to stage points; applies the zero
 * (seating) correction once, so every method reads the same curve (fits use the measured stages only,
 * interpolation starts from the origin); then runs the methods the test's procedure calls for — ultimate
 * pressure side by side, each set against the test (within it, a yield, extrapolated), the footing with its
 * shape factor and allowable pressure, k labelled with its plate, Ev1/Ev2, E, the per-cycle split of a
 * repeated-loading test, and the time–settlement of each stage — with cautions worked out for this plate
 * and footing. A method that does not apply or is not shown says why; none throws. Linear in the readings.
 */
export function analyzeRecord(record: TestRecord, options: AnalyzeRecordOptions = {}): RecordAnalysis {
  const plate: Plate = record.plate;
  const procedure = procedureReading(record.plan?.procedureId);
  const stages = toStageReadings(record);
  const targets = new Map(stages.map((s) => [s.index, s.targetKpa]));
  const rule = options.reduction ?? record.plan?.reduction ?? procedure.reduction;
  const reduction = attempt(() => reduceStages(stages, rule));
  const points = reduction.applies ? reduction.result : [];
  const zero = zeroCorrection(points, record.plan?.seatingPressureKpa);
  const application = options.kApplication ?? procedure.kApplication;
  const envelope = loadingEnvelope(points, targets, application).map((p) => ({ pressureKpa: p.pressureKpa, settlementMm: p.settlementMm }));
  const firstLoading = [zero.origin, ...envelope];
  zero.bedding = beddingCorrection(envelope, zero.origin);
  const problem = curveProblem(reduction, envelope, firstLoading);
  const curve: CorrectedCurve = { measured: envelope, withOrigin: firstLoading, problem };
  const shown = (group: MethodGroup): string | null => {
    const s = procedure.methods[group];
    return s.shown ? null : `not shown for this procedure (${procedure.name}): ${s.why}`;
  };
  const run = <T>(group: MethodGroup | null, method: () => T): Finding<T> => {
    const hidden = group === null ? null : shown(group);
    if (hidden !== null) return notApplicable(hidden);
    return problem === null ? attempt(method) : notApplicable(problem);
  };

  const criterionMm = attempt(() => criterionSettlementMm(plate.sizeMm, options.ultimate?.criterion));
  const extent = run(null, () => testExtent(envelope, zero.origin, criterionMm.applies ? criterionMm.result : plate.sizeMm / 10));
  const ultimate = run('ultimate', () => {
    const ext = extent.applies ? extent.result : testExtent(envelope, zero.origin, plate.sizeMm / 10);
    return compareUltimateMethods(envelope, plate.sizeMm, { ...options.ultimate, origin: zero.origin }).map((r) => assessUltimate(r, ext));
  });
  const chosenUltimate: Finding<ChosenUltimate> =
    ultimate.applies && extent.applies ? chooseUltimate(ultimate.result, extent.result, options.ultimateMethod) : notApplicable(ultimate.applies ? 'no test extent' : ultimate.reason);
  const footing = record.footing;
  const scaling = options.scaling ?? (footing ? defaultScaling(footing) : undefined);
  const poisson = options.poisson ?? (footing?.soilBehaviour === 'cohesive' ? 0.5 : 0.3);

  const footingHidden = shown('footing');
  const footingFinding: Finding<FootingAnalysis> =
    footingHidden !== null
      ? notApplicable(footingHidden)
      : footing && scaling
        ? { applies: true, result: analyzeFooting(footing, plate, curve, chosenUltimate, scaling, options.columnLoadKn) }
        : notApplicable('the record names no footing to scale to');

  const kSettlementMm = options.kSettlementMm ?? procedure.kSettlement.mm;
  const label = kLabel(plate.sizeMm);
  const atSettlement = run('subgradeModulus', () => ({ ...subgradeModulusAtSettlement(firstLoading, kSettlementMm), label }));
  const atPressure: Finding<LabelledModulus> =
    procedure.kind === 'modulus'
      ? notApplicable('the 10 psi convention belongs to pavement tests (US Army Corps, 30 in plate), not to the modulus test')
      : run('subgradeModulus', () => ({ ...subgradeModulusAtPressure(firstLoading, FIXED_PRESSURE_KPA), label }));
  const standardPlate: SubgradeAnalysis['standardPlate'] = !atSettlement.applies
    ? notApplicable(atSettlement.reason)
    : atSettlement.result.kMnM3 === null
      ? notApplicable(atSettlement.result.reason ?? 'k is not determined')
      : (() => {
          const k = kForStandardPlate(atSettlement.result.kMnM3, plate.sizeMm);
          return k.kind === 'none' ? notApplicable(k.reason) : { applies: true as const, result: k };
        })();

  const deformation = (): Finding<StatedModuli> => {
    const hidden = shown('deformationModuli');
    if (hidden !== null) return notApplicable(hidden);
    if (problem !== null) return notApplicable(problem);
    if (plate.shape !== 'circular') return notApplicable('Ev (DIN 18134) is defined for a circular plate');
    const branches = evBranchesFromStages(points);
    if (branches.secondLoading === undefined) return notApplicable('needs a reloading branch after the first loading (a two-cycle test)');
    const secondLoading = branches.secondLoading;
    // DIN 18134 fits each branch from its starting point (the zero reading after the preload), as the standard defines the branch.
    return attempt(() => {
      const d = deformationModuli({ firstLoading, secondLoading, plateDiameterMm: plate.sizeMm, convention: options.evConvention });
      const convention = d.convention === 'branchMax' ? 'σ0max of each branch for its own Ev' : 'σ0max of the first loading for Ev1 and Ev2';
      return { ...d, statement: `${plate.sizeMm} mm circular plate; ${convention} (σ0max = ${(d.ev1.sigma0maxMnM2 * 1000).toFixed(0)} kPa); stages read ${describeRule(rule)}.` };
    });
  };

  const clayTest = record.plan?.procedureId === 'bearing-cohesive' || footing?.soilBehaviour === 'cohesive';
  const undrainedStrength: RecordAnalysis['undrainedStrength'] = !chosenUltimate.applies
    ? notApplicable(chosenUltimate.reason)
    : !clayTest
      ? notApplicable('a clay strength needs a clay: a cohesive-soil procedure or footing')
      : plate.shape !== 'circular'
        ? notApplicable('N_c = 6 (EN 1997-2 K.1) is given for a circular plate; this plate is square')
        : attempt(() => {
            const c = chosenUltimate.result;
            const cu = undrainedShearStrength({ ultimatePressureKpa: c.qUltKpa, plateDiameterMm: plate.sizeMm, setting: 'surface' });
            const lowerBound = c.basis === 'lowerBound';
            return {
              ...cu,
              lowerBound,
              statement: `c_u ${lowerBound ? '≥' : '='} ${f1(cu.cuKpa)} kPa from q_ult ${lowerBound ? '≥' : '='} ${f1(c.qUltKpa)} kPa with N_c = ${cu.nc} (plate at the surface or in a pit wider than its influence).`,
            };
          });

  const moduli = deformation();
  const evAcceptance: Finding<EvAcceptance> = !moduli.applies
    ? notApplicable(moduli.reason)
    : options.evRequirement === undefined
      ? notApplicable('no requirement entered: give the contract’s Ev2 (and Ev2/Ev1 limit) to check against')
      : attempt(() => checkEvRequirement(moduli.result, options.evRequirement as EvRequirement));

  const cycles: Finding<LoadCycle[]> = (() => {
    const hidden = shown('cycles');
    if (hidden !== null) return notApplicable(hidden);
    if (!reduction.applies) return notApplicable(`no stage points: ${reduction.reason}`);
    return attempt(() => repeatedCycles(points, targets, zero.origin));
  })();

  return {
    analysisVersion: ANALYSIS_VERSION,
    summary: {
      metadata: record.metadata ?? {},
      procedureId: record.plan?.procedureId ?? null,
      plate: { shape: plate.shape, sizeMm: plate.sizeMm },
      gauges: record.gauges.map((g) => g.key),
      stages: stages.length,
      readings: stages.reduce((n, s) => n + s.readings.length, 0),
    },
    procedure,
    reduction: {
      rule,
      points,
      formula: 'q = the plate pressure of the reading; s = mean of the gauges, at the end of the hold or at a set time into the stage (linear interpolation)',
      source:
        'Common practice: mean of opposite gauges = centre settlement of a rigid plate; end of hold for maintained-load tests, about 2 min for DIN 18134 stages',
    },
    zeroCorrection: zero,
    firstLoading,
    extent,
    ultimate,
    chosenUltimate,
    footing: footingFinding,
    subgradeModulus: {
      plateMm: plate.sizeMm,
      application,
      settlementBasis: options.kSettlementMm === undefined ? procedure.kSettlement.basis : `${options.kSettlementMm} mm (the engineer’s choice)`,
      atSettlement,
      atPressure,
      standardPlate,
      cbrEstimate: standardPlate.applies
        ? attempt(() => {
            const cbr = cbrFromK762(standardPlate.result.kMnM3);
            return standardPlate.result.kind === 'converted' ? { ...cbr, source: `${cbr.source}; from the converted k, so a conversion upon a conversion` } : cbr;
          })
        : notApplicable(standardPlate.reason),
      soaked:
        options.soakedSpecimens === undefined
          ? null
          : !atSettlement.applies || atSettlement.result.kMnM3 === null
            ? notApplicable(atSettlement.applies ? (atSettlement.result.reason ?? 'k is not determined') : atSettlement.reason)
            : attempt(() => saturationCorrection(atSettlement.result.kMnM3 as number, options.soakedSpecimens!.unsoakedMm, options.soakedSpecimens!.soakedMm)),
    },
    deformationModuli: moduli,
    evAcceptance,
    elasticModulus: run('elasticModulus', () => secantElasticModulus(firstLoading, plate, poisson, options.elasticRange ?? [0.3, 0.7])),
    undrainedStrength,
    unloadReloadModulus: run('ultimate', () => unloadModulus(points, plate, poisson)),
    cycles,
    timeSettlement: stages.filter((s) => s.branch === 'loading' || s.branch === 'reloading').map((s) => stageTimeSettlement(s, options)),
    scalingWarnings:
      footing && footingFinding.applies
        ? scalingWarnings({
            soil: footing.soilBehaviour,
            plateWidthM: plate.sizeMm / 1000,
            footingWidthM: footing.widthM,
            scaling,
            scalesUltimate: chosenUltimate.applies,
            waterTableBelowTestM: record.ground?.waterTableBelowTestM,
          })
        : [],
    cautions: cautionsFor(plate, footing),
  };
}

/** A reduction rule in words. */
export function describeRule(rule: ReductionRule): string {
  return rule.kind === 'atTime' ? `${rule.minutes} min after each target was reached` : 'at the end of each hold';
}
