import { describe, expect, it } from 'vitest';
import { defaultsForPlate } from '../../../shared/procedures/plate-rules';
import { findProfile } from '../../../shared/procedures/profiles';
import { buildStageSequence } from '../../../shared/plans/stages';
import { UNLOADING_EVENT, stagesAfterEvents, unloadingRuleOf, unloadingStages } from '../../../shared/plans/unloading';
import { type Actor, type CommandContext, type RunState, applyCommand, applyObservation, initialRunState } from '../../../shared/runs/lifecycle';
import { applyModelEvent, initialModelState, jackBranchOf, type RunSetupSnapshot } from '../../../shared/runs/measurement-model';
import { describeRunEvent } from '../../../shared/runs/event-text';
import type { RunCommand } from '../../../shared/schemas/runs';

// Two-cycle modulus test on a 600 mm plate: the profile's stages carried to 250 kPa (DIN 18134 family, from memory).
const modulus = defaultsForPlate(findProfile('modulus-two-cycle')!, 600).defaults;
const modulusStages = buildStageSequence(modulus);
const short = (stages: readonly { branch: string; targetKpa: number }[]) => stages.map((s) => `${s.branch[0]}${s.targetKpa}`);

describe('unloadingStages: the modulus rule', () => {
  it('the 600 mm plan is what the test below starts from', () => {
    expect(short(modulusStages)).toEqual(['s10', 'l40', 'l80', 'l120', 'l160', 'l200', 'l250', 'u125', 'u62.5', 'u0', 'r40', 'r80', 'r120', 'r160', 'r200']);
    expect(unloadingRuleOf(modulus)).toBe('modulus');
  });

  it('settlement limit at loading stage 4 (160 kPa, held): unloads to 50/25/0 % of it and reloads to stage 3 (DIN 18134 family, from memory)', () => {
    const stages = unloadingStages({ stages: modulusStages, reachedIndex: 4, currentIndex: 4, rule: 'modulus', planUnloadKpa: modulus.unloadReload.unloadKpa });
    expect(short(stages)).toEqual(['s10', 'l40', 'l80', 'l120', 'l160', 'u80', 'u40', 'u0', 'r40', 'r80', 'r120']);
    expect(stages.map((s) => s.index)).toEqual(stages.map((_, i) => i));
    // The stages already run are kept as they were.
    expect(stages.slice(0, 5)).toEqual(modulusStages.slice(0, 5));
  });

  it('a stage pumped to but never reached is replaced: the last stage held is the maximum', () => {
    const stages = unloadingStages({ stages: modulusStages, reachedIndex: 4, currentIndex: 5, rule: 'modulus', planUnloadKpa: [] });
    expect(short(stages)).toEqual(['s10', 'l40', 'l80', 'l120', 'l160', 'u80', 'u40', 'u0', 'r40', 'r80', 'r120']);
  });

  it('with no loading stage reached, only releases', () => {
    expect(short(unloadingStages({ stages: modulusStages, reachedIndex: null, currentIndex: 1, rule: 'modulus', planUnloadKpa: [] }))).toEqual(['s10', 'u0']);
  });

  it('refuses a reached stage that is not a loading stage', () => {
    expect(() => unloadingStages({ stages: modulusStages, reachedIndex: 8, currentIndex: 8, rule: 'modulus', planUnloadKpa: [] })).toThrow(
      /not a loading stage/,
    );
  });
});

describe('unloadingStages: rebound of a bearing test', () => {
  const bearing = findProfile('bearing-granular')!.defaults;
  const stages = buildStageSequence({ ...bearing, loading: { mode: 'list', pressuresKpa: [100, 200, 300, 400, 500, 600] } });

  it('a bearing plan unloads by rebound stages', () => expect(unloadingRuleOf(bearing)).toBe('rebound'));

  it('stopped at 25 mm at 300 kPa (common practice): released in three steps to zero (ASTM D1194 practice, from memory)', () => {
    const out = unloadingStages({ stages, reachedIndex: 3, currentIndex: 3, rule: 'rebound', planUnloadKpa: bearing.unloadReload.unloadKpa });
    expect(short(out)).toEqual(['s' + stages[0].targetKpa, 'l100', 'l200', 'l300', 'u200', 'u100', 'u0']);
  });

  it('uses the plan’s own unloading pressures below the maximum when it has some', () => {
    const out = unloadingStages({ stages, reachedIndex: 3, currentIndex: 3, rule: 'rebound', planUnloadKpa: [400, 150, 50, 0] });
    expect(short(out).slice(4)).toEqual(['u150', 'u50', 'u0']);
  });
});

describe('stagesAfterEvents', () => {
  it('replaces the planned tail from the event’s index and leaves the plan as it is without one', () => {
    const tail = [
      { index: 5, branch: 'unloading' as const, targetKpa: 80, repetition: 1 },
      { index: 6, branch: 'unloading' as const, targetKpa: 0, repetition: 1 },
    ];
    expect(stagesAfterEvents(modulusStages, [{ kind: 'note', payload: {} }])).toEqual(modulusStages);
    expect(short(stagesAfterEvents(modulusStages, [{ kind: UNLOADING_EVENT, payload: { fromIndex: 5, stages: tail } }]))).toEqual([
      's10',
      'l40',
      'l80',
      'l120',
      'l160',
      'u80',
      'u0',
    ]);
  });
});

