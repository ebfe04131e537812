import type { ComponentProps } from 'react';
import { Link } from 'react-router-dom';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'quiet';

const BASE =
  'inline-flex min-h-touch min-w-touch items-center justify-center gap-2 rounded-md px-4 py-2 text-base font-semibold no-underline ' +
  'disabled:cursor-not-allowed disabled:opacity-60';

const VARIANTS: Record<ButtonVariant, string> = {
  primary: 'bg-neutral-900 text-white hover:bg-neutral-700',
  secondary: 'border-2 border-neutral-800 bg-white text-neutral-950 hover:bg-neutral-100',
  danger: 'border-2 border-alarm-700 bg-white text-alarm-900 hover:bg-alarm-50',
  quiet: 'text-neutral-950 hover:bg-neutral-100',
};

export function buttonClass(variant: ButtonVariant = 'primary', extra = ''): string {
  return `${BASE} ${VARIANTS[variant]} ${extra}`.trim();
}

interface ButtonProps extends ComponentProps<'button'> {
  variant?: ButtonVariant;
  /** Shown instead of the children while an action runs; the button is disabled meanwhile. */
  busyLabel?: string;
  busy?: boolean;
}

export function Button({ variant = 'primary', busy = false, busyLabel, className = '', type = 'button', disabled, children, ...rest }: ButtonProps) {
  return (
    <button type={type} className={buttonClass(variant, className)} disabled={disabled || busy} aria-busy={busy || undefined} {...rest}>
      {busy && busyLabel ? busyLabel : children}
    </button>
  );
}

interface LinkButtonProps extends ComponentProps<typeof Link> {
  variant?: ButtonVariant;
}

export function LinkButton({ variant = 'secondary', className = '', ...rest }: LinkButtonProps) {
  return <Link className={buttonClass(variant, className)} {...rest} />;
}

interface FormActionsProps {
  submitLabel: string;
  /** Shown on the submit button while the form is being saved. */
  busyLabel?: string;
  busy: boolean;
  /** Omit for a form with no way back. */
  onCancel?: () => void;
  className?: string;
}

/** The submit (and cancel) row at the end of a form. */
export function FormActions({ submitLabel, busyLabel = 'Saving…', busy, onCancel, className = '' }: FormActionsProps) {
  return (
    <div className={`flex flex-wrap gap-2 ${className}`}>
      <Button type="submit" busy={busy} busyLabel={busyLabel}>
        {submitLabel}
      </Button>
      {onCancel && (
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      )}
    </div>
  );
}
