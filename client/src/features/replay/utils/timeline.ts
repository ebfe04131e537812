import type { PlannedStage } from '@shared/plans/stages';
import type { AlarmEpisode } from '@shared/runs/alarm-episodes';
import { RunMeasurer, settlementOf, stateAtTime } from '@shared/runs/measurement-model';
import type { RunView } from '@shared/schemas/runs';
import type { ReadingAt, ReplayEvent, SampleSummary } from '../api/replay-api';

/** One stage on the timeline: from the moment it was started (pumping) to the next stage's start or the run's end; run clock ms. */
export interface StageSpan {
  stageIndex: number;
  targetKpa: number;
  fromMs: number;
  /** When the target was reached (the hold began); null while still pumping. */
  reachedMs: number | null;
  toMs: number;
}

/** A point on the timeline worth a mark: an event other than an alarm's (alarms are drawn as episodes). */
export interface TimelineMark {
  /** The event's id. */
  id: number;
  atMs: number;
  kind: string;
  label: string;
}

const RUN_ENDS = new Set(['run-completed', 'run-stopped']);

/**
 * Stages from the log: a stage starts at 'run-started' (stage 0) or at the 'stage-advanced' that names it,
 * its hold at 'target-reached', and it ends where the next starts or the run ends (`endMs` while still going).
 */
export function stageSpans(events: readonly ReplayEvent[], stages: readonly PlannedStage[], endMs: number): StageSpan[] {
  const spans: StageSpan[] = [];
  const close = (atMs: number) => {
    const open = spans.at(-1);
    if (open && open.toMs === Number.POSITIVE_INFINITY) open.toMs = atMs;
  };
  for (const e of events) {
    const p = e.payload ?? {};
    if (e.kind === 'run-started' || e.kind === 'stage-advanced') {
      close(e.atMs);
      const stageIndex = e.kind === 'run-started' ? Number(p.stageIndex ?? 0) : Number(p.to);
      const stage = stages[stageIndex];
      if (stage) spans.push({ stageIndex, targetKpa: stage.targetKpa, fromMs: e.atMs, reachedMs: null, toMs: Number.POSITIVE_INFINITY });
    } else if (e.kind === 'target-reached') {
      const stageIndex = Number(p.stageIndex);
      const open = spans.at(-1);
      if (open && open.stageIndex === stageIndex && open.toMs === Number.POSITIVE_INFINITY) open.reachedMs = e.atMs;
      else if (stages[stageIndex]) {
        close(e.atMs);
        spans.push({ stageIndex, targetKpa: stages[stageIndex].targetKpa, fromMs: e.atMs, reachedMs: e.atMs, toMs: Number.POSITIVE_INFINITY });
      }
    } else if (RUN_ENDS.has(e.kind)) close(e.atMs);
  }
  close(endMs);
  return spans;
}

/** Words for an event kind on the timeline and in the log. */
export function eventLabel(e: ReplayEvent): string {
  const p = e.payload ?? {};
  const text = [p.text, p.reason, p.message].find((v): v is string => typeof v === 'string');
  const name = e.kind.replace(/-/g, ' ');
  const title = name.charAt(0).toUpperCase() + name.slice(1);
  return text ? `${title}: ${text}` : title;
}

/**
 * Every event as a timeline mark, except stage boundaries (drawn as spans) and alarm changes (drawn as
 * episodes, raise to clear, by `alarmEpisodes` in shared/runs/alarm-episodes).
 */
export function timelineMarks(events: readonly ReplayEvent[]): TimelineMark[] {
  return events
    .filter((e) => e.kind !== 'stage-advanced' && e.kind !== 'target-reached' && !e.kind.startsWith('alarm-'))
    .map((e) => ({ id: e.id, atMs: e.atMs, kind: e.kind, label: eventLabel(e) }));
}

/** An alarm episode on the timeline: one row per alarm key, so overlapping alarms do not hide each other. */
export interface EpisodeBand extends AlarmEpisode {
  row: number;
  /** Where the band ends: its clear, or the end of the timeline while it still stands. */
  toMs: number;
}

/** Episodes as bands, one row per key in the order keys first appear. */
export function episodeBands(episodes: readonly AlarmEpisode[], endMs: number): EpisodeBand[] {
  const rows = [...new Set(episodes.map((e) => e.key))];
  return episodes.map((e) => ({ ...e, row: rows.indexOf(e.key), toMs: e.clearedAtMs ?? Math.max(e.raisedAtMs, endMs) }));
}

/** The run's time span on the replay: its first event (or sample) to its last event, sample or — while live — now. */
export function runSpan(events: readonly ReplayEvent[], summary: Pick<SampleSummary, 'fromMs' | 'toMs' | 'channels'> | undefined, nowMs: number | null): { fromMs: number; toMs: number } | null {
  const times = events.map((e) => e.atMs);
  if (summary?.channels.length) times.push(summary.fromMs, summary.toMs);
  if (nowMs !== null && times.length) times.push(nowMs);
  if (!times.length) return null;
  const fromMs = Math.min(...times);
  return { fromMs, toMs: Math.max(fromMs + 1, ...times) };
}

