/**
 * Keeps one engine per active run: creates runs from a plan and a rig, resumes unfinished runs after
 * a restart (state from the database, samples from the journal, the outage marked as a gap), routes
 * commands, and hands live data to the realtime layer. A run that closes is published ('run-closed')
 * for whoever subscribed, and let go: its engine leaves the table and its journal is deleted once the
 * database holds every sample in it.
 */
import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';
import createDebug from 'debug';
import { QueryTypes, type Sequelize } from 'sequelize';
import { buildStageSequence } from '../../shared/plans/stages';
import { UNLOADING_EVENT, unloadingReasonText } from '../../shared/plans/unloading';
import { type Actor, type RunEventDraft, initialRunState } from '../../shared/runs/lifecycle';
import type { ModelEvent, ModelSample } from '../../shared/runs/measurement-model';
import type { SampleRow } from '../../shared/runs/samples';
import { ACTIVE_PHASES, type RunView } from '../../shared/schemas/runs';
import { onCalibrationRecorded } from '../acquisition/calibration-events';
import { type RigContext, currentCalibrationVersion, loadRigContext, setupSnapshot } from '../acquisition/rig-context';
import { transaction } from '../db/transaction';
import { badRequest, conflict, notFound } from '../http/errors';
import { type PersistedRun, Run } from '../models/run';
import { RunEvent } from '../models/run-event';
import { TestPlan } from '../models/test-plan';
import { type AuditInput, audit } from '../services/audit';
import { DomainEvents } from '../services/domain-events';
import { Archiver } from './archiver';
import { Journal } from './journal';
import { newRunClock, runTime } from './run-clock';
import { type EngineIo, RunEngine } from './run-engine';

const debug = createDebug('sscope:runs');

export interface RunManagerOptions {
  sequelize: Sequelize;
  dataDir: string;
  pushView: (runId: number, view: RunView) => void;
  pushSamples: (runId: number, rows: SampleRow[]) => void;
  /** Where 'run-closed' is published (the server's bus); a private one when not given. */
  events?: DomainEvents;
  /** Samples per journal segment file (tests make it small). Default the journal's. */
  journalSegmentSize?: number;
}

/** Closed runs whose console view is kept ready (their engines hold no rig and no journal). */
const CLOSED_VIEWS = 8;

/** The journal a closed run's engine gets: it takes no readings. */
const NO_READINGS = {
  append(): never {
    throw new Error('a closed run takes no readings');
  },
};

function overdue(rig: RigContext): string[] {
  const ids = [...rig.rig.channels.map((c) => c.instrumentId), rig.rig.jackInstrumentId].filter((id): id is number => id != null);
  return [...new Set(ids)].filter((id) => rig.status.get(id) === 'overdue' || rig.status.get(id) === 'uncalibrated').map((id) => rig.serials.get(id) ?? `#${id}`);
}

export class RunManager {
  private readonly engines = new Map<number, RunEngine>();
  /** Recently viewed closed runs, oldest first (bounded: memory does not grow with the runs ever shown). */
  private readonly closedViews = new Map<number, RunEngine>();
  readonly archiver: Archiver;
  readonly events: DomainEvents;
  private readonly journals = new Map<number, Journal>();
  /** Closed runs whose journal is deleted as soon as the archive holds all of it. */
  private readonly retiring = new Set<number>();
  private readonly stopListening: () => void;

  constructor(private readonly o: RunManagerOptions) {
    this.events = o.events ?? new DomainEvents();
    this.archiver = new Archiver(o.sequelize, {
      onArchived: (runId, seq) => {
        this.journals.get(runId)?.markArchived(seq);
        this.releaseJournal(runId);
      },
    });
    this.stopListening = onCalibrationRecorded((id) => void this.calibrationRecorded(id));
  }

  /** Runs with a journal still open (tests: closed runs leave none behind). */
  get openJournals(): number[] {
    return [...this.journals.keys()];
  }

  /** A new calibration of an instrument: every active run using it applies it from now. */
  private async calibrationRecorded(instrumentId: number): Promise<void> {
    const version = await currentCalibrationVersion(instrumentId);
    if (!version) return;
    for (const engine of this.engines.values()) {
      if (!engine.isActive) continue;
      try {
        await engine.applyCalibration(version);
      } catch (err) {
        debug('calibration of instrument %d for run %d: %s', instrumentId, engine.runId, (err as Error).message);
      }
    }
  }

  engine(runId: number): RunEngine | undefined {
    return this.engines.get(runId);
  }

