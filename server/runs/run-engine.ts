/**
 * One running test: reads its rig, journals and archives every sample, judges the hold, keeps the
 * alarms, and applies people's commands through the pure lifecycle reducer. It is the single
 * authority over its run's state; everything it decides is persisted and pushed to watchers.
 */
import createDebug from 'debug';
import { type WallClock, systemClock } from '../../devices/port/clock';
import type { Calibration } from '../../shared/calibration/schema';
import { jackGaugeFor } from '../../shared/calibration/jack';
import { plateAreaM2 } from '../../shared/domain/plate';
import { type AlarmAction, reduceAlarm } from '../../shared/hold/alarm-lifecycle';
import { type Alarm, gaugeTravelAlarm, loadDriftAlarm, reactionCapacityAlarm, readingsUnsecuredAlarm, signalLostAlarm, stopLimitAlarm, stopLimitMm, tiltAlarm } from '../../shared/hold/alarms';
import { evaluateHold } from '../../shared/hold/evaluate';
import { emptyInstrumentWatch, gaugeResolutionMm, gaugeTravelMm, instrumentAlarms, type Kit, rigResolutionMm, watchReading, watchReset } from '../../shared/hold/instrument-alarms';
import { nextStepPrompt, promptBlocksLoading } from '../../shared/hold/next-step';
import { lateReadings, nextReadingDue } from '../../shared/hold/schedule';
import type { HoldEvaluation } from '../../shared/hold/verdict';
import { type PlannedStage, seatingHoldMin } from '../../shared/plans/stages';
import { stagesAfterEvents, unloadingRuleOf } from '../../shared/plans/unloading';
import { type AlarmPending, reconcileAlarms } from '../../shared/runs/alarm-board';
import { type Actor, type RunEventDraft, type RunState, applyCommand, applyObservation, needsCurrentVersion } from '../../shared/runs/lifecycle';
import { HoldSeriesTracker } from '../../shared/runs/hold-series';
import { type CalibrationVersion, MODEL_EVENT_KINDS, type ModelEvent, type ModelSample, RunMeasurer, type RunSetupSnapshot, jackBranchOf, oilForPlatePressure } from '../../shared/runs/measurement-model';
import type { Measurements } from '../../shared/runs/measurements';
import { SAMPLE_STATUS, type SampleRow, toMicro } from '../../shared/runs/samples';
import type { PlanInput } from '../../shared/schemas/plans';
import { ACTIVE_PHASES, type RunCommand, type RunView } from '../../shared/schemas/runs';
import { type ChannelReading, RigConnection, type RigConnectionOptions, channelUnit } from '../acquisition/rig-connection';
import { type RigContext, snapshotCalibrations } from '../acquisition/rig-context';
import type { PersistedRun } from '../models/run';
import type { Archiver } from './archiver';
import type { Journal } from './journal';
import { RunClock } from './run-clock';
import { SampleSecurer } from './sample-securer';

const debug = createDebug('sscope:runs:engine');

/** How long a held load stays inside its drift tolerance before gauges are judged for jumps, run-clock ms. */
const LOAD_STEADY_BEFORE_JUMPS_MS = 60_000;

/** How the engine reaches the outside world; the run manager provides these. */
export interface EngineIo {
  archiver: Archiver;
  /** Where new samples are secured first (a closed run's engine is given one that refuses). */
  journal: Pick<Journal, 'append'>;
  /** Saves the persisted state and the new events in one transaction. */
  save(runId: number, persisted: PersistedRun, events: RunEventDraft[]): Promise<void>;
  pushView(runId: number, view: RunView): void;
  pushSamples(runId: number, rows: SampleRow[]): void;
  /** Told once a command has closed the run and the engine has stopped (the manager then lets it go). */
  released?(runId: number): void;
  /** Time source (monotonic for intervals, wall for anchoring the run clock). Default: the system clock. */
  clock?: WallClock;
  /** Opens the rig's ports (tests pass a fake). Default: a RigConnection. */
  connect?: (options: RigConnectionOptions) => { start(): void; stop(): Promise<void> };
}

