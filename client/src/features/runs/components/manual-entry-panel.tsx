import type { RunCommand, RunView } from '@shared/schemas/runs';
import { useState } from 'react';
import { FormActions } from '../../../components/button';
import { NumberField } from '../../../components/form-field';
import { formatMinutes } from '../utils/run-format';

type Entries = Record<string, string>;
const PRESSURE = '__pressure';

/** Turns the typed values into a manual-reading command; null while any gauge box is empty or not a number. */
export function manualReading(view: RunView, entries: Entries): Extract<RunCommand, { type: 'manual-reading' }> | null {
  const gauges: Record<string, number> = {};
  for (const g of view.live.gauges) {
    const text = entries[g.key]?.trim() ?? '';
    if (text === '' || !Number.isFinite(Number(text))) return null;
    gauges[g.key] = Number(text);
  }
  const pressure = entries[PRESSURE]?.trim() ?? '';
  if (pressure !== '' && !Number.isFinite(Number(pressure))) return null;
  return pressure === '' ? { type: 'manual-reading', gauges } : { type: 'manual-reading', pressureKpa: Number(pressure), gauges };
}

/** Manual mode: when the next reading is due, and large boxes to type each dial gauge and the pressure. */
export function ManualEntryPanel({
  view,
  send,
  busy,
  disabled,
}: {
  view: RunView;
  send: (c: RunCommand) => Promise<boolean>;
  busy: boolean;
  disabled: boolean;
}) {
  const [entries, setEntries] = useState<Entries>({});
  const command = manualReading(view, entries);
  const due = view.nextReading;
  const set = (key: string, value: string) => setEntries((e) => ({ ...e, [key]: value }));
  return (
    <section aria-labelledby="manual-heading" className="flex flex-col gap-3 rounded-md border-2 border-neutral-800 p-3">
      <h2 id="manual-heading" className="text-xl font-bold">
        Readings by hand
      </h2>
      <p role="status" className={`text-lg ${due && due.inMin <= 0 ? 'font-bold' : ''}`}>
        {due ? (
          <>
            {due.inMin <= 0 ? <span aria-hidden="true">⏰ </span> : null}
            Next reading at <span className="font-mono">{formatMinutes(due.atMin)}</span> of the hold —{' '}
            {due.inMin <= 0 ? 'due now' : <span className="font-mono">in {formatMinutes(due.inMin)}</span>}
          </>
        ) : (
          'Readings are scheduled once the hold starts.'
        )}
      </p>
      {view.readingFlags.length > 0 && (
        <ul aria-label="Late and missing readings" className="rounded-md border-2 border-caution-700 bg-caution-50 p-2 text-caution-950">
          {view.readingFlags.map((f) => (
            <li key={f.dueAtMin}>
              <span aria-hidden="true">⚠ </span>
              Reading due at <span className="font-mono">{formatMinutes(f.dueAtMin)}</span> {f.status === 'missing' ? 'is missing' : 'was taken late'} (by{' '}
              <span className="font-mono">{formatMinutes(f.lateByMin)}</span>)
            </li>
          ))}
        </ul>
      )}
      <form
        aria-label="Manual readings"
        className="flex flex-col gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          if (command) void send(command).then((ok) => ok && setEntries({}));
        }}
      >
        <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
          {view.live.gauges.map((g) => (
            <NumberField
              key={g.key}
              label={`${g.label} reading`}
              unit="mm"
              className="text-2xl"
              value={entries[g.key] ?? ''}
              onChange={(e) => set(g.key, e.target.value)}
              required
            />
          ))}
          <NumberField
            label="Pressure (optional)"
            unit="kPa"
            className="text-2xl"
            value={entries[PRESSURE] ?? ''}
            onChange={(e) => set(PRESSURE, e.target.value)}
          />
        </div>
        <FormActions submitLabel="Record readings" busyLabel="Recording…" busy={busy} />
        {disabled && <p className="text-neutral-800">Take control to record readings.</p>}
      </form>
    </section>
  );
}
