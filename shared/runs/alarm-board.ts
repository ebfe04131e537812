/**
 * A run's standing alarms kept in step with what the alarm rules say now: a rule active long enough is
 * raised, one quiet long enough (and back inside its deadband) cleared, an expired shelf brought back,
 * every change reported so the run can record it. Pure: records and pending onsets in, the same out.
 *
 * Delays and deadbands keep an alarm worth hearing: a figure hovering at its limit, or a reading's
 * noise, would otherwise raise and clear it every few seconds and the crew would learn to ignore it.
 */
import { type AlarmAction, type AlarmRecord, alarmKey, reduceAlarm } from '../hold/alarm-lifecycle';
import type { Alarm, AlarmCode } from '../hold/alarms';

export interface AlarmChange {
  key: string;
  action: AlarmAction['type'];
  message: string;
}

/** How long a rule must say so before its alarm is raised (`onMs`) or cleared (`offMs`), run clock ms. */
export interface AlarmDelays {
  onMs: number;
  offMs: number;
}

/**
 * Delays per alarm. Rules about the load and the plate (drift, tilt, travel, reaction) wait a few
 * seconds both ways: a pump stroke or a knock passes. Rules that already wait (signal-lost counts its own
 * silence), that judge once (an unexplained jump, a calibration date) or that guard the record itself
 * (readings unsecured, outside calibration, the stop limit) act at once.
 */
export const ALARM_DELAYS: Readonly<Record<AlarmCode, AlarmDelays>> = {
  'load-drift': { onMs: 10_000, offMs: 15_000 },
  'plate-tilt': { onMs: 10_000, offMs: 30_000 },
  'gauge-travel': { onMs: 3_000, offMs: 10_000 },
  'reaction-capacity': { onMs: 2_000, offMs: 10_000 },
  'stop-limit': { onMs: 0, offMs: 10_000 },
  'signal-lost': { onMs: 0, offMs: 0 },
  'calibration-overdue': { onMs: 0, offMs: 0 },
  'outside-calibration': { onMs: 0, offMs: 5_000 },
  'unexplained-jump': { onMs: 0, offMs: 0 },
  'readings-unsecured': { onMs: 0, offMs: 0 },
};

/** Since when (run clock ms) each alarm's rule has disagreed with its record: the delay counting down. */
export type AlarmPending = Record<string, number>;

export interface AlarmBoard {
  records: Record<string, AlarmRecord>;
  changes: AlarmChange[];
  pending: AlarmPending;
}

const standing = (record: AlarmRecord | undefined) => record !== undefined && record.state !== 'cleared';

/**
 * One step of the board. `pending` carries the onsets between steps (the run keeps it in memory: after a
 * restart a delay simply starts again). `delays` defaults to {@link ALARM_DELAYS}.
 */
export function reconcileAlarms(
  records: Readonly<Record<string, AlarmRecord>>,
  alarms: readonly Alarm[],
  nowMs: number,
  pending: Readonly<AlarmPending> = {},
  delays: Readonly<Record<AlarmCode, AlarmDelays>> = ALARM_DELAYS,
): AlarmBoard {
  const next: Record<string, AlarmRecord> = { ...records };
  const nextPending: AlarmPending = {};
  const changes: AlarmChange[] = [];
  const apply = (key: string, action: AlarmAction) => {
    const r = reduceAlarm(next[key] ?? null, action);
    if (!r.ok) return;
    next[key] = r.record;
    changes.push({ key, action: action.type, message: r.record.alarm.message });
  };
  /** True once the rule has disagreed with the record for `ms`; starts or keeps the count otherwise. */
  const waited = (key: string, ms: number) => {
    const since = pending[key] ?? nowMs;
    if (nowMs - since >= ms) return true;
    nextPending[key] = since;
    return false;
  };
  const seen = new Set<string>();
  for (const alarm of alarms) {
    const key = alarmKey(alarm);
    seen.add(key);
    const record = next[key];
    const delay = delays[alarm.code];
    if (!standing(record)) {
      if (alarm.active && waited(key, delay.onMs)) apply(key, { type: 'raise', atMs: nowMs, alarm });
    } else if (alarm.active) {
      next[key] = { ...record, alarm }; // keep the figures fresh
    } else if (!alarm.inDeadband && waited(key, delay.offMs)) {
      apply(key, { type: 'clear', atMs: nowMs });
    }
    const current = next[key];
    if (current?.state === 'shelved' && current.shelvedUntilMs !== null && nowMs >= current.shelvedUntilMs) apply(key, { type: 'unshelve-expired', atMs: nowMs });
  }
  // A rule that no longer applies at all (a gauge removed, the hold over) clears its alarm at once.
  for (const [key, record] of Object.entries(next)) {
    if (!seen.has(key) && standing(record)) apply(key, { type: 'clear', atMs: nowMs });
  }
  return { records: next, changes, pending: nextPending };
}
