import { Controller, type FieldError, get, useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import { Button } from '../../../components/button';
import { CONTROL_CLASS, NumberField, SelectField } from '../../../components/form-field';
import { NumberListField } from '../../../components/number-list-field';
import { emptyAsNull } from '../../../lib/form-values';
import type { CalibrationDraft, CurveKind } from '../utils/calibration-draft';

const KIND_OPTIONS: { value: CurveKind; label: string }[] = [
  { value: 'linear', label: 'Straight line: y = c0 + c1·x' },
  { value: 'polynomial', label: 'Polynomial: y = a0 + a1·x + a2·x² …' },
  { value: 'table', label: 'Table of points (straight between them)' },
];

type CurveName = 'method.curve' | 'method.fallingCurve';

interface CurveFieldsProps {
  name: CurveName;
  legend: string;
  inputUnit: string;
  outputUnit: string;
}

/** The message of an error at a path, whether RHF put it on the node itself or on a list's `root`. */
function messageAt(errors: unknown, path: string): string | undefined {
  const error = get(errors, path) as (FieldError & { root?: FieldError }) | undefined;
  return error?.message ?? error?.root?.message;
}

/** One calibration curve: its kind and that kind's numbers. */
export function CurveFields({ name, legend, inputUnit, outputUnit }: CurveFieldsProps) {
  const { register, control, formState } = useFormContext<CalibrationDraft>();
  const kind = useWatch({ control, name: `${name}.kind` });
  const errorAt = (field: string) => messageAt(formState.errors, `${name}.${field}`);
  return (
    <fieldset className="flex min-w-0 flex-col gap-4 rounded-md border-2 border-neutral-300 p-4">
      <legend className="px-1 text-lg font-bold">{legend}</legend>
      <SelectField label="Curve" options={KIND_OPTIONS} error={errorAt('kind')} {...register(`${name}.kind`)} />
      {kind === 'linear' && (
        <div className="grid gap-4 sm:grid-cols-2">
          <NumberField label="Offset c0" unit={outputUnit} error={errorAt('c0')} {...register(`${name}.c0`, emptyAsNull)} />
          <NumberField label="Slope c1" unit={`${outputUnit}/${inputUnit}`} error={errorAt('c1')} {...register(`${name}.c1`, emptyAsNull)} />
        </div>
      )}
      {kind === 'polynomial' && (
        <Controller
          control={control}
          name={`${name}.coefficients`}
          render={({ field }) => (
            <NumberListField
              label="Coefficients a0, a1, a2 …"
              hint="From the constant term up, as on the certificate. Separate values with commas or spaces."
              value={field.value}
              onChange={field.onChange}
              onBlur={field.onBlur}
              name={field.name}
              error={errorAt('coefficients')}
            />
          )}
        />
      )}
      {kind === 'table' && <PointsTable name={name} inputUnit={inputUnit} outputUnit={outputUnit} />}
    </fieldset>
  );
}

/** Table editor: one row per certificate point, errors named by point number. */
function PointsTable({ name, inputUnit, outputUnit }: Omit<CurveFieldsProps, 'legend'>) {
  const { register, control, formState } = useFormContext<CalibrationDraft>();
  const { fields, append, remove } = useFieldArray({ control, name: `${name}.points` });
  const listError = messageAt(formState.errors, `${name}.points`);
  const problems = fields.flatMap((_, i) =>
    (['x', 'y'] as const).flatMap((axis) => {
      const message = messageAt(formState.errors, `${name}.points.${i}.${axis}`);
      return message ? [{ key: `${i}-${axis}`, text: `Point ${i + 1}, ${axis}: ${message}` }] : [];
    }),
  );
  const cell = (i: number, axis: 'x' | 'y', label: string) => (
    <input
      type="number"
      step="any"
      inputMode="decimal"
      aria-label={`Point ${i + 1} ${label}`}
      aria-invalid={Boolean(messageAt(formState.errors, `${name}.points.${i}.${axis}`)) || undefined}
      className={`${CONTROL_CLASS} font-mono`}
      {...register(`${name}.points.${i}.${axis}`, emptyAsNull)}
    />
  );
  return (
    <div className="flex flex-col gap-2">
      <table className="w-full max-w-xl border-collapse text-left">
        <caption className="mb-1 text-left font-semibold">Calibration points, in rising reading</caption>
        <thead>
          <tr>
            <th scope="col" className="w-12 px-1 font-semibold">
              #
            </th>
            <th scope="col" className="px-1 font-semibold">
              Reading x <span className="font-mono font-normal">({inputUnit})</span>
            </th>
            <th scope="col" className="px-1 font-semibold">
              True value y <span className="font-mono font-normal">({outputUnit})</span>
            </th>
            <th scope="col" className="sr-only">
              Remove
            </th>
          </tr>
        </thead>
        <tbody>
          {fields.map((field, i) => (
            <tr key={field.id}>
              <th scope="row" className="px-1 font-mono font-normal">
                {i + 1}
              </th>
              <td className="p-1">{cell(i, 'x', 'reading')}</td>
              <td className="p-1">{cell(i, 'y', 'true value')}</td>
              <td className="p-1">
                <Button variant="quiet" aria-label={`Remove point ${i + 1}`} disabled={fields.length <= 2} onClick={() => remove(i)}>
                  ✕
                </Button>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {(listError || problems.length > 0) && (
        <ul className="flex flex-col gap-1 font-semibold text-alarm-900">
          {listError && (
            <li>
              <span aria-hidden="true">✖ </span>
              {listError}
            </li>
          )}
          {problems.map((p) => (
            <li key={p.key}>
              <span aria-hidden="true">✖ </span>
              {p.text}
            </li>
          ))}
        </ul>
      )}
      <Button variant="secondary" className="self-start" disabled={fields.length >= 200} onClick={() => append({ x: null, y: null })}>
        Add point
      </Button>
    </div>
  );
}
