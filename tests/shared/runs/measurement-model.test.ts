import { describe, expect, it } from 'vitest';
import { HoldSeriesTracker } from '../../../shared/runs/hold-series';
import { type ModelEvent, type RunSetupSnapshot, RunMeasurer, eventPrecedes, oilForPlatePressure, stateAtTime } from '../../../shared/runs/measurement-model';
import type { RigChannelInput } from '../../../shared/schemas/instruments';

const gauge = (key: string, xMm: number, direction: 1 | -1): RigChannelInput => ({ key, role: 'gauge', label: key, instrumentId: null, profileId: 'manual', port: '', gauge: { xMm, yMm: 0, direction, travelMm: 50 } });

/**
 * Ø300 mm plate (A = π·0.15² = 0.0706858 m², geometry), 1.5 kN of apparatus. Jack: 1 bar gives 0.5 kN
 * rising and 0.45 kN falling (an invented jack whose seals cost 10 % on the way down).
 */
const SETUP: RunSetupSnapshot = {
  channels: [gauge('g1', -150, 1), gauge('g2', 150, -1), { key: 'p', role: 'pressure', label: 'oil', instrumentId: 3, profileId: 'manual', port: '', gauge: null }],
  plate: { shape: 'circular', sizeMm: 300 },
  apparatusWeightKn: 1.5,
  stageBranches: ['seating', 'loading', 'unloading'],
  jack: { instrumentId: 9, serial: 'J1', calibrationId: 1, calibration: { inputUnit: 'bar', outputUnit: 'kN', curve: { kind: 'linear', c0: 0, c1: 0.5 }, fallingCurve: { kind: 'linear', c0: 0, c1: 0.45 } } },
  pressureUnit: 'bar',
  instruments: [],
};
const AREA = Math.PI * 0.15 ** 2;

const ev = (kind: string, atMs: number, payload: Record<string, unknown>): ModelEvent => ({ kind, atMs, payload });

describe('measurement model', () => {
  it('measures settlement from the zero, direction and reset offsets in force at each sample', () => {
    const events = [
      ev('gauges-zeroed', 0, { readings: { g1: 10, g2: 40 }, afterSeq: 2 }),
      ev('run-started', 10, { stageIndex: 0, afterSeq: 2 }),
      // g1 reset after seq 4: 30.00 before, 5.00 after → offset +25.00 mm (sign × (before − after), common practice).
      ev('gauge-reset', 50, { channel: 'g1', beforeMm: 30, afterMm: 5, offsetMm: 25, afterSeq: 4 }),
    ];
    const m = new RunMeasurer(SETUP, events);
    m.add({ seq: 3, tMs: 20, channel: 0, value: 30_000 });
    m.add({ seq: 4, tMs: 50, channel: 1, value: 35_000 }); // same ms as the reset, but decided before it
    expect(m.measure().gauges.map((g) => g.settlementMm)).toEqual([20, 5]); // 30 − 10; −(35 − 40)
    m.add({ seq: 5, tMs: 50, channel: 0, value: 5_000 });
    expect(m.measure().gauges[0].settlementMm).toBe(20); // 5 − 10 + 25: continuous across the reset
    expect(m.measure().meanSettlementMm).toBe(12.5);
  });

  it('reads the jack on the branch of the stage in force, with the apparatus weight, and a calibration from its event on', () => {
    const events = [
      ev('run-started', 0, { stageIndex: 1, afterSeq: 0 }),
      ev('stage-advanced', 100, { from: 1, to: 2, afterSeq: 1 }),
      ev('calibration-applied', 200, { instrumentId: 9, serial: 'J1', calibrationId: 2, calibration: { inputUnit: 'bar', outputUnit: 'kN', curve: { kind: 'linear', c0: 0, c1: 0.6 } }, afterSeq: 2 }),
    ];
    const m = new RunMeasurer(SETUP, events);
    m.add({ seq: 1, tMs: 50, channel: 2, value: 100_000 }); // 100 bar loading: 50 kN + 1.5 kN
    expect(m.measure().pressureKpa).toBeCloseTo(51.5 / AREA, 9); // q = F/A
    m.add({ seq: 2, tMs: 150, channel: 2, value: 100_000 }); // unloading: falling branch, 45 kN + 1.5 kN
    expect(m.measure().pressureKpa).toBeCloseTo(46.5 / AREA, 9);
    m.add({ seq: 3, tMs: 250, channel: 2, value: 100_000 }); // the new certificate has no falling curve: 60 kN + 1.5 kN
    expect(m.measure().pressureKpa).toBeCloseTo(61.5 / AREA, 9);
  });

  it('stores a typed plate pressure as the oil pressure it reads back as, on the stage’s branch', () => {
    for (const [stageIndex, perBar] of [
      [1, 0.5],
      [2, 0.45],
    ] as const) {
      const m = new RunMeasurer(SETUP, [ev('run-started', 0, { stageIndex, afterSeq: 0 })]);
      m.advance(null);
      const oil = oilForPlatePressure(SETUP, m.modelState, 150)!;
      expect(oil).toBeCloseTo((150 * AREA - 1.5) / perBar, 9); // F_jack = q·A − W (plate equilibrium)
      m.add({ seq: 1, tMs: 1, channel: 2, value: Math.round(oil * 1000) });
      expect(m.measure().pressureKpa).toBeCloseTo(150, 1); // stored to 0.001 bar
    }
  });

  it('places events without a sequence number by time (runs recorded before), and by number when they have one', () => {
    expect(eventPrecedes(ev('x', 100, {}), { seq: 1, tMs: 100 })).toBe(true);
    expect(eventPrecedes(ev('x', 100, {}), { seq: 1, tMs: 99 })).toBe(false);
    expect(eventPrecedes(ev('x', 100, { afterSeq: 7 }), { seq: 7, tMs: 100 })).toBe(false);
    expect(eventPrecedes(ev('x', 100, { afterSeq: 7 }), { seq: 8, tMs: 100 })).toBe(true);
    const zeroed = [ev('gauges-zeroed', 0, { readings: { g1: 1 } }), ev('gauge-reset', 500, { channel: 'g1', offsetMm: 2 })];
    expect(stateAtTime(SETUP, zeroed, 499).offsets).toEqual({});
    expect(stateAtTime(SETUP, zeroed, 500).offsets).toEqual({ g1: 2 });
  });

  it('keeps the hold series from the target reached, at most every 2 s of gauge samples, cleared by the next stage', () => {
    const tracker = new HoldSeriesTracker();
    const m = new RunMeasurer(SETUP, [ev('gauges-zeroed', 0, { readings: { g1: 0, g2: 0 }, afterSeq: 0 }), ev('target-reached', 1000, { stageIndex: 1, afterSeq: 1 })], (e, mm) => tracker.onEvent(e, mm));
    const feed = (seq: number, tMs: number, channel: number, value: number) => {
      const s = { seq, tMs, channel, value };
      m.add(s);
      tracker.onSample(s, m);
    };
    feed(1, 900, 0, 1_000);
    feed(2, 1500, 0, 1_100); // 0.5 s after t = 0: not due
    feed(3, 3000, 0, 1_200);
    feed(4, 3500, 2, 1_000); // pressure: no point
    expect(tracker.points).toEqual([
      { tMin: 0, settlementMm: 1 },
      { tMin: 2000 / 60_000, settlementMm: 1.2 },
    ]);
    m.push(ev('stage-advanced', 4000, { from: 1, to: 2 }));
    expect(tracker.points).toEqual([]);
    expect(tracker.startedAtMs).toBeNull();
  });
});
