/**
 * What a run holds is let go: archived journal segments are deleted while the run goes on; a closed
 * run's engine leaves the run manager and its journal is deleted once the database holds it; and
 * stopping the server with the database down ends within its deadline, leaving the rest in the
 * journal for the next start to archive.
 */
import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createApp } from '../../server/app';
import type { ServerConfig } from '../../server/config';
import { initModels } from '../../server/db/models';
import { createSequelize } from '../../server/db/sequelize';
import { RunManager } from '../../server/runs/run-manager';
import type { DomainEventMap } from '../../server/services/domain-events';
import { findProfile } from '../../shared/procedures/profiles';
import type { RunView } from '../../shared/schemas/runs';
import { Client, demoEmail } from '../support/api';
import { instrumentIdBySerial } from '../support/run-commands';
import { seededDatabase } from '../support/test-database';

/** Small segments, so a few typed readings span several files. */
const SEGMENT = 2;

let config: ServerConfig;
let sequelize: Sequelize;
let runs: RunManager;
let operator: Client;
let engineer: Client;

function startManager(db: Sequelize): RunManager {
  return new RunManager({ sequelize: db, dataDir: config.dataDir, pushView: () => {}, pushSamples: () => {}, journalSegmentSize: SEGMENT });
}

beforeAll(async () => {
  config = await seededDatabase();
  sequelize = createSequelize(config.db);
  initModels(sequelize);
  runs = startManager(sequelize);
  const { app } = createApp(sequelize, config, { runs });
  engineer = await new Client(app).signIn(demoEmail('engineer'));
  operator = await new Client(app).signIn(demoEmail('operator'));
});
afterAll(async () => {
  await runs.stopAll({ deadlineMs: 1000 });
  await sequelize.close().catch(() => {});
});

const journalDir = (runId: number) => path.join(config.dataDir, 'journal', `run-${runId}`);
const segments = (runId: number) => (existsSync(journalDir(runId)) ? readdirSync(journalDir(runId)).filter((f) => f.startsWith('seg-')).sort() : []);
const seqsInDb = async (db: Sequelize, runId: number) =>
  ((await db.query('SELECT seq FROM samples WHERE run_id = ? ORDER BY seq', { replacements: [runId], type: QueryTypes.SELECT })) as { seq: number }[]).map((r) => Number(r.seq));

