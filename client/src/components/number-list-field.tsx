import { type ReactNode, useState } from 'react';
import { CONTROL_CLASS, FieldShell } from './form-field';

/** "35, 70, 105" → [35, 70, 105]; a token that is not a number becomes NaN so the form cannot pass it. */
export function parseNumberList(text: string): { values: number[]; bad: string[] } {
  const tokens = text.split(/[\s,;]+/).filter(Boolean);
  const values = tokens.map(Number);
  return { values, bad: tokens.filter((_, i) => Number.isNaN(values[i])) };
}

const sameList = (a: readonly number[], b: readonly number[]) => a.length === b.length && a.every((v, i) => Object.is(v, b[i]));

interface NumberListFieldProps {
  label: string;
  unit?: string;
  hint?: ReactNode;
  error?: string;
  value: number[] | undefined;
  onChange: (values: number[]) => void;
  onBlur?: () => void;
  name?: string;
  disabled?: boolean;
}

/** A list of numbers typed in one box, separated by commas or spaces. */
export function NumberListField({ label, unit, hint, error, value = [], onChange, onBlur, name, disabled }: NumberListFieldProps) {
  const [text, setText] = useState(() => value.join(', '));
  const parsed = parseNumberList(text);
  // Follow changes made outside the box (a procedure's defaults, a reset) without fighting the typist.
  if (!sameList(parsed.values, value)) setText(value.join(', '));

  const problem = parsed.bad.length > 0 ? `not a number: ${parsed.bad.join(' ')}` : error;
  return (
    <FieldShell label={label} unit={unit} hint={hint ?? 'Separate values with commas or spaces.'} error={problem}>
      {({ id, describedBy, invalid }) => (
        <input
          id={id}
          name={name}
          value={text}
          disabled={disabled}
          onChange={(e) => {
            setText(e.target.value);
            onChange(parseNumberList(e.target.value).values);
          }}
          onBlur={onBlur}
          aria-describedby={describedBy}
          aria-invalid={invalid || undefined}
          autoComplete="off"
          className={`${CONTROL_CLASS} font-mono`}
        />
      )}
    </FieldShell>
  );
}
