import type { RunCommand, RunView } from '@shared/schemas/runs';
import { useState } from 'react';
import { Button } from '../../../components/button';
import { NumberField, SelectField } from '../../../components/form-field';
import { formatNumber } from '../../../components/readout';

type Step = { kind: 'pick' } | { kind: 'before'; channel: string } | { kind: 'after'; channel: string; beforeMm: number };

const toNumber = (text: string) => (text.trim() === '' ? Number.NaN : Number(text));

/**
 * Guided reset of a gauge that is running out of travel: pick the gauge, keep its reading as
 * "before", re-seat it, then confirm the new reading as "after". The server adds the difference
 * to the gauge's offset so its settlement stays continuous.
 */
export function GaugeResetDialog({
  view,
  send,
  busy,
  onClose,
}: {
  view: RunView;
  send: (c: RunCommand) => Promise<boolean>;
  busy: boolean;
  onClose: () => void;
}) {
  const [step, setStep] = useState<Step>({ kind: 'pick' });
  const [typed, setTyped] = useState('');
  const gauges = view.live.gauges;
  const liveReading = (key: string) => gauges.find((g) => g.key === key)?.readingMm ?? null;
  const channel = step.kind === 'pick' ? null : step.channel;
  const live = channel ? liveReading(channel) : null;
  // Manual rigs (or a silent gauge) have no live reading: the operator types it.
  const value = live ?? toNumber(typed);
  const label = gauges.find((g) => g.key === channel)?.label ?? channel;

  return (
    <section role="dialog" aria-labelledby="gauge-reset-heading" className="flex flex-col gap-3 rounded-md border-2 border-neutral-950 bg-white p-3">
      <h2 id="gauge-reset-heading" className="text-xl font-bold">
        Reset a gauge
      </h2>
      {step.kind === 'pick' && (
        <SelectField
          label="Gauge to reset"
          placeholder="Choose a gauge"
          value=""
          options={gauges.map((g) => ({ value: g.key, label: `${g.label} (reading ${formatNumber(g.readingMm, 2)} mm)` }))}
          onChange={(e) => e.target.value && setStep({ kind: 'before', channel: e.target.value })}
        />
      )}
      {step.kind !== 'pick' && (
        <ol className="list-decimal space-y-2 pl-5">
          <li className={step.kind === 'before' ? 'font-semibold' : 'text-neutral-800'}>
            Before re-seating {label}: {step.kind === 'after' ? <span className="font-mono">{step.beforeMm.toFixed(3)} mm kept</span> : 'keep its reading now.'}
          </li>
          <li className={step.kind === 'after' ? 'font-semibold' : 'text-neutral-800'}>Re-seat the gauge stem, let it settle, then confirm its new reading.</li>
        </ol>
      )}
      {channel && (
        <div className="flex flex-col gap-2">
          {live !== null ? (
            <p>
              {step.kind === 'before' ? 'Before' : 'After'} (live):{' '}
              <output className="font-mono text-3xl font-bold" aria-label={`${step.kind === 'before' ? 'Before' : 'After'} reading`}>
                {live.toFixed(3)}
              </output>{' '}
              mm
            </p>
          ) : (
            <NumberField
              label={step.kind === 'before' ? 'Before reading' : 'After reading'}
              unit="mm"
              value={typed}
              onChange={(e) => setTyped(e.target.value)}
            />
          )}
          {step.kind === 'before' ? (
            <Button
              disabled={!Number.isFinite(value)}
              onClick={() => {
                setStep({ kind: 'after', channel: step.channel, beforeMm: value });
                setTyped('');
              }}
            >
              Keep as before, I will re-seat it
            </Button>
          ) : (
            step.kind === 'after' && (
              <Button
                busy={busy}
                busyLabel="Sending…"
                disabled={!Number.isFinite(value)}
                onClick={() => void send({ type: 'gauge-reset', channel: step.channel, beforeMm: step.beforeMm, afterMm: value }).then((ok) => ok && onClose())}
              >
                Confirm after reading
              </Button>
            )
          )}
        </div>
      )}
      <Button variant="secondary" onClick={onClose}>
        Cancel reset
      </Button>
    </section>
  );
}