  /**
   * The engine of a run, loading a closed run's (without reading its rig) so its console view can
   * still be shown. Undefined for unknown runs and for imported ones (they have no rig).
   */
  async load(runId: number): Promise<RunEngine | undefined> {
    const loaded = this.engines.get(runId) ?? this.closedViews.get(runId);
    if (loaded) return loaded;
    const run = await Run.findByPk(runId);
    if (!run || run.rigId == null || ACTIVE_PHASES.includes(run.status)) return undefined;
    const plan = await TestPlan.findByPk(run.planId);
    if (!plan) return undefined;
    // Its last recorded value per channel stands in for live readings, measured as at the end of the run.
    const last = (await this.o.sequelize.query(
      'SELECT s.seq, s.t_ms AS tMs, s.channel, s.value FROM samples s JOIN (SELECT channel, MAX(seq) AS seq FROM samples WHERE run_id = ? AND value IS NOT NULL GROUP BY channel) m ON m.seq = s.seq WHERE s.run_id = ? ORDER BY s.seq',
      { replacements: [runId, runId], type: QueryTypes.SELECT },
    )) as ModelSample[];
    const engine = this.launch(run, plan, await loadRigContext(run.rigId, run.createdAt), run.state, { events: await this.runEvents(runId), samples: last.map(modelSample) }, false);
    this.closedViews.set(runId, engine);
    for (const id of this.closedViews.keys()) if (this.closedViews.size > CLOSED_VIEWS) this.closedViews.delete(id);
    return engine;
  }

  /** Why a rig's ports are taken, or null. */
  rigBusy(rigId: number): string | null {
    for (const e of this.engines.values()) if (e.rigId === rigId && e.isActive) return `Run ${e.runId} is reading this rig.`;
    return null;
  }

  async create(planId: number, rigId: number, actor: Actor): Promise<RunView> {
    const plan = await TestPlan.findByPk(planId);
    if (!plan) throw badRequest('planId: no such test plan', 'planId');
    let rig: RigContext;
    try {
      rig = await loadRigContext(rigId);
    } catch {
      throw badRequest('rigId: no such rig', 'rigId');
    }
    const busy = this.rigBusy(rigId);
    if (busy) throw conflict(`rigId: ${busy}`, 'rigId');
    const input = plan.toInput();
    const setup = setupSnapshot(input, buildStageSequence(input), rig);
    const persisted: PersistedRun = { lifecycle: initialRunState(), clock: newRunClock(rig.rig.simulator?.speed ?? 1), alarms: {}, lastSeq: 0, lastSampleMs: null, setup };
    const run = await transaction(async (t) => {
      const created = await Run.create({ planId, rigId, status: 'preparing', state: persisted, startedAt: null, finishedAt: null, createdBy: actor.id }, { transaction: t });
      await RunEvent.create({ runId: created.id, at: new Date(persisted.clock.anchorRunMs), kind: 'run-created', userId: actor.id, payload: { planId, rigId, rig: rig.rig.name } }, { transaction: t });
      return created;
    });
    const engine = this.launch(run, plan, rig, persisted);
    engine.start();
    return engine.view();
  }

  /**
   * Resumes every unfinished run (after a crash or restart), and archives what closed runs left in
   * their journals (a stop whose deadline came before the database took everything).
   */
  async resumeAll(): Promise<number> {
    const runs = await Run.findAll({ where: { status: [...ACTIVE_PHASES] } });
    this.recoverClosedJournals(new Set(runs.map((r) => r.id)));
    for (const run of runs) {
      try {
        await this.resume(run);
      } catch (err) {
        debug('cannot resume run %d: %s', run.id, (err as Error).message);
      }
    }
    return runs.length;
  }

  private async resume(run: Run): Promise<void> {
    const plan = await TestPlan.findByPk(run.planId);
    if (!plan || run.rigId == null) return;
    const rig = await loadRigContext(run.rigId, run.state.setup ? undefined : run.createdAt);
    const persisted = run.state;
    const journal = this.journal(run.id);
    const backlog = journal.unarchived();
    if (backlog.length > 0) {
      persisted.lastSeq = Math.max(persisted.lastSeq, backlog[backlog.length - 1].seq);
      persisted.lastSampleMs = Math.max(persisted.lastSampleMs ?? 0, backlog[backlog.length - 1].tMs);
      this.archiver.enqueue(run.id, backlog);
    }
    const dbMax = await this.maxSeq(run.id);
    persisted.lastSeq = Math.max(persisted.lastSeq, dbMax);
    const now = runTime(persisted.clock, Date.now());
    await this.saveEvents(run.id, [{ kind: 'outage', atMs: now, userId: null, payload: { fromMs: persisted.lastSampleMs, toMs: now, note: 'server restarted; no samples in this gap' } }]);
    const engine = this.launch(run, plan, rig, persisted, { events: await this.runEvents(run.id), samples: await this.stageSamples(run.id, persisted) });
    engine.start();
  }

