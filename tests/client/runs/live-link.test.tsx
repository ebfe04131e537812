import { act, renderHook } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { createLiveStore } from '../../../client/src/features/live/live-store';
import { useLiveRun } from '../../../client/src/features/live/use-live-run';
import { fakeSocket } from './fake-socket';
import { aBatch, aRunView } from './run-fixtures';

describe('live link', () => {
  it('joins again after a drop asking only for samples after the last one received', () => {
    const fake = fakeSocket();
    const store = createLiveStore();
    const socketFor = () => fake.socket;
    const { unmount } = renderHook(() => useLiveRun(7, store, socketFor));
    expect(store.getSnapshot().link).toBe('connecting');

    act(() => fake.connect());
    expect(fake.emitted.at(-1)).toEqual({ event: 'run:join', payload: { runId: 7, afterSeq: 0 } });
    expect(store.getSnapshot().link).toBe('live');

    act(() => {
      fake.deliver('run:view', aRunView());
      fake.deliver(
        'run:samples',
        aBatch([
          [1001, 3_600_100, 0, 13_900],
          [1002, 3_600_200, 1, 23_300],
        ]),
      );
      // Another run's traffic on the same socket is not ours.
      fake.deliver('run:samples', aBatch([[5000, 1, 0, 1]], 8));
    });
    expect(store.series.length).toBe(2);

    act(() => fake.drop());
    expect(store.getSnapshot().link).toBe('reconnecting');
    act(() => fake.connect());
    expect(fake.emitted.at(-1)).toEqual({ event: 'run:join', payload: { runId: 7, afterSeq: 1002 } });

    unmount();
    expect(fake.emitted.at(-1)?.event).toBe('run:leave');
    expect(fake.listeners('run:samples')).toBe(0);
  });
});
