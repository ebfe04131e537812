import { defaultsForPlate } from '@shared/procedures/plate-rules';
import { findProfile, type SourceTag } from '@shared/procedures/profiles';
import type { ReactNode } from 'react';
import { Controller, type FieldErrors, get, type Path, useFormContext, useWatch } from 'react-hook-form';
import { NumberField, SelectField, TextField } from '../../../components/form-field';
import { NumberListField } from '../../../components/number-list-field';
import { emptyAsNull } from '../../../lib/form-values';
import { type PlanFormValues, sourcesFor, type VariantGroup, variantStarter } from '../utils/plan-draft';
import { PLAN_FIELDS, type PlanFieldPath, planFieldUnit } from '../utils/plan-fields';

/*
 * Inputs bound to one plan setting by its dotted path: label, unit, error and the chosen
 * procedure's source for the default all come from the path.
 */

const TAG_WORDS: Record<SourceTag, string> = {
  standard: 'standard',
  secondary: 'standard, as given in secondary texts',
  'from memory': 'recalled, not looked up',
  'common practice': 'common practice',
};

/** The chosen procedure's sources for this setting, for the plate the plan has (a plate rule changes some). */
function useProcedureSources(path: string) {
  const [procedureId, sizeMm] = useWatch<PlanFormValues, ['procedureId', 'plate.sizeMm']>({ name: ['procedureId', 'plate.sizeMm'] });
  const profile = findProfile(procedureId ?? '');
  const sources = profile && Number.isFinite(Number(sizeMm)) ? defaultsForPlate(profile, Number(sizeMm)).sources : undefined;
  return sourcesFor(profile && sources ? { ...profile, sources } : profile, path);
}

/** Where the chosen procedure's default for this setting comes from. */
export function SourceNote({ path }: { path: string }) {
  const sources = useProcedureSources(path);
  if (sources.length === 0) return null;
  return (
    <ul className="mt-1 flex flex-col gap-1 text-sm text-neutral-800">
      {sources.map((s) => (
        <li key={s.text}>
          <span className="font-semibold">Default source ({TAG_WORDS[s.tag]}):</span> {s.text}
        </li>
      ))}
    </ul>
  );
}

/** An error message at a path; for a list, the first bad entry, numbered from 1. */
function messageAt(errors: FieldErrors<PlanFormValues>, path: string): string | undefined {
  type Found = { message?: unknown } | ({ message?: unknown } | undefined)[] | undefined;
  const error = get(errors, path) as Found;
  if (!error) return undefined;
  if (!Array.isArray(error)) return typeof error.message === 'string' ? error.message : undefined;
  const index = error.findIndex((e) => typeof e?.message === 'string');
  return index >= 0 ? `value ${index + 1}: ${error[index]?.message}` : undefined;
}

function useField(path: PlanFieldPath) {
  const { register, control, formState } = useFormContext<PlanFormValues>();
  return {
    register,
    control,
    label: PLAN_FIELDS[path].label,
    unit: planFieldUnit(path),
    error: messageAt(formState.errors, path),
    name: path as Path<PlanFormValues>,
  };
}

function hintWithSource(path: string, hint: ReactNode) {
  return (
    <>
      {hint}
      <SourceNote path={path} />
    </>
  );
}

export function PlanNumber({ path, hint, nullable = false }: { path: PlanFieldPath; hint?: ReactNode; nullable?: boolean }) {
  const { register, label, unit, error, name } = useField(path);
  return (
    <NumberField
      label={label}
      unit={unit}
      error={error}
      hint={hintWithSource(path, hint)}
      {...register(name, nullable ? emptyAsNull : { valueAsNumber: true })}
    />
  );
}

export function PlanText({ path, hint }: { path: PlanFieldPath; hint?: ReactNode }) {
  const { register, label, error, name } = useField(path);
  return <TextField label={label} error={error} hint={hint} {...register(name)} />;
}

export type Options = readonly { value: string; label: string }[];

export function PlanSelect({ path, options, hint, placeholder }: { path: PlanFieldPath; options: Options; hint?: ReactNode; placeholder?: string }) {
  const { register, label, error, name } = useField(path);
  return <SelectField label={label} options={options} placeholder={placeholder} error={error} hint={hintWithSource(path, hint)} {...register(name)} />;
}

export function PlanList({ path, hint }: { path: PlanFieldPath; hint?: ReactNode }) {
  const { control, label, unit, error, name } = useField(path);
  return (
    <Controller
      control={control}
      name={name}
      render={({ field }) => (
        <NumberListField
          label={label}
          unit={unit}
          error={error}
          hint={hintWithSource(path, hint ?? 'Separate values with commas or spaces.')}
          name={field.name}
          value={field.value as number[] | undefined}
          onChange={field.onChange}
          onBlur={field.onBlur}
          disabled={field.disabled}
        />
      )}
    />
  );
}

/**
 * A choice between kinds of a setting (e.g. how a hold is judged). Choosing replaces the whole
 * setting with starting values for that kind, so no field of the old kind lingers.
 */
export function PlanKindSelect({ path, options, onChoose }: { path: PlanFieldPath; options: Options; onChoose: (kind: string) => void }) {
  const { label, error } = useField(path);
  const value = useWatch<PlanFormValues>({ name: path as Path<PlanFormValues> });
  return <SelectField label={label} options={options} error={error} value={String(value ?? '')} onChange={(e) => onChoose(e.target.value)} />;
}

/** A titled group of settings with the procedure's sources for the group as a whole. */
export function PlanSection({ title, sourcePath, children }: { title: string; sourcePath?: string; children: ReactNode }) {
  return (
    <fieldset className="flex min-w-0 flex-col gap-4 rounded-md border-2 border-neutral-300 p-4">
      <legend className="px-1 text-lg font-bold">{title}</legend>
      {sourcePath && <SourceNote path={sourcePath} />}
      {children}
    </fieldset>
  );
}

/** Switches a setting to another kind, starting from the chosen procedure's values for that kind. */
export function useKindChooser(group: VariantGroup) {
  const { setValue, getValues, formState } = useFormContext<PlanFormValues>();
  return (kind: string) => {
    const starter = variantStarter(group, kind, findProfile(getValues('procedureId') ?? ''));
    if (starter) setValue(group, starter as PlanFormValues[typeof group], { shouldDirty: true, shouldValidate: formState.isSubmitted });
  };
}
