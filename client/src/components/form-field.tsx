import { type ComponentProps, type ReactNode, useId } from 'react';

/** Look of every text-like control: 44 px tall, thick dark border, red-tinted and bordered when invalid. */
export const CONTROL_CLASS =
  'min-h-touch w-full rounded-md border-2 border-neutral-700 bg-white px-3 py-2 text-base text-neutral-950 ' +
  'aria-invalid:border-alarm-700 aria-invalid:bg-alarm-50 disabled:border-neutral-400 disabled:bg-neutral-100';

interface ShellProps {
  label: string;
  /** Validation or server message; shown under the control and announced with it. */
  error?: string;
  hint?: ReactNode;
  /** Unit written after the control, e.g. "kPa". */
  unit?: string;
  className?: string;
  children: (control: { id: string; describedBy: string | undefined; invalid: boolean }) => ReactNode;
}

/** Label, control, unit, hint and error, wired together for screen readers. */
export function FieldShell({ label, error, hint, unit, className = '', children }: ShellProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [errorId, hintId].filter(Boolean).join(' ') || undefined;
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="font-semibold text-neutral-950">
        {label}
      </label>
      <div className="flex items-center gap-2">
        {children({ id, describedBy, invalid: Boolean(error) })}
        {unit && <span className="shrink-0 font-mono text-neutral-800">{unit}</span>}
      </div>
      {error && (
        <p id={errorId} className="font-semibold text-alarm-900">
          <span aria-hidden="true">✖ </span>
          {error}
        </p>
      )}
      {hint && (
        <div id={hintId} className="text-sm text-neutral-700">
          {hint}
        </div>
      )}
    </div>
  );
}

type FieldProps<P> = Omit<ShellProps, 'children'> & P & { mono?: boolean };

function controlClass(mono: boolean | undefined) {
  return `${CONTROL_CLASS} ${mono ? 'font-mono' : ''}`;
}

export function TextField({ label, error, hint, unit, className, mono, ...input }: FieldProps<ComponentProps<'input'>>) {
  return (
    <FieldShell label={label} error={error} hint={hint} unit={unit} className={className}>
      {({ id, describedBy, invalid }) => (
        <input id={id} aria-describedby={describedBy} aria-invalid={invalid || undefined} className={controlClass(mono)} {...input} />
      )}
    </FieldShell>
  );
}

/** A decimal number; numerals in the monospace face so digits line up. */
export function NumberField(props: FieldProps<ComponentProps<'input'>>) {
  return <TextField type="number" step="any" inputMode="decimal" mono {...props} />;
}

export function SelectField({
  label,
  error,
  hint,
  unit,
  className,
  options,
  placeholder,
  ...select
}: FieldProps<ComponentProps<'select'>> & { options: readonly { value: string; label: string }[]; placeholder?: string }) {
  return (
    <FieldShell label={label} error={error} hint={hint} unit={unit} className={className}>
      {({ id, describedBy, invalid }) => (
        <select id={id} aria-describedby={describedBy} aria-invalid={invalid || undefined} className={CONTROL_CLASS} {...select}>
          {placeholder !== undefined && <option value="">{placeholder}</option>}
          {options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      )}
    </FieldShell>
  );
}

export function TextAreaField({ label, error, hint, unit, className, ...area }: FieldProps<ComponentProps<'textarea'>>) {
  return (
    <FieldShell label={label} error={error} hint={hint} unit={unit} className={className}>
      {({ id, describedBy, invalid }) => (
        <textarea id={id} aria-describedby={describedBy} aria-invalid={invalid || undefined} rows={3} className={CONTROL_CLASS} {...area} />
      )}
    </FieldShell>
  );
}
