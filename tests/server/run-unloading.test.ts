/**
 * The unloading path through a real run engine (manual mode, so the test types the readings): a bearing
 * test stopped at its stop limit records its rebound stages, and a next stage beyond the jack's
 * calibration cannot be applied while going to unloading can.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/models/audit-entry';
import { findProfile } from '../../shared/procedures/profiles';
import type { TestRecord } from '../../shared/records/schema';
import type { RunView } from '../../shared/schemas/runs';
import { type Client, type TestApp, signedIn, startTestApp } from '../support/api';
import { instrumentIdBySerial, sendRunCommand } from '../support/run-commands';

let t: TestApp;
let engineer: Client;
let operator: Client;
beforeAll(async () => {
  t = await startTestApp();
  engineer = await signedIn(t.app, 'engineer');
  operator = await signedIn(t.app, 'operator');
});
afterAll(() => t.stop());

const serial = (s: string) => instrumentIdBySerial(engineer, s);
const view = async (runId: number) => (await operator.get(`/api/runs/${runId}`)).body as RunView;
const send = (runId: number, cmd: object) => sendRunCommand(operator, runId, cmd);
async function ok(runId: number, cmd: object): Promise<RunView> {
  const res = await send(runId, cmd);
  if (res.status !== 200) throw new Error(`${JSON.stringify(cmd)} → ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as RunView;
}
async function holdMet(runId: number, stageIndex: number): Promise<RunView> {
  let v = await view(runId);
  for (let i = 0; i < 80 && !(v.phase === 'hold-met' && v.stageIndex === stageIndex); i++) {
    await new Promise((r) => setTimeout(r, 250));
    v = await view(runId);
  }
  expect(v).toMatchObject({ phase: 'hold-met', stageIndex });
  return v;
}
/** Types the stage's readings (on the way and once there), reports the target reached and waits for the hold. */
async function holdStage(runId: number, stageIndex: number, pressureKpa: number, settlementMm: number): Promise<RunView> {
  await ok(runId, { type: 'manual-reading', pressureKpa, gauges: { d1: 2 + settlementMm, d2: 2 + settlementMm } });
  await ok(runId, { type: 'stage-reached' });
  await ok(runId, { type: 'manual-reading', pressureKpa, gauges: { d1: 2 + settlementMm, d2: 2 + settlementMm } });
  return holdMet(runId, stageIndex);
}

async function manualRun(profileId: string, jackId: number, changes: object) {
  const gauge = (key: string, xMm: number) => ({
    key,
    role: 'gauge',
    label: key,
    instrumentId: null,
    profileId: 'manual',
    gauge: { xMm, yMm: 0, direction: 1, travelMm: 50 },
  });
  const rig = await engineer.post('/api/rigs', {
    name: `Unloading kit ${profileId} ${jackId}`,
    mode: 'manual',
    channels: [
      gauge('d1', 130),
      gauge('d2', -130),
      { key: 'p1', role: 'pressure', label: 'Pressure gauge', instrumentId: await serial('PT-5520'), profileId: 'manual', gauge: null },
    ],
    jackInstrumentId: jackId,
  });
  expect(rig.status).toBe(201);
  const p = findProfile(profileId)!;
  const plan = await engineer.post('/api/locations/1/plans', {
    name: `Unloading ${profileId}`,
    procedureId: p.id,
    ...p.defaults,
    apparatusWeightKn: 0,
    seatingHoldMin: 0.02,
    holdRule: { kind: 'fixed', durationMin: 0.02 },
    reaction: { kind: 'kentledge', capacityKn: 1000, description: '' },
    footing: null,
    ...changes,
  });
  expect(plan.status).toBe(201);
  const run = await operator.post('/api/runs', { planId: plan.body.plan.id, rigId: rig.body.id });
  expect(run.status).toBe(201);
  const runId = (run.body as RunView).id;
  await ok(runId, { type: 'manual-reading', gauges: { d1: 2, d2: 2 } });
  await ok(runId, { type: 'zero' });
  await ok(runId, { type: 'start' });
  return runId;
}

