import { alarmEpisodes } from '@shared/runs/alarm-episodes';
import { describe, expect, it } from 'vitest';
import { episodeBands } from '../../../client/src/features/replay/utils/timeline';

const events = (rows: [number, string, Record<string, unknown>][]) => rows.map(([atMs, kind, payload], i) => ({ id: i + 1, atMs, kind, payload }));

describe('alarm episodes on the replay timeline', () => {
  it('as timeline bands: one row per key, an episode still standing runs to the end', () => {
    const bands = episodeBands(
      alarmEpisodes(
        events([
          [1000, 'alarm-raise', { key: 'a' }],
          [2000, 'alarm-raise', { key: 'b' }],
          [3000, 'alarm-clear', { key: 'a' }],
          [4000, 'alarm-raise', { key: 'a' }],
        ]),
      ),
      10_000,
    );
    expect(bands.map((b) => [b.key, b.row, b.raisedAtMs, b.toMs])).toEqual([
      ['a', 0, 1000, 3000],
      ['b', 1, 2000, 10_000],
      ['a', 0, 4000, 10_000],
    ]);
  });
});
