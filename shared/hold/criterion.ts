import { findProfile, PROCEDURE_PROFILES, type ProcedureProfile, type SettingSource } from '../procedures/profiles';
import type { HoldRule } from '../schemas/plans';
import type { HoldCriterion } from './verdict';

/** The rule in words. */
export function describeHoldRule(rule: HoldRule): string {
  switch (rule.kind) {
    case 'rate':
      return `Settlement rate below ${rule.maxRateMmPerMin} mm/min (least-squares slope over ${rule.windowMin} min), held at least ${rule.minHoldMin} min`;
    case 'consecutive':
      return `Settlement change of at most ${rule.maxChangeMm} mm in each of ${rule.intervals} consecutive ${rule.intervalMin}-min intervals`;
    case 'fixed':
      return `Hold for ${rule.durationMin} min`;
    case 'percentOfUltimate':
      return `${rule.percent} % of the stage's probable ultimate settlement (hyperbolic time fit), held at least ${rule.minHoldMin} min; satisfied in any case after ${rule.maxHoldMin} min`;
  }
}

const holdRuleSources = (profile: ProcedureProfile): SettingSource[] =>
  profile.sources.filter((s) => s.setting === 'holdRule' || s.setting.startsWith('holdRule.'));

/** The plan's own profile when it documents this kind of rule, else the first profile that does. */
function referenceProfile(rule: HoldRule, procedureId: string | undefined): ProcedureProfile | undefined {
  const documents = (p: ProcedureProfile) => p.defaults.holdRule.kind === rule.kind && holdRuleSources(p).length > 0;
  const own = procedureId === undefined ? undefined : findProfile(procedureId);
  return own && documents(own) ? own : PROCEDURE_PROFILES.find(documents);
}

const sameValues = (a: HoldRule, b: HoldRule) =>
  Object.keys(a).length === Object.keys(b).length && Object.entries(a).every(([k, v]) => (b as Record<string, unknown>)[k] === v);

/**
 * The criterion shown beside a verdict: the rule in words, then where its default values come from, in the
 * source wording of the procedure profiles, and whether the plan kept those defaults.
 */
export function holdCriterion(rule: HoldRule, procedureId?: string): HoldCriterion {
  const profile = referenceProfile(rule, procedureId);
  const sources = profile ? holdRuleSources(profile) : [];
  const matchesDefault = profile !== undefined && sameValues(rule, profile.defaults.holdRule);
  const origin = sources.length === 0 ? 'No published default for this rule' : `Default from ${sources.map((s) => `${s.text} [${s.tag}]`).join('; ')}`;
  const own = matchesDefault || sources.length === 0 ? '' : ' This plan sets its own values.';
  return { text: `${describeHoldRule(rule)}. ${origin}.${own}`, sources, matchesDefault };
}
