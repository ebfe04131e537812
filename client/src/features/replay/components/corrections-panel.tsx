import type { RunView } from '@shared/schemas/runs';
import { useState } from 'react';
import { FormActions } from '../../../components/button';
import { NumberField, SelectField, TextAreaField } from '../../../components/form-field';
import { FormError } from '../../../components/form-alert';
import { formatNumber } from '../../../components/readout';
import { isApiError } from '../../../lib/api-client';
import type { Correction, ReadingAt } from '../api/replay-api';
import { useCreateCorrection } from '../api/replay-api';
import { formatElapsed } from '../utils/timeline';

const fromMicro = (v: number | null) => (v === null ? null : v / 1000);

/** Every correction of the run's readings: what was recorded, what stands now, who, when (UTC) and why. */
export function CorrectionsList({ view, fromMs, corrections }: { view: RunView; fromMs: number; corrections: readonly Correction[] }) {
  if (corrections.length === 0) return <p className="text-neutral-800">No reading of this run has been corrected.</p>;
  return (
    <table aria-label="Corrections" className="w-full text-left">
      <thead>
        <tr>
          <th scope="col">Run time</th>
          <th scope="col">Channel</th>
          <th scope="col">Recorded</th>
          <th scope="col">Now</th>
          <th scope="col">Reason</th>
          <th scope="col">By, at (UTC)</th>
        </tr>
      </thead>
      <tbody>
        {corrections.map((c) => {
          const channel = view.channels[c.channel];
          return (
            <tr key={c.id}>
              <td className="font-mono">{formatElapsed(c.tMs - fromMs)}</td>
              <td>{channel?.label ?? `#${c.channel}`}</td>
              <td className="font-mono">
                {formatNumber(fromMicro(c.originalValue), 3)} {channel?.unit}
              </td>
              <td className="font-mono">{c.action === 'mark-faulty' ? 'faulty (left out)' : `${formatNumber(fromMicro(c.newValue), 3)} ${channel?.unit ?? ''}`}</td>
              <td>{c.reason}</td>
              <td>
                {c.userName}, <span className="font-mono">{c.at.slice(0, 19).replace('T', ' ')}</span>
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

/**
 * Marks one of the readings in force at the replay time faulty, or — for a typed gauge reading — gives it the
 * value it should have had. The recorded sample stays as it was; the correction is kept beside it.
 */
export function CorrectionForm({ runId, view, readings }: { runId: number; view: RunView; readings: readonly ReadingAt[] }) {
  const create = useCreateCorrection(runId);
  const [seq, setSeq] = useState('');
  const [action, setAction] = useState<Correction['action']>('mark-faulty');
  const [valueMm, setValueMm] = useState('');
  const [reason, setReason] = useState('');
  const chosen = readings.find((r) => String(r.seq) === seq);
  const canCorrectValue = view.manual && chosen !== undefined && view.channels[chosen.channel]?.role === 'gauge';
  const error = create.error;
  const fieldError = (field: string) => (isApiError(error) && error.field === field ? error.message : undefined);
  const options = readings.map((r) => {
    const c = view.channels[r.channel];
    return { value: String(r.seq), label: `${c?.label ?? `#${r.channel}`}: ${formatNumber(fromMicro(r.value), 3)} ${c?.unit ?? ''} (#${r.seq})${r.faulty ? ', marked faulty' : r.correctedValue != null ? ', corrected' : ''}` };
  });
  return (
    <form
      aria-label="Correct a reading"
      className="flex flex-col gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        if (!chosen) return;
        const correctValue = action === 'correct-value' && canCorrectValue;
        create.mutate(
          { seq: chosen.seq, action: correctValue ? 'correct-value' : 'mark-faulty', ...(correctValue ? { valueMm: Number(valueMm) } : {}), reason: reason.trim() },
          {
            onSuccess: () => {
              setReason('');
              setValueMm('');
            },
          },
        );
      }}
    >
      <SelectField label="Reading at the replay time" options={options} placeholder="Choose a reading" value={seq} onChange={(e) => setSeq(e.target.value)} error={fieldError('seq')} required />
      <fieldset className="flex flex-wrap gap-4">
        <legend className="font-semibold">Correction</legend>
        <label className="inline-flex min-h-touch items-center gap-1">
          <input type="radio" name="correction-action" checked={action === 'mark-faulty' || !canCorrectValue} onChange={() => setAction('mark-faulty')} />
          Mark faulty (leave it out)
        </label>
        <label className="inline-flex min-h-touch items-center gap-1">
          <input type="radio" name="correction-action" checked={action === 'correct-value' && canCorrectValue} disabled={!canCorrectValue} onChange={() => setAction('correct-value')} />
          Correct a typed gauge reading
        </label>
      </fieldset>
      {action === 'correct-value' && canCorrectValue && (
        <NumberField label="Reading it should have been" unit="mm" step="any" value={valueMm} onChange={(e) => setValueMm(e.target.value)} error={fieldError('valueMm')} required />
      )}
      <TextAreaField label="Reason" value={reason} onChange={(e) => setReason(e.target.value)} maxLength={500} error={fieldError('reason')} required />
      <FormError message={error && !(isApiError(error) && error.field) ? error.message : undefined} />
      <FormActions submitLabel="Record correction" busyLabel="Recording…" busy={create.isPending} />
    </form>
  );
}
