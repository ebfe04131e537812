import type { DeviceProfile } from '@shared/devices/schema';
import type { Instrument } from '@shared/schemas/instruments';
import { type FieldError, get, useFormContext, useWatch } from 'react-hook-form';
import { Button } from '../../../components/button';
import { NumberField, SelectField, TextField } from '../../../components/form-field';
import { emptyAsNull } from '../../../lib/form-values';
import { type ChannelRole, defaultGaugeSetup, KIND_FOR_ROLE, profilesForRole, type RigFormValues } from '../utils/rig-draft';
import { InstrumentPicker } from './instrument-picker';

const ROLE_OPTIONS = [
  { value: 'gauge', label: 'Displacement gauge' },
  { value: 'pressure', label: 'Jack oil pressure' },
  { value: 'load', label: 'Load cell' },
];
const DIRECTION_OPTIONS = [
  { value: '1', label: 'Reading rises as the plate settles' },
  { value: '-1', label: 'Reading falls as the plate settles' },
];

interface ChannelFieldsProps {
  index: number;
  instruments: Instrument[];
  profiles: readonly DeviceProfile[];
  canRemove: boolean;
  onRemove: () => void;
}

/** One channel of a rig: what it measures, with which instrument, on which port, and where a gauge sits. */
export function ChannelFields({ index, instruments, profiles, canRemove, onRemove }: ChannelFieldsProps) {
  const { register, control, setValue, getValues, formState } = useFormContext<RigFormValues>();
  const base = `channels.${index}` as const;
  const [role, instrumentId, label, mode] = useWatch({ control, name: [`${base}.role`, `${base}.instrumentId`, `${base}.label`, 'mode'] });
  const error = (field: string) => (get(formState.errors, `${base}.${field}`) as FieldError | undefined)?.message;
  const manual = mode === 'manual';

  const changeRole = (next: ChannelRole) => {
    // A gauge needs its position and travel; other roles must not carry one.
    setValue(`${base}.gauge`, next === 'gauge' ? (getValues(`${base}.gauge`) ?? defaultGaugeSetup()) : null);
    setValue(`${base}.instrumentId`, null);
    if (!manual) setValue(`${base}.profileId`, '');
  };

  // A gauge's stem travel is on the register; copy it so the run warns at the right point.
  const takeTravel = (id: number) => {
    const travel = instruments.find((i) => i.id === id)?.travelMm;
    if (role === 'gauge' && travel != null) setValue(`${base}.gauge.travelMm`, travel);
  };

  return (
    <fieldset className="flex min-w-0 flex-col gap-4 rounded-md border-2 border-neutral-300 p-4">
      <legend className="px-1 text-lg font-bold">
        Channel {index + 1}
        {label ? `: ${label}` : ''}
      </legend>
      <div className="grid gap-4 sm:grid-cols-[10rem_1fr_1fr]">
        <TextField label="Key" mono autoComplete="off" hint="e.g. g1, p1" error={error('key')} {...register(`${base}.key`)} />
        <SelectField
          label="Measures"
          options={ROLE_OPTIONS}
          error={error('role')}
          {...register(`${base}.role`, { onChange: (e) => changeRole(e.target.value as ChannelRole) })}
        />
        <TextField label="Label" hint="As the crew calls it, e.g. North gauge." error={error('label')} {...register(`${base}.label`)} />
      </div>
      <InstrumentPicker
        label="Instrument"
        instruments={instruments}
        kind={KIND_FOR_ROLE[role]}
        chosenId={instrumentId}
        error={error('instrumentId')}
        {...register(`${base}.instrumentId`, { ...emptyAsNull, onChange: (e) => takeTravel(Number(e.target.value)) })}
      />
      {!manual && (
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField
            label="Device profile"
            placeholder="Choose how it talks…"
            options={profilesForRole(profiles, role).map((p) => ({ value: p.id, label: p.name }))}
            error={error('profileId')}
            {...register(`${base}.profileId`)}
          />
          <TextField label="Serial port" mono autoComplete="off" placeholder="/dev/ttyUSB0" error={error('port')} {...register(`${base}.port`)} />
        </div>
      )}
      {role === 'gauge' && (
        <fieldset className="flex flex-col gap-3">
          <legend className="font-semibold">Gauge on the plate</legend>
          {error('gauge') && (
            <p className="font-semibold text-alarm-900">
              <span aria-hidden="true">✖ </span>
              {error('gauge')}
            </p>
          )}
          <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
            <NumberField
              label="Position x"
              unit="mm"
              hint="From the plate centre."
              error={error('gauge.xMm')}
              {...register(`${base}.gauge.xMm`, emptyAsNull)}
            />
            <NumberField label="Position y" unit="mm" error={error('gauge.yMm')} {...register(`${base}.gauge.yMm`, emptyAsNull)} />
            <SelectField
              label="Direction"
              options={DIRECTION_OPTIONS}
              error={error('gauge.direction')}
              {...register(`${base}.gauge.direction`, { setValueAs: (v) => Number(v) })}
            />
            <NumberField label="Stem travel" unit="mm" error={error('gauge.travelMm')} {...register(`${base}.gauge.travelMm`, emptyAsNull)} />
          </div>
        </fieldset>
      )}
      {canRemove && (
        <Button variant="danger" className="self-start" onClick={onRemove}>
          Remove channel {index + 1}
        </Button>
      )}
    </fieldset>
  );
}
