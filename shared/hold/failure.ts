import { trailingRate } from './rate';
import type { TimePoint } from './series';
import type { CreepCheckOptions, FailureSignal } from './verdict';

/** Inputs of the checks that apply to every rule. */
export interface CommonFailureInput {
  heldMin: number;
  latestSettlementMm: number | null;
  stopLimitMm: number;
  pressureHoldable: boolean;
  maxHoldMin: number | undefined;
  satisfied: boolean;
}

/**
 * Failure checks shared by every rule: settlement at the stop limit, a pressure the jack cannot hold,
 * and a hold that overran the plan's termination time without being satisfied.
 */
export function commonFailureSignals(input: CommonFailureInput): FailureSignal[] {
  const signals: FailureSignal[] = [];
  if (input.latestSettlementMm !== null && input.latestSettlementMm >= input.stopLimitMm) {
    signals.push({
      code: 'stop-limit',
      message: `Settlement ${input.latestSettlementMm.toFixed(2)} mm has reached the stop limit of ${input.stopLimitMm} mm.`,
      source: { tag: 'common practice', text: "Stop at the plan's settlement limit (25 mm is common practice for bearing tests)" },
    });
  }
  if (!input.pressureHoldable) {
    signals.push({
      code: 'pressure-not-holdable',
      message: 'The jack cannot hold the target pressure: the plate keeps giving way.',
      source: { tag: 'common practice', text: 'A plate that settles faster than the pump can keep the load on has failed' },
    });
  }
  if (!input.satisfied && input.maxHoldMin !== undefined && input.heldMin >= input.maxHoldMin) {
    signals.push({
      code: 'hold-overrun',
      message: `The hold is not satisfied after ${input.heldMin.toFixed(1)} min (plan limit ${input.maxHoldMin} min).`,
      source: { tag: 'common practice', text: 'Termination rule of the plan: a hold that cannot be satisfied in time suggests failure' },
    });
  }
  return signals;
}

/** Inputs of {@link rateNotDecaying}. */
export interface CreepCheckInput extends CreepCheckOptions {
  windowMin: number;
  thresholdMmPerMin: number;
  heldMin: number;
  /** Default hold time before the check applies, minutes (used when `afterMin` is not given). */
  defaultAfterMin: number;
}

export interface CreepCheck {
  currentRateMmPerMin: number | null;
  previousRateMmPerMin: number | null;
  signal: FailureSignal | null;
}

/**
 * "Rate not decaying" (common practice): past `afterMin`, the rate over the latest window is still above
 * the threshold and is not below `decayFactor` (default 0.9) × the rate over the window just before it.
 * A consolidating or seating plate slows down window after window; a plate in failure creeps on at a
 * steady or growing rate (reference §G: past failure the creep term does not decay).
 */
export function rateNotDecaying(series: readonly TimePoint[], input: CreepCheckInput): CreepCheck {
  const current = trailingRate(series, { windowMin: input.windowMin, untilMin: input.heldMin });
  if (current.slopeMmPerMin === null) return { currentRateMmPerMin: null, previousRateMmPerMin: null, signal: null };
  const before = trailingRate(series, { windowMin: input.windowMin, untilMin: current.fromMin });
  const result: CreepCheck = { currentRateMmPerMin: current.slopeMmPerMin, previousRateMmPerMin: before.slopeMmPerMin, signal: null };
  if (before.slopeMmPerMin === null || input.heldMin < (input.afterMin ?? input.defaultAfterMin)) return result;

  const latest = Math.abs(current.slopeMmPerMin);
  const earlier = Math.abs(before.slopeMmPerMin);
  const factor = input.decayFactor ?? 0.9;
  if (latest > input.thresholdMmPerMin && latest >= factor * earlier) {
    result.signal = {
      code: 'rate-not-decaying',
      message: `Settlement rate ${latest.toFixed(4)} mm/min is not falling (${earlier.toFixed(4)} mm/min over the window before) and is above ${input.thresholdMmPerMin} mm/min.`,
      source: {
        tag: 'common practice',
        text: `Rate above the threshold and not below ${factor} × the rate over the previous ${input.windowMin}-min window`,
      },
    };
  }
  return result;
}
