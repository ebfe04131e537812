import type { SettingSource, SourceTag } from '../procedures/profiles';
import type { HyperbolicTimeFit } from './hyperbolic';

export type HoldVerdict = 'settling' | 'satisfied' | 'failure-suspected';

/** Where a rule of thumb or default comes from, in the source wording of the procedure profiles. */
export interface RuleSource {
  tag: SourceTag;
  text: string;
}

/** Everything {@link evaluateHold} needs besides the rule and the readings. */
export interface HoldContext {
  /** Minutes since the stage's target was reached, on the same clock as the readings. */
  nowMin: number;
  /** Settlement at which the test stops, mm, on the same (cumulative) scale as the readings. */
  stopLimitMm: number;
  /** False when the jack cannot hold the target pressure (it keeps falling after top-ups). Default true. */
  pressureHoldable?: boolean;
  /** Termination rule: a hold still not satisfied after this long is a suspected failure, minutes. Default: no limit. */
  maxHoldMin?: number;
  /** Settlement gauge resolution, mm; the hyperbolic fit leaves out readings within 5 divisions of the start. Default 0.01. */
  resolutionMm?: number;
  /** The plan's procedure profile id: its wording is used for the criterion's source when it has this kind of rule. */
  procedureId?: string;
  /** Tuning of the "rate not decaying" failure check (rate and consecutive rules). */
  creepCheck?: CreepCheckOptions;
}

/** Options of the "rate not decaying" failure check. */
export interface CreepCheckOptions {
  /** Not applied before this hold time, minutes. Default: the larger of the rule's minimum hold and three windows. */
  afterMin?: number;
  /** The latest window's rate counts as decaying only when below this fraction of the window before. Default 0.9. */
  decayFactor?: number;
}

export type FailureCode = 'stop-limit' | 'pressure-not-holdable' | 'rate-not-decaying' | 'no-finite-ultimate' | 'hold-overrun';

/** One reason to suspect failure, with the rule it follows. */
export interface FailureSignal {
  code: FailureCode;
  message: string;
  source: RuleSource;
}

/** Evidence every rule reports. */
export interface EvidenceBase {
  /** Time since the target was reached, minutes. */
  heldMin: number;
  /** Last reading at or before now, mm; null before the first reading. */
  latestSettlementMm: number | null;
  /** Readings at or before now. */
  readings: number;
  failureSignals: FailureSignal[];
}

export interface RateEvidence extends EvidenceBase {
  kind: 'rate';
  /** Least-squares slope over the trailing window, mm/min; null while it cannot be fitted. */
  currentRateMmPerMin: number | null;
  rateStandardErrorMmPerMin: number | null;
  rateUnavailableReason: string | null;
  /** Rate over the window before the current one, mm/min (used by the failure check). */
  previousRateMmPerMin: number | null;
  maxRateMmPerMin: number;
  windowMin: number;
  /** Time span of the readings fitted, minutes. */
  coveredMin: number;
  points: number;
  minHoldMin: number;
  /** τ of the exponential decay of the windowed rate, minutes; null when unknown or not decaying. */
  decayTimeConstantMin: number | null;
}

/** Settlement change over one interval, from readings snapped to the interval boundaries. */
export interface IntervalChange {
  fromMin: number;
  toMin: number;
  changeMm: number;
  withinLimit: boolean;
}

export interface ConsecutiveEvidence extends EvidenceBase {
  kind: 'consecutive';
  intervalMin: number;
  maxChangeMm: number;
  intervalsRequired: number;
  /** Consecutive intervals up to the latest boundary whose change stayed within the limit. */
  intervalsPassed: number;
  /** The latest intervals (one more than required, so the last failing one shows), oldest first. */
  recentIntervals: IntervalChange[];
  previousRateMmPerMin: number | null;
  currentRateMmPerMin: number | null;
}

export interface FixedEvidence extends EvidenceBase {
  kind: 'fixed';
  durationMin: number;
  remainingMin: number;
}

export interface PercentEvidence extends EvidenceBase {
  kind: 'percentOfUltimate';
  /** Stage settlement as a percentage of the fitted ultimate; null without a fit with a finite ultimate. */
  percentOfUltimate: number | null;
  targetPercent: number;
  /** Settlement since the reading when the target was reached, mm. */
  stageSettlementMm: number | null;
  fit: HyperbolicTimeFit | null;
  /** Time at which the fit reaches the target percentage, minutes since the target was reached. */
  fitTargetTimeMin: number | null;
  minHoldMin: number;
  maxHoldMin: number;
  /** Why the hold is satisfied: the percentage, or only because the maximum hold time ran out. */
  satisfiedBy: 'percent' | 'max-hold-cap' | null;
}

export type HoldEvidence = RateEvidence | ConsecutiveEvidence | FixedEvidence | PercentEvidence;

/** The rule in words, with where its default values come from. */
export interface HoldCriterion {
  text: string;
  /** The procedure profile's sources for its hold-rule defaults. */
  sources: SettingSource[];
  /** True when the rule's values are exactly those defaults. */
  matchesDefault: boolean;
}

export interface HoldEvaluation {
  verdict: HoldVerdict;
  evidence: HoldEvidence;
  criterion: HoldCriterion;
  /** Estimated minutes from now until the hold is satisfied: 0 when satisfied, null when unknown or failure is suspected. */
  etaMin: number | null;
}

/** What one rule kind contributes; {@link evaluateHold} adds the common evidence and failure checks. */
export interface RuleOutcome<E> {
  satisfied: boolean;
  evidence: E;
  etaMin: number | null;
  failureSignals: FailureSignal[];
}

/** Evidence minus the common part, as a rule returns it. */
export type RuleEvidence<E extends HoldEvidence> = Omit<E, keyof EvidenceBase>;

/** The rule-specific evidence of any rule kind. */
export type AnyRuleEvidence = HoldEvidence extends infer E ? (E extends HoldEvidence ? RuleEvidence<E> : never) : never;
