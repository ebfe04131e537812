import { describe, expect, it } from 'vitest';
import { buildStageSequence } from '../../../shared/plans/stages';
import {
  calibratedRangeAlarm,
  gaugeTravelAlarm,
  loadDriftAlarm,
  reactionCapacityAlarm,
  signalLostAlarm,
  stopLimitAlarm,
  tiltAlarm,
} from '../../../shared/hold/alarms';
import { describeRunEvent } from '../../../shared/runs/event-text';
import { applyCommand, applyObservation, initialRunState, type RunState } from '../../../shared/runs/lifecycle';
import { overPrecise, unitFigureCount } from './unit-figures';

/** Awkward floats: what a calibration curve or a unit conversion leaves behind. */
const AWKWARD = [7.07355302630646, 98.11111111111, 0.1 + 0.2, 123.456789, 2 / 3];

describe('alarm words carry no more places than their unit shows', () => {
  it('every alarm message over awkward figures', () => {
    const messages: string[] = [];
    for (const x of AWKWARD) {
      messages.push(loadDriftAlarm({ targetKpa: x * 10, actualKpa: x * 7 }).message);
      messages.push(loadDriftAlarm({ targetKpa: x * 10, actualKpa: x * 13 }).message);
      messages.push(loadDriftAlarm({ targetKpa: x * 10, actualKpa: x * 10 + 0.01 }).message);
      messages.push(loadDriftAlarm({ targetKpa: x, actualKpa: x, deadWeightKpa: 7.07355302630646 }).message);
      messages.push(tiltAlarm({ gauges: [{ xMm: 140, yMm: 0, settlementMm: x * 3 }, { xMm: -140, yMm: 0, settlementMm: x }] }).message);
      messages.push(gaugeTravelAlarm({ gauge: 'g1', readingMm: x * 30, travelMm: 25, sign: 1 }).message);
      messages.push(stopLimitAlarm({ meanSettlementMm: x * 40, stopLimitMm: 25.123456 }).message);
      messages.push(reactionCapacityAlarm({ jackForceKn: x * 140, capacityKn: 100.55555 }).message);
      messages.push(signalLostAlarm({ channel: 'g1', lastSampleAtMs: 0, nowMs: x * 10_000 }).message);
      const jack = { kind: 'table', inputUnit: 'MPa', outputUnit: 'kN', points: [{ input: 0, output: 0 }, { input: 50.123456, output: 500 }] } as const;
      const range = calibratedRangeAlarm({ subject: 'p1', label: 'Oil pressure', reading: x * 100, calibration: jack as never });
      if (range) messages.push(range.message);
    }
    expect(messages.reduce((n, m) => n + unitFigureCount(m), 0)).toBeGreaterThan(60); // the pattern really finds the figures
    expect(overPrecise('Pressure 7.07355 kPa, 0.123 mm, 12.5 s')).toEqual(['7.07355 kPa', '0.123 mm', '12.5 s']); // and would catch these
    for (const m of messages) expect(overPrecise(m), m).toEqual([]);
    for (const m of messages) expect(m).not.toMatch(/\d\.\d{4,}/);
  });

  it('the target of a drift alarm is the planned figure in a tenth of a kPa: "7.1 kPa target", not 7.07355302630646', () => {
    expect(loadDriftAlarm({ targetKpa: 7.07355302630646, actualKpa: 12 }).message).toBe('Pressure 12.0 kPa is 4.9 kPa above the 7.1 kPa target: let some pressure off.');
    expect(loadDriftAlarm({ targetKpa: 100, actualKpa: 97.5 }).message).toBe('Pressure 97.5 kPa is 2.5 kPa below the 100 kPa target: top up the pump.');
  });
});

describe('load drift where the jack holds no load', () => {
  // A 0.5 kN apparatus on a 300 mm plate: 0.5 / (π · 0.15²) = 7.07 kPa (plate area, calc).
  const deadWeightKpa = 0.5 / (Math.PI * 0.15 ** 2);

  it('is silent at a 0 kPa stage with the valve open: never "let some pressure off"', () => {
    const alarm = loadDriftAlarm({ targetKpa: 0, actualKpa: deadWeightKpa + 3, deadWeightKpa });
    expect(alarm).toMatchObject({ active: false, value: null });
    expect(alarm.message).toMatch(/^No load drift to watch: the 0 kPa target is at or below the 7\.1 kPa the apparatus puts on the plate/);
    expect(alarm.message).not.toMatch(/let some pressure off/);
  });

  it('is silent for a seating target below the dead weight, and watches a target above it as usual', () => {
    expect(loadDriftAlarm({ targetKpa: 7, actualKpa: 12, deadWeightKpa }).active).toBe(false);
    expect(loadDriftAlarm({ targetKpa: 50, actualKpa: 45, deadWeightKpa }).active).toBe(true);
    expect(loadDriftAlarm({ targetKpa: 50, actualKpa: 55, deadWeightKpa }).message).toMatch(/above the 50 kPa target/);
  });

  it('marks the deadband a raised alarm must leave before it clears (half the tolerance each side)', () => {
    expect(loadDriftAlarm({ targetKpa: 100, actualKpa: 98.5 })).toMatchObject({ active: false, inDeadband: true });
    expect(loadDriftAlarm({ targetKpa: 100, actualKpa: 101.5 })).toMatchObject({ active: false, inDeadband: true });
    expect(loadDriftAlarm({ targetKpa: 100, actualKpa: 99.1 })).toMatchObject({ active: false, inDeadband: false });
    expect(loadDriftAlarm({ targetKpa: 400, actualKpa: 395 })).toMatchObject({ active: false, inDeadband: true }); // ±8 limit, ±4 clear band
  });
});

describe('a hold met while the load drifted', () => {
  const stages = buildStageSequence({ seatingPressureKpa: 7, loading: { mode: 'list', pressuresKpa: [100] }, unloadReload: { unloadKpa: [], reload: { mode: 'none' }, repetitionsPerLevel: 1 } });
  const holding = (): RunState => {
    let s = initialRunState();
    for (const cmd of [{ type: 'zero' }, { type: 'start' }] as const) {
      const r = applyCommand(s, cmd, { nowMs: 1000, actor: { id: 3, name: 'Op', role: 'operator' }, stages, gaugeReadings: { g1: 1 }, overdueInstruments: [] });
      if (!r.ok) throw new Error(r.message);
      s = r.state;
    }
    return applyObservation(s, { type: 'target-reached' }, 2000)!.state;
  };

  it('is recorded as met under drift, with the drift in words', () => {
    const words = loadDriftAlarm({ targetKpa: 100, actualKpa: 88.04 }).message;
    const { events } = applyObservation(holding(), { type: 'hold-met', underDrift: words }, 3000)!;
    expect(events[0]).toMatchObject({ kind: 'hold-met', payload: { stageIndex: 0, underDrift: words } });
    expect(describeRunEvent(events[0])).toEqual({ title: 'Hold met under drift', detail: expect.stringContaining('Pressure 88.0 kPa is 12.0 kPa below the 100 kPa target') });
  });

  it('is plainly met when no drift stood', () => {
    const { events } = applyObservation(holding(), { type: 'hold-met', underDrift: null }, 3000)!;
    expect(events[0].payload).toEqual({ stageIndex: 0 });
    expect(describeRunEvent(events[0]).title).toBe('Hold met');
  });
});
