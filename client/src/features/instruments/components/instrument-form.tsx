import { zodResolver } from '@hookform/resolvers/zod';
import { INSTRUMENT_KINDS, type Instrument, type InstrumentInput, instrumentInput } from '@shared/schemas/instruments';
import { useForm, useWatch } from 'react-hook-form';
import type { z } from 'zod';
import { FormActions } from '../../../components/button';
import { KIND_LABELS } from '../../../components/calibration-status';
import { FormError } from '../../../components/form-alert';
import { NumberField, SelectField, TextAreaField, TextField } from '../../../components/form-field';
import { readableErrors, withServerErrors } from '../../../lib/form-errors';
import { emptyAsNull } from '../../../lib/form-values';
import { useSaveInstrument } from '../api/save-instrument';

const FIELDS = ['kind', 'makeModel', 'serialNumber', 'rangeMin', 'rangeMax', 'unit', 'resolution', 'travelMm', 'ratedPressureMpa', 'notes'] as const;
const KIND_OPTIONS = INSTRUMENT_KINDS.map((kind) => ({ value: kind, label: KIND_LABELS[kind] }));

type InstrumentFormValues = z.input<typeof instrumentInput>;

function initialValues(instrument: Instrument | undefined): Partial<InstrumentFormValues> {
  if (!instrument) return { makeModel: '', serialNumber: '', unit: '', rangeMin: null, rangeMax: null, resolution: null, travelMm: null, ratedPressureMpa: null, notes: '' };
  const { kind, makeModel, serialNumber, rangeMin, rangeMax, unit, resolution, travelMm, ratedPressureMpa, notes } = instrument;
  return { kind, makeModel, serialNumber, rangeMin, rangeMax, unit, resolution, travelMm, ratedPressureMpa, notes };
}

interface InstrumentFormProps {
  /** The instrument to change; omit to register a new one. */
  instrument?: Instrument;
  onSaved: (instrument: Instrument) => void;
  onCancel?: () => void;
}

export function InstrumentForm({ instrument, onSaved, onCancel }: InstrumentFormProps) {
  const save = useSaveInstrument(instrument?.id);
  const {
    register,
    handleSubmit,
    setError,
    control,
    formState: { errors, isSubmitting },
  } = useForm<InstrumentFormValues, unknown, InstrumentInput>({
    resolver: zodResolver(instrumentInput, readableErrors),
    defaultValues: initialValues(instrument),
  });
  const kind = useWatch({ control, name: 'kind' });
  const unit = useWatch({ control, name: 'unit' }) || undefined;

  const onSubmit = handleSubmit(withServerErrors(setError, FIELDS, async (input: InstrumentInput) => onSaved(await save.mutateAsync(input))));

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-2xl flex-col gap-4">
      <FormError message={errors.root?.server?.message} />
      <SelectField label="Kind" placeholder="Choose the kind…" options={KIND_OPTIONS} error={errors.kind?.message} {...register('kind')} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Make and model" error={errors.makeModel?.message} {...register('makeModel')} />
        <TextField label="Serial number" mono autoComplete="off" error={errors.serialNumber?.message} {...register('serialNumber')} />
      </div>
      <TextField
        label="Unit"
        mono
        className="max-w-48"
        hint="Unit of the range and resolution: mm for gauges, bar, MPa or kPa for pressure, kN for jacks and load cells."
        error={errors.unit?.message}
        {...register('unit')}
      />
      <div className="grid gap-4 sm:grid-cols-3">
        <NumberField label="Range from" unit={unit} error={errors.rangeMin?.message} {...register('rangeMin', emptyAsNull)} />
        <NumberField label="Range to" unit={unit} error={errors.rangeMax?.message} {...register('rangeMax', emptyAsNull)} />
        <NumberField label="Resolution" unit={unit} error={errors.resolution?.message} {...register('resolution', emptyAsNull)} />
      </div>
      {kind === 'gauge' && (
        <NumberField
          label="Stem travel"
          unit="mm"
          className="max-w-64"
          hint="How far the stem can move; runs warn before it runs out."
          error={errors.travelMm?.message}
          {...register('travelMm', emptyAsNull)}
        />
      )}
      {kind === 'jack' && (
        <NumberField
          label="Rated pressure"
          unit="MPa"
          className="max-w-64"
          hint="The highest oil pressure the jack is rated for (its plate or certificate); the console never prompts beyond it."
          error={errors.ratedPressureMpa?.message}
          {...register('ratedPressureMpa', emptyAsNull)}
        />
      )}
      <TextAreaField label="Notes" error={errors.notes?.message} {...register('notes')} />
      <FormActions submitLabel={instrument ? 'Save changes' : 'Register instrument'} busy={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
