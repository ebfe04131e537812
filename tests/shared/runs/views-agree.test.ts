/**
 * Every view of a run measures a sample the same way: the console (the engine's live figures), the test
 * record, replay, the live chart and the engine rebuilt after a restart. Random runs — gauge resets and
 * replacements, unloading and reloading, a calibration recorded mid-run, corrections — go through the
 * real engine (fake rig connection, virtual clock, no database), and every sample's figures are compared.
 */
import fc from 'fast-check';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createLiveStore } from '../../../client/src/features/live/live-store';
import { stateFromReadings } from '../../../client/src/features/replay/utils/timeline';
import { RunEngine } from '../../../server/runs/run-engine';
import { RunRecordBuilder } from '../../../server/services/run-record';
import type { RunEventDraft } from '../../../shared/runs/lifecycle';
import { type ModelEvent, type ModelSample, RunMeasurer, type RunSetupSnapshot } from '../../../shared/runs/measurement-model';
import type { SampleRow } from '../../../shared/runs/samples';
import type { RunView } from '../../../shared/schemas/runs';
import { PLAN, STAGES, VirtualClock, virtualRig, virtualRun } from './support/virtual-run';

interface RunShape {
  gauges: { direction: 1 | -1; xMm: number; yMm: number }[];
  apparatusWeightKn: number;
  stages: {
    samples: { channel: number; value: number; gapMs: number }[];
    resets: { gauge: number; beforeMm: number; afterMm: number; at: number }[];
    calibrate: number | null;
    reachByCommand: boolean;
  }[];
  corrections: { pick: number; value: number | null }[];
}

const runShape: fc.Arbitrary<RunShape> = fc.record({
  // Gauges round the plate at distinct places (a rig puts them apart).
  gauges: fc
    .array(fc.record({ direction: fc.constantFrom(1 as const, -1 as const), radiusMm: fc.integer({ min: 80, max: 140 }) }), { minLength: 2, maxLength: 4 })
    .map((gs) => gs.map((g, i, all) => ({ direction: g.direction, xMm: Math.round(g.radiusMm * Math.cos((2 * Math.PI * i) / all.length)), yMm: Math.round(g.radiusMm * Math.sin((2 * Math.PI * i) / all.length)) }))),
  apparatusWeightKn: fc.double({ min: 0, max: 3, noNaN: true }),
  stages: fc.array(
    fc.record({
      samples: fc.array(fc.record({ channel: fc.nat({ max: 4 }), value: fc.integer({ min: 0, max: 50_000 }), gapMs: fc.integer({ min: 1, max: 4_000 }) }), { minLength: 1, maxLength: 25 }),
      // A reset with a small jump; a replacement gauge reads anything after it.
      resets: fc.array(fc.record({ gauge: fc.nat({ max: 3 }), beforeMm: fc.double({ min: 0, max: 50, noNaN: true }), afterMm: fc.double({ min: 0, max: 50, noNaN: true }), at: fc.nat({ max: 24 }) }), { maxLength: 2 }),
      calibrate: fc.option(fc.double({ min: 0.3, max: 0.7, noNaN: true }), { freq: 3 }),
      reachByCommand: fc.boolean(),
    }),
    { minLength: 2, maxLength: STAGES.length },
  ),
  corrections: fc.array(fc.record({ pick: fc.nat(), value: fc.option(fc.integer({ min: 0, max: 50_000 })) }), { maxLength: 4 }),
});

/** What the console showed right after one sample. */
interface Seen {
  row: SampleRow;
  gauges: (number | null)[];
  meanSettlementMm: number | null;
  pressureKpa: number | null;
}

