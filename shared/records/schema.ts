import { z } from 'zod';
import type { ReductionRule } from '../interpretation/reduction';
import type { Branch } from '../plans/stages';
import { holdRuleSchema, planInput } from '../schemas/plans';

/**
 * Settlescope's own test record ("settlescope-record", version 1): one plate load test as JSON — who,
 * where and when, the plate, the plan settings that matter for analysis, an optional footing to scale to,
 * the gauges, and per stage the timed readings (minutes since the stage's target was reached, plate
 * pressure, zero-corrected settlement per gauge), plus an events log. tests/fixtures/records/README.md
 * documents the format with examples; shared/records/test-record.schema.json is its JSON Schema.
 */
export const RECORD_FORMAT = 'settlescope-record';
export const RECORD_VERSION = 1;

/** Size limits that keep a hostile or broken file from exhausting memory (a week at one reading a minute is ~10,000 readings). */
export const RECORD_LIMITS = {
  /** Largest record file or CSV text, bytes. */
  bytes: 8 * 1024 * 1024,
  gauges: 12,
  stages: 200,
  readingsPerStage: 50_000,
  readingsTotal: 100_000,
  events: 2_000,
  /** Longest time since a stage's target was reached: 30 days, minutes. */
  stageMinutes: 60 * 24 * 30,
} as const;

export const RECORD_BRANCHES = ['seating', 'loading', 'unloading', 'reloading'] as const satisfies readonly Branch[];

/** What an event in the log is about; `other` for anything else. */
export const RECORD_EVENT_KINDS = ['note', 'load-change', 'top-up', 'gauge-reset', 'gauge-replaced', 'pause', 'weather', 'photo', 'alarm', 'other'] as const;

/** A gauge key: a letter, then up to 31 letters, digits, "_" or "-" (it doubles as a CSV column name). */
export const GAUGE_KEY_PATTERN = /^[A-Za-z][A-Za-z0-9_-]{0,31}$/;

const singleLine = (max: number) =>
  z
    .string()
    .max(max)
    .regex(/^[^\r\n]*$/, 'must be a single line');
const gaugeKey = z.string().regex(GAUGE_KEY_PATTERN, 'must be a letter followed by up to 31 letters, digits, "_" or "-"');
const minutes = z.number().min(0).max(RECORD_LIMITS.stageMinutes);
const settlementMm = z.number().min(-500).max(500);
const positionMm = z.number().min(-2000).max(2000);
const planPlate = planInput.shape.plate.shape;
const planFooting = planInput.shape.footing.unwrap().unwrap().shape;
const kpa = planInput.shape.seatingPressureKpa;

/** The interpretation's {@link ReductionRule} as a schema. */
export const reductionRuleSchema: z.ZodType<ReductionRule> = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('endOfHold') }),
  z.strictObject({ kind: z.literal('atTime'), minutes: minutes.positive() }),
]);

const metadataSchema = z.strictObject({
  project: singleLine(200).optional(),
  client: singleLine(200).optional(),
  site: singleLine(200).optional(),
  pit: singleLine(80).optional(),
  testDate: singleLine(40).optional(),
  crew: singleLine(200).optional(),
  weather: singleLine(200).optional(),
  notes: z.string().max(4000).optional(),
});

const planSchema = z.strictObject({
  procedureId: singleLine(60).optional(),
  seatingPressureKpa: kpa.optional(),
  holdRule: holdRuleSchema.optional(),
  /** Which reading stands for a stage on the load–settlement curve; absent = the end of the hold. */
  reduction: reductionRuleSchema.optional(),
});

const groundSchema = z.strictObject({
  description: singleLine(300).optional(),
  testDepthM: z.number().min(0).max(100).optional(),
  waterTableBelowTestM: z.number().min(0).max(200).optional(),
});

const footingSchema = z.strictObject({
  shape: planFooting.shape,
  widthM: planFooting.widthM,
  /** Length of a rectangular footing, m (its shape factor needs it). */
  lengthM: z.number().positive().max(200).optional(),
  soilBehaviour: planFooting.soilBehaviour,
  /** Depth of the footing base below ground, m (net pressure γ·D_f). */
  foundationDepthM: z.number().min(0).max(50).optional(),
  unitWeightKnM3: z.number().min(0).max(30).optional(),
  permissibleSettlementMm: z.number().positive().max(500).optional(),
  factorOfSafety: z.number().min(1).max(10).optional(),
});

const gaugeSchema = z
  .strictObject({ key: gaugeKey, label: singleLine(80).optional(), xMm: positionMm.optional(), yMm: positionMm.optional() })
  .refine((g) => (g.xMm === undefined) === (g.yMm === undefined), { message: 'give both xMm and yMm, or neither', path: ['yMm'] });

const stageFields = {
  index: z.int().min(0).max(10_000),
  branch: z.enum(RECORD_BRANCHES),
  targetKpa: kpa,
};
const readingsOf = <T extends z.ZodType>(reading: T) => z.array(reading).min(1).max(RECORD_LIMITS.readingsPerStage);