/** The stage in force at `tMs`, or null before the first started. */
export const stageAt = (spans: readonly StageSpan[], tMs: number): StageSpan | null => spans.findLast((s) => s.fromMs <= tMs) ?? null;

/** Events that happened up to `tMs`, newest first. */
export const eventsUntil = (events: readonly ReplayEvent[], tMs: number): ReplayEvent[] => events.filter((e) => e.atMs <= tMs).reverse();

/**
 * Pressure and mean settlement at the readings of one time, measured by the run's measurement model
 * (shared/runs/measurement-model) exactly as the console measured them at the newest of those readings:
 * the zeros, reset offsets, stage and calibrations in force then. Corrected values are used and readings
 * marked faulty left out.
 */
export function stateFromReadings(view: RunView, readings: readonly ReadingAt[]) {
  const inForce = (r: ReadingAt) => (r.correctedValue !== undefined ? r.correctedValue : r.value);
  const measurer = new RunMeasurer(view.measurement.setup, view.measurement.events);
  let pressure: { value: number; unit: string } | null = null;
  for (const r of [...readings].sort((a, b) => a.seq - b.seq)) {
    const c = view.channels[r.channel];
    const v = inForce(r);
    measurer.add({ seq: r.seq, tMs: r.tMs, channel: r.channel, value: v });
    if (c?.role === 'pressure' && v !== null) pressure = { value: v / 1000, unit: c.unit };
  }
  const m = measurer.measure();
  // Readings-at gives one reading per channel: without one of them, the gauge's value in force is unknown here.
  const complete = m.gauges.length > 0 && m.gauges.every((g) => g.settlementMm !== null);
  return { pressure, pressureKpa: m.pressureKpa, meanSettlementMm: complete ? m.meanSettlementMm : null };
}

/** Columns for the overview plot: x (s), mean settlement low/high (mm), pressure low/high (channel unit); null where a bucket lacks data. */
export type EnvelopeData = [number[], (number | null)[], (number | null)[], (number | null)[], (number | null)[]];

/**
 * The summary's min/max per bucket as the plot's envelopes. Mean settlement bounds per bucket are the means of
 * each gauge's lowest and highest settlement (a gauge read downwards swaps its reading's min and max), each
 * measured by the run's model with the zeros and reset offsets in force at the bucket's start: they bracket
 * the true mean's range in that bucket, so no extreme is hidden.
 */
export function envelopeData(view: RunView, summary: SampleSummary): EnvelopeData {
  const { setup, events } = view.measurement;
  const count = Math.max(1, Math.round((summary.toMs - summary.fromMs) / summary.bucketMs));
  const bucketOf = (t: number) => Math.round((t - summary.fromMs) / summary.bucketMs - 0.5);
  const lowSum = new Array<number>(count).fill(0);
  const highSum = new Array<number>(count).fill(0);
  const seen = new Array<number>(count).fill(0);
  const pLow: (number | null)[] = new Array(count).fill(null);
  const pHigh: (number | null)[] = new Array(count).fill(null);
  const states = Array.from({ length: count }, (_, b) => stateAtTime(setup, events, summary.fromMs + b * summary.bucketMs));
  const gauges = view.channels.filter((c) => c.role === 'gauge').length;
  for (const series of summary.channels) {
    const c = view.channels[series.channel];
    if (!c) continue;
    series.t.forEach((t, i) => {
      const b = bucketOf(t);
      if (b < 0 || b >= count) return;
      if (c.role === 'pressure') {
        pLow[b] = series.min[i] / 1000;
        pHigh[b] = series.max[i] / 1000;
        return;
      }
      const a = c.role === 'gauge' ? settlementOf(setup, states[b], series.channel, series.min[i] / 1000) : null;
      const z = c.role === 'gauge' ? settlementOf(setup, states[b], series.channel, series.max[i] / 1000) : null;
      if (a === null || z === null) return;
      lowSum[b] += Math.min(a, z);
      highSum[b] += Math.max(a, z);
      seen[b]++;
    });
  }
  const complete = (b: number) => gauges > 0 && seen[b] === gauges;
  // Only buckets that hold data become points: sparse samples (a slow schedule, typed readings, an
  // accelerated demo rig) would otherwise leave every line broken by empty buckets.
  const kept = Array.from({ length: count }, (_, b) => b).filter((b) => complete(b) || pLow[b] !== null);
  return [
    kept.map((b) => (summary.fromMs + (b + 0.5) * summary.bucketMs) / 1000),
    kept.map((b) => (complete(b) ? lowSum[b] / gauges : null)),
    kept.map((b) => (complete(b) ? highSum[b] / gauges : null)),
    kept.map((b) => pLow[b]),
    kept.map((b) => pHigh[b]),
  ];
}

/** Elapsed run time as h:mm:ss. */
export function formatElapsed(ms: number): string {
  const s = Math.max(0, Math.floor(ms / 1000));
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${Math.floor(s / 3600)}:${pad(Math.floor((s % 3600) / 60))}:${pad(s % 60)}`;
}
