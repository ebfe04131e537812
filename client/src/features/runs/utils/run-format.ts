import type { HoldVerdict } from '@shared/hold/verdict';
import type { Branch, PlannedStage } from '@shared/plans/stages';
import type { RunPhase } from '@shared/schemas/runs';
import { formatPlanned, formatQuantity } from '@shared/units/format';

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
  return `Stage ${stage.index + 1} of ${count} · ${BRANCH_LABELS[stage.branch]} ${formatPlanned(stage.targetKpa, 'kPa')} kPa`;
}

/**
 * Tilt reads "level" once flatter than 1:{@link TILT_LEVEL_ENTER} and stays level until steeper than
 * 1:{@link TILT_LEVEL_LEAVE}: a deadband, so gauge noise on a level plate does not flip the tile between
 * "level" and a huge ratio. Gauges read to 0.01 mm across a 300 mm plate resolve about 1:30 000, so
 * anything flatter than 1:1000 is level for practical purposes (common practice).
 */
export const TILT_LEVEL_ENTER = 1250;
export const TILT_LEVEL_LEAVE = 800;

/** Whether a tilt reads level, given whether it read level before (the deadband). */
export function tiltIsLevel(slope: number | null, wasLevel: boolean): boolean {
  if (slope === null || !Number.isFinite(slope)) return wasLevel;
  const run = slope === 0 ? Number.POSITIVE_INFINITY : 1 / Math.abs(slope);
  return run >= (wasLevel ? TILT_LEVEL_LEAVE : TILT_LEVEL_ENTER);
}

/** Tilt as a gradient 1:N with N to two significant figures (1:400, 1:1200), or "level" (see {@link tiltIsLevel}). */
export function formatTilt(slope: number | null, wasLevel = false): string {
  if (slope === null || !Number.isFinite(slope)) return '—';
  if (tiltIsLevel(slope, wasLevel)) return 'level';
  const run = 1 / Math.abs(slope);
  return `1:${Number(run.toPrecision(2))}`;
}

/** A countdown in minutes as "m:ss" or "h:mm:ss"; "—" when unknown. */
export function formatCountdown(min: number | null | undefined): string {
  if (min == null || !Number.isFinite(min)) return '—';
  const total = Math.max(0, Math.ceil(min * 60));
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = String(total % 60).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${s}` : `${m}:${s}`;
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
  return formatQuantity(min, 'min');
}

/** Wall-clock time of day, HH:MM:SS, for the events log. */
export function formatClock(ms: number): string {
  return new Date(ms).toTimeString().slice(0, 8);
}
