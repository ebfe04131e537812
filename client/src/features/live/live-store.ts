import type { SampleBatch } from '@shared/realtime/events';
import { type ModelSample, RunMeasurer } from '@shared/runs/measurement-model';
import type { RunView } from '@shared/schemas/runs';
import { createColumnBuffer } from './utils/column-buffer';

/** Where the live link stands; `stale` is derived from the age of the last view. */
export type LinkState = 'connecting' | 'live' | 'reconnecting' | 'offline';

/** What React reads from the store: replaced only when a view or the link changes, never per sample. */
export interface LiveSnapshot {
  view: RunView | null;
  link: LinkState;
  /** Local wall-clock time the last view arrived, ms since the epoch; null before the first. */
  viewReceivedAtMs: number | null;
  /** Last error the live link reported (join refused, connection error). */
  linkError: string | null;
}

/** One point of the load–settlement curve: where a stage ended (or stands now). */
export interface CurvePoint {
  stageIndex: number;
  pressureKpa: number;
  settlementMm: number;
}

/** Options of {@link createLiveStore}. */
export interface LiveStoreOptions {
  /** Most settlement–time points kept; older ones are thinned, not dropped. Default 200,000. */
  capacity?: number;
  /** Clock for "when did the last view arrive"; injectable for tests. Default Date.now. */
  now?: () => number;
}

/** Phases in which a stage's pressure and settlement count as that stage's point on the curve. */
const HOLD_PHASES = new Set<RunView['phase']>(['holding', 'hold-met', 'completed', 'stopped']);

/**
 * The live state of one run, outside React: the latest RunView, and the mean settlement over time
 * measured from `run:samples` by the run's measurement model (its parameters come with the view) into
 * preallocated columns (run-clock ms, mm). A sample is measured once a view covers it (seq ≤ the view's
 * lastSeq): that view holds every event that applies to it, so the chart shows what the server measured.
 * Samples never cause a React render; charts poll `seriesVersion` once per animation frame.
 */
export function createLiveStore({ capacity = 200_000, now = Date.now }: LiveStoreOptions = {}) {
  const listeners = new Set<() => void>();
  const series = createColumnBuffer({ columns: 2, capacity });
  let snapshot: LiveSnapshot = { view: null, link: 'connecting', viewReceivedAtMs: null, linkError: null };
  let lastSeq = 0;
  let seriesVersion = 0;
  /** The run's measurement model, fed every sample in order; rebuilt when another run's view arrives. */
  let measurer: { runId: number; m: RunMeasurer } | null = null;
  /** Samples received but not yet covered by a view. */
  let waiting: ModelSample[] = [];

  function publish(next: Partial<LiveSnapshot>) {
    snapshot = { ...snapshot, ...next };
    for (const listener of listeners) listener();
  }

  /** Takes the view's model events it has not seen yet (they only grow), then measures the samples the view covers. */
  function follow(view: RunView) {
    if (measurer?.runId !== view.id) measurer = { runId: view.id, m: new RunMeasurer(view.measurement.setup) };
    const { m } = measurer;
    for (const e of view.measurement.events.slice(m.eventCount)) m.enqueue(e);
    const upTo = view.lastSeq;
    let i = 0;
    let added = false;
    for (; i < waiting.length && waiting[i].seq <= upTo; i++) {
      const sample = waiting[i];
      m.add(sample);
      if (sample.value === null || view.channels[sample.channel]?.role !== 'gauge') continue;
      const mean = m.measure().meanSettlementMm;
      if (mean !== null) {
        series.push(sample.tMs, mean);
        added = true;
      }
    }
    waiting = waiting.slice(i);
    if (added) seriesVersion++;
  }

  return {
    subscribe(listener: () => void): () => void {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    getSnapshot: (): LiveSnapshot => snapshot,

    setView(view: RunView): void {
      // A command's answer and a pushed view may arrive out of order: never step back in version.
      if (snapshot.view && snapshot.view.id === view.id && view.version < snapshot.view.version) return;
      publish({ view, viewReceivedAtMs: now() });
      follow(view);
    },
    setLink(link: LinkState, linkError: string | null = null): void {
      if (link !== snapshot.link || linkError !== snapshot.linkError) publish({ link, linkError });
    },

    /** Takes a batch of samples; rows at or below the last sequence number seen are ignored (backfill overlap). */
    ingest(batch: SampleBatch): void {
      for (let r = 0; r < batch.seq.length; r++) {
        const seq = batch.seq[r];
        if (seq <= lastSeq) continue;
        lastSeq = seq;
        waiting.push({ seq, tMs: batch.t[r], channel: batch.channel[r], value: batch.value[r] });
      }
      if (snapshot.view) follow(snapshot.view);
    },

    /** Sequence number to ask the server to continue after, when joining again. */
    get lastSeq() {
      return lastSeq;
    },
    /** Changes whenever new points were added; a chart redraws only when it moved. */
    get seriesVersion() {
      return seriesVersion;
    },
    /** Mean settlement (mm) over run-clock time (ms). */
    series,
    /** The load–settlement curve so far: the server's end-of-hold point of every finished stage, plus the stage now held. */
    curve(): CurvePoint[] {
      const view = snapshot.view;
      if (!view) return [];
      const points: CurvePoint[] = view.stagePoints.map((p) => ({ stageIndex: p.stageIndex, pressureKpa: p.pressureKpa, settlementMm: p.settlementMm }));
      const { pressureKpa, meanSettlementMm } = view.live;
      const held = HOLD_PHASES.has(view.phase) && !points.some((p) => p.stageIndex === view.stageIndex);
      if (held && pressureKpa !== null && meanSettlementMm !== null) points.push({ stageIndex: view.stageIndex, pressureKpa, settlementMm: meanSettlementMm });
      return points;
    },
  };
}

export type LiveStore = ReturnType<typeof createLiveStore>;
