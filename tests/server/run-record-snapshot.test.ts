/**
 * A run's record is built from what the run measured with, never from today's rig or calibrations: a
 * new calibration of its jack and a changed gauge direction on its rig leave the record — and so the
 * sign-off hash — exactly as it was.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadRigContext, setupSnapshot } from '../../server/acquisition/rig-context';
import { Instrument } from '../../server/models/instrument';
import { Run } from '../../server/models/run';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { TestPlan } from '../../server/models/test-plan';
import { loadReportData } from '../../server/services/report-data';
import { loadRunRecord, rebuildRunRecord } from '../../server/services/run-record';
import { buildStageSequence } from '../../shared/plans/stages';
import type { TestRecord } from '../../shared/records/schema';
import type { RunView } from '../../shared/schemas/runs';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';
import { recordedRun } from '../support/stored-run';

let t: TestApp;
let engineer: Client;
let admin: Client;

beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
  engineer = await signedIn(t.app, 'engineer');
  admin = await signedIn(t.app, 'admin');
});
afterAll(() => t.stop());

/** A new certificate for the demo jack that doubles its force per unit of oil pressure, dated today. */
async function recalibrateJack(): Promise<void> {
  const jack = await Instrument.findOne({ where: { serialNumber: 'JK-50-031' }, include: ['calibrations'] });
  const current = jack!.currentCalibration()!.method;
  const doubled = { ...current, curve: { kind: 'linear' as const, c0: 0, c1: 2 * (current.curve.kind === 'linear' ? current.curve.c1 : 1) }, fallingCurve: undefined };
  const today = new Date().toISOString().slice(0, 10);
  const res = await engineer.post(`/api/instruments/${jack!.id}/calibrations`, { calibratedOn: today, dueOn: `${Number(today.slice(0, 4)) + 1}${today.slice(4)}`, method: doubled, notes: 'recalibrated after the run' });
  expect(res.status).toBe(201);
}

/** Turns gauge g1 of the run's rig round (direction −1). */
async function flipGauge(runId: number): Promise<void> {
  const run = await Run.findByPk(runId);
  const rig = (await admin.get(`/api/rigs/${run!.rigId}`)).body;
  const channels = rig.channels.map((c: { key: string; gauge: object | null }) => (c.key === 'g1' ? { ...c, gauge: { ...c.gauge, direction: -1 } } : c));
  const res = await admin.patch(`/api/rigs/${run!.rigId}`, { channels });
  expect(res.status).toBe(200);
}

const stageReadings = (r: TestRecord) => r.stages.map((s) => s.readings);

