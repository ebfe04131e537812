import { type CurvePoint, checkLoadingCurve, pressureAtSettlement, settlementAtPressure } from './curve';
import { InterpretationInputError, requireInRange, requirePositive } from './input-checks';
import { fitLine, type LineFit } from './regression';
import { type BreakSignificance, breakSignificance, roundingSd } from './significance';

/** Reading resolution assumed when none is given: a 0.01 mm dial or digital gauge (common practice). */
export const DEFAULT_RESOLUTION_MM = 0.01;

/** The ultimate-pressure methods of reference §B.2. */
export type UltimateMethod = 'logLogIntersection' | 'tangentIntersection' | 'hyperbolic' | 'settlementCriterion' | 'brinchHansen80' | 'brinchHansen90';

/** How well a method's fit reproduces the data it used. */
export interface FitQuality {
  measure: 'r2' | 'sse';
  value: number;
}

/** One method's ultimate (failure) pressure, with its evidence. */
export interface UltimateResult<M extends UltimateMethod = UltimateMethod, D = unknown> {
  method: M;
  label: string;
  /** Ultimate pressure, kPa; null when the data do not determine it (see `reason`). */
  qUltKpa: number | null;
  /** Settlement at the ultimate pressure, mm; null when the method has none or it is not determined. */
  sUltMm: number | null;
  fit: FitQuality | null;
  /** Method-specific working (fitted lines, constants); null when too few points to fit. */
  details: D | null;
  formula: string;
  source: string;
  /** Why `qUltKpa` is null, or a caution about a value that is given; null when there is nothing to say. */
  reason: string | null;
}

function result<M extends UltimateMethod, D>(
  head: Pick<UltimateResult<M, D>, 'method' | 'label' | 'formula' | 'source'>,
  body: Partial<Pick<UltimateResult<M, D>, 'qUltKpa' | 'sUltMm' | 'fit' | 'details' | 'reason'>>,
): UltimateResult<M, D> {
  return { ...head, qUltKpa: null, sUltMm: null, fit: null, details: null, reason: null, ...body };
}

/** Whether slope b is steeper than slope a by more than rounding (equal slopes = no break). */
function isSteeper(a: number, b: number): boolean {
  return b - a > 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));
}

const TOO_FEW_FOR_NOISE = 'too few points to tell a break from reading noise (five or more needed)';

/** Why a break that is within reading noise is not a break. */
function noBreakReason(s: BreakSignificance): string {
  return `no significant break: two lines fit no better than one straight line plus reading noise (p = ${s.pValue.toPrecision(2)}, needs < ${s.threshold.toPrecision(2)})`;
}

// ---------------------------------------------------------------------------------------------------
// Log–log two-straight-line intersection

/** Options of the log–log method. */
export interface LogLogOptions {
  /**
   * Index (into the given points) of the last point of the first line, chosen by the engineer.
   * Default: the split with the least total squared error.
   */
  firstLineEnd?: number;
  /** Fewest points on each line when the split is chosen automatically. Default 2 (the geometric minimum). */
  minPointsPerLine?: number;
  /** Resolution of the settlement readings, mm, for the significance of the break. Default 0.01. */
  resolutionMm?: number;
}

/** Working of the log–log method. Lines are log10 s = intercept + slope·log10 q (s in mm, q in kPa). */
export interface LogLogDetails {
  firstLineEnd: number;
  chosenBy: 'leastSquares' | 'engineer';
  firstLine: LineFit;
  secondLine: LineFit;
  /** Every split tried (automatic choice only): index of the last point of line 1 and the total SSE. */
  candidates: { firstLineEnd: number; sse: number }[];
  /** Points left out because log q or log s is undefined (q or s ≤ 0). */
  excludedIndices: number[];
  /** Whether the two lines fit significantly better than one; null with fewer than five points. */
  significance: BreakSignificance | null;
}

const LOG_LOG = {
  method: 'logLogIntersection',
  label: 'Log–log two-line intersection',
  formula: 'log s = a1 + b1·log q and log s = a2 + b2·log q fitted either side of the split; q_ult where they meet',
  source: 'De Beer (1970) Géotechnique 20(4), double-logarithmic plot; IS 1888 interpretation practice',
} as const;

/**
 * Log–log two-straight-line method (reference §B.2 item 1; De Beer 1970): in log10 q – log10 s space fit
 * line 1 to points 0..k and line 2 to points k+1..n−1 for every split k, take the split with the least
 * total SSE (or the engineer's `firstLineEnd`), and return the pressure where the lines intersect:
 * log q* = (a2 − a1)/(b1 − b2). Null when the second line is not steeper or they meet outside the data.
 */
