/**
 * The run state machine as a pure reducer: one authoritative state per run, changed only by commands
 * (people) and observations (the engine). Every accepted change yields run events for the record;
 * a command that does not fit the state is refused with a reason, never half-applied.
 */
import { type GaugeSign, resetOffset } from '../hold/gauge-reset';
import type { PlannedStage } from '../plans/stages';
import { UNLOADING_EVENT, type UnloadingRule, unloadingReasonText, unloadingStages } from '../plans/unloading';
import type { RunCommand, RunPhase } from '../schemas/runs';
import type { Role } from '../schemas/users';

export interface Actor {
  id: number;
  name: string;
  role: Role;
}

export interface RunState {
  phase: RunPhase;
  /** Rises with every accepted change; commands must quote it (QUALITY R7). */
  version: number;
  stageIndex: number;
  /** When the current stage's target was set (pumping began), run clock ms. */
  stageStartedAtMs: number | null;
  /** When the target was reached: t = 0 of the hold series. */
  holdStartedAtMs: number | null;
  holdMetAtMs: number | null;
  /** Gauge readings taken as zero, mm, by channel key. */
  zeros: Record<string, number>;
  /** Offsets added by gauge resets, mm, by channel key (reference §C12). */
  resetOffsets: Record<string, number>;
  /** The one person whose station commands the run. */
  controller: { id: number; name: string } | null;
  calibrationOverride: { by: string; reason: string; atMs: number } | null;
  closedReason: string | null;
}

export interface RunEventDraft {
  kind: string;
  atMs: number;
  userId: number | null;
  payload: Record<string, unknown>;
}

export interface CommandContext {
  nowMs: number;
  actor: Actor;
  stages: readonly PlannedStage[];
  /** Latest calibrated gauge readings, mm, by channel key (for zeroing). */
  gaugeReadings: Record<string, number>;
  /** Instruments chosen for the run whose calibration is overdue (serial numbers). */
  overdueInstruments: readonly string[];
  /** Each gauge's direction (+1 reading grows as the plate settles, −1 it falls), by channel key. */
  gaugeSigns?: Record<string, GaugeSign>;
  /** How the plan unloads when loading ends early (default: rebound stages, no planned unloading pressures). */
  unloading?: { rule: UnloadingRule; planUnloadKpa: readonly number[] };
  /** Why the next stage must not be applied (its prompt is refused: the jack's calibration range or rating); null when it may. */
  nextStageRefusal?: string | null;
}

export type CommandResult = { ok: true; state: RunState; events: RunEventDraft[] } | { ok: false; code: 'conflict' | 'forbidden' | 'invalid'; message: string };

export function initialRunState(): RunState {
  return {
    phase: 'preparing',
    version: 0,
    stageIndex: 0,
    stageStartedAtMs: null,
    holdStartedAtMs: null,
    holdMetAtMs: null,
    zeros: {},
    resetOffsets: {},
    controller: null,
    calibrationOverride: null,
    closedReason: null,
  };
}

const isClosed = (s: RunState) => s.phase === 'completed' || s.phase === 'stopped';
const refuse = (message: string, code: 'conflict' | 'forbidden' | 'invalid' = 'conflict'): CommandResult => ({ ok: false, code, message });

/** Roles that may command a run at all; clients never do. */
export const COMMANDING_ROLES: readonly Role[] = ['admin', 'engineer', 'operator'];

/** Commands anyone allowed to command may send without holding control. */
const FREE_COMMANDS = new Set<RunCommand['type']>(['take-control', 'note', 'acknowledge-alarm', 'shelve-alarm', 'accept-overdue']);
/** Commands that name what they act on (an alarm by its key), so they stand whatever else changed since the sender looked. */
const KEYED_COMMANDS = new Set<RunCommand['type']>(['acknowledge-alarm', 'shelve-alarm']);

/**
 * Whether a command must quote the run's current version: every command is decided on what its sender
 * saw, so a stale one is refused (two stations never cross), except those that name what they act on.
 */
export const needsCurrentVersion = (command: RunCommand) => !KEYED_COMMANDS.has(command.type);

