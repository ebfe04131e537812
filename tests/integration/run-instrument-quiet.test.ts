/**
 * The instrument alarms (calibration overdue, reading outside its calibrated range, unexplained gauge
 * jump) stay quiet through a clean simulated run: instruments in calibration, readings inside their
 * certificates, gauges moving only as the plate settles. Their firing is tested in shared and in
 * tests/server/run-instrument-alarms.test.ts.
 */
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../../server/main';
import type { SimulatorProcess } from '../../server/ops/simulated-rig';
import type { RunView } from '../../shared/schemas/runs';
import { Client, demoEmail } from '../support/api';
import { startLiveServer } from '../support/live-server';
import { command, simPlan, simulatedRig, waitFor } from '../support/sim-run';

let server: RunningServer;
let sim: SimulatorProcess;
let rigId: number;
let operator: Client;

beforeAll(async () => {
  server = await startLiveServer();
  ({ sim, rig: { id: rigId } } = await simulatedRig('dense-sand', 200, undefined, server.url));
  operator = await new Client(server.url).signIn(demoEmail('operator'));
}, 120_000);
afterAll(async () => {
  await server?.close();
  await sim?.stop();
});

describe('instrument alarms in a clean simulated run', () => {
  it('raise nothing from zero to finish', async () => {
    const engineer = await new Client(server.url).signIn(demoEmail('engineer'));
    const planId = await simPlan(engineer, 'bearing-granular', {
      loading: { mode: 'list', pressuresKpa: [150, 300] },
      holdRule: { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 5, minHoldMin: 10 },
    });
    const runId = ((await operator.post('/api/runs', { planId, rigId })).body as RunView).id;
    await waitFor(operator, runId, (v) => v.live.gauges.every((g) => g.readingMm !== null) && v.live.pressureKpa !== null, 'first readings');
    await command(operator, runId, { type: 'zero' });
    let view = await command(operator, runId, { type: 'start' });
    for (let i = 0; i < view.stages.length; i++) {
      view = await waitFor(operator, runId, (v) => v.phase === 'hold-met' && v.stageIndex === i, `hold met at stage ${i}`, 90_000);
      // Every prompt the run gave was a pressure to pump to, not a refusal.
      if (view.prompt) expect(view.prompt.problem).toBeNull();
      await command(operator, runId, { type: i < view.stages.length - 1 ? 'advance' : 'finish' });
    }
    const raised = (await server.sequelize.query("SELECT payload FROM run_events WHERE run_id = ? AND kind = 'alarm-raise'", { replacements: [runId], type: QueryTypes.SELECT })) as { payload: unknown }[];
    const keys = raised.map((r) => ((typeof r.payload === 'string' ? JSON.parse(r.payload) : r.payload) as { key: string }).key);
    expect(keys.filter((k) => /^(calibration-overdue|outside-calibration|unexplained-jump):/.test(k))).toEqual([]);
  }, 240_000);
});
