import { zodResolver } from '@hookform/resolvers/zod';
import { CALIBRATION_UNITS } from '@shared/calibration/schema';
import { type CalibrationRecord, type CalibrationRecordInput, calibrationRecordInput, type InstrumentKind } from '@shared/schemas/instruments';
import { FormProvider, type Resolver, useForm, useWatch } from 'react-hook-form';
import { FormActions } from '../../../components/button';
import { FormError } from '../../../components/form-alert';
import { NumberField, SelectField, TextAreaField, TextField } from '../../../components/form-field';
import { readableErrors, withServerErrors } from '../../../lib/form-errors';
import { emptyAsNull } from '../../../lib/form-values';
import { useRecordCalibration } from '../api/save-calibration';
import { blankCalibrationDraft, type CalibrationDraft, toCalibrationInput } from '../utils/calibration-draft';
import { CurveFields } from './curve-fields';

const FIELDS = ['calibratedOn', 'dueOn', 'notes', 'method.inputUnit', 'method.outputUnit', 'method.range', 'method.curve', 'method.fallingCurve'] as const;
const UNIT_OPTIONS = CALIBRATION_UNITS.map((u) => ({ value: u, label: u }));

const schemaResolver = zodResolver(calibrationRecordInput, readableErrors);

/** The shared record schema, judged on the form's draft turned into the record it would send. */
const draftResolver: Resolver<CalibrationDraft, unknown, CalibrationRecordInput> = (values, context, options) =>
  schemaResolver(toCalibrationInput(values) as never, context, options as never) as never;

interface CalibrationFormProps {
  instrumentId: number;
  /** Sets the starting units, and offers a falling branch for jacks. */
  instrumentKind: InstrumentKind;
  onSaved: (calibration: CalibrationRecord) => void;
  onCancel?: () => void;
}

/** Records a calibration: dates, units and the certificate's curve (line, polynomial or table). */
export function CalibrationForm({ instrumentId, instrumentKind, onSaved, onCancel }: CalibrationFormProps) {
  const save = useRecordCalibration(instrumentId);
  const form = useForm<CalibrationDraft, unknown, CalibrationRecordInput>({
    resolver: draftResolver,
    defaultValues: blankCalibrationDraft(instrumentKind),
  });
  const {
    register,
    handleSubmit,
    setError,
    control,
    formState: { errors, isSubmitting },
  } = form;
  const [inputUnit, outputUnit, hasFalling] = useWatch({ control, name: ['method.inputUnit', 'method.outputUnit', 'hasFalling'] });
  // An issue about the span as a whole lands on `root`: its two boxes are registered as an array.
  type Said = { message?: string } | undefined;
  const range = errors.method?.range as { message?: string; root?: Said; 0?: Said; 1?: Said } | undefined;
  const rangeError = range?.message ?? range?.root?.message ?? range?.[0]?.message ?? range?.[1]?.message;

  const onSubmit = handleSubmit(withServerErrors(setError, FIELDS, async (input: CalibrationRecordInput) => onSaved(await save.mutateAsync(input))));

  return (
    <FormProvider {...form}>
      <form onSubmit={onSubmit} noValidate className="flex max-w-3xl flex-col gap-4">
        <FormError message={errors.root?.server?.message} />
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField label="Calibrated on" type="date" mono error={errors.calibratedOn?.message} {...register('calibratedOn')} />
          <TextField label="Due on" type="date" mono error={errors.dueOn?.message} {...register('dueOn')} />
        </div>
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField
            label="Reading unit (x)"
            options={UNIT_OPTIONS}
            placeholder="Choose…"
            error={errors.method?.inputUnit?.message}
            {...register('method.inputUnit')}
          />
          <SelectField
            label="Engineering unit (y)"
            options={UNIT_OPTIONS}
            placeholder="Choose…"
            error={errors.method?.outputUnit?.message}
            {...register('method.outputUnit')}
          />
        </div>
        <CurveFields name="method.curve" legend={hasFalling ? 'Rising (loading) curve' : 'Curve'} inputUnit={inputUnit} outputUnit={outputUnit} />
        {instrumentKind === 'jack' && (
          <label className="flex min-h-touch items-center gap-3 font-semibold">
            <input type="checkbox" className="size-6" {...register('hasFalling')} />
            Unloading reads differently (seal friction): give a falling curve too
          </label>
        )}
        {hasFalling && <CurveFields name="method.fallingCurve" legend="Falling (unloading) curve" inputUnit={inputUnit} outputUnit={outputUnit} />}
        <fieldset className="flex flex-col gap-2">
          <legend className="font-semibold">Certified reading span (a table's points serve when left empty)</legend>
          <p className="text-sm">Nothing is worked out beyond it: a reading outside raises an alarm, and no prompt asks for more.</p>
          <div className="grid gap-4 sm:grid-cols-2">
            <NumberField label="Span from" unit={inputUnit} {...register('method.range.0', emptyAsNull)} />
            <NumberField label="Span to" unit={inputUnit} error={rangeError} {...register('method.range.1', emptyAsNull)} />
          </div>
        </fieldset>
        <TextAreaField label="Notes" hint="Laboratory, certificate number, conditions." error={errors.notes?.message} {...register('notes')} />
        <FormActions submitLabel="Record calibration" busy={isSubmitting} onCancel={onCancel} />
      </form>
    </FormProvider>
  );
}
