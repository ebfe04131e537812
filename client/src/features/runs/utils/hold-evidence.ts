import type { HoldEvidence } from '@shared/hold/verdict';

/** The settlement rate the evidence reports now, mm/min; null for rules that do not measure one. */
export function currentRate(evidence: HoldEvidence): number | null {
  return evidence.kind === 'rate' || evidence.kind === 'consecutive' ? evidence.currentRateMmPerMin : null;
}
