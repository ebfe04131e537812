/**
 * The current hold's settlement–time series, kept the same way live (the engine) and after a restart
 * (rebuilt from the archive): a point when the target is reached (t = 0), then at most one per
 * {@link HOLD_SERIES_STEP_MS} of run time from gauge samples, each the plate's mean settlement by the
 * measurement model. Manual rigs keep every typed reading.
 */
import type { ModelEvent, ModelSample, RunMeasurer } from './measurement-model';

/** Hold-series points are kept at most this often (run time), so a 24-hour hold stays small. */
export const HOLD_SERIES_STEP_MS = 2000;

export interface HoldPoint {
  tMin: number;
  settlementMm: number;
}

const HOLD_ENDS = new Set(['stage-advanced', 'run-started', 'run-completed', 'run-stopped']);

export class HoldSeriesTracker {
  points: HoldPoint[] = [];
  private holdStartMs: number | null = null;
  private lastMs = Number.NEGATIVE_INFINITY;

  /** `everySample`: keep every gauge sample (manual rigs, where each is a typed reading). */
  constructor(private readonly everySample = false) {}

  /** Run clock ms at which the open hold began, or null between holds. */
  get startedAtMs(): number | null {
    return this.holdStartMs;
  }

  /** Follows the run's events (pass it as the measurer's `onEvent`). */
  onEvent(e: ModelEvent, m: RunMeasurer): void {
    if (e.kind === 'target-reached') {
      this.holdStartMs = e.atMs;
      this.points = [];
      this.lastMs = Number.NEGATIVE_INFINITY;
      this.point(e.atMs, m);
    } else if (HOLD_ENDS.has(e.kind)) {
      this.holdStartMs = null;
      if (e.kind !== 'run-completed' && e.kind !== 'run-stopped') this.points = [];
    }
  }

  /** Takes a sample the measurer has just taken. */
  onSample(s: ModelSample, m: RunMeasurer): void {
    if (this.holdStartMs === null || s.value === null || m.setup.channels[s.channel]?.role !== 'gauge') return;
    if (!this.everySample && s.tMs - this.lastMs < HOLD_SERIES_STEP_MS) return;
    this.point(s.tMs, m);
  }

  private point(tMs: number, m: RunMeasurer): void {
    if (this.holdStartMs === null) return;
    const mean = m.measure().meanSettlementMm;
    if (mean === null) return;
    this.lastMs = tMs;
    this.points.push({ tMin: Math.max(0, (tMs - this.holdStartMs) / 60_000), settlementMm: mean });
  }
}
