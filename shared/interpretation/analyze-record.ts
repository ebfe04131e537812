import type { Plate } from '../domain/plate';
import { toStageReadings } from '../records/readings';
import type { RecordFooting, TestRecord } from '../records/schema';
import {
  type AllowableBearingPressure,
  allowableBearingPressure,
  type SettlementAllowable,
  type ShearAllowable,
  settlementAllowable,
  shearAllowable,
} from './allowable';
import { type CurvePoint, settlementAtPressure } from './curve';
import { type DeformationModuli, deformationModuli, evBranchesFromStages, type Sigma0MaxConvention } from './deformation-modulus';
import { type ElasticModulus, rigidPlateModulus } from './elastic';
import { InterpretationInputError, requireInRange } from './input-checks';
import { type ReductionRule, reduceStages, type StagePoint, type StageReadings, stageSettlementSeries } from './reduction';
import { footingUltimatePressure, type ScalingWarning, type SettlementScaling, scalingWarnings } from './scaling';
import { type SubgradeModulus, subgradeModulusAtPressure, subgradeModulusAtSettlement } from './subgrade';
import { type CreepCoefficient, creepPerLogCycle, type HyperbolicTimeFit, hyperbolicTimeFit } from './time-settlement';
import { type AnyUltimateResult, type CompareUltimateOptions, compareUltimateMethods, type UltimateMethod } from './ultimate';

/** A method's result, or why it does not apply to this record. */
export type Finding<T> = { applies: true; result: T } | { applies: false; reason: string };

/** A caution shown beside the results. */
export interface Caution {
  code: string;
  message: string;
}

/** Options of {@link analyzeRecord}. */
export interface AnalyzeRecordOptions {
  /** Which reading stands for each stage. Default: the record's `plan.reduction`, else the end of each hold. */
  reduction?: ReductionRule;
  /** Options of the ultimate-pressure methods (log–log split, tangent points, settlement criterion). Default: each method's own. */
  ultimate?: CompareUltimateOptions;
  /** The method whose ultimate pressure is scaled to the footing. Default: the lowest value any method determines (the cautious choice). */
  ultimateMethod?: UltimateMethod;
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
}

/** The ultimate pressure carried into the footing checks, and how it was picked. */
export interface ChosenUltimate {
  method: UltimateMethod;
  label: string;
  qUltKpa: number;
  basis: 'engineer' | 'lowest';
  formula: string;
  source: string;
}

/** Scaling of the plate results to the record's footing (DOMAIN §B.3, §B.4). */
export interface FootingAnalysis {
  footing: RecordFooting;
  plateWidthM: number;
  scaling: SettlementScaling;
  ultimate: Finding<{ qUltKpa: number; fromMethod: UltimateMethod; formula: string; source: string }>;
  shear: Finding<ShearAllowable>;
  settlement: Finding<SettlementAllowable>;
  allowable: Finding<AllowableBearingPressure>;
}

/** Young's modulus from the first loading's secant, with the range it used. */
export interface SecantElasticModulus extends ElasticModulus {
  poisson: number;
  fromKpa: number;
  toKpa: number;
  fromMm: number;
  toMm: number;
}

/** Time–settlement evaluation of one loading or reloading stage (DOMAIN §B.8). */
export interface StageTimeSettlement {
  index: number;
  branch: StagePoint['branch'];
  targetKpa: number;
  readings: number;
  lastTMin: number;
  creep: Finding<CreepCoefficient>;
  hyperbolicFit: Finding<HyperbolicTimeFit>;
}

/** Everything Settlescope can say about one test record. */
export interface RecordAnalysis {
  summary: {
    metadata: NonNullable<TestRecord['metadata']>;
    procedureId: string | null;
    plate: Plate;
    gauges: string[];
    stages: number;
    readings: number;
  };
  reduction: { rule: ReductionRule; points: StagePoint[]; formula: string; source: string };
  /** The first loading (the last seating point, then the loading stages): the curve of the loading methods. */
  firstLoading: CurvePoint[];
  ultimate: Finding<AnyUltimateResult[]>;
  chosenUltimate: Finding<ChosenUltimate>;
  footing: Finding<FootingAnalysis>;
  subgradeModulus: { atSettlement: Finding<SubgradeModulus>; atPressure: Finding<SubgradeModulus> };
  deformationModuli: Finding<DeformationModuli>;
  elasticModulus: Finding<SecantElasticModulus>;
  timeSettlement: StageTimeSettlement[];
  scalingWarnings: ScalingWarning[];
  cautions: Caution[];
}

