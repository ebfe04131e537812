import type { TimePoint } from './series';
import { fitSlope } from './slope-fit';

/** Hyperbolic time fit of one stage, t/Δs = a + b·t (reference §B.8). */
export interface HyperbolicTimeFit {
  /** Intercept a, min/mm (1/a = initial settlement rate of the stage, mm/min). */
  aMinPerMm: number;
  /** Slope b, 1/mm (1/b = probable ultimate settlement of the stage when b > 0). */
  bPerMm: number;
  /** Probable ultimate settlement of the stage, 1/b, mm (a magnitude); null when b ≤ 0 (settlement not converging). */
  ultimateMm: number | null;
  /** 1 while the plate settles, −1 while it rebounds (unloading); Δs is taken in this direction. */
  direction: 1 | -1;
  points: number;
}

/** Options of {@link hyperbolicTimeFit}. */
export interface HyperbolicFitOptions {
  /** Readings with a stage settlement below this are left out of the fit (t/Δs is meaningless for a few gauge divisions), mm. Default 0.05. */
  minStageSettlementMm?: number;
  /** Fewest readings the fit needs. Default 3. */
  minPoints?: number;
}

/**
 * Fits t/Δs = a + b·t by least squares over the readings of a stage, where t is the time since the target
 * was reached and Δs the settlement since the first reading (taken when the target was reached). Then
 * Δs → 1/b as t → ∞, the probable ultimate settlement of the stage, and the share reached at time t is
 * Δs(t)·b (reference §B.8; method from consolidation practice, Tan 1971 / Sridharan et al. 1987 — from memory).
 * Rebound on unloading is fitted the same way, with Δs measured upwards. Null when fewer than
 * `minPoints` readings qualify.
 */
export function hyperbolicTimeFit(readings: readonly TimePoint[], options: HyperbolicFitOptions = {}): HyperbolicTimeFit | null {
  if (readings.length === 0) return null;
  const minStage = options.minStageSettlementMm ?? 0.05;
  const base = readings[0].settlementMm;
  const direction = readings[readings.length - 1].settlementMm >= base ? 1 : -1;
  const stage = (p: TimePoint) => direction * (p.settlementMm - base);
  const used = readings.filter((p) => p.tMin > 0 && stage(p) >= minStage);
  if (used.length < (options.minPoints ?? 3)) return null;
  const fit = fitSlope(
    used.length,
    (i) => used[i].tMin,
    (i) => used[i].tMin / stage(used[i]),
  );
  if (!fit) return null;
  return { aMinPerMm: fit.intercept, bPerMm: fit.slope, ultimateMm: fit.slope > 0 ? 1 / fit.slope : null, direction, points: used.length };
}

/**
 * Time at which the fitted hyperbola reaches `fraction` (0–1) of its ultimate settlement:
 * b·t/(a + b·t) = p ⇒ t = p·a / (b·(1 − p)) [calc]. Null when the fit has no finite ultimate or a ≤ 0.
 */
export function timeToFraction(fit: HyperbolicTimeFit, fraction: number): number | null {
  if (fit.ultimateMm === null || fit.aMinPerMm <= 0) return null;
  return (fraction * fit.aMinPerMm) / (fit.bPerMm * (1 - fraction));
}
