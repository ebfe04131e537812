/**
 * One running test: reads its rig, journals and archives every sample, judges the hold, keeps the
 * alarms, and applies people's commands through the pure lifecycle reducer. It is the single
 * authority over its run's state; everything it decides is persisted and pushed to watchers.
 */
import createDebug from 'debug';
import { jackGaugeFor } from '../../shared/calibration/jack';
import { convertPressure, isPressureUnit } from '../../shared/calibration/units';
import { plateAreaM2, plateForceKn } from '../../shared/domain/plate';
import { type AlarmAction, reduceAlarm } from '../../shared/hold/alarm-lifecycle';
import { type Alarm, gaugeTravelAlarm, loadDriftAlarm, reactionCapacityAlarm, readingsUnsecuredAlarm, signalLostAlarm, stopLimitAlarm, stopLimitMm, tiltAlarm } from '../../shared/hold/alarms';
import { evaluateHold } from '../../shared/hold/evaluate';
import { emptyInstrumentWatch, gaugeResolutionMm, gaugeTravelMm, instrumentAlarms, type Kit, rigResolutionMm, watchReading, watchReset } from '../../shared/hold/instrument-alarms';
import { nextStepPrompt } from '../../shared/hold/next-step';
import { lateReadings, nextReadingDue } from '../../shared/hold/schedule';
import type { HoldEvaluation } from '../../shared/hold/verdict';
import type { PlannedStage } from '../../shared/plans/stages';
import { reconcileAlarms } from '../../shared/runs/alarm-board';
import { type Actor, type RunEventDraft, type RunState, applyCommand, applyObservation, needsCurrentVersion } from '../../shared/runs/lifecycle';
import { type MeasurementSetup, type Measurements, jackGaugePressure, measure } from '../../shared/runs/measurements';
import { SAMPLE_STATUS, type SampleRow, fromMicro, toMicro } from '../../shared/runs/samples';
import type { PlanInput } from '../../shared/schemas/plans';
import { ACTIVE_PHASES, type RunCommand, type RunView } from '../../shared/schemas/runs';
import { type ChannelReading, RigConnection, channelUnit } from '../acquisition/rig-connection';
import type { RigContext } from '../acquisition/rig-context';
import type { PersistedRun } from '../models/run';
import type { Archiver } from './archiver';
import type { Journal } from './journal';
import { runTime } from './run-clock';
import { SampleSecurer } from './sample-securer';

const debug = createDebug('sscope:runs:engine');

/** How the engine reaches the outside world; the run manager provides these. */
export interface EngineIo {
  archiver: Archiver;
  journal: Journal;
  /** Saves the persisted state and the new events in one transaction. */
  save(runId: number, persisted: PersistedRun, events: RunEventDraft[]): Promise<void>;
  pushView(runId: number, view: RunView): void;
  pushSamples(runId: number, rows: SampleRow[]): void;
  /** Sends an operator action to a simulated rig's control channel (demo rigs only). */
  simulator?: (action: 'pump' | 'top-up' | 'release' | 'gauge-reset', body: object) => void;
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
/** Hold-series points are kept at most this often (run time), so a 24-hour hold stays small. */
const SERIES_STEP_MS = 2000;
/** The target counts as reached within max(2 %, 2 kPa) (common practice, as the load-drift rule). */
const reached = (actual: number, target: number) => Math.abs(actual - target) <= Math.max(0.02 * target, 2);
const NO_KIT: Kit = new Map();

export class RunEngine {
  private persisted: PersistedRun;
  private readonly connection: RigConnection | null;
  private readonly latest = new Map<string, number | null>();
  private readonly lastOkWallMs = new Map<string, number>();
  /** Channels whose port reported itself gone; cleared by their next good sample. */
  private readonly portLost = new Set<string>();
  /** What the instrument alarms remember between readings: last readings, gauge jumps, recorded resets. */
  private watch = emptyInstrumentWatch();
  private pending: SampleRow[] = [];
  /** Journals new rows; keeps (bounded) what a refusing journal cannot take. */
  private readonly securer: SampleSecurer;
  private series: { tMin: number; settlementMm: number }[] = [];
  private lastSeriesMs = -Infinity;
  private hold: HoldEvaluation | null = null;
  private measurements: Measurements;
  private readonly setupM: MeasurementSetup;
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

