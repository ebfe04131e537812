/**
 * Importing tests recorded elsewhere (QUALITY R6): the fixture records import as completed runs with a
 * 'custom' plan; bad input answers 400 naming the field or line and leaves nothing behind.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyzeRecord } from '../../shared/interpretation/analyze-record';
import type { TestRecord } from '../../shared/records/schema';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';
import { tableCounts } from '../support/table-counts';

const FIXTURES = path.join(import.meta.dirname, '../fixtures/records');
const fixture = (name: string) => readFileSync(path.join(FIXTURES, name), 'utf8');
const sandCsv = fixture('sand-bearing-450-square.csv');
const asJson = <T>(x: T): T => JSON.parse(JSON.stringify(x));

let t: TestApp;
let engineer: Client;

beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
  engineer = await signedIn(t.app, 'engineer');
}, 120_000);
afterAll(() => t?.stop());

const TABLES = ['test_plans', 'runs', 'run_events', 'run_records', 'audit_log'];
const counts = () => tableCounts(t.sequelize, TABLES);

describe('importing the fixture records', () => {
  it.each(['sand-bearing-450-square.json', 'modulus-two-cycle-300.json'])('imports %s as JSON content: a custom plan, a completed run, an "imported" event', async (name) => {
    const text = fixture(name);
    const record = JSON.parse(text) as TestRecord;
    const res = await engineer.post('/api/imports', { locationId: 1, format: 'json', content: text, planName: `Imported ${name}` });
    expect(res.status).toBe(201);
    const readings = record.stages.reduce((n, s) => n + s.readings.length, 0);
    expect(res.body).toMatchObject({ planName: `Imported ${name}`, stages: record.stages.length, readings });

    const plan = await engineer.get(`/api/plans/${res.body.planId}`);
    expect(plan.body.plan).toMatchObject({ procedureId: 'custom', locationId: 1, plate: { shape: record.plate.shape, sizeMm: record.plate.sizeMm } });
    const runs = (await engineer.get('/api/runs')).body.items as { id: number; phase: string; planId: number }[];
    expect(runs.find((r) => r.id === res.body.runId)).toMatchObject({ phase: 'completed', planId: res.body.planId });
    const events = (await engineer.get(`/api/runs/${res.body.runId}/events`)).body.items;
    expect(events).toEqual([expect.objectContaining({ kind: 'imported', payload: expect.objectContaining({ by: expect.objectContaining({ name: expect.any(String) }), format: 'json' }) })]);
    expect((await engineer.get(`/api/runs/${res.body.runId}/record`)).body).toEqual(record);
  });

  it('imports the readings CSV as an uploaded file, giving the record the CSV describes', async () => {
    const res = await engineer.agent.post('/api/imports').set('x-csrf-token', engineer.token).field('locationId', '1').attach('file', Buffer.from(sandCsv), 'tp-03.csv');
    expect(res.status).toBe(201);
    const record = (await engineer.get(`/api/runs/${res.body.runId}/record`)).body as TestRecord;
    // The CSV is recordToReadingsCsv of the JSON fixture: the same stages; the footing's design values are not in the CSV.
    const json = JSON.parse(fixture('sand-bearing-450-square.json')) as TestRecord;
    expect(record.stages).toEqual(json.stages);
    expect(record.footing).toEqual({ shape: 'square', widthM: 1.5, soilBehaviour: 'cohesionless' });
    const analysis = await engineer.get(`/api/runs/${res.body.runId}/interpretation`);
    expect(analysis.body).toEqual(asJson(analyzeRecord(record)));
  });
});

describe('bad imports leave nothing behind', () => {
  it('names the line of a bad CSV row and creates nothing', async () => {
    const lines = sandCsv.split('\n');
    const header = lines.findIndex((l) => l.startsWith('"stage",'));
    const bad = header + 3; // 0-based index of the third reading row
    lines[bad] = lines[bad].replace(/,[^,]*$/, ',abc');
    const before = await counts();
    const res = await engineer.post('/api/imports', { locationId: 1, format: 'csv', content: lines.join('\n') });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_record');
    expect(res.body.issues).toEqual([expect.objectContaining({ line: bad + 1, column: 'g4' })]);
    expect(res.body.error.message).toContain(`line ${bad + 1}`);
    expect(await counts()).toEqual(before);
  });

  it('names the field of a bad JSON record', async () => {
    const record = JSON.parse(fixture('modulus-two-cycle-300.json'));
    record.stages[1].readings[0].pressureKpa = -5;
    record.plate.sizeMm = 'big';
    const before = await counts();
    const res = await engineer.post('/api/imports', { locationId: 1, format: 'json', content: JSON.stringify(record) });
    expect(res.status).toBe(400);
    const fields = res.body.issues.map((i: { field: string }) => i.field);
    expect(fields).toEqual(expect.arrayContaining(['plate.sizeMm', 'stages.1.readings.0.pressureKpa']));
    expect(res.body.error.field).toBe(res.body.issues[0].field);
    expect(await counts()).toEqual(before);
  });

  it('rejects text that is not JSON, an unknown location, a missing format and a wrong file type', async () => {
    const before = await counts();
    const notJson = await engineer.post('/api/imports', { locationId: 1, format: 'json', content: '{"format": ' });
    expect(notJson.status).toBe(400);
    expect(notJson.body.issues[0].message).toMatch(/^not valid JSON/);
    const noLocation = await engineer.post('/api/imports', { locationId: 999999, format: 'csv', content: sandCsv });
    expect([noLocation.status, noLocation.body.error.field]).toEqual([400, 'locationId']);
    const noFormat = await engineer.post('/api/imports', { locationId: 1, content: sandCsv });
    expect([noFormat.status, noFormat.body.error.field]).toEqual([400, 'format']);
    const png = await engineer.agent.post('/api/imports').set('x-csrf-token', engineer.token).field('locationId', '1').attach('file', Buffer.from('x'), 'photo.png');
    expect([png.status, png.body.error.field]).toEqual([400, 'file']);
    expect(await counts()).toEqual(before);
  });

  it('rejects an upload over 8 MB and a JSON body over the API’s 2 MB limit', async () => {
    const before = await counts();
    const big = Buffer.alloc(8 * 1024 * 1024 + 1, 'x');
    const upload = await engineer.agent.post('/api/imports').set('x-csrf-token', engineer.token).field('locationId', '1').attach('file', big, 'huge.csv');
    expect(upload.status).toBe(413);
    expect(upload.body.error.field).toBe('file');
    const body = await engineer.post('/api/imports', { locationId: 1, format: 'csv', content: 'x'.repeat(3 * 1024 * 1024) });
    expect(body.status).toBe(413);
    expect(await counts()).toEqual(before);
  });

  it('is for engineers and admins only', async () => {
    const operator = await signedIn(t.app, 'operator');
    expect((await operator.post('/api/imports', { locationId: 1, format: 'csv', content: sandCsv })).status).toBe(403);
  });
});
