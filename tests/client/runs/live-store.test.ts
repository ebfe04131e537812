import { describe, expect, it } from 'vitest';
import { linkStatus, STALE_AFTER_MS } from '../../../client/src/features/live/components/link-badge';
import { createLiveStore } from '../../../client/src/features/live/live-store';
import { createColumnBuffer } from '../../../client/src/features/live/utils/column-buffer';
import { aBatch, aRunView } from './run-fixtures';

describe('column buffer', () => {
  it('keeps memory bounded and rows in order while taking far more rows than it holds', () => {
    const buffer = createColumnBuffer({ columns: 2, capacity: 1000 });
    const total = 50_000;
    for (let i = 0; i < total; i++) buffer.push(i * 100, i * 0.001);
    expect(buffer.length).toBeLessThanOrEqual(1000);
    expect(buffer.length).toBeGreaterThan(500);
    const t = buffer.column(0);
    const v = buffer.column(1);
    for (let i = 1; i < t.length; i++) expect(t[i]).toBeGreaterThan(t[i - 1]);
    // Thinned, not truncated: the start of the hold and the newest row are both still there, rows kept in pairs.
    expect(t[0]).toBe(0);
    expect(t[t.length - 1]).toBe((total - 1) * 100);
    for (let i = 0; i < t.length; i++) expect(v[i]).toBeCloseTo(t[i] / 100_000, 9);
    expect(buffer.stride).toBeGreaterThan(1);
    // The columns are views on the one preallocated block: no array grew.
    expect(t.buffer.byteLength).toBe(1000 * 8);
  });

  it('finds the first row at or after a time', () => {
    const buffer = createColumnBuffer({ columns: 1, capacity: 8 });
    for (const t of [10, 20, 30, 40]) buffer.push(t);
    expect(buffer.lowerBound(0, 25)).toBe(2);
    expect(buffer.lowerBound(0, 10)).toBe(0);
    expect(buffer.lowerBound(0, 99)).toBe(4);
  });

  it('refuses a capacity it cannot honour, naming the option', () => {
    expect(() => createColumnBuffer({ columns: 2, capacity: 1 })).toThrow('"capacity"');
    expect(() => createColumnBuffer({ columns: 0 })).toThrow('"columns"');
  });
});

describe('live store', () => {
  it('measures gauge samples by the run’s model once a view covers them', () => {
    const store = createLiveStore();
    store.setView(aRunView({ lastSeq: 1000 }));
    // g1 (up) zeroed at 10.00 mm, g2 (down) at 26.45 mm (the view's measurement parameters).
    store.ingest(
      aBatch([
        [1001, 3_600_100, 0, 13_900], // west reads 13.900 mm → 3.900 mm
        [1002, 3_600_100, 1, 23_300], // east reads 23.300 mm → 3.150 mm
        [1003, 3_600_100, 2, 28_100], // jack pressure: not a settlement
      ]),
    );
    expect(store.series.length).toBe(0); // no view yet says which events apply to seq 1001–1003
    expect(store.lastSeq).toBe(1003);
    store.setView(aRunView({ lastSeq: 1003 }));
    const t = store.series.column(0);
    const mean = store.series.column(1);
    expect(Array.from(t)).toEqual([3_600_100, 3_600_100]);
    expect(mean[0]).toBeCloseTo(3.9, 9); // only the west gauge has a value yet
    expect(mean[1]).toBeCloseTo((3.9 + 3.15) / 2, 9);
  });

  it('applies an event that arrives after its samples only to the samples after it', () => {
    const store = createLiveStore();
    store.setView(aRunView({ lastSeq: 1000 }));
    store.ingest(aBatch([[1001, 3_600_100, 1, 23_300], [1002, 3_600_200, 0, 24_000], [1003, 3_600_300, 0, 1_000]]));
    // West reset between seq 1002 and 1003: 24.00 before, 1.00 after → offset +23.00 mm; the view telling it comes later.
    const base = aRunView().measurement;
    const reset = { kind: 'gauge-reset', atMs: 3_600_250, payload: { channel: 'g1', beforeMm: 24, afterMm: 1, offsetMm: 23, afterSeq: 1002 } };
    store.setView(aRunView({ lastSeq: 1003, measurement: { ...base, events: [...base.events, reset] } }));
    const mean = Array.from(store.series.column(1));
    expect(mean[0]).toBeCloseTo(3.15, 9); // east alone
    expect(mean[1]).toBeCloseTo((14 + 3.15) / 2, 9); // west 24.00 − 10.00, before the reset
    expect(mean[2]).toBeCloseTo((1 - 10 + 23 + 3.15) / 2, 9); // after it: continuous, 14.00 mm
  });

  it('ignores rows it already has, as a backfill after reconnecting overlaps', () => {
    const store = createLiveStore();
    store.setView(aRunView({ lastSeq: 1001 }));
    store.ingest(aBatch([[1001, 3_600_100, 0, 13_900]]));
    const version = store.seriesVersion;
    store.ingest(aBatch([[1001, 3_600_100, 0, 13_900]]));
    expect(store.series.length).toBe(1);
    expect(store.seriesVersion).toBe(version);
  });

  it('never steps back to an older view', () => {
    const store = createLiveStore();
    store.setView(aRunView({ version: 43 }));
    store.setView(aRunView({ version: 42, phase: 'pumping' }));
    expect(store.getSnapshot().view?.version).toBe(43);
  });

  it('draws the server’s end-of-hold points plus the stage now held', () => {
    const store = createLiveStore();
    const live = aRunView().live;
    const ended = { stageIndex: 1, branch: 'loading' as const, targetKpa: 100, pressureKpa: 100.4, settlementMm: 1.5, atMs: 0 };
    store.setView(aRunView({ stageIndex: 2, version: 3, phase: 'pumping', stagePoints: [ended], live: { ...live, pressureKpa: 150, meanSettlementMm: 1.9 } }));
    expect(store.curve()).toEqual([{ stageIndex: 1, pressureKpa: 100.4, settlementMm: 1.5 }]); // pumping: no point yet
    store.setView(aRunView({ stageIndex: 2, version: 4, stagePoints: [ended], live: { ...live, pressureKpa: 199.6, meanSettlementMm: 3.42 } }));
    expect(store.curve()).toEqual([
      { stageIndex: 1, pressureKpa: 100.4, settlementMm: 1.5 },
      { stageIndex: 2, pressureKpa: 199.6, settlementMm: 3.42 },
    ]);
  });
});

describe('link status', () => {
  it('says stale when no view came for more than five seconds, even with the socket up', () => {
    const at = 1_000_000;
    expect(linkStatus({ link: 'live', viewReceivedAtMs: at }, at + STALE_AFTER_MS)).toBe('live');
    expect(linkStatus({ link: 'live', viewReceivedAtMs: at }, at + STALE_AFTER_MS + 1)).toBe('stale');
    expect(linkStatus({ link: 'reconnecting', viewReceivedAtMs: at }, at)).toBe('reconnecting');
  });
});
