/**
 * Whole runs of the other procedure families through the real stack (simulated rig on socat
 * pseudo-terminals → device layer → engine → MariaDB): a two-cycle deformation-modulus test with
 * unloading and reloading on compacted fill, and a bearing test on soft clay whose 24-hour holds
 * run at ×1000.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../../server/main';
import type { SimulatorProcess } from '../../server/ops/simulated-rig';
import { findProfile } from '../../shared/procedures/profiles';
import type { RunView } from '../../shared/schemas/runs';
import { Client, demoEmail } from '../support/api';
import { startLiveServer } from '../support/live-server';
import { command, simulatedRig, waitFor } from '../support/sim-run';

let server: RunningServer;
const sims: SimulatorProcess[] = [];
beforeAll(async () => {
  server = await startLiveServer();
});
afterAll(async () => {
  await server?.close();
  for (const s of sims) await s.stop();
});

async function runPlan(plan: object, scenario: string, speed: number, timeoutPerStageMs: number, maintain?: number) {
  const { sim, rig } = await simulatedRig(scenario, speed, `${scenario} rig`, server.url);
  sims.push(sim);
  if (maintain) await fetch(`${sim.controlUrl}/maintain`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ tolerance: maintain }) });
  const engineer = await new Client(server.url).signIn(demoEmail('engineer'));
  const operator = await new Client(server.url).signIn(demoEmail('operator'));
  const created = await engineer.post('/api/locations/1/plans', plan);
  expect(created.status).toBe(201);
  const runId = ((await operator.post('/api/runs', { planId: created.body.plan.id, rigId: rig.id })).body as RunView).id;
  await waitFor(operator, runId, (v) => v.live.gauges.every((g) => g.readingMm !== null), 'first readings');
  await command(operator, runId, { type: 'zero' });
  let view = await command(operator, runId, { type: 'start' });
  const met: RunView[] = [];
  for (let i = 0; i < view.stages.length; i++) {
    view = await waitFor(operator, runId, (v) => v.phase === 'hold-met' && v.stageIndex === i, `hold met at stage ${i}`, timeoutPerStageMs);
    met.push(view);
    if (i < view.stages.length - 1) await command(operator, runId, { type: 'advance' });
  }
  await command(operator, runId, { type: 'finish' });
  return { runId, met, operator };
}

describe('procedure families end to end', () => {
  it('runs a two-cycle modulus test: six stages, three unloading stages, reload to the penultimate', async () => {
    const p = findProfile('modulus-two-cycle')!;
    const { met } = await runPlan(
      { name: 'Two-cycle run', procedureId: p.id, ...p.defaults, apparatusWeightKn: 0.5, reaction: { kind: 'vehicle', capacityKn: 90, description: '' }, footing: null },
      'compacted-fill',
      100,
      60_000,
    );
    expect(met.map((v) => `${v.stages[v.stageIndex].branch[0]}${v.stages[v.stageIndex].targetKpa}`)).toEqual([
      's10', 'l80', 'l160', 'l240', 'l320', 'l400', 'l500', 'u250', 'u125', 'u0', 'r80', 'r160', 'r240', 'r320', 'r400',
    ]);
    // Fixed 2-minute stages (DIN 18134 family, from memory): each met at ≥ 2 min held.
    for (const v of met.slice(1)) expect(v.hold?.evidence.heldMin).toBeGreaterThanOrEqual(2);
    const settlementAt = (i: number) => met[i].live.meanSettlementMm!;
    expect(settlementAt(6)).toBeGreaterThan(settlementAt(1)); // first loading settles
    expect(settlementAt(9)).toBeLessThan(settlementAt(6)); // the plate rebounds on unloading
    expect(settlementAt(9)).toBeGreaterThan(0); // but not all the way: plastic settlement stays
    // Reloading is stiffer than first loading (Ev2 > Ev1): less settlement per kPa from the unloaded state.
    const first = (settlementAt(5) - settlementAt(1)) / (400 - 80);
    const second = (settlementAt(14) - settlementAt(10)) / (400 - 80);
    expect(second).toBeLessThan(first);
  }, 300_000);

  it('runs a bearing test on soft clay with 24-hour holds at ×1000 through the percent-of-ultimate rule', async () => {
    const p = findProfile('bearing-cohesive')!;
    const { met } = await runPlan(
      {
        name: 'Clay run',
        procedureId: p.id,
        ...p.defaults,
        plate: { shape: 'circular', sizeMm: 300, thicknessMm: 25 },
        apparatusWeightKn: 0.5,
        loading: { mode: 'list', pressuresKpa: [60] },
        reaction: { kind: 'kentledge', capacityKn: 100, description: '' },
        footing: null,
      },
      'soft-clay',
      1000,
      150_000,
      0.01,
    );
    for (const v of met.slice(1)) {
      const e = v.hold!.evidence;
      expect(e.kind).toBe('percentOfUltimate');
      // Satisfied either by reaching 75 % of the stage's probable final settlement or by the 24 h cap.
      expect(e.heldMin).toBeGreaterThanOrEqual(60);
      expect(e.heldMin).toBeLessThanOrEqual(24 * 60 + 60);
    }
    expect(met[1].live.meanSettlementMm!).toBeGreaterThan(met[0].live.meanSettlementMm! + 0.05);
  }, 400_000);
});
