/**
 * The one measurement model of a run: what a stored sample means, given the set-up the run was started
 * with and the run events so far. Every view — the engine's console figures, the hold series, the rebuild
 * after a restart, the test record, the live chart and replay — measures through it, so they cannot differ.
 *
 * A run's samples store calibrated readings (micro-units); the model adds what the events say: each
 * gauge's zero, the offsets of gauge resets and replacements, the stage (an unloading stage reads the jack
 * on its falling branch) and the jack calibration in force (a calibration recorded mid-run applies from
 * its event). An event applies to the samples after it: when it names the run's last sequence number at
 * the time (`afterSeq`), to samples above that number, else (runs recorded before) to samples at or after
 * its time.
 */
import type { Calibration } from '../calibration/schema';
import { convertPressure, isPressureUnit } from '../calibration/units';
import { type Plate, plateForceKn } from '../domain/plate';
import type { Branch as StageBranch } from '../plans/stages';
import { UNLOADING_EVENT } from '../plans/unloading';
import type { RigChannelInput } from '../schemas/instruments';
import { gaugeSettlement } from '../hold/gauge-reset';
import { type Measurements, jackGaugePressure, measure } from './measurements';
import { fromMicro } from './samples';

/** One calibration certificate of one instrument, as a run used it. */
export interface CalibrationVersion {
  instrumentId: number;
  serial: string;
  /** The calibration record's id; null when the instrument had none. */
  calibrationId: number | null;
  calibration: Calibration | null;
}

/** What a run measures with, fixed when the run is created: later rig edits and calibrations do not change it. */
export interface RunSetupSnapshot {
  /** The rig's channels in sample order (gauge positions and directions as they were). */
  channels: RigChannelInput[];
  plate: Plate;
  apparatusWeightKn: number;
  /** Branch of every planned stage, by stage index. */
  stageBranches: StageBranch[];
  /** The jack and its calibration at the start; null for a rig without one. */
  jack: CalibrationVersion | null;
  /** Unit of the pressure channel's calibrated value. */
  pressureUnit: string | null;
  /** Every instrument of the rig (channels and jack) with the calibration in force at the start. */
  instruments: CalibrationVersion[];
}

/** A run event as the model reads it (run clock ms). */
export interface ModelEvent {
  kind: string;
  atMs: number;
  payload: Record<string, unknown>;
}

/** Event kinds that change what a sample means. */
export const MODEL_EVENT_KINDS: ReadonlySet<string> = new Set(['gauges-zeroed', 'gauge-reset', 'run-started', 'stage-advanced', 'calibration-applied', UNLOADING_EVENT]);

/** The model's state between two events. */
export interface ModelState {
  /** Gauge readings taken as zero, mm, by channel key. */
  zeros: Record<string, number>;
  /** Settlement offsets of gauge resets and replacements, mm, by channel key. */
  offsets: Record<string, number>;
  stageIndex: number;
  jack: Calibration | null;
  pressureUnit: string | null;
  /** Branch of every stage once going to unloading replaced the planned ones (absent: the snapshot's). */
  stageBranches?: StageBranch[];
}

export function initialModelState(setup: RunSetupSnapshot): ModelState {
  return { zeros: {}, offsets: {}, stageIndex: 0, jack: setup.jack?.calibration ?? null, pressureUnit: setup.pressureUnit };
}

/** The state after one event; events of other kinds leave it as it is. */
export function applyModelEvent(setup: RunSetupSnapshot, state: ModelState, e: ModelEvent): ModelState {
  const p = e.payload;
  switch (e.kind) {
    case 'gauges-zeroed':
      return { ...state, zeros: { ...(p.readings as Record<string, number>) }, offsets: {} };
    case 'gauge-reset':
      // The event carries the gauge's whole offset so far (resets add up in the lifecycle reducer).
      return { ...state, offsets: { ...state.offsets, [String(p.channel)]: Number(p.offsetMm) } };
    case 'run-started':
      return { ...state, stageIndex: Number(p.stageIndex ?? 0) };
    case 'stage-advanced':
      return { ...state, stageIndex: Number(p.to) };
    case UNLOADING_EVENT: {
      // The stages from `fromIndex` on are the derived unloading (and reloading) stages.
      const from = Number(p.fromIndex);
      const tail = Array.isArray(p.stages) ? (p.stages as { branch: StageBranch }[]).map((s) => s.branch) : [];
      return { ...state, stageBranches: [...(state.stageBranches ?? setup.stageBranches).slice(0, from), ...tail] };
    }
    case 'calibration-applied': {
      const calibration = (p.calibration ?? null) as Calibration | null;
      const id = Number(p.instrumentId);
      const next = { ...state };
      if (setup.jack?.instrumentId === id) next.jack = calibration;
      const pressure = setup.channels.find((c) => c.role === 'pressure');
      if (pressure?.instrumentId === id && calibration) next.pressureUnit = calibration.outputUnit;
      return next;
    }
    default:
      return state;
  }
}

/** A sample's place in the run: its sequence number and run clock time. */
export interface SamplePosition {
  seq: number;
  tMs: number;
}

/** The run's last sequence number when an event was decided, when it says. */
export const afterSeqOf = (e: ModelEvent): number | null => (typeof e.payload.afterSeq === 'number' ? e.payload.afterSeq : null);

/** Whether an event comes before a sample (and so applies to it). */
export function eventPrecedes(e: ModelEvent, at: SamplePosition): boolean {
  const after = afterSeqOf(e);
  return after !== null ? at.seq > after : at.tMs >= e.atMs;
}