const eventSchema = z.strictObject({
  /** Index of the stage the event belongs to. */
  stage: z.int().min(0).max(10_000).optional(),
  /** Minutes since that stage's target was reached. */
  tMin: minutes.optional(),
  kind: z.enum(RECORD_EVENT_KINDS),
  text: z.string().max(2000),
});

const recordFields = {
  format: z.literal(RECORD_FORMAT),
  version: z.literal(RECORD_VERSION),
  metadata: metadataSchema.optional(),
  plate: z.strictObject({ shape: planPlate.shape, sizeMm: planPlate.sizeMm }),
  plan: planSchema.optional(),
  ground: groundSchema.optional(),
  /** The real footing the plate results are scaled to. */
  footing: footingSchema.optional(),
  gauges: z.array(gaugeSchema).min(1).max(RECORD_LIMITS.gauges),
};
const events = z.array(eventSchema).max(RECORD_LIMITS.events).optional();
const stagesOf = <T extends z.ZodType>(stage: T) => z.array(stage).min(1).max(RECORD_LIMITS.stages);

/** One reading: minutes since the stage's target was reached, plate pressure, settlement per gauge key (mm, zero- and reset-corrected). */
export const readingSchema = z.strictObject({ tMin: minutes, pressureKpa: kpa, gauges: z.record(gaugeKey, settlementMm) });

/** The record with each stage's readings left unchecked, so that they can be checked one by one (see validate.ts). */
export const recordHeadSchema = z.strictObject({
  ...recordFields,
  stages: stagesOf(z.strictObject({ ...stageFields, readings: readingsOf(z.unknown()) })),
  events,
});

/** Where a consistency problem is, as a path into the record, and what it is. */
export type ReportIssue = (path: (string | number)[], message: string) => void;

/** The message for a record with more readings than {@link RECORD_LIMITS} allows, or null. */
export function tooManyReadings(total: number): string | null {
  return total > RECORD_LIMITS.readingsTotal ? `too many readings: ${total} (at most ${RECORD_LIMITS.readingsTotal})` : null;
}

/** The rules between fields: unique gauges, every reading gives every gauge, stage and time order, events on real stages. */
export function checkConsistency(record: Pick<TestRecord, 'gauges' | 'stages' | 'events'>, issue: ReportIssue): void {
  const keys = record.gauges.map((g) => g.key);
  const declared = new Set(keys);
  keys.forEach((key, i) => {
    if (keys.indexOf(key) !== i) issue(['gauges', i, 'key'], `duplicate gauge key "${key}"`);
  });
  let total = 0;
  record.stages.forEach((stage, s) => {
    total += stage.readings.length;
    if (s > 0 && stage.index <= record.stages[s - 1].index) issue(['stages', s, 'index'], 'stage indexes must rise from stage to stage');
    stage.readings.forEach((reading, r) => {
      const at = ['stages', s, 'readings', r];
      if (r > 0 && reading.tMin < stage.readings[r - 1].tMin) issue([...at, 'tMin'], 'readings must be in time order');
      for (const key of keys) if (!(key in reading.gauges)) issue([...at, 'gauges', key], 'missing: every reading gives every declared gauge');
      for (const key of Object.keys(reading.gauges)) if (!declared.has(key)) issue([...at, 'gauges', key], 'not a declared gauge');
    });
  });
  const tooMany = tooManyReadings(total);
  if (tooMany) issue(['stages'], tooMany);
  const stageIndexes = new Set(record.stages.map((s) => s.index));
  record.events?.forEach((event, e) => {
    if (event.stage !== undefined && !stageIndexes.has(event.stage)) issue(['events', e, 'stage'], `no stage has index ${event.stage}`);
  });
}

/**
 * A Settlescope test record. Objects are strict: an unknown or misspelt field is an error. For untrusted
 * input use `parseTestRecord` (validate.ts), which bounds the list of problems a hostile file can produce.
 */
export const testRecordSchema = z
  .strictObject({ ...recordFields, stages: stagesOf(z.strictObject({ ...stageFields, readings: readingsOf(readingSchema) })), events })
  .superRefine((record, ctx) => checkConsistency(record, (path, message) => ctx.addIssue({ code: 'custom', path, message })));

export type TestRecord = z.infer<typeof testRecordSchema>;
export type RecordStage = TestRecord['stages'][number];
export type RecordReading = RecordStage['readings'][number];
export type RecordGauge = TestRecord['gauges'][number];
export type RecordFooting = NonNullable<TestRecord['footing']>;

/** The JSON Schema of the record (zod 4's `z.toJSONSchema`; the cross-field rules are not expressible there). */
export function toJsonSchema(): Record<string, unknown> {
  return z.toJSONSchema(testRecordSchema) as Record<string, unknown>;
}

/** The text of shared/records/test-record.schema.json. */
export function jsonSchemaText(): string {
  return `${JSON.stringify(toJsonSchema(), null, 2)}\n`;
}
