import { UNLOAD_REASON_LABELS, UNLOAD_REASONS, type UnloadReason } from '@shared/plans/unloading';
import type { RunCommand } from '@shared/schemas/runs';
import { Button } from '../../../components/button';
import { SelectField, TextAreaField } from '../../../components/form-field';

const REASON_OPTIONS = UNLOAD_REASONS.map((value) => ({
  value,
  label: UNLOAD_REASON_LABELS[value].charAt(0).toUpperCase() + UNLOAD_REASON_LABELS[value].slice(1),
}));

/**
 * Confirms ending the loading here: why (the reason is recorded with the run), and what follows — the
 * stage reached becomes the maximum and the server derives the unloading stages from it.
 */
export function UnloadForm({
  reason,
  busy,
  onSubmit,
  onCancel,
}: {
  /** The reason chosen beforehand (the jack's limit when the next stage is refused). */
  reason?: UnloadReason;
  busy: boolean;
  onSubmit: (command: Extract<RunCommand, { type: 'unload' }>) => void;
  onCancel: () => void;
}) {
  return (
    <form
      aria-label="Go to unloading"
      className="flex flex-col gap-2 rounded-md border-2 border-neutral-800 p-3"
      onSubmit={(e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        const note = String(data.get('note') ?? '').trim();
        onSubmit({ type: 'unload', reason: String(data.get('reason')) as UnloadReason, ...(note ? { note } : {}) });
      }}
    >
      <p className="font-semibold">End the loading here? The stage reached becomes the maximum; the unloading stages follow from it. This cannot be undone.</p>
      <SelectField label="Why" name="reason" required defaultValue={reason ?? 'stop-limit'} options={REASON_OPTIONS} />
      <TextAreaField label="Note (optional)" name="note" maxLength={500} rows={2} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="danger" busy={busy} busyLabel="Sending…">
          Go to unloading
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