/** The jack branch a stage reads: its falling side while unloading (seal friction, reference §D.1). */
export const jackBranchOf = (setup: RunSetupSnapshot, stageIndex: number, state?: Pick<ModelState, 'stageBranches'>): 'rising' | 'falling' =>
  ((state?.stageBranches ?? setup.stageBranches)[stageIndex] === 'unloading' ? 'falling' : 'rising');

/** The measurements from the latest calibrated value per channel key (mm, or the channel's unit) under a state. */
export function measureWith(setup: RunSetupSnapshot, state: ModelState, latest: ReadonlyMap<string, number | null>): Measurements {
  return measure(
    { channels: setup.channels, plate: setup.plate, apparatusWeightKn: setup.apparatusWeightKn, jack: state.jack, pressureUnit: state.pressureUnit },
    latest,
    state.zeros,
    state.offsets,
    jackBranchOf(setup, state.stageIndex, state),
  );
}

/**
 * The oil pressure (in the pressure channel's unit) that the model reads back as a plate pressure, kPa:
 * how a typed plate pressure is stored, so every pressure sample means the same. Null where the jack's
 * calibration cannot say.
 */
export function oilForPlatePressure(setup: RunSetupSnapshot, state: ModelState, kpa: number): number | null {
  const { jack, pressureUnit: unit } = state;
  if (!jack) return null;
  const oil = jackGaugePressure(jack, jackBranchOf(setup, state.stageIndex, state))(Math.max(0, plateForceKn(setup.plate, kpa) - setup.apparatusWeightKn));
  if (oil === null || !unit || unit === jack.inputUnit) return oil;
  return isPressureUnit(unit) && isPressureUnit(jack.inputUnit) ? convertPressure(oil, jack.inputUnit, unit) : null;
}

/** One gauge's settlement (mm) for a reading under a state, exactly as {@link measure} works it; null for a channel that is no gauge or not zeroed. */
export function settlementOf(setup: RunSetupSnapshot, state: ModelState, channelIndex: number, readingMm: number): number | null {
  const c = setup.channels[channelIndex];
  const zero = c ? state.zeros[c.key] : undefined;
  if (c?.role !== 'gauge' || !c.gauge || zero === undefined) return null;
  return gaugeSettlement(readingMm, zero, c.gauge.direction, [state.offsets[c.key] ?? 0]);
}

/** The state after every event at or before a run time (for views that place readings by time only, such as a summary bucket). */
export function stateAtTime(setup: RunSetupSnapshot, events: readonly ModelEvent[], tMs: number): ModelState {
  let state = initialModelState(setup);
  for (const e of events) {
    if (e.atMs > tMs) break;
    state = applyModelEvent(setup, state, e);
  }
  return state;
}

/** One stored sample as the model takes it: values in micro-units, null when none was trusted. */
export interface ModelSample extends SamplePosition {
  channel: number;
  value: number | null;
}

/**
 * Walks a run in order: takes the run's events (all of them, oldest first: others are passed to `onEvent`
 * too) and its samples in sequence order, and measures at any point. Used whole by the record builder and
 * the restart rebuild, and one sample or event at a time by the engine and the live chart.
 */
export class RunMeasurer {
  private state: ModelState;
  private readonly latest = new Map<string, number | null>();
  private next = 0;
  private readonly events: ModelEvent[];

  /**
   * `onEvent`: called for each event as it is applied (before the samples it precedes), with the
   * measurer in the state just after it.
   */
  constructor(
    readonly setup: RunSetupSnapshot,
    events: readonly ModelEvent[] = [],
    private readonly onEvent?: (e: ModelEvent, m: RunMeasurer) => void,
  ) {
    this.state = initialModelState(setup);
    this.events = [...events];
  }

  get modelState(): ModelState {
    return this.state;
  }

  /** Adds an event that happened now (after every sample so far); it applies at once. */
  push(e: ModelEvent): void {
    this.events.push(e);
    this.applyPending(null);
  }

  /** Adds a later event without applying it: it applies before the first sample it precedes (a browser learns events after some of their samples). */
  enqueue(e: ModelEvent): void {
    this.events.push(e);
  }

  /** How many events it holds (applied or waiting). */
  get eventCount(): number {
    return this.events.length;
  }

  /** Applies the events that come before a sample at `at` (all remaining ones when null). */
  advance(at: SamplePosition | null): void {
    this.applyPending(at);
  }

  /** Takes the next sample (sequence order); a sample with no trusted value leaves its channel's last value. */
  add(sample: ModelSample): void {
    this.applyPending(sample);
    const channel = this.setup.channels[sample.channel];
    if (!channel || sample.value === null) return;
    this.latest.set(channel.key, fromMicro(sample.value));
  }

  /** The latest value of a channel (mm, or its unit), undefined before its first. */
  latestOf(key: string): number | null | undefined {
    return this.latest.get(key);
  }

  latestValues(): ReadonlyMap<string, number | null> {
    return this.latest;
  }

  measure(): Measurements {
    return measureWith(this.setup, this.state, this.latest);
  }

  private applyPending(at: SamplePosition | null): void {
    while (this.next < this.events.length && (at === null || eventPrecedes(this.events[this.next], at))) {
      const e = this.events[this.next++];
      this.state = applyModelEvent(this.setup, this.state, e);
      this.onEvent?.(e, this);
    }
  }
}

/** The model's parameters as the server sends them to a browser: the set-up and the events that change what a sample means. */
export interface MeasurementParams {
  setup: RunSetupSnapshot;
  events: ModelEvent[];
}

/** The events of a run that the model reads, for {@link MeasurementParams}. */
export const modelEventsOf = (events: readonly ModelEvent[]): ModelEvent[] => events.filter((e) => MODEL_EVENT_KINDS.has(e.kind)).map(({ kind, atMs, payload }) => ({ kind, atMs, payload }));
