/**
 * A stored run as a test record ('settlescope-record' v1), so that the interpretation, the exports and
 * the command line all read runs and imported tests the same way. Imported runs carry their record whole;
 * a recorded run's record is rebuilt from its plan, its events and its archived samples.
 */
import { QueryTypes, type Sequelize } from 'sequelize';
import { buildStageSequence, type PlannedStage } from '../../shared/plans/stages';
import { stagesAfterEvents } from '../../shared/plans/unloading';
import { type ModelEvent, type ModelSample, RunMeasurer, type RunSetupSnapshot } from '../../shared/runs/measurement-model';
import { type RECORD_EVENT_KINDS, RECORD_FORMAT, RECORD_LIMITS, RECORD_VERSION, type RecordStage, type TestRecord } from '../../shared/records/schema';
import { formatIssue, parseTestRecord } from '../../shared/records/validate';
import type { PlanInput } from '../../shared/schemas/plans';
import { runSnapshot } from '../acquisition/rig-context';
import { HttpError, notFound } from '../http/errors';
import { correctedValues } from '../models/correction';
import { RunRecord } from '../models/interpretation';
import { Project } from '../models/project';
import { Run } from '../models/run';
import { RunEvent } from '../models/run-event';
import { TestLocation } from '../models/test-location';
import { TestPlan } from '../models/test-plan';

/** A run event as the record builder needs it (run clock ms). */
export type TimedEvent = ModelEvent;

/** One archived sample: sequence number, run clock ms, rig channel index, calibrated value in micro-units (null when none was trusted). */
export type TimedSample = ModelSample;

/** What a run's record is built from besides its samples. */
export interface RunRecordSource {
  plan: PlanInput;
  stages: readonly PlannedStage[];
  /** What the run measured with: the snapshot taken when it was created (never today's rig or calibrations). */
  setup: RunSetupSnapshot;
  /** Every run event, oldest first. */
  events: readonly TimedEvent[];
  metadata?: TestRecord['metadata'];
  ground?: TestRecord['ground'];
}

/** Fewest milliseconds of run time between two readings kept per stage: 5 s (stage ends are always kept). */
export const MIN_READING_STEP_MS = 5000;

/** Run-time step between kept readings: 5 s, or longer when the holds are so long that 5 s would pass the record's reading limits. */
export function readingStepMs(heldMs: number, longestStageMs: number): number {
  // 10 % headroom for the extra reading at each stage's end.
  const byTotal = heldMs / (0.9 * RECORD_LIMITS.readingsTotal);
  const byStage = longestStageMs / (0.9 * RECORD_LIMITS.readingsPerStage);
  return Math.max(MIN_READING_STEP_MS, Math.ceil(Math.max(byTotal, byStage)));
}

interface StageWindow {
  stage: PlannedStage;
  fromMs: number;
  toMs: number;
}

const STAGE_ENDS = new Set(['stage-advanced', 'run-completed', 'run-stopped']);

/** Each held stage from its 'target-reached' (t = 0) to the next 'stage-advanced', finish or stop (or open-ended); `end`: that event's index. */
export function stageWindows(stages: readonly PlannedStage[], events: readonly TimedEvent[]): (StageWindow & { start: number; end: number })[] {
  const windows: (StageWindow & { start: number; end: number })[] = [];
  for (const [i, e] of events.entries()) {
    if (e.kind !== 'target-reached') continue;
    const stage = stages[Number(e.payload.stageIndex)];
    if (!stage) continue;
    const offset = events.slice(i + 1).findIndex((x) => STAGE_ENDS.has(x.kind));
    const end = offset < 0 ? events.length : i + 1 + offset;
    windows.push({ stage, fromMs: e.atMs, toMs: events[end]?.atMs ?? Number.POSITIVE_INFINITY, start: i, end });
  }
  return windows;
}

const round = (x: number, places: number) => Math.round(x * 10 ** places) / 10 ** places;

/** What a run event means in the record's events log, or null when the log has no place for it. */
function recordEvent(e: TimedEvent): { kind: (typeof RECORD_EVENT_KINDS)[number]; text: string } | null {
  const p = e.payload;
  if (e.kind === 'note') return { kind: p.topic === 'weather' ? 'weather' : 'note', text: String(p.text ?? '').slice(0, 2000) };
  if (e.kind === 'top-up') return { kind: 'top-up', text: 'Load topped up' };
  // The criterion was met while the load stood outside its tolerance: the record says so beside the stage.
  if (e.kind === 'hold-met' && typeof p.underDrift === 'string') return { kind: 'alarm', text: `Hold met under drift: ${p.underDrift}`.slice(0, 2000) };
  if (e.kind === 'gauge-reset') return { kind: 'gauge-reset', text: `Gauge ${p.channel} reset: read ${p.beforeMm} mm before, ${p.afterMm} mm after` };
  return null;
}

