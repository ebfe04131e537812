/** The seating stage is held for the plan's seatingHoldMin, not a fixed half minute. */
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
const send = (runId: number, cmd: object) => sendRunCommand(operator, runId, cmd);

/** A typed-in run of a plan with this seating hold, taken to the end of the seating pump. */
async function seatedRun(name: string, seatingHoldMin: number | undefined): Promise<number> {
  const gauge = (key: string, xMm: number) => ({ key, role: 'gauge', label: key, profileId: 'manual', gauge: { xMm, yMm: 0, direction: 1, travelMm: 50 } });
  const rig = await engineer.post('/api/rigs', {
    name,
    mode: 'manual',
    channels: [gauge('d1', 140), { key: 'p1', role: 'pressure', label: 'Pressure gauge', instrumentId: await serial('PT-5520'), profileId: 'manual', gauge: null }],
    jackInstrumentId: await serial('JK-50-031'),
  });
  const p = findProfile('custom')!;
  const { seatingHoldMin: _default, ...defaults } = p.defaults;
  const plan = await engineer.post('/api/locations/1/plans', {
    name,
    procedureId: p.id,
    ...defaults,
    ...(seatingHoldMin === undefined ? {} : { seatingHoldMin }),
    loading: { mode: 'list', pressuresKpa: [100] },
    reaction: { kind: 'kentledge', capacityKn: 100, description: '' },
    footing: null,
  });
  expect(plan.status, JSON.stringify(plan.body)).toBe(201);
  const runId = ((await operator.post('/api/runs', { planId: plan.body.plan.id, rigId: rig.body.id })).body as RunView).id;
  expect((await send(runId, { type: 'manual-reading', gauges: { d1: 12.5 } })).status).toBe(200);
  expect((await send(runId, { type: 'zero' })).status).toBe(200);
  expect((await send(runId, { type: 'start' })).status).toBe(200);
  expect((await send(runId, { type: 'manual-reading', pressureKpa: 7, gauges: { d1: 12.6 } })).status).toBe(200);
  expect((await send(runId, { type: 'stage-reached' })).status).toBe(200);
  return runId;
}

/** The run's view once the engine has judged the hold (it does so every half second). */
async function judged(runId: number): Promise<RunView> {
  let view = (await operator.get(`/api/runs/${runId}`)).body as RunView;
  for (let i = 0; i < 40 && !view.hold; i++) {
    await new Promise((r) => setTimeout(r, 100));
    view = (await operator.get(`/api/runs/${runId}`)).body;
  }
  return view;
}

describe('seating hold', () => {
  it("holds the seating stage for the plan's setting", async () => {
    const runId = await seatedRun('Short seating', 0.02);
    let view = await judged(runId);
    expect(view.hold?.evidence).toMatchObject({ kind: 'fixed', durationMin: 0.02 });
    for (let i = 0; i < 40 && view.phase !== 'hold-met'; i++) {
      await new Promise((r) => setTimeout(r, 250));
      view = (await operator.get(`/api/runs/${runId}`)).body;
    }
    expect(view.phase).toBe('hold-met');
  }, 60_000);

  it('holds half a minute when the plan does not say', async () => {
    const runId = await seatedRun('Default seating', undefined);
    const view = await judged(runId);
    expect(view.hold?.evidence).toMatchObject({ kind: 'fixed', durationMin: 0.5 });
    expect(view.phase).toBe('holding');
  }, 60_000);
});