export interface EngineSetup {
  runId: number;
  planId: number;
  planName: string;
  plan: PlanInput;
  stages: PlannedStage[];
  rig: RigContext;
  persisted: PersistedRun;
  overdueInstruments: string[];
  /** What the run measures with: its snapshot, taken when it was created. */
  snapshot: RunSetupSnapshot;
  /**
   * The run so far, when it is loaded again: every event (oldest first) and the samples of the current
   * stage (or the last per channel of a closed run), in sequence order. The engine's measurements and
   * hold series are rebuilt from them through the same model that keeps them live.
   */
  history?: { events: ModelEvent[]; samples: ModelSample[] };
}

export class CommandRefused extends Error {
  constructor(
    readonly code: 'conflict' | 'forbidden' | 'invalid',
    message: string,
  ) {
    super(message);
  }
}

/** Samples go out (journal, archive, sockets) in batches this often: well inside QUALITY P1's 50 ms. */
const FLUSH_MS = 25;
const EVALUATE_MS = 500;
/** The target counts as reached within max(2 %, 2 kPa) (common practice, as the load-drift rule). */
const reached = (actual: number, target: number) => Math.abs(actual - target) <= Math.max(0.02 * target, 2);
const NO_KIT: Kit = new Map();
/** The settlement stop limit ends the loading: it has no say once the plate is being unloaded or reloaded. */
const stopLimitApplies = (stage: PlannedStage) => stage.branch === 'seating' || stage.branch === 'loading';

export class RunEngine {
  private persisted: PersistedRun;
  private readonly connection: { start(): void; stop(): Promise<void> } | null;
  /** The measurement model, fed every sample and every event of the run in order. */
  private readonly measurer: RunMeasurer;
  private readonly tracker: HoldSeriesTracker;
  /** Events that change what a sample means, as sent to browsers with the view. */
  private readonly modelEvents: ModelEvent[] = [];
  /** Calibration in force per instrument: the snapshot's, then those applied mid-run (the readers read this map). */
  private readonly calibrations: Map<number, Calibration>;
  private readonly calibrationIds = new Map<number, number | null>();
  private readonly clock: WallClock;
  private readonly runClock: RunClock;
  /** Monotonic time of each channel's last good sample (signal-lost compares it with monotonic now). */
  private readonly lastOkMonoMs = new Map<string, number>();
  /** Channels whose port reported itself gone; cleared by their next good sample. */
  private readonly portLost = new Set<string>();
  /** What the instrument alarms remember between readings: last readings, gauge jumps, recorded resets. */
  private watch = emptyInstrumentWatch();
  /** Run-clock ms since which the held load has stayed inside its drift tolerance; null while it is not. */
  private loadSteadySinceMs: number | null = null;
  /** Since when each alarm's rule has disagreed with its record (the board's on- and off-delays); memory only. */
  private alarmPending: AlarmPending = {};
  private pending: SampleRow[] = [];
  /** Journals new rows; keeps (bounded) what a refusing journal cannot take. */
  private readonly securer: SampleSecurer;
  private hold: HoldEvaluation | null = null;
  private measurements: Measurements;
  private readonly timers: NodeJS.Timeout[] = [];
  private watchers = new Map<string, { id: number; name: string; role: string }>();
  /** Manual mode: when readings were typed in this hold, minutes since the target was reached. */
  private manualTimes: number[] = [];
  private closed = false;
  private saving: Promise<void> = Promise.resolve();
  private unsaved: RunEventDraft[] = [];
  private retryTimer: NodeJS.Timeout | null = null;
  /**
   * Highest seq on disk in the journal (so also queued for the archive and pushed). The run reports and
   * saves this as its last seq, never one still waiting in memory for the next flush: a reader can get
   * every sample up to it, and a restart after a crash does not skip seqs that were never secured.
   */
  private securedSeq: number;
  /** The stages the run follows: the plan's, with the tail that going to unloading replaced. */
  private stages: PlannedStage[];

