import { InterpretationInputError, requireFinite } from '../interpretation/input-checks';

/** One settlement reading of a hold: minutes since the stage's target was reached, and settlement in mm. */
export interface TimePoint {
  tMin: number;
  /** Cumulative (mean) settlement of the plate, mm — the same figure the stop limit applies to. */
  settlementMm: number;
}

/** Time tolerance, minutes (≈ 0.06 ms): absorbs floating-point error in schedule and boundary arithmetic. */
export const TIME_EPS_MIN = 1e-6;

/** Throws naming the element when a reading is not finite or the readings are out of time order. */
export function checkSeries(series: readonly TimePoint[], field = 'series'): void {
  series.forEach((p, i) => {
    requireFinite(p.tMin, `${field}[${i}].tMin`);
    requireFinite(p.settlementMm, `${field}[${i}].settlementMm`);
    if (i > 0 && p.tMin < series[i - 1].tMin) throw new InterpretationInputError(`${field}[${i}].tMin`, 'readings must be in time order');
  });
}

/** Number of readings taken at or before `tMin` (binary search; the series is in time order). */
export function countUpTo(series: readonly TimePoint[], tMin: number): number {
  let lo = 0;
  let hi = series.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (series[mid].tMin <= tMin + TIME_EPS_MIN) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** The readings taken at or before `tMin`. */
export function readingsUpTo(series: readonly TimePoint[], tMin: number): readonly TimePoint[] {
  const n = countUpTo(series, tMin);
  return n === series.length ? series : series.slice(0, n);
}

/** Settlement at `tMin`, interpolated linearly between the readings around it; null outside the readings. */
export function settlementAt(series: readonly TimePoint[], tMin: number): number | null {
  const n = series.length;
  if (n === 0 || tMin < series[0].tMin - TIME_EPS_MIN || tMin > series[n - 1].tMin + TIME_EPS_MIN) return null;
  const after = Math.min(countUpTo(series, tMin), n - 1);
  const p1 = series[after];
  const p0 = series[Math.max(after - 1, 0)];
  if (Math.abs(p1.tMin - tMin) <= TIME_EPS_MIN) return p1.settlementMm;
  if (Math.abs(p0.tMin - tMin) <= TIME_EPS_MIN || p1.tMin === p0.tMin) return p0.settlementMm;
  return p0.settlementMm + ((tMin - p0.tMin) / (p1.tMin - p0.tMin)) * (p1.settlementMm - p0.settlementMm);
}