export function logLogIntersection(points: readonly CurvePoint[], options: LogLogOptions = {}): UltimateResult<'logLogIntersection', LogLogDetails> {
  checkLoadingCurve(points);
  const minPerLine = Math.max(2, options.minPointsPerLine ?? 2);
  const excludedIndices = points.flatMap((p, i) => (p.pressureKpa > 0 && p.settlementMm > 0 ? [] : [i]));
  const used = points.flatMap((p, i) => (excludedIndices.includes(i) ? [] : [{ i, x: Math.log10(p.pressureKpa), y: Math.log10(p.settlementMm) }]));
  if (used.length < 2 * minPerLine) {
    return result(LOG_LOG, { reason: `needs at least ${2 * minPerLine} points with q > 0 and s > 0 (got ${used.length})` });
  }
  const fitPart = (part: typeof used) =>
    fitLine(
      part.map((u) => u.x),
      part.map((u) => u.y),
    );
  const splitAt = (pos: number) => ({ first: fitPart(used.slice(0, pos + 1)), second: fitPart(used.slice(pos + 1)) });

  let pos: number;
  const candidates: LogLogDetails['candidates'] = [];
  if (options.firstLineEnd !== undefined) {
    pos = used.findIndex((u) => u.i === options.firstLineEnd);
    if (pos < 1 || pos > used.length - 3) {
      throw new InterpretationInputError('options.firstLineEnd', `must be the index of a point with q, s > 0 leaving at least two points on each line (got ${options.firstLineEnd})`);
    }
  } else {
    for (let k = minPerLine - 1; k <= used.length - minPerLine - 1; k++) {
      const { first, second } = splitAt(k);
      candidates.push({ firstLineEnd: used[k].i, sse: first.sse + second.sse });
    }
    // Splits whose SSE differ by rounding only count as equal; the earlier split wins the tie.
    const spread = fitPart(used).sse + Number.EPSILON;
    const best = candidates.reduce((a, b) => (b.sse < a.sse - 1e-9 * spread ? b : a));
    pos = used.findIndex((u) => u.i === best.firstLineEnd);
  }
  const { first: firstLine, second: secondLine } = splitAt(pos);
  // Rounding s to the resolution moves log s by about sd/(s·ln 10); what that alone leaves over four parameters.
  const sd = roundingSd(requirePositive(options.resolutionMm ?? DEFAULT_RESOLUTION_MM, 'options.resolutionMm'));
  const noise = used.reduce((sum, u) => sum + (sd / (10 ** u.y * Math.LN10)) ** 2, 0) * Math.max(0, used.length - 4) / used.length;
  const part = (from: number, to: number) => ({ xs: used.slice(from, to).map((u) => u.x), ys: used.slice(from, to).map((u) => u.y) });
  const significance = breakSignificance(part(0, pos + 1), part(pos + 1, used.length), noise, Math.max(1, candidates.length));
  const details: LogLogDetails = {
    firstLineEnd: used[pos].i,
    chosenBy: options.firstLineEnd === undefined ? 'leastSquares' : 'engineer',
    firstLine,
    secondLine,
    candidates,
    excludedIndices,
    significance,
  };
  const fit: FitQuality = { measure: 'sse', value: firstLine.sse + secondLine.sse };
  if (!isSteeper(firstLine.slope, secondLine.slope)) return result(LOG_LOG, { fit, details, reason: 'no break: the second line is not steeper than the first' });
  if (significance === null) return result(LOG_LOG, { fit, details, reason: TOO_FEW_FOR_NOISE });
  if (!significance.significant) return result(LOG_LOG, { fit, details, reason: noBreakReason(significance) });
  const x = (secondLine.intercept - firstLine.intercept) / (firstLine.slope - secondLine.slope);
  if (x < used[0].x || x > used[used.length - 1].x) return result(LOG_LOG, { fit, details, reason: 'the two lines meet outside the tested pressure range' });
  return result(LOG_LOG, { qUltKpa: 10 ** x, sUltMm: 10 ** (firstLine.intercept + firstLine.slope * x), fit, details });
}

// ---------------------------------------------------------------------------------------------------
// Tangent intersection

/** Options of the tangent-intersection method. */
export interface TangentOptions {
  /** Points (from the start of the curve) that define the initial tangent. Default 3. */
  initialPoints?: number;
  /** Points (from the end of the curve) that define the final tangent. Default 3. */
  finalPoints?: number;
  /** Resolution of the settlement readings, mm, for the significance of the break. Default 0.01. */
  resolutionMm?: number;
}