  constructor(
    private readonly setup: EngineSetup,
    private readonly io: EngineIo,
  ) {
    this.persisted = structuredClone(setup.persisted);
    this.securer = new SampleSecurer(io.journal);
    this.securedSeq = this.persisted.lastSeq;
    this.stages = stagesAfterEvents(setup.stages, setup.history?.events ?? []);
    this.clock = io.clock ?? systemClock;
    this.runClock = new RunClock(this.persisted.clock, this.clock);
    this.calibrations = snapshotCalibrations(setup.snapshot);
    for (const v of setup.snapshot.instruments) this.calibrationIds.set(v.instrumentId, v.calibrationId);
    this.tracker = new HoldSeriesTracker(setup.rig.rig.mode === 'manual');
    this.measurer = new RunMeasurer(setup.snapshot, setup.history?.events ?? [], (e, m) => this.onModelEvent(e, m));
    for (const sample of setup.history?.samples ?? []) {
      this.measurer.add(sample);
      this.tracker.onSample(sample, this.measurer);
    }
    this.measurer.advance(null);
    this.measurements = this.measure();
    const connect = io.connect ?? ((o: RigConnectionOptions) => new RigConnection(o));
    this.connection = setup.rig.rig.mode === 'serial' ? connect({ channels: this.channels, calibrations: this.calibrations, ranges: setup.rig.ranges, clock: this.clock, onReading: (r) => this.onReading(r) }) : null;
  }

  /** The run's channels as its snapshot has them (sample order). */
  private get kit(): Kit {
    return this.setup.rig.kit ?? NO_KIT;
  }

  /** Feeds the instrument alarms' memory; jumps are looked for under a held load only. */
  private watchInstruments(r: ChannelReading, tMs: number): void {
    const channel = this.channels[r.channelIndex];
    if (!channel || r.value === null) return;
    // A top-up moves the plate for a while after the pressure is back, faster still on an accelerated
    // rig: a gauge is judged for jumps only once the load has been steady for a minute of run time.
    const held = this.loadSteadySinceMs !== null && tMs - this.loadSteadySinceMs >= LOAD_STEADY_BEFORE_JUMPS_MS;
    this.watch = watchReading(this.watch, { key: r.key, role: r.role, tMs, raw: r.raw, value: r.value }, { resolutionMm: gaugeResolutionMm(channel, this.kit), held });
  }

  private get channels() {
    return this.setup.snapshot.channels;
  }

  private onModelEvent(e: ModelEvent, m: RunMeasurer): void {
    this.tracker.onEvent(e, m);
    if (!MODEL_EVENT_KINDS.has(e.kind)) return;
    this.modelEvents.push({ kind: e.kind, atMs: e.atMs, payload: e.payload });
    if (e.kind === 'calibration-applied') {
      const id = Number(e.payload.instrumentId);
      const calibration = (e.payload.calibration ?? null) as Calibration | null;
      if (calibration) this.calibrations.set(id, calibration);
      else this.calibrations.delete(id);
      this.calibrationIds.set(id, (e.payload.calibrationId ?? null) as number | null);
    }
  }

  /**
   * Stamps the run's new events with its last sequence number (the samples they come after, so every
   * view applies them to exactly the same samples) and lets the measurement model take them.
   */
  private record(events: RunEventDraft[]): RunEventDraft[] {
    const afterSeq = this.persisted.lastSeq;
    return events.map((e) => {
      const stamped = { ...e, payload: { ...e.payload, afterSeq } };
      this.measurer.push(stamped);
      return stamped;
    });
  }

  get runId() {
    return this.setup.runId;
  }
  get state(): RunState {
    return this.persisted.lifecycle;
  }
  get isActive() {
    return ACTIVE_PHASES.includes(this.state.phase);
  }
  get rigId() {
    return this.setup.rig.rig.id;
  }

  /** Starts reading. */
  start(): void {
    this.connection?.start();
    this.timers.push(setInterval(() => this.flush(), FLUSH_MS), setInterval(() => this.evaluate(), EVALUATE_MS));
  }

  /**
   * Stops reading and waits until every sample is journaled, and, within `deadlineMs`, the state saved
   * and the samples archived; what the database has not taken by then stays in the journal for the
   * next start.
   */
  async stop(deadlineMs = 10_000): Promise<void> {
    if (this.closed) return;
    const until = Date.now() + deadlineMs;
    const left = () => new Promise((r) => setTimeout(r, Math.max(0, until - Date.now())).unref());
    this.closed = true;
    for (const t of this.timers) clearInterval(t);
    this.flush(); // now, so the view of the command that closed the run already counts every sample (lastSeq)
    await this.connection?.stop();
    this.flush();
    await this.queueSave([]);
    // Bounded, so a shutdown with the database away still ends; the journal keeps the samples.
    await Promise.race([this.saved(), left()]);
    await Promise.race([this.io.archiver.drain(), left()]);
  }