/**
 * Builds the record of a recorded run while its samples stream past (in sequence order), so that a run of
 * millions of samples never sits in memory. Every reading is measured by the run's measurement model
 * (shared/runs/measurement-model) with the run's own set-up snapshot and the events before each sample —
 * zeros, reset offsets, the jack's branch for the stage and calibrations applied mid-run — exactly as the
 * console measured it. Readings are kept at most one per {@link readingStepMs} of run time per stage,
 * plus each stage's t = 0 (when its target was reached) and its last.
 */
export class RunRecordBuilder {
  private readonly windows: ReturnType<typeof stageWindows>;
  private readonly stepMs: number;
  private readonly measurer: RunMeasurer;
  private eventIndex = -1;
  private window = -1;
  private readonly readings = new Map<number, RecordStage['readings']>();
  private lastKeptMs = Number.NEGATIVE_INFINITY;
  private lastSeenMs: number | null = null;

  constructor(private readonly source: RunRecordSource) {
    this.windows = stageWindows(source.stages, source.events);
    const lastMs = source.events.length ? source.events[source.events.length - 1].atMs : 0;
    const lengths = this.windows.map((w) => Math.max(0, (Number.isFinite(w.toMs) ? w.toMs : lastMs) - w.fromMs));
    this.stepMs = readingStepMs(
      lengths.reduce((a, b) => a + b, 0),
      Math.max(0, ...lengths),
    );
    this.measurer = new RunMeasurer(source.setup, source.events, (e) => this.onEvent(e));
  }

  /** Takes the next sample (samples must come in sequence order). */
  add(sample: TimedSample): void {
    this.measurer.add(sample);
    if (sample.value === null || !this.source.setup.channels[sample.channel]) return;
    if (this.window < 0) return;
    this.lastSeenMs = sample.tMs;
    if (sample.tMs - this.lastKeptMs >= this.stepMs) this.keep(sample.tMs);
  }

  /** The record; stages that were never held or have no complete reading are left out. */
  finish(): TestRecord {
    this.measurer.advance(null);
    if (this.window >= 0) this.closeStage();
    const { plan, metadata, ground } = this.source;
    const stages = this.windows.flatMap(({ stage }) => {
      const readings = this.readings.get(stage.index);
      return readings?.length ? [{ index: stage.index, branch: stage.branch, targetKpa: stage.targetKpa, readings }] : [];
    });
    const events = this.recordEvents(new Set(stages.map((s) => s.index)));
    return {
      format: RECORD_FORMAT,
      version: RECORD_VERSION,
      ...(metadata ? { metadata } : {}),
      plate: { shape: plan.plate.shape, sizeMm: plan.plate.sizeMm },
      plan: { procedureId: plan.procedureId, seatingPressureKpa: plan.seatingPressureKpa, holdRule: plan.holdRule },
      ...(ground ? { ground } : {}),
      ...(plan.footing ? { footing: { shape: plan.footing.shape, widthM: plan.footing.widthM, soilBehaviour: plan.footing.soilBehaviour } } : {}),
      gauges: this.source.setup.channels
        .filter((c) => c.role === 'gauge' && c.gauge)
        .map((c) => ({ key: c.key, label: c.label, xMm: c.gauge!.xMm, yMm: c.gauge!.yMm })),
      stages,
      ...(events.length ? { events } : {}),
    };
  }

  /** Each event as the model applies it (before the samples it precedes): stage openings (t = 0 reading) and closings (last reading). */
  private onEvent(e: TimedEvent): void {
    this.eventIndex++;
    if (this.window >= 0 && this.windows[this.window].end === this.eventIndex) this.closeStage();
    const opening = this.windows.findIndex((w) => w.start === this.eventIndex);
    if (opening >= 0) {
      if (this.window >= 0) this.closeStage();
      this.window = opening;
      this.lastKeptMs = Number.NEGATIVE_INFINITY;
      this.lastSeenMs = null;
      this.keep(e.atMs); // the t = 0 reading, from the latest values at the moment the target was reached
    }
  }

  private closeStage(): void {
    if (this.lastSeenMs !== null && this.lastSeenMs > this.lastKeptMs) this.keep(this.lastSeenMs);
    this.window = -1;
  }

