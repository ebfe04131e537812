import { z } from 'zod';
import { PLATE_SHAPES } from '../domain/plate';
import { optionalText, patchOf, requiredText } from './common';

const kpa = z.number().min(0).max(20000);
const positiveMinutes = z.number().positive().max(60 * 24 * 14);

/** How one increment's hold is judged satisfied (reference §A.3, §D.9). */
export const holdRuleSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('rate'),
    /** Least-squares settlement rate must fall below this, mm/min. */
    maxRateMmPerMin: z.number().positive().max(10),
    /** Regression window, minutes. */
    windowMin: positiveMinutes,
    /** The hold lasts at least this long, minutes. */
    minHoldMin: z.number().min(0).max(60 * 24 * 14),
  }),
  z.object({
    kind: z.literal('consecutive'),
    /** Largest allowed settlement change per interval, mm. */
    maxChangeMm: z.number().positive().max(10),
    intervalMin: positiveMinutes,
    /** Number of consecutive intervals that must each stay within the limit. */
    intervals: z.number().int().min(1).max(60),
  }),
  z.object({
    kind: z.literal('fixed'),
    durationMin: positiveMinutes,
  }),
  z.object({
    kind: z.literal('percentOfUltimate'),
    /** Percent of the stage's probable ultimate settlement (hyperbolic time fit) to reach. */
    percent: z.number().min(50).max(99),
    minHoldMin: z.number().min(0).max(60 * 24 * 14),
    /** Satisfied in any case after this long, minutes (24 h is common practice for clay). */
    maxHoldMin: positiveMinutes,
  }),
]);
export type HoldRule = z.infer<typeof holdRuleSchema>;

/** When readings are due during a hold (manual mode prompts; automatic mode snaps official readings). */
export const readingScheduleSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('list'),
    minutes: z.array(z.number().positive().max(60 * 24 * 14)).min(1).max(100),
    thenEveryMin: positiveMinutes,
  }),
  z.object({ kind: z.literal('interval'), everyMin: positiveMinutes }),
]);
export type ReadingSchedule = z.infer<typeof readingScheduleSchema>;

export const loadingSchema = z.discriminatedUnion('mode', [
  z.object({ mode: z.literal('list'), pressuresKpa: z.array(kpa.positive()).min(1).max(60) }),
  z.object({
    mode: z.literal('rule'),
    /** Step = min(fixedStepKpa, fractionOfUltimate × expectedUltimateKpa). */
    fixedStepKpa: kpa.positive(),
    fractionOfUltimate: z.number().positive().max(1),
    expectedUltimateKpa: kpa.positive(),
    maxPressureKpa: kpa.positive(),
  }),
]);
export type Loading = z.infer<typeof loadingSchema>;

export const unloadReloadSchema = z.object({
  /** Pressures to unload through after the last loading stage; empty = release at once. */
  unloadKpa: z.array(kpa).max(20).default([]),
  /** Second loading: none, back up through the loading stages to the penultimate one, or a list. */
  reload: z.discriminatedUnion('mode', [
    z.object({ mode: z.literal('none') }),
    z.object({ mode: z.literal('toPenultimate') }),
    z.object({ mode: z.literal('list'), pressuresKpa: z.array(kpa.positive()).min(1).max(60) }),
  ]),
  /** Applications of each load level before the next (repetitive pavement test); 1 = plain test. */
  repetitionsPerLevel: z.number().int().min(1).max(20).default(1),
});
export type UnloadReload = z.infer<typeof unloadReloadSchema>;

export const terminationSchema = z.object({
  /** Stop when mean settlement reaches this, mm (25 mm is common practice). */
  maxSettlementMm: z.number().positive().max(200),
  /** Stop when this fraction of the plate width is reached (0 = off). */
  maxSettlementFractionOfWidth: z.number().min(0).max(0.5).default(0),
  /** Stop when a hold cannot be satisfied within this time, minutes (suspected failure). */
  maxHoldMin: positiveMinutes,
});
export type Termination = z.infer<typeof terminationSchema>;

export const REACTION_KINDS = ['kentledge', 'anchors', 'vehicle', 'frame', 'other'] as const;

export const planInput = z.object({
  name: requiredText(160),
  procedureId: requiredText(60),
  plate: z.object({
    shape: z.enum(PLATE_SHAPES),
    sizeMm: z.number().min(100).max(1500),
    thicknessMm: z.number().positive().max(100).default(25),
  }),
  seatingPressureKpa: kpa,
  /**
   * How long the seating pressure is held before the operator zeroes the gauges, minutes. Plans saved
   * before this setting existed have none and hold 0.5 min (see seatingHoldMin() in plans/stages).
   */
  seatingHoldMin: z.number().min(0).max(60).default(0.5),
  /** Weight of column, spacers, jack body resting on the plate, kN (reference §B.1). */
  apparatusWeightKn: z.number().min(0).max(100).default(0),
  loading: loadingSchema,
  unloadReload: unloadReloadSchema,
  holdRule: holdRuleSchema,
  readingSchedule: readingScheduleSchema,
  termination: terminationSchema,
  reaction: z.object({
    kind: z.enum(REACTION_KINDS),
    capacityKn: z.number().positive().max(100000),
    description: optionalText(300),
  }),
  /** The real footing the results are scaled to. */
  footing: z
    .object({
      shape: z.enum(['square', 'circular', 'strip', 'rectangular']),
      widthM: z.number().positive().max(50),
      lengthM: z.number().positive().max(200).nullable().default(null),
      soilBehaviour: z.enum(['cohesionless', 'cohesive']),
    })
    .nullable()
    .default(null),
  notes: optionalText(2000),
});
export type PlanInput = z.infer<typeof planInput>;
/** PATCH body: the fields to change (a nested part is replaced whole); the server checks the whole plan after merging. */
export const planPatch = patchOf(planInput);
export type PlanDraft = z.input<typeof planInput>;

export interface TestPlan extends PlanInput {
  id: number;
  locationId: number;
  createdAt: string;
  updatedAt: string;
}

/** A warning raised by the plan's self-check; never blocks saving. */
export interface PlanCheck {
  code: string;
  severity: 'warning' | 'info';
  message: string;
  field?: string;
}
