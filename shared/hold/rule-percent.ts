import type { HoldRule } from '../schemas/plans';
import { hyperbolicTimeFit, timeToFraction } from './hyperbolic';
import { TIME_EPS_MIN, type TimePoint } from './series';
import type { FailureSignal, PercentEvidence, RuleEvidence, RuleOutcome } from './verdict';

type PercentRule = Extract<HoldRule, { kind: 'percentOfUltimate' }>;

/**
 * Percent-of-ultimate rule for clays (IS 1888 family, 70–80 % of the stage's probable ultimate settlement,
 * or 24 h): the ultimate comes from the hyperbolic time fit t/Δs = a + b·t (reference §B.8). After
 * `maxHoldMin` the hold is satisfied anyway, and the evidence says so (`satisfiedBy: 'max-hold-cap'`).
 */
export function evaluatePercentRule(
  rule: PercentRule,
  series: readonly TimePoint[],
  heldMin: number,
  resolutionMm: number,
): RuleOutcome<RuleEvidence<PercentEvidence>> {
  const fit = hyperbolicTimeFit(series, { minStageSettlementMm: 5 * resolutionMm });
  const stageSettlementMm = series.length === 0 ? null : series[series.length - 1].settlementMm - series[0].settlementMm;
  const percentOfUltimate = fit?.ultimateMm == null || stageSettlementMm === null ? null : (100 * fit.direction * stageSettlementMm) / fit.ultimateMm;
  const fitTargetTimeMin = fit === null ? null : timeToFraction(fit, rule.percent / 100);

  const minHoldServed = heldMin >= rule.minHoldMin - TIME_EPS_MIN;
  const byPercent = minHoldServed && percentOfUltimate !== null && percentOfUltimate >= rule.percent;
  const byCap = heldMin >= rule.maxHoldMin - TIME_EPS_MIN;
  const satisfied = byPercent || byCap;

  const failureSignals: FailureSignal[] = [];
  if (!satisfied && minHoldServed && fit !== null && fit.ultimateMm === null) {
    failureSignals.push({
      code: 'no-finite-ultimate',
      message: `The time fit has no finite ultimate settlement (b = ${fit.bPerMm.toExponential(3)} 1/mm): the stage is not converging.`,
      source: { tag: 'common practice', text: 'A hyperbolic time fit with b ≤ 0 means settlement at a steady or growing rate' },
    });
  }

  // Before a fit exists the cap is still a known upper bound on the wait.
  const expected = Math.min(Math.max(fitTargetTimeMin ?? rule.maxHoldMin, rule.minHoldMin), rule.maxHoldMin);
  return {
    satisfied,
    etaMin: satisfied ? 0 : Math.max(0, expected - heldMin),
    failureSignals,
    evidence: {
      kind: 'percentOfUltimate',
      percentOfUltimate,
      targetPercent: rule.percent,
      stageSettlementMm,
      fit,
      fitTargetTimeMin,
      minHoldMin: rule.minHoldMin,
      maxHoldMin: rule.maxHoldMin,
      satisfiedBy: byPercent ? 'percent' : byCap ? 'max-hold-cap' : null,
    },
  };
}