/** Working of the tangent method. Tangents are s = intercept + slope·q (s in mm, q in kPa). */
export interface TangentDetails {
  initial: LineFit;
  final: LineFit;
  /** Whether two tangents fit their points significantly better than one line; null with fewer than five points. */
  significance: BreakSignificance | null;
}

const TANGENT = {
  method: 'tangentIntersection',
  label: 'Tangent intersection',
  formula: 'initial tangent s = a1 + b1·q, final tangent s = a2 + b2·q; q_ult = (a1 − a2)/(b2 − b1)',
  source: 'Common practice (double-tangent construction on the arithmetic load–settlement curve)',
} as const;

/**
 * Tangent (double-tangent) intersection (reference §B.2 item 2, common practice). Algorithm chosen here:
 * the initial tangent is the least-squares line s = a1 + b1·q through the first `initialPoints` points,
 * the final tangent the least-squares line through the last `finalPoints` points (the two sets do not
 * overlap); q_ult = (a1 − a2)/(b2 − b1) where they cross. Null when the final tangent is not steeper, the
 * crossing lies outside the tested pressures, or there are too few points.
 */
export function tangentIntersection(points: readonly CurvePoint[], options: TangentOptions = {}): UltimateResult<'tangentIntersection', TangentDetails> {
  checkLoadingCurve(points);
  const nInitial = options.initialPoints ?? 3;
  const nFinal = options.finalPoints ?? 3;
  if (!Number.isInteger(nInitial) || nInitial < 2) throw new InterpretationInputError('options.initialPoints', 'must be a whole number ≥ 2');
  if (!Number.isInteger(nFinal) || nFinal < 2) throw new InterpretationInputError('options.finalPoints', 'must be a whole number ≥ 2');
  if (points.length < nInitial + nFinal) {
    return result(TANGENT, { reason: `needs at least ${nInitial + nFinal} points for ${nInitial} initial and ${nFinal} final tangent points (got ${points.length})` });
  }
  const line = (part: readonly CurvePoint[]) =>
    fitLine(
      part.map((p) => p.pressureKpa),
      part.map((p) => p.settlementMm),
    );
  const [head, tail] = [points.slice(0, nInitial), points.slice(points.length - nFinal)];
  const initial = line(head);
  const final = line(tail);
  const sd = roundingSd(requirePositive(options.resolutionMm ?? DEFAULT_RESOLUTION_MM, 'options.resolutionMm'));
  const xy = (part: readonly CurvePoint[]) => ({ xs: part.map((p) => p.pressureKpa), ys: part.map((p) => p.settlementMm) });
  const significance = breakSignificance(xy(head), xy(tail), sd * sd * Math.max(0, nInitial + nFinal - 4));
  const details = { initial, final, significance };
  const fit: FitQuality = { measure: 'sse', value: initial.sse + final.sse };
  if (!isSteeper(initial.slope, final.slope)) return result(TANGENT, { fit, details, reason: 'the final tangent is not steeper than the initial one' });
  if (significance === null) return result(TANGENT, { fit, details, reason: TOO_FEW_FOR_NOISE });
  if (!significance.significant) return result(TANGENT, { fit, details, reason: noBreakReason(significance) });
  const q = (initial.intercept - final.intercept) / (final.slope - initial.slope);
  if (q < points[0].pressureKpa || q > points[points.length - 1].pressureKpa) {
    return result(TANGENT, { fit, details, reason: 'the tangents cross outside the tested pressure range' });
  }
  return result(TANGENT, { qUltKpa: q, sUltMm: initial.intercept + initial.slope * q, fit, details });
}

// ---------------------------------------------------------------------------------------------------
// Hyperbolic (Chin–Kondner)

/** Working of the hyperbolic method: s/q = a + b·s (a in mm/kPa, b in 1/kPa). */
export interface HyperbolicDetails {
  a: number;
  b: number;
  /** Initial stiffness 1/a, kPa/mm; null when a ≤ 0. */
  initialStiffnessKpaPerMm: number | null;
  /** Pressure at the settlement criterion, when one was given. */
  atCriterion: {
    settlementMm: number;
    /** q = s/(a + b·s) on the fitted hyperbola, kPa. */
    byHyperbolaKpa: number | null;
    /** Linear interpolation of the measured points, kPa; null when the test did not reach the settlement. */
    byInterpolationKpa: number | null;
  } | null;
  /** Points left out because s/q is undefined (q = 0). */
  excludedIndices: number[];
}

