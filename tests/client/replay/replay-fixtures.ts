import type { RunView } from '@shared/schemas/runs';
import type { ReplayEvent, SampleSummary } from '../../../client/src/features/replay/api/replay-api';
import { json, stubFetch } from '../support/fetch-stub';
import { aUser } from '../support/fixtures';
import { aRunView } from '../runs/run-fixtures';

/*
 * The invented Larkfield run of the console tests, finished: seating from 0 s, 100 kPa from 10 min, 200 kPa
 * from 33 min 20 s, completed at 1 h. Its live values put gauge g1's zero at 10.00 mm (read upwards) and
 * g2's at 26.45 mm (read downwards), so readings of 12.00 and 24.45 mm are both 2.00 mm of settlement.
 */
export const FINISHED_VIEW: RunView = aRunView({ phase: 'completed', stageIndex: 2 });

export const EVENTS: ReplayEvent[] = [
  [0, 'run-started', { stageIndex: 0 }],
  [60_000, 'target-reached', { stageIndex: 0 }],
  [600_000, 'stage-advanced', { from: 0, to: 1 }],
  [700_000, 'target-reached', { stageIndex: 1 }],
  [900_000, 'note', { text: 'Kentledge settled' }],
  [1_200_000, 'alarm-raise', { key: 'travel:g2', message: 'Gauge travel low' }],
  [2_000_000, 'stage-advanced', { from: 1, to: 2 }],
  [2_100_000, 'target-reached', { stageIndex: 2 }],
  [3_600_000, 'run-completed', {}],
].map(([atMs, kind, payload], i) => ({ id: i + 1, atMs: atMs as number, kind: kind as string, userId: null, payload: payload as Record<string, unknown> }));

/** Two buckets over the hour, for each of g1, g2 and the pressure. */
export const SUMMARY: SampleSummary = {
  runId: 7,
  fromMs: 0,
  toMs: 3_600_001,
  bucketMs: 1_800_001,
  channels: [
    { channel: 0, t: [900_000, 2_700_000], min: [10_000, 12_000], max: [12_000, 13_800] },
    { channel: 1, t: [900_000, 2_700_000], min: [24_450, 23_410], max: [26_450, 24_450] },
    { channel: 2, t: [900_000, 2_700_000], min: [0, 14_500], max: [14_500, 28_070] },
  ],
};

/** Readings at 25 min: both gauges at 2.00 mm of settlement, 14.5 bar. */
export const READINGS_AT_25_MIN = [
  { seq: 450, tMs: 1_499_000, channel: 0, value: 12_000, status: 0 },
  { seq: 451, tMs: 1_499_000, channel: 1, value: 24_450, status: 0 },
  { seq: 452, tMs: 1_499_000, channel: 2, value: 14_500, status: 0 },
];

export const ENGINEER = aUser('engineer', 'Ines Okafor', 'ines@example.test');

/** The server of a finished run at the replay page's first questions (its end, 1 h) and after a scrub to 25 min. */
export function stubFinishedRun(extra: Parameters<typeof stubFetch>[0] = {}, view: RunView = FINISHED_VIEW) {
  return stubFetch({
    'GET /api/auth/me': json(200, { user: ENGINEER, csrfToken: 'token-1' }),
    'GET /api/runs/7': json(200, view),
    'GET /api/runs/7/events': json(200, { items: EVENTS }),
    'GET /api/runs/7/samples/summary?buckets=800': json(200, SUMMARY),
    'GET /api/runs/7/readings-at?tMs=3600000': json(200, { tMs: 3_600_000, items: [] }),
    'GET /api/runs/7/readings-at?tMs=1500000': json(200, { tMs: 1_500_000, items: READINGS_AT_25_MIN }),
    'GET /api/runs/7/corrections': json(200, { items: [] }),
    ...extra,
  });
}
