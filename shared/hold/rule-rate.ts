import type { HoldRule } from '../schemas/plans';
import { rateDecay } from './decay';
import { rateNotDecaying } from './failure';
import { trailingRate } from './rate';
import { TIME_EPS_MIN, type TimePoint } from './series';
import type { CreepCheckOptions, RateEvidence, RuleEvidence, RuleOutcome } from './verdict';

type RateRule = Extract<HoldRule, { kind: 'rate' }>;

/** Minutes from now until a decaying rate is due below the threshold and the minimum hold is served; null when unknown. */
function etaFromDecay(crossingMin: number | null | undefined, minHoldMin: number, heldMin: number): number | null {
  if (crossingMin === null || crossingMin === undefined) return null;
  return Math.max(0, Math.max(crossingMin, minHoldMin) - heldMin);
}

/**
 * Rate rule: the least-squares rate over the trailing window is below the threshold (in magnitude, so the
 * same rule judges rebound on unloading) and the minimum hold time has passed (reference §A.3).
 */
export function evaluateRateRule(
  rule: RateRule,
  series: readonly TimePoint[],
  heldMin: number,
  creep: CreepCheckOptions = {},
): RuleOutcome<RuleEvidence<RateEvidence>> {
  const rate = trailingRate(series, { windowMin: rule.windowMin, untilMin: heldMin });
  const rateBelow = rate.slopeMmPerMin !== null && Math.abs(rate.slopeMmPerMin) < rule.maxRateMmPerMin;
  const minHoldServed = heldMin >= rule.minHoldMin - TIME_EPS_MIN;
  const satisfied = rateBelow && minHoldServed;

  // The failure check runs always so that the evidence shows the previous window's rate; it only counts while unsatisfied.
  const check = rateNotDecaying(series, {
    ...creep,
    windowMin: rule.windowMin,
    thresholdMmPerMin: rule.maxRateMmPerMin,
    heldMin,
    defaultAfterMin: Math.max(rule.minHoldMin, 3 * rule.windowMin),
  });
  const decay = satisfied ? null : rateDecay(series, rule.windowMin, heldMin, rule.maxRateMmPerMin);
  const etaMin = satisfied ? 0 : rateBelow ? rule.minHoldMin - heldMin : etaFromDecay(decay?.crossingMin, rule.minHoldMin, heldMin);

  return {
    satisfied,
    etaMin,
    failureSignals: !satisfied && check.signal ? [check.signal] : [],
    evidence: {
      kind: 'rate',
      currentRateMmPerMin: rate.slopeMmPerMin,
      rateStandardErrorMmPerMin: rate.slopeMmPerMin === null ? null : rate.standardErrorMmPerMin,
      rateUnavailableReason: rate.slopeMmPerMin === null ? rate.reason : null,
      previousRateMmPerMin: check.previousRateMmPerMin,
      maxRateMmPerMin: rule.maxRateMmPerMin,
      windowMin: rule.windowMin,
      coveredMin: rate.coveredMin,
      points: rate.points,
      minHoldMin: rule.minHoldMin,
      decayTimeConstantMin: decay?.timeConstantMin ?? null,
    },
  };
}
