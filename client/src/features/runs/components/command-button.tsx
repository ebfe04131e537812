import type { ComponentProps } from 'react';
import { Button } from '../../../components/button';
import { TextAreaField } from '../../../components/form-field';

/** A console button that names its keyboard shortcut on its face (the key is not part of its accessible name). */
export function CommandButton({ shortcut, children, ...rest }: ComponentProps<typeof Button> & { shortcut?: string }) {
  return (
    <Button aria-keyshortcuts={shortcut} {...rest}>
      {children}
      {shortcut && (
        <span aria-hidden="true">
          <kbd className="rounded border border-current px-1.5 font-mono text-sm">{shortcut}</kbd>
        </span>
      )}
    </Button>
  );
}

/** A required reason for an action that must be explained (early advance, stop), with its own submit. */
export function ReasonForm({
  label,
  submitLabel,
  busy,
  onSubmit,
  onCancel,
  variant = 'primary',
}: {
  label: string;
  submitLabel: string;
  busy: boolean;
  onSubmit: (reason: string) => void;
  onCancel: () => void;
  variant?: 'primary' | 'danger';
}) {
  return (
    <form
      className="flex flex-col gap-2 rounded-md border-2 border-neutral-800 p-3"
      onSubmit={(e) => {
        e.preventDefault();
        const reason = String(new FormData(e.currentTarget).get('reason') ?? '').trim();
        if (reason) onSubmit(reason);
      }}
    >
      <TextAreaField label={label} name="reason" required maxLength={500} rows={2} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant={variant} busy={busy} busyLabel="Sending…">
          {submitLabel}
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