  /** Every journal folder of a run that is not active: its unarchived rows go to the archive, then the journal goes. */
  private recoverClosedJournals(active: Set<number>): void {
    const dir = path.join(this.o.dataDir, 'journal');
    if (!existsSync(dir)) return;
    for (const name of readdirSync(dir)) {
      const runId = Number(/^run-(\d+)$/.exec(name)?.[1]);
      if (!Number.isSafeInteger(runId) || active.has(runId) || this.engines.has(runId)) continue;
      const backlog = this.journal(runId).unarchived();
      this.retiring.add(runId);
      if (backlog.length > 0) this.archiver.enqueue(runId, backlog);
      else this.releaseJournal(runId);
    }
  }

  /**
   * An engine for a run: `live` for an active run (its journal, told when a command closes it), else
   * one that only shows a closed run's console view.
   */
  private launch(run: Run, plan: TestPlan, rig: RigContext, persisted: PersistedRun, history?: { events: ModelEvent[]; samples: ModelSample[] }, live = true): RunEngine {
    const input = plan.toInput();
    const stages = buildStageSequence(input);
    // A run created before snapshots were kept gets one from its rig (calibrations recorded by its creation).
    persisted.setup ??= setupSnapshot(input, stages, rig);
    const io: EngineIo = {
      archiver: this.archiver,
      journal: live ? this.journal(run.id) : NO_READINGS,
      save: (runId, state, events) => this.save(runId, state, events),
      pushView: this.o.pushView,
      pushSamples: this.o.pushSamples,
      released: (runId) => this.release(runId),
    };
    const engine = new RunEngine({ runId: run.id, planId: plan.id, planName: plan.name, plan: input, stages, rig, persisted, overdueInstruments: overdue(rig), snapshot: persisted.setup, history }, io);
    if (live) this.engines.set(run.id, engine);
    return engine;
  }

  /** A run a command closed, its engine stopped: the engine leaves the table, the journal follows once archived. */
  private release(runId: number): void {
    const engine = this.engines.get(runId);
    if (!engine || engine.isActive) return;
    this.engines.delete(runId);
    this.retiring.add(runId);
    this.releaseJournal(runId);
  }

  /** Deletes a retiring run's journal when the archive queue holds none of its rows (so the database has them all). */
  private releaseJournal(runId: number): void {
    if (!this.retiring.has(runId) || this.engines.has(runId) || this.archiver.queued(runId, 0).length > 0) return;
    this.journals.get(runId)?.destroy();
    this.journals.delete(runId);
    this.retiring.delete(runId);
    debug('run %d released: its journal is archived and deleted', runId);
  }

  private journal(runId: number): Journal {
    let j = this.journals.get(runId);
    if (!j) {
      j = new Journal({ dir: path.join(this.o.dataDir, 'journal'), runId, segmentSize: this.o.journalSegmentSize });
      this.journals.set(runId, j);
    }
    return j;
  }

  private async save(runId: number, persisted: PersistedRun, events: RunEventDraft[]): Promise<void> {
    const phase = persisted.lifecycle.phase;
    const closed = !ACTIVE_PHASES.includes(phase);
    let justClosed = false;
    await transaction(async (t) => {
      const run = await Run.findByPk(runId, { transaction: t });
      if (!run) return;
      justClosed = closed && ACTIVE_PHASES.includes(run.status);
      await run.update(
        {
          status: phase,
          state: persisted,
          startedAt: run.startedAt ?? (phase !== 'preparing' ? new Date() : null),
          finishedAt: closed ? (run.finishedAt ?? new Date()) : null,
        },
        { transaction: t },
      );
      if (events.length) await RunEvent.bulkCreate(events.map((e) => ({ runId, at: new Date(e.atMs), kind: e.kind, userId: e.userId, payload: e.payload })), { transaction: t });
      // Going to unloading changes the stages the run follows: audited with its reason, with the event.
      for (const e of events) if (e.kind === UNLOADING_EVENT) await audit(unloadingAudit(runId, e), t);
    });
    // Mail notices, replay rollups and the like subscribe to this (the run layer knows none of them).
    if (justClosed) this.events.publish('run-closed', { runId, phase: phase === 'completed' ? 'completed' : 'stopped', reason: persisted.lifecycle.closedReason ?? null });
  }

