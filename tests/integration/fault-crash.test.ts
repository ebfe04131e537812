/**
 * QUALITY R1: the server is killed (SIGKILL) mid-hold and restarted. The run resumes in the same
 * stage with its hold clock; every journaled sample is in the database exactly once; the outage is
 * a marked gap.
 */
import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { initModels } from '../../server/db/models';
import { createSequelize } from '../../server/db/sequelize';
import type { SimulatorProcess } from '../../server/ops/simulated-rig';
import { Client, demoEmail } from '../support/api';
import { freePort } from '../support/free-port';
import { spawnServer } from '../support/server-process';
import { command, simPlan, simulatedRig, startedRun, waitFor } from '../support/sim-run';
import { seededDatabase } from '../support/test-database';

const config = await seededDatabase();
const sequelize = createSequelize(config.db);
let sim: SimulatorProcess;
let rigId: number;
const PORT = await freePort();

beforeAll(async () => {
  initModels(sequelize);
  ({ sim, rig: { id: rigId } } = await simulatedRig('dense-sand', 100, 'Crash rig', `http://127.0.0.1:${PORT}`));
}, 120_000);
afterAll(async () => {
  await sim?.stop();
  await sequelize.close();
});

function journaledSeqs(runId: number): number[] {
  const dir = path.join(config.dataDir, 'journal', `run-${runId}`);
  return readdirSync(dir)
    .filter((f) => f.startsWith('seg-'))
    .flatMap((f) => readFileSync(path.join(dir, f), 'utf8').split('\n'))
    .flatMap((line) => {
      try {
        return [JSON.parse(line)[0] as number];
      } catch {
        return [];
      }
    });
}

const dbSeqs = async (runId: number) => ((await sequelize.query('SELECT seq FROM samples WHERE run_id = ? ORDER BY seq', { replacements: [runId], type: QueryTypes.SELECT })) as { seq: number }[]).map((r) => Number(r.seq));

describe('server killed mid-hold (QUALITY R1)', () => {
  it('resumes the run where it was and loses no journaled sample', async () => {
    let server = await spawnServer(config, PORT);
    let client = await new Client(server.url).signIn(demoEmail('operator'));
    const engineer = await new Client(server.url).signIn(demoEmail('engineer'));
    const planId = await simPlan(engineer, 'bearing-granular', {
      loading: { mode: 'list', pressuresKpa: [200, 400] },
      holdRule: { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 10, minHoldMin: 600 }, // a long hold to be killed in
    });
    const runId = await startedRun(client, planId, rigId);
    await waitFor(client, runId, (v) => v.phase === 'hold-met' && v.stageIndex === 0, 'seating');
    await command(client, runId, { type: 'advance' });
    const before = await waitFor(client, runId, (v) => v.phase === 'holding' && v.stageIndex === 1 && v.lastSeq > 200, 'holding stage 1');
    await waitFor(client, runId, (v) => v.lastSeq > before.lastSeq + 30, 'more samples in the hold'); // killed mid-hold, not at its start

    await server.kill('SIGKILL');
    const journaled = journaledSeqs(runId);
    expect(journaled.length).toBeGreaterThan(0);

    server = await spawnServer(config, PORT);
    client = await new Client(server.url).signIn(demoEmail('operator'));
    const after = await waitFor(client, runId, (v) => v.lastSeq > Math.max(...journaled) + 20, 'samples after the restart');
    expect(after.stageIndex).toBe(1);
    expect(after.phase).toBe('holding');
    expect(after.holdStartedAtMs).toBe(before.holdStartedAtMs); // the hold clock goes on

    await command(client, runId, { type: 'stop', reason: 'end of the crash test' });
    await server.kill('SIGTERM');
    const stored = await dbSeqs(runId);
    expect(new Set(stored).size).toBe(stored.length); // no duplicates
    const missing = journaled.filter((s) => !stored.includes(s));
    expect(missing).toEqual([]);
    expect(stored).toEqual(Array.from({ length: stored.length }, (_, i) => i + 1)); // contiguous: nothing lost or renumbered

    const kinds = (await sequelize.query('SELECT kind, payload FROM run_events WHERE run_id = ? ORDER BY id', { replacements: [runId], type: QueryTypes.SELECT })) as { kind: string; payload: string | object }[];
    const outage = kinds.find((k) => k.kind === 'outage');
    if (!outage) throw new Error(`no outage event among ${kinds.map((k) => k.kind).join(', ')}`);
    const gap = typeof outage.payload === 'string' ? JSON.parse(outage.payload) : outage.payload;
    expect(gap.toMs).toBeGreaterThan(gap.fromMs);
  });
});
