import { appendFileSync, mkdtempSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { migrate } from '../../server/db/migrator';
import { createSequelize } from '../../server/db/sequelize';
import { Archiver } from '../../server/runs/archiver';
import { Journal } from '../../server/runs/journal';
import { SAMPLE_STATUS, type SampleRow } from '../../shared/runs/samples';
import { freshDatabase } from '../support/test-database';

const sequelize = createSequelize((await freshDatabase()).db);
beforeAll(() => migrate(sequelize));
afterAll(() => sequelize.close());

const rows = (from: number, n: number): SampleRow[] =>
  Array.from({ length: n }, (_, i) => ({ seq: from + i, tMs: 1_700_000_000_000 + (from + i) * 100, channel: (from + i) % 4, raw: 1000 + i, value: 2000 + i, status: SAMPLE_STATUS.ok }));

const count = async (runId: number) =>
  ((await sequelize.query('SELECT COUNT(*) AS n, COUNT(DISTINCT seq) AS d, MIN(seq) AS lo, MAX(seq) AS hi FROM samples WHERE run_id = ?', { replacements: [runId], type: QueryTypes.SELECT })) as { n: number; d: number; lo: number; hi: number }[])[0];

describe('journal', () => {
  it('keeps rows across segments, survives a torn last line and trims archived segments', () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'journal-'));
    const j = new Journal({ dir, runId: 7, segmentSize: 100 });
    j.append(rows(1, 250));
    appendFileSync(path.join(dir, 'run-7', 'seg-00000002.ndjson'), '[251,17000'); // crash mid-write
    j.close();
    const reopened = new Journal({ dir, runId: 7, segmentSize: 100 });
    expect(reopened.unarchived().map((r) => r.seq)).toEqual(rows(1, 250).map((r) => r.seq));
    reopened.markArchived(199);
    expect(reopened.archivedUpTo).toBe(199);
    expect(readdirSync(path.join(dir, 'run-7')).filter((f) => f.startsWith('seg-'))).toEqual(['seg-00000002.ndjson']);
    expect(new Journal({ dir, runId: 7, segmentSize: 100 }).unarchived().map((r) => r.seq)).toEqual(rows(200, 51).map((r) => r.seq));
  });
});

describe('archiver', () => {
  it('writes chunks through batch() exactly once, even when a chunk is replayed', async () => {
    const archived: number[] = [];
    const a = new Archiver(sequelize, { chunkSize: 5000, onArchived: (_run, seq) => archived.push(seq) });
    a.enqueue(1, rows(1, 12_000));
    await a.drain();
    a.enqueue(1, rows(9_001, 3_000)); // a replay after a crash
    await a.drain();
    expect(await count(1)).toEqual({ n: 12_000, d: 12_000, lo: 1, hi: 12_000 });
    expect(archived).toEqual([5000, 10_000, 12_000, 12_000]);
  });

  it('waits while the table is unreachable and catches up without loss or duplicates', async () => {
    const a = new Archiver(sequelize, { retryMs: 20 });
    await sequelize.query('RENAME TABLE samples TO samples_away');
    try {
      a.enqueue(2, rows(1, 500));
      await vi.waitFor(() => expect(a.healthy).toBe(false), { timeout: 10_000 }); // the first write has failed
      expect(a.backlog).toBe(500);
      a.enqueue(2, rows(501, 500));
    } finally {
      await sequelize.query('RENAME TABLE samples_away TO samples');
    }
    await a.drain();
    expect(a.healthy).toBe(true);
    expect(await count(2)).toEqual({ n: 1000, d: 1000, lo: 1, hi: 1000 });
  });
});
