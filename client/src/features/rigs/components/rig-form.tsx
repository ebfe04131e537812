import { zodResolver } from '@hookform/resolvers/zod';
import type { DeviceProfile } from '@shared/devices/schema';
import { type Instrument, type Rig, type RigInput, rigInput } from '@shared/schemas/instruments';
import { FormProvider, useFieldArray, useForm, useWatch } from 'react-hook-form';
import { Button, FormActions } from '../../../components/button';
import { FormError } from '../../../components/form-alert';
import { SelectField, TextAreaField, TextField } from '../../../components/form-field';
import { readableErrors, withServerErrors } from '../../../lib/form-errors';
import { emptyAsNull } from '../../../lib/form-values';
import { useSaveRig } from '../api/save-rig';
import { blankChannel, blankRig, MANUAL_PROFILE, type RigFormValues, rigDraft, rigFieldPaths } from '../utils/rig-draft';
import { ChannelFields } from './channel-fields';
import { InstrumentPicker } from './instrument-picker';

const MODE_OPTIONS = [
  { value: 'serial', label: 'Devices on serial ports' },
  { value: 'manual', label: 'Dial gauges read by eye and typed in' },
];
const MAX_CHANNELS = 12;

interface RigFormProps {
  /** The rig to change; omit to define a new one. */
  rig?: Rig;
  /** The instrument register, for the pickers. */
  instruments: Instrument[];
  profiles: readonly DeviceProfile[];
  onSaved: (rig: Rig) => void;
  onCancel?: () => void;
}

export function RigForm({ rig, instruments, profiles, onSaved, onCancel }: RigFormProps) {
  const save = useSaveRig(rig?.id);
  const form = useForm<RigFormValues, unknown, RigInput>({
    resolver: zodResolver(rigInput, readableErrors),
    defaultValues: rig ? rigDraft(rig) : blankRig(),
  });
  const {
    register,
    handleSubmit,
    setError,
    setValue,
    getValues,
    control,
    formState: { errors, isSubmitting },
  } = form;
  const { fields, append, remove } = useFieldArray({ control, name: 'channels' });
  const jackId = useWatch({ control, name: 'jackInstrumentId' });
  const channelsError = errors.channels?.message ?? errors.channels?.root?.message;

  const changeMode = (mode: string) => {
    // A manual channel has no device; a serial one must choose its profile again.
    getValues('channels').forEach((c, i) => {
      if (mode === 'manual') setValue(`channels.${i}.profileId`, MANUAL_PROFILE);
      else if (c.profileId === MANUAL_PROFILE) setValue(`channels.${i}.profileId`, '');
    });
  };

  const onSubmit = handleSubmit(withServerErrors(setError, rigFieldPaths(fields.length), async (input: RigInput) => onSaved(await save.mutateAsync(input))));

  return (
    <FormProvider {...form}>
      <form onSubmit={onSubmit} noValidate className="flex max-w-4xl flex-col gap-5">
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField label="Rig name" error={errors.name?.message} {...register('name')} />
          <SelectField
            label="Readings come from"
            options={MODE_OPTIONS}
            error={errors.mode?.message}
            {...register('mode', { onChange: (e) => changeMode(e.target.value) })}
          />
        </div>
        <InstrumentPicker
          label="Jack"
          hint="Its calibration turns oil pressure into force."
          instruments={instruments}
          kind="jack"
          chosenId={jackId}
          error={errors.jackInstrumentId?.message}
          {...register('jackInstrumentId', emptyAsNull)}
        />
        <section aria-labelledby="channels-title" className="flex flex-col gap-4">
          <h2 id="channels-title" className="text-xl font-bold">
            Channels
          </h2>
          {channelsError && (
            <p className="font-semibold text-alarm-900">
              <span aria-hidden="true">✖ </span>
              {channelsError}
            </p>
          )}
          {fields.map((field, i) => (
            <ChannelFields key={field.id} index={i} instruments={instruments} profiles={profiles} canRemove={fields.length > 1} onRemove={() => remove(i)} />
          ))}
          <div className="flex flex-wrap gap-2">
            <Button
              variant="secondary"
              disabled={fields.length >= MAX_CHANNELS}
              onClick={() => append(withMode(blankChannel('gauge', fields.length), getValues('mode')))}
            >
              Add gauge
            </Button>
            <Button
              variant="secondary"
              disabled={fields.length >= MAX_CHANNELS}
              onClick={() => append(withMode(blankChannel('pressure', fields.length), getValues('mode')))}
            >
              Add pressure channel
            </Button>
          </div>
        </section>
        <TextAreaField label="Notes" error={errors.notes?.message} {...register('notes')} />
        <FormError message={errors.root?.server?.message} />
        <FormActions submitLabel={rig ? 'Save rig' : 'Create rig'} busy={isSubmitting} onCancel={onCancel} className="border-t-2 border-neutral-300 pt-4" />
      </form>
    </FormProvider>
  );
}

function withMode(channel: RigFormValues['channels'][number], mode: RigFormValues['mode']) {
  return mode === 'manual' ? { ...channel, profileId: MANUAL_PROFILE } : channel;
}
