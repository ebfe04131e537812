/**
 * Going to unloading in a whole simulated run (simulated rig on socat pseudo-terminals → device layer →
 * engine → MariaDB): a two-cycle modulus test on a 600 mm plate whose settlement limit is reached at
 * stage 4 unloads from that stage, reloads to stage 3, and its Ev1/Ev2 come from the stages run.
 *
 * The simulated ground is quoted for a 300 mm plate, so the test pumps the jack as a crew would: to the
 * gauge pressure the console prompts (the same jack force on the plan's 600 mm plate), never by plate
 * pressure; the rig's own control link is pointed nowhere so that only these pumps drive the jack.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../../server/main';
import type { SimulatorProcess } from '../../server/ops/simulated-rig';
import { convertPressure, isPressureUnit } from '../../shared/calibration/units';
import { analyzeRecord } from '../../shared/interpretation/analyze-record';
import { defaultsForPlate } from '../../shared/procedures/plate-rules';
import { findProfile } from '../../shared/procedures/profiles';
import type { TestRecord } from '../../shared/records/schema';
import type { RunView } from '../../shared/schemas/runs';
import { Client, demoEmail } from '../support/api';
import { startLiveServer } from '../support/live-server';
import { command, simulatedRig, waitFor } from '../support/sim-run';

let server: RunningServer;
let sim: SimulatorProcess | undefined;
beforeAll(async () => {
  server = await startLiveServer();
});
afterAll(async () => {
  await server?.close();
  await sim?.stop();
});

/** Pumps (or releases) the simulated jack to what the console prompts for the stage being pumped to. */
async function pumpAsPrompted(controlUrl: string, view: RunView): Promise<void> {
  const prompt = view.prompt;
  expect(prompt?.stageIndex).toBe(view.stageIndex);
  // A zero target is prompted as releasing the jack fully (the apparatus alone stays on the plate).
  if (prompt?.gaugePressure !== 0) expect(prompt?.problem ?? null).toBeNull();
  const unit = prompt!.gaugeUnit;
  if (!isPressureUnit(unit)) throw new Error(`prompt unit ${unit}`);
  const gaugeMpa = convertPressure(prompt!.gaugePressure!, unit, 'MPa');
  const res = await fetch(`${controlUrl}/${gaugeMpa === 0 ? 'release' : 'pump'}`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(gaugeMpa === 0 ? {} : { gaugeMpa }),
  });
  expect(res.ok).toBe(true);
}

const label = (v: RunView) => `${v.stages[v.stageIndex].branch[0]}${v.stages[v.stageIndex].targetKpa}`;