export function applyCommand(state: RunState, command: RunCommand, ctx: CommandContext): CommandResult {
  if (!COMMANDING_ROLES.includes(ctx.actor.role)) return refuse('Your role may watch this run but not command it.', 'forbidden');
  if (isClosed(state) && command.type !== 'note') return refuse(`The run is ${state.phase}; it takes notes only.`);
  if (state.controller && state.controller.id !== ctx.actor.id && !FREE_COMMANDS.has(command.type)) {
    return refuse(`${state.controller.name} is commanding this run; take control first.`);
  }
  const event = (kind: string, payload: Record<string, unknown> = {}): RunEventDraft => ({ kind, atMs: ctx.nowMs, userId: ctx.actor.id, payload });
  const next = (patch: Partial<RunState>, events: RunEventDraft[]): CommandResult => ({
    ok: true,
    state: { ...state, controller: state.controller ?? { id: ctx.actor.id, name: ctx.actor.name }, ...patch, version: state.version + 1 },
    events,
  });
  const stage = ctx.stages[state.stageIndex];

  switch (command.type) {
    case 'take-control':
      return next({ controller: { id: ctx.actor.id, name: ctx.actor.name } }, [event('control-taken', { from: state.controller?.name ?? null })]);
    case 'note':
      return next({}, [event('note', { text: command.text, ...(command.topic ? { topic: command.topic } : {}) })]);
    // The alarm reducer (shared/hold/alarm-lifecycle) decides whether these apply; the run records who and when.
    case 'acknowledge-alarm':
      return next({}, [event('alarm-acknowledge', { key: command.key })]);
    case 'shelve-alarm':
      return next({}, [event('alarm-shelve', { key: command.key, minutes: command.minutes, reason: command.reason })]);
    case 'zero': {
      const zeroable = state.phase === 'preparing' || (state.phase === 'hold-met' && stage?.branch === 'seating');
      if (!zeroable) return refuse('Gauges are zeroed before the test or after seating, not during a stage.');
      if (Object.keys(ctx.gaugeReadings).length === 0) return refuse('No gauge reading to zero yet; check the gauges are connected.', 'invalid');
      return next({ zeros: { ...ctx.gaugeReadings }, resetOffsets: {} }, [event('gauges-zeroed', { readings: ctx.gaugeReadings })]);
    }
    case 'start': {
      if (state.phase !== 'preparing') return refuse('The run has already started.');
      if (Object.keys(state.zeros).length === 0) return refuse('Zero the gauges before starting.', 'invalid');
      if (ctx.overdueInstruments.length > 0 && !state.calibrationOverride) {
        return refuse(`Calibration overdue: ${ctx.overdueInstruments.join(', ')}. An engineer must accept it, with a reason, before the run starts.`, 'invalid');
      }
      return next({ phase: 'pumping', stageIndex: 0, stageStartedAtMs: ctx.nowMs, holdStartedAtMs: null, holdMetAtMs: null }, [
        event('run-started', { stageIndex: 0, targetKpa: ctx.stages[0]?.targetKpa, overdueInstruments: ctx.overdueInstruments }),
      ]);
    }
    case 'accept-overdue':
      if (ctx.actor.role === 'operator') return refuse('Only an engineer or admin may accept an overdue calibration.', 'forbidden');
      if (state.phase !== 'preparing') return refuse('The run has already started.');
      if (ctx.overdueInstruments.length === 0) return refuse('No instrument of this run is overdue.', 'invalid');
      return {
        ok: true,
        state: { ...state, calibrationOverride: { by: ctx.actor.name, reason: command.reason, atMs: ctx.nowMs }, version: state.version + 1 },
        events: [event('calibration-overridden', { instruments: ctx.overdueInstruments, reason: command.reason })],
      };
    case 'stage-reached':
      if (state.phase !== 'pumping') return refuse('The target can only be reached while pumping.');
      return next({ phase: 'holding', holdStartedAtMs: ctx.nowMs }, [event('target-reached', { stageIndex: state.stageIndex, by: 'operator' })]);
    case 'advance': {
      if (state.phase !== 'hold-met' && state.phase !== 'holding') return refuse('There is no hold to advance from.');
      if (state.phase === 'holding' && !command.reason) return refuse('The hold is not met yet; give a reason to advance early.', 'invalid');
      const nextIndex = state.stageIndex + 1;
      if (nextIndex >= ctx.stages.length) return refuse('This was the last stage; finish the run.', 'invalid');
      if (ctx.nextStageRefusal) return refuse(`${ctx.nextStageRefusal} Go to unloading instead.`, 'invalid');
      return next({ phase: 'pumping', stageIndex: nextIndex, stageStartedAtMs: ctx.nowMs, holdStartedAtMs: null, holdMetAtMs: null }, [
        event('stage-advanced', { from: state.stageIndex, to: nextIndex, targetKpa: ctx.stages[nextIndex].targetKpa, early: state.phase === 'holding', reason: command.reason ?? null }),
      ]);
    }
    case 'unload':
      return goToUnloading(state, command, ctx, next, event);
    case 'top-up':
      if (state.phase !== 'holding' && state.phase !== 'hold-met') return refuse('Top-ups are recorded during a hold.');
      return next({}, [event('top-up', { stageIndex: state.stageIndex })]);
    case 'gauge-reset': {
      if (state.phase !== 'holding' && state.phase !== 'hold-met') return refuse('Reset a gauge only while the load is held constant.');
      if (!(command.channel in state.zeros)) return refuse(`Unknown gauge "${command.channel}".`, 'invalid');
      const offset = (state.resetOffsets[command.channel] ?? 0) + resetOffset(command.beforeMm, command.afterMm, ctx.gaugeSigns?.[command.channel] ?? 1);
      return next({ resetOffsets: { ...state.resetOffsets, [command.channel]: offset } }, [
        event('gauge-reset', { channel: command.channel, beforeMm: command.beforeMm, afterMm: command.afterMm, offsetMm: offset }),
      ]);
    }
    case 'manual-reading':
      return next({}, [event('manual-reading', { pressureKpa: command.pressureKpa ?? null, gauges: command.gauges, stageIndex: state.stageIndex })]);
    case 'finish':
      if (state.phase === 'preparing') return refuse('Nothing to finish yet; stop the run instead.');
      if (state.stageIndex < ctx.stages.length - 1 || state.phase !== 'hold-met') return refuse('Finish after the last stage’s hold is met, or stop the run early with a reason.', 'invalid');
      return next({ phase: 'completed', closedReason: 'all stages done' }, [event('run-completed')]);
    case 'stop':
      return next({ phase: 'stopped', closedReason: command.reason }, [event('run-stopped', { reason: command.reason, stageIndex: state.stageIndex })]);
  }
}