describe('the unload command', () => {
  const operator: Actor = { id: 3, name: 'Op', role: 'operator' };
  const base = (stages = modulusStages): CommandContext => ({
    nowMs: 1000,
    actor: operator,
    stages,
    gaugeReadings: { g1: 1 },
    overdueInstruments: [],
    unloading: { rule: 'modulus', planUnloadKpa: modulus.unloadReload.unloadKpa },
  });
  const ok = (s: RunState, cmd: RunCommand, c = base()) => {
    const r = applyCommand(s, cmd, c);
    if (!r.ok) throw new Error(r.message);
    return r;
  };
  /** A run holding loading stage `index` (1-based stage number index + 1). */
  function holdingAt(index: number): RunState {
    let s = ok(ok(initialRunState(), { type: 'zero' }).state, { type: 'start' }).state;
    for (let i = 0; i <= index; i++) {
      s = applyObservation(s, { type: 'target-reached' }, 10 * i)!.state;
      s = applyObservation(s, { type: 'hold-met' }, 10 * i + 5)!.state;
      if (i < index) s = ok(s, { type: 'advance' }).state;
    }
    return s;
  }

  it('goes from the held stage to the first derived unloading stage, recording why and the stages', () => {
    const r = ok(holdingAt(4), { type: 'unload', reason: 'stop-limit' });
    expect(r.state).toMatchObject({ phase: 'pumping', stageIndex: 5 });
    expect(r.events.map((e) => e.kind)).toEqual([UNLOADING_EVENT, 'stage-advanced']);
    expect(r.events[0]).toMatchObject({ userId: 3, payload: { reason: 'stop-limit', rule: 'modulus', reachedIndex: 4, maxKpa: 160, fromIndex: 5 } });
    expect(r.events[1].payload).toMatchObject({ from: 4, to: 5, targetKpa: 80, branch: 'unloading' });
    const after = stagesAfterEvents(modulusStages, r.events);
    expect(short(after)).toEqual(['s10', 'l40', 'l80', 'l120', 'l160', 'u80', 'u40', 'u0', 'r40', 'r80', 'r120']);
    expect(describeRunEvent(r.events[0])).toEqual({ title: 'Unloading begun', detail: 'Settlement stop limit reached; from 160 kPa (Stage 5)' });

    // The run then follows the derived stages to the last reloading stage and finishes there.
    let s = r.state;
    for (let i = 5; i < after.length; i++) {
      s = applyObservation(s, { type: 'target-reached' }, 100 * i)!.state;
      s = applyObservation(s, { type: 'hold-met' }, 100 * i + 5)!.state;
      if (i < after.length - 1) s = ok(s, { type: 'advance' }, base(after)).state;
    }
    expect(ok(s, { type: 'finish' }, base(after)).state.phase).toBe('completed');
    // Going to unloading again, from a reloading stage, is refused.
    expect(applyCommand(s, { type: 'unload', reason: 'failure' }, base(after))).toMatchObject({ ok: false, message: expect.stringMatching(/loading stage/) });
  });

  it('while pumping to a stage never reached, the stage before it is the maximum and the current index is replaced', () => {
    const pumping = ok(holdingAt(4), { type: 'advance' }).state;
    const r = ok(pumping, { type: 'unload', reason: 'reaction-limit', note: 'kentledge lifting' });
    expect(r.state).toMatchObject({ phase: 'pumping', stageIndex: 5 });
    expect(r.events[0].payload).toMatchObject({ reachedIndex: 4, fromIndex: 5, note: 'kentledge lifting' });
    expect(r.events[1].payload).toMatchObject({ from: 5, to: 5, targetKpa: 80 });
  });

  it('is refused before the run starts and from the seating stage', () => {
    expect(applyCommand(initialRunState(), { type: 'unload', reason: 'other' }, base())).toMatchObject({ ok: false });
    expect(applyCommand(holdingAt(0), { type: 'unload', reason: 'other' }, base())).toMatchObject({
      ok: false,
      message: 'Unloading can begin only from a loading stage.',
    });
  });

  it('a refused next-stage prompt blocks advancing (early too) but not going to unloading', () => {
    const held = holdingAt(4);
    const blocked = { ...base(), nextStageRefusal: 'Target 200 kPa needs 63.14 MPa on the jack gauge; the jack calibration is valid to 50 MPa.' };
    expect(applyCommand(held, { type: 'advance' }, blocked)).toEqual({
      ok: false,
      code: 'invalid',
      message: `${blocked.nextStageRefusal} Go to unloading instead.`,
    });
    const early = applyObservation(ok(holdingAt(3), { type: 'advance' }).state, { type: 'target-reached' }, 1)!.state;
    expect(applyCommand(early, { type: 'advance', reason: 'in a hurry' }, blocked)).toMatchObject({ ok: false, code: 'invalid' });
    expect(applyCommand(held, { type: 'unload', reason: 'jack-limit' }, blocked)).toMatchObject({ ok: true });
  });
});

describe('the measurement model follows the derived stages', () => {
  it('reads the jack on its falling branch in a derived unloading stage, where the plan had a loading stage', () => {
    const setup = { stageBranches: modulusStages.map((s) => s.branch), jack: null, pressureUnit: null } as unknown as RunSetupSnapshot;
    const tail = unloadingStages({ stages: modulusStages, reachedIndex: 4, currentIndex: 4, rule: 'modulus', planUnloadKpa: [] }).slice(5);
    let state = initialModelState(setup);
    expect(jackBranchOf(setup, 5, state)).toBe('rising');
    state = applyModelEvent(setup, state, { kind: UNLOADING_EVENT, atMs: 0, payload: { fromIndex: 5, stages: tail } });
    state = applyModelEvent(setup, state, { kind: 'stage-advanced', atMs: 0, payload: { to: 5 } });
    expect(jackBranchOf(setup, state.stageIndex, state)).toBe('falling');
    expect(jackBranchOf(setup, 8, state)).toBe('rising'); // reloading
  });
});
