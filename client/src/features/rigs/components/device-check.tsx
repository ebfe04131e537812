import type { ChannelLive, RigLive } from '@shared/realtime/events';
import { useEffect, useState } from 'react';
import { Button } from '../../../components/button';
import { CalibrationBadge } from '../../../components/calibration-status';
import { LoadingState } from '../../../components/query-states';
import type { RigLiveFeed } from '../api/use-rig-live';
import { formatAge, formatRaw, formatReading, LINK_WORDS, movementSince, SAMPLE_WORDS, STALE_AFTER_MS } from '../utils/live-format';
import { StateWord } from './state-word';

/** The wall clock, ticking so the age of a sample keeps growing when a device falls silent. */
function useNow(intervalMs = 500): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const timer = setInterval(() => setNow(Date.now()), intervalMs);
    return () => clearInterval(timer);
  }, [intervalMs]);
  return now;
}

const ROLE_WORDS: Record<ChannelLive['role'], string> = { gauge: 'Gauge', pressure: 'Pressure', load: 'Load' };

interface ChannelCardProps {
  channel: ChannelLive;
  nowMs: number;
  /** The display zero of a gauge, in its unit; undefined when none is set. */
  zero: number | undefined;
  onZero: (value: number | undefined) => void;
}

function Counter({ label, value }: { label: string; value: number }) {
  return (
    <div className="flex flex-col">
      <dt className="text-sm text-neutral-800">{label}</dt>
      <dd className={`font-mono text-lg ${label !== 'Frames ok' && value > 0 ? 'font-bold text-alarm-900' : ''}`}>{value}</dd>
    </div>
  );
}

function ChannelCard({ channel, nowMs, zero, onZero }: ChannelCardProps) {
  const zeroed = zero !== undefined;
  const shown = movementSince(channel.value, zero);
  const stale = channel.atMs != null && nowMs - channel.atMs > STALE_AFTER_MS;
  return (
    <article aria-labelledby={`channel-${channel.key}`} className="flex min-w-0 flex-col gap-3 rounded-md border-2 border-neutral-300 p-4">
      <header className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id={`channel-${channel.key}`} className="text-lg font-bold">
          {channel.label}
        </h2>
        <span className="text-neutral-800">
          {ROLE_WORDS[channel.role]} · <span className="font-mono">{channel.key}</span>
        </span>
      </header>
      <div>
        <p className="text-sm font-semibold text-neutral-800">{zeroed ? 'Movement since display zero' : 'Reading'}</p>
        <p className="font-mono text-5xl font-bold break-all text-neutral-950 sm:text-6xl" data-testid={`reading-${channel.key}`}>
          {formatReading(shown, channel.unit)}
          <span className="ml-2 text-xl font-normal text-neutral-800">{channel.unit}</span>
        </p>
        {zeroed && (
          <p className="font-mono text-neutral-800">
            Reading {formatReading(channel.value, channel.unit)} {channel.unit} − zero {formatReading(zero, channel.unit)} {channel.unit}
          </p>
        )}
      </div>
      <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1">
        <dt className="font-semibold">Raw</dt>
        <dd className="font-mono">{formatRaw(channel.raw)}</dd>
        <dt className="font-semibold">Last frame</dt>
        <dd>
          <StateWord {...SAMPLE_WORDS[channel.status]} />
        </dd>
        {channel.problem && (
          <>
            <dt className="font-semibold">Why</dt>
            <dd className="font-semibold text-alarm-900" data-testid={`problem-${channel.key}`}>
              {channel.problem}
            </dd>
          </>
        )}
        {channel.lastRejection && channel.lastRejection !== channel.problem && (
          <>
            <dt className="font-semibold">Last rejection</dt>
            <dd data-testid={`last-rejection-${channel.key}`}>{channel.lastRejection}</dd>
          </>
        )}
        <dt className="font-semibold">Link</dt>
        <dd>
          <StateWord {...LINK_WORDS[channel.link]} />
        </dd>
        <dt className="font-semibold">Port</dt>
        <dd className="font-mono break-all">{channel.port || '—'}</dd>
        <dt className="font-semibold">Last sample</dt>
        <dd>
          {stale ? (
            <StateWord symbol="⚠" word={`${formatAge(channel.atMs, nowMs)} ago: stale`} bad />
          ) : (
            <span className="font-mono">{formatAge(channel.atMs, nowMs)}</span>
          )}
        </dd>
        <dt className="font-semibold">Calibration</dt>
        <dd>
          <CalibrationBadge status={channel.calibration} />
        </dd>
      </dl>
      <dl className="grid grid-cols-2 gap-2 sm:grid-cols-4">
        <Counter label="Frames ok" value={channel.framesOk} />
        <Counter label="Rejected" value={channel.rejected} />
        <Counter label="Timeouts" value={channel.timeouts} />
        <Counter label="Reconnects" value={channel.reconnects} />
      </dl>
      {channel.role === 'gauge' && (
        <div className="flex flex-col gap-2 border-t-2 border-neutral-300 pt-3">
          <div className="flex flex-wrap gap-2">
            <Button variant="secondary" disabled={channel.value == null} onClick={() => onZero(channel.value ?? undefined)}>
              Set display zero
            </Button>
            {zeroed && (
              <Button variant="quiet" onClick={() => onZero(undefined)}>
                Clear display zero
              </Button>
            )}
          </div>
          <p className="text-sm text-neutral-800">
            Display zero is for checking that the stem moves; it is kept on this screen only and does not change the rig or any run.
          </p>
        </div>
      )}
    </article>
  );
}

/** The live device check of a rig: one card per channel, with a display zero for gauges. */
export function DeviceCheck({ feed }: { feed: RigLiveFeed }) {
  const nowMs = useNow();
  const [zeros, setZeros] = useState<Record<string, number>>({});
  const { live, connected, refused } = feed;
  const setZero = (key: string) => (value: number | undefined) =>
    setZeros(({ [key]: _dropped, ...rest }) => (value === undefined ? rest : { ...rest, [key]: value }));

  return (
    <div className="flex flex-col gap-4">
      {!connected && (
        <p role="status" className="rounded-md border-2 border-caution-700 bg-caution-50 p-3 font-semibold text-caution-950">
          <span aria-hidden="true">◌ </span>Not connected to the server; reconnecting…
        </p>
      )}
      {refused && <RigProblem text={`The server would not watch this rig: ${refused}`} />}
      {live?.problem && <RigProblem text={live.problem} />}
      {!live ? <LoadingState label="Waiting for the first readings…" /> : <ChannelCards live={live} nowMs={nowMs} zeros={zeros} setZero={setZero} />}
    </div>
  );
}

function RigProblem({ text }: { text: string }) {
  return (
    <div role="alert" className="rounded-md border-4 border-alarm-700 bg-alarm-50 p-4 text-xl font-bold text-alarm-900">
      <span aria-hidden="true">⚠ </span>
      {text}
    </div>
  );
}

interface ChannelCardsProps {
  live: RigLive;
  nowMs: number;
  zeros: Record<string, number>;
  setZero: (key: string) => (value: number | undefined) => void;
}

function ChannelCards({ live, nowMs, zeros, setZero }: ChannelCardsProps) {
  return (
    <div className="grid gap-4 md:grid-cols-2 xl:grid-cols-3">
      {live.channels.map((channel) => (
        <ChannelCard key={channel.key} channel={channel} nowMs={nowMs} zero={zeros[channel.key]} onZero={setZero(channel.key)} />
      ))}
    </div>
  );
}