  private saveEvents(runId: number, events: RunEventDraft[]) {
    return RunEvent.bulkCreate(events.map((e) => ({ runId, at: new Date(e.atMs), kind: e.kind, userId: e.userId, payload: e.payload })));
  }

  private async maxSeq(runId: number): Promise<number> {
    const [row] = (await this.o.sequelize.query('SELECT COALESCE(MAX(seq), 0) AS m FROM samples WHERE run_id = ?', { replacements: [runId], type: QueryTypes.SELECT })) as { m: number }[];
    return Number(row.m);
  }

  /** Every event of a run, oldest first, as the measurement model reads them. */
  private async runEvents(runId: number): Promise<ModelEvent[]> {
    return (await RunEvent.findAll({ where: { runId }, order: [['id', 'ASC']] })).map((e) => ({ kind: e.kind, atMs: e.at.getTime(), payload: e.payload }));
  }

  /**
   * The samples the engine rebuilds its measurements and the hold series from after a restart, through
   * the same model that keeps them live: the last good one of each channel before the current stage
   * (a gauge read seldom still counts) and every one since the stage began, in sequence order.
   */
  private async stageSamples(runId: number, persisted: PersistedRun): Promise<ModelSample[]> {
    const from = persisted.lifecycle.stageStartedAtMs ?? persisted.lifecycle.holdStartedAtMs;
    await this.archiver.drain();
    const since = from ?? Number.MAX_SAFE_INTEGER;
    const rows = (await this.o.sequelize.query(
      `SELECT s.seq, s.t_ms AS tMs, s.channel, s.value FROM samples s
         JOIN (SELECT channel, MAX(seq) AS seq FROM samples WHERE run_id = :id AND t_ms < :since AND value IS NOT NULL GROUP BY channel) m ON m.seq = s.seq
         WHERE s.run_id = :id
       UNION ALL
       SELECT seq, t_ms, channel, value FROM samples WHERE run_id = :id AND t_ms >= :since
       ORDER BY seq`,
      { replacements: { id: runId, since }, type: QueryTypes.SELECT },
    )) as ModelSample[];
    return rows.map(modelSample);
  }

  /**
   * Where a run's stream stands, read in one synchronous step (for a gap-free backfill): every sample
   * at or below `archived` is in the database, and `queued` holds every secured one above it with a
   * seq above `afterSeq`. `archived` is infinite when nothing waits and no journal is open.
   */
  streamTail(runId: number, afterSeq: number): { archived: number; queued: SampleRow[] } {
    const waiting = this.archiver.queued(runId, 0);
    const journal = this.journals.get(runId);
    const archived = journal ? journal.archivedUpTo : waiting.length > 0 ? waiting[0].seq - 1 : Number.POSITIVE_INFINITY;
    return { archived, queued: waiting.filter((r) => r.seq > afterSeq) };
  }

  /**
   * Stops every run and drains the archive within `deadlineMs`, never longer: whatever the database
   * has not taken by then stays in the journals, and the next start archives it.
   */
  async stopAll({ deadlineMs = 10_000 }: { deadlineMs?: number } = {}): Promise<void> {
    const until = Date.now() + deadlineMs;
    this.stopListening();
    await Promise.all([...this.engines.values()].map((e) => e.stop(Math.max(0, until - Date.now()))));
    this.engines.clear();
    this.closedViews.clear();
    let timer: NodeJS.Timeout | undefined;
    const deadline = new Promise<'deadline'>((r) => {
      timer = setTimeout(() => r('deadline'), Math.max(0, until - Date.now()));
    });
    if ((await Promise.race([this.archiver.drain().then(() => 'drained' as const), deadline])) === 'deadline') debug('stopped with %d samples left in the journals for the next start', this.archiver.backlog);
    clearTimeout(timer);
    this.archiver.stop();
    for (const j of this.journals.values()) j.close();
    this.journals.clear();
  }
}

export const runNotFound = () => notFound('Run');

/** The audit entry of going to unloading: the stages it replaced and those derived, with the reason. */
function unloadingAudit(runId: number, e: RunEventDraft): AuditInput {
  const p = e.payload;
  return { userId: e.userId, entity: 'run', entityId: runId, action: 'unloading-begun', before: { stages: p.replaced ?? null }, after: { stages: p.stages ?? null }, reason: unloadingReasonText(p) };
}

/** A sample row as the database driver returns it (BIGINT columns may come as strings). */
const modelSample = (r: ModelSample): ModelSample => ({ seq: Number(r.seq), tMs: Number(r.tMs), channel: Number(r.channel), value: r.value === null ? null : Number(r.value) });