  /** Keeps a reading at `tMs` from the latest values, when every gauge and the pressure are known. */
  private keep(tMs: number): void {
    const w = this.windows[this.window];
    const m = this.measurer.measure();
    if (!w || m.pressureKpa === null || m.gauges.length === 0 || m.gauges.some((g) => g.settlementMm === null)) return;
    const tMin = (tMs - w.fromMs) / 60_000;
    if (tMin > RECORD_LIMITS.stageMinutes) return;
    const list = this.readings.get(w.stage.index) ?? [];
    list.push({
      tMin: round(tMin, 4),
      pressureKpa: round(m.pressureKpa, 2),
      gauges: Object.fromEntries(m.gauges.map((g) => [g.key, round(g.settlementMm as number, 4)])),
    });
    this.readings.set(w.stage.index, list);
    this.lastKeptMs = tMs;
  }

  private recordEvents(kept: Set<number>): NonNullable<TestRecord['events']> {
    const out: NonNullable<TestRecord['events']> = [];
    for (const e of this.source.events) {
      const entry = recordEvent(e);
      const w = this.windows.find((x) => e.atMs >= x.fromMs && e.atMs < x.toMs);
      if (!entry || !w || !kept.has(w.stage.index) || out.length >= RECORD_LIMITS.events) continue;
      out.push({ stage: w.stage.index, tMin: round((e.atMs - w.fromMs) / 60_000, 4), ...entry });
    }
    return out;
  }
}

/** A text cut to one line of at most `max` characters (record metadata fields are single lines). */
const oneLine = (text: string, max: number) => text.replace(/[\r\n]+/g, ' ').trim().slice(0, max);

/** The weather line of a run: every distinct note about the weather, in order. */
function weatherOf(events: readonly TimedEvent[]): string | undefined {
  const notes = events.filter((e) => e.kind === 'note' && e.payload.topic === 'weather').map((e) => oneLine(String(e.payload.text ?? ''), 200));
  const line = [...new Set(notes)].filter(Boolean).join('; ');
  return line ? line.slice(0, 200) : undefined;
}

/** Who, where, when and in what weather, from the plan's location and project and the run's notes. */
async function runMetadata(run: Run, plan: TestPlan, events: readonly TimedEvent[]): Promise<Pick<RunRecordSource, 'metadata' | 'ground'>> {
  const location = await TestLocation.findByPk(plan.locationId, { include: [{ model: Project, as: 'project' }] });
  const metadata: NonNullable<TestRecord['metadata']> = { pit: location ? oneLine(location.pitId, 80) : undefined };
  if (location?.project) Object.assign(metadata, { project: oneLine(location.project.name, 200), site: oneLine(location.project.site, 200) });
  if (run.startedAt) metadata.testDate = run.startedAt.toISOString().slice(0, 10);
  const weather = weatherOf(events);
  if (weather) metadata.weather = weather;
  if (!location) return { metadata };
  const below = location.waterTableDepthM === null ? undefined : location.waterTableDepthM - location.testDepthM;
  const ground = {
    ...(location.soilDescription ? { description: oneLine(location.soilDescription, 300) } : {}),
    testDepthM: location.testDepthM,
    ...(below !== undefined && below >= 0 ? { waterTableBelowTestM: below } : {}),
  };
  return { metadata, ground };
}

const SAMPLE_PAGE = 20_000;

/** Streams a run's archived samples into the builder, a page at a time, as corrected: corrected values replace the originals, readings marked faulty are left out. */
async function feedSamples(sequelize: Sequelize, runId: number, builder: RunRecordBuilder): Promise<void> {
  const corrected = await correctedValues(runId);
  for (let after = 0; ; ) {
    const rows = (await sequelize.query('SELECT seq, t_ms AS tMs, channel, value FROM samples WHERE run_id = ? AND seq > ? ORDER BY seq LIMIT ?', {
      replacements: [runId, after, SAMPLE_PAGE],
      type: QueryTypes.SELECT,
    })) as { seq: number; tMs: number; channel: number; value: number | null }[];
    // A reading marked faulty comes as null: the builder treats it as one with no trusted value.
    for (const r of rows) builder.add({ seq: Number(r.seq), tMs: Number(r.tMs), channel: Number(r.channel), value: corrected.has(Number(r.seq)) ? (corrected.get(Number(r.seq)) as number | null) : r.value === null ? null : Number(r.value) });
    if (rows.length < SAMPLE_PAGE) return;
    after = Number(rows[rows.length - 1].seq);
  }
}

