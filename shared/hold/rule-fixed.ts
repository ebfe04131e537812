import type { HoldRule } from '../schemas/plans';
import { TIME_EPS_MIN } from './series';
import type { FixedEvidence, RuleEvidence, RuleOutcome } from './verdict';

type FixedRule = Extract<HoldRule, { kind: 'fixed' }>;

/** Fixed rule: the stage is held for a set time (e.g. about 120 s per stage in the DIN 18134 family). */
export function evaluateFixedRule(rule: FixedRule, heldMin: number): RuleOutcome<RuleEvidence<FixedEvidence>> {
  const remainingMin = Math.max(0, rule.durationMin - heldMin);
  const satisfied = heldMin >= rule.durationMin - TIME_EPS_MIN;
  return { satisfied, etaMin: satisfied ? 0 : remainingMin, failureSignals: [], evidence: { kind: 'fixed', durationMin: rule.durationMin, remainingMin } };
}
