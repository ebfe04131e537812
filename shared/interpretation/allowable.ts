import { type CurvePoint, checkCurve, pressureAtSettlement } from './curve';
import { InterpretationInputError, requireNonNegative, requirePositive } from './input-checks';
import { plateSettlementForFooting, type SettlementScaling, settlementRatio } from './scaling';

/** Input of {@link shearAllowable}. */
export interface ShearAllowableInput {
  /** Ultimate (gross) pressure of the footing, kPa (scaled from the plate). */
  qUltFootingKpa: number;
  /** Factor of safety on the net ultimate pressure. Default 3 (2.5–3 is typical). */
  factorOfSafety?: number;
  /** Unit weight of the soil above founding level, kN/m³. Default 0. */
  unitWeightKnM3?: number;
  /** Depth of the footing base below ground, m. Default 0. */
  foundationDepthM?: number;
}

/** Safe bearing pressure against shear failure. */
export interface ShearAllowable {
  overburdenKpa: number;
  netUltimateKpa: number;
  /** Net safe bearing capacity (q_u − γD)/FS, kPa. */
  netSafeKpa: number;
  /** Gross safe bearing capacity: net safe + γD, kPa. */
  grossSafeKpa: number;
  factorOfSafety: number;
  formula: string;
  source: string;
}

/**
 * Safe bearing pressure in shear (reference §B.4; IS 6403 practice): q_net,u = q_u − γ·D_f,
 * q_safe,net = q_net,u/FS, q_safe,gross = q_safe,net + γ·D_f.
 */
export function shearAllowable(input: ShearAllowableInput): ShearAllowable {
  const qu = requirePositive(input.qUltFootingKpa, 'qUltFootingKpa');
  const fs = requirePositive(input.factorOfSafety ?? 3, 'factorOfSafety');
  const overburdenKpa = requireNonNegative(input.unitWeightKnM3 ?? 0, 'unitWeightKnM3') * requireNonNegative(input.foundationDepthM ?? 0, 'foundationDepthM');
  if (qu <= overburdenKpa) throw new InterpretationInputError('qUltFootingKpa', `must exceed the overburden γD = ${overburdenKpa} kPa`);
  const netUltimateKpa = qu - overburdenKpa;
  const netSafeKpa = netUltimateKpa / fs;
  return {
    overburdenKpa,
    netUltimateKpa,
    netSafeKpa,
    grossSafeKpa: netSafeKpa + overburdenKpa,
    factorOfSafety: fs,
    formula: 'q_safe,net = (q_u − γ·D_f)/FS; q_safe,gross = q_safe,net + γ·D_f',
    source: 'IS 6403 net safe bearing capacity; common practice',
  };
}

/** Input of {@link settlementAllowable}. */
export interface SettlementAllowableInput {
  /** The plate's loading curve, in test order. */
  curve: readonly CurvePoint[];
  plateWidthM: number;
  footingWidthM: number;
  scaling: SettlementScaling;
  /** Permissible footing settlement, mm. Default 25 (Terzaghi & Peck, isolated footings on sand). */
  permissibleSettlementMm?: number;
}

/** Safe bearing pressure against excessive settlement. */
export interface SettlementAllowable {
  ratio: number;
  /** Plate settlement that corresponds to the permissible footing settlement, mm. */
  plateSettlementMm: number;
  /** Pressure read from the plate curve at that settlement, kPa; null when the test did not reach it. */
  qKpa: number | null;
  /** When not reached: the largest pressure tested, a lower bound of the answer, kPa. */
  lowerBoundKpa: number | null;
  reason: string | null;
  formula: string;
  source: string;
}

/**
 * The plate pressure at a settlement, or — when the curve stops short of it — the largest pressure
 * tested as a lower bound. Neither when the settlement lies below the curve's first point.
 */
function readPlateCurve(curve: readonly CurvePoint[], settlementMm: number): { qKpa: number | null; lowerBoundKpa: number | null } {
  const qKpa = pressureAtSettlement(curve, settlementMm);
  if (qKpa !== null) return { qKpa, lowerBoundKpa: null };
  const beyond = settlementMm > Math.max(...curve.map((p) => p.settlementMm));
  return { qKpa: null, lowerBoundKpa: beyond ? Math.max(...curve.map((p) => p.pressureKpa)) : null };
}

/**
 * Safe bearing pressure for a permissible settlement (reference §B.4): S_p,allow = S_f,allow / ratio(B_f, B_p),
 * and q is read from the plate curve at S_p,allow by linear interpolation.
 */
export function settlementAllowable(input: SettlementAllowableInput): SettlementAllowable {
  checkCurve(input.curve, 'curve', 2);
  const scaled = plateSettlementForFooting(input.permissibleSettlementMm ?? 25, input.plateWidthM, input.footingWidthM, input.scaling);
  const { qKpa, lowerBoundKpa } = readPlateCurve(input.curve, scaled.settlementMm);
  const at = `${+scaled.settlementMm.toFixed(3)} mm`;
  return {
    ratio: scaled.ratio,
    plateSettlementMm: scaled.settlementMm,
    qKpa,
    lowerBoundKpa,
    reason:
      qKpa !== null
        ? null
        : lowerBoundKpa !== null
          ? `the plate curve does not reach ${at}; the safe pressure is at least ${+lowerBoundKpa.toFixed(1)} kPa`
          : `the plate curve starts above ${at}; it cannot be read there`,
    formula: `S_p,allow = S_f,allow/ratio; q read from the plate curve at S_p,allow; ${scaled.formula}`,
    source: scaled.source,
  };
}