const HYPERBOLIC = {
  method: 'hyperbolic',
  label: 'Hyperbolic asymptote (Chin–Kondner)',
  formula: 'q = s/(a + b·s) ⇔ s/q = a + b·s (least squares); q_ult = 1/b',
  source: 'Kondner (1963) ASCE JSMFD 89(SM1); Chin (1970) Proc. 2nd SE Asian Conf. Soil Eng.',
} as const;

/**
 * Hyperbolic method (reference §B.2 item 3; Kondner 1963, Chin 1970): least-squares line s/q = a + b·s;
 * q_ult = 1/b (the asymptote, which over-predicts the load reached in tests), initial stiffness 1/a.
 * With `criterionSettlementMm` also gives q there by the hyperbola, q = s/(a + b·s), and by linear
 * interpolation of the data. Null when fewer than three points have q > 0 or b ≤ 0 (no asymptote).
 */
export function hyperbolicUltimate(
  points: readonly CurvePoint[],
  criterionSettlementMm?: number,
  /** The curve read by interpolation at the criterion: default `points`; the zero-corrected curve with its origin when there is one. */
  interpolationCurve: readonly CurvePoint[] = points,
): UltimateResult<'hyperbolic', HyperbolicDetails> {
  checkLoadingCurve(points);
  if (criterionSettlementMm !== undefined) requirePositive(criterionSettlementMm, 'criterionSettlementMm');
  const excludedIndices = points.flatMap((p, i) => (p.pressureKpa > 0 ? [] : [i]));
  const used = points.filter((p) => p.pressureKpa > 0);
  if (used.length < 3) return result(HYPERBOLIC, { reason: `needs at least three points with q > 0 (got ${used.length})` });
  const line = fitLine(
    used.map((p) => p.settlementMm),
    used.map((p) => p.settlementMm / p.pressureKpa),
  );
  const [a, b] = [line.intercept, line.slope];
  const onHyperbola = (s: number) => (a + b * s > 0 ? s / (a + b * s) : null);
  const details: HyperbolicDetails = {
    a,
    b,
    initialStiffnessKpaPerMm: a > 0 ? 1 / a : null,
    atCriterion:
      criterionSettlementMm === undefined
        ? null
        : { settlementMm: criterionSettlementMm, byHyperbolaKpa: onHyperbola(criterionSettlementMm), byInterpolationKpa: pressureAtSettlement(interpolationCurve, criterionSettlementMm) },
    excludedIndices,
  };
  const fit: FitQuality = { measure: 'r2', value: line.r2 };
  if (b <= 0) return result(HYPERBOLIC, { fit, details, reason: 's/q does not rise with s: the data show no asymptote' });
  return result(HYPERBOLIC, { qUltKpa: 1 / b, fit, details, reason: 'asymptote: over-predicts the pressure reached in tests (practice applies 0.8–0.9 or reads q at a settlement criterion)' });
}

// ---------------------------------------------------------------------------------------------------
// Settlement criterion

/** Options of the settlement-criterion method. */
export interface SettlementCriterionOptions {
  /** Criterion as a fraction of the plate width or diameter. Default 0.1 (10 %). */
  fractionOfWidth?: number;
  /** Criterion as an absolute settlement, mm (e.g. 25); overrides `fractionOfWidth`. */
  settlementMm?: number;
}

/** Working of the settlement-criterion method. */
export interface SettlementCriterionDetails {
  criterionMm: number;
  /** Fraction of the width used, or null when an absolute settlement was given. */
  fractionOfWidth: number | null;
}

/** Settlement (mm) a criterion stands for on a plate of the given width. */
export function criterionSettlementMm(plateWidthMm: number, options: SettlementCriterionOptions = {}): number {
  if (options.settlementMm !== undefined) return requirePositive(options.settlementMm, 'options.settlementMm');
  return requireInRange(options.fractionOfWidth ?? 0.1, 1e-6, 1, 'options.fractionOfWidth') * requirePositive(plateWidthMm, 'plateWidthMm');
}

/**
 * Settlement criterion (reference §B.2 item 4, common practice): q_ult = pressure at s = fraction × plate
 * width (default 10 %), linear interpolation of the load–settlement points. Null when not reached.
 */
