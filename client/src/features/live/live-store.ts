import type { SampleBatch } from '@shared/realtime/events';
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

const MICRO = 1000;
/** Phases in which a stage's pressure and settlement count as that stage's point on the curve. */
const HOLD_PHASES = new Set<RunView['phase']>(['holding', 'hold-met', 'completed', 'stopped']);

/**
 * The live state of one run, outside React: the latest RunView, and the mean settlement over time
 * computed from `run:samples` into preallocated columns (run-clock ms, mm). Samples never cause a
 * React render; charts poll `seriesVersion` once per animation frame.
 */
export function createLiveStore({ capacity = 200_000, now = Date.now }: LiveStoreOptions = {}) {
  const listeners = new Set<() => void>();
  const series = createColumnBuffer({ columns: 2, capacity });
  let snapshot: LiveSnapshot = { view: null, link: 'connecting', viewReceivedAtMs: null, linkError: null };
  let lastSeq = 0;
  let seriesVersion = 0;
  /** Per channel index: settlement offset (mm) so settlement = direction × reading + offset; NaN when unknown. */
  let offsets: Float64Array = new Float64Array(0);
  /** Per channel index: latest settlement (mm), NaN when none yet. */
  let latest: Float64Array = new Float64Array(0);

  function publish(next: Partial<LiveSnapshot>) {
    snapshot = { ...snapshot, ...next };
    for (const listener of listeners) listener();
  }

  /** Offsets are constant between gauge resets, so the latest view gives them for new samples. */
  function updateOffsets(view: RunView) {
    if (offsets.length !== view.channels.length) {
      offsets = new Float64Array(view.channels.length).fill(Number.NaN);
      latest = new Float64Array(view.channels.length).fill(Number.NaN);
    }
    view.channels.forEach((channel, i) => {
      const gauge = view.live.gauges.find((g) => g.key === channel.key);
      if (channel.role !== 'gauge' || channel.direction === null || gauge?.readingMm == null || gauge.settlementMm == null) return;
      offsets[i] = gauge.settlementMm - channel.direction * gauge.readingMm;
      // Until its first sample, a gauge counts in the mean with the view's figure.
      if (Number.isNaN(latest[i])) latest[i] = gauge.settlementMm;
    });
  }

  function meanOfLatest(): number {
    let sum = 0;
    let n = 0;
    for (let i = 0; i < latest.length; i++) {
      if (!Number.isNaN(latest[i])) {
        sum += latest[i];
        n++;
      }
    }
    return n === 0 ? Number.NaN : sum / n;
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
      updateOffsets(view);
      publish({ view, viewReceivedAtMs: now() });
    },
    setLink(link: LinkState, linkError: string | null = null): void {
      if (link !== snapshot.link || linkError !== snapshot.linkError) publish({ link, linkError });
    },

    /** Takes a batch of samples; rows at or below the last sequence number seen are ignored (backfill overlap). */
    ingest(batch: SampleBatch): void {
      const channels = snapshot.view?.channels;
      if (!channels) return;
      let added = false;
      for (let r = 0; r < batch.seq.length; r++) {
        const seq = batch.seq[r];
        if (seq <= lastSeq) continue;
        lastSeq = seq;
        const index = batch.channel[r];
        const channel = channels[index];
        const value = batch.value[r];
        if (channel?.role !== 'gauge' || channel.direction === null || value === null || Number.isNaN(offsets[index])) continue;
        latest[index] = (channel.direction * value) / MICRO + offsets[index];
        const mean = meanOfLatest();
        if (!Number.isNaN(mean)) {
          series.push(batch.t[r], mean);
          added = true;
        }
      }
      if (added) seriesVersion++;
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
