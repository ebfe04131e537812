import type { RunCommand, RunView } from '@shared/schemas/runs';
import type { Role } from '@shared/schemas/users';
import { useState } from 'react';
import { Button } from '../../../components/button';
import { formatNumber } from '../../../components/readout';
import { ReasonForm } from './command-button';

/** A channel's live figure and whether it is reading, from the run view. */
function channelState(view: RunView, channel: RunView['channels'][number]): { value: string; ok: boolean } {
  if (channel.role === 'gauge') {
    const g = view.live.gauges.find((x) => x.key === channel.key);
    return { value: g?.readingMm == null ? '—' : `${formatNumber(g.readingMm, 3)} mm`, ok: g?.readingMm != null };
  }
  const v = view.live.oilPressure;
  const ok = v !== null && view.live.pressureProblem === null;
  return { value: v === null ? '—' : `${formatNumber(v, 2)} ${view.live.oilUnit ?? channel.unit}`, ok };
}

function OverdueBlock({ view, role, send, busy }: { view: RunView; role: Role | undefined; send: (c: RunCommand) => Promise<boolean>; busy: boolean }) {
  const [asking, setAsking] = useState(false);
  const accepted = view.calibrationOverride;
  if (view.overdueInstruments.length === 0) return null;
  const mayAccept = role === 'engineer' || role === 'admin';
  return (
    <div className={`flex flex-col gap-2 rounded-md border-2 p-3 ${accepted ? 'border-neutral-700' : 'border-alarm-700 bg-alarm-50 text-alarm-900'}`}>
      <p className="font-bold">
        <span aria-hidden="true">{accepted ? '✓ ' : '✖ '}</span>
        Calibration overdue: {view.overdueInstruments.join(', ')}
      </p>
      {accepted ? (
        <p>
          Accepted by {accepted.by}: “{accepted.reason}”. The run's record shows it.
        </p>
      ) : mayAccept ? (
        asking ? (
          <ReasonForm
            label="Why may this run use an instrument out of calibration?"
            submitLabel="Accept with this reason"
            busy={busy}
            onCancel={() => setAsking(false)}
            onSubmit={(reason) => void send({ type: 'accept-overdue', reason })}
          />
        ) : (
          <Button variant="danger" className="self-start" onClick={() => setAsking(true)}>
            Accept with a reason…
          </Button>
        )
      ) : (
        <p>An engineer must accept this, with a reason, before the run can start.</p>
      )}
    </div>
  );
}

/** Before the seating stage: every channel reading, calibration accepted, gauges zeroed, then start. */
export function PreparingPanel({
  view,
  role,
  send,
  busy,
  disabled,
  zeroed,
}: {
  view: RunView;
  role: Role | undefined;
  send: (c: RunCommand) => Promise<boolean>;
  busy: boolean;
  disabled: boolean;
  /** Zeroing first is the bar's main action; once done, it can be done again from here. */
  zeroed: boolean;
}) {
  return (
    <section aria-labelledby="prepare-heading" className="flex flex-col gap-3 rounded-md border-2 border-neutral-800 p-3">
      <h2 id="prepare-heading" className="text-xl font-bold">
        Get ready
      </h2>
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">Channels</caption>
        <thead>
          <tr className="border-b-2 border-neutral-300">
            <th scope="col" className="py-1 pr-2">
              Channel
            </th>
            <th scope="col" className="py-1 pr-2">
              Live value
            </th>
            <th scope="col" className="py-1">
              Status
            </th>
          </tr>
        </thead>
        <tbody>
          {view.channels.map((c) => {
            const s = channelState(view, c);
            return (
              <tr key={c.key} className="border-b border-neutral-300">
                <td className="py-2 pr-2 font-semibold">{c.label}</td>
                <td className="py-2 pr-2 font-mono">{s.value}</td>
                <td className={`py-2 font-semibold ${s.ok ? '' : 'text-alarm-900'}`}>
                  <span aria-hidden="true">{s.ok ? '✓ ' : '✖ '}</span>
                  {s.ok ? 'Reading' : 'No reading'}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <OverdueBlock view={view} role={role} send={send} busy={busy} />
      {zeroed && (
        <Button variant="secondary" className="self-start" busy={busy} disabled={disabled} onClick={() => void send({ type: 'zero' })}>
          Zero the gauges again
        </Button>
      )}
      <p className="text-neutral-800">Once every channel reads: zero the gauges, then start, from the bar at the top.</p>
    </section>
  );
}
