/**
 * Keeps one engine per active run: creates runs from a plan and a rig, resumes unfinished runs after
 * a restart (state from the database, samples from the journal, the outage marked as a gap), routes
 * commands, and hands live data to the realtime layer.
 */
import path from 'node:path';
import createDebug from 'debug';
import { QueryTypes, type Sequelize } from 'sequelize';
import { buildStageSequence } from '../../shared/plans/stages';
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
import { notifyRunFinished } from '../services/mail';
import { Archiver } from './archiver';
import { buildRollups } from './samples-query';
import { Journal } from './journal';
import { newRunClock, runTime } from './run-clock';
import { type EngineIo, RunEngine } from './run-engine';

const debug = createDebug('sscope:runs');

export interface RunManagerOptions {
  sequelize: Sequelize;
  dataDir: string;
  pushView: (runId: number, view: RunView) => void;
  pushSamples: (runId: number, rows: SampleRow[]) => void;
}

function overdue(rig: RigContext): string[] {
  const ids = [...rig.rig.channels.map((c) => c.instrumentId), rig.rig.jackInstrumentId].filter((id): id is number => id != null);
  return [...new Set(ids)].filter((id) => rig.status.get(id) === 'overdue' || rig.status.get(id) === 'uncalibrated').map((id) => rig.serials.get(id) ?? `#${id}`);
}

export class RunManager {
  private readonly engines = new Map<number, RunEngine>();
  readonly archiver: Archiver;
  private readonly journals = new Map<number, Journal>();
  private readonly stopListening: () => void;

  constructor(private readonly o: RunManagerOptions) {
    this.archiver = new Archiver(o.sequelize, { onArchived: (runId, seq) => this.journals.get(runId)?.markArchived(seq) });
    this.stopListening = onCalibrationRecorded((id) => void this.calibrationRecorded(id));
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
    const loaded = this.engines.get(runId);
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
    return this.launch(run, plan, await loadRigContext(run.rigId, run.createdAt), run.state, { events: await this.events(runId), samples: last.map(modelSample) });
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

  /** Resumes every unfinished run (after a crash or restart). */
  async resumeAll(): Promise<number> {
    const runs = await Run.findAll({ where: { status: [...ACTIVE_PHASES] } });
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
    const engine = this.launch(run, plan, rig, persisted, { events: await this.events(run.id), samples: await this.stageSamples(run.id, persisted) });
    engine.start();
  }

  private launch(run: Run, plan: TestPlan, rig: RigContext, persisted: PersistedRun, history?: { events: ModelEvent[]; samples: ModelSample[] }): RunEngine {
    const input = plan.toInput();
    const stages = buildStageSequence(input);
    // A run created before snapshots were kept gets one from its rig (calibrations recorded by its creation).
    persisted.setup ??= setupSnapshot(input, stages, rig);
    const sim = rig.rig.simulator;
    const io: EngineIo = {
      archiver: this.archiver,
      journal: this.journal(run.id),
      save: (runId, state, events) => this.save(runId, state, events),
      pushView: this.o.pushView,
      pushSamples: this.o.pushSamples,
      simulator: sim ? (action, body) => void tellSimulator(sim.controlUrl, action, body) : undefined,
    };
    const engine = new RunEngine({ runId: run.id, planId: plan.id, planName: plan.name, plan: input, stages, rig, persisted, overdueInstruments: overdue(rig), snapshot: persisted.setup, history }, io);
    this.engines.set(run.id, engine);
    return engine;
  }

  private journal(runId: number): Journal {
    let j = this.journals.get(runId);
    if (!j) {
      j = new Journal({ dir: path.join(this.o.dataDir, 'journal'), runId });
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
    });
    if (justClosed) {
      // The engineers hear that a run needs interpreting and review; the rollups make its replay fast.
      void notifyRunFinished(runId, phase === 'completed' ? 'completed' : 'stopped', persisted.lifecycle.closedReason ?? undefined);
      void this.archiver
        .drain()
        .then(() => buildRollups(this.o.sequelize, runId))
        .catch((err) => debug('rollups of run %d: %s', runId, (err as Error).message));
    }
  }

  private saveEvents(runId: number, events: RunEventDraft[]) {
    return RunEvent.bulkCreate(events.map((e) => ({ runId, at: new Date(e.atMs), kind: e.kind, userId: e.userId, payload: e.payload })));
  }

  private async maxSeq(runId: number): Promise<number> {
    const [row] = (await this.o.sequelize.query('SELECT COALESCE(MAX(seq), 0) AS m FROM samples WHERE run_id = ?', { replacements: [runId], type: QueryTypes.SELECT })) as { m: number }[];
    return Number(row.m);
  }

  /** Every event of a run, oldest first, as the measurement model reads them. */
  private async events(runId: number): Promise<ModelEvent[]> {
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

  async stopAll(): Promise<void> {
    this.stopListening();
    await Promise.all([...this.engines.values()].map((e) => e.stop()));
    this.engines.clear();
    await this.archiver.drain();
    this.archiver.stop();
  }
}

export const runNotFound = () => notFound('Run');

/** A sample row as the database driver returns it (BIGINT columns may come as strings). */
const modelSample = (r: ModelSample): ModelSample => ({ seq: Number(r.seq), tMs: Number(r.tMs), channel: Number(r.channel), value: r.value === null ? null : Number(r.value) });

/**
 * Sends an operator action to a simulated rig, retrying a few times: a pooled keep-alive connection
 * the simulator has just closed fails once, and a lost "pump" would leave the demo rig idle.
 */
async function tellSimulator(controlUrl: string, action: string, body: object): Promise<void> {
  for (let attempt = 1; attempt <= 4; attempt++) {
    try {
      const res = await fetch(`${controlUrl}/${action}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
      if (res.ok) return;
      debug('simulator refused %s: %s', action, await res.text());
      return;
    } catch (err) {
      debug('simulator %s, attempt %d: %s', action, attempt, (err as Error).message);
      await new Promise((r) => setTimeout(r, 100 * attempt));
    }
  }
}
