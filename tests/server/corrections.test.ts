/**
 * Corrections of archived readings (QUALITY "nothing recorded is ever lost", ISO/IEC 17025 §7.5:
 * amendments traceable with the original kept): each correction is its own audited row, the sample
 * row never changes, and the run's record — hence the interpretation — reads the corrected view.
 */
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/models/audit-entry';
import { Signoff } from '../../server/models/signoff';
import type { TestRecord } from '../../shared/records/schema';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';
import { RECORDED_RUN_START_MS, recordedRun, recordedSeq } from '../support/stored-run';

let t: TestApp;
let engineer: Client;
let runId: number;
const T = RECORDED_RUN_START_MS;
const seqOf = recordedSeq;

const sampleRow = async (seq: number) =>
  (
    (await t.sequelize.query('SELECT raw, value, status FROM samples WHERE run_id = ? AND seq = ?', {
      replacements: [runId, seq],
      type: QueryTypes.SELECT,
    })) as unknown[]
  )[0];
const lastReading = async () => ((await engineer.get(`/api/runs/${runId}/record`)).body as TestRecord).stages.find((s) => s.index === 1)!.readings.at(-1)!;

beforeAll(async () => {
  t = await startTestApp();
  engineer = await signedIn(t.app, 'engineer');
  runId = await recordedRun(t.sequelize, engineer, 'Run for the corrections test');
});
afterAll(() => t.stop());

describe('corrections of archived readings', () => {
  // The 100 kPa stage ends at 60 s (exclusive): its last reading holds the samples of second 59.
  const g1Last = seqOf(59, 0);
  const g2Last = seqOf(59, 1);

  it('keeps the sample, stores the correction beside it with the original, and the record uses the corrected value', async () => {
    const before = await lastReading();
    expect(before.gauges).toEqual({ g1: expect.closeTo(1.29, 6), g2: expect.closeTo(1.29, 6) });
    const original = await sampleRow(g1Last);

    const res = await engineer.post(`/api/runs/${runId}/corrections`, {
      seq: g1Last,
      action: 'correct-value',
      valueMm: 1.35,
      reason: 'Typed 1.29 for 1.35 (field sheet)',
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      seq: g1Last,
      channel: 0,
      action: 'correct-value',
      originalValue: 1290,
      newValue: 1350,
      reason: 'Typed 1.29 for 1.35 (field sheet)',
      userName: expect.any(String),
    });
    expect(Date.parse(res.body.at)).toBeGreaterThan(Date.now() - 60_000);

    expect(await sampleRow(g1Last)).toEqual(original); // the samples table is never updated
    const audit = await AuditEntry.findOne({ where: { entity: 'sample', entityId: `${runId}:${g1Last}` } });
    expect(audit?.changes).toEqual({ value: { from: 1290, to: 1350 } });
    expect(audit?.reason).toBe('Typed 1.29 for 1.35 (field sheet)');

    const after = await lastReading();
    expect(after.gauges.g1).toBeCloseTo(1.35, 6);
    expect(after.gauges.g2).toBeCloseTo(1.29, 6);
  });

  it('leaves a reading marked faulty out of the record (the previous reading stands)', async () => {
    const res = await engineer.post(`/api/runs/${runId}/corrections`, { seq: g2Last, action: 'mark-faulty', reason: 'Gauge knocked' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ originalValue: 1290, newValue: null });
    expect((await lastReading()).gauges.g2).toBeCloseTo(1.28, 6);
    const interpretation = await engineer.get(`/api/runs/${runId}/interpretation`);
    expect(interpretation.status).toBe(200);
    // Mean of the corrected g1 (1.35) and the last good g2 (1.28).
    expect(interpretation.body.reduction.points.at(-1).settlementMm).toBeCloseTo((1.35 + 1.28) / 2, 4);
  });

  it('lists the corrections and shows them with the readings at a time', async () => {
    const list = await engineer.get(`/api/runs/${runId}/corrections`);
    expect(list.body.items.map((c: { seq: number; action: string }) => [c.seq, c.action])).toEqual([
      [g1Last, 'correct-value'],
      [g2Last, 'mark-faulty'],
    ]);
    const at = await engineer.get(`/api/runs/${runId}/readings-at?tMs=${T + 59_500}`);
    expect(at.body.items).toEqual([
      { seq: g1Last, tMs: T + 59_000, channel: 0, value: 1290, status: 0, correctedValue: 1350, faulty: false },
      { seq: g2Last, tMs: T + 59_000, channel: 1, value: 1290, status: 0, correctedValue: null, faulty: true },
      { seq: seqOf(59, 2), tMs: T + 59_000, channel: 2, value: 30_000, status: 0 },
    ]);
  });

  it('refuses bad input naming the field, an unknown seq with 404, and a new value for a pressure reading', async () => {
    const post = (body: object) => engineer.post(`/api/runs/${runId}/corrections`, body);
    expect((await post({ seq: g1Last, action: 'correct-value', reason: 'missing value' })).body.error.field).toBe('valueMm');
    expect((await post({ seq: g1Last, action: 'mark-faulty', reason: '' })).body.error.field).toBe('reason');
    expect((await post({ seq: 'x', action: 'mark-faulty', reason: 'bad seq' })).body.error.field).toBe('seq');
    expect((await post({ seq: g1Last, action: 'erase', reason: 'no such action' })).body.error.field).toBe('action');
    const unknown = await post({ seq: 999_999, action: 'mark-faulty', reason: 'no such sample' });
    expect(unknown.status).toBe(404);
    const pressure = await post({ seq: seqOf(40, 2), action: 'correct-value', valueMm: 1, reason: 'not a gauge' });
    expect(pressure.status).toBe(400);
    expect(pressure.body.error.field).toBe('seq');
  });

  it('lets only engineers and admins correct; operators may read; clients may not', async () => {
    const body = { seq: seqOf(40, 0), action: 'mark-faulty', reason: 'try' };
    const operator = await signedIn(t.app, 'operator');
    expect((await operator.post(`/api/runs/${runId}/corrections`, body)).status).toBe(403);
    expect((await operator.get(`/api/runs/${runId}/corrections`)).status).toBe(200);
    const client = await signedIn(t.app, 'client');
    expect((await client.post(`/api/runs/${runId}/corrections`, body)).status).toBe(403);
    expect((await client.get(`/api/runs/${runId}/corrections`)).status).toBe(403);
    const admin = await signedIn(t.app, 'admin');
    expect((await admin.post(`/api/runs/${runId}/corrections`, body)).status).toBe(201);
  });

  it('refuses corrections of a signed run with 409', async () => {
    await Signoff.create({ runId, state: 'signed', revision: 1, interpretationVersion: null, submittedBy: null, submittedAt: null, revisions: [] });
    const res = await engineer.post(`/api/runs/${runId}/corrections`, { seq: seqOf(41, 0), action: 'mark-faulty', reason: 'after signing' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('run_signed');
    expect((await engineer.get(`/api/runs/${runId}/corrections`)).body.items).toHaveLength(3);
    // Even a note (it would join the record's events or its weather line).
    const view = await engineer.get(`/api/runs/${runId}`);
    expect(view.status).toBe(200);
    const note = await engineer.post(`/api/runs/${runId}/commands`, { version: view.body.version, command: { type: 'note', text: 'Sunny', topic: 'weather' } });
    expect(note.status).toBe(409);
    expect(note.body.error.code).toBe('run_signed');
  });
});