async function send(runId: number, cmd: object): Promise<RunView> {
  const v = (await operator.get(`/api/runs/${runId}`)).body as RunView;
  const res = await operator.post(`/api/runs/${runId}/commands`, { version: v.version, command: cmd });
  if (res.status !== 200) throw new Error(`${JSON.stringify(cmd)} → ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}

/** A started run on a fresh manual rig (dial gauges read by eye: no ports, readings typed). */
async function manualRun(name: string): Promise<number> {
  const serial = (s: string) => instrumentIdBySerial(engineer, s);
  const gauge = (key: string, xMm: number) => ({ key, role: 'gauge', label: key, profileId: 'manual', gauge: { xMm, yMm: 0, direction: 1, travelMm: 50 } });
  const rig = await engineer.post('/api/rigs', {
    name,
    mode: 'manual',
    channels: [gauge('d1', 140), gauge('d2', -140), { key: 'p1', role: 'pressure', label: 'Pressure gauge', instrumentId: await serial('PT-5520'), profileId: 'manual', gauge: null }],
    jackInstrumentId: await serial('JK-50-031'),
  });
  expect(rig.status).toBe(201);
  const p = findProfile('custom')!;
  const plan = await engineer.post('/api/locations/1/plans', {
    name: `${name} plan`,
    procedureId: p.id,
    ...p.defaults,
    plate: { shape: 'circular', sizeMm: 300, thicknessMm: 25 },
    apparatusWeightKn: 0.5,
    loading: { mode: 'list', pressuresKpa: [100] },
    reaction: { kind: 'kentledge', capacityKn: 100, description: '' },
    footing: null,
  });
  expect(plan.status).toBe(201);
  const created = await operator.post('/api/runs', { planId: plan.body.plan.id, rigId: rig.body.id });
  expect(created.status).toBe(201);
  const runId = (created.body as RunView).id;
  await send(runId, { type: 'manual-reading', gauges: { d1: 12.5, d2: 10.0 } });
  await send(runId, { type: 'zero' });
  await send(runId, { type: 'start' });
  return runId;
}

describe('a run lets go of what it holds', () => {
  it('deletes archived segments as it goes, and once closed leaves the manager and deletes its journal', async () => {
    const closed: DomainEventMap['run-closed'][] = [];
    const off = runs.events.on('run-closed', (e) => void closed.push(e));
    const runId = await manualRun('Released rig');
    for (let i = 1; i <= 4; i++) await send(runId, { type: 'manual-reading', gauges: { d1: 12.5 + i / 10, d2: 10 + i / 10 } });
    await runs.archiver.drain();
    const view = (await operator.get(`/api/runs/${runId}`)).body as RunView;
    // 2 + 4 × 2 typed gauge readings: seqs 1…10 in segments of 2 (seq / 2 → files 0…5).
    expect(view.lastSeq).toBe(10);
    expect(await seqsInDb(sequelize, runId)).toEqual(Array.from({ length: 10 }, (_, i) => i + 1));
    // Only the segment still being written is left; every fully archived one is gone.
    expect(segments(runId)).toEqual(['seg-00000005.ndjson']);
    expect(runs.engine(runId)).toBeDefined();

    const stopped = await send(runId, { type: 'stop', reason: 'test of what a closed run keeps' });
    expect(stopped.phase).toBe('stopped');
    await vi.waitFor(() => expect(runs.engine(runId)).toBeUndefined(), { timeout: 15_000, interval: 50 });
    expect(runs.openJournals).not.toContain(runId);
    expect(existsSync(journalDir(runId))).toBe(false);
    // Published once for the subscribers (mail notice, rollups), and its samples all still in the database.
    await runs.events.settled();
    expect(closed).toEqual([{ runId, phase: 'stopped', reason: 'test of what a closed run keeps' }]);
    expect(await seqsInDb(sequelize, runId)).toHaveLength(10);
    // The closed run's console view is still there, from the database, without a journal of its own.
    const again = await operator.get(`/api/runs/${runId}`);
    expect(again.status).toBe(200);
    expect((again.body as RunView).phase).toBe('stopped');
    expect(existsSync(journalDir(runId))).toBe(false);
    // A closed run still takes notes (a weather line remembered afterwards) with its engine released.
    await send(runId, { type: 'note', text: 'Overcast all afternoon', topic: 'weather' });
    const notes = (await operator.get(`/api/runs/${runId}/events`)).body.items.filter((e: { kind: string }) => e.kind === 'note');
    expect(notes.map((e: { payload: { text: string } }) => e.payload.text)).toEqual(['Overcast all afternoon']);
    expect(existsSync(journalDir(runId))).toBe(false);
    off();
  }, 60_000);

  it('stops within its deadline with the database down; the next start archives what was left in the journal', async () => {
    const runId = await manualRun('Outage rig');
    await runs.archiver.drain();
    const before = await seqsInDb(sequelize, runId);
    expect(before).toEqual([1, 2]);
    // The database goes away (this server's connections are closed: every query and every archive
    // attempt now fails); readings typed at the rig still reach the engine and its journal.
    await sequelize.close();
    const engine = runs.engine(runId)!;
    const actor = { ...engine.state.controller!, role: 'operator' as const }; // the operator who started it
    for (let i = 1; i <= 3; i++) await engine.command({ type: 'manual-reading', gauges: { d1: 13 + i / 10, d2: 11 + i / 10 } }, actor, engine.state.version);
    expect(engine.view().lastSeq).toBe(8);
    expect(runs.archiver.backlog).toBe(6);

    const deadlineMs = 1500;
    const t0 = performance.now();
    await runs.stopAll({ deadlineMs });
    const took = performance.now() - t0;
    expect(took).toBeLessThan(deadlineMs + 500); // a little slack for a busy machine, never the archiver's retries
    // The unarchived readings are on disk for the next start.
    expect(segments(runId).length).toBeGreaterThan(0);

    // The next start, with the database back.
    sequelize = createSequelize(config.db);
    initModels(sequelize);
    runs = startManager(sequelize);
    expect(await runs.resumeAll()).toBeGreaterThanOrEqual(1);
    await runs.archiver.drain();
    expect(await seqsInDb(sequelize, runId)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
  }, 60_000);

  it('a run closed while its samples wait for the archive: the next start archives them and deletes its journal', async () => {
    // The run manager on a connection of its own, closed below: the archive cannot write, while the
    // commands (the models' connection) still reach the database and the run closes properly.
    await runs.stopAll({ deadlineMs: 1000 });
    const archiveDb = createSequelize(config.db);
    runs = startManager(archiveDb);
    const { app } = createApp(sequelize, config, { runs });
    operator = await new Client(app).signIn(demoEmail('operator'));
    engineer = await new Client(app).signIn(demoEmail('engineer'));
    const runId = await manualRun('Closed outage rig');
    await runs.archiver.drain();
    await archiveDb.close();
    for (let i = 1; i <= 2; i++) await send(runId, { type: 'manual-reading', gauges: { d1: 14 + i / 10, d2: 12 + i / 10 } });
    expect((await send(runId, { type: 'stop', reason: 'closed during an archive outage' })).phase).toBe('stopped');
    await vi.waitFor(() => expect(runs.engine(runId)).toBeUndefined(), { timeout: 15_000, interval: 50 });
    // Released, but its journal stays: the database has not got its last readings.
    expect(runs.openJournals).toContain(runId);
    expect(await seqsInDb(sequelize, runId)).toEqual([1, 2]);
    const t0 = performance.now();
    await runs.stopAll({ deadlineMs: 1000 });
    expect(performance.now() - t0).toBeLessThan(1500);
    expect(segments(runId).length).toBeGreaterThan(0);

    runs = startManager(sequelize);
    await runs.resumeAll(); // the run is closed: nothing to resume, but its journal is archived
    await runs.archiver.drain();
    expect(await seqsInDb(sequelize, runId)).toEqual([1, 2, 3, 4, 5, 6]);
    expect(existsSync(journalDir(runId))).toBe(false);
    expect(runs.openJournals).not.toContain(runId);
  }, 60_000);
});
