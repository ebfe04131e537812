import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Run } from '../../server/models/run';
import { QueryTypes } from 'sequelize';
import { Archiver } from '../../server/runs/archiver';
import { buildRollups } from '../../server/runs/samples-query';
import { SAMPLE_STATUS, type SampleRow } from '../../shared/runs/samples';
import { type Client, type TestApp, signedIn, startTestApp } from '../support/api';

let t: TestApp;
let engineer: Client;
let runId: number;
const T0 = 1_800_000_000_000;
const N = 60_000;

// A run with one gauge channel (0) and one pressure channel (1), 1 sample/s for ~8 h, with a single
// spike and a single dip that a reduced plot must still show.
const value = (i: number, channel: number) => (channel === 0 ? 1000 + Math.floor(i / 10) + (i === 21_337 ? 50_000 : 0) : 200_000 - (i === 25_001 ? 150_000 : 0));

beforeAll(async () => {
  t = await startTestApp();
  engineer = await signedIn(t.app, 'engineer');
  runId = (await Run.create({ planId: 1, rigId: null, status: 'completed', state: {} as never, startedAt: null, finishedAt: null, createdBy: null })).id;
  const rows: SampleRow[] = [];
  for (let i = 0; i < N; i++) rows.push({ seq: i + 1, tMs: T0 + Math.floor(i / 2) * 1000, channel: i % 2, raw: null, value: value(Math.floor(i / 2), i % 2), status: SAMPLE_STATUS.ok });
  const a = new Archiver(t.sequelize);
  a.enqueue(runId, rows);
  await a.drain();
});
afterAll(() => t.stop());

describe('samples summary (QUALITY P3 reduction)', () => {
  it('sends at most the asked buckets per series and keeps every extreme', async () => {
    const res = await engineer.get(`/api/runs/${runId}/samples/summary?buckets=500`);
    expect(res.status).toBe(200);
    const [gauge, pressure] = res.body.channels;
    expect(gauge.t.length).toBeLessThanOrEqual(500);
    expect(Math.max(...gauge.max)).toBe(value(21_337, 0));
    expect(Math.min(...pressure.min)).toBe(value(25_001, 1));
    expect(Math.max(...pressure.max)).toBe(200_000);
    // The reduced series brackets the raw one: every bucket's min ≤ max, and times rise.
    expect(gauge.min.every((m: number, i: number) => m <= gauge.max[i])).toBe(true);
    expect(gauge.t).toEqual([...gauge.t].sort((a: number, b: number) => a - b));
  });

  it('zooms into a span', async () => {
    const from = T0 + 3600_000;
    const res = await engineer.get(`/api/runs/${runId}/samples/summary?fromMs=${from}&toMs=${from + 3600_000}&buckets=100`);
    expect(res.body.bucketMs).toBe(36_000);
    expect(res.body.channels[0].t[0]).toBeGreaterThanOrEqual(from);
    expect(res.body.channels[0].t.length).toBe(100);
  });

  it('serves wide buckets from the per-minute rollups built at close, with the same extremes', async () => {
    const before = (await engineer.get(`/api/runs/${runId}/samples/summary?buckets=40`)).body;
    await buildRollups(t.sequelize, runId);
    await buildRollups(t.sequelize, runId); // idempotent
    const [{ n }] = (await t.sequelize.query('SELECT COUNT(*) AS n FROM sample_rollups WHERE run_id = ?', { replacements: [runId], type: QueryTypes.SELECT })) as { n: number }[];
    expect(Number(n)).toBe(2 * Math.ceil(30_000 / 60)); // two channels × 500 minutes
    const after = (await engineer.get(`/api/runs/${runId}/samples/summary?buckets=40`)).body;
    // 30,000 s over 40 buckets = 750 s per bucket: rollup minutes straddle bucket edges, so buckets may shift by one
    // minute, but every extreme of the run is still there.
    for (const c of [0, 1]) {
      expect(Math.max(...after.channels[c].max)).toBe(Math.max(...before.channels[c].max));
      expect(Math.min(...after.channels[c].min)).toBe(Math.min(...before.channels[c].min));
    }
    expect(Math.max(...after.channels[0].max)).toBe(value(21_337, 0));
    expect(Math.min(...after.channels[1].min)).toBe(value(25_001, 1));
  });

  it('names the field of a bad span', async () => {
    const res = await engineer.get(`/api/runs/${runId}/samples/summary?fromMs=10&toMs=5`);
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('toMs');
  });
});
