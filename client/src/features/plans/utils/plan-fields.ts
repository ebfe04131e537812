import { nearestField } from '../../../lib/form-errors';

/** Label and unit of every plan setting the form shows, by its dotted path in PlanInput. */
export const PLAN_FIELDS = {
  name: { label: 'Plan name' },
  procedureId: { label: 'Procedure' },
  'plate.shape': { label: 'Plate shape' },
  'plate.sizeMm': { label: 'Plate size', unit: 'mm' },
  'plate.thicknessMm': { label: 'Plate thickness', unit: 'mm' },
  seatingPressureKpa: { label: 'Seating pressure', unit: 'kPa' },
  seatingHoldMin: { label: 'Seating hold', unit: 'min' },
  apparatusWeightKn: { label: 'Apparatus weight on the plate', unit: 'kN' },
  loading: { label: 'Loading schedule' },
  'loading.mode': { label: 'Increments set by' },
  'loading.pressuresKpa': { label: 'Loading pressures', unit: 'kPa' },
  'loading.fixedStepKpa': { label: 'Fixed step', unit: 'kPa' },
  'loading.fractionOfUltimate': { label: 'Fraction of expected ultimate' },
  'loading.expectedUltimateKpa': { label: 'Expected ultimate pressure', unit: 'kPa' },
  'loading.maxPressureKpa': { label: 'Largest loading pressure', unit: 'kPa' },
  unloadReload: { label: 'Unloading and second loading' },
  'unloadReload.unloadKpa': { label: 'Unloading pressures', unit: 'kPa' },
  'unloadReload.reload.mode': { label: 'Second loading' },
  'unloadReload.reload.pressuresKpa': { label: 'Second-loading pressures', unit: 'kPa' },
  'unloadReload.repetitionsPerLevel': { label: 'Applications per load level' },
  holdRule: { label: 'Hold rule' },
  'holdRule.kind': { label: 'A hold is satisfied by' },
  'holdRule.maxRateMmPerMin': { label: 'Settlement rate below', unit: 'mm/min' },
  'holdRule.windowMin': { label: 'Rate judged over', unit: 'min' },
  'holdRule.minHoldMin': { label: 'Shortest hold', unit: 'min' },
  'holdRule.maxChangeMm': { label: 'Largest change per interval', unit: 'mm' },
  'holdRule.intervalMin': { label: 'Interval', unit: 'min' },
  'holdRule.intervals': { label: 'Consecutive intervals' },
  'holdRule.durationMin': { label: 'Hold duration', unit: 'min' },
  'holdRule.percent': { label: 'Share of probable final settlement', unit: '%' },
  'holdRule.maxHoldMin': { label: 'Satisfied in any case after', unit: 'min' },
  readingSchedule: { label: 'Reading schedule' },
  'readingSchedule.kind': { label: 'Readings due' },
  'readingSchedule.minutes': { label: 'Readings after each step at', unit: 'min' },
  'readingSchedule.thenEveryMin': { label: 'Then every', unit: 'min' },
  'readingSchedule.everyMin': { label: 'Every', unit: 'min' },
  termination: { label: 'Stop rules' },
  'termination.maxSettlementMm': { label: 'Stop at mean settlement', unit: 'mm' },
  'termination.maxSettlementFractionOfWidth': { label: 'Stop at fraction of plate width (0 = off)' },
  'termination.maxHoldMin': { label: 'Failure suspected when a hold exceeds', unit: 'min' },
  'reaction.kind': { label: 'Reaction' },
  'reaction.capacityKn': { label: 'Reaction capacity', unit: 'kN' },
  'reaction.description': { label: 'Reaction description' },
  footing: { label: 'Footing to scale to' },
  'footing.shape': { label: 'Footing shape' },
  'footing.widthM': { label: 'Footing width', unit: 'm' },
  'footing.lengthM': { label: 'Footing length', unit: 'm' },
  'footing.soilBehaviour': { label: 'Soil behaviour' },
  notes: { label: 'Notes' },
} as const satisfies Record<string, { label: string; unit?: string }>;

export type PlanFieldPath = keyof typeof PLAN_FIELDS;

export const PLAN_FIELD_PATHS = Object.keys(PLAN_FIELDS) as PlanFieldPath[];

/** Location facts the plan check refers to; they are edited on the location, not in the plan. */
const LOCATION_FIELDS: Record<string, string> = {
  pitWidthM: 'Pit width (location)',
  waterTableDepthM: 'Water table (location)',
};

/** The label of the nearest known setting for a dotted path, e.g. `loading.pressuresKpa.2` → "Loading pressures". */
export function planFieldLabel(path: string): string {
  if (path in LOCATION_FIELDS) return LOCATION_FIELDS[path];
  const nearest = nearestField(path, PLAN_FIELD_PATHS) as PlanFieldPath | null;
  return nearest ? PLAN_FIELDS[nearest].label : path;
}

export function planFieldUnit(path: PlanFieldPath): string | undefined {
  const field: { label: string; unit?: string } = PLAN_FIELDS[path];
  return field.unit;
}
