import { requirePositive, requireFinite } from '../interpretation/input-checks';
import { countUpTo, TIME_EPS_MIN, type TimePoint } from './series';
import { fitSlope } from './slope-fit';

/** Options of {@link trailingRate}. */
export interface RateOptions {
  /** Length of the trailing window, minutes. Required. */
  windowMin: number;
  /** Only readings taken at or before this time are used, minutes; the window ends at the last of them. Default: the last reading. */
  untilMin?: number;
  /** Fewest readings the fit needs. Default 2 (two readings a whole window apart are a long-baseline rate, not a 1-min difference). */
  minPoints?: number;
}

/** A settlement rate fitted by least squares over a trailing window. */
export interface RateEstimate {
  /** Slope of settlement against time, mm/min (negative while the plate rebounds). */
  slopeMmPerMin: number;
  /** Standard error of the slope, mm/min; null when only two readings were fitted. */
  standardErrorMmPerMin: number | null;
  points: number;
  /** Time span of the readings actually fitted, minutes (from `fromMin` to `toMin`). */
  coveredMin: number;
  fromMin: number;
  toMin: number;
}

/** Why no rate could be fitted. */
export interface RateUnavailable {
  slopeMmPerMin: null;
  reason: string;
  points: number;
  coveredMin: number;
}

export type TrailingRate = RateEstimate | RateUnavailable;

/**
 * Settlement rate as the least-squares slope over the trailing `windowMin` minutes (reference §B.1, §D.3:
 * a 0.01 mm dial makes 1-min differences meaningless, so the rate is a regression over a window).
 *
 * The window ends at the last reading (not at "now", so a late manual reading does not empty it). When
 * readings are sparse (manual schedules: 9, 16, 25, 60 min) the reading just before the window start is
 * taken in too, so that the fit always spans the whole window; `coveredMin` reports the span used.
 * The rate is unavailable until the readings reach back a whole window.
 */
export function trailingRate(series: readonly TimePoint[], options: RateOptions): TrailingRate {
  const windowMin = requirePositive(options.windowMin, 'windowMin');
  const minPoints = Math.max(2, options.minPoints ?? 2);
  const end = options.untilMin === undefined ? series.length : countUpTo(series, requireFinite(options.untilMin, 'untilMin'));
  if (end === 0) return { slopeMmPerMin: null, reason: 'no readings yet', points: 0, coveredMin: 0 };

  const toMin = series[end - 1].tMin;
  const windowStart = toMin - windowMin;
  let first = end - 1;
  while (first > 0 && series[first - 1].tMin >= windowStart - TIME_EPS_MIN) first--;
  if (series[first].tMin > windowStart + TIME_EPS_MIN) {
    if (first === 0) {
      const covered = toMin - series[0].tMin;
      return {
        slopeMmPerMin: null,
        reason: `readings span ${covered.toFixed(2)} min, less than the ${windowMin}-min window`,
        points: end,
        coveredMin: covered,
      };
    }
    first--; // sparse readings: reach back to the reading before the window so the fit spans all of it
  }

  const points = end - first;
  const coveredMin = toMin - series[first].tMin;
  const fit =
    points >= minPoints
      ? fitSlope(
          points,
          (i) => series[first + i].tMin,
          (i) => series[first + i].settlementMm,
        )
      : null;
  if (!fit)
    return { slopeMmPerMin: null, reason: `${points} reading(s) in the window; at least ${minPoints} at different times are needed`, points, coveredMin };
  return { slopeMmPerMin: fit.slope, standardErrorMmPerMin: fit.slopeStandardError, points, coveredMin, fromMin: series[first].tMin, toMin };
}
