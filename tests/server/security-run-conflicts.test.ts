/**
 * QUALITY R7: two people acting on one run. On a real run (simulated rig on pseudo-terminals), crossing
 * commands are settled by the server: one wins, the other gets 409 with the reason, and the run's
 * state and events show the winning command once.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../../server/main';
import type { SimulatorProcess } from '../../server/ops/simulated-rig';
import type { RunView } from '../../shared/schemas/runs';
import { Client, demoEmail } from '../support/api';
import { startLiveServer } from '../support/live-server';
import { simPlan, simulatedRig, startedRun, waitFor } from '../support/sim-run';

let server: RunningServer;
let sim: SimulatorProcess;
let rigId: number;
beforeAll(async () => {
  server = await startLiveServer();
  ({ sim, rig: { id: rigId } } = await simulatedRig('dense-sand', 100, 'R7 rig', server.url));
}, 120_000);
afterAll(async () => {
  await server?.close();
  await sim?.stop();
});

const send = (client: Client, runId: number, version: number, command: object) => client.post(`/api/runs/${runId}/commands`, { version, command });
const viewOf = async (client: Client, runId: number) => (await client.get(`/api/runs/${runId}`)).body as RunView;

describe('two people on one run (R7)', () => {
  it('lets one of two crossing commands through and refuses the other with a reason', async () => {
    const operator = await new Client(server.url).signIn(demoEmail('operator'));
    const operatorTablet = await new Client(server.url).signIn(demoEmail('operator')); // the same person at a second station
    const engineer = await new Client(server.url).signIn(demoEmail('engineer'));
    const operatorName = (await operator.get('/api/auth/me')).body.user.name as string;
    const engineerName = (await engineer.get('/api/auth/me')).body.user.name as string;
    // A 24-hour hold after seating: nothing moves on its own while the commands cross.
    const planId = await simPlan(engineer, 'bearing-granular', { loading: { mode: 'list', pressuresKpa: [250, 400] }, holdRule: { kind: 'fixed', durationMin: 24 * 60 } });
    const runId = await startedRun(operator, planId, rigId);
    const seated = await waitFor(operator, runId, (v) => v.phase === 'hold-met' && v.stageIndex === 0, 'seating hold met');
    const v0 = seated.version;

    // The operator (in control) and the engineer both press "advance" on the same view.
    const crossing = await Promise.all([send(operator, runId, v0, { type: 'advance' }), send(engineer, runId, v0, { type: 'advance' })]);
    expect(crossing.map((r) => r.status).sort()).toEqual([200, 409]);
    const refused = crossing.find((r) => r.status === 409)!;
    expect(refused.body.error.code).toBe('command_conflict');
    expect(refused.body.error.message.length).toBeGreaterThan(10);
    expect(crossing[0].status).toBe(200); // the engineer is not in control, so it is the operator's that wins
    expect((crossing[0].body as RunView).version).toBeGreaterThan(v0);
    // Let the pump reach the next target, so the run's version only moves by people's commands.
    const v1 = (await waitFor(operator, runId, (v) => v.phase === 'holding' && v.stageIndex === 1, 'holding at stage 1')).version;

    // The same person at two stations, both quoting one version: exactly one note lands.
    const twin = await Promise.all([send(operator, runId, v1, { type: 'note', text: 'from the rig' }), send(operatorTablet, runId, v1, { type: 'note', text: 'from the tablet' })]);
    expect(twin.map((r) => r.status).sort()).toEqual([200, 409]);
    expect(twin.find((r) => r.status === 409)!.body.error.message).toMatch(/changed.*version/i);

    // A command quoting a version that has since moved on is refused.
    const stale = await send(operator, runId, v0, { type: 'top-up' });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatchObject({ code: 'command_conflict', message: expect.stringMatching(/changed/) });

    // The engineer, not in control, may not drive the run: the refusal names who commands it.
    const current = await viewOf(engineer, runId);
    const driving = await send(engineer, runId, current.version, { type: 'stop', reason: 'engineer stops' });
    expect(driving.status).toBe(409);
    expect(driving.body.error.message).toContain(operatorName);

    // Taking control works; then the operator is the one refused, by name.
    const taken = await send(engineer, runId, current.version, { type: 'take-control' });
    expect(taken.status).toBe(200);
    expect((taken.body as RunView).controller).toMatchObject({ name: engineerName });
    const operatorNow = await send(operator, runId, (taken.body as RunView).version, { type: 'top-up' });
    expect(operatorNow.status).toBe(409);
    expect(operatorNow.body.error.message).toContain(engineerName);

    // One authoritative state: a single stage advance, recorded once.
    const after = await viewOf(operator, runId);
    expect(after.stageIndex).toBe(1);
    const kinds = ((await operator.get(`/api/runs/${runId}/events`)).body.items as { kind: string }[]).map((e) => e.kind);
    expect(kinds.filter((k) => k === 'stage-advanced')).toHaveLength(1);
    expect(kinds.filter((k) => k === 'note')).toHaveLength(1);
    expect(kinds.filter((k) => k === 'control-taken')).toHaveLength(1);
    expect(kinds).not.toContain('run-stopped');

    expect((await send(engineer, runId, after.version, { type: 'stop', reason: 'end of the R7 check' })).status).toBe(200);
  }, 120_000);
});
