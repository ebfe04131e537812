import { PLATE_SHAPES } from '@shared/domain/plate';
import { REACTION_KINDS } from '@shared/schemas/plans';
import { useFormContext, useWatch } from 'react-hook-form';
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
      <div className="grid gap-4 sm:grid-cols-2">
        <PlanNumber path="seatingPressureKpa" hint="Applied to bed the plate, then released before zeroing." />
        <PlanNumber path="apparatusWeightKn" hint="Column, spacers and jack body resting on the plate." />
      </div>
    </PlanSection>
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
