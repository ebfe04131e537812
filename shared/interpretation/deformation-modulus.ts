import { type CurvePoint, checkCurve } from './curve';
import { InterpretationInputError, requirePositive } from './input-checks';
import type { StagePoint } from './reduction';
import { fitQuadratic } from './regression';
import { FIXED_SETTLEMENT_MM, type SubgradeModulus, subgradeModulusAtSettlement } from './subgrade';

/** Which σ0max enters Ev = 1.5·r/(a1 + a2·σ0max). */
export type Sigma0MaxConvention =
  /** The first loading's maximum for both Ev1 and Ev2 (DIN 18134 practice as read here). */
  | 'firstLoadingMax'
  /** Each branch's own maximum. */
  | 'branchMax';

/** One loading branch fitted by s = a0 + a1·σ0 + a2·σ0² (s in mm, σ0 in MN/m²). */
export interface EvBranch {
  a0: number;
  a1: number;
  a2: number;
  r2: number;
  points: number;
  sigma0maxMnM2: number;
  /** Ev = 1.5·r/(a1 + a2·σ0max), MN/m²; null when the fitted curve does not rise (a1 + a2·σ0max ≤ 0). */
  evMnM2: number | null;
  reason: string | null;
}

/** Ev1, Ev2 and their ratio. */
export interface DeformationModuli {
  ev1: EvBranch;
  ev2: EvBranch | null;
  /** Ev2/Ev1; null without a second loading or when either is undetermined. */
  ratio: number | null;
  convention: Sigma0MaxConvention;
  plateDiameterMm: number;
  formula: string;
  source: string;
}

const kpaToMnM2 = (kpa: number) => kpa / 1000;

/**
 * DIN-type secant modulus Ev = 1.5·r·Δσ0/Δs = 0.75·D·Δσ0/Δs (MN/m² with r, D, s in mm and σ0 in MN/m²);
 * the 1.5 is π(1 − ν²)/2 of a rigid circular plate on an elastic half-space (DIN 18134; reference §B.6).
 */
export function dinSecantModulus(plateDiameterMm: number, deltaStressMnM2: number, deltaSettlementMm: number): number {
  return (0.75 * requirePositive(plateDiameterMm, 'plateDiameterMm') * requirePositive(deltaStressMnM2, 'deltaStressMnM2')) / requirePositive(deltaSettlementMm, 'deltaSettlementMm');
}

/**
 * Fits one loading branch by least squares, s = a0 + a1·σ0 + a2·σ0², and evaluates the secant between
 * 0.3 and 0.7 σ0max: Ev = 1.5·r/(a1 + a2·σ0max) (DIN 18134; reference §B.6). Needs three or more points.
 */
export function evFromBranch(points: readonly CurvePoint[], plateDiameterMm: number, sigma0maxMnM2: number, field = 'points'): EvBranch {
  checkCurve(points, field, 3);
  const r = requirePositive(plateDiameterMm, 'plateDiameterMm') / 2;
  const sigmaMax = requirePositive(sigma0maxMnM2, 'sigma0maxMnM2');
  const fit = fitQuadratic(
    points.map((p) => kpaToMnM2(p.pressureKpa)),
    points.map((p) => p.settlementMm),
    field,
  );
  const slope = fit.a1 + fit.a2 * sigmaMax;
  return {
    a0: fit.a0,
    a1: fit.a1,
    a2: fit.a2,
    r2: fit.r2,
    points: fit.n,
    sigma0maxMnM2: sigmaMax,
    evMnM2: slope > 0 ? (1.5 * r) / slope : null,
    reason: slope > 0 ? null : 'the fitted curve does not rise between 0.3 and 0.7 σ0max',
  };
}

/** Input of {@link deformationModuli}. */
export interface DeformationModuliInput {
  /** First loading branch including its start (σ0 = 0 after the preload), in test order. */
  firstLoading: readonly CurvePoint[];
  /** Second loading branch including its start (the end-of-unloading point); omit for a single loading. */
  secondLoading?: readonly CurvePoint[];
  /** Plate diameter, mm. Default 300. */
  plateDiameterMm?: number;
  /** σ0max convention. Default 'firstLoadingMax'. */
  convention?: Sigma0MaxConvention;
}

/**
 * Deformation moduli Ev1, Ev2 and Ev2/Ev1 from a two-cycle plate test (DIN 18134; reference §B.6, check C8):
 * each loading branch is fitted by s = a0 + a1·σ0 + a2·σ0² and Ev = 1.5·r/(a1 + a2·σ0max), with σ0max
 * taken per the stated convention (default: the first loading's maximum for both).
 */
export function deformationModuli(input: DeformationModuliInput): DeformationModuli {
  const diameter = input.plateDiameterMm ?? 300;
  const convention = input.convention ?? 'firstLoadingMax';
  if (convention !== 'firstLoadingMax' && convention !== 'branchMax') throw new InterpretationInputError('convention', `unknown σ0max convention "${convention}"`);
  checkCurve(input.firstLoading, 'firstLoading', 3);
  const branchMax = (points: readonly CurvePoint[]) => kpaToMnM2(Math.max(...points.map((p) => p.pressureKpa)));
  const firstMax = branchMax(input.firstLoading);
  const ev1 = evFromBranch(input.firstLoading, diameter, firstMax, 'firstLoading');
  let ev2: EvBranch | null = null;
  if (input.secondLoading !== undefined) {
    checkCurve(input.secondLoading, 'secondLoading', 3);
    ev2 = evFromBranch(input.secondLoading, diameter, convention === 'firstLoadingMax' ? firstMax : branchMax(input.secondLoading), 'secondLoading');
  }
  return {
    ev1,
    ev2,
    ratio: ev1.evMnM2 !== null && ev2?.evMnM2 != null ? ev2.evMnM2 / ev1.evMnM2 : null,
    convention,
    plateDiameterMm: diameter,
    formula: 's = a0 + a1·σ0 + a2·σ0² (least squares per branch); Ev = 1.5·r/(a1 + a2·σ0max)',
    source: 'DIN 18134:2012 plate load test',
  };
}