  /** The current hold's settlement–time series (the hold rules judge it). */
  get holdSeries(): readonly { tMin: number; settlementMm: number }[] {
    return this.tracker.points;
  }

  /** Run time now, ms. */
  nowMs(): number {
    return this.runClock.at();
  }

  // ---------------------------------------------------------------- samples

  private onReading(r: ChannelReading): void {
    if (this.closed) return;
    const tMs = Math.round(this.runClock.at(r.monoMs));
    const seq = ++this.persisted.lastSeq;
    const row: SampleRow = { seq, tMs, channel: r.channelIndex, raw: r.raw === null ? null : toMicro(r.raw), value: r.value === null ? null : toMicro(r.value), status: SAMPLE_STATUS[r.status] };
    this.pending.push(row);
    // Measured as stored (micro-units), so the console and every later view start from the same numbers.
    this.measurer.add(row);
    if (r.status === 'disconnected' && !this.portLost.has(r.key)) {
      this.portLost.add(r.key);
      this.alarmNow(); // a pulled cable is known at once (QUALITY R3): no need to wait for the silence
    }
    if (r.value === null) return;
    this.portLost.delete(r.key);
    this.lastOkMonoMs.set(r.key, r.monoMs);
    this.persisted.lastSampleMs = tMs;
    this.watchInstruments(r, tMs);
    this.tracker.onSample(row, this.measurer);
  }

  /** Manual mode: typed readings become samples like any other (raw = value: there is no device). */
  private recordManual(command: Extract<RunCommand, { type: 'manual-reading' }>): void {
    const monoMs = this.clock.now();
    const held = this.state.holdStartedAtMs;
    if (held !== null) this.manualTimes.push(Math.max(0, (this.runClock.at(monoMs) - held) / 60_000));
    for (const [index, c] of this.channels.entries()) {
      const typed = c.role === 'gauge' ? command.gauges[c.key] : c.role === 'pressure' && command.pressureKpa !== undefined ? oilForPlatePressure(this.setup.snapshot, this.measurer.modelState, command.pressureKpa) : undefined;
      if (typed === undefined || typed === null) continue;
      this.onReading({ channelIndex: index, key: c.key, role: c.role, monoMs, wallMs: this.clock.wall(), raw: typed, value: typed, status: 'ok', deviceSeq: 0 });
    }
    this.measurements = this.measure();
    this.flush();
  }

  private flush(): void {
    const failing = this.securer.failure !== null;
    const rows = this.securer.secure(this.pending); // on disk before anything else sees them
    this.pending = [];
    if (failing !== (this.securer.failure !== null)) this.alarmNow(); // the journal just failed or recovered
    if (rows.length === 0) return;
    this.securedSeq = rows[rows.length - 1].seq;
    this.io.archiver.enqueue(this.runId, rows);
    this.io.pushSamples(this.runId, rows);
  }

  private measure(): Measurements {
    return this.measurer.measure();
  }

  // ---------------------------------------------------------------- decisions

