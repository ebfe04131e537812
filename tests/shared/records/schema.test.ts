import { readFileSync } from 'node:fs';
import { jsonSchemaText, RECORD_LIMITS, type TestRecord, testRecordSchema, toJsonSchema } from '@shared/records/schema';
import { MAX_LISTED_ISSUES, parseTestRecord, type RecordImport } from '@shared/records/validate';
import { describe, expect, it } from 'vitest';
import { copy, fixtureRecord, fixtureText } from './fixtures';
import { modulusTwoCycleRecord, sandBearingRecord } from './synthetic';

/** The problems of a failed import, as "field: message" lines. */
function problems(outcome: RecordImport): string[] {
  if (outcome.ok) return expect.fail('expected the record to be rejected');
  return outcome.errors.map((e) => `${e.field}: ${e.message}`);
}

const sand = () => copy(fixtureRecord('sand-bearing-450-square.json'));
const reject = (mutate: (r: TestRecord & Record<string, unknown>) => void) => {
  const record = sand() as TestRecord & Record<string, unknown>;
  mutate(record);
  return problems(parseTestRecord(record));
};

describe('test record schema', () => {
  it('accepts the example records, unchanged', () => {
    for (const name of ['sand-bearing-450-square.json', 'modulus-two-cycle-300.json']) {
      const raw = JSON.parse(fixtureText(name));
      expect(fixtureRecord(name)).toEqual(raw);
    }
  });

  it('the example files are what the scenario builders produce', () => {
    expect(fixtureRecord('sand-bearing-450-square.json')).toEqual(sandBearingRecord());
    expect(fixtureRecord('modulus-two-cycle-300.json')).toEqual(modulusTwoCycleRecord());
  });

  it('names the field of a reading that is not a number', () => {
    expect(
      reject((r) => {
        (r.stages[3].readings[2].gauges as Record<string, unknown>).g2 = '1.5';
      }),
    ).toEqual(['stages.3.readings.2.gauges.g2: Invalid input: expected number, received string']);
  });

  it('names a missing gauge, an undeclared gauge and a duplicate key', () => {
    expect(
      reject((r) => {
        delete (r.stages[1].readings[0].gauges as Record<string, number>).g4;
        r.stages[2].readings[5].gauges.g9 = 1;
      }),
    ).toEqual(['stages.1.readings.0.gauges.g4: missing: every reading gives every declared gauge', 'stages.2.readings.5.gauges.g9: not a declared gauge']);
    expect(reject((r) => (r.gauges[1].key = 'g1'))).toContain('gauges.1.key: duplicate gauge key "g1"');
  });

  it('names order problems: stage indexes and reading times', () => {
    expect(reject((r) => (r.stages[2].index = 1))).toEqual(['stages.2.index: stage indexes must rise from stage to stage']);
    expect(reject((r) => (r.stages[1].readings[3].tMin = 0.5))).toEqual(['stages.1.readings.3.tMin: readings must be in time order']);
  });

  it('names out-of-range values, unknown fields and a wrong format or version', () => {
    expect(reject((r) => (r.stages[0].readings[0].pressureKpa = -3))).toEqual(['stages.0.readings.0.pressureKpa: Too small: expected number to be >=0']);
    expect(reject((r) => (r.plate.sizeMm = 50))).toEqual(['plate.sizeMm: Too small: expected number to be >=100']);
    expect(reject((r) => (r.plat = { shape: 'square' }))[0]).toMatch(/^\(record\): Unrecognized key: "plat"/);
    expect(reject((r) => ((r as Record<string, unknown>).format = 'other'))[0]).toMatch(/^format: Invalid input: expected "settlescope-record"/);
    expect(reject((r) => ((r as Record<string, unknown>).version = 2))[0]).toMatch(/^version: Invalid input: expected 1/);
    expect(reject((r) => (r.metadata = { weather: 'dry\nwindy' }))).toEqual(['metadata.weather: must be a single line']);
    expect(reject((r) => (r.gauges[0] = { key: 'g1', xMm: 5 }))).toEqual(['gauges.0.yMm: give both xMm and yMm, or neither']);
    expect(reject((r) => (r.events = [{ stage: 42, kind: 'note', text: 'x' }]))).toEqual(['events.0.stage: no stage has index 42']);
  });

  it('lists every problem, the first 100 with a count of the rest', () => {
    const outcome = parseTestRecord({
      ...sand(),
      stages: [
        {
          index: 0,
          branch: 'loading',
          targetKpa: 100,
          readings: Array.from({ length: 150 }, (_, i) => ({ tMin: i, pressureKpa: 'high', gauges: { g1: 0, g2: 0, g3: 0, g4: 0 } })),
        },
      ],
    });
    expect(problems(outcome)).toHaveLength(MAX_LISTED_ISSUES);
    expect(outcome.ok === false && outcome.omitted).toBe(50);
    expect(problems(outcome)[99]).toBe('stages.0.readings.99.pressureKpa: Invalid input: expected number, received string');
  });

  it('counts every problem of a record full of them, keeping only the listed ones', () => {
    const bad = { tMin: 0, pressureKpa: 0, gauges: { g1: 'x', g2: 'x', g3: 'x', g4: 'x' } };
    const outcome = parseTestRecord({
      ...sand(),
      stages: [{ index: 0, branch: 'loading', targetKpa: 100, readings: Array.from({ length: 10_000 }, () => bad) }],
    });
    expect(problems(outcome)).toHaveLength(MAX_LISTED_ISSUES);
    expect(outcome.ok === false && outcome.omitted).toBe(4 * 10_000 - MAX_LISTED_ISSUES);
  });

  it('the zod schema on its own applies the same rules', () => {
    expect(testRecordSchema.safeParse(sand()).success).toBe(true);
    const record = sand();
    record.gauges[1].key = 'g1';
    const issues = testRecordSchema.safeParse(record).error?.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
    expect(issues).toContain('gauges.1.key: duplicate gauge key "g1"');
  });

  it('enforces the size limits', () => {
    const gauges = Array.from({ length: RECORD_LIMITS.gauges + 1 }, (_, i) => ({ key: `g${i}` }));
    expect(reject((r) => (r.gauges = gauges))).toContain(`gauges: Too big: expected array to have <=${RECORD_LIMITS.gauges} items`);
    const reading = { tMin: 0, pressureKpa: 0, gauges: { g1: 0, g2: 0, g3: 0, g4: 0 } };
    const perStage = RECORD_LIMITS.readingsPerStage;
    const stages = Array.from({ length: Math.ceil(RECORD_LIMITS.readingsTotal / perStage) + 1 }, (_, index) => ({
      index,
      branch: 'loading' as const,
      targetKpa: 10,
      readings: Array.from({ length: perStage }, () => reading),
    }));
    const tooMany = reject((r) => {
      r.stages = stages;
      delete r.events;
    });
    expect(tooMany).toEqual([`stages: too many readings: ${stages.length * perStage} (at most ${RECORD_LIMITS.readingsTotal})`]);
  });
});

describe('JSON Schema', () => {
  it('the checked-in file is the one generated from the zod schema (regenerate: npx tsx server/cli/write-record-schema.ts)', () => {
    const file = readFileSync(new URL('../../../shared/records/test-record.schema.json', import.meta.url), 'utf8');
    expect(file).toBe(jsonSchemaText());
  });

  it('describes the record: format, required parts and the reading shape', () => {
    const schema = toJsonSchema() as { required: string[]; properties: Record<string, { const?: unknown }> };
    expect(schema.properties.format.const).toBe('settlescope-record');
    expect(schema.properties.version.const).toBe(1);
    expect(schema.required).toEqual(['format', 'version', 'plate', 'gauges', 'stages']);
    expect(JSON.stringify(schema)).toContain('"pressureKpa"');
  });
});