export const recordUnavailable = (message: string) => new HttpError(409, 'record_unavailable', message);

/** Rebuilds a recorded run's record from its plan, events and samples. */
async function recordedRunRecord(run: Run): Promise<TestRecord> {
  const plan = await TestPlan.findByPk(run.planId);
  if (!plan) throw notFound('Test plan of the run');
  if (run.rigId === null) throw recordUnavailable('The run has neither a rig nor a stored record to interpret.');
  const input = plan.toInput();
  const planned = buildStageSequence(input);
  const events = (await RunEvent.findAll({ where: { runId: run.id }, order: [['id', 'ASC']] })).map((e) => ({ atMs: e.at.getTime(), kind: e.kind, payload: e.payload }));
  const builder = new RunRecordBuilder({
    plan: input,
    // The stages run: going to unloading replaced the planned ones after the stage reached.
    stages: stagesAfterEvents(planned, events),
    setup: await runSnapshot(run, input, planned),
    events,
    ...(await runMetadata(run, plan, events)),
  });
  await feedSamples(Run.sequelize!, run.id, builder);
  const record = builder.finish();
  if (record.stages.length === 0) throw recordUnavailable('The run has no held stage with complete readings yet.');
  const checked = parseTestRecord(record);
  if (!checked.ok) throw recordUnavailable(`The run's data do not make a valid record: ${formatIssue(checked.errors[0])}`);
  return checked.record;
}

/** Recently built records by run, with what they were built from, so that trying settings does not re-read a long run each time. */
const built = new Map<number, { key: string; record: TestRecord }>();
const BUILT_KEPT = 8;

/**
 * Changes whenever anything the record is built from can have changed: the run row, its samples (count and
 * highest seq: a late archived batch counts), its events and corrections (count and highest id: an added or
 * removed row counts), its plan, location and project (metadata), and — for a run without a set-up
 * snapshot, measured with its rig — the rig and the calibrations.
 */
async function dataKey(run: Run): Promise<string> {
  const [row] = (await Run.sequelize!.query(
    `SELECT
      (SELECT CONCAT(COUNT(*), ':', COALESCE(MAX(seq), 0)) FROM samples WHERE run_id = :id) AS samples,
      (SELECT CONCAT(COUNT(*), ':', COALESCE(MAX(id), 0)) FROM run_events WHERE run_id = :id) AS events,
      (SELECT CONCAT(COUNT(*), ':', COALESCE(MAX(id), 0)) FROM sample_corrections WHERE run_id = :id) AS corrections,
      (SELECT CONCAT(p.id, ':', p.updated_at, ':', COALESCE(l.updated_at, ''), ':', COALESCE(j.updated_at, ''))
         FROM test_plans p LEFT JOIN test_locations l ON l.id = p.location_id LEFT JOIN projects j ON j.id = l.project_id WHERE p.id = :plan) AS plan,
      (SELECT CONCAT(COALESCE(MAX(r.updated_at), ''), ':', (SELECT CONCAT(COUNT(*), ':', COALESCE(MAX(id), 0), ':', COALESCE(MAX(updated_at), '')) FROM calibrations))
         FROM rigs r WHERE r.id = :rig) AS rig`,
    { replacements: { id: run.id, plan: run.planId, rig: run.rigId ?? 0 }, type: QueryTypes.SELECT },
  )) as Record<string, string | null>[];
  const rig = run.state.setup ? 'snapshot' : row.rig;
  return [run.status, run.updatedAt.getTime(), row.samples, row.events, row.corrections, row.plan, rig].join('|');
}

/** A recorded run's record built afresh from its data, past the cache (for checks that must not trust it). */
export async function rebuildRunRecord(runId: number): Promise<TestRecord> {
  const run = await Run.findByPk(runId);
  if (!run) throw notFound('Run');
  return recordedRunRecord(run);
}

/** The test record of a run: the stored one of an imported run, else rebuilt from the run's data. 404 for an unknown run. */
export async function loadRunRecord(runId: number): Promise<TestRecord> {
  const stored = await RunRecord.findByPk(runId);
  if (stored) return stored.record;
  const run = await Run.findByPk(runId);
  if (!run) throw notFound('Run');
  const key = await dataKey(run);
  const cached = built.get(runId);
  if (cached?.key === key) return cached.record;
  const record = await recordedRunRecord(run);
  built.delete(runId);
  built.set(runId, { key, record });
  if (built.size > BUILT_KEPT) built.delete(built.keys().next().value as number);
  return record;
}