  private evaluate(): void {
    if (this.closed) return;
    const now = this.nowMs();
    this.measurements = this.measure();
    const s = this.state;
    const stage = this.stages[s.stageIndex];
    const q = this.measurements.pressureKpa;
    const events: RunEventDraft[] = [];
    const observe = (o: Parameters<typeof applyObservation>[1]) => {
      const r = applyObservation(this.state, o, now);
      if (r) {
        this.persisted.lifecycle = r.state;
        events.push(...this.record(r.events));
      }
    };

    if (s.phase === 'pumping' && stage && q !== null && this.setup.rig.rig.mode === 'serial') {
      // The hold starts the first time the pressure arrives; drifting off afterwards is the load-drift
      // alarm's business (top up), not a reason to keep the hold clock waiting.
      if (reached(q, this.effectiveTarget(stage.targetKpa))) observe({ type: 'target-reached' }); // the model's hold series starts at it
    }
    this.trackLoadSteadiness(now, stage?.targetKpa ?? null, q);
    this.hold = null;
    if ((this.state.phase === 'holding' || this.state.phase === 'hold-met') && this.state.holdStartedAtMs !== null && stage) {
      const rule = stage.branch === 'seating' ? ({ kind: 'fixed', durationMin: seatingHoldMin(this.setup.plan) } as const) : this.setup.plan.holdRule;
      try {
        this.hold = evaluateHold(rule, this.tracker.points, {
          nowMin: Math.max(0, (now - this.state.holdStartedAtMs) / 60_000),
          // Unloading and reloading holds are judged on time and rate only: the stop limit ends the first loading.
          stopLimitMm: stopLimitApplies(stage) ? this.stopLimit() : Number.MAX_VALUE,
          maxHoldMin: this.setup.plan.termination.maxHoldMin,
          procedureId: this.setup.plan.procedureId,
          resolutionMm: rigResolutionMm(this.channels, this.kit),
        });
        if (this.hold.verdict === 'satisfied') observe({ type: 'hold-met', underDrift: this.standingDrift() });
      } catch (err) {
        debug('hold evaluation: %s', (err as Error).message);
      }
    }
    this.updateAlarms(now, events);
    if (events.length > 0) this.queueSave(events);
    this.io.pushView(this.runId, this.view());
  }

  /**
   * What to pump to for a stage, in the unit the operator reads at the rig: the pressure channel's
   * (the transducer or gauge on the jack), converted from the jack calibration's input unit.
   */
  private prompt(stage: PlannedStage) {
    const { jack, pressureUnit } = this.measurer.modelState;
    // Never beyond the jack calibration's range: the prompt then says why instead of giving a pressure.
    const gauge = jackGaugeFor(jack, { branch: jackBranchOf(this.setup.snapshot, stage.index, this.measurer.modelState), unit: pressureUnit, ratedPressureMpa: this.setup.rig.jack?.ratedPressureMpa });
    return nextStepPrompt({ stage, plate: this.setup.plan.plate, apparatusWeightKn: this.setup.plan.apparatusWeightKn, gaugePressureFor: gauge.pressureFor, gaugeUnit: gauge.unit });
  }

  /** Why the stage after the current one must not be applied (its prompt is beyond the jack's limits), or null. */
  private nextStageRefusal(): string | null {
    const following = this.stages[this.state.stageIndex + 1];
    const prompt = following && this.state.phase !== 'preparing' ? this.prompt(following) : null;
    return promptBlocksLoading(prompt) ? prompt?.problem ?? null : null;
  }

  private trackLoadSteadiness(now: number, targetKpa: number | null, q: number | null): void {
    const holding = this.state.phase === 'holding' || this.state.phase === 'hold-met';
    const steady = holding && targetKpa !== null && q !== null && !loadDriftAlarm({ targetKpa, actualKpa: q, deadWeightKpa: this.effectiveTarget(0) }).active;
    if (!steady) this.loadSteadySinceMs = null;
    else this.loadSteadySinceMs ??= now;
  }

  /** With the jack released the plate still carries the apparatus: no target can be below that pressure. */
  private effectiveTarget(targetKpa: number): number {
    return Math.max(targetKpa, this.setup.plan.apparatusWeightKn / plateAreaM2(this.setup.plan.plate));
  }

  private stopLimit(): number {
    return stopLimitMm(this.setup.plan.termination, this.setup.plan.plate.sizeMm);
  }

