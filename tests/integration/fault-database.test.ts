/**
 * QUALITY R2: MariaDB stopped for 60 s during a run. Acquisition, hold decisions and the live view go
 * on; the archive catches up when it returns; no sample lost or duplicated; events wait and land.
 */
import { rmSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROOT_DIR, defaultConfig } from '../../server/config';
import { type RunningServer, startServer } from '../../server/main';
import { type MariadbInstance, ensureDatabase, startMariadb } from '../../server/ops/mariadb';
import type { SimulatorProcess } from '../../server/ops/simulated-rig';
import { seedDemo } from '../../server/seed/demo';
import type { RunView } from '../../shared/schemas/runs';
import { Client, demoEmail } from '../support/api';
import { freePort } from '../support/free-port';
import { connectSocket, httpSignIn } from '../support/live-server';
import { command, simPlan, simulatedRig, startedRun, waitFor } from '../support/sim-run';

const OUTAGE_MS = Number(process.env.SSCOPE_R2_OUTAGE_MS ?? 60_000);
const baseDir = path.join(ROOT_DIR, '.data', `test-r2-${process.pid}`);
const port = await freePort();
let db: MariadbInstance;
let server: RunningServer;
let sim: SimulatorProcess;
let rigId: number;
const config = defaultConfig({ port: 0, clientDir: null, dataDir: path.join(baseDir, 'files'), sessionSecret: 'r2', db: { host: '127.0.0.1', port, database: 'sscope_r2', user: 'sscope_r2', password: 'r2-pass' } });

beforeAll(async () => {
  db = await startMariadb({ baseDir, port, bufferPool: '64M' });
  await ensureDatabase(db, 'sscope_r2', 'sscope_r2', 'r2-pass');
  server = await startServer(config);
  await seedDemo();
  ({ sim, rig: { id: rigId } } = await simulatedRig('dense-sand', 20, 'R2 rig', server.url));
}, 120_000);
/** Samples of a run with seq ≤ upTo: count, distinct seqs, lowest and highest (exactly once and contiguous when n = d = hi = upTo, lo = 1). */
async function archived(runId: number, upTo: number) {
  const [row] = (await server.sequelize.query('SELECT COUNT(*) AS n, COUNT(DISTINCT seq) AS d, MIN(seq) AS lo, MAX(seq) AS hi FROM samples WHERE run_id = ? AND seq <= ?', {
    replacements: [runId, upTo],
    type: QueryTypes.SELECT,
  })) as { n: number; d: number; lo: number; hi: number }[];
  return row;
}

afterAll(async () => {
  await server?.close();
  await sim?.stop();
  await db?.stop();
  rmSync(baseDir, { recursive: true, force: true });
});

describe('database outage during a run (QUALITY R2)', () => {
  it('keeps acquiring and deciding while MariaDB is away, then archives everything exactly once', async () => {
    const operator = await new Client(server.url).signIn(demoEmail('operator'));
    const engineer = await new Client(server.url).signIn(demoEmail('engineer'));
    const planId = await simPlan(engineer, 'bearing-granular', {
      loading: { mode: 'list', pressuresKpa: [200, 400] },
      holdRule: { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 5, minHoldMin: 20 },
    });
    const runId = await startedRun(operator, planId, rigId);
    await waitFor(operator, runId, (v) => v.phase === 'hold-met', 'seating');
    await command(operator, runId, { type: 'advance' });
    await waitFor(operator, runId, (v) => v.phase === 'holding' && v.stageIndex === 1, 'holding');

    const { cookie } = await httpSignIn(server.url, demoEmail('engineer'));
    const socket = await connectSocket(server.url, cookie);
    const views: RunView[] = [];
    socket.on('run:view', (v) => views.push(v));
    await socket.emitWithAck('run:join', { runId, afterSeq: 0 });

    // The run's lastSeq counts only samples already on disk in the journal and queued for the archive
    // (never one still waiting for the next flush), so after a drain every one of them is in the table.
    for (let i = 0; i < 20; i++) {
      const upTo = (await operator.get(`/api/runs/${runId}`)).body.lastSeq as number;
      await server.runs.archiver.drain();
      expect(await archived(runId, upTo)).toEqual({ n: upTo, d: upTo, lo: 1, hi: upTo });
    }

    await db.stop();
    const seqAtDown = views.at(-1)?.lastSeq ?? 0;
    await new Promise((r) => setTimeout(r, OUTAGE_MS));
    const during = views.filter((v) => v.lastSeq > seqAtDown);
    const last = views.at(-1)!;
    expect(last.lastSeq).toBeGreaterThan(seqAtDown + 100); // acquisition went on
    expect(last.hold).not.toBeNull(); // so did the hold decisions
    expect(['holding', 'hold-met']).toContain(last.phase);
    expect(during.length).toBeGreaterThan(OUTAGE_MS / 1000); // the live view kept coming
    expect(server.runs.archiver.healthy).toBe(false);
    expect(server.runs.archiver.backlog).toBeGreaterThan(0);

    db = await startMariadb({ baseDir, port, bufferPool: '64M' });
    await server.runs.archiver.drain(); // the backlog of the outage lands (retried until the database answers)
    const upTo = (await operator.get(`/api/runs/${runId}`)).body.lastSeq as number;
    expect(upTo).toBeGreaterThanOrEqual(last.lastSeq);
    await server.runs.archiver.drain();
    expect(server.runs.archiver.healthy).toBe(true);
    expect(await archived(runId, upTo)).toEqual({ n: upTo, d: upTo, lo: 1, hi: upTo });

    // State changes made while the database was away (the hold being met, alarms) are in the record too.
    await command(operator, runId, { type: 'stop', reason: 'end of the outage test' });
    const kinds = (await operator.get(`/api/runs/${runId}/events`)).body.items.map((e: { kind: string }) => e.kind);
    expect(kinds).toContain('run-stopped');
    if (last.phase === 'hold-met') expect(kinds.filter((k: string) => k === 'hold-met')).toHaveLength(2);
    socket.close();
  }, OUTAGE_MS + 120_000);
});
