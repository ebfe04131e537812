/**
 * A run engine with nothing real around it: a virtual clock, a fake rig connection the test feeds
 * readings into, and an I/O stub that keeps what the engine journals, saves and pushes.
 */
import type { WallClock } from '../../../../devices/port/clock';
import type { ChannelReading, RigConnectionOptions } from '../../../../server/acquisition/rig-connection';
import type { RigContext } from '../../../../server/acquisition/rig-context';
import type { PersistedRun } from '../../../../server/models/run';
import { newRunClock } from '../../../../server/runs/run-clock';
import { type EngineIo, type EngineSetup, RunEngine } from '../../../../server/runs/run-engine';
import type { PlannedStage } from '../../../../shared/plans/stages';
import { findProfile } from '../../../../shared/procedures/profiles';
import { type Actor, type RunEventDraft, initialRunState } from '../../../../shared/runs/lifecycle';
import type { RunSetupSnapshot } from '../../../../shared/runs/measurement-model';
import type { SampleRow } from '../../../../shared/runs/samples';
import type { RigChannelInput } from '../../../../shared/schemas/instruments';
import { planInput } from '../../../../shared/schemas/plans';
import type { RunCommand, RunView } from '../../../../shared/schemas/runs';

/** Monotonic and wall time that move only when told, together or (a clock set, a machine asleep) apart. */
export class VirtualClock implements WallClock {
  mono = 5_000;
  wallMs = Date.UTC(2026, 2, 2, 8);
  now = () => this.mono;
  wall = () => this.wallMs;
  after = () => () => {};
  advance(ms: number) {
    this.mono += ms;
    this.wallMs += ms;
  }
}

export const STAGES: PlannedStage[] = [
  { index: 0, branch: 'seating', targetKpa: 10, repetition: 1 },
  { index: 1, branch: 'loading', targetKpa: 100, repetition: 1 },
  { index: 2, branch: 'loading', targetKpa: 200, repetition: 1 },
  { index: 3, branch: 'unloading', targetKpa: 100, repetition: 1 },
  { index: 4, branch: 'reloading', targetKpa: 200, repetition: 1 },
  { index: 5, branch: 'loading', targetKpa: 300, repetition: 1 },
];
const profile = findProfile('bearing-granular')!;
export const PLAN = planInput.parse({ name: 'virtual run', procedureId: profile.id, ...profile.defaults, plate: { shape: 'circular', sizeMm: 300 }, reaction: { kind: 'kentledge', capacityKn: 5000 } });
export const ACTOR: Actor = { id: 1, name: 'Ada Field', role: 'engineer' };
/** An invented jack: 0.5 kN per bar rising, 0.45 kN per bar falling (seal friction on the way down). */
export const JACK = { inputUnit: 'bar', outputUnit: 'kN', curve: { kind: 'linear', c0: 0, c1: 0.5 }, fallingCurve: { kind: 'linear', c0: 0, c1: 0.45 } } as const;

/** A serial rig with these gauges and one oil-pressure channel (last), its jack instrument 9. */
export function virtualRig(gauges: readonly { direction: 1 | -1; xMm: number; yMm: number }[], apparatusWeightKn = 0): { snapshot: RunSetupSnapshot; rig: RigContext } {
  const channels: RigChannelInput[] = [
    ...gauges.map((g, i) => ({ key: `g${i + 1}`, role: 'gauge' as const, label: `Gauge ${i + 1}`, instrumentId: null, profileId: 'ascii-polled-mm', port: `/dev/null-${i}`, gauge: { ...g, travelMm: 50 } })),
    { key: 'p', role: 'pressure', label: 'Oil', instrumentId: null, profileId: 'modbus-hr0-int16', port: '/dev/null-p', gauge: null },
  ];
  const jack = { instrumentId: 9, serial: 'J-9', calibrationId: 1, calibration: JACK };
  const snapshot: RunSetupSnapshot = { channels, plate: PLAN.plate, apparatusWeightKn, stageBranches: STAGES.map((s) => s.branch), jack, pressureUnit: 'bar', instruments: [jack] };
  const rig: RigContext = {
    rig: { id: 1, name: 'Virtual rig', mode: 'serial', channels, jackInstrumentId: 9, notes: '', simulator: null } as RigContext['rig'],
    calibrations: new Map([[9, JACK]]),
    calibrationIds: new Map([[9, 1]]),
    status: new Map([[9, 'in-calibration' as const]]),
    serials: new Map([[9, 'J-9']]),
    jack: { calibration: JACK, serial: 'J-9', status: 'in-calibration' },
  };
  return { snapshot, rig };
}

/** The engine of a new run on a virtual rig, and everything it hands out. */
export function virtualRun(snapshot: RunSetupSnapshot, rig: RigContext, clock: VirtualClock) {
  const rows: SampleRow[] = [];
  const events: RunEventDraft[] = [];
  const pushed: ({ view: RunView } | { rows: SampleRow[] })[] = [];
  const last: { saved: PersistedRun | null } = { saved: null };
  let onReading: ((r: ChannelReading) => void) | null = null;
  const io: EngineIo = {
    archiver: { enqueue: () => {}, drain: async () => {}, queued: () => [] } as unknown as EngineIo['archiver'],
    journal: { append: (r: SampleRow[]) => rows.push(...r), markArchived: () => {} } as unknown as EngineIo['journal'],
    save: async (_id, persisted, evs) => {
      last.saved = structuredClone(persisted);
      events.push(...structuredClone(evs));
    },
    pushView: (_id, view) => pushed.push({ view: structuredClone(view) }),
    pushSamples: (_id, r) => pushed.push({ rows: [...r] }),
    clock,
    connect: (o: RigConnectionOptions) => {
      onReading = o.onReading;
      return { start: () => {}, stop: async () => {} };
    },
  };
  const persisted: PersistedRun = { lifecycle: initialRunState(), clock: newRunClock(1, clock.wall()), alarms: {}, lastSeq: 0, lastSampleMs: null, setup: snapshot };
  const setup: EngineSetup = { runId: 1, planId: 1, planName: 'virtual run', plan: PLAN, stages: STAGES, rig, persisted, overdueInstruments: [], snapshot };
  const engine = new RunEngine(setup, io);
  return {
    engine,
    setup,
    io: { ...io, connect: () => ({ start: () => {}, stop: async () => {} }) } as EngineIo,
    rows,
    events,
    pushed,
    last,
    command: (c: RunCommand) => engine.command(c, ACTOR, engine.state.version),
    /** A good reading of a channel (by index) now, in its unit (mm, bar). */
    read(channel: number, value: number) {
      const c = snapshot.channels[channel];
      onReading!({ channelIndex: channel, key: c.key, role: c.role, monoMs: clock.now(), wallMs: clock.wall(), raw: value, value, status: 'ok', deviceSeq: 0 });
    },
  };
}