  /** The alarm rules now; `nowMono`: the clock's monotonic now (signal-lost measures silence on it). */
  private currentAlarms(nowMono: number): Alarm[] {
    const m = this.measurements;
    const s = this.state;
    const stage = this.stages[s.stageIndex];
    const alarms: Alarm[] = [];
    const during = s.phase === 'holding' || s.phase === 'hold-met';
    if (during && stage && m.pressureKpa !== null) alarms.push(loadDriftAlarm({ targetKpa: stage.targetKpa, actualKpa: m.pressureKpa, deadWeightKpa: this.effectiveTarget(0) }));
    const placed = this.channels.flatMap((c) => {
      const g = m.gauges.find((x) => x.key === c.key);
      return c.gauge && g?.settlementMm != null ? [{ xMm: c.gauge.xMm, yMm: c.gauge.yMm, settlementMm: g.settlementMm }] : [];
    });
    if (placed.length >= 2) alarms.push(tiltAlarm({ gauges: placed }));
    for (const c of this.channels) {
      const reading = this.measurer.latestOf(c.key);
      if (c.gauge && reading != null) alarms.push({ ...gaugeTravelAlarm({ gauge: c.key, readingMm: reading, travelMm: gaugeTravelMm(c, this.kit) ?? c.gauge.travelMm, sign: c.gauge.direction }) });
      if (this.setup.rig.rig.mode === 'serial' && s.phase !== 'preparing') {
        alarms.push(signalLostAlarm({ channel: c.key, lastSampleAtMs: this.lastOkMonoMs.get(c.key) ?? null, nowMs: nowMono, portLost: this.portLost.has(c.key) }));
      }
    }
    if (m.meanSettlementMm !== null && s.phase !== 'preparing' && (!stage || stopLimitApplies(stage))) alarms.push(stopLimitAlarm({ meanSettlementMm: m.meanSettlementMm, stopLimitMm: this.stopLimit() }));
    if (m.jackForceKn !== null) alarms.push(reactionCapacityAlarm({ jackForceKn: m.jackForceKn, capacityKn: this.setup.plan.reaction.capacityKn }));
    alarms.push(readingsUnsecuredAlarm({ failure: this.securer.failure, maxWaiting: this.securer.maxWaiting }));
    alarms.push(...this.instrumentAlarms());
    return alarms;
  }

  /** Calibration overdue or expiring, readings outside their calibrated range, unexplained gauge jumps. */
  private instrumentAlarms(): Alarm[] {
    const m = this.measurements;
    const jackId = this.setup.rig.rig.jackInstrumentId;
    return instrumentAlarms({
      channels: this.channels,
      kit: this.kit,
      calibrations: this.calibrations,
      jack: jackId == null ? null : { instrumentId: jackId, calibration: this.measurer.modelState.jack },
      oil: m.oilPressure === null ? null : { value: m.oilPressure, unit: m.oilUnit },
      watch: this.watch,
      sinceMs: this.state.stageStartedAtMs,
      nowWallMs: this.clock.wall(),
    });
  }

  /** Reconciles the alarms between evaluations, saving and pushing any change. */
  private alarmNow(): void {
    const events: RunEventDraft[] = [];
    this.updateAlarms(this.nowMs(), events);
    if (events.length === 0) return;
    this.queueSave(events);
    this.io.pushView(this.runId, this.view());
  }

  /** The standing load-drift alarm's words, or null: a hold met meanwhile is recorded as met under drift. */
  private standingDrift(): string | null {
    const drift = this.persisted.alarms['load-drift'];
    return drift && drift.state !== 'cleared' ? drift.alarm.message : null;
  }

  private updateAlarms(now: number, events: RunEventDraft[]): void {
    const { records, changes, pending } = reconcileAlarms(this.persisted.alarms, this.currentAlarms(this.clock.now()), now, this.alarmPending);
    this.persisted.alarms = records;
    this.alarmPending = pending;
    events.push(...this.record(changes.map((c) => ({ kind: `alarm-${c.action}`, atMs: now, userId: null, payload: { key: c.key, message: c.message } }))));
  }

  // ---------------------------------------------------------------- commands