  constructor(
    private readonly setup: EngineSetup,
    private readonly io: EngineIo,
  ) {
    this.persisted = structuredClone(setup.persisted);
    this.securer = new SampleSecurer(io.journal);
    this.securedSeq = this.persisted.lastSeq;
    const pressureChannel = setup.rig.rig.channels.find((c) => c.role === 'pressure');
    this.setupM = {
      channels: setup.rig.rig.channels,
      plate: setup.plan.plate,
      apparatusWeightKn: setup.plan.apparatusWeightKn,
      jack: setup.rig.jack?.calibration ?? null,
      pressureUnit: pressureChannel ? channelUnit(pressureChannel, pressureChannel.instrumentId != null ? setup.rig.calibrations.get(pressureChannel.instrumentId) : undefined) : null,
    };
    this.measurements = this.measure();
    this.connection = setup.rig.rig.mode === 'serial' ? new RigConnection({ channels: setup.rig.rig.channels, calibrations: setup.rig.calibrations, onReading: (r) => this.onReading(r) }) : null;
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

  /** Starts reading. `restoredSeries` rebuilds the current hold's settlement–time series after a restart. */
  start(restoredSeries: { tMin: number; settlementMm: number }[] = []): void {
    this.series = restoredSeries;
    this.connection?.start();
    this.timers.push(setInterval(() => this.flush(), FLUSH_MS), setInterval(() => this.evaluate(), EVALUATE_MS));
  }

  /** Stops reading and waits until every sample is journaled, archived and the state saved. */
  async stop(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    for (const t of this.timers) clearInterval(t);
    this.flush(); // now, so the view of the command that closed the run already counts every sample (lastSeq)
    await this.connection?.stop();
    this.flush();
    await this.queueSave([]);
    // Bounded, so a shutdown with the database away still ends; the journal keeps the samples.
    await Promise.race([this.saved(), new Promise((r) => setTimeout(r, 10_000).unref())]);
    await this.io.archiver.drain();
  }

  nowMs(wallMs = Date.now()): number {
    return runTime(this.persisted.clock, wallMs);
  }

  // ---------------------------------------------------------------- samples

  private onReading(r: ChannelReading): void {
    if (this.closed) return;
    const tMs = Math.round(this.nowMs(r.wallMs));
    const seq = ++this.persisted.lastSeq;
    this.pending.push({ seq, tMs, channel: r.channelIndex, raw: r.raw === null ? null : toMicro(r.raw), value: r.value === null ? null : toMicro(r.value), status: SAMPLE_STATUS[r.status] });
    if (r.status === 'disconnected' && !this.portLost.has(r.key)) {
      this.portLost.add(r.key);
      this.alarmNow(); // a pulled cable is known at once (QUALITY R3): no need to wait for the silence
    }
    if (r.value === null) return;
    this.portLost.delete(r.key);
    this.latest.set(r.key, r.value);
    this.lastOkWallMs.set(r.key, r.wallMs);
    this.persisted.lastSampleMs = tMs;
    this.watchInstruments(r, tMs);
    if (r.role === 'gauge') this.recordSettlement(tMs);
  }

  /** Manual mode: typed readings become samples like any other (raw = value: there is no device). */
  private recordManual(command: Extract<RunCommand, { type: 'manual-reading' }>): void {
    const wallMs = Date.now();
    const held = this.state.holdStartedAtMs;
    if (held !== null) this.manualTimes.push(Math.max(0, (this.nowMs(wallMs) - held) / 60_000));
    const channels = this.setup.rig.rig.channels;
    for (const [index, c] of channels.entries()) {
      const typed = c.role === 'gauge' ? command.gauges[c.key] : c.role === 'pressure' && command.pressureKpa !== undefined ? this.oilForPlatePressure(command.pressureKpa) : undefined;
      if (typed === undefined || typed === null) continue;
      this.onReading({ channelIndex: index, key: c.key, role: c.role, wallMs, raw: typed, value: typed, status: 'ok', deviceSeq: 0 });
    }
    this.measurements = this.measure();
    this.flush();
  }

  /** A typed plate pressure, stored as the oil pressure (in the pressure channel's unit) that gives it, so every pressure sample means the same. */
  private oilForPlatePressure(kpa: number): number | null {
    const jack = this.setupM.jack;
    if (!jack) return null;
    const oil = jackGaugePressure(jack, this.jackBranch(this.state.stageIndex))(Math.max(0, plateForceKn(this.setupM.plate, kpa) - this.setupM.apparatusWeightKn));
    const unit = this.setupM.pressureUnit;
    if (oil === null || !unit || unit === jack.inputUnit) return oil;
    return isPressureUnit(unit) && isPressureUnit(jack.inputUnit) ? convertPressure(oil, jack.inputUnit, unit) : null;
  }

  /**
   * Adds a point to the hold's settlement–time series. Called on every gauge sample, so it measures
   * only when a point is due (inside a hold, at most every SERIES_STEP_MS); the view's figures are
   * refreshed by the evaluation tick.
   */
  private recordSettlement(tMs: number): void {
    const s = this.state;
    if (s.holdStartedAtMs === null || (s.phase !== 'holding' && s.phase !== 'hold-met')) return;
    if (tMs - this.lastSeriesMs < SERIES_STEP_MS && this.setup.rig.rig.mode === 'serial') return;
    this.measurements = this.measure();
    const mean = this.measurements.meanSettlementMm;
    if (mean === null) return;
    this.lastSeriesMs = tMs;
    this.series.push({ tMin: Math.max(0, (tMs - s.holdStartedAtMs) / 60_000), settlementMm: mean });
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
    return measure(this.setupM, this.latest, this.state.zeros, this.state.resetOffsets, this.jackBranch(this.state.stageIndex));
  }

  /** Unloading stages read the jack on its falling branch. */
  private jackBranch(stageIndex: number): 'rising' | 'falling' {
    return this.setup.stages[stageIndex]?.branch === 'unloading' ? 'falling' : 'rising';
  }

  private get kit(): Kit {
    return this.setup.rig.kit ?? NO_KIT;
  }

  /** Feeds the instrument alarms' memory; jumps are looked for under a held load only. */
  private watchInstruments(r: ChannelReading, tMs: number): void {
    const channel = this.setup.rig.rig.channels[r.channelIndex];
    if (!channel || r.value === null) return;
    const held = this.state.phase === 'holding' || this.state.phase === 'hold-met';
    this.watch = watchReading(this.watch, { key: r.key, role: r.role, tMs, raw: r.raw, value: r.value }, { resolutionMm: gaugeResolutionMm(channel, this.kit), held });
  }

  // ---------------------------------------------------------------- decisions

  private evaluate(): void {
    if (this.closed) return;
    const now = this.nowMs();
    this.measurements = this.measure();
    const s = this.state;
    const stage = this.setup.stages[s.stageIndex];
    const q = this.measurements.pressureKpa;
    const events: RunEventDraft[] = [];
    const observe = (o: Parameters<typeof applyObservation>[1]) => {
      const r = applyObservation(this.state, o, now);
      if (r) {
        this.persisted.lifecycle = r.state;
        events.push(...r.events);
      }
    };

    if (s.phase === 'pumping' && stage && q !== null && this.setup.rig.rig.mode === 'serial') {
      // The hold starts the first time the pressure arrives; drifting off afterwards is the load-drift
      // alarm's business (top up), not a reason to keep the hold clock waiting.
      if (reached(q, this.effectiveTarget(stage.targetKpa))) {
        observe({ type: 'target-reached' });
        this.series = [];
        this.lastSeriesMs = -Infinity;
        this.recordSettlement(now);
      }
    }
    this.hold = null;
    if ((this.state.phase === 'holding' || this.state.phase === 'hold-met') && this.state.holdStartedAtMs !== null && stage) {
      const rule = stage.branch === 'seating' ? ({ kind: 'fixed', durationMin: 0.5 } as const) : this.setup.plan.holdRule;
      try {
        this.hold = evaluateHold(rule, this.series, {
          nowMin: Math.max(0, (now - this.state.holdStartedAtMs) / 60_000),
          stopLimitMm: this.stopLimit(),
          maxHoldMin: this.setup.plan.termination.maxHoldMin,
          procedureId: this.setup.plan.procedureId,
          resolutionMm: rigResolutionMm(this.setup.rig.rig.channels, this.kit),
        });
        if (this.hold.verdict === 'satisfied') observe({ type: 'hold-met' });
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
    // Never beyond the jack calibration's range: the prompt then says why instead of giving a pressure.
    const gauge = jackGaugeFor(this.setup.rig.jack?.calibration ?? null, { branch: this.jackBranch(stage.index), unit: this.setupM.pressureUnit, ratedPressureMpa: this.setup.rig.jack?.ratedPressureMpa });
    return nextStepPrompt({ stage, plate: this.setup.plan.plate, apparatusWeightKn: this.setup.plan.apparatusWeightKn, gaugePressureFor: gauge.pressureFor, gaugeUnit: gauge.unit });
  }

  /** With the jack released the plate still carries the apparatus: no target can be below that pressure. */
  private effectiveTarget(targetKpa: number): number {
    return Math.max(targetKpa, this.setup.plan.apparatusWeightKn / plateAreaM2(this.setup.plan.plate));
  }

  private stopLimit(): number {
    return stopLimitMm(this.setup.plan.termination, this.setup.plan.plate.sizeMm);
  }

  private currentAlarms(nowWall: number): Alarm[] {
    const m = this.measurements;
    const s = this.state;
    const stage = this.setup.stages[s.stageIndex];
    const alarms: Alarm[] = [];
    const during = s.phase === 'holding' || s.phase === 'hold-met';
    if (during && stage && m.pressureKpa !== null) alarms.push(loadDriftAlarm({ targetKpa: this.effectiveTarget(stage.targetKpa), actualKpa: m.pressureKpa }));
    const placed = this.setup.rig.rig.channels.flatMap((c) => {
      const g = m.gauges.find((x) => x.key === c.key);
      return c.gauge && g?.settlementMm != null ? [{ xMm: c.gauge.xMm, yMm: c.gauge.yMm, settlementMm: g.settlementMm }] : [];
    });
    if (placed.length >= 2) alarms.push(tiltAlarm({ gauges: placed }));
    for (const c of this.setup.rig.rig.channels) {
      const reading = this.latest.get(c.key);
      if (c.gauge && reading != null) alarms.push({ ...gaugeTravelAlarm({ gauge: c.key, readingMm: reading, travelMm: gaugeTravelMm(c, this.kit) ?? c.gauge.travelMm, sign: c.gauge.direction }) });
      if (this.setup.rig.rig.mode === 'serial' && s.phase !== 'preparing') {
        alarms.push(signalLostAlarm({ channel: c.key, lastSampleAtMs: this.lastOkWallMs.get(c.key) ?? null, nowMs: nowWall, portLost: this.portLost.has(c.key) }));
      }
    }
    if (m.meanSettlementMm !== null && s.phase !== 'preparing') alarms.push(stopLimitAlarm({ meanSettlementMm: m.meanSettlementMm, stopLimitMm: this.stopLimit() }));
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
      channels: this.setup.rig.rig.channels,
      kit: this.kit,
      calibrations: this.setup.rig.calibrations,
      jack: jackId == null ? null : { instrumentId: jackId, calibration: this.setup.rig.jack?.calibration ?? null },
      oil: m.oilPressure === null ? null : { value: m.oilPressure, unit: m.oilUnit },
      watch: this.watch,
      sinceMs: this.state.stageStartedAtMs,
      nowWallMs: Date.now(),
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

  private updateAlarms(now: number, events: RunEventDraft[]): void {
    const { records, changes } = reconcileAlarms(this.persisted.alarms, this.currentAlarms(Date.now()), now);
    this.persisted.alarms = records;
    for (const c of changes) events.push({ kind: `alarm-${c.action}`, atMs: now, userId: null, payload: { key: c.key, message: c.message } });
  }

  // ---------------------------------------------------------------- commands

  /** Applies a person's command, or throws CommandRefused with the reason. */
  async command(command: RunCommand, actor: Actor, version: number): Promise<RunView> {
    if (version !== this.state.version && needsCurrentVersion(command)) throw new CommandRefused('conflict', `The run changed (now version ${this.state.version}); look again and retry.`);
    const now = this.nowMs();
    if (command.type === 'acknowledge-alarm' || command.type === 'shelve-alarm') this.alarmCommand(command, actor, now);
    const gaugeReadings = Object.fromEntries(this.setup.rig.rig.channels.filter((c) => c.role === 'gauge' && this.latest.get(c.key) != null).map((c) => [c.key, this.latest.get(c.key)!]));
    const gaugeSigns = Object.fromEntries(this.setup.rig.rig.channels.flatMap((c) => (c.gauge ? [[c.key, c.gauge.direction]] : [])));
    const r = applyCommand(this.state, command, { nowMs: now, actor, stages: this.setup.stages, gaugeReadings, overdueInstruments: this.setup.overdueInstruments, gaugeSigns });
    if (!r.ok) throw new CommandRefused(r.code, r.message);
    if (command.type === 'gauge-reset') this.watch = watchReset(this.watch, command.channel, now);
    const before = this.state;
    this.persisted.lifecycle = r.state;
    if (command.type === 'manual-reading') this.recordManual(command);
    if ((before.phase === 'holding' || before.phase === 'hold-met') && (r.state.stageIndex !== before.stageIndex || !ACTIVE_PHASES.includes(r.state.phase))) {
      this.recordStagePoint(before.stageIndex, now);
    }
    if (r.state.stageIndex !== before.stageIndex || (before.phase === 'preparing' && r.state.phase === 'pumping')) {
      this.series = [];
      this.manualTimes = [];
    }
    if (command.type === 'stage-reached') this.recordSettlement(now);
    this.drive(command, r.state);
    await this.queueSave(r.events);
    if (!this.isActive) void this.closeAfterCommand();
    const view = this.view();
    this.io.pushView(this.runId, view);
    return view;
  }

  /** The point a finished stage leaves on the load–settlement curve (its end of hold). */
  private recordStagePoint(stageIndex: number, atMs: number): void {
    const stage = this.setup.stages[stageIndex];
    const m = this.measurements;
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

  /** A simulated rig does what the operator's hands would do. */
  private drive(command: RunCommand, state: RunState): void {
    const sim = this.io.simulator;
    if (!sim) return;
    const stage = this.setup.stages[state.stageIndex];
    if ((command.type === 'start' || command.type === 'advance') && stage) {
      if (stage.targetKpa === 0) sim('release', {});
      else sim('pump', { pressureKpa: stage.targetKpa });
    } else if (command.type === 'top-up') sim('top-up', {});
    else if (command.type === 'finish' || command.type === 'stop') sim('release', {});
  }

  private async closeAfterCommand(): Promise<void> {
    await this.stop();
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
      await this.io.save(this.runId, { ...structuredClone(this.persisted), lastSeq: this.securedSeq }, events);
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

  /** A closed run shown again: its last recorded value per channel (calibrated, micro-units) stands in for live readings. */
  primeLatest(lastByChannel: ReadonlyMap<number, number>): void {
    this.setup.rig.rig.channels.forEach((c, i) => {
      const v = lastByChannel.get(i);
      if (v !== undefined) this.latest.set(c.key, fromMicro(v));
    });
    this.measurements = this.measure();
  }

  setWatchers(watchers: { id: number; name: string; role: string }[]): void {
    this.watchers = new Map(watchers.map((w) => [String(w.id), w]));
  }

  view(): RunView {
    const s = this.state;
    const m = this.measurements;
    const now = this.nowMs();
    const stages = this.setup.stages;
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
      channels: this.setup.rig.rig.channels.map((c) => ({
        key: c.key,
        label: c.label,
        role: c.role,
        unit: channelUnit(c, c.instrumentId != null ? this.setup.rig.calibrations.get(c.instrumentId) : undefined),
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
      clock: { nowMs: now, speed: this.persisted.clock.speed },
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
          const c = this.setup.rig.rig.channels.find((x) => x.key === g.key);
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

