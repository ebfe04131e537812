import type { CurvePoint } from './curve';
import type { AnyUltimateResult, UltimateMethod } from './ultimate';

/**
 * What an ultimate-pressure figure stands for once it is set against the test that produced it:
 * - `ultimate`: within the tested range, on a test that showed failure (or a settlement-criterion value);
 * - `yield`: a bend in the curve below a pressure the plate then carried without failure signs;
 * - `extrapolated`: beyond the largest pressure or settlement tested, within {@link EXTRAPOLATION_LIMITS};
 * - `beyondLimits`: further out than that, so not given as a result;
 * - `none`: the method gives no value.
 */
export type UltimateStanding = 'ultimate' | 'yield' | 'extrapolated' | 'beyondLimits' | 'none';

/**
 * How far beyond the test a fitted ultimate is still shown (marked as extrapolated), chosen here after common
 * practice: an asymptote or peak is trusted only when the test got at least half way to it in pressure and a
 * third of the way in settlement. Extrapolated values are never chosen for design automatically.
 */
export const EXTRAPOLATION_LIMITS = {
  maxPressureRatio: 2,
  maxSettlementRatio: 3,
  source: 'Common practice: a fitted asymptote is read only when the test reached about half of it (limits chosen here: q_ult/q_max ≤ 2, s/s_max ≤ 3)',
} as const;

/** The curve is taken as failing when the last increment settles this many times more per kPa than the first (a near-vertical curve). */
export const PLUNGE_RATIO = 10;

/** Whether the test showed failure, and the evidence. */
export interface FailureSigns {
  reached: boolean;
  evidence: string;
  /** Settlement per kPa of the last increment over that of the first. */
  complianceRatio: number | null;
}

/** How far the test went: its largest pressure and settlement, and whether it failed. */
export interface TestExtent {
  qMaxKpa: number;
  sMaxMm: number;
  failure: FailureSigns;
}

/** An ultimate-pressure result with its standing against the test. */
export type AssessedUltimate = AnyUltimateResult & {
  standing: UltimateStanding;
  /** q_ult/q_max: above 1 the value lies beyond the largest pressure tested. */
  qOverQmax: number | null;
  /** s_ult/s_max: above 1 the value lies beyond the largest settlement measured. */
  sOverSmax: number | null;
  /** A value too far beyond the test to be a result, kept for the record; null otherwise. */
  indicativeKpa: number | null;
};

const fmt = (x: number, digits = 1) => x.toFixed(digits);

/**
 * Failure signs of a loading curve (common practice: failure is settlement that runs on or a curve that turns
 * near-vertical; rules chosen here): the settlement reached the criterion (10 % of the plate width by default),
 * or the last increment settled {@link PLUNGE_RATIO} times more per kPa than the first (from the origin).
 */
export function failureSigns(measured: readonly CurvePoint[], origin: CurvePoint, criterionMm: number): FailureSigns {
  const curve = [origin, ...measured];
  const sMax = Math.max(...measured.map((p) => p.settlementMm));
  const compliance = (a: CurvePoint, b: CurvePoint) => (b.settlementMm - a.settlementMm) / (b.pressureKpa - a.pressureKpa);
  const first = curve.length >= 2 ? compliance(curve[0], curve[1]) : null;
  const last = curve.length >= 3 ? compliance(curve[curve.length - 2], curve[curve.length - 1]) : null;
  const complianceRatio = first !== null && last !== null && first > 0 ? last / first : null;
  if (sMax >= criterionMm) return { reached: true, evidence: `the settlement reached ${fmt(sMax, 2)} mm, past the criterion of ${fmt(criterionMm, 2)} mm`, complianceRatio };
  if (complianceRatio !== null && complianceRatio >= PLUNGE_RATIO) {
    return { reached: true, evidence: `the last increment settled ${fmt(complianceRatio)} times more per kPa than the first (the curve turns near-vertical)`, complianceRatio };
  }
  const ratioText = complianceRatio === null ? '' : `; the last increment settled ${fmt(complianceRatio)} times more per kPa than the first (failure taken at ${PLUNGE_RATIO})`;
  return { reached: false, evidence: `the settlement stopped at ${fmt(sMax, 2)} mm, short of ${fmt(criterionMm, 2)} mm${ratioText}`, complianceRatio };
}

