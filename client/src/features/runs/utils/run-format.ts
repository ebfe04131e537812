import type { HoldVerdict } from '@shared/hold/verdict';
import type { Branch, PlannedStage } from '@shared/plans/stages';
import type { RunPhase } from '@shared/schemas/runs';

/** Each verdict in words and a symbol, so colour is never the only signal. */
export const VERDICTS: Record<HoldVerdict, { symbol: string; label: string }> = {
  settling: { symbol: '◷', label: 'Still settling' },
  satisfied: { symbol: '✓', label: 'Hold satisfied' },
  'failure-suspected': { symbol: '✖', label: 'Failure suspected' },
};

export const PHASE_LABELS: Record<RunPhase, string> = {
  preparing: 'Preparing',
  pumping: 'Pumping to target',
  holding: 'Holding',
  'hold-met': 'Hold met',
  completed: 'Completed',
  stopped: 'Stopped',
};

export const BRANCH_LABELS: Record<Branch, string> = { seating: 'Seating', loading: 'Loading', unloading: 'Unloading', reloading: 'Reloading' };

/** "Stage 3 of 9 · Loading 200 kPa"; stage 0 is seating and counts as stage 1 for people. */
export function stageLabel(stage: PlannedStage | undefined, count: number): string {
  if (!stage) return '—';
  return `Stage ${stage.index + 1} of ${count} · ${BRANCH_LABELS[stage.branch]} ${stage.targetKpa} kPa`;
}

/** Tilt as a gradient 1:N (N rounded); "level" below 1:100 000. */
export function formatTilt(slope: number | null): string {
  if (slope === null || !Number.isFinite(slope)) return '—';
  const run = 1 / Math.abs(slope);
  return run > 100_000 ? 'level' : `1:${Math.round(run)}`;
}

/** A duration in seconds as "4 s", "3 min 20 s" or "2 h 5 min". */
export function formatDuration(seconds: number): string {
  const s = Math.max(0, Math.round(seconds));
  if (s < 60) return `${s} s`;
  if (s < 3600) return `${Math.floor(s / 60)} min ${s % 60} s`;
  return `${Math.floor(s / 3600)} h ${Math.floor((s % 3600) / 60)} min`;
}

/** Minutes with one decimal, "—" when unknown. */
export function formatMinutes(min: number | null | undefined): string {
  return min == null || !Number.isFinite(min) ? '—' : `${min.toFixed(1)} min`;
}

/** Wall-clock time of day, HH:MM:SS, for the events log. */
export function formatClock(ms: number): string {
  return new Date(ms).toTimeString().slice(0, 8);
}
