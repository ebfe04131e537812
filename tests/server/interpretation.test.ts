/**
 * Interpretation of stored runs: a record built from a recorded run's events and samples, the record of an
 * imported run returned as imported, the analysis over HTTP equal to analyzeRecord on the same record, CSV
 * exports, versioned saves with their audit rows, and who may read and write.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/models/audit-entry';
import { CalibrationRecord } from '../../server/models/calibration-record';
import { Instrument } from '../../server/models/instrument';
import { Rig } from '../../server/models/rig';
import { Run } from '../../server/models/run';
import { analyzeRecord } from '../../shared/interpretation/analyze-record';
import { readingsCsvToRecord } from '../../shared/records/csv';
import type { TestRecord } from '../../shared/records/schema';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';
import { manualGauge, storedRun } from '../support/stored-run';

const FIXTURES = path.join(import.meta.dirname, '../fixtures/records');
const sandJson = readFileSync(path.join(FIXTURES, 'sand-bearing-450-square.json'), 'utf8');
const sandCsv = readFileSync(path.join(FIXTURES, 'sand-bearing-450-square.csv'), 'utf8');
const sand = JSON.parse(sandJson) as TestRecord;
/** What the API sends: the analysis as JSON (undefined fields dropped). */
const asJson = <T>(x: T): T => JSON.parse(JSON.stringify(x));

let t: TestApp;
let engineer: Client;
let operator: Client;
let importedRunId: number;

beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
  engineer = await signedIn(t.app, 'engineer');
  operator = await signedIn(t.app, 'operator');
  const res = await engineer.post('/api/imports', { locationId: 1, format: 'json', content: sandJson });
  expect(res.status).toBe(201);
  importedRunId = res.body.runId;
}, 120_000);
afterAll(() => t?.stop());

describe('an imported run', () => {
  it('returns its record exactly as imported, and the readings CSV the record writes', async () => {
    const record = await operator.get(`/api/runs/${importedRunId}/record`);
    expect(record.status).toBe(200);
    expect(record.headers['content-disposition']).toContain(`run-${importedRunId}-record.json`);
    expect(record.body).toEqual(sand);
    // The fixture CSV is recordToReadingsCsv of the fixture JSON (tests/fixtures/records/README.md).
    const csv = await operator.get(`/api/runs/${importedRunId}/record.csv`);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    expect(csv.text).toBe(sandCsv);
  });

  it('exports one stage point per stage, as the analysis reduces them', async () => {
    const res = await operator.get(`/api/runs/${importedRunId}/stage-points.csv`);
    expect(res.status).toBe(200);
    const lines = res.text.trim().split('\n');
    // Text cells are quoted, numbers bare (spreadsheet-safe export).
    expect(lines[0]).toBe('"stage","branch","t_min","pressure_kpa","settlement_mm","cut_short","g1","g2","g3","g4"');
    expect(lines).toHaveLength(1 + sand.stages.length);
    const points = analyzeRecord(sand).reduction.points;
    lines.slice(1).forEach((line, i) => {
      const [stage, branch, , pressure, settlement] = line.split(',');
      expect([Number(stage), JSON.parse(branch)]).toEqual([points[i].index, points[i].branch]);
      expect(Number(pressure)).toBeCloseTo(points[i].pressureKpa, 9);
      expect(Number(settlement)).toBeCloseTo(points[i].settlementMm, 9);
    });
  });

  it('answers the same analysis as analyzeRecord on the record, with and without the engineer’s settings', async () => {
    const plain = await operator.get(`/api/runs/${importedRunId}/interpretation`);
    expect(plain.status).toBe(200);
    expect(plain.body).toEqual(asJson(analyzeRecord(sand)));

    const query = 'footingWidthM=3&factorOfSafety=2.5&permissibleSettlementMm=40&ultimateMethod=hyperbolic&evConvention=branchMax';
    const tuned = await operator.get(`/api/runs/${importedRunId}/interpretation?${query}`);
    expect(tuned.status).toBe(200);
    const expected = analyzeRecord(
      { ...sand, footing: { ...sand.footing!, widthM: 3, factorOfSafety: 2.5, permissibleSettlementMm: 40 } },
      { ultimateMethod: 'hyperbolic', evConvention: 'branchMax' },
    );
    expect(tuned.body).toEqual(asJson(expected));
    expect(tuned.body.chosenUltimate).toMatchObject({ applies: true, result: { method: 'hyperbolic', basis: 'engineer' } });
    expect(tuned.body.footing.result.footing.widthM).toBe(3);
  });

  it('rejects settings it cannot use, naming the field', async () => {
    const cases: [string, string][] = [
      ['footingWidthM=wide', 'footingWidthM'],
      ['factorOfSafety=0.5', 'factorOfSafety'],
      ['ultimateMethod=guess', 'ultimateMethod'],
      ['footingWidht=2', ''],
    ];
    for (const [query, field] of cases) {
      const res = await operator.get(`/api/runs/${importedRunId}/interpretation?${query}`);
      expect(res.status, query).toBe(400);
      expect(res.body.error.message, query).toContain(field || 'footingWidht');
    }
  });

  it('answers 404 for a run that does not exist', async () => {
    for (const url of ['/record', '/record.csv', '/stage-points.csv', '/interpretation', '/interpretations']) {
      expect((await operator.get(`/api/runs/999999${url}`)).status, url).toBe(404);
    }
  });
});