/** The extent of a test: largest pressure and settlement of the measured points, and its failure signs. */
export function testExtent(measured: readonly CurvePoint[], origin: CurvePoint, criterionMm: number): TestExtent {
  return {
    qMaxKpa: Math.max(...measured.map((p) => p.pressureKpa)),
    sMaxMm: Math.max(...measured.map((p) => p.settlementMm)),
    failure: failureSigns(measured, origin, criterionMm),
  };
}

const BREAK_METHODS: readonly UltimateMethod[] = ['logLogIntersection', 'tangentIntersection', 'brinchHansen80', 'hyperbolic'];

/** Sets one method's figure against the test: within it, a yield, extrapolated, or too far out to be a result. */
export function assessUltimate(r: AnyUltimateResult, extent: TestExtent): AssessedUltimate {
  const none = { qOverQmax: null, sOverSmax: null, indicativeKpa: null };
  if (r.qUltKpa === null) return { ...r, ...none, standing: 'none' };
  const qOverQmax = r.qUltKpa / extent.qMaxKpa;
  const sOverSmax = r.sUltMm === null || extent.sMaxMm <= 0 ? null : r.sUltMm / extent.sMaxMm;
  const slack = 1 + 1e-9;
  const beyond = qOverQmax > slack || (sOverSmax !== null && sOverSmax > slack);
  const ratios = `q_ult/q_max = ${fmt(qOverQmax, 2)}${sOverSmax === null ? '' : `, s/s_max = ${fmt(sOverSmax, 2)}`}`;
  if (beyond) {
    const far = qOverQmax > EXTRAPOLATION_LIMITS.maxPressureRatio || (sOverSmax !== null && sOverSmax > EXTRAPOLATION_LIMITS.maxSettlementRatio);
    if (far) {
      return {
        ...r,
        qUltKpa: null,
        sUltMm: null,
        qOverQmax,
        sOverSmax,
        indicativeKpa: r.qUltKpa,
        standing: 'beyondLimits',
        reason: `too far beyond the test to be a result (${ratios}; limits ${EXTRAPOLATION_LIMITS.maxPressureRatio} and ${EXTRAPOLATION_LIMITS.maxSettlementRatio})`,
      };
    }
    const note = `extrapolated beyond the test (${ratios}): shown for comparison, never chosen for design automatically`;
    return { ...r, qOverQmax, sOverSmax, indicativeKpa: null, standing: 'extrapolated', reason: r.reason ? `${note}; ${r.reason}` : note };
  }
  if (BREAK_METHODS.includes(r.method) && !extent.failure.reached) {
    const note = `yield pressure, not an ultimate: a bend below ${fmt(extent.qMaxKpa)} kPa, which the plate then carried without failure signs`;
    return { ...r, qOverQmax, sOverSmax, indicativeKpa: null, standing: 'yield', reason: r.reason ? `${note}; ${r.reason}` : note };
  }
  return { ...r, qOverQmax, sOverSmax, indicativeKpa: null, standing: 'ultimate' };
}

/** What the engineer may carry to the footing: a method's value, or the largest pressure carried as the lower bound q_ult ≥ q_max. */
export type UltimateChoice = UltimateMethod | 'largestPressure';

/** The ultimate pressure carried into the footing checks, and how it was picked. */
export interface ChosenUltimate {
  /** The method, or null for the lower bound q_ult ≥ q_max of a test that did not fail. */
  method: UltimateMethod | null;
  label: string;
  qUltKpa: number;
  /** engineer: a method named by the engineer; lowest: the lowest ultimate within the test; lowerBound: q_ult ≥ q_max (by default or as the engineer chose). */
  basis: 'engineer' | 'lowest' | 'lowerBound';
  standing: UltimateStanding | 'lowerBound';
  qOverQmax: number;
  /** One sentence every view prints. */
  statement: string;
  formula: string;
  source: string;
}