/**
 * The branches of a stage-point list as DIN 18134 fits them (reference §B.6): first loading = the last
 * seating point (σ0 after preload, gauges zeroed) followed by the loading points; second loading = the
 * last unloading point followed by the reloading points (absent when there is no reloading).
 */
export function evBranchesFromStages(points: readonly StagePoint[]): { firstLoading: StagePoint[]; secondLoading?: StagePoint[] } {
  const lastOf = (branch: StagePoint['branch']) => points.filter((p) => p.branch === branch).slice(-1);
  const loading = points.filter((p) => p.branch === 'loading');
  const reloading = points.filter((p) => p.branch === 'reloading');
  const firstLoading = [...lastOf('seating'), ...loading];
  return reloading.length === 0 ? { firstLoading } : { firstLoading, secondLoading: [...lastOf('unloading'), ...reloading] };
}

/** An acceptance requirement on Ev2 and Ev2/Ev1, configured per contract (reference §B.6 table). */
export interface EvRequirement {
  name: string;
  /** Required Ev2, MN/m². */
  minEv2MnM2: number;
  /** Largest acceptable Ev2/Ev1; absent = no ratio requirement. */
  maxRatio?: number;
  /** A higher ratio is acceptable when Ev1 ≥ this fraction × the required Ev2 (e.g. 0.6); absent = no relaxation. */
  relaxWhenEv1AtLeastFractionOfRequiredEv2?: number;
}

/** One check of a requirement. */
export interface EvCheck {
  code: 'ev2' | 'ratio';
  passed: boolean;
  message: string;
}

/** Verdict on one requirement. */
export interface EvAcceptance {
  name: string;
  passed: boolean;
  checks: EvCheck[];
}

const fmt = (x: number, digits = 1) => x.toFixed(digits);

/**
 * Checks Ev2 ≥ required and Ev2/Ev1 ≤ limit, the ratio limit waived when Ev1 ≥ fraction × required Ev2
 * (reference §B.6; ZTV E-StB practice, values configured per contract). An undetermined modulus fails.
 */
export function checkEvRequirement(moduli: Pick<DeformationModuli, 'ev1' | 'ev2' | 'ratio'>, requirement: EvRequirement): EvAcceptance {
  const required = requirePositive(requirement.minEv2MnM2, 'requirement.minEv2MnM2');
  const ev1 = moduli.ev1.evMnM2;
  const ev2 = moduli.ev2?.evMnM2 ?? null;
  const checks: EvCheck[] = [
    ev2 === null
      ? { code: 'ev2', passed: false, message: 'Ev2 is not determined.' }
      : { code: 'ev2', passed: ev2 >= required, message: `Ev2 = ${fmt(ev2)} MN/m² ${ev2 >= required ? '≥' : '<'} ${fmt(required)} MN/m² required.` },
  ];
  if (requirement.maxRatio !== undefined) {
    const limit = requirePositive(requirement.maxRatio, 'requirement.maxRatio');
    const fraction = requirement.relaxWhenEv1AtLeastFractionOfRequiredEv2;
    const relaxed = fraction !== undefined && ev1 !== null && ev1 >= requirePositive(fraction, 'requirement.relaxWhenEv1AtLeastFractionOfRequiredEv2') * required;
    const ratio = moduli.ratio;
    if (ratio === null) checks.push({ code: 'ratio', passed: false, message: 'Ev2/Ev1 is not determined.' });
    else if (ratio <= limit) checks.push({ code: 'ratio', passed: true, message: `Ev2/Ev1 = ${fmt(ratio, 2)} ≤ ${limit}.` });
    else if (relaxed) checks.push({ code: 'ratio', passed: true, message: `Ev2/Ev1 = ${fmt(ratio, 2)} > ${limit}, accepted because Ev1 = ${fmt(ev1 as number)} MN/m² ≥ ${fraction} × ${fmt(required)} MN/m².` });
    else checks.push({ code: 'ratio', passed: false, message: `Ev2/Ev1 = ${fmt(ratio, 2)} > ${limit}.` });
  }
  return { name: requirement.name, passed: checks.every((c) => c.passed), checks };
}

/**
 * Modulus of subgrade reaction ks from the first loading of a 762 mm plate (DIN 18134; reference §B.6):
 * ks = σ0(s = 1.25 mm)/1.25 mm, σ0 interpolated linearly; MN/m³.
 */
export function ksFromFirstLoading(firstLoading: readonly CurvePoint[], plateDiameterMm = 762): SubgradeModulus & { plateDiameterMm: number } {
  const k = subgradeModulusAtSettlement(firstLoading, FIXED_SETTLEMENT_MM);
  const diameter = requirePositive(plateDiameterMm, 'plateDiameterMm');
  const caution = diameter === 762 ? null : `ks is defined for the 762 mm plate; this plate is ${diameter} mm`;
  return { ...k, plateDiameterMm: diameter, reason: k.reason ?? caution, source: 'DIN 18134:2012 ks (762 mm plate, first loading)' };
}
