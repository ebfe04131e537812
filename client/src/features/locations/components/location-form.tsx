import { zodResolver } from '@hookform/resolvers/zod';
import { type LocationInput, locationInput, type TestLocation } from '@shared/schemas/projects';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Button, FormActions } from '../../../components/button';
import { FormError } from '../../../components/form-alert';
import { NumberField, TextAreaField, TextField } from '../../../components/form-field';
import { readableErrors, withServerErrors } from '../../../lib/form-errors';
import { emptyAsNull } from '../../../lib/form-values';
import { sitePlanUrl } from '../api/get-location';
import { useSaveLocation } from '../api/save-location';
import { SitePlanPin } from './site-plan-pin';

type LocationDraft = z.input<typeof locationInput>;
type NumberName = 'latitude' | 'longitude' | 'planX' | 'planY' | 'testDepthM' | 'waterTableDepthM' | 'pitWidthM';

const FIELDS = ['pitId', 'latitude', 'longitude', 'planX', 'planY', 'testDepthM', 'waterTableDepthM', 'pitWidthM', 'soilDescription', 'notes'] as const;

function initialValues(location: TestLocation | undefined): Partial<LocationDraft> {
  if (!location)
    return { pitId: '', latitude: null, longitude: null, planX: null, planY: null, waterTableDepthM: null, pitWidthM: null, soilDescription: '', notes: '' };
  const { pitId, latitude, longitude, planX, planY, testDepthM, waterTableDepthM, pitWidthM, soilDescription, notes } = location;
  return { pitId, latitude, longitude, planX, planY, testDepthM, waterTableDepthM, pitWidthM, soilDescription, notes };
}

interface LocationFormProps {
  /** Project of a new location. */
  projectId: number;
  /** The location to edit; omit to create one. */
  location?: TestLocation;
  onSaved: (location: TestLocation) => void;
  onCancel?: () => void;
}

export function LocationForm({ projectId, location, onSaved, onCancel }: LocationFormProps) {
  const save = useSaveLocation(location ? { locationId: location.id } : { projectId });
  const [positionProblem, setPositionProblem] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    setValue,
    watch,
    formState: { errors, isSubmitting },
  } = useForm<LocationDraft, unknown, LocationInput>({ resolver: zodResolver(locationInput, readableErrors), defaultValues: initialValues(location) });

  /** Error and registration of a number box; empty means "not recorded" unless the value is required. */
  const numberInput = (name: NumberName, required = false) => ({
    error: errors[name]?.message,
    ...register(name, required ? { valueAsNumber: true } : emptyAsNull),
  });

  const onSubmit = handleSubmit(withServerErrors(setError, FIELDS, async (input: LocationInput) => onSaved(await save.mutateAsync(input))));

  const setNumber = (field: NumberName, value: number) => setValue(field, value, { shouldDirty: true, shouldValidate: true });

  const fillFromDevice = () => {
    setPositionProblem(null);
    navigator.geolocation.getCurrentPosition(
      ({ coords }) => {
        setNumber('latitude', Number(coords.latitude.toFixed(6)));
        setNumber('longitude', Number(coords.longitude.toFixed(6)));
      },
      (failure) => setPositionProblem(`No position from this device: ${failure.message || 'permission refused or no fix'}.`),
      { enableHighAccuracy: true, timeout: 20_000 },
    );
  };

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-3xl flex-col gap-5">
      <FormError message={errors.root?.server?.message} />
      <TextField
        label="Pit id"
        mono
        autoComplete="off"
        hint="The pit's mark on site, e.g. TP-03."
        error={errors.pitId?.message}
        className="max-w-xs"
        {...register('pitId')}
      />

      <fieldset className="flex flex-col gap-3 rounded-md border-2 border-neutral-300 p-4">
        <legend className="px-1 text-lg font-bold">Depths and pit</legend>
        <div className="grid gap-4 sm:grid-cols-3">
          <NumberField label="Test depth" unit="m" hint="Below ground level." {...numberInput('testDepthM', true)} />
          <NumberField label="Water table depth" unit="m" hint="Leave empty if not found." {...numberInput('waterTableDepthM')} />
          <NumberField label="Pit width" unit="m" hint="Narrowest side at test level." {...numberInput('pitWidthM')} />
        </div>
      </fieldset>

      <fieldset className="flex flex-col gap-3 rounded-md border-2 border-neutral-300 p-4">
        <legend className="px-1 text-lg font-bold">Where the pit is</legend>
        <div className="grid gap-4 sm:grid-cols-2">
          <NumberField label="Latitude" unit="°" hint="Decimal degrees, north positive." {...numberInput('latitude')} />
          <NumberField label="Longitude" unit="°" hint="Decimal degrees, east positive." {...numberInput('longitude')} />
        </div>
        {'geolocation' in navigator && (
          <div>
            <Button variant="secondary" onClick={fillFromDevice}>
              Use this device's position
            </Button>
          </div>
        )}
        {positionProblem && <FormError message={positionProblem} />}
        {location?.sitePlanFile ? (
          <>
            <SitePlanPin
              imageUrl={sitePlanUrl(location)}
              x={watch('planX') ?? null}
              y={watch('planY') ?? null}
              onPick={(x, y) => {
                setNumber('planX', x);
                setNumber('planY', y);
              }}
            />
            <div className="grid gap-4 sm:grid-cols-2">
              <NumberField label="Pin across the plan" hint="0 = left edge, 1 = right edge." {...numberInput('planX')} />
              <NumberField label="Pin down the plan" hint="0 = top edge, 1 = bottom edge." {...numberInput('planY')} />
            </div>
          </>
        ) : (
          <p className="text-neutral-800">To pin the pit on a site plan, upload the plan image on this location's page first.</p>
        )}
      </fieldset>

      <TextAreaField label="Soil description" hint="As logged at test level." error={errors.soilDescription?.message} {...register('soilDescription')} />
      <TextAreaField label="Notes" error={errors.notes?.message} {...register('notes')} />
      <FormActions submitLabel={location ? 'Save changes' : 'Create location'} busy={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
