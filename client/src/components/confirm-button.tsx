import { useState } from 'react';
import { Button } from './button';

interface ConfirmButtonProps {
  /** What the first press says, e.g. "Delete project". */
  label: string;
  /** The question asked before acting, e.g. "Delete project P-12 and its locations?". */
  question: string;
  confirmLabel?: string;
  busy?: boolean;
  onConfirm: () => void;
}

/** A destructive action that asks once more in place, rather than in a browser dialog. */
export function ConfirmButton({ label, question, confirmLabel = 'Yes, delete', busy = false, onConfirm }: ConfirmButtonProps) {
  const [asking, setAsking] = useState(false);
  if (!asking) {
    return (
      <Button variant="danger" onClick={() => setAsking(true)}>
        {label}
      </Button>
    );
  }
  return (
    <fieldset className="flex flex-wrap items-center gap-2 rounded-md border-2 border-alarm-700 bg-alarm-50 p-2">
      <legend className="float-left font-semibold text-alarm-900">{question}</legend>
      <Button variant="danger" busy={busy} busyLabel="Deleting…" onClick={onConfirm}>
        {confirmLabel}
      </Button>
      <Button variant="secondary" onClick={() => setAsking(false)}>
        Keep it
      </Button>
    </fieldset>
  );
}
