import { PLATE_SHAPES } from '@shared/domain/plate';
import { defaultsForPlate, plateRuleOf, plateRuleRow } from '@shared/procedures/plate-rules';
import { findProfile } from '@shared/procedures/profiles';
import { REACTION_KINDS } from '@shared/schemas/plans';
import { useFormContext, useWatch } from 'react-hook-form';
import { Button } from '../../../components/button';
import type { PlanFormValues } from '../utils/plan-draft';
import { type Options, PlanNumber, PlanSection, PlanSelect, PlanText } from './plan-inputs';

const PLATE_SHAPE_LABELS: Record<(typeof PLATE_SHAPES)[number], string> = { circular: 'Circular (size = diameter)', square: 'Square (size = side)' };
const PLATE_SHAPE_OPTIONS: Options = PLATE_SHAPES.map((value) => ({ value, label: PLATE_SHAPE_LABELS[value] }));

const REACTION_LABELS: Record<(typeof REACTION_KINDS)[number], string> = {
  kentledge: 'Kentledge',
  anchors: 'Ground anchors',
  vehicle: 'Loaded vehicle',
  frame: 'Reaction frame',
  other: 'Other',
};
const REACTION_OPTIONS: Options = REACTION_KINDS.map((value) => ({ value, label: REACTION_LABELS[value] }));

const FOOTING_SHAPE_OPTIONS: Options = [
  { value: 'square', label: 'Square' },
  { value: 'circular', label: 'Circular' },
  { value: 'strip', label: 'Strip' },
  { value: 'rectangular', label: 'Rectangular' },
];
const SOIL_BEHAVIOUR_OPTIONS: Options = [
  { value: 'cohesionless', label: 'Cohesionless (sand, gravel)' },
  { value: 'cohesive', label: 'Cohesive (clay, silt)' },
];

/** A footing still to be described: its width and soil behaviour are left for the engineer to enter. */
const NEW_FOOTING = { shape: 'square', widthM: Number.NaN, lengthM: null, soilBehaviour: '' } as unknown as NonNullable<PlanFormValues['footing']>;

export function PlateFields() {
  return (
    <PlanSection title="Plate and seating">
      <div className="grid gap-4 sm:grid-cols-3">
        <PlanSelect path="plate.shape" options={PLATE_SHAPE_OPTIONS} />
        <PlanNumber path="plate.sizeMm" />
        <PlanNumber path="plate.thicknessMm" />
      </div>
      <PlateRuleOffer />
      <div className="grid gap-4 sm:grid-cols-3">
        <PlanNumber path="seatingPressureKpa" hint="Applied to bed the plate, then released before zeroing." />
        <PlanNumber path="seatingHoldMin" hint="How long the seating pressure is held before the gauges are zeroed." />
        <PlanNumber path="apparatusWeightKn" hint="Column, spacers and jack body resting on the plate." />
      </div>
    </PlanSection>
  );
}

/**
 * When the procedure ties the maximum pressure and stop limit to the plate and the plan holds another
 * plate's values, offers this plate's (one click, never behind the engineer's back), with the source.
 */
function PlateRuleOffer() {
  const { setValue, getValues } = useFormContext<PlanFormValues>();
  const [procedureId, sizeMm, loading, maxSettlementMm] = useWatch<PlanFormValues, ['procedureId', 'plate.sizeMm', 'loading', 'termination.maxSettlementMm']>({
    name: ['procedureId', 'plate.sizeMm', 'loading', 'termination.maxSettlementMm'],
  });
  const profile = findProfile(procedureId ?? '');
  const rule = plateRuleOf(profile);
  const row = rule && plateRuleRow(rule, Number(sizeMm));
  if (!profile || !rule || !row) return null;
  const { defaults } = defaultsForPlate(profile, row.sizeMm);
  const same = JSON.stringify(loading) === JSON.stringify(defaults.loading) && Number(maxSettlementMm) === defaults.termination.maxSettlementMm;
  if (same) return null;
  const apply = () => {
    const options = { shouldDirty: true, shouldValidate: true };
    setValue('loading', defaults.loading, options);
    setValue('unloadReload', { ...getValues('unloadReload'), unloadKpa: defaults.unloadReload.unloadKpa }, options);
    setValue('termination.maxSettlementMm', defaults.termination.maxSettlementMm, options);
  };
  return (
    <div role="note" className="flex flex-col gap-2 rounded-md border-2 border-caution-700 bg-caution-50 p-3">
      <p>
        A {row.sizeMm} mm plate is loaded to {row.maxPressureKpa} kPa and stopped at {row.maxSettlementMm} mm ({rule.text}; {rule.tag}).
      </p>
      <div>
        <Button variant="secondary" onClick={apply}>
          Use the {row.sizeMm} mm plate's stages and stop limit
        </Button>
      </div>
    </div>
  );
}

export function ReactionFields() {
  return (
    <PlanSection title="Reaction">
      <div className="grid gap-4 sm:grid-cols-2">
        <PlanSelect path="reaction.kind" options={REACTION_OPTIONS} />
        <PlanNumber path="reaction.capacityKn" hint="The most the reaction can safely hold down." />
      </div>
      <PlanText path="reaction.description" />
    </PlanSection>
  );
}

/** The real footing the results are scaled to; optional. */
export function FootingFields() {
  const { setValue } = useFormContext<PlanFormValues>();
  const footing = useWatch<PlanFormValues, 'footing'>({ name: 'footing' });
  const toggle = (on: boolean) => setValue('footing', on ? NEW_FOOTING : null, { shouldDirty: true });
  return (
    <PlanSection title="Footing to scale to">
      <label className="flex min-h-touch items-center gap-3 font-semibold">
        <input type="checkbox" className="size-6 accent-neutral-900" checked={footing != null} onChange={(e) => toggle(e.target.checked)} />
        Scale the results to a real footing
      </label>
      {footing != null && (
        <div className="grid gap-4 sm:grid-cols-2">
          <PlanSelect path="footing.shape" options={FOOTING_SHAPE_OPTIONS} />
          <PlanSelect path="footing.soilBehaviour" options={SOIL_BEHAVIOUR_OPTIONS} placeholder="Choose…" />
          <PlanNumber path="footing.widthM" />
          {footing.shape === 'rectangular' && <PlanNumber path="footing.lengthM" nullable />}
        </div>
      )}
    </PlanSection>
  );
}
