import { Rig } from '../../server/models/rig';
import { Run } from '../../server/models/run';
import { RunEvent } from '../../server/models/run-event';
import { initialRunState } from '../../shared/runs/lifecycle';
import type { RigChannelInput } from '../../shared/schemas/instruments';

/** A manual-rig gauge channel at x mm from the plate centre. */
export const manualGauge = (key: string, xMm: number, direction: 1 | -1 = 1, label = key): RigChannelInput => ({
  key,
  role: 'gauge',
  label,
  instrumentId: null,
  profileId: 'manual',
  port: '',
  gauge: { xMm, yMm: 0, direction, travelMm: 25 },
});

export interface StoredRunInput {
  planId: number;
  rigName: string;
  channels: RigChannelInput[];
  jackInstrumentId: number;
  startMs: number;
  durationMs: number;
  /** [ms after the start, kind, payload] */
  events: [number, string, Record<string, unknown>][];
}

/**
 * A completed run written straight to the database (a manual rig, the run row and its events), for
 * tests that need a stored run with known readings; the caller adds the samples. Returns the run id.
 */
export async function storedRun(i: StoredRunInput): Promise<number> {
  const rig = await Rig.create({ name: i.rigName, mode: 'manual', channels: i.channels, jackInstrumentId: i.jackInstrumentId, notes: '', simulator: null });
  const run = await Run.create({
    planId: i.planId,
    rigId: rig.id,
    status: 'completed',
    state: {
      lifecycle: { ...initialRunState(), phase: 'completed' },
      clock: { speed: 1, anchorWallMs: i.startMs, anchorRunMs: i.startMs },
      alarms: {},
      lastSeq: 0,
      lastSampleMs: null,
    },
    startedAt: new Date(i.startMs),
    finishedAt: new Date(i.startMs + i.durationMs),
    createdBy: null,
  });
  await RunEvent.bulkCreate(i.events.map(([ms, kind, payload]) => ({ runId: run.id, at: new Date(i.startMs + ms), kind, userId: null, payload })));
  return run.id;
}