export function settlementCriterionUltimate(
  points: readonly CurvePoint[],
  plateWidthMm: number,
  options: SettlementCriterionOptions = {},
): UltimateResult<'settlementCriterion', SettlementCriterionDetails> {
  checkLoadingCurve(points);
  const criterionMm = criterionSettlementMm(plateWidthMm, options);
  const fractionOfWidth = options.settlementMm === undefined ? (options.fractionOfWidth ?? 0.1) : null;
  const head = {
    method: 'settlementCriterion',
    label: fractionOfWidth === null ? `Settlement criterion (${criterionMm} mm)` : `Settlement criterion (${+(fractionOfWidth * 100).toPrecision(6)} % of width)`,
    formula: 'q_ult = q at s = criterion, linear interpolation of the measured points',
    source: 'Common practice: pressure at a settlement of 10 % of the plate width (plate and pile convention)',
  } as const;
  const details = { criterionMm, fractionOfWidth };
  const q = pressureAtSettlement(points, criterionMm);
  if (q === null) {
    const reached = Math.max(...points.map((p) => p.settlementMm));
    return result(head, { details, reason: `not reached: the test stopped at ${+reached.toFixed(3)} mm, short of ${+criterionMm.toFixed(3)} mm` });
  }
  return result(head, { qUltKpa: q, sUltMm: criterionMm, details });
}

// ---------------------------------------------------------------------------------------------------
// Brinch Hansen 80 %

/** Working of the Brinch Hansen method: √s/q = C1·s + C2 (C1 in 1/(kPa·√mm), C2 in √mm/kPa). */
export interface BrinchHansenDetails {
  c1: number;
  c2: number;
  /** Settlement at 0.8·q_u, which the criterion makes s_u/4, mm. */
  settlementAt80PercentMm: number | null;
  /** True when s_u lies beyond the largest measured settlement. */
  extrapolated: boolean;
  excludedIndices: number[];
}

const BRINCH_HANSEN = {
  method: 'brinchHansen80',
  label: 'Brinch Hansen 80 %',
  formula: '√s/q = C1·s + C2 (least squares); q_u = 1/(2·√(C1·C2)), s_u = C2/C1',
  source: 'Brinch Hansen (1963) ASCE JSMFD 89(SM4), 80 % criterion',
} as const;

/**
 * Brinch Hansen 80 % criterion (reference §B.2 item 5; Brinch Hansen 1963): least-squares line
 * √s/q = C1·s + C2, then q_u = 1/(2√(C1·C2)) and s_u = C2/C1 (the peak of q = √s/(C1·s + C2), at which
 * 0.8·q_u corresponds to s_u/4). Null when fewer than three points have q > 0 or C1, C2 are not both > 0.
 */
export function brinchHansenUltimate(points: readonly CurvePoint[]): UltimateResult<'brinchHansen80', BrinchHansenDetails> {
  checkLoadingCurve(points);
  const excludedIndices = points.flatMap((p, i) => (p.pressureKpa > 0 && p.settlementMm >= 0 ? [] : [i]));
  const used = points.filter((_, i) => !excludedIndices.includes(i));
  if (used.length < 3) return result(BRINCH_HANSEN, { reason: `needs at least three points with q > 0 and s ≥ 0 (got ${used.length})` });
  const line = fitLine(
    used.map((p) => p.settlementMm),
    used.map((p) => Math.sqrt(p.settlementMm) / p.pressureKpa),
  );
  const [c1, c2] = [line.slope, line.intercept];
  const fit: FitQuality = { measure: 'r2', value: line.r2 };
  if (c1 <= 0 || c2 <= 0) {
    const details = { c1, c2, settlementAt80PercentMm: null, extrapolated: false, excludedIndices };
    return result(BRINCH_HANSEN, { fit, details, reason: 'C1 and C2 must both be positive: the curve shows no peak of the Brinch Hansen form' });
  }
  const sU = c2 / c1;
  const extrapolated = sU > Math.max(...used.map((p) => p.settlementMm));
  const details = { c1, c2, settlementAt80PercentMm: sU / 4, extrapolated, excludedIndices };
  return result(BRINCH_HANSEN, {
    qUltKpa: 1 / (2 * Math.sqrt(c1 * c2)),
    sUltMm: sU,
    fit,
    details,
    reason: extrapolated ? 's_u lies beyond the largest measured settlement (extrapolated)' : null,
  });
}

// ---------------------------------------------------------------------------------------------------
// Brinch Hansen 90 %

/** Working of the Brinch Hansen 90 % criterion. */
export interface BrinchHansen90Details {
  /** Settlement at 0.9·q_u read from the curve, mm. */
  settlementAt90PercentMm: number;
}

