import { formatPlanned } from '@shared/units/format';
import { Button } from '../../../components/button';
import { REPLAY_SPEEDS, type ReplaySpeed } from '../utils/use-playback';
import { type EpisodeBand, formatElapsed, type StageSpan, type TimelineMark } from '../utils/timeline';

export interface ReplayTimelineProps {
  fromMs: number;
  toMs: number;
  tMs: number;
  stages: readonly StageSpan[];
  marks: readonly TimelineMark[];
  /** Alarm episodes, raise to clear (see `episodeBands`). */
  episodes: readonly EpisodeBand[];
  playing: boolean;
  speed: ReplaySpeed;
  onSeek: (tMs: number) => void;
  onToggle: () => void;
  onSpeed: (speed: ReplaySpeed) => void;
}

const pct = (t: number, fromMs: number, toMs: number) => `${((Math.min(toMs, Math.max(fromMs, t)) - fromMs) / (toMs - fromMs)) * 100}%`;

/** Height of one alarm row, px: each alarm key keeps its own row so overlapping episodes stay apart. */
const ROW_PX = 14;

/**
 * The whole run as a bar: stages as spans, alarm episodes as bands from raise to clear, other events as
 * marks (each a jump), a scrubber and the playback controls.
 */
export function ReplayTimeline({ fromMs, toMs, tMs, stages, marks, episodes, playing, speed, onSeek, onToggle, onSpeed }: ReplayTimelineProps) {
  const jumps = [...marks.map((m) => m.atMs), ...episodes.map((e) => e.raisedAtMs)].sort((a, b) => a - b);
  const previous = jumps.findLast((t) => t < tMs);
  const next = jumps.find((t) => t > tMs);
  const rows = episodes.reduce((n, e) => Math.max(n, e.row + 1), 0);
  return (
    <section aria-label="Timeline" className="flex flex-col gap-2">
      <ol aria-label="Stages" className="relative h-8 rounded-md border-2 border-neutral-300 bg-neutral-100">
        {stages.map((s) => (
          <li
            key={`${s.stageIndex}-${s.fromMs}`}
            aria-label={`Stage ${s.stageIndex + 1}, target ${formatPlanned(s.targetKpa, 'kPa')} kPa, from ${formatElapsed(s.fromMs - fromMs)}`}
            title={`Stage ${s.stageIndex + 1} · ${formatPlanned(s.targetKpa, 'kPa')} kPa`}
            className="absolute inset-y-0 overflow-hidden border-l-2 border-neutral-700 bg-neutral-200 px-1 text-xs leading-7"
            style={{ left: pct(s.fromMs, fromMs, toMs), width: `calc(${pct(s.toMs, fromMs, toMs)} - ${pct(s.fromMs, fromMs, toMs)})` }}
          >
            {formatPlanned(s.targetKpa, 'kPa')}
          </li>
        ))}
      </ol>
      {rows > 0 && (
        <ol aria-label="Alarm episodes" className="relative" style={{ height: rows * ROW_PX }}>
          {episodes.map((e) => {
            const until = e.clearedAtMs === null ? 'still standing' : `to ${formatElapsed(e.clearedAtMs - fromMs)}`;
            return (
              <li
                key={e.raiseEventId}
                className="absolute"
                style={{ top: e.row * ROW_PX, height: ROW_PX - 2, left: pct(e.raisedAtMs, fromMs, toMs), width: `calc(${pct(e.toMs, fromMs, toMs)} - ${pct(e.raisedAtMs, fromMs, toMs)})` }}
              >
                <button
                  type="button"
                  aria-label={`Alarm: ${e.message} from ${formatElapsed(e.raisedAtMs - fromMs)} ${until}`}
                  title={e.message}
                  onClick={() => onSeek(e.raisedAtMs)}
                  className={`block h-full w-full min-w-1.5 rounded-sm ${e.clearedAtMs === null ? 'bg-alarm-700' : 'bg-alarm-700/70'}`}
                />
              </li>
            );
          })}
        </ol>
      )}
      <ol aria-label="Events" className="relative h-6">
        {marks.map((m) => (
          <li key={m.id} className="absolute top-0" style={{ left: pct(m.atMs, fromMs, toMs) }}>
            <button
              type="button"
              aria-label={`${m.label} at ${formatElapsed(m.atMs - fromMs)}`}
              title={m.label}
              onClick={() => onSeek(m.atMs)}
              className="-ml-1 block h-5 w-2 rounded-sm bg-neutral-700"
            />
          </li>
        ))}
      </ol>
      <label className="flex flex-col gap-1">
        <span className="font-semibold">
          Run time <span className="font-mono">{formatElapsed(tMs - fromMs)}</span>
        </span>
        <input
          type="range"
          aria-label="Replay time"
          min={0}
          max={toMs - fromMs}
          step={1000}
          value={tMs - fromMs}
          onChange={(e) => onSeek(fromMs + Number(e.target.value))}
        />
      </label>
      <div className="flex flex-wrap items-center gap-2">
        <Button variant="secondary" onClick={() => onSeek(fromMs)}>
          Start
        </Button>
        <Button variant="secondary" disabled={previous === undefined} onClick={() => previous !== undefined && onSeek(previous)}>
          Previous event
        </Button>
        <Button onClick={onToggle}>{playing ? 'Pause' : 'Play'}</Button>
        <Button variant="secondary" disabled={next === undefined} onClick={() => next !== undefined && onSeek(next)}>
          Next event
        </Button>
        <Button variant="secondary" onClick={() => onSeek(toMs)}>
          End
        </Button>
        <fieldset className="flex items-center gap-2">
          <legend className="sr-only">Speed</legend>
          {REPLAY_SPEEDS.map((s) => (
            <label key={s} className="inline-flex min-h-touch items-center gap-1">
              <input type="radio" name="replay-speed" checked={speed === s} onChange={() => onSpeed(s)} />×{s}
            </label>
          ))}
        </fieldset>
      </div>
    </section>
  );
}