/** The governing allowable bearing pressure and which check governs. */
export interface AllowableBearingPressure {
  qAllowKpa: number | null;
  governs: 'shear' | 'settlement' | null;
  reason: string | null;
}

/**
 * Allowable bearing pressure = min(net safe pressure in shear, safe pressure for settlement), both taken
 * as net pressures at founding level (reference §B.4, common practice). When the test did not reach the
 * settlement, shear governs only if it is below the largest pressure tested.
 */
export function allowableBearingPressure(shear: Pick<ShearAllowable, 'netSafeKpa'>, settlement: Pick<SettlementAllowable, 'qKpa' | 'lowerBoundKpa'>): AllowableBearingPressure {
  const q = shear.netSafeKpa;
  if (settlement.qKpa !== null) {
    return q <= settlement.qKpa ? { qAllowKpa: q, governs: 'shear', reason: null } : { qAllowKpa: settlement.qKpa, governs: 'settlement', reason: null };
  }
  if (settlement.lowerBoundKpa !== null && q <= settlement.lowerBoundKpa) return { qAllowKpa: q, governs: 'shear', reason: null };
  return { qAllowKpa: null, governs: null, reason: 'the test stopped before the permissible settlement and below the safe pressure in shear: the settlement check is not determined' };
}

/** Input of {@link designFootingWidth}. */
export interface FootingWidthInput {
  /** Column load on a square footing, kN. */
  columnLoadKn: number;
  curve: readonly CurvePoint[];
  plateWidthM: number;
  scaling: SettlementScaling;
  /** Permissible footing settlement, mm. Default 25. */
  permissibleSettlementMm?: number;
  /** Widths searched, m. Default [0.3, 10]. */
  widthRangeM?: readonly [number, number];
  /** Width tolerance of the bisection, m. Default 0.0001. */
  toleranceM?: number;
}

/** A square footing width that keeps the settlement within the permissible value. */
export interface FootingWidth {
  widthM: number;
  /** Q/B² at that width, kPa. */
  bearingPressureKpa: number;
  /** Plate settlement corresponding to the permissible footing settlement at that width, mm. */
  plateSettlementMm: number;
  ratio: number;
  iterations: number;
  /**
   * True when, just below the answer, the plate curve stopped short of the settlement needed: a smaller
   * footing might do, but the test cannot show it. The width given is then on the safe side.
   */
  limitedByTestRange: boolean;
}

/**
 * Square footing width for a column load Q by bracketed bisection on B (reference §B.4): find B with
 * Q/B² = q_plate(S_f,allow / ratio(B, B_p)), q_plate read from the plate curve. Where the curve does not
 * reach the needed plate settlement its largest pressure stands for q_plate (a lower bound), which keeps
 * the answer on the safe side. Throws naming `widthRangeM` when no width in the range is the answer.
 */
export function designFootingWidth(input: FootingWidthInput): FootingWidth {
  const load = requirePositive(input.columnLoadKn, 'columnLoadKn');
  checkCurve(input.curve, 'curve', 2);
  const [lo0, hi0] = input.widthRangeM ?? [0.3, 10];
  requirePositive(lo0, 'widthRangeM[0]');
  if (!(requirePositive(hi0, 'widthRangeM[1]') > lo0)) throw new InterpretationInputError('widthRangeM', 'the upper width must exceed the lower');
  const tolerance = requirePositive(input.toleranceM ?? 1e-4, 'toleranceM');
  const permissible = requirePositive(input.permissibleSettlementMm ?? 25, 'permissibleSettlementMm');

  /** Whether width B is enough, and whether a "no" rests on a curve that stops short (unknown, taken as no). */
  const judge = (b: number) => {
    const { qKpa, lowerBoundKpa } = readPlateCurve(input.curve, permissible / settlementRatio(input.scaling, input.plateWidthM, b));
    const demand = load / (b * b);
    if (qKpa !== null) return { enough: demand <= qKpa, shortCurve: false };
    const enough = lowerBoundKpa !== null && demand <= lowerBoundKpa;
    return { enough, shortCurve: !enough };
  };

  const smallest = judge(lo0);
  if (smallest.enough) throw new InterpretationInputError('widthRangeM', `already the smallest width ${lo0} m keeps the settlement within ${permissible} mm; lower the range`);
  if (!judge(hi0).enough) throw new InterpretationInputError('widthRangeM', `no width up to ${hi0} m keeps the settlement within ${permissible} mm on this plate curve`);
  let [lo, hi, iterations] = [lo0, hi0, 0];
  let shortBelow = smallest.shortCurve;
  while (hi - lo > tolerance) {
    const mid = (lo + hi) / 2;
    const verdict = judge(mid);
    if (verdict.enough) hi = mid;
    else [lo, shortBelow] = [mid, verdict.shortCurve];
    iterations++;
  }
  const ratio = settlementRatio(input.scaling, input.plateWidthM, hi);
  return { widthM: hi, bearingPressureKpa: load / (hi * hi), plateSettlementMm: permissible / ratio, ratio, iterations, limitedByTestRange: shortBelow };
}