const BRINCH_HANSEN_90 = {
  method: 'brinchHansen90',
  label: 'Brinch Hansen 90 %',
  formula: 'q_u where s(q_u) = 2·s(0.9·q_u), s read from the curve by linear interpolation',
  source: 'Brinch Hansen (1963) ASCE JSMFD 89(SM4), 90 % criterion',
} as const;

/**
 * Brinch Hansen 90 % criterion (Brinch Hansen 1963): the ultimate pressure is the one at which the settlement
 * is twice the settlement at 90 % of it, s(q_u) = 2·s(0.9·q_u), both read from the curve (which should start
 * from its origin). The first crossing of s(q) − 2·s(0.9q) from below zero, by bisection between measured
 * pressures. Null when the test never gets there (no extrapolation).
 */
export function brinchHansen90Ultimate(points: readonly CurvePoint[]): UltimateResult<'brinchHansen90', BrinchHansen90Details> {
  checkLoadingCurve(points);
  const excess = (q: number) => {
    const [s, s90] = [settlementAtPressure(points, q), settlementAtPressure(points, 0.9 * q)];
    return s === null || s90 === null ? null : s - 2 * s90;
  };
  const qs = points.map((p) => p.pressureKpa).filter((q) => excess(q) !== null);
  let low: number | null = null;
  for (const q of qs) {
    const f = excess(q) as number;
    if (f < 0) low = q;
    else if (low !== null) {
      let [a, b] = [low, q];
      for (let i = 0; i < 60; i++) {
        const mid = (a + b) / 2;
        if ((excess(mid) as number) < 0) a = mid;
        else b = mid;
      }
      const s90 = settlementAtPressure(points, 0.9 * b) as number;
      return result(BRINCH_HANSEN_90, { qUltKpa: b, sUltMm: 2 * s90, details: { settlementAt90PercentMm: s90 } });
    }
  }
  return result(BRINCH_HANSEN_90, { reason: 'not reached: the settlement never doubles over the last tenth of the pressure within the test' });
}

// ---------------------------------------------------------------------------------------------------
// Side by side

/** Options of {@link compareUltimateMethods}; each part goes to its method. */
export interface CompareUltimateOptions {
  logLog?: LogLogOptions;
  tangent?: TangentOptions;
  /** Settlement criterion, also used for the hyperbola's q at the criterion. Default 10 % of the width. */
  criterion?: SettlementCriterionOptions;
  /**
   * The curve's origin (the seating point: the pressure at which the gauges were zeroed, s = 0). It is no
   * measurement, so no fit uses it; the methods that interpolate the curve (settlement criterion, the
   * hyperbola's q at the criterion) start from it. Default: none.
   */
  origin?: CurvePoint;
  /** Resolution of the settlement readings, mm, for the significance of a break. Default 0.01. */
  resolutionMm?: number;
}

/** A result of any ultimate-pressure method, discriminated by `method`. */
export type AnyUltimateResult =
  | UltimateResult<'logLogIntersection', LogLogDetails>
  | UltimateResult<'tangentIntersection', TangentDetails>
  | UltimateResult<'hyperbolic', HyperbolicDetails>
  | UltimateResult<'settlementCriterion', SettlementCriterionDetails>
  | UltimateResult<'brinchHansen80', BrinchHansenDetails>
  | UltimateResult<'brinchHansen90', BrinchHansen90Details>;

/**
 * Every ultimate-pressure method of reference §B.2 on one loading curve, side by side, so that the engineer
 * can choose (none is "the" value unless a contract fixes it). Input: the loading branch in test order.
 */
export function compareUltimateMethods(points: readonly CurvePoint[], plateWidthMm: number, options: CompareUltimateOptions = {}): AnyUltimateResult[] {
  checkLoadingCurve(points);
  const criterionMm = criterionSettlementMm(plateWidthMm, options.criterion);
  const interpolated = options.origin ? [options.origin, ...points] : points;
  if (options.origin) checkLoadingCurve(interpolated, 'origin and points');
  const resolution = options.resolutionMm === undefined ? {} : { resolutionMm: options.resolutionMm };
  return [
    logLogIntersection(points, { ...resolution, ...options.logLog }),
    tangentIntersection(points, { ...resolution, ...options.tangent }),
    hyperbolicUltimate(points, criterionMm, interpolated),
    settlementCriterionUltimate(interpolated, plateWidthMm, options.criterion),
    brinchHansenUltimate(points),
    brinchHansen90Ultimate(interpolated),
  ];
}
