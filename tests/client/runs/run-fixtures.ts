import type { AlarmRecord } from '@shared/hold/alarm-lifecycle';
import { nextStepPrompt } from '@shared/hold/next-step';
import type { HoldEvaluation } from '@shared/hold/verdict';
import type { SampleBatch } from '@shared/realtime/events';
import type { RunView } from '@shared/schemas/runs';

/* An invented run: plate test TP-4 at the Larkfield depot extension, rig "Larkfield rig B". */

/** 80 mm jack ram: gauge pressure in bar = F / A, A = π·0.04² m² (hydraulics: p = F/A; 1 bar = 100 kPa). */
const RAM_AREA_M2 = Math.PI * 0.04 ** 2;
const toBar = (kn: number) => kn / RAM_AREA_M2 / 100;

const STAGES: RunView['stages'] = [
  { index: 0, branch: 'seating', targetKpa: 7, repetition: 1 },
  { index: 1, branch: 'loading', targetKpa: 100, repetition: 1 },
  { index: 2, branch: 'loading', targetKpa: 200, repetition: 1 },
  { index: 3, branch: 'loading', targetKpa: 300, repetition: 1 },
];

const PLATE = { shape: 'circular' as const, sizeMm: 300 };

export function aPrompt(stageIndex: number) {
  const stage = STAGES[stageIndex];
  return nextStepPrompt({ stage, plate: PLATE, gaugePressureFor: (kn) => ({ pressure: toBar(kn), refusal: null }), gaugeUnit: 'bar' });
}

export const SETTLING_HOLD: HoldEvaluation = {
  verdict: 'settling',
  evidence: {
    kind: 'rate',
    heldMin: 12.5,
    latestSettlementMm: 3.42,
    readings: 750,
    failureSignals: [],
    currentRateMmPerMin: 0.034,
    rateStandardErrorMmPerMin: 0.002,
    rateUnavailableReason: null,
    previousRateMmPerMin: 0.051,
    maxRateMmPerMin: 0.02,
    windowMin: 10,
    coveredMin: 10,
    points: 600,
    minHoldMin: 15,
    decayTimeConstantMin: 6,
  },
  criterion: {
    text: 'Settlement rate below 0.02 mm/min over a 10 min window, after at least 15 min',
    sources: [{ setting: 'holdRule.maxRateMmPerMin', tag: 'common practice', text: '0.02 mm/min is common practice for non-cohesive soil' }],
    matchesDefault: true,
  },
  etaMin: 4.2,
};

export const TRAVEL_ALARM: AlarmRecord = {
  code: 'gauge-travel',
  subject: 'g2',
  state: 'unacknowledged',
  alarm: {
    code: 'gauge-travel',
    subject: 'g2',
    severity: 'warning',
    active: true,
    message: 'East gauge has 1.6 mm of travel left: reset it',
    value: 1.6,
    limit: 2,
    unit: 'mm',
    source: { tag: 'common practice', text: 'Reset a gauge before its stem runs out of travel' },
  },
  raisedAtMs: 1_700_000_000_000,
  shelvedUntilMs: null,
  history: [],
};

/**
 * The run's measurement model parameters: g1 (read upwards) zeroed at 10.00 mm and g2 (read downwards) at
 * 26.45 mm before the start, the jack a linear 80 mm ram (kN = bar × 100 kPa/bar × A), stages 0 → 1 → 2.
 */
export const MEASUREMENT: RunView['measurement'] = {
  setup: {
    channels: [
      { key: 'g1', role: 'gauge', label: 'West gauge', instrumentId: null, profileId: 'manual', port: '', gauge: { xMm: -100, yMm: 0, direction: 1, travelMm: 25 } },
      { key: 'g2', role: 'gauge', label: 'East gauge', instrumentId: null, profileId: 'manual', port: '', gauge: { xMm: 100, yMm: 0, direction: -1, travelMm: 25 } },
      { key: 'p', role: 'pressure', label: 'Jack pressure', instrumentId: 5, profileId: 'manual', port: '', gauge: null },
    ],
    plate: PLATE,
    apparatusWeightKn: 0,
    stageBranches: STAGES.map((s) => s.branch),
    jack: { instrumentId: 6, serial: 'J-80', calibrationId: 11, calibration: { inputUnit: 'bar', outputUnit: 'kN', curve: { kind: 'linear', c0: 0, c1: RAM_AREA_M2 * 100 } } },
    pressureUnit: 'bar',
    instruments: [],
  },
  events: [
    { kind: 'gauges-zeroed', atMs: -60_000, payload: { readings: { g1: 10, g2: 26.45 }, afterSeq: 10 } },
    { kind: 'run-started', atMs: 0, payload: { stageIndex: 0, afterSeq: 20 } },
    { kind: 'stage-advanced', atMs: 600_000, payload: { from: 0, to: 1, afterSeq: 200 } },
    { kind: 'stage-advanced', atMs: 2_000_000, payload: { from: 1, to: 2, afterSeq: 700 } },
  ],
};

/** The run holding stage 2 (200 kPa) with two gauges. Override any field. */
export function aRunView(fields: Partial<RunView> = {}): RunView {
  return {
    id: 7,
    planId: 31,
    planName: 'TP-4 bearing test, 300 mm plate',
    procedureId: 'bearing-granular',
    rigId: 2,
    rigName: 'Larkfield rig B',
    manual: false,
    channels: [
      { key: 'g1', label: 'West gauge', role: 'gauge', unit: 'mm', direction: 1 },
      { key: 'g2', label: 'East gauge', role: 'gauge', unit: 'mm', direction: -1 },
      { key: 'p', label: 'Jack pressure', role: 'pressure', unit: 'bar', direction: null },
    ],
    plate: PLATE,
    holdRule: { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 10, minHoldMin: 15 },
    stopLimitMm: 25,
    phase: 'holding',
    version: 42,
    stageIndex: 2,
    stages: STAGES,
    controller: null,
    calibrationOverride: null,
    overdueInstruments: [],
    closedReason: null,
    clock: { nowMs: 3_600_000, speed: 1 },
    stageStartedAtMs: 2_700_000,
    holdStartedAtMs: 2_850_000,
    holdMetAtMs: null,
    live: {
      atMs: 3_598_000,
      pressureKpa: 199.6,
      plateForceKn: 14.11,
      jackForceKn: 14.11,
      oilPressure: 28.07,
      oilUnit: 'bar',
      pressureProblem: null,
      meanSettlementMm: 3.42,
      tiltSlope: 0.0025,
      spreadMm: 0.75,
      gauges: [
        { key: 'g1', label: 'West gauge', readingMm: 13.8, settlementMm: 3.8, travelMm: 25 },
        { key: 'g2', label: 'East gauge', readingMm: 23.41, settlementMm: 3.04, travelMm: 25 },
      ],
    },
    hold: SETTLING_HOLD,
    prompt: aPrompt(3),
    nextReading: null,
    readingFlags: [],
    alarms: [],
    watchers: [{ id: 9, name: 'Ines Okafor', role: 'engineer' }],
    lastSeq: 1000,
    stagePoints: [],
    measurement: MEASUREMENT,
    ...fields,
  };
}

/** A batch of samples in the server's columns: rows of [seq, run ms, channel index, micro-units]. */
export function aBatch(rows: [number, number, number, number | null][], runId = 7): SampleBatch {
  return { runId, seq: rows.map((r) => r[0]), t: rows.map((r) => r[1]), channel: rows.map((r) => r[2]), value: rows.map((r) => r[3]) };
}
