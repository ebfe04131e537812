import type { HoldRule } from '../schemas/plans';
import { exponentialDecay } from './decay';
import { rateNotDecaying } from './failure';
import { settlementAt, TIME_EPS_MIN, type TimePoint } from './series';
import type { ConsecutiveEvidence, CreepCheckOptions, IntervalChange, RuleEvidence, RuleOutcome } from './verdict';

type ConsecutiveRule = Extract<HoldRule, { kind: 'consecutive' }>;

/** Slack on the change limit, mm: 2.480 − 2.450 must count as 0.030, not 0.030000000000000027. */
const CHANGE_EPS_MM = 1e-9;

/** Recent interval changes that enter the decay fit of the time estimate. */
const DECAY_INTERVALS = 6;

/**
 * Settlement changes over the intervals [k·Δ, (k+1)·Δ] (Δ = `intervalMin`, t = 0 when the target was
 * reached) that the readings span, from readings snapped to the boundaries by linear interpolation.
 */
export function intervalChanges(series: readonly TimePoint[], intervalMin: number, maxChangeMm: number): IntervalChange[] {
  if (series.length < 2) return [];
  const firstK = Math.ceil(series[0].tMin / intervalMin - TIME_EPS_MIN);
  const lastK = Math.floor(series[series.length - 1].tMin / intervalMin + TIME_EPS_MIN);
  const changes: IntervalChange[] = [];
  let previous = settlementAt(series, firstK * intervalMin);
  for (let k = firstK + 1; k <= lastK; k++) {
    const current = settlementAt(series, k * intervalMin);
    if (previous !== null && current !== null) {
      const changeMm = current - previous;
      changes.push({ fromMin: (k - 1) * intervalMin, toMin: k * intervalMin, changeMm, withinLimit: Math.abs(changeMm) <= maxChangeMm + CHANGE_EPS_MM });
    }
    previous = current;
  }
  return changes;
}

/**
 * Consecutive rule: the settlement changed by no more than `maxChangeMm` in each of the last `intervals`
 * intervals (the "0.03 mm/min for 3 consecutive minutes" rule of the pavement tests, reference §A.3).
 */
export function evaluateConsecutiveRule(
  rule: ConsecutiveRule,
  series: readonly TimePoint[],
  heldMin: number,
  creep: CreepCheckOptions = {},
): RuleOutcome<RuleEvidence<ConsecutiveEvidence>> {
  const changes = intervalChanges(series, rule.intervalMin, rule.maxChangeMm);
  let passed = 0;
  while (passed < changes.length && changes[changes.length - 1 - passed].withinLimit) passed++;
  const satisfied = passed >= rule.intervals;

  const windowMin = rule.intervals * rule.intervalMin;
  const thresholdMmPerMin = rule.maxChangeMm / rule.intervalMin;
  const check = rateNotDecaying(series, { ...creep, windowMin, thresholdMmPerMin, heldMin, defaultAfterMin: 3 * windowMin });

  let etaMin: number | null = 0;
  if (!satisfied) {
    const lastBoundary = changes.at(-1)?.toMin ?? null;
    if (passed > 0 && lastBoundary !== null) {
      etaMin = Math.max(0, lastBoundary + (rule.intervals - passed) * rule.intervalMin - heldMin);
    } else {
      // Interval changes of an exponential approach decay like e^(−t/τ) with the interval start t: fit the
      // recent ones and take the first boundary from which they stay within the limit.
      const recent = changes.slice(-DECAY_INTERVALS);
      const crossing = exponentialDecay(
        recent.map((c) => c.fromMin),
        recent.map((c) => c.changeMm),
        rule.maxChangeMm,
      )?.crossingMin;
      const start = crossing == null ? null : Math.max(lastBoundary ?? 0, Math.ceil(crossing / rule.intervalMin - TIME_EPS_MIN) * rule.intervalMin);
      etaMin = start === null ? null : Math.max(0, start + windowMin - heldMin);
    }
  }

  return {
    satisfied,
    etaMin,
    failureSignals: !satisfied && check.signal ? [check.signal] : [],
    evidence: {
      kind: 'consecutive',
      intervalMin: rule.intervalMin,
      maxChangeMm: rule.maxChangeMm,
      intervalsRequired: rule.intervals,
      intervalsPassed: passed,
      recentIntervals: changes.slice(-(rule.intervals + 1)),
      currentRateMmPerMin: check.currentRateMmPerMin,
      previousRateMmPerMin: check.previousRateMmPerMin,
    },
  };
}