/**
 * The ultimate pressure for the footing checks. The engineer's method when named (any with a value; its
 * standing is stated). Otherwise the lowest value that stands as an ultimate within the test; yields and
 * extrapolations are never chosen. With none, the largest pressure carried is a lower bound, q_ult ≥ q_max,
 * which keeps the footing checks on the safe side.
 */
export function chooseUltimate(
  methods: readonly AssessedUltimate[],
  extent: TestExtent,
  wanted: UltimateChoice | undefined,
): { applies: true; result: ChosenUltimate } | { applies: false; reason: string } {
  const pick = (r: AssessedUltimate, basis: 'engineer' | 'lowest'): { applies: true; result: ChosenUltimate } => {
    const q = r.qUltKpa as number;
    const standingText = r.standing === 'ultimate' ? '' : ` — ${r.standing === 'yield' ? 'a yield pressure' : 'an extrapolated value'}, taken as the engineer chose`;
    const how = basis === 'engineer' ? 'the engineer’s choice' : 'the lowest ultimate any method finds within the test';
    return {
      applies: true,
      result: {
        method: r.method,
        label: r.label,
        qUltKpa: q,
        basis,
        standing: r.standing,
        qOverQmax: r.qOverQmax as number,
        statement: `q_ult = ${fmt(q)} kPa by ${r.label} (${how}; q_ult/q_max = ${fmt(r.qOverQmax as number, 2)})${standingText}.`,
        formula: r.formula,
        source: r.source,
      },
    };
  };
  if (wanted !== undefined && wanted !== 'largestPressure') {
    const chosen = methods.find((r) => r.method === wanted);
    if (!chosen) return { applies: false, reason: `unknown ultimate-pressure method "${wanted}"` };
    return chosen.qUltKpa === null ? { applies: false, reason: `${chosen.label}: ${chosen.reason}` } : pick(chosen, 'engineer');
  }
  const standing = methods.filter((r) => r.standing === 'ultimate' && r.qUltKpa !== null);
  if (standing.length > 0 && wanted === undefined) return pick(standing.reduce((a, b) => ((b.qUltKpa as number) < (a.qUltKpa as number) ? b : a)), 'lowest');
  const q = extent.qMaxKpa;
  return {
    applies: true,
    result: {
      method: null,
      label: extent.failure.reached ? 'Largest pressure carried' : 'Failure not reached',
      qUltKpa: q,
      basis: 'lowerBound',
      standing: 'lowerBound',
      qOverQmax: 1,
      statement: `${wanted === 'largestPressure' ? 'The engineer’s choice, the largest pressure carried' : extent.failure.reached ? 'No method finds an ultimate within the test' : 'Failure not reached'}: q_ult ≥ ${fmt(q)} kPa, the largest pressure carried (${extent.failure.evidence}). The footing checks use this lower bound, which is on the safe side.`,
      formula: 'q_ult ≥ q_max (the largest pressure the plate carried)',
      source: 'Common practice: a test stopped before failure bounds the ultimate pressure from below',
    },
  };
}

/** What each standing is called on the page, the report and the command line. */
export const STANDING_WORDS: Record<UltimateStanding, string> = {
  ultimate: 'ultimate',
  yield: 'yield pressure',
  extrapolated: 'extrapolated',
  beyondLimits: 'beyond the test',
  none: 'no value',
};

/** The legend every view prints under the ultimate-pressure methods. */
export const STANDING_LEGEND =
  'q_ult/q_max and s/s_max: the value over the largest pressure and settlement of the test; above 1 it lies beyond the test. ' +
  `Extrapolated values are shown up to q_ult/q_max ≤ ${EXTRAPOLATION_LIMITS.maxPressureRatio} and s/s_max ≤ ${EXTRAPOLATION_LIMITS.maxSettlementRatio} ` +
  '(common practice: a fitted asymptote is read only when the test reached about half of it; limits chosen here), beyond that they are no result. ' +
  'A yield pressure (a bend below a pressure then carried without failure signs) or an extrapolated value is never carried to the footing unless the engineer chooses it.';
