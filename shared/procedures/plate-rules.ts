import type { PlanCheck, PlanInput } from '../schemas/plans';
import type { ProcedureProfile, SettingSource, SourceTag } from './profiles';

/*
 * Defaults that depend on the plate. A standard that ties the maximum pressure and the stop limit to
 * the plate diameter says so in a plate rule; choosing another plate brings that plate's values, and a
 * plan that keeps another plate's values is warned about.
 */

export interface PlateRuleRow {
  sizeMm: number;
  /** The largest pressure of the first loading on this plate, kPa. */
  maxPressureKpa: number;
  /** Settlement at which the loading stops on this plate, mm. */
  maxSettlementMm: number;
}

export interface PlateRule {
  rows: readonly PlateRuleRow[];
  tag: SourceTag;
  text: string;
}

/** DIN 18134 family: σ0max and the settlement limit for the 300, 600 and 762 mm plates (from memory). */
export const MODULUS_PLATE_RULE: PlateRule = {
  rows: [
    { sizeMm: 300, maxPressureKpa: 500, maxSettlementMm: 5 },
    { sizeMm: 600, maxPressureKpa: 250, maxSettlementMm: 8 },
    { sizeMm: 762, maxPressureKpa: 200, maxSettlementMm: 13 },
  ],
  tag: 'from memory',
  text: 'DIN 18134 — σ0max 0.5 / 0.25 / 0.2 MN/m² and stop at 5 / 8 / 13 mm settlement for 300 / 600 / 762 mm plates',
};

const PLATE_RULES: Record<string, PlateRule> = { 'modulus-two-cycle': MODULUS_PLATE_RULE };

export function plateRuleOf(profile: ProcedureProfile | undefined): PlateRule | undefined {
  return profile ? PLATE_RULES[profile.id] : undefined;
}

/** The row for exactly this plate, if the rule names it. */
export function plateRuleRow(rule: PlateRule, sizeMm: number): PlateRuleRow | undefined {
  return rule.rows.find((r) => r.sizeMm === sizeMm);
}

/** Pressures scaled by `ratio`, to 0.1 kPa: the profile's stages carried to another plate's maximum. */
const scaled = (kpa: readonly number[], ratio: number) => kpa.map((q) => Math.round(q * ratio * 10) / 10);

export interface PlateDefaults {
  defaults: ProcedureProfile['defaults'];
  /** The profile's sources, those of the plate-dependent settings replaced by the rule's. */
  sources: SettingSource[];
}

/**
 * The profile's defaults for a plate of `sizeMm`: where the profile has a plate rule naming that plate,
 * the profile's loading and unloading stages are carried to that plate's maximum pressure (same
 * proportions) and its stop limit replaces the profile's. Any other plate keeps the profile's defaults
 * (the plan check says the rule does not cover it).
 */
export function defaultsForPlate(profile: ProcedureProfile, sizeMm: number): PlateDefaults {
  const base = structuredClone(profile.defaults);
  base.plate = { ...base.plate, sizeMm };
  const rule = plateRuleOf(profile);
  const row = rule && plateRuleRow(rule, sizeMm);
  if (!rule || !row || base.loading.mode !== 'list') return { defaults: base, sources: profile.sources };
  const ratio = row.maxPressureKpa / Math.max(...base.loading.pressuresKpa);
  const defaults: ProcedureProfile['defaults'] = {
    ...base,
    loading: { mode: 'list', pressuresKpa: scaled(base.loading.pressuresKpa, ratio) },
    unloadReload: { ...base.unloadReload, unloadKpa: scaled(base.unloadReload.unloadKpa, ratio) },
    termination: { ...base.termination, maxSettlementMm: row.maxSettlementMm },
  };
  const ruled = new Set(['loading', 'termination.maxSettlementMm']);
  const sources = [
    ...profile.sources.filter((s) => !ruled.has(s.setting)),
    { setting: 'loading', tag: rule.tag, text: `${rule.text}: the stages carried to ${row.maxPressureKpa} kPa on the ${sizeMm} mm plate` },
    { setting: 'termination.maxSettlementMm', tag: rule.tag, text: `${rule.text}: ${row.maxSettlementMm} mm on the ${sizeMm} mm plate` },
  ];
  return { defaults, sources };
}

/** Warnings when a plan breaks its standard's plate rule: a plate the rule does not name, or another plate's maximum or stop limit. */
export function plateRuleChecks(plan: Pick<PlanInput, 'plate' | 'loading' | 'termination'>, profile: ProcedureProfile | undefined, maxPlannedKpa: number): PlanCheck[] {
  const rule = plateRuleOf(profile);
  if (!rule || !profile) return [];
  const row = plateRuleRow(rule, plan.plate.sizeMm);
  const sizes = rule.rows.map((r) => r.sizeMm).join(' / ');
  if (!row) {
    return [{ code: 'plate_rule_size', severity: 'warning', message: `${profile.family} sets its limits for ${sizes} mm plates only; a ${plan.plate.sizeMm} mm plate is outside its rule.`, field: 'plate.sizeMm' }];
  }
  const checks: PlanCheck[] = [];
  if (Math.abs(maxPlannedKpa - row.maxPressureKpa) > 0.5) {
    checks.push({
      code: 'plate_rule_pressure',
      severity: 'warning',
      message: `The first loading goes to ${maxPlannedKpa} kPa; ${profile.family} loads a ${row.sizeMm} mm plate to ${row.maxPressureKpa} kPa.`,
      field: 'loading',
    });
  }
  if (Math.abs(plan.termination.maxSettlementMm - row.maxSettlementMm) > 1e-9) {
    checks.push({
      code: 'plate_rule_settlement',
      severity: 'warning',
      message: `Stop limit ${plan.termination.maxSettlementMm} mm; ${profile.family} stops a ${row.sizeMm} mm plate at ${row.maxSettlementMm} mm.`,
      field: 'termination.maxSettlementMm',
    });
  }
  return checks;
}
