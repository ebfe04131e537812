import type { HoldRule, Loading, ReadingSchedule, Termination, UnloadReload } from '../schemas/plans';
import type { PlateShape } from '../domain/plate';

/**
 * Where a default value comes from, in the marks of the reference (shared/README.md):
 * a standard seen in a secondary text, a value recalled from memory, or common practice.
 */
export type SourceTag = 'standard' | 'secondary' | 'from memory' | 'common practice';

export interface SettingSource {
  /** Dotted path of the plan setting, e.g. `holdRule.maxRateMmPerMin`. */
  setting: string;
  tag: SourceTag;
  text: string;
}

export type ProcedureKind = 'bearing' | 'pavement' | 'modulus' | 'custom';

export interface ProcedureProfile {
  id: string;
  name: string;
  kind: ProcedureKind;
  summary: string;
  /** Standards family the defaults follow; not a claim of compliance. */
  family: string;
  plateSizeRangeMm: [number, number];
  /** Smallest pit width in plate widths (reference §A.2). */
  minPitWidthInPlates: number;
  /** Reaction capacity must exceed the largest planned load by this fraction (20 % is common practice). */
  reactionMargin: number;
  defaults: {
    plate: { shape: PlateShape; sizeMm: number; thicknessMm: number };
    seatingPressureKpa: number;
    /** Seating hold before zeroing, minutes. */
    seatingHoldMin: number;
    loading: Loading;
    unloadReload: UnloadReload;
    holdRule: HoldRule;
    readingSchedule: ReadingSchedule;
    termination: Termination;
  };
  sources: SettingSource[];
}

/** Seating held half a minute before zeroing (common practice: long enough for the plate to bed). */
export const SEATING_HOLD_MIN = 0.5;

/** √t-friendly reading times of the maintained-load family: 1, 2.25, 4, 6.25, 9, 16, 25 min, then hourly. */
const SQUARE_ROOT_SCHEDULE: ReadingSchedule = {
  kind: 'list',
  minutes: [1, 2.25, 4, 6.25, 9, 16, 25],
  thenEveryMin: 60,
};

const bearingSources: SettingSource[] = [
  { setting: 'seatingPressureKpa', tag: 'secondary', text: 'IS 1888:1982 cl. 4.5.2 — 70 g/cm² ≈ 7 kPa, applied and released (seen in secondary texts)' },
  { setting: 'loading', tag: 'common practice', text: 'Increment: the smaller of a fixed step and a fifth of the expected ultimate' },
  { setting: 'readingSchedule', tag: 'secondary', text: 'IS 1888:1982 — readings at 1, 2.25, 4, 6.25, 9, 16, 25 min, then hourly (seen in secondary texts)' },
  { setting: 'termination.maxSettlementMm', tag: 'common practice', text: '25 mm stop limit (IS 1888:1982 as described in secondary texts)' },
  { setting: 'plate.sizeMm', tag: 'secondary', text: 'IS 1888:1982 — plates 300–750 mm, ≥ 25 mm thick (seen in secondary texts)' },
  { setting: 'minPitWidthInPlates', tag: 'secondary', text: 'IS 1888:1982 — pit at least five plate widths wide (seen in secondary texts)' },
];

/** What the two maintained-load bearing profiles share: plate, pit, seating, schedule, stop limit. */
const BEARING = {
  kind: 'bearing',
  family: 'IS 1888:1982 family',
  plateSizeRangeMm: [300, 762],
  minPitWidthInPlates: 5,
  reactionMargin: 0.2,
} as const satisfies Partial<ProcedureProfile>;
const BEARING_DEFAULTS = {
  plate: { shape: 'square', sizeMm: 450, thicknessMm: 25 },
  seatingPressureKpa: 7,
  seatingHoldMin: SEATING_HOLD_MIN,
  unloadReload: { unloadKpa: [], reload: { mode: 'none' }, repetitionsPerLevel: 1 },
  readingSchedule: SQUARE_ROOT_SCHEDULE,
  termination: { maxSettlementMm: 25, maxSettlementFractionOfWidth: 0, maxHoldMin: 24 * 60 },
} as const satisfies Partial<ProcedureProfile['defaults']>;