describe('going to unloading in a simulated run', () => {
  it('a two-cycle test on a 600 mm plate reaching its settlement limit at stage 4 unloads from it and reloads to stage 3', async () => {
    const started = await simulatedRig('compacted-fill', 100, 'Unloading rig');
    sim = started.sim;
    const controlUrl = sim.controlUrl;
    await started.rig.update({ simulator: { controlUrl: 'http://127.0.0.1:9', speed: sim.speed } });

    const engineer = await new Client(server.url).signIn(demoEmail('engineer'));
    const operator = await new Client(server.url).signIn(demoEmail('operator'));
    const profile = findProfile('modulus-two-cycle')!;
    // The 600 mm plate's stages (40 … 250 kPa; DIN 18134 family, from memory). The stop limit is set for this
    // ground (3.5 mm, reached at 160 kPa and not at 120 kPa), so that it is reached at loading stage 4.
    const defaults = defaultsForPlate(profile, 600).defaults;
    const created = await engineer.post('/api/locations/1/plans', {
      name: 'Two-cycle run, stopped early',
      procedureId: profile.id,
      ...defaults,
      termination: { ...defaults.termination, maxSettlementMm: 3.5 },
      apparatusWeightKn: 0.5,
      reaction: { kind: 'vehicle', capacityKn: 200, description: '' },
      footing: null,
    });
    expect(created.status).toBe(201);
    const runId = ((await operator.post('/api/runs', { planId: created.body.plan.id, rigId: started.rig.id })).body as RunView).id;
    await waitFor(operator, runId, (v) => v.live.gauges.every((g) => g.readingMm !== null), 'first readings');
    await command(operator, runId, { type: 'zero' });
    let view = await command(operator, runId, { type: 'start' });
    await pumpAsPrompted(controlUrl, view);
    const met: string[] = [];
    for (let i = 0; i < 4; i++) {
      view = await waitFor(operator, runId, (v) => v.phase === 'hold-met' && v.stageIndex === i, `hold met at stage ${i}`, 60_000);
      expect(view.alarms.map((a) => a.code)).not.toContain('stop-limit');
      met.push(label(view));
      view = await command(operator, runId, { type: 'advance' });
      await pumpAsPrompted(controlUrl, view);
    }
    // Loading stage 4 (160 kPa): the settlement limit is reached while it is held.
    view = await waitFor(
      operator,
      runId,
      (v) => v.stageIndex === 4 && v.phase !== 'pumping' && v.alarms.some((a) => a.code === 'stop-limit' && a.state !== 'cleared'),
      'the stop limit at stage 4',
      60_000,
    );
    expect(view.live.meanSettlementMm).toBeGreaterThanOrEqual(3.5);
    met.push(label(view));
    view = await command(operator, runId, { type: 'unload', reason: 'stop-limit' });
    // 50 / 25 / 0 % of 160 kPa, then the first-loading stages below it (DIN 18134 family, from memory).
    expect(view.stages.map((s) => `${s.branch[0]}${s.targetKpa}`)).toEqual(['s10', 'l40', 'l80', 'l120', 'l160', 'u80', 'u40', 'u0', 'r40', 'r80', 'r120']);
    await pumpAsPrompted(controlUrl, view);
    for (let i = 5; i < view.stages.length; i++) {
      view = await waitFor(operator, runId, (v) => v.phase === 'hold-met' && v.stageIndex === i, `hold met at stage ${i}`, 60_000);
      met.push(label(view));
      if (i === view.stages.length - 1) break;
      view = await command(operator, runId, { type: 'advance' });
      await pumpAsPrompted(controlUrl, view);
    }
    expect((await command(operator, runId, { type: 'finish' })).phase).toBe('completed');
    expect(met).toEqual(['s10', 'l40', 'l80', 'l120', 'l160', 'u80', 'u40', 'u0', 'r40', 'r80', 'r120']);

    const events = (await operator.get(`/api/runs/${runId}/events`)).body.items as { kind: string; userId: number | null; payload: Record<string, unknown> }[];
    expect(events.find((e) => e.kind === 'unloading-begun')).toMatchObject({
      userId: expect.any(Number),
      payload: { reason: 'stop-limit', rule: 'modulus', reachedIndex: 4, maxKpa: 160 },
    });

    // The record carries the stages run, and Ev1/Ev2 come from them: σ0max is the 160 kPa reached, not the planned 250.
    const record = (await operator.get(`/api/runs/${runId}/record`)).body as TestRecord;
    expect(record.stages.map((s) => `${s.branch[0]}${s.targetKpa}`)).toEqual(['s10', 'l40', 'l80', 'l120', 'l160', 'u80', 'u40', 'u0', 'r40', 'r80', 'r120']);
    const moduli = analyzeRecord(record).deformationModuli;
    if (!moduli.applies) throw new Error(`no Ev: ${moduli.reason}`);
    expect(moduli.result.ev1.sigma0maxMnM2).toBeCloseTo(0.16, 2);
    expect(moduli.result.ev1.evMnM2).toBeGreaterThan(0);
    // Reloading is stiffer than first loading on compacted fill (Ev2/Ev1 ≈ 2–3 there: common practice).
    expect(moduli.result.ratio).toBeGreaterThan(1.5);
  }, 300_000);
});