/** Runs the random run through the engine; returns what every view needs. */
async function runThrough(shape: RunShape) {
  const clock = new VirtualClock();
  const { snapshot, rig } = virtualRig(shape.gauges, shape.apparatusWeightKn);
  const { engine, setup, io, rows, events, pushed, last, command, read } = virtualRun(snapshot, rig, clock);
  engine.start();
  const seen: Seen[] = [];
  const restarts: { live: RunView['live']; engine: RunEngine; series: readonly { tMin: number; settlementMm: number }[] }[] = [];
  const sample = async (channel: number, value: number, gapMs: number) => {
    clock.advance(gapMs);
    read(channel % snapshot.channels.length, value / 1000);
    await vi.advanceTimersByTimeAsync(500); // flush and evaluate, as the engine's timers do
    const live = engine.view().live;
    seen.push({ row: rows[rows.length - 1], gauges: live.gauges.map((g) => g.settlementMm), meanSettlementMm: live.meanSettlementMm, pressureKpa: live.pressureKpa });
  };

  // Preparing: every gauge read, zeroed, started.
  for (const [i] of shape.gauges.entries()) await sample(i, 10_000 + 1_000 * i, 100);
  await command({ type: 'zero' });
  await command({ type: 'start' });
  for (const [si, st] of shape.stages.entries()) {
    if (si > 0) await command({ type: 'advance', reason: 'property test' });
    if (engine.state.phase === 'pumping' && st.reachByCommand) await command({ type: 'stage-reached' });
    for (const [k, s] of st.samples.entries()) {
      await sample(s.channel, s.value, s.gapMs);
      for (const r of st.resets.filter((x) => x.at === k)) {
        if (engine.state.phase !== 'holding' && engine.state.phase !== 'hold-met') continue;
        await command({ type: 'gauge-reset', channel: `g${(r.gauge % shape.gauges.length) + 1}`, beforeMm: r.beforeMm, afterMm: r.afterMm });
      }
      if (st.calibrate !== null && k === 0) {
        await engine.applyCalibration({ instrumentId: 9, serial: 'J-9', calibrationId: 100 + si, calibration: { inputUnit: 'bar', outputUnit: 'kN', curve: { kind: 'linear', c0: 0, c1: st.calibrate } } });
      }
    }
    if (engine.state.phase === 'pumping') await command({ type: 'stage-reached' });
    // A restart here: a new engine from the saved state, every event and the stage's samples.
    await engine.saved();
    const state = structuredClone(last.saved!);
    const from = state.lifecycle.stageStartedAtMs ?? Number.MAX_SAFE_INTEGER;
    const lastBefore = new Map<number, SampleRow>();
    for (const r of rows) if (r.tMs < from && r.value !== null) lastBefore.set(r.channel, r);
    const history = [...lastBefore.values(), ...rows.filter((r) => r.tMs >= from)].sort((a, b) => a.seq - b.seq).map(({ seq, tMs, channel, value }) => ({ seq, tMs, channel, value }));
    const rebuilt = new RunEngine({ ...setup, persisted: state, history: { events: events.map(asModelEvent), samples: history } }, io);
    restarts.push({ live: engine.view().live, engine: rebuilt, series: [...engine.holdSeries] });
  }
  await command({ type: 'stop', reason: 'end of the property run' });
  await engine.saved();
  return { snapshot, rows, events: events.map(asModelEvent), pushed, seen, restarts, finalView: engine.view() };
}

let recordReadingsCompared = 0;
const asModelEvent = (e: RunEventDraft): ModelEvent => ({ kind: e.kind, atMs: e.atMs, payload: e.payload });
const round = (x: number, places: number) => Math.round(x * 10 ** places) / 10 ** places;

