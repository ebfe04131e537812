import { type AlarmRecord, type AlarmState, alarmKey } from '@shared/hold/alarm-lifecycle';
import type { RunCommand } from '@shared/schemas/runs';
import { formatQuantity } from '@shared/units/format';
import { useState } from 'react';
import { Button, FormActions } from '../../../components/button';
import { NumberField, TextField } from '../../../components/form-field';
import { formatClock } from '../utils/run-format';

const STATE_LABEL: Record<AlarmState, string> = {
  unacknowledged: 'Not acknowledged',
  acknowledged: 'Acknowledged',
  shelved: 'Shelved',
  cleared: 'Cleared',
};

function ShelveForm({
  alarm,
  busy,
  onShelve,
  onCancel,
}: {
  alarm: string;
  busy: boolean;
  onShelve: (minutes: number, reason: string) => void;
  onCancel: () => void;
}) {
  const [minutes, setMinutes] = useState('30');
  const [reason, setReason] = useState('');
  const valid = Number(minutes) > 0 && Number(minutes) <= 1440 && reason.trim() !== '';
  return (
    <form
      aria-label={`Shelve ${alarm}`}
      className="mt-2 flex flex-col gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        if (valid) onShelve(Number(minutes), reason.trim());
      }}
    >
      <NumberField label="Shelve for" unit="min" min={1} max={1440} value={minutes} onChange={(e) => setMinutes(e.target.value)} required />
      <TextField label="Reason for shelving" value={reason} onChange={(e) => setReason(e.target.value)} maxLength={500} required />
      <FormActions submitLabel="Shelve alarm" busyLabel="Shelving…" busy={busy} onCancel={onCancel} />
    </form>
  );
}

function AlarmItem({
  record,
  send,
  busy,
  disabled,
  closed,
}: {
  record: AlarmRecord;
  send: (c: RunCommand) => Promise<boolean>;
  busy: boolean;
  disabled: boolean;
  closed: boolean;
}) {
  const [shelving, setShelving] = useState(false);
  const key = alarmKey(record);
  const { alarm } = record;
  const critical = alarm.severity === 'critical';
  const standing = record.state === 'unacknowledged';
  return (
    <li className={`rounded-md border-2 p-3 ${standing ? 'border-alarm-700 bg-alarm-50 text-alarm-900' : 'border-neutral-400 text-neutral-950'}`}>
      <p className="font-bold">
        <span aria-hidden="true">{critical ? '✖ ' : '⚠ '}</span>
        {critical ? 'Critical' : 'Warning'}: {alarm.message}
      </p>
      <p className="text-sm">
        {STATE_LABEL[record.state]}
        {record.state === 'shelved' && record.shelvedUntilMs !== null && ` until ${formatClock(record.shelvedUntilMs)}`} · value{' '}
        <span className="font-mono">{formatQuantity(alarm.value, alarm.unit)}</span>, limit{' '}
        <span className="font-mono">{formatQuantity(alarm.limit, alarm.unit)}</span>
      </p>
      <p className="text-sm">
        Rule: {alarm.source.text} <span className="italic">({alarm.source.tag})</span>
      </p>
      {!closed && (
        <div className="mt-2 flex flex-wrap gap-2">
          {standing && (
            <Button busy={busy} disabled={disabled} aria-label={`Acknowledge: ${alarm.message}`} onClick={() => void send({ type: 'acknowledge-alarm', key })}>
              Acknowledge
            </Button>
          )}
          {record.state !== 'shelved' && !shelving && (
            <Button variant="secondary" disabled={disabled} aria-label={`Shelve: ${alarm.message}`} onClick={() => setShelving(true)}>
              Shelve…
            </Button>
          )}
        </div>
      )}
      {shelving && (
        <ShelveForm
          alarm={alarm.message}
          busy={busy}
          onCancel={() => setShelving(false)}
          onShelve={(minutes, reason) => void send({ type: 'shelve-alarm', key, minutes, reason }).then((ok) => ok && setShelving(false))}
        />
      )}
    </li>
  );
}

/** Standing alarms, each with what it judged, the rule it follows, and acknowledge / shelve while the run is open. */
export function AlarmsPanel({
  alarms,
  send,
  busy,
  disabled,
  closed = false,
}: {
  alarms: AlarmRecord[];
  send: (c: RunCommand) => Promise<boolean>;
  busy: boolean;
  disabled: boolean;
  /** The run is closed: the alarms are shown as they stood at the close, with nothing to do. */
  closed?: boolean;
}) {
  const open = alarms.filter((a) => a.state === 'unacknowledged').length;
  return (
    <section aria-labelledby="alarms-heading" className="flex flex-col gap-2">
      <h2 id="alarms-heading" className="text-xl font-bold">
        Alarms{' '}
        <span className="font-mono text-base font-normal">
          {closed ? `(${alarms.length} standing when the run closed)` : `(${alarms.length} standing, ${open} not acknowledged)`}
        </span>
      </h2>
      {alarms.length === 0 ? (
        <p className="text-neutral-800">
          <span aria-hidden="true">✓ </span>No alarms.
        </p>
      ) : (
        <ul className="flex flex-col gap-2">
          {alarms.map((a) => (
            <AlarmItem key={alarmKey(a)} record={a} send={send} busy={busy} disabled={disabled} closed={closed} />
          ))}
        </ul>
      )}
    </section>
  );
}
