import type { HoldRule } from './plans';
import type { AlarmRecord } from '../hold/alarm-lifecycle';
import type { NextStepPrompt } from '../hold/next-step';
import type { ReadingFlag } from '../hold/schedule';
import type { HoldEvaluation } from '../hold/verdict';
import type { PlannedStage } from '../plans/stages';
import type { MeasurementParams } from '../runs/measurement-model';
import { UNLOAD_REASONS } from '../plans/unloading';
import { z } from 'zod';
import { idSchema, requiredLines } from './common';

/**
 * Where a run stands. `preparing`: rig checked, gauges zeroed; `pumping`: the operator brings the jack
 * to the stage's target; `holding`: the target is on and the hold rule is judging; `hold-met`: the
 * hold rule is satisfied and the next step is prompted; `completed` / `stopped`: closed.
 */
export const RUN_PHASES = ['preparing', 'pumping', 'holding', 'hold-met', 'completed', 'stopped'] as const;
export type RunPhase = (typeof RUN_PHASES)[number];
export const ACTIVE_PHASES: readonly RunPhase[] = ['preparing', 'pumping', 'holding', 'hold-met'];

export const runCreateInput = z.object({
  planId: z.number().int().positive(),
  rigId: z.number().int().positive(),
});
export type RunCreateInput = z.infer<typeof runCreateInput>;

const channelKey = z.string().min(1).max(16);
const reason = requiredLines(500);

/** Commands a person sends to a run. Each carries the run version it was decided on (R7). */
export const runCommandSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('zero') }),
  /** Begin with the seating stage. */
  z.object({ type: z.literal('start') }),
  /** An engineer accepts, with a reason, running with an instrument whose calibration is overdue. */
  z.object({ type: z.literal('accept-overdue'), reason }),
  /** The operator reports the target is on (used when the pressure reading cannot tell, e.g. manual mode). */
  z.object({ type: z.literal('stage-reached') }),
  /** Go to the next stage; before the hold is met a reason is required. */
  z.object({ type: z.literal('advance'), reason: reason.optional() }),
  /** End loading here and go to unloading (stages derived from the stage reached), with the reason. */
  z.object({ type: z.literal('unload'), reason: z.enum(UNLOAD_REASONS), note: reason.optional() }),
  z.object({ type: z.literal('top-up') }),
  z.object({ type: z.literal('gauge-reset'), channel: channelKey, beforeMm: z.number().min(-500).max(500), afterMm: z.number().min(-500).max(500) }),
  /** A note for the record; one about the weather also fills the report's weather line. */
  z.object({ type: z.literal('note'), text: requiredLines(2000), topic: z.literal('weather').optional() }),
  z.object({ type: z.literal('finish') }),
  z.object({ type: z.literal('stop'), reason }),
  z.object({ type: z.literal('acknowledge-alarm'), key: z.string().min(1).max(80) }),
  z.object({ type: z.literal('shelve-alarm'), key: z.string().min(1).max(80), minutes: z.number().positive().max(24 * 60), reason }),
  z.object({ type: z.literal('take-control') }),
  /** Manual mode: readings typed in from dial gauges and the pressure gauge. */
  z.object({
    type: z.literal('manual-reading'),
    pressureKpa: z.number().min(0).max(20000).optional(),
    gauges: z.record(channelKey, z.number().min(-500).max(500)),
  }),
]);
export type RunCommand = z.infer<typeof runCommandSchema>;

export const runCommandEnvelope = z.object({
  /** The run version the sender saw; a stale version is refused so two people cannot cross commands. */
  version: z.number().int().min(0),
  command: runCommandSchema,
});

export const runParams = z.object({ id: idSchema });


/** Where a finished stage's hold ended: one point of the load–settlement curve. */
export interface StagePointLive {
  stageIndex: number;
  branch: PlannedStage['branch'];
  targetKpa: number;
  pressureKpa: number;
  settlementMm: number;
  atMs: number;
}

/** A run as the console shows it: one authoritative snapshot, pushed on every change. */
export interface RunView {
  id: number;
  planId: number;
  planName: string;
  procedureId: string;
  rigId: number | null;
  rigName: string;
  manual: boolean;
  /** The rig's channels in sample order: `run:samples` rows name them by index. Values are micro-units (µm, or 1/1000 of `unit`). */
  channels: { key: string; label: string; role: 'gauge' | 'pressure' | 'load'; unit: string; direction: 1 | -1 | null }[];
  /** Plate and plan facts the console shows. */
  plate: { shape: 'circular' | 'square'; sizeMm: number };
  holdRule: HoldRule;
  stopLimitMm: number;
  phase: RunPhase;
  version: number;
  stageIndex: number;
  stages: PlannedStage[];
  controller: { id: number; name: string } | null;
  calibrationOverride: { by: string; reason: string; atMs: number } | null;
  overdueInstruments: string[];
  closedReason: string | null;
  clock: { nowMs: number; speed: number };
  stageStartedAtMs: number | null;
  holdStartedAtMs: number | null;
  holdMetAtMs: number | null;
  live: {
    atMs: number | null;
    pressureKpa: number | null;
    plateForceKn: number | null;
    jackForceKn: number | null;
    oilPressure: number | null;
    oilUnit: string | null;
    pressureProblem: string | null;
    meanSettlementMm: number | null;
    tiltSlope: number | null;
    spreadMm: number | null;
    gauges: { key: string; label: string; readingMm: number | null; settlementMm: number | null; travelMm: number | null }[];
  };
  hold: HoldEvaluation | null;
  /** While pumping: the current target; once the hold is met: the next one (null after the last stage). */
  prompt: NextStepPrompt | null;
  nextReading: { atMin: number; inMin: number } | null;
  /** Manual mode: scheduled readings that were typed in late or not at all. */
  readingFlags: ReadingFlag[];
  alarms: AlarmRecord[];
  watchers: { id: number; name: string; role: string }[];
  lastSeq: number;
  stagePoints: StagePointLive[];
  /** The measurement model's parameters (set-up snapshot and the events that change what a sample means), so a browser measures samples exactly as the server does. */
  measurement: MeasurementParams;
}