describe('a run measured with its own set-up', () => {
  it('keeps its record after a new calibration of its jack and a rig change', async () => {
    const runId = await recordedRun(t.sequelize, engineer, 'Run with a snapshot');
    // As the run manager does when it creates a run: the set-up and calibration versions are kept with it.
    const run = (await Run.findByPk(runId))!;
    const plan = (await TestPlan.findByPk(run.planId))!.toInput();
    await run.update({ state: { ...run.state, setup: setupSnapshot(plan, buildStageSequence(plan), await loadRigContext(run.rigId!)) } });
    const before = await loadRunRecord(runId);
    expect(before.stages.length).toBe(2);
    const instrumentsBefore = (await loadReportData(runId, t.config.dataDir)).instruments;
    expect(instrumentsBefore.find((i) => i.role === 'jack')?.calibrationId).toEqual(expect.any(Number));

    await recalibrateJack();
    await flipGauge(runId);

    expect(await rebuildRunRecord(runId)).toEqual(before);
    expect(await loadRunRecord(runId)).toEqual(before);
    // The report (what a signature seals) names the calibration versions the run was measured with.
    expect((await loadReportData(runId, t.config.dataDir)).instruments).toEqual(instrumentsBefore);
  });

  it('applies a calibration recorded mid-run from its event on, and names the certificate', async () => {
    const serial = async (sn: string) => (await Instrument.findOne({ where: { serialNumber: sn } }))!.id;
    const gauge = (key: string, xMm: number) => ({ key, role: 'gauge', label: key, profileId: 'manual', gauge: { xMm, yMm: 0, direction: 1, travelMm: 50 } });
    const rig = await engineer.post('/api/rigs', {
      name: 'Kit for the mid-run calibration',
      mode: 'manual',
      channels: [gauge('d1', 140), gauge('d2', -140), { key: 'p1', role: 'pressure', label: 'Pressure gauge', instrumentId: await serial('PT-5520'), profileId: 'manual', gauge: null }],
      jackInstrumentId: await serial('JK-50-031'),
    });
    expect(rig.status).toBe(201);
    const plan = await engineer.post('/api/locations/1/plans', {
      name: 'Mid-run calibration plan',
      procedureId: 'custom',
      plate: { shape: 'circular', sizeMm: 300, thicknessMm: 25 },
      seatingPressureKpa: 7,
      apparatusWeightKn: 0.5,
      loading: { mode: 'list', pressuresKpa: [100] },
      unloadReload: { unloadKpa: [], reload: { mode: 'none' }, repetitionsPerLevel: 1 },
      holdRule: { kind: 'fixed', durationMin: 5 },
      readingSchedule: { kind: 'interval', everyMin: 1 },
      termination: { maxSettlementMm: 50, maxSettlementFractionOfWidth: 0, maxHoldMin: 60 },
      reaction: { kind: 'kentledge', capacityKn: 100, description: '' },
      footing: null,
    });
    expect(plan.status).toBe(201);
    const created = (await engineer.post('/api/runs', { planId: plan.body.plan.id, rigId: rig.body.id })).body as RunView;
    const send = async (command: object) => {
      const v = (await engineer.get(`/api/runs/${created.id}`)).body as RunView;
      return engineer.post(`/api/runs/${created.id}/commands`, { version: v.version, command });
    };
    expect((await send({ type: 'manual-reading', gauges: { d1: 12.5, d2: 10 }, pressureKpa: 50 })).status).toBe(200);
    const before = ((await engineer.get(`/api/runs/${created.id}`)).body as RunView).live.pressureKpa!;

    await recalibrateJack(); // the jack now gives twice the force for the same oil pressure
    let view = (await engineer.get(`/api/runs/${created.id}`)).body as RunView;
    for (let i = 0; i < 50 && !view.measurement.events.some((e) => e.kind === 'calibration-applied'); i++) {
      await new Promise((r) => setTimeout(r, 100));
      view = (await engineer.get(`/api/runs/${created.id}`)).body as RunView;
    }
    const applied = view.measurement.events.find((e) => e.kind === 'calibration-applied')!;
    expect(applied.payload).toMatchObject({ instrumentId: await serial('JK-50-031'), serial: 'JK-50-031', calibrationId: expect.any(Number), afterSeq: view.lastSeq });
    expect(view.measurement.setup.jack!.calibrationId).not.toBe(applied.payload.calibrationId); // the snapshot keeps the one it started with
    // The same stored oil pressure now means twice the jack force (q = (F_jack + W)/A, W = 0.5 kN).
    const area = Math.PI * 0.15 ** 2;
    expect(view.live.pressureKpa!).toBeCloseTo((2 * (before * area - 0.5) + 0.5) / area, 6);
    expect((await send({ type: 'stop', reason: 'test over' })).status).toBe(200);
  });

  it('never serves a cached record older than its location or its corrections', async () => {
    const runId = await recordedRun(t.sequelize, engineer, 'Run for the record cache');
    const first = await loadRunRecord(runId);
    expect((await engineer.patch('/api/locations/1', { soilDescription: 'Dense gravelly sand, re-described' })).status).toBe(200);
    expect((await loadRunRecord(runId)).ground?.description).toBe('Dense gravelly sand, re-described');
    // A correction of the last 100 kPa reading of g1 (seq 3 × 59 + 1, see recordedRun) shows at once.
    expect((await engineer.post(`/api/runs/${runId}/corrections`, { seq: 178, action: 'correct-value', valueMm: 1.5, reason: 'Misread' })).status).toBe(201);
    const corrected = await loadRunRecord(runId);
    expect(corrected.stages[1].readings.at(-1)!.gauges.g1).toBeCloseTo(1.5, 6);
    expect(corrected.stages[1].readings.at(-1)!.gauges.g1).not.toBeCloseTo(first.stages[1].readings.at(-1)!.gauges.g1, 6);
  });

  it('measures a run kept before snapshots with the calibrations recorded by its creation, not later ones', async () => {
    const runId = await recordedRun(t.sequelize, engineer, 'Run without a snapshot');
    const before = await rebuildRunRecord(runId);
    await recalibrateJack();
    expect(stageReadings(await rebuildRunRecord(runId))).toEqual(stageReadings(before));
    // Its rig is all it has for gauge directions: turning a gauge round shows in it (why runs keep a snapshot).
    await flipGauge(runId);
    const flipped = await loadRunRecord(runId);
    expect(flipped.stages[1].readings.at(-1)!.gauges.g1).toBeCloseTo(-before.stages[1].readings.at(-1)!.gauges.g1, 6);
  });

  // Last: a signed run locks its location against the changes the tests above make.
  it('still verifies once signed after a new calibration of its jack and a rig change, with no drift', async () => {
    const runId = await recordedRun(t.sequelize, engineer, 'Signed run with a snapshot');
    const run = (await Run.findByPk(runId))!;
    const plan = (await TestPlan.findByPk(run.planId))!.toInput();
    await run.update({ state: { ...run.state, setup: setupSnapshot(plan, buildStageSequence(plan), await loadRigContext(run.rigId!)) } });
    expect((await engineer.post(`/api/runs/${runId}/interpretations`, { chosenMethod: 'largestPressure', reason: 'One increment; its largest pressure.' })).status).toBe(201);
    expect((await engineer.post(`/api/runs/${runId}/signoff/submit`)).status).toBe(200);
    expect((await admin.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' })).status).toBe(200);
    const signed = (await admin.get(`/api/runs/${runId}/verify`)).body;
    expect(signed).toMatchObject({ matches: true, live: { matches: true, changed: [] } });

    await recalibrateJack();
    await flipGauge(runId);

    expect((await admin.get(`/api/runs/${runId}/verify`)).body).toMatchObject({ matches: true, recordedHash: signed.recordedHash, live: { matches: true, hash: signed.live.hash, changed: [] } });
  });
});
