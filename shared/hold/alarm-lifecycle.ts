import type { Alarm, AlarmCode } from './alarms';

/**
 * Where an alarm stands: `unacknowledged` (standing, nobody has answered it), `acknowledged` (standing,
 * someone has answered it), `shelved` (standing, hidden until a set time), `cleared` (condition gone).
 */
export type AlarmState = 'unacknowledged' | 'acknowledged' | 'shelved' | 'cleared';

export type AlarmAction =
  | { type: 'raise'; atMs: number; alarm: Alarm }
  | { type: 'acknowledge'; atMs: number; by: string }
  | { type: 'shelve'; atMs: number; by: string; untilMs: number; reason: string }
  | { type: 'unshelve-expired'; atMs: number }
  | { type: 'clear'; atMs: number; by?: string };

/** One change of state: who, when, from what to what. `by` is 'system' for automatic changes. */
export interface AlarmTransition {
  action: AlarmAction['type'];
  from: AlarmState | null;
  to: AlarmState;
  by: string;
  atMs: number;
  note: string | null;
}

export interface AlarmRecord {
  code: AlarmCode;
  subject: string | null;
  state: AlarmState;
  /** The alarm as last raised. */
  alarm: Alarm;
  raisedAtMs: number;
  /** Set while shelved, ms since the epoch. */
  shelvedUntilMs: number | null;
  history: AlarmTransition[];
}

export type AlarmResult = { ok: true; record: AlarmRecord } | { ok: false; error: string };

const SYSTEM = 'system';

/** Which states each action may start from, and where it leads. */
const TRANSITIONS: Record<AlarmAction['type'], { from: readonly (AlarmState | null)[]; to: AlarmState }> = {
  raise: { from: [null, 'cleared'], to: 'unacknowledged' },
  acknowledge: { from: ['unacknowledged'], to: 'acknowledged' },
  shelve: { from: ['unacknowledged', 'acknowledged'], to: 'shelved' },
  'unshelve-expired': { from: ['shelved'], to: 'unacknowledged' },
  clear: { from: ['unacknowledged', 'acknowledged', 'shelved'], to: 'cleared' },
};

/** Identifies an alarm among a run's alarms: its code, and its subject when it has one. */
export function alarmKey(alarm: Pick<Alarm, 'code' | 'subject'>): string {
  return alarm.subject === null ? alarm.code : `${alarm.code}:${alarm.subject}`;
}

/** Reason the action cannot apply, beyond the state table; null when it can. */
function actionProblem(record: AlarmRecord | null, action: AlarmAction): string | null {
  if (!Number.isFinite(action.atMs)) return 'atMs must be a finite time';
  const last = record?.history.at(-1);
  if (last && action.atMs < last.atMs) return `atMs ${action.atMs} is before the alarm's last change at ${last.atMs}`;
  switch (action.type) {
    case 'raise':
      if (!action.alarm.active) return 'an inactive alarm cannot be raised';
      if (record && alarmKey(record) !== alarmKey(action.alarm)) return `this record is for ${alarmKey(record)}, not ${alarmKey(action.alarm)}`;
      return null;
    case 'acknowledge':
      return action.by.trim() === '' ? 'by: say who acknowledges' : null;
    case 'shelve':
      if (action.by.trim() === '') return 'by: say who shelves the alarm';
      if (action.reason.trim() === '') return 'reason: say why the alarm is shelved';
      return action.untilMs > action.atMs ? null : 'untilMs must be after atMs';
    case 'unshelve-expired':
      return record?.shelvedUntilMs != null && action.atMs < record.shelvedUntilMs ? `the alarm is shelved until ${record.shelvedUntilMs}` : null;
    case 'clear':
      return null;
  }
}

/**
 * The alarm lifecycle as a reducer: raise → acknowledge / shelve → (shelf expires →) clear, recording who
 * and when. An action that does not apply in the current state returns an error result, never throws,
 * so the run engine can report it to whoever sent the command.
 */
export function reduceAlarm(record: AlarmRecord | null, action: AlarmAction): AlarmResult {
  const from = record?.state ?? null;
  const rule = TRANSITIONS[action.type];
  if (!rule.from.includes(from)) {
    return { ok: false, error: from === null ? `cannot ${action.type}: no alarm has been raised` : `cannot ${action.type} an alarm that is ${from}` };
  }
  const problem = actionProblem(record, action);
  if (problem) return { ok: false, error: problem };

  const by = 'by' in action && action.by !== undefined ? action.by : SYSTEM;
  const note = action.type === 'shelve' ? action.reason : null;
  const transition: AlarmTransition = { action: action.type, from, to: rule.to, by, atMs: action.atMs, note };
  const history = [...(record?.history ?? []), transition];

  if (action.type === 'raise') {
    const { alarm } = action;
    return { ok: true, record: { code: alarm.code, subject: alarm.subject, state: rule.to, alarm, raisedAtMs: action.atMs, shelvedUntilMs: null, history } };
  }
  // Every other action starts from an existing record (the state table has no null for them).
  const current = record as AlarmRecord;
  const shelvedUntilMs = action.type === 'shelve' ? action.untilMs : null;
  return { ok: true, record: { ...current, state: rule.to, shelvedUntilMs, history } };
}
