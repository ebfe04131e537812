import { interpolateFirstCrossing } from './curve';
import { InterpretationInputError, requireFinite, requireNonNegative, requirePositive } from './input-checks';
import { fitLine } from './regression';

/** Mean settlement at a time within one stage. */
export interface TimeSettlement {
  /** Minutes since the start of the stage. */
  tMin: number;
  settlementMm: number;
}

function checkSeries(readings: readonly TimeSettlement[], field: string, minReadings: number): void {
  if (readings.length < minReadings) throw new InterpretationInputError(field, `needs at least ${minReadings} readings (got ${readings.length})`);
  readings.forEach((r, i) => {
    requireNonNegative(r.tMin, `${field}[${i}].tMin`);
    requireFinite(r.settlementMm, `${field}[${i}].settlementMm`);
    if (i > 0 && r.tMin < readings[i - 1].tMin) throw new InterpretationInputError(`${field}[${i}].tMin`, 'readings must be in time order');
  });
}

/** s against log10 t for a Casagrande-type plot (reference §B.8); readings at t = 0 are left out. */
export function settlementLogTime(readings: readonly TimeSettlement[]): { log10TMin: number; settlementMm: number }[] {
  checkSeries(readings, 'readings', 1);
  return readings.filter((r) => r.tMin > 0).map((r) => ({ log10TMin: Math.log10(r.tMin), settlementMm: r.settlementMm }));
}

/** s against √t for a Taylor-type plot (reference §B.8; the IS 1888 reading times make it straight early on). */
export function settlementRootTime(readings: readonly TimeSettlement[]): { sqrtTMin: number; settlementMm: number }[] {
  checkSeries(readings, 'readings', 1);
  return readings.map((r) => ({ sqrtTMin: Math.sqrt(r.tMin), settlementMm: r.settlementMm }));
}

/** Creep per log cycle of time between two times of a hold. */
export interface CreepCoefficient {
  /** k_s = (s_b − s_a)/log10(t_b/t_a), mm per log cycle; null when the readings do not span both times. */
  ksMm: number | null;
  fromMin: number;
  toMin: number;
  reason: string | null;
  formula: string;
  source: string;
}

/**
 * Creep coefficient per log cycle (reference §B.8, as in EN ISO 22477-1 pile testing):
 * k_s = (s_b − s_a)/log10(t_b/t_a), s_a and s_b interpolated linearly in time at t_a and t_b.
 */
export function creepPerLogCycle(readings: readonly TimeSettlement[], fromMin: number, toMin: number): CreepCoefficient {
  checkSeries(readings, 'readings', 2);
  const ta = requirePositive(fromMin, 'fromMin');
  if (!(requirePositive(toMin, 'toMin') > ta)) throw new InterpretationInputError('toMin', 'must be later than fromMin');
  const at = (t: number) =>
    interpolateFirstCrossing(
      readings.map((r) => r.tMin),
      readings.map((r) => r.settlementMm),
      t,
    );
  const [sa, sb] = [at(ta), at(toMin)];
  const head = { fromMin: ta, toMin, formula: 'k_s = (s_b − s_a)/log10(t_b/t_a)', source: 'EN ISO 22477-1 creep coefficient (pile testing), applied to plate holds' };
  if (sa === null || sb === null) return { ...head, ksMm: null, reason: `the readings do not span ${ta}–${toMin} min` };
  return { ...head, ksMm: (sb - sa) / Math.log10(toMin / ta), reason: null };
}

/** Hyperbolic fit of a stage's settlement against time, t/Δs = a + b·t. */
export interface HyperbolicTimeFit {
  /** a in min/mm, b in 1/mm. */
  a: number;
  b: number;
  r2: number;
  /** Settlement of the stage at which the reading times are measured from, mm. */
  startSettlementMm: number;
  /** Probable ultimate settlement increment of the stage, 1/b, mm; null when b ≤ 0. */
  ultimateIncrementMm: number | null;
  /** Increment reached at the last reading as a percentage of the ultimate; null when not determined. */
  percentOfUltimate: number | null;
  lastTMin: number;
  reason: string | null;
  formula: string;
  source: string;
}

/** Options of {@link hyperbolicTimeFit}. */
export interface HyperbolicTimeOptions {
  /** Readings before this time (minutes) are left out of the fit. Default 0. */
  fromMin?: number;
  /** Settlement at the start of the stage, mm. Default: the reading at t = 0 (required then). */
  startSettlementMm?: number;
}

