import { SEATING_HOLD_MIN } from '../procedures/profiles';
import type { Loading, PlanInput } from '../schemas/plans';

export type Branch = 'seating' | 'loading' | 'unloading' | 'reloading';

/** One planned stage of a test: a target pressure reached and then held. */
export interface PlannedStage {
  index: number;
  branch: Branch;
  targetKpa: number;
  /** 1-based application number when load levels are repeated (repetitive pavement test). */
  repetition: number;
}

/** Loading targets: an explicit list, or equal steps of min(fixed step, fraction × expected ultimate). */
export function loadingTargets(loading: Loading): number[] {
  if (loading.mode === 'list') return [...loading.pressuresKpa];
  const step = Math.min(loading.fixedStepKpa, loading.fractionOfUltimate * loading.expectedUltimateKpa);
  const targets: number[] = [];
  // Round to 0.1 kPa so that repeated addition does not leave 299.99999 targets.
  for (let k = 1; k * step <= loading.maxPressureKpa + 1e-9; k++) targets.push(Math.round(k * step * 10) / 10);
  return targets;
}

/**
 * The whole stage sequence a plan implies: seating, loading (each level repeated and released when
 * the plan asks), unloading, reloading.
 */
export function buildStageSequence(plan: Pick<PlanInput, 'seatingPressureKpa' | 'loading' | 'unloadReload'>): PlannedStage[] {
  const stages: Omit<PlannedStage, 'index'>[] = [];
  const push = (branch: Branch, targetKpa: number, repetition = 1) => stages.push({ branch, targetKpa, repetition });
  push('seating', plan.seatingPressureKpa);
  const loads = loadingTargets(plan.loading);
  const reps = plan.unloadReload.repetitionsPerLevel;
  for (const q of loads) {
    for (let r = 1; r <= reps; r++) {
      push('loading', q, r);
      if (reps > 1) push('unloading', 0, r);
    }
  }
  for (const q of plan.unloadReload.unloadKpa) {
    if (reps > 1 && q === 0) continue; // already released after the last repetition
    push('unloading', q);
  }
  const reload = plan.unloadReload.reload;
  const reloadTargets = reload.mode === 'toPenultimate' ? loads.slice(0, -1) : reload.mode === 'list' ? reload.pressuresKpa : [];
  for (const q of reloadTargets) push('reloading', q);
  return stages.map((s, index) => ({ index, ...s }));
}

/** Largest pressure the plan will apply, kPa. */
export function maxPlannedPressureKpa(plan: Pick<PlanInput, 'seatingPressureKpa' | 'loading' | 'unloadReload'>): number {
  return Math.max(...buildStageSequence(plan).map((s) => s.targetKpa));
}

/** How long the seating stage is held: the plan's setting, or half a minute for plans saved before it existed. */
export function seatingHoldMin(plan: Partial<Pick<PlanInput, 'seatingHoldMin'>>): number {
  return plan.seatingHoldMin ?? SEATING_HOLD_MIN;
}
