import { checkPlan } from '@shared/plans/checks';
import { buildStageSequence, type PlannedStage } from '@shared/plans/stages';
import { findProfile, PROCEDURE_PROFILES, type ProcedureProfile, type SettingSource } from '@shared/procedures/profiles';
import { type PlanCheck, type PlanDraft, type PlanInput, planInput, type TestPlan } from '@shared/schemas/plans';
import type { LocationInput } from '@shared/schemas/projects';
import type { DefaultValues } from 'react-hook-form';
import { z } from 'zod';
import { planFieldLabel } from './plan-fields';

/** What the form edits: the plan input before zod has filled defaults and checked it. */
export type PlanFormValues = PlanDraft;

/** The location facts the plan self-check needs. */
export type LocationFacts = Pick<LocationInput, 'pitWidthM' | 'waterTableDepthM' | 'testDepthM'>;

/** A new plan before a procedure is chosen: only what no procedure decides. */
export function blankPlanDraft(): DefaultValues<PlanFormValues> {
  return { name: '', procedureId: '', apparatusWeightKn: 0, reaction: { kind: 'kentledge', description: '' }, footing: null, notes: '' };
}

/** A saved plan as form values. */
export function draftFromPlan(plan: TestPlan): PlanFormValues {
  const { id: _id, locationId: _locationId, createdAt: _createdAt, updatedAt: _updatedAt, ...input } = plan;
  return input;
}

/**
 * The draft with every setting the procedure decides replaced by the procedure's defaults; the name,
 * reaction, footing and notes stay as they were.
 */
export function applyProfileDefaults(current: DefaultValues<PlanFormValues>, profile: ProcedureProfile): PlanFormValues {
  return { ...(current as PlanFormValues), procedureId: profile.id, ...structuredClone(profile.defaults) };
}

export type VariantGroup = 'loading' | 'holdRule' | 'readingSchedule';
type Variant<G extends VariantGroup> = ProcedureProfile['defaults'][G];

function variantKind(value: Variant<VariantGroup>): string {
  return 'mode' in value ? value.mode : value.kind;
}

/**
 * Starting values when the user switches a setting to another kind (e.g. the hold rule from a rate
 * to a fixed duration): the chosen procedure's own values if it uses that kind, otherwise those of
 * the first procedure that does. No number here is made up.
 */
export function variantStarter<G extends VariantGroup>(group: G, kind: string, preferred?: ProcedureProfile): Variant<G> | undefined {
  const candidates = preferred ? [preferred, ...PROCEDURE_PROFILES] : PROCEDURE_PROFILES;
  const found = candidates.find((p) => variantKind(p.defaults[group]) === kind);
  return found && structuredClone(found.defaults[group]);
}

/** Sources the procedure gives for exactly this setting path. */
export function sourcesFor(profile: ProcedureProfile | undefined, path: string): SettingSource[] {
  return profile?.sources.filter((s) => s.setting === path) ?? [];
}

/** The name plays no part in any check, so an unnamed draft is checked as well. */
const checkableDraft = planInput.extend({ name: z.string() });

export type DraftAssessment =
  | { complete: true; plan: PlanInput; profile: ProcedureProfile | undefined; checks: PlanCheck[]; stages: PlannedStage[] }
  | { complete: false /** Labels of the settings that are missing or invalid. */; waitingFor: string[] };

/** Runs the shared plan self-check and stage builder on the form's current values, if they are complete. */
export function assessDraft(values: unknown, location?: LocationFacts): DraftAssessment {
  const parsed = checkableDraft.safeParse(values);
  if (!parsed.success) {
    return { complete: false, waitingFor: [...new Set(parsed.error.issues.map((issue) => planFieldLabel(issue.path.join('.'))))] };
  }
  const plan = parsed.data;
  const profile = findProfile(plan.procedureId);
  return { complete: true, plan, profile, checks: checkPlan(plan, profile, location), stages: buildStageSequence(plan) };
}
