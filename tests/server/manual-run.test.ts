/**
 * Manual mode: a rig of dial gauges read by eye. The operator types readings; they become samples
 * like any other, drive the same hold rules and prompts, and bad values are refused naming the field.
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

const send = (runId: number, cmd: object) => sendRunCommand(operator, runId, cmd);

describe('manual mode', () => {
  it('runs a test from typed readings', async () => {
    const gauge = (key: string, xMm: number) => ({ key, role: 'gauge', label: key, profileId: 'manual', gauge: { xMm, yMm: 0, direction: 1, travelMm: 50 } });
    const rig = await engineer.post('/api/rigs', {
      name: 'Dial-gauge kit',
      mode: 'manual',
      channels: [gauge('d1', 140), gauge('d2', -140), { key: 'p1', role: 'pressure', label: 'Pressure gauge', instrumentId: await serial('PT-5520'), profileId: 'manual', gauge: null }],
      jackInstrumentId: await serial('JK-50-031'),
    });
    expect(rig.status).toBe(201);
    const p = findProfile('custom')!;
    const plan = await engineer.post('/api/locations/1/plans', {
      name: 'Manual plan',
      procedureId: p.id,
      ...p.defaults,
      plate: { shape: 'circular', sizeMm: 300, thicknessMm: 25 },
      apparatusWeightKn: 0.5,
      loading: { mode: 'list', pressuresKpa: [100] },
      holdRule: { kind: 'fixed', durationMin: 0.02 },
      reaction: { kind: 'kentledge', capacityKn: 100, description: '' },
      footing: null,
    });
    const runId = ((await operator.post('/api/runs', { planId: plan.body.plan.id, rigId: rig.body.id })).body as RunView).id;

    expect((await send(runId, { type: 'manual-reading', gauges: { d1: 12.5, d2: 10.0 } })).status).toBe(200);
    expect((await send(runId, { type: 'zero' })).status).toBe(200);
    expect((await send(runId, { type: 'start' })).status).toBe(200);
    // Seating, then the 100 kPa stage: pressure typed, target reported reached by the operator.
    expect((await send(runId, { type: 'manual-reading', pressureKpa: 7, gauges: { d1: 12.6, d2: 10.1 } })).status).toBe(200);
    expect((await send(runId, { type: 'stage-reached' })).status).toBe(200);
    let view = (await operator.get(`/api/runs/${runId}`)).body as RunView;
    // Seating is held 30 s before the prompt to go on; a typed test waits for it like the crew.
    for (let i = 0; i < 80 && view.phase !== 'hold-met'; i++) {
      await new Promise((r) => setTimeout(r, 500));
      view = (await operator.get(`/api/runs/${runId}`)).body;
    }
    expect(view.phase).toBe('hold-met');
    expect((await send(runId, { type: 'advance' })).status).toBe(200);
    const typed = await send(runId, { type: 'manual-reading', pressureKpa: 100, gauges: { d1: 13.4, d2: 10.8 } });
    view = typed.body;
    expect(view.live.pressureKpa).toBeCloseTo(100, 1); // typed plate pressure → oil pressure → back through the jack calibration
    expect(view.live.gauges.map((g) => g.settlementMm)).toEqual([expect.closeTo(0.9, 6), expect.closeTo(0.8, 6)]);
    expect(view.live.meanSettlementMm).toBeCloseTo(0.85, 6);

    const bad = await send(runId, { type: 'manual-reading', gauges: { d1: 'twelve' } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('command.gauges.d1');
    const far = await send(runId, { type: 'manual-reading', gauges: { d1: 9999 } });
    expect(far.body.error.field).toBe('command.gauges.d1');

    await t.runs.archiver.drain();
    const rows = (await t.sequelize.query('SELECT channel, value FROM samples WHERE run_id = ? ORDER BY seq', { replacements: [runId], type: QueryTypes.SELECT })) as { channel: number; value: number }[];
    // Three typed readings: two gauges, then two gauges and the pressure twice — nothing more, nothing less.
    expect(rows.map((r) => r.channel)).toEqual([0, 1, 0, 1, 2, 0, 1, 2]);
    expect(rows[5].value).toBe(13_400); // µm, as typed
  }, 60_000);
});
