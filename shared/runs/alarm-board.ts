/**
 * A run's standing alarms kept in step with what the alarm rules say now: a newly active rule is
 * raised, an inactive one cleared, an expired shelf brought back, every change reported so the run
 * can record it. Pure: records in, records and changes out.
 */
import { type AlarmAction, type AlarmRecord, alarmKey, reduceAlarm } from '../hold/alarm-lifecycle';
import type { Alarm } from '../hold/alarms';

export interface AlarmChange {
  key: string;
  action: AlarmAction['type'];
  message: string;
}

export function reconcileAlarms(records: Readonly<Record<string, AlarmRecord>>, alarms: readonly Alarm[], nowMs: number): { records: Record<string, AlarmRecord>; changes: AlarmChange[] } {
  const next: Record<string, AlarmRecord> = { ...records };
  const changes: AlarmChange[] = [];
  const apply = (key: string, action: AlarmAction) => {
    const r = reduceAlarm(next[key] ?? null, action);
    if (!r.ok) return;
    next[key] = r.record;
    changes.push({ key, action: action.type, message: r.record.alarm.message });
  };
  const seen = new Set<string>();
  for (const alarm of alarms) {
    const key = alarmKey(alarm);
    seen.add(key);
    const record = next[key];
    if (alarm.active && (!record || record.state === 'cleared')) apply(key, { type: 'raise', atMs: nowMs, alarm });
    else if (!alarm.active && record && record.state !== 'cleared') apply(key, { type: 'clear', atMs: nowMs });
    else if (record && alarm.active) next[key] = { ...record, alarm }; // keep the figures fresh
    const current = next[key];
    if (current?.state === 'shelved' && current.shelvedUntilMs !== null && nowMs >= current.shelvedUntilMs) apply(key, { type: 'unshelve-expired', atMs: nowMs });
  }
  // A rule that no longer applies at all (e.g. a gauge removed) clears its alarm.
  for (const [key, record] of Object.entries(next)) {
    if (!seen.has(key) && record.state !== 'cleared') apply(key, { type: 'clear', atMs: nowMs });
  }
  return { records: next, changes };
}
