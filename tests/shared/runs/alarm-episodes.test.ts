import { describe, expect, it } from 'vitest';
import { alarmEpisodes } from '../../../shared/runs/alarm-episodes';

const events = (rows: [number, string, Record<string, unknown>][]) => rows.map(([atMs, kind, payload], i) => ({ id: i + 1, atMs, kind, payload }));

describe('alarm episodes', () => {
  it('pairs each raise with the clear of the same key, keeps keys apart and notes the first answer', () => {
    const episodes = alarmEpisodes(
      events([
        [1000, 'alarm-raise', { key: 'load-drift', message: 'Pressure 97.5 kPa is 2.5 kPa below the 100 kPa target: top up the pump.' }],
        [2000, 'alarm-raise', { key: 'signal-lost:g1' }],
        [3000, 'alarm-acknowledge', { key: 'load-drift' }],
        [4000, 'alarm-shelve', { key: 'load-drift', minutes: 5 }],
        [5000, 'alarm-clear', { key: 'load-drift', message: 'Pressure within ±2.0 kPa of the 100 kPa target.' }],
        [6000, 'note', { text: 'pump topped up' }],
        [90_000, 'alarm-raise', { key: 'load-drift', message: 'again' }],
      ]),
    );
    expect(episodes).toEqual([
      { key: 'load-drift', raiseEventId: 1, raisedAtMs: 1000, clearedAtMs: 5000, message: 'Pressure 97.5 kPa is 2.5 kPa below the 100 kPa target: top up the pump.', answeredAtMs: 3000 },
      { key: 'signal-lost:g1', raiseEventId: 2, raisedAtMs: 2000, clearedAtMs: null, message: 'signal lost (g1)', answeredAtMs: null },
      { key: 'load-drift', raiseEventId: 7, raisedAtMs: 90_000, clearedAtMs: null, message: 'again', answeredAtMs: null },
    ]);
  });

  it('ignores a clear with nothing standing and a repeated raise of a standing alarm', () => {
    const episodes = alarmEpisodes(
      events([
        [1000, 'alarm-clear', { key: 'plate-tilt' }],
        [2000, 'alarm-raise', { key: 'plate-tilt', message: 'Plate tilting' }],
        [3000, 'alarm-raise', { key: 'plate-tilt', message: 'Plate tilting more' }],
        [4000, 'alarm-clear', { key: 'plate-tilt' }],
      ]),
    );
    expect(episodes.map((e) => [e.raisedAtMs, e.clearedAtMs, e.message])).toEqual([[2000, 4000, 'Plate tilting']]);
  });
});
