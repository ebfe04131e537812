import { describe, expect, it } from 'vitest';
import { buildStageSequence } from '../../../shared/plans/stages';
import { type Actor, type CommandContext, type RunState, applyCommand, applyObservation, initialRunState, needsCurrentVersion } from '../../../shared/runs/lifecycle';
import type { RunCommand } from '../../../shared/schemas/runs';

const stages = buildStageSequence({ seatingPressureKpa: 7, loading: { mode: 'list', pressuresKpa: [100, 200] }, unloadReload: { unloadKpa: [], reload: { mode: 'none' }, repetitionsPerLevel: 1 } });
const operator: Actor = { id: 3, name: 'Op', role: 'operator' };
const engineer: Actor = { id: 2, name: 'Eng', role: 'engineer' };
const ctx = (over: Partial<CommandContext> = {}): CommandContext => ({ nowMs: 1000, actor: operator, stages, gaugeReadings: { g1: 1.5, g2: 2.5 }, overdueInstruments: [], ...over });

function run(state: RunState, cmd: RunCommand, c = ctx()): RunState {
  const r = applyCommand(state, cmd, c);
  if (!r.ok) throw new Error(r.message);
  return r.state;
}

describe('run lifecycle', () => {
  it('goes from preparing through every stage to completed, one version per change', () => {
    let s = run(initialRunState(), { type: 'zero' });
    expect(s.zeros).toEqual({ g1: 1.5, g2: 2.5 });
    s = run(s, { type: 'start' });
    expect(s).toMatchObject({ phase: 'pumping', stageIndex: 0, controller: { id: 3 } });
    for (let i = 0; i < stages.length; i++) {
      s = applyObservation(s, { type: 'target-reached' }, 2000 + i)!.state;
      expect(s.holdStartedAtMs).toBe(2000 + i);
      s = applyObservation(s, { type: 'hold-met' }, 3000 + i)!.state;
      if (i < stages.length - 1) s = run(s, { type: 'advance' });
    }
    s = run(s, { type: 'finish' });
    expect(s.phase).toBe('completed');
    expect(s.version).toBe(2 + stages.length * 2 + (stages.length - 1) + 1);
  });

  it('refuses commands that do not fit, with a reason', () => {
    const fresh = initialRunState();
    expect(applyCommand(fresh, { type: 'start' }, ctx())).toMatchObject({ ok: false, message: expect.stringMatching(/Zero the gauges/) });
    const started = run(run(fresh, { type: 'zero' }), { type: 'start' });
    expect(applyCommand(started, { type: 'zero' }, ctx())).toMatchObject({ ok: false });
    expect(applyCommand(started, { type: 'finish' }, ctx())).toMatchObject({ ok: false });
    const holding = applyObservation(started, { type: 'target-reached' }, 5)!.state;
    expect(applyCommand(holding, { type: 'advance' }, ctx())).toMatchObject({ ok: false, message: expect.stringMatching(/reason/) });
    expect(run(holding, { type: 'advance', reason: 'engineer instructed' }).stageIndex).toBe(1);
    expect(applyObservation(started, { type: 'hold-met' }, 5)).toBeNull();
  });

  it('records a note, marked when it is about the weather, by any watcher and even after the run closed', () => {
    const note = applyCommand(initialRunState(), { type: 'note', text: 'Sunny, 18 °C', topic: 'weather' }, ctx({ actor: engineer }));
    expect(note).toMatchObject({ ok: true, events: [{ kind: 'note', payload: { text: 'Sunny, 18 °C', topic: 'weather' } }] });
    const closed = { ...initialRunState(), phase: 'completed' as const };
    const plain = applyCommand(closed, { type: 'note', text: 'Pit backfilled' }, ctx());
    expect(plain).toMatchObject({ ok: true, events: [{ kind: 'note', payload: { text: 'Pit backfilled' } }] });
    if (plain.ok) expect(plain.events[0].payload).not.toHaveProperty('topic');
  });

  it('asks every command for the version its sender saw, except those that name the alarm they answer', () => {
    expect(needsCurrentVersion({ type: 'advance' })).toBe(true);
    expect(needsCurrentVersion({ type: 'note', text: 'x' })).toBe(true); // twin notes from two stations: one lands
    expect(needsCurrentVersion({ type: 'acknowledge-alarm', key: 'signal-lost:g1' })).toBe(false);
    expect(needsCurrentVersion({ type: 'shelve-alarm', key: 'tilt', minutes: 5, reason: 'known' })).toBe(false);
  });

  it('lets one station command at a time (QUALITY R7)', () => {
    const started = run(run(initialRunState(), { type: 'zero' }), { type: 'start' });
    const clash = applyCommand(started, { type: 'stage-reached' }, ctx({ actor: engineer }));
    expect(clash).toMatchObject({ ok: false, code: 'conflict', message: expect.stringMatching(/Op is commanding/) });
    const taken = run(started, { type: 'take-control' }, ctx({ actor: engineer }));
    expect(taken.controller).toEqual({ id: 2, name: 'Eng' });
    expect(applyCommand(taken, { type: 'stage-reached' }, ctx())).toMatchObject({ ok: false });
    expect(applyCommand(taken, { type: 'stage-reached' }, ctx({ actor: { id: 9, name: 'C', role: 'client' } }))).toMatchObject({ ok: false, code: 'forbidden' });
  });

  it('needs an engineer’s reason to start with an overdue instrument, and records it', () => {
    const zeroed = run(initialRunState(), { type: 'zero' });
    const c = ctx({ overdueInstruments: ['DL-0412'] });
    expect(applyCommand(zeroed, { type: 'start' }, c)).toMatchObject({ ok: false, message: expect.stringMatching(/DL-0412/) });
    expect(applyCommand(zeroed, { type: 'accept-overdue', reason: 'spare gauge' }, c)).toMatchObject({ ok: false, code: 'forbidden' });
    // The engineer accepts from the office while the operator keeps control of the rig.
    const r = applyCommand(zeroed, { type: 'accept-overdue', reason: 'checked against gauge block' }, { ...c, actor: engineer });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.state.calibrationOverride).toMatchObject({ by: 'Eng', reason: 'checked against gauge block' });
    expect(r.state.controller).toEqual({ id: 3, name: 'Op' });
    expect(r.events.map((e) => e.kind)).toEqual(['calibration-overridden']);
    expect(run(r.state, { type: 'start' }, c).phase).toBe('pumping');
  });

  it('keeps settlement continuous across a gauge reset (reference §C12 [calc/CP])', () => {
    let s = run(run(initialRunState(), { type: 'zero' }), { type: 'start' });
    s = applyObservation(s, { type: 'target-reached' }, 5)!.state;
    s = run(s, { type: 'gauge-reset', channel: 'g1', beforeMm: 24.3, afterMm: 1.15 });
    expect(s.resetOffsets.g1).toBeCloseTo(23.15, 10);
    expect(applyCommand(s, { type: 'gauge-reset', channel: 'g9', beforeMm: 1, afterMm: 0 }, ctx())).toMatchObject({ ok: false });
  });
});
