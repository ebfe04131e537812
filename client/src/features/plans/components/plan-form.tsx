import { zodResolver } from '@hookform/resolvers/zod';
import { findProfile } from '@shared/procedures/profiles';
import { type PlanInput, planInput, type TestPlan } from '@shared/schemas/plans';
import { useMemo, useState } from 'react';
import { FormProvider, useForm, useWatch } from 'react-hook-form';
import { FormActions } from '../../../components/button';
import { FormError, FormNotice } from '../../../components/form-alert';
import { TextAreaField } from '../../../components/form-field';
import { readableErrors, withServerErrors } from '../../../lib/form-errors';
import type { CheckedPlan } from '../api/get-plan';
import { useSavePlan } from '../api/save-plan';
import { applyProfileDefaults, assessDraft, blankPlanDraft, draftFromPlan, type LocationFacts, type PlanFormValues } from '../utils/plan-draft';
import { PLAN_FIELD_PATHS } from '../utils/plan-fields';
import { PlanChecksPanel } from './plan-checks-panel';
import { HoldRuleFields, ReadingScheduleFields, TerminationFields } from './plan-hold-fields';
import { PlanText } from './plan-inputs';
import { LoadingFields, UnloadReloadFields } from './plan-loading-fields';
import { FootingFields, PlateFields, ReactionFields } from './plan-setup-fields';
import { ProcedurePicker } from './procedure-picker';
import { StagePreview } from './stage-preview';

interface PlanFormProps {
  /** The test location: new plans are created there, and its pit width and water table are checked. */
  location: LocationFacts & { id: number };
  /** The plan to edit; omit to write a new one. */
  plan?: TestPlan;
  /** Shows the plan and its checks without letting anything change (operators). */
  readOnly?: boolean;
  onSaved?: (saved: CheckedPlan) => void;
  onCancel?: () => void;
}

/**
 * The test plan editor. The shared self-check and the stage sequence are recomputed on every edit,
 * so the engineer sees a warning the moment a value breaks a procedure rule.
 */
export function PlanForm({ location, plan, readOnly = false, onSaved, onCancel }: PlanFormProps) {
  const save = useSavePlan(plan ? { planId: plan.id } : { locationId: location.id });
  const [saved, setSaved] = useState(false);
  const form = useForm<PlanFormValues, unknown, PlanInput>({
    resolver: zodResolver(planInput, readableErrors),
    defaultValues: plan ? draftFromPlan(plan) : blankPlanDraft(),
  });
  const {
    control,
    register,
    handleSubmit,
    setError,
    setValue,
    getValues,
    reset,
    formState: { errors, isSubmitting },
  } = form;

  const values = useWatch({ control });
  const assessment = useMemo(() => assessDraft(values, location), [values, location]);
  const procedureId = values.procedureId ?? '';

  const chooseProcedure = (id: string) => {
    const profile = findProfile(id);
    if (profile) reset(applyProfileDefaults(getValues(), profile), { keepDefaultValues: true });
    else setValue('procedureId', id, { shouldDirty: true });
  };

  const onSubmit = handleSubmit(
    withServerErrors(setError, PLAN_FIELD_PATHS, async (input: PlanInput) => {
      setSaved(false);
      const result = await save.mutateAsync(input);
      reset(draftFromPlan(result.plan));
      setSaved(true);
      onSaved?.(result);
    }),
  );

  return (
    <FormProvider {...form}>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
        <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_24rem]">
          <fieldset disabled={readOnly} className="flex min-w-0 flex-col gap-5">
            <PlanText path="name" />
            <ProcedurePicker value={procedureId} error={errors.procedureId?.message} onChoose={chooseProcedure} />
            {procedureId ? (
              <>
                <PlateFields />
                <LoadingFields />
                <UnloadReloadFields />
                <HoldRuleFields />
                <ReadingScheduleFields />
                <TerminationFields />
                <ReactionFields />
                <FootingFields />
                <TextAreaField label="Notes" error={errors.notes?.message} {...register('notes')} />
              </>
            ) : (
              <p className="text-lg text-neutral-800">Choose a procedure to fill in its defaults.</p>
            )}
          </fieldset>
          <aside className="flex flex-col gap-6 lg:sticky lg:top-4 lg:self-start">
            <PlanChecksPanel assessment={assessment} />
            {assessment.complete && <StagePreview stages={assessment.stages} plate={assessment.plan.plate} />}
          </aside>
        </div>
        {/* Next to the save button, where the eye is after pressing it at the end of a long form. */}
        <FormError message={errors.root?.server?.message} />
        {saved && <FormNotice>Plan saved.</FormNotice>}
        {!readOnly && (
          <FormActions
            submitLabel={plan ? 'Save plan' : 'Create plan'}
            busy={isSubmitting}
            onCancel={onCancel}
            className="border-t-2 border-neutral-300 pt-4"
          />
        )}
      </form>
    </FormProvider>
  );
}