  /** Applies a person's command, or throws CommandRefused with the reason. */
  async command(command: RunCommand, actor: Actor, version: number): Promise<RunView> {
    if (version !== this.state.version && needsCurrentVersion(command)) throw new CommandRefused('conflict', `The run changed (now version ${this.state.version}); look again and retry.`);
    const now = this.nowMs();
    if (command.type === 'acknowledge-alarm' || command.type === 'shelve-alarm') this.alarmCommand(command, actor, now);
    const gaugeReadings = Object.fromEntries(this.channels.flatMap((c) => (c.role === 'gauge' && this.measurer.latestOf(c.key) != null ? [[c.key, this.measurer.latestOf(c.key) as number]] : [])));
    const gaugeSigns = Object.fromEntries(this.channels.flatMap((c) => (c.gauge ? [[c.key, c.gauge.direction]] : [])));
    const r = applyCommand(this.state, command, {
      nowMs: now,
      actor,
      stages: this.stages,
      gaugeReadings,
      overdueInstruments: this.setup.overdueInstruments,
      gaugeSigns,
      unloading: { rule: unloadingRuleOf(this.setup.plan), planUnloadKpa: this.setup.plan.unloadReload.unloadKpa },
      nextStageRefusal: this.nextStageRefusal(),
    });
    if (!r.ok) throw new CommandRefused(r.code, r.message);
    this.stages = stagesAfterEvents(this.stages, r.events);
    if (command.type === 'gauge-reset') this.watch = watchReset(this.watch, command.channel, now);
    const before = this.state;
    // A finished hold's point on the curve is measured as the hold ended, before the command's events apply.
    if ((before.phase === 'holding' || before.phase === 'hold-met') && (r.state.stageIndex !== before.stageIndex || !ACTIVE_PHASES.includes(r.state.phase))) {
      this.recordStagePoint(before.stageIndex, now);
    }
    this.persisted.lifecycle = r.state;
    const events = this.record(r.events);
    if (command.type === 'manual-reading') this.recordManual(command);
    if (r.state.stageIndex !== before.stageIndex || (before.phase === 'preparing' && r.state.phase === 'pumping')) this.manualTimes = [];
    this.measurements = this.measure();
    await this.queueSave(events);
    if (!this.isActive) void this.closeAfterCommand();
    const view = this.view();
    this.io.pushView(this.runId, view);
    return view;
  }

  /**
   * A calibration recorded while the run goes on, for one of its instruments: it applies from now (the
   * run records which certificate, so every view applies it from the same sample on).
   */
  async applyCalibration(version: CalibrationVersion): Promise<void> {
    if (this.closed || !this.isActive || !version.calibration || !this.calibrationIds.has(version.instrumentId)) return;
    if (this.calibrationIds.get(version.instrumentId) === version.calibrationId) return;
    const events = this.record([{ kind: 'calibration-applied', atMs: this.nowMs(), userId: null, payload: { ...version } }]);
    this.measurements = this.measure();
    await this.queueSave(events);
    this.io.pushView(this.runId, this.view());
  }

  /** The point a finished stage leaves on the load–settlement curve (its end of hold). */
  private recordStagePoint(stageIndex: number, atMs: number): void {
    const stage = this.stages[stageIndex];
    const m = this.measure();
    if (!stage || m.pressureKpa === null || m.meanSettlementMm === null) return;
    this.persisted.stagePoints = [...(this.persisted.stagePoints ?? []), { stageIndex, branch: stage.branch, targetKpa: stage.targetKpa, pressureKpa: m.pressureKpa, settlementMm: m.meanSettlementMm, atMs }];
  }

  private alarmCommand(command: Extract<RunCommand, { type: 'acknowledge-alarm' | 'shelve-alarm' }>, actor: Actor, now: number): void {
    const record = this.persisted.alarms[command.key];
    const action: AlarmAction = command.type === 'acknowledge-alarm' ? { type: 'acknowledge', atMs: now, by: actor.name } : { type: 'shelve', atMs: now, by: actor.name, untilMs: now + command.minutes * 60_000, reason: command.reason };
    const r = reduceAlarm(record ?? null, action);
    if (!r.ok) throw new CommandRefused('invalid', r.error);
    this.persisted.alarms[command.key] = r.record;
  }

  private async closeAfterCommand(): Promise<void> {
    await this.stop();
    this.io.released?.(this.runId);
  }

  /** Saves state and events in order; while the database is away they wait here and are retried. */
  private queueSave(events: RunEventDraft[]): Promise<void> {
    this.unsaved.push(...events);
    this.saving = this.saving.then(() => this.flushSaves());
    return this.saving;
  }

  private async flushSaves(): Promise<void> {
    const events = this.unsaved;
    this.unsaved = [];
    try {
      await this.io.save(this.runId, { ...structuredClone(this.persisted), lastSeq: this.securedSeq, clock: this.runClock.persisted() }, events);
    } catch (err) {
      this.unsaved = events.concat(this.unsaved);
      debug('save failed (%s); %d events wait for the database', (err as Error).message, this.unsaved.length);
      if (!this.retryTimer) {
        this.retryTimer = setTimeout(() => {
          this.retryTimer = null;
          void this.queueSave([]);
        }, 1000);
      }
    }
  }

