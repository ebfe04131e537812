import { act, renderHook } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { createLiveStore } from '../../../client/src/features/live/live-store';
import { useLiveRun } from '../../../client/src/features/live/use-live-run';
import { fakeSocket } from './fake-socket';
import { aBatch, aRunView } from './run-fixtures';

afterEach(() => {
  vi.useRealTimers();
});

/** A live store that also records the seqs handed to it, in the order they came. */
function recordingStore() {
  const store = createLiveStore();
  const handed: number[] = [];
  const ingest = store.ingest;
  store.ingest = (batch) => {
    handed.push(...batch.seq);
    ingest(batch);
  };
  return { store, handed };
}

describe('live link', () => {
  it('lets the server choose the start of a first join, and joins again after a drop continuing after the last sample handed on', () => {
    const fake = fakeSocket();
    const { store, handed } = recordingStore();
    const socketFor = () => fake.socket;
    const { unmount } = renderHook(() => useLiveRun(7, store, socketFor));
    expect(store.getSnapshot().link).toBe('connecting');

    act(() => fake.connect());
    expect(fake.emitted.at(-1)).toEqual({ event: 'run:join', payload: { runId: 7 } });
    expect(store.getSnapshot().link).toBe('live');

    act(() => {
      fake.deliver('run:view', aRunView());
      // A live batch overtakes the backfill: held back until the rows before it arrive.
      fake.deliver('run:samples', aBatch([[1003, 3_600_300, 0, 14_000]]));
      expect(handed).toEqual([]);
      fake.deliver('run:samples', {
        ...aBatch([
          [1001, 3_600_100, 0, 13_900],
          [1002, 3_600_200, 1, 23_300],
        ]),
        span: { after: 1000, through: 1002 },
      });
      // Another run's traffic on the same socket is not ours.
      fake.deliver('run:samples', aBatch([[5000, 1, 0, 1]], 8));
    });
    expect(handed).toEqual([1001, 1002, 1003]);

    act(() => fake.drop());
    expect(store.getSnapshot().link).toBe('reconnecting');
    act(() => fake.connect());
    expect(fake.emitted.at(-1)).toEqual({ event: 'run:join', payload: { runId: 7, afterSeq: 1003 } });

    unmount();
    expect(fake.emitted.at(-1)?.event).toBe('run:leave');
    expect(fake.listeners('run:samples')).toBe(0);
  });

  it('asks again for a range that stays missing, and takes the answer in order', () => {
    vi.useFakeTimers();
    const fake = fakeSocket();
    const { store, handed } = recordingStore();
    renderHook(() => useLiveRun(7, store, () => fake.socket));
    act(() => fake.connect());
    act(() => {
      fake.deliver('run:view', aRunView());
      fake.deliver('run:samples', { ...aBatch([[1001, 3_600_100, 0, 13_900]]), span: { after: 1000, through: 1001 } });
      fake.deliver('run:samples', aBatch([[1004, 3_600_400, 0, 14_100]])); // 1002–1003 went missing
    });
    act(() => vi.advanceTimersByTime(500));
    expect(fake.emitted.filter((e) => e.event === 'run:resend')).toEqual([]); // a late batch may still come
    act(() => vi.advanceTimersByTime(1000));
    expect(fake.emitted.filter((e) => e.event === 'run:resend')).toEqual([{ event: 'run:resend', payload: { runId: 7, after: 1001, through: 1003 } }]);
    act(() =>
      fake.deliver('run:samples', {
        ...aBatch([
          [1002, 3_600_200, 1, 23_300],
          [1003, 3_600_300, 0, 14_000],
        ]),
        span: { after: 1001, through: 1003 },
      }),
    );
    expect(handed).toEqual([1001, 1002, 1003, 1004]);
  });
});