/**
 * Hyperbolic time fit of one stage (reference §B.8; Tan 1971, Sridharan et al. 1987): with Δs the settlement
 * since the stage start, least squares t/Δs = a + b·t; ultimate increment 1/b and the percentage reached
 * at the last reading, Δs(t)/(1/b)·100 — an objective form of IS 1888's 70–80 % rule for clays.
 */
export function hyperbolicTimeFit(readings: readonly TimeSettlement[], options: HyperbolicTimeOptions = {}): HyperbolicTimeFit {
  checkSeries(readings, 'readings', 1);
  const fromMin = requireNonNegative(options.fromMin ?? 0, 'options.fromMin');
  if (options.startSettlementMm === undefined && readings[0].tMin !== 0) {
    throw new InterpretationInputError('options.startSettlementMm', 'give it, or include a reading at t = 0');
  }
  const start = requireFinite(options.startSettlementMm ?? readings[0].settlementMm, 'options.startSettlementMm');
  // Readings with no settlement since the start have t/Δs undefined and are left out.
  const used = readings.filter((r) => r.tMin > 0 && r.tMin >= fromMin && r.settlementMm !== start);
  if (used.length < 3) throw new InterpretationInputError('readings', `needs at least three readings after t = 0 (and from ${fromMin} min) with settlement since the start (got ${used.length})`);
  const line = fitLine(
    used.map((r) => r.tMin),
    used.map((r) => r.tMin / (r.settlementMm - start)),
    'readings',
  );
  const last = readings[readings.length - 1];
  const ultimate = line.slope > 0 ? 1 / line.slope : null;
  return {
    a: line.intercept,
    b: line.slope,
    r2: line.r2,
    startSettlementMm: start,
    ultimateIncrementMm: ultimate,
    percentOfUltimate: ultimate === null ? null : ((last.settlementMm - start) / ultimate) * 100,
    lastTMin: last.tMin,
    reason: ultimate === null ? 't/Δs does not rise with t: no ultimate settlement' : null,
    formula: 't/Δs = a + b·t; Δs_ult = 1/b; percent = Δs(t)/Δs_ult × 100',
    source: 'Hyperbolic time–settlement fit (Tan 1971; Sridharan et al. 1987)',
  };
}

/** Settlement increment on the fitted hyperbola at time t: Δs = t/(a + b·t), mm. */
export function hyperbolicIncrementAt(fit: Pick<HyperbolicTimeFit, 'a' | 'b'>, tMin: number): number | null {
  const denominator = fit.a + fit.b * requireNonNegative(tMin, 'tMin');
  return denominator > 0 ? tMin / denominator : null;
}

/** One load–release cycle: settlement at the end of the load hold and at the end of the release, mm. */
export interface LoadReleaseCycle {
  loadedMm: number;
  releasedMm: number;
}

/** The split of one cycle into total, rebound (elastic) and residual (plastic) deflection. */
export interface CycleSplit {
  cycle: number;
  /** Deflection at load from the test's zero, mm. */
  totalMm: number;
  /** Recovery on release, loaded − released, mm. */
  reboundMm: number;
  /** Deflection left after release, from the test's zero, mm. */
  residualMm: number;
  /** Residual added by this cycle, mm. */
  residualIncrementMm: number;
  /** Rebound / total; null when the total is zero. */
  elasticFraction: number | null;
}

/**
 * Cyclic evaluation (reference §B.9; ASTM D1195 terms): per cycle total deflection at load, rebound on
 * release, residual deflection and elastic fraction = rebound/total; the residual's growth per cycle.
 */
export function cyclicSplit(cycles: readonly LoadReleaseCycle[], zeroMm = 0): CycleSplit[] {
  requireFinite(zeroMm, 'zeroMm');
  if (cycles.length === 0) throw new InterpretationInputError('cycles', 'needs at least one cycle');
  let previousResidual = 0;
  return cycles.map((c, i) => {
    const totalMm = requireFinite(c.loadedMm, `cycles[${i}].loadedMm`) - zeroMm;
    const residualMm = requireFinite(c.releasedMm, `cycles[${i}].releasedMm`) - zeroMm;
    const reboundMm = totalMm - residualMm;
    const split = { cycle: i + 1, totalMm, reboundMm, residualMm, residualIncrementMm: residualMm - previousResidual, elasticFraction: totalMm === 0 ? null : reboundMm / totalMm };
    previousResidual = residualMm;
    return split;
  });
}
