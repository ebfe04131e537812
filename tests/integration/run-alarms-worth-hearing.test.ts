/**
 * Alarms worth hearing over a whole simulated run (the rig's seal leaks and the reaction springs back,
 * its transducer reads with noise): the crew tops up whenever the load-drift alarm stands, as a crew
 * would. No alarm raises or clears more than once a minute of run time, none speaks at the seating or
 * 0 kPa stage where the jack holds no load, and every alarm and event text keeps to its unit's places.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../../server/main';
import type { SimulatorProcess } from '../../server/ops/simulated-rig';
import { alarmEpisodes } from '../../shared/runs/alarm-episodes';
import { describeRunEvent } from '../../shared/runs/event-text';
import type { RunView } from '../../shared/schemas/runs';
import { overPrecise } from '../shared/hold/unit-figures';
import { Client, demoEmail } from '../support/api';
import { startLiveServer } from '../support/live-server';
import { command, simPlan, simulatedRig, waitFor } from '../support/sim-run';

// Slow enough that the run clock's 0.5 s evaluations are 10 s of run time: the board's delays count.
const SPEED = 20;

let server: RunningServer;
let sim: SimulatorProcess;
let rigId: number;
let operator: Client;

beforeAll(async () => {
  server = await startLiveServer();
  ({ sim, rig: { id: rigId } } = await simulatedRig('dense-sand', SPEED, undefined, server.url));
  operator = await new Client(server.url).signIn(demoEmail('operator'));
}, 120_000);
afterAll(async () => {
  await server?.close();
  await sim?.stop();
});

const view = async (runId: number) => (await operator.get(`/api/runs/${runId}`)).body as RunView;

describe('alarms over a simulated run', () => {
  it('raise and clear no alarm more than once a minute, stay silent where the jack holds no load, and speak in rounded figures', async () => {
    const engineer = await new Client(server.url).signIn(demoEmail('engineer'));
    const planId = await simPlan(engineer, 'bearing-granular', {
      loading: { mode: 'list', pressuresKpa: [150, 300] },
      unloadReload: { unloadKpa: [0], reload: { mode: 'none' }, repetitionsPerLevel: 1 },
      holdRule: { kind: 'fixed', durationMin: 20 },
    });
    const runId = ((await operator.post('/api/runs', { planId, rigId })).body as RunView).id;
    await waitFor(operator, runId, (x) => x.live.gauges.every((g) => g.readingMm !== null) && x.live.pressureKpa !== null, 'first readings');
    await command(operator, runId, { type: 'zero' });
    let v = await command(operator, runId, { type: 'start' });
    const stages = v.stages;
    expect(stages.map((s) => s.targetKpa)).toEqual([7, 150, 300, 0]);
    let toppedUp = 0;
    for (let i = 0; i < stages.length; i++) {
      const until = Date.now() + 150_000;
      let lastTopUp = '';
      for (;;) {
        v = await view(runId);
        if (v.phase === 'hold-met' && v.stageIndex === i) break;
        if (Date.now() > until) throw new Error(`stage ${i}: still ${v.phase} at ${v.stageIndex}`);
        // The crew answers a standing drift alarm with a top-up, once per episode.
        const drift = v.alarms.find((a) => a.code === 'load-drift' && a.state !== 'cleared');
        if (drift && lastTopUp !== String(drift.raisedAtMs) && (v.phase === 'holding' || v.phase === 'hold-met')) {
          lastTopUp = String(drift.raisedAtMs);
          await command(operator, runId, { type: 'top-up' });
          toppedUp++;
        }
        await new Promise((r) => setTimeout(r, 250));
      }
      await command(operator, runId, { type: i < stages.length - 1 ? 'advance' : 'finish' });
    }

    // The run's log as every view reads it (run clock ms).
    const events = ((await operator.get(`/api/runs/${runId}/events`)).body as { items: { id: number; kind: string; atMs: number; payload: Record<string, unknown> }[] }).items;
    const episodes = alarmEpisodes(events);
    // The leak really drifted the load past its tolerance, and each top-up brought it back (a run here: five episodes).
    const drifts = episodes.filter((e) => e.key === 'load-drift');
    expect(drifts.length).toBeGreaterThanOrEqual(1);
    expect(toppedUp).toBeGreaterThanOrEqual(1);
    expect(drifts.filter((e) => e.clearedAtMs !== null).length).toBeGreaterThanOrEqual(1);

    // No alarm begins again within a minute of run time of its last beginning, nor clears twice within one.
    for (const key of new Set(episodes.map((e) => e.key))) {
      const list = episodes.filter((e) => e.key === key);
      for (let k = 1; k < list.length; k++) {
        expect(list[k].raisedAtMs - list[k - 1].raisedAtMs, `${key} raised again`).toBeGreaterThanOrEqual(60_000);
        if (list[k].clearedAtMs !== null && list[k - 1].clearedAtMs !== null) expect(list[k].clearedAtMs! - list[k - 1].clearedAtMs!, `${key} cleared again`).toBeGreaterThanOrEqual(60_000);
      }
    }
    // Load drift never stands at the seating stage (7 kPa, under the 7.1 kPa of the apparatus) or at 0 kPa.
    const stageFrom = events.filter((e) => e.kind === 'run-started' || e.kind === 'stage-advanced').map((e) => ({ atMs: e.atMs, index: e.kind === 'run-started' ? 0 : Number(e.payload.to) }));
    const stageAt = (t: number) => stageFrom.findLast((s) => s.atMs <= t)?.index ?? 0;
    for (const e of episodes.filter((x) => x.key === 'load-drift')) expect([1, 2], `drift raised at stage ${stageAt(e.raisedAtMs)}`).toContain(stageAt(e.raisedAtMs));
    for (const e of events) expect(/let some pressure off/.test(String(e.payload?.message ?? '')) && stageAt(e.atMs) === 3).toBe(false);

    // Every event and alarm in words keeps to its unit's places.
    for (const e of events) {
      const { title, detail } = describeRunEvent(e);
      expect(overPrecise(`${title} ${detail}`), `${e.kind}: ${detail}`).toEqual([]);
    }
    for (const a of (await view(runId)).alarms) expect(overPrecise(a.alarm.message), a.alarm.message).toEqual([]);
  }, 600_000);
});