describe('saved interpretations', () => {
  it('saves versions 1 and 2, each with an audit entry, and lists them newest first', async () => {
    const auditBefore = await AuditEntry.count({ where: { entity: 'interpretation' } });
    const first = await engineer.post(`/api/runs/${importedRunId}/interpretations`, {
      options: { footingWidthM: 2 },
      chosenMethod: 'hyperbolic',
      reason: 'The curve bends smoothly; the asymptote, extrapolated, read with care.',
    });
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({ runId: importedRunId, version: 1, chosenMethod: 'hyperbolic' });
    expect(first.body.result).toEqual(asJson(analyzeRecord({ ...sand, footing: { ...sand.footing!, widthM: 2 } }, { ultimateMethod: 'hyperbolic' })));
    const second = await engineer.post(`/api/runs/${importedRunId}/interpretations`, {
      chosenMethod: 'logLogIntersection',
      reason: 'Second opinion: look for a break in the log–log plot.',
    });
    expect(second.status).toBe(201);
    expect(second.body.version).toBe(2);

    const entries = await AuditEntry.findAll({ where: { entity: 'interpretation' }, order: [['id', 'ASC']] });
    expect(entries).toHaveLength(auditBefore + 2);
    expect(entries.slice(-2).map((e) => [e.action, e.reason, e.entityId])).toEqual([
      ['saved', 'The curve bends smoothly; the asymptote, extrapolated, read with care.', String(first.body.id)],
      ['saved', 'Second opinion: look for a break in the log–log plot.', String(second.body.id)],
    ]);

    const list = await operator.get(`/api/runs/${importedRunId}/interpretations`);
    expect(list.status).toBe(200);
    expect(list.body.items.map((i: { version: number }) => i.version)).toEqual([2, 1]);
    expect(list.body.items[1]).toMatchObject({ chosenMethod: 'hyperbolic', createdByName: expect.any(String) });
    expect(list.body.items[1].qUltKpa).toBeCloseTo(first.body.result.chosenUltimate.result.qUltKpa, 9);
    // The log–log method finds no break that stands out from reading noise: the version says so and carries no value.
    expect(second.body.result.chosenUltimate.reason).toMatch(/^Log–log two-line intersection: no significant break/);
    expect(list.body.items[0].qUltKpa).toBeNull();
  });

  it('needs a method and a reason', async () => {
    const noReason = await engineer.post(`/api/runs/${importedRunId}/interpretations`, { chosenMethod: 'hyperbolic', reason: '  ' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.field).toBe('reason');
    const noMethod = await engineer.post(`/api/runs/${importedRunId}/interpretations`, { reason: 'because' });
    expect(noMethod.status).toBe(400);
    expect(noMethod.body.error.field).toBe('chosenMethod');
  });

  it('lets operators read but not save, and clients neither', async () => {
    const save = await operator.post(`/api/runs/${importedRunId}/interpretations`, { chosenMethod: 'hyperbolic', reason: 'operator try' });
    expect(save.status).toBe(403);
    expect((await operator.get(`/api/runs/${importedRunId}/interpretations`)).status).toBe(200);
    const client = await signedIn(t.app, 'client');
    for (const url of ['/record', '/record.csv', '/interpretation', '/interpretations']) {
      expect((await client.get(`/api/runs/${importedRunId}${url}`)).status, url).toBe(403);
    }
  });
});

/**
 * A recorded run stored as the run engine stores one: a 450 mm square plate, apparatus 0.60 kN, a jack of
 * 5.0 kN/MPa (an ideal 50 cm² ram), gauge g1 rising as the plate settles (zeroed at 0.00) and g2 falling
 * (zeroed at 10.00, seeing max(0, s − 0.5 mm)), one sample per channel per second.
 */
async function recordedRun(): Promise<number> {
  const plan = await engineer.post('/api/locations/1/plans', {
    name: 'Recorded run for the record test',
    procedureId: 'custom',
    plate: { shape: 'square', sizeMm: 450, thicknessMm: 25 },
    seatingPressureKpa: 7,
    apparatusWeightKn: 0.6,
    loading: { mode: 'list', pressuresKpa: [100, 200] },
    unloadReload: { unloadKpa: [], reload: { mode: 'none' }, repetitionsPerLevel: 1 },
    holdRule: { kind: 'fixed', durationMin: 5 },
    readingSchedule: { kind: 'interval', everyMin: 1 },
    termination: { maxSettlementMm: 50, maxSettlementFractionOfWidth: 0, maxHoldMin: 60 },
    reaction: { kind: 'kentledge', capacityKn: 200, description: '' },
    footing: null,
  });
  expect(plan.status).toBe(201);
  const jack = await Instrument.create({
    kind: 'jack',
    makeModel: 'Ideal 50 cm² ram',
    serialNumber: 'JK-TEST-50',
    unit: 'kN',
    rangeMin: 0,
    rangeMax: 350,
    resolution: null,
    travelMm: null,
    notes: '',
  });
  const today = new Date().toISOString().slice(0, 10);
  await CalibrationRecord.create({
    instrumentId: jack.id,
    calibratedOn: today,
    dueOn: '2099-01-01',
    method: { inputUnit: 'MPa', outputUnit: 'kN', curve: { kind: 'linear', c0: 0, c1: 5 } },
    notes: '',
    createdBy: null,
  });
  const transducer = await Instrument.findOne({ where: { serialNumber: 'PT-5520' } }); // bar in = bar out (demo seed)
  const T = 1_700_000_000_000;
  const runId = await storedRun({
    planId: plan.body.plan.id,
    rigName: 'Record test rig',
    channels: [
      manualGauge('g1', -180, 1, 'Gauge g1'),
      manualGauge('g2', 180, -1, 'Gauge g2'),
      { key: 'p1', role: 'pressure', label: 'Oil', instrumentId: transducer!.id, profileId: 'manual', port: '', gauge: null },
    ],
    jackInstrumentId: jack.id,
    startMs: T,
    durationMs: 450_000,
    events: [
      [0, 'gauges-zeroed', { readings: { g1: 0, g2: 10 } }],
      [1_000, 'run-started', { stageIndex: 0 }],
      [5_000, 'note', { text: 'Overcast, 9 °C, light wind', topic: 'weather' }],
      [10_000, 'target-reached', { stageIndex: 0 }],
      [70_000, 'stage-advanced', { from: 0, to: 1 }],
      [80_000, 'target-reached', { stageIndex: 1 }],
      [200_000, 'gauge-reset', { channel: 'g1', beforeMm: 24.3, afterMm: 1.15, offsetMm: 23.15 }],
      [380_000, 'stage-advanced', { from: 1, to: 2 }],
      [390_000, 'target-reached', { stageIndex: 2 }],
      [396_000, 'note', { text: 'Rain began', topic: 'weather' }],
      [420_000, 'note', { text: 'Rain began', topic: 'weather' }],
      [450_000, 'run-completed', {}],
    ],
  });

  // Settlement s(t), mm: 0.1 after seating, 20 → 24.30 (at the reset, 200 s) → 26.15 (at 379 s) in the first increment, 30 in the second.
  const settlement = (s: number) =>
    s < 10
      ? 0
      : s < 70
        ? 0.1
        : s < 80
          ? 0.1 + ((s - 70) / 10) * 19.9
          : s <= 200
            ? 20 + ((s - 80) / 120) * 4.3
            : s <= 379
              ? 24.3 + ((s - 200) / 179) * 1.85
              : 30;
  // Oil pressure, bar, that gives 7, 100 and 200 kPa: (q·A − 0.60 kN)/5 kN/MPa × 10 bar/MPa (reference §C10: 100 kPa ↔ 39.30 bar).
  const oilBar = (s: number) => (s < 70 ? 1.635 : s < 385 ? 39.3 : 79.8);
  const rows: number[][] = [];
  let seq = 0;
  for (let s = 0; s <= 450; s++) {
    const g1 = s < 200 ? settlement(s) : settlement(s) - 23.15; // the gauge was reset at 200 s (reference §C12)
    const g2 = 10 - Math.max(0, settlement(s) - 0.5);
    for (const [channel, value] of [g1, g2, oilBar(s)].entries())
      rows.push([runId, ++seq, T + s * 1000, channel, Math.round(value * 1000), Math.round(value * 1000), 0]);
  }
  await t.sequelize.query(`INSERT INTO samples (run_id, seq, t_ms, channel, raw, value, status) VALUES ${rows.map(() => '(?,?,?,?,?,?,?)').join(',')}`, {
    replacements: rows.flat(),
  });
  return runId;
}

describe('a recorded run', () => {
  it('becomes a record: stages from the events, settlement from zero, direction and reset offset, pressure through the jack', async () => {
    const runId = await recordedRun();
    const res = await operator.get(`/api/runs/${runId}/record`);
    expect(res.status).toBe(200);
    const record = res.body as TestRecord;
    expect(record).toMatchObject({
      format: 'settlescope-record',
      version: 1,
      plate: { shape: 'square', sizeMm: 450 },
      plan: { procedureId: 'custom', seatingPressureKpa: 7 },
    });
    expect(record.gauges.map((g) => [g.key, g.xMm])).toEqual([
      ['g1', -180],
      ['g2', 180],
    ]);
    expect(record.stages.map((s) => [s.index, s.branch, s.targetKpa])).toEqual([
      [0, 'seating', 7],
      [1, 'loading', 100],
      [2, 'loading', 200],
    ]);

    const [seating, first, second] = record.stages;
    // t = 0 when the target was reached; the reading there holds the values read just before.
    expect(first.readings[0].tMin).toBe(0);
    expect(first.readings[0].gauges.g1).toBeCloseTo(0.1 + 0.9 * 19.9, 3);
    // reference §C10: 450 mm square plate, 39.30 bar on a 50 cm² ram + 0.60 kN apparatus = 100 kPa.
    for (const r of first.readings) expect(r.pressureKpa).toBeCloseTo(100, 2);
    // (1.635 bar → 0.1635 MPa × 5 + 0.6) / 0.2025 m² = 7 kPa; 79.8 bar → 200 kPa (same conversion).
    expect(seating.readings[0].pressureKpa).toBeCloseTo(7, 2);
    expect(second.readings.at(-1)!.pressureKpa).toBeCloseTo(200, 2);

    // One reading per 5 s of run time at most, plus the stage's last: 0, 5, …, 295 s and 299 s.
    const times = first.readings.map((r) => Math.round(r.tMin * 60));
    expect(times).toEqual([...Array.from({ length: 60 }, (_, i) => i * 5), 299]);

    // reference §C12: reset read 24.30 before and 1.15 after → offset 23.15 mm; a later raw 3.00 mm → 26.15 mm.
    const last = first.readings.at(-1)!;
    expect(last.gauges.g1).toBeCloseTo(26.15, 4);
    // g2 falls as the plate settles: settlement = −1 × (reading − 10.00), 0.5 mm less than g1.
    expect(last.gauges.g2).toBeCloseTo(25.65, 4);
    const acrossReset = first.readings.filter((r) => Math.abs(r.tMin * 60 - 200) <= 5).map((r) => r.gauges.g1);
    expect(Math.max(...acrossReset) - Math.min(...acrossReset)).toBeLessThan(0.5); // continuous across the reset
    // Notes about the weather: in the record's events while a stage is held, and every distinct one on its weather line.
    expect(record.events).toEqual([
      expect.objectContaining({ stage: 1, kind: 'gauge-reset', tMin: 2 }),
      { stage: 2, kind: 'weather', tMin: 0.1, text: 'Rain began' },
      { stage: 2, kind: 'weather', tMin: 0.5, text: 'Rain began' },
    ]);
    expect(record.metadata?.weather).toBe('Overcast, 9 °C, light wind; Rain began');

    const analysis = await operator.get(`/api/runs/${runId}/interpretation`);
    expect(analysis.status).toBe(200);
    expect(analysis.body).toEqual(asJson(analyzeRecord(record)));
    expect(analysis.body.reduction.points.map((p: { settlementMm: number }) => p.settlementMm)).toEqual([
      expect.closeTo((0.1 + 0) / 2, 4), // g2 reads max(0, s − 0.5): nothing at seating
      expect.closeTo((26.15 + 25.65) / 2, 4),
      expect.closeTo((30 + 29.5) / 2, 4),
    ]);
  });

  it('round-trips through its readings CSV', async () => {
    const runs = await Run.findAll({ where: { rigId: (await Rig.findOne({ where: { name: 'Record test rig' } }))!.id } });
    const runId = runs[0].id;
    const record = (await operator.get(`/api/runs/${runId}/record`)).body as TestRecord;
    const csv = await operator.get(`/api/runs/${runId}/record.csv`);
    const back = readingsCsvToRecord(csv.text, { gauges: record.gauges, events: record.events, metadata: record.metadata, ground: record.ground });
    expect(back.ok).toBe(true);
    if (back.ok) expect(back.record.stages).toEqual(record.stages);
  });
});
