/**
 * A run's alarms as episodes: each raise paired with the clear that ended it, so a timeline or a report
 * shows one band per time an alarm stood rather than a mark per change. Pure: the run's events in order.
 */
import { alarmKeyWords } from './event-text';

/** One time an alarm stood, run clock ms. */
export interface AlarmEpisode {
  /** The alarm's key ("load-drift", "signal-lost:g1"). */
  key: string;
  /** The id of the 'alarm-raise' event that began it. */
  raiseEventId: number;
  raisedAtMs: number;
  /** When it cleared; null while it still stood at the last event. */
  clearedAtMs: number | null;
  /** The alarm's words as raised (the key in words when the event carries none). */
  message: string;
  /** When someone first acknowledged or shelved it within the episode; null when nobody did. */
  answeredAtMs: number | null;
}

interface AlarmEventLike {
  id: number;
  atMs: number;
  kind: string;
  payload: Record<string, unknown> | null;
}

/** Episodes in the order they began. A raise of a key already standing (a record restored) continues its episode. */
export function alarmEpisodes(events: readonly AlarmEventLike[]): AlarmEpisode[] {
  const episodes: AlarmEpisode[] = [];
  const open = new Map<string, AlarmEpisode>();
  for (const e of events) {
    if (!e.kind.startsWith('alarm-')) continue;
    const key = typeof e.payload?.key === 'string' ? e.payload.key : null;
    if (key === null) continue;
    const standing = open.get(key);
    if (e.kind === 'alarm-raise' && !standing) {
      const message = typeof e.payload?.message === 'string' && e.payload.message !== '' ? e.payload.message : alarmKeyWords(key);
      const episode: AlarmEpisode = { key, raiseEventId: e.id, raisedAtMs: e.atMs, clearedAtMs: null, message, answeredAtMs: null };
      episodes.push(episode);
      open.set(key, episode);
    } else if (e.kind === 'alarm-clear' && standing) {
      standing.clearedAtMs = e.atMs;
      open.delete(key);
    } else if ((e.kind === 'alarm-acknowledge' || e.kind === 'alarm-shelve') && standing && standing.answeredAtMs === null) {
      standing.answeredAtMs = e.atMs;
    }
  }
  return episodes;
}