describe('the unloading path in a run', () => {
  it('a bearing test stopped at its 25 mm stop limit (common practice) records its rebound stages', async () => {
    const runId = await manualRun('bearing-granular', await serial('JK-50-031'), {
      plate: { shape: 'circular', sizeMm: 300, thicknessMm: 25 },
      loading: { mode: 'list', pressuresKpa: [100, 200, 300, 400] },
      termination: { maxSettlementMm: 25, maxSettlementFractionOfWidth: 0, maxHoldMin: 60 },
    });
    await holdStage(runId, 0, 7, 0.1);
    for (const [i, q, s] of [
      [1, 100, 6],
      [2, 200, 14],
    ]) {
      await ok(runId, { type: 'advance' });
      await holdStage(runId, i, q, s);
    }
    await ok(runId, { type: 'advance' });
    // Stage 4 at 300 kPa passes the stop limit while held: the alarm says so and the operator goes to unloading.
    await ok(runId, { type: 'manual-reading', pressureKpa: 300, gauges: { d1: 24, d2: 24 } });
    await ok(runId, { type: 'stage-reached' });
    await ok(runId, { type: 'manual-reading', pressureKpa: 300, gauges: { d1: 28, d2: 28 } });
    await new Promise((r) => setTimeout(r, 1200));
    expect((await view(runId)).alarms.map((a) => a.code)).toContain('stop-limit');
    const unloading = await ok(runId, { type: 'unload', reason: 'stop-limit' });
    // Rebound from 300 kPa in three steps to zero (ASTM D1194 practice, from memory).
    expect(unloading.stages.slice(4).map((s) => `${s.branch} ${s.targetKpa}`)).toEqual(['unloading 200', 'unloading 100', 'unloading 0']);
    expect(unloading).toMatchObject({ phase: 'pumping', stageIndex: 4 });
    expect(unloading.prompt).toMatchObject({ stageIndex: 4, branch: 'unloading', targetKpa: 200 });
    await holdStage(runId, 4, 200, 25.6);
    await ok(runId, { type: 'advance' });
    await holdStage(runId, 5, 100, 25.1);
    await ok(runId, { type: 'advance' });
    await holdStage(runId, 6, 0, 24.2);
    expect((await ok(runId, { type: 'finish' })).phase).toBe('completed');
    // Once the closed run's engine has let go, its view is rebuilt from the database: the stages come from its events.
    for (let i = 0; i < 40 && t.runs.engine(runId); i++) await new Promise((r) => setTimeout(r, 250));
    expect(t.runs.engine(runId)).toBeUndefined();
    expect((await view(runId)).stages.map((s) => `${s.branch} ${s.targetKpa}`).slice(4)).toEqual(['unloading 200', 'unloading 100', 'unloading 0']);

    const events = (await operator.get(`/api/runs/${runId}/events`)).body.items as { kind: string; payload: Record<string, unknown> }[];
    const begun = events.find((e) => e.kind === 'unloading-begun');
    expect(begun?.payload).toMatchObject({ reason: 'stop-limit', rule: 'rebound', reachedIndex: 3, maxKpa: 300, fromIndex: 4 });
    // The plan change is audited with its reason: the planned stages it replaced and the derived ones.
    const entries = await AuditEntry.findAll({ where: { entity: 'run', entityId: String(runId), action: 'unloading-begun' } });
    expect(entries).toHaveLength(1);
    expect(entries[0].reason).toBe('settlement stop limit reached');
    const changes = entries[0].changes as { stages: { from: { targetKpa: number }[]; to: { targetKpa: number }[] } };
    expect(changes.stages.from.map((s) => s.targetKpa)).toEqual([400]);
    expect(changes.stages.to.map((s) => s.targetKpa)).toEqual([200, 100, 0]);

    const record = (await operator.get(`/api/runs/${runId}/record`)).body as TestRecord;
    expect(record.stages.map((s) => `${s.branch} ${s.targetKpa}`)).toEqual([
      'seating 7',
      'loading 100',
      'loading 200',
      'loading 300',
      'unloading 200',
      'unloading 100',
      'unloading 0',
    ]);
    // The rebound is measured: settlement falls from the stop limit as the load comes off.
    const last = (i: number) => record.stages[i].readings[record.stages[i].readings.length - 1].gauges.d1;
    expect(last(3)).toBeCloseTo(26, 1);
    expect(last(6)).toBeCloseTo(24.2, 1);
  }, 120_000);

  it('a next stage beyond the jack calibration cannot be applied; going to unloading can', async () => {
    // A jack certified 0–50 MPa, F = 0.35 + 4.92·p kN (invented), rated to 70 MPa.
    const jack = await engineer.post('/api/instruments', {
      kind: 'jack',
      makeModel: 'Test ram',
      serialNumber: 'JK-U50',
      unit: 'kN',
      rangeMin: 0,
      rangeMax: 250,
      ratedPressureMpa: 70,
    });
    expect(jack.status).toBe(201);
    const method = { inputUnit: 'MPa', outputUnit: 'kN', curve: { kind: 'linear', c0: 0.35, c1: 4.92 }, range: [0, 50] };
    expect((await engineer.post(`/api/instruments/${jack.body.id}/calibrations`, { calibratedOn: '2026-06-01', dueOn: '2099-06-01', method })).status).toBe(
      201,
    );
    // 1100 kPa on a 600 mm plate needs 63.14 MPa on this jack (calc); 200 kPa is well inside.
    const runId = await manualRun('custom', jack.body.id, {
      plate: { shape: 'circular', sizeMm: 600, thicknessMm: 25 },
      loading: { mode: 'list', pressuresKpa: [200, 1100] },
    });
    await holdStage(runId, 0, 10, 0.05);
    await ok(runId, { type: 'advance' });
    const met = await holdStage(runId, 1, 200, 1.5);
    expect(met.prompt).toMatchObject({ targetKpa: 1100, gaugePressure: null, refusal: 'above-calibration' });

    const refused = await send(runId, { type: 'advance' });
    expect(refused.status).toBe(400);
    expect(refused.body.error.message).toBe(`${met.prompt!.problem} Go to unloading instead.`);
    expect(await view(runId)).toMatchObject({ phase: 'hold-met', stageIndex: 1, version: met.version });

    const unloading = await ok(runId, { type: 'unload', reason: 'jack-limit' });
    // The custom plan only releases: three rebound steps from 200 kPa (ASTM D1194 practice, from memory).
    expect(unloading.stages.map((s) => `${s.branch} ${s.targetKpa}`)).toEqual(['seating 7', 'loading 200', 'unloading 133.3', 'unloading 66.7', 'unloading 0']);
    expect(unloading.prompt).toMatchObject({ targetKpa: 133.3, problem: null, refusal: null });
    expect(unloading.prompt!.gaugePressure).toBeGreaterThan(0);
    await ok(runId, { type: 'stop', reason: 'Test over' });
  }, 90_000);
});