/**
 * Loading ends early: the stages after the one reached become unloading (and, by the modulus rule,
 * reloading) stages derived from it (shared/plans/unloading), and the run goes on to the first of them.
 */
function goToUnloading(
  state: RunState,
  command: Extract<RunCommand, { type: 'unload' }>,
  ctx: CommandContext,
  next: (patch: Partial<RunState>, events: RunEventDraft[]) => CommandResult,
  event: (kind: string, payload?: Record<string, unknown>) => RunEventDraft,
): CommandResult {
  const stage = ctx.stages[state.stageIndex];
  if (state.phase !== 'pumping' && state.phase !== 'holding' && state.phase !== 'hold-met') return refuse('Go to unloading from a loading stage of a running test.');
  if (stage?.branch !== 'loading') return refuse('Unloading can begin only from a loading stage.', 'invalid');
  // While pumping, the stage being pumped to was never reached: the last loading stage before it is the maximum.
  const held = state.phase !== 'pumping';
  const before = ctx.stages.slice(0, state.stageIndex).filter((s) => s.branch === 'loading');
  const reachedIndex = held ? state.stageIndex : (before[before.length - 1]?.index ?? null);
  const { rule, planUnloadKpa } = ctx.unloading ?? { rule: 'rebound', planUnloadKpa: [] };
  const stages = unloadingStages({ stages: ctx.stages, reachedIndex, currentIndex: state.stageIndex, rule, planUnloadKpa });
  const fromIndex = held ? state.stageIndex + 1 : state.stageIndex;
  const first = stages[fromIndex];
  const reasonText = unloadingReasonText(command);
  return next({ phase: 'pumping', stageIndex: fromIndex, stageStartedAtMs: ctx.nowMs, holdStartedAtMs: null, holdMetAtMs: null }, [
    event(UNLOADING_EVENT, {
      reason: command.reason,
      note: command.note ?? null,
      rule,
      reachedIndex,
      maxKpa: reachedIndex === null ? null : ctx.stages[reachedIndex].targetKpa,
      fromIndex,
      stages: stages.slice(fromIndex),
      // What the change replaced, for the audit trail.
      replaced: ctx.stages.slice(fromIndex),
    }),
    event('stage-advanced', { from: state.stageIndex, to: fromIndex, targetKpa: first.targetKpa, branch: first.branch, early: state.phase !== 'hold-met', reason: `Unloading: ${reasonText}` }),
  ]);
}

/** `underDrift`: the load-drift alarm's words when the hold's criterion was met while that alarm stood. */
export type Observation = { type: 'target-reached' } | { type: 'hold-met'; underDrift?: string | null };

/** Changes the engine makes from what it measures; an observation that no longer fits is ignored (null). */
export function applyObservation(state: RunState, observation: Observation, nowMs: number): { state: RunState; events: RunEventDraft[] } | null {
  const event = (kind: string, payload: Record<string, unknown> = {}): RunEventDraft => ({ kind, atMs: nowMs, userId: null, payload });
  const bump = (patch: Partial<RunState>) => ({ ...state, ...patch, version: state.version + 1 });
  switch (observation.type) {
    case 'target-reached':
      if (state.phase !== 'pumping') return null;
      return { state: bump({ phase: 'holding', holdStartedAtMs: nowMs }), events: [event('target-reached', { stageIndex: state.stageIndex, by: 'pressure reading' })] };
    case 'hold-met':
      if (state.phase !== 'holding') return null;
      return { state: bump({ phase: 'hold-met', holdMetAtMs: nowMs }), events: [event('hold-met', { stageIndex: state.stageIndex, ...(observation.underDrift ? { underDrift: observation.underDrift } : {}) })] };
  }
}
