import { runEventLine } from '@shared/runs/event-text';
import { alarmEpisodes } from '@shared/runs/alarm-episodes';
import type { RunView } from '@shared/schemas/runs';
import { useEffect, useMemo, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/button';
import { EmptyState, ErrorState, LoadingState } from '../../../components/query-states';
import { paths } from '../../../config/paths';
import { useUser } from '../../../lib/auth';
import { type ReplayEvent, type SampleSummary, type Span, useCorrections, useReadingsAt, useReplayEvents, useReplayView, useSampleSummary } from '../api/replay-api';
import { envelopeData, episodeBands, eventsUntil, runSpan, stageAt, stageSpans, stateFromReadings, timelineMarks } from '../utils/timeline';
import { usePlayback } from '../utils/use-playback';
import { CorrectionForm, CorrectionsList } from './corrections-panel';
import { ReplayChart } from './replay-chart';
import { ReplayStatePanel } from './replay-state-panel';
import { ReplayTimeline } from './replay-timeline';

const FINISHED = new Set<RunView['phase']>(['completed', 'stopped']);
/** Plot columns when the page width is not known (e.g. before layout), px. */
const DEFAULT_BUCKETS = 800;

/** The width of an element in steps of 50 px (so a resize does not refetch at every pixel). */
function useWidth() {
  const ref = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(DEFAULT_BUCKETS);
  useEffect(() => {
    const el = ref.current;
    if (!el || typeof ResizeObserver === 'undefined') return;
    const observer = new ResizeObserver(() => el.clientWidth > 0 && setWidth(Math.max(100, Math.round(el.clientWidth / 50) * 50)));
    observer.observe(el);
    return () => observer.disconnect();
  }, []);
  return { ref, width };
}

/** The replay of a run, live or archived; an imported run (no samples) links to its interpretation instead. */
export function ReplayPage({ runId }: { runId: number }) {
  const [live, setLive] = useState(false);
  const view = useReplayView(runId, live);
  const events = useReplayEvents(runId, live);
  const { ref, width } = useWidth();
  const summary = useSampleSummary(runId, null, width, live);
  useEffect(() => setLive(view.data ? !FINISHED.has(view.data.phase) : false), [view.data]);

  const failed = [view, events, summary].find((q) => q.isError);
  const body = () => {
    if (failed) return <ErrorState error={failed.error} onRetry={() => void failed.refetch()} />;
    if (view.data === undefined || !events.data || !summary.data) return <LoadingState label="Loading the run’s record…" />;
    if (view.data === null || (summary.data.channels.length === 0 && events.data.length === 0)) return <NoSamples runId={runId} />;
    return <LoadedReplay runId={runId} view={view.data} events={events.data} overview={summary.data} live={live} buckets={width} />;
  };
  return (
    <div ref={ref} className="flex flex-col gap-6">
      {body()}
    </div>
  );
}

function NoSamples({ runId }: { runId: number }) {
  return (
    <EmptyState title="No recorded samples">
      This run has no recorded samples to replay (an imported test keeps only its readings).{' '}
      <Link to={paths.interpretation.href(runId)} className="font-bold underline underline-offset-4">
        Open its interpretation
      </Link>
      .
    </EmptyState>
  );
}

interface LoadedReplayProps {
  runId: number;
  view: RunView;
  events: ReplayEvent[];
  overview: SampleSummary;
  live: boolean;
  buckets: number;
}

function LoadedReplay({ runId, view, events, overview, live, buckets }: LoadedReplayProps) {
  const span = runSpan(events, overview, live ? view.clock.nowMs : null) ?? { fromMs: 0, toMs: 1 };
  const playback = usePlayback(span.fromMs, span.toMs);
  const [zoom, setZoom] = useState<Span | null>(null);
  const zoomed = useSampleSummary(runId, zoom, buckets, live);
  const shown = zoom ? (zoomed.data ?? overview) : overview;

  const stages = useMemo(() => stageSpans(events, view.stages, span.toMs), [events, view.stages, span.toMs]);
  // Each mark named in words, as the console's log names the event.
  const marks = useMemo(() => {
    const byId = new Map(events.map((e) => [e.id, e]));
    return timelineMarks(events).map((m) => {
      const event = byId.get(m.id);
      return event ? { ...m, label: runEventLine(event) } : m;
    });
  }, [events]);
  const episodes = useMemo(() => episodeBands(alarmEpisodes(events), span.toMs), [events, span.toMs]);
  const chartData = useMemo(() => envelopeData(view, shown), [view, shown]);

  // Readings are asked for at most once per second of run time, coarser while playing fast.
  const stepMs = 1000 * (playback.playing ? playback.speed : 1);
  const readings = useReadingsAt(runId, overview.channels.length ? Math.floor(playback.tMs / stepMs) * stepMs : null);
  const corrections = useCorrections(runId);
  const state = stateFromReadings(view, readings.data ?? []);
  const role = useUser()?.role;
  // Engineers and admins may correct readings (the server enforces the same).
  const mayCorrect = role === 'admin' || role === 'engineer';
  const pressureUnit = view.channels.find((c) => c.role === 'pressure')?.unit ?? '';

  return (
    <>
      <ReplayTimeline
        fromMs={span.fromMs}
        toMs={span.toMs}
        tMs={playback.tMs}
        stages={stages}
        marks={marks}
        episodes={episodes}
        playing={playback.playing}
        speed={playback.speed}
        onSeek={playback.seek}
        onToggle={playback.toggle}
        onSpeed={playback.setSpeed}
      />
      <ReplayStatePanel fromMs={span.fromMs} tMs={playback.tMs} stage={stageAt(stages, playback.tMs)} pressure={state.pressure} pressureKpa={state.pressureKpa} meanSettlementMm={state.meanSettlementMm} events={eventsUntil(events, playback.tMs)} />
      {overview.channels.length === 0 ? (
        <EmptyState title="No recorded samples">
          Nothing has been recorded in this run yet.{' '}
          <Link to={paths.interpretation.href(runId)} className="font-bold underline underline-offset-4">
            Interpretation
          </Link>
        </EmptyState>
      ) : (
        <section aria-label="Plot" className="flex flex-col gap-2">
          <div className="flex flex-wrap items-center gap-3">
            <h3 className="font-bold">Mean settlement and oil pressure</h3>
            <span className="text-neutral-800">Drag across the plot to zoom in.</span>
            {zoom && (
              <Button variant="secondary" onClick={() => setZoom(null)}>
                Whole run
              </Button>
            )}
          </div>
          <ReplayChart data={chartData} dataVersion={`${shown.fromMs}|${shown.toMs}|${shown.bucketMs}|${shown.channels.length}`} cursorMs={playback.tMs} pressureUnit={pressureUnit} onZoom={setZoom} />
        </section>
      )}
      <section aria-label="Corrections of readings" className="flex flex-col gap-3">
        <h3 className="text-lg font-bold">Corrections of readings</h3>
        {corrections.isError ? <ErrorState error={corrections.error} /> : corrections.data ? <CorrectionsList view={view} fromMs={span.fromMs} corrections={corrections.data} /> : <LoadingState />}
        {mayCorrect && readings.data && readings.data.length > 0 && <CorrectionForm runId={runId} view={view} readings={readings.data} />}
      </section>
    </>
  );
}
