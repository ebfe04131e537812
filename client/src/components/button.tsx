import type { ComponentProps } from 'react';
import { Link } from 'react-router-dom';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'quiet';

const BASE = 'inline-flex items-center justify-center gap-2 rounded-md py-2 font-semibold no-underline disabled:cursor-not-allowed disabled:opacity-60';

/** `glove`: at least 60 px tall, for the run console's main actions, pressed with work gloves on. */
export type ButtonSize = 'normal' | 'glove';

const SIZES: Record<ButtonSize, string> = {
  normal: 'min-h-touch min-w-touch px-4 text-base',
  glove: 'min-h-[3.75rem] min-w-[3.75rem] px-5 text-xl',
};

const VARIANTS: Record<ButtonVariant, string> = {
  primary: 'bg-neutral-900 text-white hover:bg-neutral-700',
  secondary: 'border-2 border-neutral-800 bg-white text-neutral-950 hover:bg-neutral-100',
  danger: 'border-2 border-alarm-700 bg-white text-alarm-900 hover:bg-alarm-50',
  quiet: 'text-neutral-950 hover:bg-neutral-100',
};

export function buttonClass(variant: ButtonVariant = 'primary', extra = '', size: ButtonSize = 'normal'): string {
  return `${BASE} ${SIZES[size]} ${VARIANTS[variant]} ${extra}`.trim();
}

interface ButtonProps extends ComponentProps<'button'> {
  variant?: ButtonVariant;
  size?: ButtonSize;
  /** Shown instead of the children while an action runs; the button is disabled meanwhile. */
  busyLabel?: string;
  busy?: boolean;
}

export function Button({
  variant = 'primary',
  size = 'normal',
  busy = false,
  busyLabel,
  className = '',
  type = 'button',
  disabled,
  children,
  ...rest
}: ButtonProps) {
  return (
    <button type={type} className={buttonClass(variant, className, size)} disabled={disabled || busy} aria-busy={busy || undefined} {...rest}>
      {busy && busyLabel ? busyLabel : children}
    </button>
  );
}

interface LinkButtonProps extends ComponentProps<typeof Link> {
  variant?: ButtonVariant;
  size?: ButtonSize;
}

export function LinkButton({ variant = 'secondary', size = 'normal', className = '', ...rest }: LinkButtonProps) {
  return <Link className={buttonClass(variant, className, size)} {...rest} />;
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