/** What the two pavement profiles share: a 762 mm plate, 1-min readings, the 3-consecutive-minute rule. */
const PAVEMENT = {
  kind: 'pavement',
  plateSizeRangeMm: [152, 762],
  minPitWidthInPlates: 0,
  reactionMargin: 0.2,
} as const satisfies Partial<ProcedureProfile>;
const PAVEMENT_DEFAULTS = {
  plate: { shape: 'circular', sizeMm: 762, thicknessMm: 25 },
  seatingPressureKpa: 7,
  seatingHoldMin: SEATING_HOLD_MIN,
  holdRule: { kind: 'consecutive', maxChangeMm: 0.03, intervalMin: 1, intervals: 3 },
  readingSchedule: { kind: 'interval', everyMin: 1 },
} as const satisfies Partial<ProcedureProfile['defaults']>;

export const PROCEDURE_PROFILES: ProcedureProfile[] = [
  {
    id: 'bearing-granular',
    name: 'Bearing test — maintained load, granular soil',
    ...BEARING,
    summary:
      'Increments held until the settlement rate falls below a threshold, to 25 mm or failure. For sands, gravels and other free-draining soils.',
    defaults: {
      ...BEARING_DEFAULTS,
      loading: { mode: 'rule', fixedStepKpa: 100, fractionOfUltimate: 0.2, expectedUltimateKpa: 600, maxPressureKpa: 900 },
      holdRule: { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 10, minHoldMin: 60 },
    },
    sources: [
      ...bearingSources,
      { setting: 'holdRule.maxRateMmPerMin', tag: 'secondary', text: 'IS 1888:1982 — next increment when the rate is below 0.02 mm/min (seen in secondary texts); common practice for non-cohesive soil' },
      { setting: 'holdRule.minHoldMin', tag: 'from memory', text: 'Textbook descriptions keep each increment not less than 1 h' },
      { setting: 'holdRule.windowMin', tag: 'common practice', text: 'Rate by least-squares slope over ≥ 5–10 min: a 0.01 mm dial makes 1-min differences meaningless' },
    ],
  },
  {
    id: 'bearing-cohesive',
    name: 'Bearing test — maintained load, cohesive soil',
    ...BEARING,
    summary:
      'Each increment held until the time–settlement curve shows 75 % of its probable ultimate settlement, or 24 h. For clays and silts.',
    defaults: {
      ...BEARING_DEFAULTS,
      loading: { mode: 'rule', fixedStepKpa: 50, fractionOfUltimate: 0.2, expectedUltimateKpa: 300, maxPressureKpa: 450 },
      holdRule: { kind: 'percentOfUltimate', percent: 75, minHoldMin: 60, maxHoldMin: 24 * 60 },
    },
    sources: [
      ...bearingSources,
      { setting: 'holdRule.percent', tag: 'from memory', text: 'IS 1888:1982 — clayey soils: 70–80 % of the probable ultimate settlement of the stage, judged here by a hyperbolic time fit' },
      { setting: 'holdRule.maxHoldMin', tag: 'common practice', text: '24 h per increment for clay' },
    ],
  },
  {
    id: 'pavement-single',
    name: 'Pavement test — single loading (subgrade modulus)',
    ...PAVEMENT,
    summary:
      'Uniform increments on a 762 mm plate, each held until the settlement changes by no more than 0.03 mm in each of 3 consecutive minutes; gives k.',
    family: 'ASTM D1196 / AASHTO T 222 family',
    defaults: {
      ...PAVEMENT_DEFAULTS,
      loading: { mode: 'list', pressuresKpa: [35, 70, 105, 140, 175, 210] },
      unloadReload: { unloadKpa: [], reload: { mode: 'none' }, repetitionsPerLevel: 1 },
      termination: { maxSettlementMm: 12.7, maxSettlementFractionOfWidth: 0, maxHoldMin: 120 },
    },
    sources: [
      { setting: 'holdRule', tag: 'from memory', text: 'ASTM D1196 / AASHTO T 222 — rate ≤ 0.03 mm/min (0.001 in/min) for 3 consecutive minutes' },
      { setting: 'plate.sizeMm', tag: 'standard', text: 'ASTM D1196 — circular plates 152–762 mm, ≥ 25 mm thick' },
      { setting: 'readingSchedule', tag: 'common practice', text: '1-min readings during the hold, needed to check the criterion' },
      { setting: 'termination.maxSettlementMm', tag: 'from memory', text: 'A selected total deflection, often 12.7–25 mm' },
    ],
  },
  {
    id: 'pavement-repeated',
    name: 'Pavement test — repeated loading',
    ...PAVEMENT,
    summary: 'Each load level applied and released six times before the next; total, rebound and residual deflection per cycle.',
    family: 'ASTM D1195 / AASHTO T 221 family',
    defaults: {
      ...PAVEMENT_DEFAULTS,
      loading: { mode: 'list', pressuresKpa: [70, 140, 210] },
      unloadReload: { unloadKpa: [0], reload: { mode: 'none' }, repetitionsPerLevel: 6 },
      termination: { maxSettlementMm: 25, maxSettlementFractionOfWidth: 0, maxHoldMin: 120 },
    },
    sources: [
      { setting: 'unloadReload.repetitionsPerLevel', tag: 'from memory', text: 'ASTM D1195 / AASHTO T 221 — each load applied and released 6 times' },
      { setting: 'holdRule', tag: 'from memory', text: 'Each application and release held until the rate ≤ 0.03 mm/min for 3 consecutive minutes' },
      { setting: 'plate.sizeMm', tag: 'standard', text: 'ASTM D1195 — circular plates 152–762 mm, ≥ 25 mm thick' },
    ],
  },
  {
    id: 'modulus-two-cycle',
    name: 'Deformation modulus — two loading cycles (Ev1, Ev2)',
    kind: 'modulus',
    summary:
      'First loading in six stages to 500 kPa on a 300 mm plate, unloading in three stages, second loading to the penultimate stage; timed holds; gives Ev1, Ev2 and their ratio.',
    family: 'DIN 18134 family',
    plateSizeRangeMm: [300, 762],
    minPitWidthInPlates: 0,
    reactionMargin: 0.2,
    defaults: {
      plate: { shape: 'circular', sizeMm: 300, thicknessMm: 25 },
      seatingPressureKpa: 10,
      seatingHoldMin: SEATING_HOLD_MIN,
      loading: { mode: 'list', pressuresKpa: [80, 160, 240, 320, 400, 500] },
      unloadReload: { unloadKpa: [250, 125, 0], reload: { mode: 'toPenultimate' }, repetitionsPerLevel: 1 },
      holdRule: { kind: 'fixed', durationMin: 2 },
      readingSchedule: { kind: 'interval', everyMin: 2 },
      termination: { maxSettlementMm: 5, maxSettlementFractionOfWidth: 0, maxHoldMin: 10 },
    },
    sources: [
      { setting: 'seatingPressureKpa', tag: 'secondary', text: 'DIN 18134 — preload 0.01 MN/m² on a 300 mm plate, then zero (seen in secondary texts)' },
      { setting: 'loading', tag: 'from memory', text: 'DIN 18134 — at least 6 roughly equal stages to σ0max = 0.5 MN/m² (300 mm plate)' },
      { setting: 'unloadReload', tag: 'from memory', text: 'DIN 18134 — unload to ≈ 50 %, 25 % and 0 of σ0max; second loading to the penultimate stage' },
      { setting: 'holdRule.durationMin', tag: 'from memory', text: 'DIN 18134 — each stage held about 120 s' },
      { setting: 'termination.maxSettlementMm', tag: 'from memory', text: 'DIN 18134 — stop at 5 mm settlement (300 mm plate)' },
    ],
  },
  {
    id: 'custom',
    name: 'User-defined procedure',
    kind: 'custom',
    summary: 'Every setting chosen by the engineer; defaults are a starting point only.',
    family: 'none',
    plateSizeRangeMm: [100, 1500],
    minPitWidthInPlates: 0,
    reactionMargin: 0.2,
    defaults: {
      plate: { shape: 'circular', sizeMm: 300, thicknessMm: 25 },
      seatingPressureKpa: 7,
      seatingHoldMin: SEATING_HOLD_MIN,
      loading: { mode: 'list', pressuresKpa: [50, 100, 150, 200] },
      unloadReload: { unloadKpa: [0], reload: { mode: 'none' }, repetitionsPerLevel: 1 },
      holdRule: { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 10, minHoldMin: 15 },
      readingSchedule: { kind: 'interval', everyMin: 1 },
      termination: { maxSettlementMm: 25, maxSettlementFractionOfWidth: 0, maxHoldMin: 24 * 60 },
    },
    sources: [{ setting: 'reactionMargin', tag: 'common practice', text: 'Reaction ≥ 1.2 × largest planned load' }],
  },
];

export function findProfile(id: string): ProcedureProfile | undefined {
  return PROCEDURE_PROFILES.find((p) => p.id === id);
}
