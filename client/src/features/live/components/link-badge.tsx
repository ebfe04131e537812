import type { LiveSnapshot } from '../live-store';

/** No view for longer than this, ms, and the shown figures count as stale. */
export const STALE_AFTER_MS = 5_000;

type Shown = 'live' | 'connecting' | 'reconnecting' | 'stale' | 'offline';

/** What the badge says, from the link and how long ago the last view arrived. */
export function linkStatus(snapshot: Pick<LiveSnapshot, 'link' | 'viewReceivedAtMs'>, nowMs: number): Shown {
  if (snapshot.link !== 'live') return snapshot.link;
  return snapshot.viewReceivedAtMs === null || nowMs - snapshot.viewReceivedAtMs > STALE_AFTER_MS ? 'stale' : 'live';
}

const LOOK: Record<Shown, { symbol: string; label: string; box: string }> = {
  live: { symbol: '●', label: 'Live', box: 'border-neutral-950 bg-white text-neutral-950' },
  connecting: { symbol: '◌', label: 'Connecting…', box: 'border-neutral-700 bg-neutral-100 text-neutral-950' },
  reconnecting: { symbol: '◌', label: 'Reconnecting…', box: 'border-caution-700 bg-caution-50 text-caution-950' },
  stale: { symbol: '⚠', label: 'Stale', box: 'border-alarm-700 bg-alarm-50 text-alarm-900' },
  offline: { symbol: '✖', label: 'Not connected', box: 'border-alarm-700 bg-alarm-50 text-alarm-900' },
};

/** The live link's state, always in view: words and a symbol, never colour alone. */
export function LinkBadge({ snapshot, nowMs }: { snapshot: LiveSnapshot; nowMs: number }) {
  const shown = linkStatus(snapshot, nowMs);
  const look = LOOK[shown];
  const age = snapshot.viewReceivedAtMs === null ? null : Math.round((nowMs - snapshot.viewReceivedAtMs) / 1000);
  return (
    <p role="status" className={`inline-flex min-h-touch items-center gap-2 rounded-md border-2 px-3 font-bold ${look.box}`}>
      <span aria-hidden="true">{look.symbol}</span>
      {look.label}
      {shown === 'stale' && age !== null && <span className="font-normal">: no update for {age} s</span>}
      {snapshot.linkError && shown !== 'live' && <span className="font-normal">({snapshot.linkError})</span>}
    </p>
  );
}
