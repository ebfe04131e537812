/**
 * A run's record is built from what the run measured with, never from today's rig or calibrations: a
 * new calibration of its jack and a changed gauge direction on its rig leave the record — and so the
 * sign-off hash — exactly as it was.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadRigContext, setupSnapshot } from '../../server/acquisition/rig-context';
import { Instrument } from '../../server/models/instrument';
import { Run } from '../../server/models/run';
import { TestPlan } from '../../server/models/test-plan';
import { loadRunRecord, rebuildRunRecord } from '../../server/services/run-record';
import { buildStageSequence } from '../../shared/plans/stages';
import type { TestRecord } from '../../shared/records/schema';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';
import { recordedRun } from '../support/stored-run';

let t: TestApp;
let engineer: Client;
let admin: Client;

beforeAll(async () => {
  t = await startTestApp();
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

    await recalibrateJack();
    await flipGauge(runId);

    expect(await rebuildRunRecord(runId)).toEqual(before);
    expect(await loadRunRecord(runId)).toEqual(before);
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
});
