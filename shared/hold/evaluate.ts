import { InterpretationInputError, requireNonNegative, requirePositive } from '../interpretation/input-checks';
import { holdRuleSchema, type HoldRule } from '../schemas/plans';
import { holdCriterion } from './criterion';
import { commonFailureSignals } from './failure';
import { evaluateConsecutiveRule } from './rule-consecutive';
import { evaluateFixedRule } from './rule-fixed';
import { evaluatePercentRule } from './rule-percent';
import { evaluateRateRule } from './rule-rate';
import { checkSeries, readingsUpTo, type TimePoint } from './series';
import type { AnyRuleEvidence, HoldContext, HoldEvaluation, RuleOutcome } from './verdict';

function checkRule(rule: HoldRule): void {
  const parsed = holdRuleSchema.safeParse(rule);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new InterpretationInputError(['rule', ...issue.path.map(String)].join('.'), issue.message);
  }
}

function evaluateRule(rule: HoldRule, readings: readonly TimePoint[], heldMin: number, context: HoldContext): RuleOutcome<AnyRuleEvidence> {
  switch (rule.kind) {
    case 'rate':
      return evaluateRateRule(rule, readings, heldMin, context.creepCheck);
    case 'consecutive':
      return evaluateConsecutiveRule(rule, readings, heldMin, context.creepCheck);
    case 'fixed':
      return evaluateFixedRule(rule, heldMin);
    case 'percentOfUltimate':
      return evaluatePercentRule(rule, readings, heldMin, context.resolutionMm ?? 0.01);
  }
}

/**
 * Judges one increment's hold from its settlement–time readings (t = 0 when the stage's target was reached):
 * still settling, satisfied, or failure suspected, with the evidence behind the verdict, the criterion
 * and where its defaults come from, and an estimate of the minutes left. Readings after `context.nowMin`
 * are ignored. Failure signals (stop limit, pressure not holdable, rate not decaying, no finite ultimate,
 * hold overran the plan's limit) outrank satisfaction. Bad input throws naming the field.
 */
export function evaluateHold(rule: HoldRule, series: readonly TimePoint[], context: HoldContext): HoldEvaluation {
  checkRule(rule);
  checkSeries(series);
  const heldMin = requireNonNegative(context.nowMin, 'context.nowMin');
  const stopLimitMm = requirePositive(context.stopLimitMm, 'context.stopLimitMm');
  if (context.maxHoldMin !== undefined) requirePositive(context.maxHoldMin, 'context.maxHoldMin');
  if (context.resolutionMm !== undefined) requirePositive(context.resolutionMm, 'context.resolutionMm');

  const readings = readingsUpTo(series, heldMin);
  const latestSettlementMm = readings.length === 0 ? null : readings[readings.length - 1].settlementMm;
  const outcome = evaluateRule(rule, readings, heldMin, context);
  const failureSignals = [
    ...commonFailureSignals({
      heldMin,
      latestSettlementMm,
      stopLimitMm,
      pressureHoldable: context.pressureHoldable ?? true,
      maxHoldMin: context.maxHoldMin,
      satisfied: outcome.satisfied,
    }),
    ...outcome.failureSignals,
  ];
  const verdict = failureSignals.length > 0 ? 'failure-suspected' : outcome.satisfied ? 'satisfied' : 'settling';
  return {
    verdict,
    evidence: { ...outcome.evidence, heldMin, latestSettlementMm, readings: readings.length, failureSignals },
    criterion: holdCriterion(rule, context.procedureId),
    etaMin: verdict === 'failure-suspected' ? null : outcome.etaMin,
  };
}
