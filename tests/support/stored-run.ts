import type { Sequelize } from 'sequelize';
import { expect } from 'vitest';
import { Instrument } from '../../server/models/instrument';
import { Rig } from '../../server/models/rig';
import { Run } from '../../server/models/run';
import { RunEvent } from '../../server/models/run-event';
import { Archiver } from '../../server/runs/archiver';
import { initialRunState } from '../../shared/runs/lifecycle';
import { SAMPLE_STATUS, type SampleRow } from '../../shared/runs/samples';
import type { RigChannelInput } from '../../shared/schemas/instruments';
import type { Client } from './api';

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

/** A stored run's rig: gauges g1, g2 240 mm apart and p1, the demo's calibrated pressure transducer, on its calibrated jack. */
async function demoTransducerRig(name: string): Promise<Pick<StoredRunInput, 'rigName' | 'channels' | 'jackInstrumentId'>> {
  const serial = async (s: string) => (await Instrument.findOne({ where: { serialNumber: s } }))!.id;
  return {
    rigName: `${name} rig`,
    channels: [
      manualGauge('g1', -120),
      manualGauge('g2', 120),
      { key: 'p1', role: 'pressure', label: 'Oil', instrumentId: await serial('PT-5520'), profileId: 'manual', port: '', gauge: null },
    ],
    jackInstrumentId: await serial('JK-50-031'),
  };
}

/** Archives a stored run's samples through the real archive path. */
async function archiveAll(sequelize: Sequelize, runId: number, rows: SampleRow[]): Promise<void> {
  const archiver = new Archiver(sequelize);
  archiver.enqueue(runId, rows);
  await archiver.drain();
}

export const RECORDED_RUN_START_MS = 1_750_000_000_000;
/** Channels g1, g2, p1 of {@link recordedRun}, one sample each per second: seq of channel c at second s. */
export const recordedSeq = (s: number, channel: number) => 3 * s + channel + 1;
/** Gauge reading of {@link recordedRun}, mm: 0.1 through seating, then 1.00 rising 0.01 mm/s from the 100 kPa target (30 s). */
const recordedReading = (s: number) => (s < 30 ? 0.1 : 1 + (s - 30) * 0.01);

/**
 * A finished run on a typed-readings rig with the demo's calibrated pressure transducer and jack, planned
 * by `engineer` at location 1: seating held 10–20 s, 100 kPa held 30–60 s, every sample archived.
 */
export async function recordedRun(sequelize: Sequelize, engineer: Client, name: string): Promise<number> {
  const plan = await engineer.post('/api/locations/1/plans', {
    name,
    procedureId: 'custom',
    plate: { shape: 'circular', sizeMm: 300, thicknessMm: 25 },
    seatingPressureKpa: 7,
    apparatusWeightKn: 0.5,
    loading: { mode: 'list', pressuresKpa: [100] },
    unloadReload: { unloadKpa: [], reload: { mode: 'none' }, repetitionsPerLevel: 1 },
    holdRule: { kind: 'fixed', durationMin: 0.5 },
    readingSchedule: { kind: 'interval', everyMin: 1 },
    termination: { maxSettlementMm: 50, maxSettlementFractionOfWidth: 0, maxHoldMin: 60 },
    reaction: { kind: 'kentledge', capacityKn: 100, description: '' },
    footing: null,
  });
  expect(plan.status).toBe(201);
  const T = RECORDED_RUN_START_MS;
  const runId = await storedRun({
    planId: plan.body.plan.id,
    ...(await demoTransducerRig(name)),
    startMs: T,
    durationMs: 60_000,
    events: [
      [0, 'gauges-zeroed', { readings: { g1: 0, g2: 0 } }],
      [10_000, 'target-reached', { stageIndex: 0 }],
      [20_000, 'stage-advanced', { from: 0, to: 1 }],
      [30_000, 'target-reached', { stageIndex: 1 }],
      [60_000, 'run-completed', {}],
    ],
  });
  const rows: SampleRow[] = [];
  for (let s = 0; s <= 60; s++) {
    for (const [channel, value] of [recordedReading(s), recordedReading(s), s < 30 ? 1 : 30].entries()) {
      rows.push({ seq: recordedSeq(s, channel), tMs: T + s * 1000, channel, raw: Math.round(value * 1000), value: Math.round(value * 1000), status: SAMPLE_STATUS.ok });
    }
  }
  await archiveAll(sequelize, runId, rows);
  return runId;
}

/**
 * A finished bearing test of a plan (its pressures `pressuresKpa`) on the demo's calibrated transducer and
 * jack, written straight to the database, for tests that start where a run ends (review, interpretation,
 * sign-off), with notes at the given seconds: seating for 20 s, then each pressure held `holdS` seconds, settlement following a hyperbola towards 900 kPa
 * (invented: 200 kPa/mm initial stiffness) with a little creep in each hold, every sample archived.
 */
export async function storedBearingRun(
  sequelize: Sequelize,
  planId: number,
  name: string,
  pressuresKpa: number[],
  { holdS = 120, notes = [] }: { holdS?: number; notes?: [number, { text: string; topic?: 'weather' }][] } = {},
): Promise<number> {
  const T = RECORDED_RUN_START_MS;
  const stageStartS = (i: number) => 20 + (i - 1) * holdS; // stage i ≥ 1
  const endS = stageStartS(pressuresKpa.length + 1);
  const events: StoredRunInput['events'] = [
    [0, 'gauges-zeroed', { readings: { g1: 0, g2: 0 } }],
    [10_000, 'target-reached', { stageIndex: 0 }],
  ];
  pressuresKpa.forEach((_, k) => {
    const i = k + 1;
    events.push([stageStartS(i) * 1000, 'stage-advanced', { from: i - 1, to: i }], [(stageStartS(i) + 10) * 1000, 'target-reached', { stageIndex: i }]);
  });
  for (const [atS, payload] of notes) events.push([atS * 1000, 'note', payload]);
  events.push([endS * 1000, 'run-completed', {}]);
  const runId = await storedRun({
    planId,
    ...(await demoTransducerRig(name)),
    startMs: T,
    durationMs: endS * 1000,
    events,
  });
  const plateAreaM2 = Math.PI * 0.15 ** 2;
  const rows: SampleRow[] = [];
  for (let s = 0; s <= endS; s++) {
    const stage = s < 20 ? 0 : Math.min(pressuresKpa.length, Math.floor((s - 20) / holdS) + 1);
    const q = stage === 0 ? 7 : pressuresKpa[stage - 1]!;
    const inHoldS = stage === 0 ? s : s - stageStartS(stage);
    const settlementMm = q / (200 * (1 - q / 900)) + 0.002 * q * (1 - Math.exp(-inHoldS / 40)) / 10;
    // Oil pressure that gives q through the jack's 4.926 kN/MPa with the 0.5 kN apparatus; the transducer reads bar (value × 1000).
    const oilBar = Math.max(0, ((q * plateAreaM2 - 0.5) / 4.926) * 10);
    for (const [channel, value] of [Math.round(settlementMm * 1000), Math.round(settlementMm * 1000), Math.round(oilBar * 1000)].entries()) {
      rows.push({ seq: 3 * s + channel + 1, tMs: T + s * 1000, channel, raw: value, value, status: SAMPLE_STATUS.ok });
    }
  }
  await archiveAll(sequelize, runId, rows);
  return runId;
}
