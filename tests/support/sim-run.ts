import { mkdirSync, mkdtempSync } from 'node:fs';
import path from 'node:path';
import { ROOT_DIR } from '../../server/config';
import { startAutoOperator } from '../../server/ops/auto-operator';
import { type SimulatorProcess, startSimulator, upsertDemoRig } from '../../server/ops/simulated-rig';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { findProfile } from '../../shared/procedures/profiles';
import type { RunView } from '../../shared/schemas/runs';
import { type Client, demoEmail } from './api';

/**
 * A simulated rig on its own pseudo-terminals (a private folder per test file) and its rig record.
 * With `serverUrl`, the automatic operator stands at it: it follows the rig's runs through that
 * server's API and pumps to each prompted target through the rig's control port (stopped with the rig).
 */
export async function simulatedRig(scenario: string, speed: number, name = 'Test rig (simulated)', serverUrl?: string) {
  mkdirSync(path.join(ROOT_DIR, '.data'), { recursive: true }); // a fresh clone has none yet
  const dir = path.relative(ROOT_DIR, mkdtempSync(path.join(ROOT_DIR, '.data', 'test-pty-')));
  const sim: SimulatorProcess = await startSimulator({ scenario, speed, gauges: 3, controlPort: 0, dir, name: 't' });
  const rig = await upsertDemoRig(sim, name);
  if (serverUrl) {
    const operator = startAutoOperator({ serverUrl, controlUrl: sim.controlUrl, rigId: rig.id, email: demoEmail('operator'), password: DEMO_PASSWORD });
    const stopRig = sim.stop;
    sim.stop = async () => {
      await operator.stop();
      await stopRig();
    };
  }
  return { sim, rig };
}

/** Sends a command quoting the current version; returns the new view or throws with the server's reason. */
export async function command(client: Client, runId: number, cmd: object): Promise<RunView> {
  const current = (await client.get(`/api/runs/${runId}`)).body as RunView;
  const res = await client.post(`/api/runs/${runId}/commands`, { version: current.version, command: cmd });
  if (res.status !== 200) throw new Error(`${JSON.stringify(cmd)} → ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}

/** Polls the run until `ok(view)` or the time runs out. */
export async function waitFor(client: Client, runId: number, ok: (v: RunView) => boolean, what: string, timeoutMs = 60_000): Promise<RunView> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const view = (await client.get(`/api/runs/${runId}`)).body as RunView;
    if (ok(view)) return view;
    if (Date.now() > until) throw new Error(`timed out waiting for ${what}; run is ${view.phase} at stage ${view.stageIndex}: ${JSON.stringify({ live: view.live, hold: view.hold?.verdict, alarms: view.alarms.map((a) => a.alarm.message) })}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

/**
 * Writes a test plan for the simulated rig's 300 mm plate (its grounds are quoted for that plate)
 * from a procedure profile's defaults, with the given changes; returns the plan id.
 */
export async function simPlan(engineer: Client, profileId: string, changes: object, locationId = 1): Promise<number> {
  const profile = findProfile(profileId);
  if (!profile) throw new Error(`unknown profile ${profileId}`);
  const res = await engineer.post(`/api/locations/${locationId}/plans`, {
    name: `${profileId} test plan`,
    procedureId: profile.id,
    ...profile.defaults,
    plate: { shape: 'circular', sizeMm: 300, thicknessMm: 25 },
    apparatusWeightKn: 0.5,
    reaction: { kind: 'kentledge', capacityKn: 100, description: '' },
    footing: null,
    ...changes,
  });
  if (res.status !== 201) throw new Error(`plan refused: ${JSON.stringify(res.body)}`);
  return res.body.plan.id;
}

/** Creates a run of a plan on a rig, waits for readings, zeroes, and starts the seating stage. */
export async function startedRun(operator: Client, planId: number, rigId: number): Promise<number> {
  const created = await operator.post('/api/runs', { planId, rigId });
  if (created.status !== 201) throw new Error(`run refused: ${JSON.stringify(created.body)}`);
  const runId = (created.body as RunView).id;
  await waitFor(operator, runId, (v) => v.live.gauges.every((g) => g.readingMm !== null), 'first readings');
  await command(operator, runId, { type: 'zero' });
  await command(operator, runId, { type: 'start' });
  return runId;
}
