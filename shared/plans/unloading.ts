/**
 * The unloading path: a test that must not load further (stop limit, failure, reaction or jack limit,
 * refusal) goes to unloading from where it stands instead of losing its unloading and reloading data.
 * The stages already run stay as they were; the stages after them are derived here, once, for every view.
 */
import type { Branch, PlannedStage } from './stages';

/** Why loading ends early. */
export const UNLOAD_REASONS = ['stop-limit', 'failure', 'reaction-limit', 'jack-limit', 'refusal', 'other'] as const;
export type UnloadReason = (typeof UNLOAD_REASONS)[number];

export const UNLOAD_REASON_LABELS: Record<UnloadReason, string> = {
  'stop-limit': 'settlement stop limit reached',
  failure: 'failure',
  'reaction-limit': 'reaction limit reached',
  'jack-limit': 'jack calibration range or rated pressure reached',
  refusal: 'refusal',
  other: 'other',
};

/**
 * Unloading fractions of the maximum in a two-cycle modulus test: 50 %, 25 % and 0 of the largest stage
 * reached (DIN 18134 family, from memory).
 */
export const MODULUS_UNLOAD_FRACTIONS = [0.5, 0.25, 0] as const;
/** Rebound of a bearing test: released in about three equal steps to zero (ASTM D1194 practice, from memory). */
export const REBOUND_FRACTIONS = [2 / 3, 1 / 3, 0] as const;

/** How a plan unloads: by the modulus test's rule (its reloading climbs back to the penultimate stage), or by rebound stages. */
export type UnloadingRule = 'modulus' | 'rebound';

export interface UnloadingInput {
  /** The run's stages as they stand. */
  stages: readonly PlannedStage[];
  /** Index of the last loading stage whose target was reached (held): it becomes the maximum. Null when none was. */
  reachedIndex: number | null;
  /** Index the run is at (the reached stage while holding it; the stage being pumped to otherwise). */
  currentIndex: number;
  rule: UnloadingRule;
  /** The plan's own unloading pressures, kPa (rebound: those between zero and the maximum are used when there are any). */
  planUnloadKpa: readonly number[];
}

const round1 = (x: number) => Math.round(x * 10) / 10;

/** The rule a plan's unloading follows: the modulus rule when its reloading climbs to the penultimate stage. */
export const unloadingRuleOf = (plan: { unloadReload: { reload: { mode: string } } }): UnloadingRule =>
  plan.unloadReload.reload.mode === 'toPenultimate' ? 'modulus' : 'rebound';

/**
 * The whole stage sequence after going to unloading: every stage up to the current one kept, the current one
 * too when it was held (it is the reached maximum), then unloading stages derived from the maximum and, by
 * the modulus rule, reloading through the loading stages below it to the penultimate stage reached. A stage
 * being pumped to but never reached is replaced (it has no reading to keep). Indexes stay those of the stages kept.
 */
export function unloadingStages(input: UnloadingInput): PlannedStage[] {
  const { stages, reachedIndex, currentIndex, rule } = input;
  const reached = reachedIndex === null ? undefined : stages[reachedIndex];
  if (reachedIndex !== null && reached?.branch !== 'loading') throw new RangeError(`stage ${reachedIndex} is not a loading stage`);
  const keep = reachedIndex === null ? currentIndex : Math.max(reachedIndex + 1, currentIndex);
  const kept = stages.slice(0, keep);
  const maxKpa = reached?.targetKpa ?? 0;
  const tail: { branch: Branch; targetKpa: number }[] = [];
  const unload = (targets: readonly number[]) => {
    for (const q of targets) tail.push({ branch: 'unloading', targetKpa: round1(q) });
  };
  if (rule === 'modulus') {
    unload(maxKpa > 0 ? MODULUS_UNLOAD_FRACTIONS.map((f) => f * maxKpa) : [0]);
    // Second loading: the first-loading levels below the maximum, one each, up to the penultimate stage reached.
    const levels = [...new Set(kept.filter((s) => s.branch === 'loading' && s.index !== reachedIndex && s.targetKpa < maxKpa).map((s) => s.targetKpa))];
    for (const q of levels) tail.push({ branch: 'reloading', targetKpa: q });
  } else {
    // The plan's own unloading pressures when it has some between zero and the maximum; a plan that only releases gets three steps.
    const planned = [...new Set(input.planUnloadKpa.filter((q) => q > 0 && q < maxKpa))].sort((a, b) => b - a);
    const rebound = planned.length > 0 ? planned : maxKpa > 0 ? REBOUND_FRACTIONS.map((f) => f * maxKpa) : [0];
    unload(rebound[rebound.length - 1] === 0 ? rebound : [...rebound, 0]);
  }
  return [...kept, ...tail.map((s, i) => ({ index: keep + i, branch: s.branch, targetKpa: s.targetKpa, repetition: 1 }))];
}

/** A run event as this module reads it. */
interface StageEvent {
  kind: string;
  payload: Record<string, unknown>;
}

/** The event that records going to unloading; its payload carries the derived stages (from `fromIndex` on). */
export const UNLOADING_EVENT = 'unloading-begun';

/**
 * The stages a run actually followed: its planned stages, with the tail each 'unloading-begun' event
 * replaced. The engine, the record and every view read the stages through this.
 */
export function stagesAfterEvents(planned: readonly PlannedStage[], events: readonly StageEvent[]): PlannedStage[] {
  let stages = [...planned];
  for (const e of events) {
    if (e.kind !== UNLOADING_EVENT || !Array.isArray(e.payload.stages)) continue;
    const tail = e.payload.stages as PlannedStage[];
    const from = Number(e.payload.fromIndex);
    if (!Number.isInteger(from) || from < 0 || from > stages.length) continue;
    stages = [...stages.slice(0, from), ...tail.map((s, i) => ({ index: from + i, branch: s.branch, targetKpa: s.targetKpa, repetition: s.repetition ?? 1 }))];
  }
  return stages;
}

/** The reason of an 'unloading-begun' event in words, with the operator's note: "settlement stop limit reached: plate tilting". */
export function unloadingReasonText(payload: Record<string, unknown>): string {
  const label = UNLOAD_REASON_LABELS[payload.reason as UnloadReason] ?? String(payload.reason ?? '');
  return typeof payload.note === 'string' && payload.note ? `${label}: ${payload.note}` : label;
}