describe('one measurement model for every view', () => {
  beforeEach(() => vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval', 'setTimeout', 'clearTimeout'] }));
  afterEach(() => vi.useRealTimers());

  it('console = record = replay = live chart = rebuild after restart, for every sample', async () => {
    await fc.assert(
      fc.asyncProperty(runShape, async (shape) => {
        const { snapshot, rows, events, pushed, seen, restarts, finalView } = await runThrough(shape);
        expect(rows.map((r) => r.seq)).toEqual(rows.map((_, i) => i + 1));

        // The record's pure function: the model fed the stored rows and the saved events, in order.
        const model = new RunMeasurer(snapshot, events);
        const bySeq = new Map<number, Seen>();
        for (const s of seen) bySeq.set(s.row.seq, s);
        const latestRow = new Map<number, SampleRow>();
        for (const row of rows) {
          model.add(row);
          latestRow.set(row.channel, row);
          const s = bySeq.get(row.seq);
          if (!s) continue;
          const m = model.measure();
          expect(m.gauges.map((g) => g.settlementMm)).toEqual(s.gauges);
          expect(m.meanSettlementMm).toBe(s.meanSettlementMm);
          expect(m.pressureKpa).toBe(s.pressureKpa);
          // Replay: the last reading of each channel at that time, through the view's parameters.
          const replay = stateFromReadings(finalView, [...latestRow.values()].map((r) => ({ ...r, status: 0 })));
          expect(replay.pressureKpa).toBe(s.pressureKpa);
          if (s.gauges.every((g) => g !== null)) expect(replay.meanSettlementMm).toBe(s.meanSettlementMm);
        }

        // The record: each reading kept at a sample is the console's figures at that sample, rounded as the
        // record rounds.
        checkRecord(buildRecord(snapshot, events, rows), events, seen);

        // The live chart, fed the views and batches in the order the engine pushed them, and with every view
        // overtaken by the next batch (a command's view waits for its save while samples keep flowing).
        const expected = seen.filter((s) => snapshot.channels[s.row.channel].role === 'gauge' && s.meanSettlementMm !== null);
        for (const order of [pushed, viewsLate(pushed)]) {
          const store = createLiveStore();
          for (const p of order) {
            if ('view' in p) store.setView(p.view);
            else store.ingest({ runId: 1, seq: p.rows.map((r) => r.seq), t: p.rows.map((r) => r.tMs), channel: p.rows.map((r) => r.channel), value: p.rows.map((r) => r.value) });
          }
          expect(Array.from(store.series.column(0))).toEqual(expected.map((s) => s.row.tMs));
          expect(Array.from(store.series.column(1))).toEqual(expected.map((s) => s.meanSettlementMm));
        }

        // The engine rebuilt after a restart shows what the console showed at that moment and keeps the same hold series.
        for (const r of restarts) {
          const live = r.engine.view().live;
          expect(live.gauges.map((g) => g.settlementMm)).toEqual(r.live.gauges.map((g) => g.settlementMm));
          expect(live.meanSettlementMm).toBe(r.live.meanSettlementMm);
          expect(live.pressureKpa).toBe(r.live.pressureKpa);
          expect(r.engine.holdSeries).toEqual(r.series);
        }

        // Corrections: the record and replay take corrected values the same way.
        const corrected = correct(rows, shape.corrections);
        const cmodel = new RunMeasurer(snapshot, events);
        const cSeen: Seen[] = [];
        const latestC = new Map<number, ModelSample & { original: number | null }>();
        for (const [i, row] of corrected.entries()) {
          cmodel.add(row);
          const m = cmodel.measure();
          cSeen.push({ row: { ...rows[i], value: row.value }, gauges: m.gauges.map((g) => g.settlementMm), meanSettlementMm: m.meanSettlementMm, pressureKpa: m.pressureKpa });
          latestC.set(row.channel, { ...row, original: rows[i].value });
          // Replay knows one reading per channel: it can say only when none of them is marked faulty.
          if ([...latestC.values()].some((r) => r.value === null)) continue;
          const replay = stateFromReadings(
            finalView,
            [...latestC.values()].map((r) => ({ seq: r.seq, tMs: r.tMs, channel: r.channel, value: r.original, status: 0, ...(r.value !== r.original ? { correctedValue: r.value } : {}) })),
          );
          expect(replay.pressureKpa).toBe(m.pressureKpa);
          if (m.gauges.every((g) => g.settlementMm !== null)) expect(replay.meanSettlementMm).toBe(m.meanSettlementMm);
        }
        checkRecord(buildRecord(snapshot, events, corrected), events, cSeen);
      }),
      { numRuns: 40, endOnFailure: true },
    );
    expect(recordReadingsCompared).toBeGreaterThan(20); // the record comparison did compare
  }, 120_000);
});

/**
 * Each reading the record kept at a sample equals the figures measured at that sample, rounded as the record
 * rounds (t = 0 and a stage's closing reading are measured at events, between samples).
 */
function checkRecord(record: ReturnType<typeof buildRecord>, events: readonly ModelEvent[], seen: readonly Seen[]): void {
  for (const stage of record.stages) {
    const opened = events.find((e) => e.kind === 'target-reached' && Number(e.payload.stageIndex) === stage.index)!;
    for (const reading of stage.readings.slice(1, -1)) {
      const candidates = seen.filter((x) => x.row.tMs > opened.atMs && x.row.value !== null && round((x.row.tMs - opened.atMs) / 60_000, 4) === reading.tMin);
      if (candidates.length !== 1) continue; // tMin is kept to 6 ms: samples closer than that cannot be told apart
      const [s] = candidates;
      recordReadingsCompared++;
      expect(reading.pressureKpa).toBe(round(s.pressureKpa!, 2));
      expect(Object.values(reading.gauges)).toEqual(s.gauges.map((g) => round(g!, 4)));
    }
  }
}

/** The same pushes with each view delivered after the batch that followed it. */
function viewsLate<T extends object>(pushed: readonly T[]): T[] {
  const out = [...pushed];
  for (let i = 0; i < out.length - 1; i++) {
    if ('view' in out[i] && !('view' in out[i + 1])) {
      [out[i], out[i + 1]] = [out[i + 1], out[i]];
      i++;
    }
  }
  return out;
}

function buildRecord(snapshot: RunSetupSnapshot, events: ModelEvent[], rows: readonly ModelSample[]) {
  const builder = new RunRecordBuilder({ plan: PLAN, stages: STAGES, setup: snapshot, events });
  for (const r of rows) builder.add(r);
  return builder.finish();
}

/** Rows with some values corrected (null: marked faulty), as the record builder is fed them. */
function correct(rows: readonly SampleRow[], corrections: RunShape['corrections']): ModelSample[] {
  const out = rows.map(({ seq, tMs, channel, value }) => ({ seq, tMs, channel, value }));
  for (const c of corrections) if (out.length) out[c.pick % out.length].value = c.value;
  return out;
}
