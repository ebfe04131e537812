/**
 * A journal that cannot write (its disk full): the run says at once that readings are not being
 * secured, keeps the readings that wait for the disk within a bound, loses nothing that was already
 * secured, and secures the waiting readings once the disk takes them again. The disk-full error is
 * the kernel's own: /dev/full answers every write with ENOSPC.
 */
import { closeSync, mkdtempSync, openSync, readFileSync, rmSync, symlinkSync, unlinkSync, writeSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { RunningServer } from '../../server/main';
import { Journal } from '../../server/runs/journal';
import { SampleSecurer } from '../../server/runs/sample-securer';
import type { SampleRow } from '../../shared/runs/samples';
import type { RunView } from '../../shared/schemas/runs';
import { createLiveRuns } from '../bench/live-runs';
import { startLiveServer } from '../support/live-server';

const range = (from: number, to: number) => Array.from({ length: Math.max(0, to - from + 1) }, (_, i) => from + i);
const rows = (from: number, to: number): SampleRow[] => range(from, to).map((seq) => ({ seq, tMs: seq * 100, channel: seq % 6, raw: seq, value: seq * 10, status: 0 }));
const seqs = (r: SampleRow[]) => r.map((x) => x.seq);

/** Writes to /dev/full: the error a full disk gives. */
function diskFull(): never {
  const fd = openSync('/dev/full', 'a');
  try {
    writeSync(fd, 'x');
  } finally {
    closeSync(fd);
  }
  throw new Error('/dev/full took a write');
}

describe('sample securer on a full disk', () => {
  it('keeps what was secured, holds the rest within its bound, and secures it once the disk has room', () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'sscope-journal-'));
    try {
      const journal = new Journal({ dir, runId: 1, segmentSize: 100 });
      let now = 0;
      const securer = new SampleSecurer(journal, { maxWaiting: 50, retryMs: 1000, now: () => now });
      // Seqs 1–99 fill segment 0, on a disk with room.
      expect(seqs(securer.secure(rows(1, 99)))).toEqual(range(1, 99));
      expect(securer.failure).toBeNull();
      // Segment 1 lies on a full disk.
      const full = path.join(dir, 'run-1', 'seg-00000001.ndjson');
      symlinkSync('/dev/full', full);
      expect(securer.secure(rows(100, 119))).toEqual([]);
      expect(securer.failure).toEqual({ sinceMs: 0, message: expect.stringMatching(/^ENOSPC/), waiting: 20, lost: 0 });
      now = 500; // not tried again before retryMs
      expect(securer.secure(rows(120, 139))).toEqual([]);
      expect(securer.failure).toMatchObject({ waiting: 40, lost: 0 });
      now = 1000; // tried, refused again; 60 waiting > 50: the oldest 10 are given up
      expect(securer.secure(rows(140, 159))).toEqual([]);
      expect(securer.failure).toEqual({ sinceMs: 0, message: expect.stringMatching(/^ENOSPC/), waiting: 50, lost: 10 });
      // What was secured before the disk filled is on disk, whole (read directly: /dev/full reads back endless zeros).
      const segment0 = readFileSync(path.join(dir, 'run-1', 'seg-00000000.ndjson'), 'utf8').split('\n').filter(Boolean);
      expect(segment0.map((line) => JSON.parse(line)[0])).toEqual(range(1, 99));

      unlinkSync(full); // room again
      now = 1500;
      expect(securer.secure([])).toEqual([]); // the next try is at 2000
      now = 2000;
      expect(seqs(securer.secure(rows(160, 160)))).toEqual(range(110, 160));
      expect(securer.failure).toBeNull();
      expect(seqs(journal.unarchived())).toEqual([...range(1, 99), ...range(110, 160)]);
      journal.close();
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('a run whose journal disk fills', () => {
  let server: RunningServer;
  beforeAll(async () => {
    server = await startLiveServer();
  });
  afterAll(() => server?.close());

  it('raises "readings are not being secured" at once, loses no reading, and clears once the disk takes them', async () => {
    const live = await createLiveRuns(server, 1);
    const [runId] = live.runIds;
    const stopFeed = live.feed(10); // 6 channels × 10 Hz
    const view = async () => (await live.operator.get(`/api/runs/${runId}`)).body as RunView;
    await vi.waitFor(async () => expect((await view()).lastSeq).toBeGreaterThan(60), { timeout: 10_000, interval: 50 });

    const journal = (server.runs as unknown as { journals: Map<number, Journal> }).journals.get(runId)!;
    const before = await view();
    const refuse = vi.spyOn(journal, 'append').mockImplementation(diskFull);
    const raised = await vi.waitFor(
      async () => {
        const v = await view();
        const alarm = v.alarms.find((a) => a.code === 'readings-unsecured');
        expect(alarm?.state).toBe('unacknowledged');
        return { v, alarm: alarm! };
      },
      { timeout: 5000, interval: 20 },
    );
    // Measured on the run's own clock: raised within half a second of the disk filling (flushes run every 25 ms).
    expect(raised.alarm.raisedAtMs - before.clock.nowMs).toBeLessThanOrEqual(500);
    expect(raised.alarm.alarm).toMatchObject({ severity: 'critical', message: expect.stringMatching(/^Readings are not being secured: .*ENOSPC/) });
    // Nothing new counts as secured while the disk is full.
    await new Promise((r) => setTimeout(r, 1500));
    const during = await view();
    expect(during.lastSeq).toBe(raised.v.lastSeq);
    expect(during.alarms.find((a) => a.code === 'readings-unsecured')?.alarm.value).toBeGreaterThan(60); // readings waiting

    refuse.mockRestore(); // the disk has room again
    await vi.waitFor(async () => expect((await view()).alarms.some((a) => a.code === 'readings-unsecured')).toBe(false), { timeout: 5000, interval: 50 });
    stopFeed();
    await live.stop();
    const last = (await view()).lastSeq;
    expect(last).toBeGreaterThan(during.lastSeq + 60);
    // Every reading, the secured ones and those that waited, is in the archive exactly once and in order.
    const archived = (await server.sequelize.query('SELECT seq FROM samples WHERE run_id = ? ORDER BY seq', { replacements: [runId], type: QueryTypes.SELECT })) as { seq: number }[];
    expect(archived.map((r) => Number(r.seq))).toEqual(range(1, last));
    const events = (await server.sequelize.query("SELECT kind FROM run_events WHERE run_id = ? AND kind LIKE 'alarm-%' AND JSON_VALUE(payload, '$.key') = 'readings-unsecured'", {
      replacements: [runId],
      type: QueryTypes.SELECT,
    })) as { kind: string }[];
    expect(events.map((e) => e.kind)).toEqual(['alarm-raise', 'alarm-clear']);
  }, 60_000);
});