/** The cautions that stand beside every result (PRODUCT.md). */
export const STANDING_CAUTIONS: readonly Caution[] = [
  { code: 'one_spot', message: 'The results describe the soil under one plate, at one spot and one depth; the ground elsewhere on the site may differ.' },
  {
    code: 'deeper_soil',
    message: 'A footing stresses the soil 2–3 plate widths deeper than the plate did: a weaker layer below the plate’s reach does not show in this test.',
  },
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

/** Why there is no first loading to feed the loading-curve methods, or null when there is. */
function curveProblem(reduction: Finding<StagePoint[]>): string | null {
  if (!reduction.applies) return `no stage points: ${reduction.reason}`;
  return reduction.result.some((p) => p.branch === 'loading') ? null : 'the record has no loading stages';
}

function chooseUltimate(methods: readonly AnyUltimateResult[], wanted: UltimateMethod | undefined): Finding<ChosenUltimate> {
  const pick = (r: AnyUltimateResult, basis: ChosenUltimate['basis']): Finding<ChosenUltimate> =>
    r.qUltKpa === null
      ? notApplicable(`${r.label}: ${r.reason}`)
      : { applies: true, result: { method: r.method, label: r.label, qUltKpa: r.qUltKpa, basis, formula: r.formula, source: r.source } };
  if (wanted !== undefined) {
    const chosen = methods.find((r) => r.method === wanted);
    return chosen ? pick(chosen, 'engineer') : notApplicable(`unknown ultimate-pressure method "${wanted}"`);
  }
  const determined = methods.filter((r) => r.qUltKpa !== null);
  if (determined.length === 0) return notApplicable('no method determines an ultimate pressure from this curve');
  return pick(
    determined.reduce((a, b) => ((b.qUltKpa as number) < (a.qUltKpa as number) ? b : a)),
    'lowest',
  );
}

function defaultScaling(footing: RecordFooting): SettlementScaling {
  return footing.soilBehaviour === 'cohesive' ? { kind: 'clayLinear' } : { kind: 'terzaghiPeckSand' };
}

function analyzeFooting(
  footing: RecordFooting,
  plate: Plate,
  curve: { points: readonly CurvePoint[]; problem: string | null },
  chosen: Finding<ChosenUltimate>,
  scaling: SettlementScaling,
): FootingAnalysis {
  const plateWidthM = plate.sizeMm / 1000;
  const ultimate: FootingAnalysis['ultimate'] = chosen.applies
    ? attempt(() => ({
        ...footingUltimatePressure(chosen.result.qUltKpa, plateWidthM, footing.widthM, footing.soilBehaviour),
        fromMethod: chosen.result.method,
      }))
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
  const settlement: Finding<SettlementAllowable> =
    curve.problem === null
      ? attempt(() =>
          settlementAllowable({
            curve: curve.points,
            plateWidthM,
            footingWidthM: footing.widthM,
            scaling,
            permissibleSettlementMm: footing.permissibleSettlementMm,
          }),
        )
      : notApplicable(curve.problem);
  const allowable: Finding<AllowableBearingPressure> = !shear.applies
    ? notApplicable(shear.reason)
    : !settlement.applies
      ? notApplicable(settlement.reason)
      : attempt(() => allowableBearingPressure(shear.result, settlement.result));
  return { footing, plateWidthM, scaling, ultimate, shear, settlement, allowable };
}

/** E from the secant of the first loading between two fractions of its largest pressure (DOMAIN §B.7; EN 1997-2 K.2). */
function secantElasticModulus(curve: readonly CurvePoint[], plate: Plate, poisson: number, range: readonly [number, number]): SecantElasticModulus {
  const [low, high] = [requireInRange(range[0], 0, 1, 'elasticRange[0]'), requireInRange(range[1], 0, 1, 'elasticRange[1]')];
  if (!(high > low)) throw new InterpretationInputError('elasticRange', 'the upper fraction must exceed the lower');
  const qMax = Math.max(...curve.map((p) => p.pressureKpa));
  const [fromKpa, toKpa] = [low * qMax, high * qMax];
  const [fromMm, toMm] = [settlementAtPressure(curve, fromKpa), settlementAtPressure(curve, toKpa)];
  if (fromMm === null || toMm === null)
    throw new InterpretationInputError('firstLoading', `the curve does not span ${+fromKpa.toFixed(1)}–${+toKpa.toFixed(1)} kPa`);
  const modulus = rigidPlateModulus({ plate, deltaPressureKpa: toKpa - fromKpa, deltaSettlementMm: toMm - fromMm, poisson });
  const secant = `Δq, Δs: secant of the first loading between ${low} and ${high} of its largest pressure (linear interpolation of the stage points)`;
  return { ...modulus, formula: `${modulus.formula}; ${secant}`, poisson, fromKpa, toKpa, fromMm, toMm };
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

/**
 * Interprets a whole test record (PRODUCT §7): reduces the readings to stage points, then runs every
 * method that applies — ultimate pressure side by side, scaling to the record's footing with the allowable
 * pressure, k at 1.25 mm and at 10 psi, Ev1/Ev2 for a two-cycle test, E from the first loading, and the
 * time–settlement of each loading and reloading stage — with the standing cautions and scaling warnings.
 * A method that does not apply says why; none throws. Every figure keeps the formula and source of its method.
 * Linear in the number of readings.
 */
export function analyzeRecord(record: TestRecord, options: AnalyzeRecordOptions = {}): RecordAnalysis {
  const plate: Plate = record.plate;
  const stages = toStageReadings(record);
  const rule = options.reduction ?? record.plan?.reduction ?? { kind: 'endOfHold' };
  const reduction = attempt(() => reduceStages(stages, rule));
  const points = reduction.applies ? reduction.result : [];
  const branches = evBranchesFromStages(points);
  const firstLoading = branches.firstLoading.map((p) => ({ pressureKpa: p.pressureKpa, settlementMm: p.settlementMm }));
  const problem = curveProblem(reduction);
  const onCurve = <T>(method: () => T): Finding<T> => (problem === null ? attempt(method) : notApplicable(problem));

  const ultimate = onCurve(() => compareUltimateMethods(firstLoading, plate.sizeMm, options.ultimate));
  const chosenUltimate = ultimate.applies ? chooseUltimate(ultimate.result, options.ultimateMethod) : notApplicable(ultimate.reason);
  const footing = record.footing;
  const scaling = options.scaling ?? (footing ? defaultScaling(footing) : undefined);
  const poisson = options.poisson ?? (footing?.soilBehaviour === 'cohesive' ? 0.5 : 0.3);

  const deformation = (): Finding<DeformationModuli> => {
    if (problem !== null) return notApplicable(problem);
    if (plate.shape !== 'circular') return notApplicable('Ev (DIN 18134) is defined for a circular plate');
    if (branches.secondLoading === undefined) return notApplicable('needs a reloading branch after the first loading (a two-cycle test)');
    const secondLoading = branches.secondLoading;
    return attempt(() => deformationModuli({ firstLoading, secondLoading, plateDiameterMm: plate.sizeMm, convention: options.evConvention }));
  };

  return {
    summary: {
      metadata: record.metadata ?? {},
      procedureId: record.plan?.procedureId ?? null,
      plate: { shape: plate.shape, sizeMm: plate.sizeMm },
      gauges: record.gauges.map((g) => g.key),
      stages: stages.length,
      readings: stages.reduce((n, s) => n + s.readings.length, 0),
    },
    reduction: {
      rule,
      points,
      formula: 'q = the plate pressure of the reading; s = mean of the gauges, at the end of the hold or at a set time into the stage (linear interpolation)',
      source:
        'Common practice: mean of opposite gauges = centre settlement of a rigid plate; end of hold for maintained-load tests, about 2 min for DIN 18134 stages',
    },
    firstLoading,
    ultimate,
    chosenUltimate,
    footing:
      footing && scaling
        ? { applies: true, result: analyzeFooting(footing, plate, { points: firstLoading, problem }, chosenUltimate, scaling) }
        : notApplicable('the record names no footing to scale to'),
    subgradeModulus: {
      atSettlement: onCurve(() => subgradeModulusAtSettlement(firstLoading)),
      atPressure: onCurve(() => subgradeModulusAtPressure(firstLoading)),
    },
    deformationModuli: deformation(),
    elasticModulus: onCurve(() => secantElasticModulus(firstLoading, plate, poisson, options.elasticRange ?? [0.3, 0.7])),
    timeSettlement: stages.filter((s) => s.branch === 'loading' || s.branch === 'reloading').map((s) => stageTimeSettlement(s, options)),
    scalingWarnings: footing
      ? scalingWarnings({
          soil: footing.soilBehaviour,
          plateWidthM: plate.sizeMm / 1000,
          footingWidthM: footing.widthM,
          scaling,
          scalesUltimate: chosenUltimate.applies,
          waterTableBelowTestM: record.ground?.waterTableBelowTestM,
        })
      : [],
    cautions: [...STANDING_CAUTIONS],
  };
}