  /** Resolves once every state change and event so far is in the database. */
  async saved(): Promise<void> {
    while (this.unsaved.length > 0 || this.retryTimer) {
      await this.saving;
      if (this.unsaved.length > 0 || this.retryTimer) await new Promise((r) => setTimeout(r, 200));
    }
    await this.saving;
  }

  // ---------------------------------------------------------------- views

  setWatchers(watchers: { id: number; name: string; role: string }[]): void {
    this.watchers = new Map(watchers.map((w) => [String(w.id), w]));
  }

  view(): RunView {
    const s = this.state;
    const m = this.measurements;
    const now = this.nowMs();
    const stages = this.stages;
    const promptStage = s.phase === 'pumping' || s.phase === 'preparing' ? stages[s.stageIndex] : s.phase === 'hold-met' ? stages[s.stageIndex + 1] : undefined;
    const prompt = promptStage ? this.prompt(promptStage) : null;
    const holdMin = s.holdStartedAtMs === null ? null : (now - s.holdStartedAtMs) / 60_000;
    return {
      id: this.runId,
      planId: this.setup.planId,
      planName: this.setup.planName,
      procedureId: this.setup.plan.procedureId,
      rigId: this.setup.rig.rig.id,
      rigName: this.setup.rig.rig.name,
      manual: this.setup.rig.rig.mode === 'manual',
      channels: this.channels.map((c) => ({
        key: c.key,
        label: c.label,
        role: c.role,
        unit: channelUnit(c, c.instrumentId != null ? this.calibrations.get(c.instrumentId) : undefined),
        direction: c.gauge?.direction ?? null,
      })),
      plate: { shape: this.setup.plan.plate.shape, sizeMm: this.setup.plan.plate.sizeMm },
      holdRule: this.setup.plan.holdRule,
      stopLimitMm: this.stopLimit(),
      phase: s.phase,
      version: s.version,
      stageIndex: s.stageIndex,
      stages,
      controller: s.controller,
      calibrationOverride: s.calibrationOverride,
      overdueInstruments: this.setup.overdueInstruments,
      closedReason: s.closedReason,
      clock: { nowMs: now, speed: this.runClock.speed },
      stageStartedAtMs: s.stageStartedAtMs,
      holdStartedAtMs: s.holdStartedAtMs,
      holdMetAtMs: s.holdMetAtMs,
      live: {
        atMs: this.persisted.lastSampleMs,
        pressureKpa: m.pressureKpa,
        plateForceKn: m.plateForceKn,
        jackForceKn: m.jackForceKn,
        oilPressure: m.oilPressure,
        oilUnit: m.oilUnit,
        pressureProblem: m.pressureProblem,
        meanSettlementMm: m.meanSettlementMm,
        tiltSlope: m.tilt ? Math.tan(m.tilt.tilt.radians) : null,
        spreadMm: m.tilt?.spreadMm ?? null,
        gauges: m.gauges.map((g) => {
          const c = this.channels.find((x) => x.key === g.key);
          return { ...g, label: c?.label ?? g.key, travelMm: c ? gaugeTravelMm(c, this.kit) : null };
        }),
      },
      hold: this.hold,
      prompt,
      nextReading: holdMin !== null && this.isActive ? safeNextReading(this.setup.plan, holdMin) : null,
      // Manual mode: scheduled readings not typed in on time (1 min grace, common practice).
      readingFlags: holdMin !== null && this.isActive && this.setup.rig.rig.mode === 'manual' ? lateReadings(this.setup.plan.readingSchedule, this.manualTimes, holdMin, 1) : [],
      alarms: Object.values(this.persisted.alarms).filter((a) => a.state !== 'cleared'),
      watchers: [...this.watchers.values()],
      lastSeq: this.securedSeq,
      stagePoints: this.persisted.stagePoints ?? [],
      measurement: { setup: this.setup.snapshot, events: this.modelEvents },
    };
  }
}

function safeNextReading(plan: PlanInput, elapsedMin: number) {
  try {
    return nextReadingDue(plan.readingSchedule, Math.max(0, elapsedMin));
  } catch {
    return null;
  }
}

