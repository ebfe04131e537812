/**
 * Calibration limits and instrument alarms through a real run engine (manual mode, so the test types the
 * readings): a jack certified to 50 MPa is never prompted beyond it, a reading beyond it is alarmed and
 * recorded, an overdue instrument is alarmed, and none of these fire on a rig in calibration.
 */
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findProfile } from '../../shared/procedures/profiles';
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
/** The run's standing alarms, once the engine's next evaluations have seen the latest reading. */
async function alarmsAfterTicks(runId: number) {
  await new Promise((r) => setTimeout(r, 1200));
  return (await view(runId)).alarms.map((a) => `${a.code}:${a.subject}`).sort();
}
const INSTRUMENT_CODES = /^(calibration-overdue|outside-calibration|unexplained-jump):/;

async function startRun(gaugeSerial: string, jackId: number, loadKpa: number) {
  const gauge = (key: string, xMm: number, instrumentId: number | null) => ({ key, role: 'gauge', label: key, instrumentId, profileId: 'manual', gauge: { xMm, yMm: 0, direction: 1, travelMm: 25 } });
  const rig = await engineer.post('/api/rigs', {
    name: `Kit ${gaugeSerial} ${jackId}`,
    mode: 'manual',
    channels: [gauge('d1', 280, await serial(gaugeSerial)), gauge('d2', -280, null), { key: 'p1', role: 'pressure', label: 'Pressure gauge', instrumentId: await serial('PT-5520'), profileId: 'manual', gauge: null }],
    jackInstrumentId: jackId,
  });
  expect(rig.status).toBe(201);
  const p = findProfile('custom')!;
  const plan = await engineer.post('/api/locations/1/plans', {
    name: `Plan ${loadKpa}`,
    procedureId: p.id,
    ...p.defaults,
    plate: { shape: 'circular', sizeMm: 600, thicknessMm: 25 },
    apparatusWeightKn: 0,
    loading: { mode: 'list', pressuresKpa: [loadKpa] },
    holdRule: { kind: 'fixed', durationMin: 0.02 },
    reaction: { kind: 'kentledge', capacityKn: 1000, description: '' },
    footing: null,
  });
  expect(plan.status).toBe(201);
  const run = await operator.post('/api/runs', { planId: plan.body.plan.id, rigId: rig.body.id });
  expect(run.status).toBe(201);
  return (run.body as RunView).id;
}

describe('calibration limits and instrument alarms in a run', () => {
  it('refuses to prompt beyond the jack calibration, alarms a reading beyond it, and stays quiet within it', async () => {
    // A jack certified 0–50 MPa, F = 0.35 + 4.92·p kN (invented), rated to 70 MPa.
    const jack = await engineer.post('/api/instruments', { kind: 'jack', makeModel: 'Test ram', serialNumber: 'JK-T50', unit: 'kN', rangeMin: 0, rangeMax: 250, ratedPressureMpa: 70 });
    expect(jack.status).toBe(201);
    const method = { inputUnit: 'MPa', outputUnit: 'kN', curve: { kind: 'linear', c0: 0.35, c1: 4.92 }, range: [0, 50] };
    expect((await engineer.post(`/api/instruments/${jack.body.id}/calibrations`, { calibratedOn: '2026-06-01', dueOn: '2099-06-01', method })).status).toBe(201);
    // 1100 kPa on a 600 mm plate: 311.02 kN → 63.14 MPa on this jack (calc).
    const runId = await startRun('DG-2107', jack.body.id, 1100);

    expect((await send(runId, { type: 'manual-reading', gauges: { d1: 2.0, d2: 2.0 } })).status).toBe(200);
    expect((await send(runId, { type: 'zero' })).status).toBe(200);
    expect((await send(runId, { type: 'start' })).status).toBe(200);
    // Seating at a pressure well inside the calibration: no instrument alarm.
    expect((await send(runId, { type: 'manual-reading', pressureKpa: 10, gauges: { d1: 2.05, d2: 2.05 } })).status).toBe(200);
    expect((await send(runId, { type: 'stage-reached' })).status).toBe(200);
    expect((await alarmsAfterTicks(runId)).filter((a) => INSTRUMENT_CODES.test(a))).toEqual([]);
    expect((await view(runId)).live.pressureProblem).toBeNull();

    let v = await view(runId);
    for (let i = 0; i < 80 && v.phase !== 'hold-met'; i++) {
      await new Promise((r) => setTimeout(r, 500));
      v = await view(runId);
    }
    expect(v.phase).toBe('hold-met');
    // The next stage needs more than the jack calibration covers: no pressure, the reason and what to do,
    // in the unit the crew reads (the pressure channel's bar: 63.14 MPa = 631.4 bar).
    expect(v.prompt).toMatchObject({ targetKpa: 1100, gaugePressure: null, gaugeUnit: 'bar' });
    expect(v.prompt!.problem).toBe('Target 1100 kPa needs 631.4 bar on the jack gauge; the jack calibration is valid to 500 bar. Go to unloading from here, or use a larger jack.');

    // A pressure that reads beyond the calibration (55.3 MPa): alarmed, and the alarm is in the run's record.
    expect((await send(runId, { type: 'manual-reading', pressureKpa: 960, gauges: { d1: 2.4, d2: 2.4 } })).status).toBe(200);
    expect(await alarmsAfterTicks(runId)).toContain('outside-calibration:jack');
    // The plate pressure is still shown, but flagged as the curve extended, never silently.
    expect((await view(runId)).live.pressureProblem).toMatch(/^Oil pressure 55\.\d+ MPa is above the jack calibration \(0–50 MPa\): the plate pressure is extrapolated\.$/);
    const raised = (await t.sequelize.query("SELECT payload FROM run_events WHERE run_id = ? AND kind = 'alarm-raise'", { replacements: [runId], type: QueryTypes.SELECT })) as { payload: unknown }[];
    const messages = raised.map((r) => (typeof r.payload === 'string' ? JSON.parse(r.payload) : r.payload) as { key: string; message: string });
    expect(messages.find((m) => m.key === 'outside-calibration:jack')?.message).toMatch(/Oil pressure on jack JK-T50 reads 55\.\d+ MPa, beyond its calibration \(0–50 MPa\)/);
    expect((await send(runId, { type: 'stop', reason: 'Test over' })).status).toBe(200);
  }, 90_000);

  it('raises calibration-overdue for an overdue gauge on the rig, and not for instruments in calibration', async () => {
    const runId = await startRun('DL-0412', await serial('JK-50-031'), 200);
    expect((await send(runId, { type: 'manual-reading', gauges: { d1: 2.0, d2: 2.0 } })).status).toBe(200);
    expect((await alarmsAfterTicks(runId)).filter((a) => INSTRUMENT_CODES.test(a))).toEqual(['calibration-overdue:DL-0412']);
  }, 60_000);
});
