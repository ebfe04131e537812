import { describe, expect, it } from 'vitest';
import { calibrationExpiresAtMs } from '@shared/instruments/status';
import { jumpBetween, type GaugeJump } from '@shared/hold/gauge-reset';
import {
  calibratedRangeAlarm,
  calibrationAlarm,
  gaugeTravelAlarm,
  loadDriftAlarm,
  plateTiltState,
  reactionCapacityAlarm,
  signalLostAlarm,
  stopLimitAlarm,
  stopLimitMm,
  tiltAlarm,
  unexplainedJumpAlarm,
} from '@shared/hold/alarms';

const polar = (radiusMm: number, degrees: number, settlementMm: number) => ({
  xMm: radiusMm * Math.cos((degrees * Math.PI) / 180),
  yMm: radiusMm * Math.sin((degrees * Math.PI) / 180),
  settlementMm,
});

describe('load drift (±2 % or a fixed kPa, whichever is larger — common practice, reference §D.1)', () => {
  it('uses the fixed tolerance at low pressure and 2 % at high pressure', () => {
    expect(loadDriftAlarm({ targetKpa: 100, actualKpa: 98.1 }).active).toBe(false);
    const low = loadDriftAlarm({ targetKpa: 100, actualKpa: 97.9 });
    expect(low).toMatchObject({ code: 'load-drift', active: true, limit: 2, unit: 'kPa' });
    expect(low.value).toBeCloseTo(-2.1, 9);
    expect(low.message).toMatch(/below the 100 kPa target: top up the pump/);
    expect(loadDriftAlarm({ targetKpa: 300, actualKpa: 305 })).toMatchObject({ active: false, limit: 6 });
    expect(loadDriftAlarm({ targetKpa: 300, actualKpa: 306.5 }).message).toMatch(/above .* let some pressure off/);
  });

  it('throws naming the field for bad input', () => {
    expect(() => loadDriftAlarm({ targetKpa: 100, actualKpa: Number.NaN })).toThrow(/^actualKpa:/);
  });
});

describe('plate tilt (reference §C11 check values, calc; thresholds reference §D.3, common practice)', () => {
  it('two gauges 280 mm apart at 4.20 and 3.40 mm: mean 3.800 mm, tilt 0.002857 rad = 0.1637° ≈ 1:350', () => {
    const state = plateTiltState([polar(140, 0, 4.2), polar(140, 180, 3.4)]);
    expect(state.meanSettlementMm).toBeCloseTo(3.8, 9);
    expect(state.spreadMm).toBeCloseTo(0.8, 9);
    expect(state.tilt.radians).toBeCloseTo(0.002857, 6);
    expect(state.tilt.degrees).toBeCloseTo(0.1637, 4);
    expect(state.tilt.oneIn).toBeCloseTo(350, 6);
  });

  it('three gauges at 140 mm, 90°/210°/330°, reading 3.90/3.60/3.30: tilt 0.002474 rad', () => {
    const state = plateTiltState([polar(140, 90, 3.9), polar(140, 210, 3.6), polar(140, 330, 3.3)]);
    expect(state.meanSettlementMm).toBeCloseTo(3.6, 9);
    expect(state.tilt.radians).toBeCloseTo(0.002474, 6);
  });

  it('warns on the C11 pair: 0.80 mm apart is more than 20 % of 3.80 mm and more than 0.5 mm', () => {
    const alarm = tiltAlarm({ gauges: [polar(140, 0, 4.2), polar(140, 180, 3.4)] });
    expect(alarm).toMatchObject({ code: 'plate-tilt', active: true, unit: 'mm' });
    expect(alarm.value).toBeCloseTo(0.8, 9);
    expect(alarm.limit).toBeCloseTo(0.76, 9);
    expect(alarm.message).toContain('1:350');
  });

  it('does not warn on the C11 triple: 0.60 mm apart is less than 20 % of 3.60 mm', () => {
    expect(tiltAlarm({ gauges: [polar(140, 90, 3.9), polar(140, 210, 3.6), polar(140, 330, 3.3)] }).active).toBe(false);
  });

  it('needs both parts of the spread test: a small settlement with 0.4 mm spread does not warn', () => {
    expect(tiltAlarm({ gauges: [polar(300, 0, 1.2), polar(300, 180, 0.8)] }).active).toBe(false);
  });

  it('warns on a tilt beyond 1:100 alone, reporting the tilt', () => {
    // 4 mm over 280 mm is 1:70; the spread limit is max(20 % of 30 mm, 0.5 mm) = 6 mm, not exceeded.
    const alarm = tiltAlarm({ gauges: [polar(140, 0, 32), polar(140, 180, 28)] });
    expect(alarm).toMatchObject({ active: true, unit: 'rad' });
    expect(alarm.value).toBeCloseTo(Math.atan(4 / 280), 12);
  });

  it('needs two gauges', () => {
    expect(() => tiltAlarm({ gauges: [polar(140, 0, 1)] })).toThrow(/^gauges:/);
  });
});

describe('gauge travel (warn at 85 % — common practice, reference §D.3)', () => {
  it('counts used travel in the direction the gauge moves', () => {
    expect(gaugeTravelAlarm({ gauge: 'G1', readingMm: 20, travelMm: 25, sign: 1 })).toMatchObject({ active: false, subject: 'G1', value: 80, limit: 85 });
    expect(gaugeTravelAlarm({ gauge: 'G1', readingMm: 21.5, travelMm: 25, sign: 1 })).toMatchObject({ active: true, severity: 'warning', value: 86 });
    expect(gaugeTravelAlarm({ gauge: 'G2', readingMm: 3, travelMm: 25, sign: -1 })).toMatchObject({ active: true, value: 88 });
    expect(gaugeTravelAlarm({ gauge: 'G2', readingMm: 0, travelMm: 25, sign: -1 })).toMatchObject({ active: true, severity: 'critical' });
    expect(gaugeTravelAlarm({ gauge: 'G1', readingMm: 20, travelMm: 25, sign: 1, warnFraction: 0.8 }).active).toBe(true);
  });
});

describe('stop limit', () => {
  it('takes the smaller of the settlement limit and the fraction of plate width', () => {
    expect(stopLimitMm({ maxSettlementMm: 25, maxSettlementFractionOfWidth: 0 }, 300)).toBe(25);
    expect(stopLimitMm({ maxSettlementMm: 25, maxSettlementFractionOfWidth: 0.1 }, 150)).toBe(15);
  });

  it('is active when the mean settlement reaches it (25 mm — common practice)', () => {
    expect(stopLimitAlarm({ meanSettlementMm: 24.99, stopLimitMm: 25 }).active).toBe(false);
    expect(stopLimitAlarm({ meanSettlementMm: 25, stopLimitMm: 25 })).toMatchObject({ active: true, severity: 'critical' });
  });
});

describe('reaction capacity (90 % — common practice, reference §D.2)', () => {
  it('warns at 90 % and is critical at 100 %', () => {
    expect(reactionCapacityAlarm({ jackForceKn: 89.9, capacityKn: 100 }).active).toBe(false);
    expect(reactionCapacityAlarm({ jackForceKn: 90, capacityKn: 100 })).toMatchObject({ active: true, severity: 'warning' });
    expect(reactionCapacityAlarm({ jackForceKn: 101, capacityKn: 100 })).toMatchObject({ active: true, severity: 'critical' });
  });
});

describe('signal lost (alarm within 2 s — QUALITY R3)', () => {
  it('is active after more than 2 s without a sample, or before the first', () => {
    expect(signalLostAlarm({ channel: 'pressure', lastSampleAtMs: 10_000, nowMs: 11_500 }).active).toBe(false);
    expect(signalLostAlarm({ channel: 'pressure', lastSampleAtMs: 10_000, nowMs: 12_500 })).toMatchObject({ active: true, value: 2.5, unit: 's' });
    // A port that reports itself gone alarms at once, without waiting for the silence.
    expect(signalLostAlarm({ channel: 'g1', lastSampleAtMs: 10_000, nowMs: 10_100, portLost: true })).toMatchObject({ active: true, message: expect.stringMatching(/port of g1 is gone/) });
    expect(signalLostAlarm({ channel: 'G1', lastSampleAtMs: null, nowMs: 0 })).toMatchObject({ active: true, value: null });
  });
});

describe('calibration', () => {
  const day = 86_400_000;
  it('is active past the due date or with no calibration on record', () => {
    expect(calibrationAlarm({ instrument: 'Jack J-2', dueAtMs: 10 * day, nowMs: 11 * day })).toMatchObject({ active: true, value: 1 });
    expect(calibrationAlarm({ instrument: 'Jack J-2', dueAtMs: null, nowMs: 0 }).active).toBe(true);
    expect(calibrationAlarm({ instrument: 'Jack J-2', dueAtMs: 30 * day, nowMs: 11 * day }).message).toMatch(/due in 19 day/);
  });
});

describe('calibration expiring during a run', () => {
  it('stays quiet through the due date and fires from the next day (usable through its due date — common practice)', () => {
    const expires = calibrationExpiresAtMs('2026-12-02');
    expect(expires).toBe(Date.parse('2026-12-03T00:00:00Z'));
    const at = (iso: string) => calibrationAlarm({ instrument: 'Gauge DG-2107', dueAtMs: expires, nowMs: Date.parse(iso) });
    expect(at('2026-12-02T23:59:59Z').active).toBe(false);
    const after = at('2026-12-03T00:00:01Z');
    expect(after).toMatchObject({ code: 'calibration-overdue', subject: 'Gauge DG-2107', active: true });
    expect(after.message).toMatch(/past its calibration due date/);
  });
});

describe('reading outside its calibrated range', () => {
  // A jack certified 0–50 MPa (invented): 4.92 kN per MPa.
  const jack = { inputUnit: 'MPa' as const, outputUnit: 'kN' as const, curve: { kind: 'linear' as const, c0: 0.35, c1: 4.92 }, range: [0, 50] as [number, number] };

  it('fires beyond the range, naming the reading, the span and what to do', () => {
    const alarm = calibratedRangeAlarm({ subject: 'p1', label: 'Jack JK-1', reading: 55, calibration: jack });
    expect(alarm).toMatchObject({ code: 'outside-calibration', subject: 'p1', severity: 'critical', active: true, value: 55, limit: 50, unit: 'MPa' });
    expect(alarm!.message).toMatch(/reads 55\.00 MPa, beyond its calibration \(0–50 MPa\): values worked out from it are extrapolated/);
    expect(calibratedRangeAlarm({ subject: 'p1', label: 'Jack JK-1', reading: -2, calibration: jack })).toMatchObject({ active: true, limit: 0 });
  });

  it('stays quiet inside the range, at its ends too, and for the flutter of an instrument at rest (1 % of the span)', () => {
    for (const reading of [0, 12.5, 50, -0.04, 50.4]) expect(calibratedRangeAlarm({ subject: 'p1', label: 'Jack JK-1', reading, calibration: jack })?.active).toBe(false);
    expect(calibratedRangeAlarm({ subject: 'p1', label: 'Jack JK-1', reading: 50.6, calibration: jack })?.active).toBe(true);
    expect(calibratedRangeAlarm({ subject: 'p1', label: 'Jack JK-1', reading: 50.1, calibration: jack, marginFraction: 0 })?.active).toBe(true);
  });

  it('takes a table without a range as covering its points; a bare line with no span has nothing to judge', () => {
    const table = { inputUnit: 'mm' as const, outputUnit: 'mm' as const, curve: { kind: 'table' as const, points: [{ x: 0, y: 0 }, { x: 25, y: 25.02 }] } };
    expect(calibratedRangeAlarm({ subject: 'g1', label: 'Gauge g1', reading: 25.5, calibration: table })?.active).toBe(true);
    expect(calibratedRangeAlarm({ subject: 'j', label: 'Ideal ram', reading: 500, calibration: { ...jack, range: undefined } })).toBeNull();
  });
});

describe('unexplained jump (a gauge knocked or reset without a record — common practice)', () => {
  const t0 = Date.parse('2026-12-02T10:00:00Z');
  /** Readings 100 ms apart through jumpBetween, as the engine feeds them, on a 0.01 mm gauge. */
  const jumpsOf = (values: number[]) => {
    const jumps: GaugeJump[] = [];
    values.forEach((mm, i) => {
      const j = jumpBetween(i === 0 ? null : { tMs: t0 + (i - 1) * 100, mm: values[i - 1] }, { tMs: t0 + i * 100, mm }, { resolutionMm: 0.01 });
      if (j) jumps.push(j);
    });
    return jumps;
  };

  it('fires on a jump no reset explains, with the readings and times either side as evidence', () => {
    const jumps = jumpsOf([12.3, 12.31, 12.31, 14.56, 14.57]);
    expect(jumps).toEqual([{ fromMs: t0 + 200, toMs: t0 + 300, fromMm: 12.31, toMm: 14.56 }]);
    const alarm = unexplainedJumpAlarm({ gauge: 'g1', jumps, resetsAtMs: [] });
    expect(alarm).toMatchObject({ code: 'unexplained-jump', subject: 'g1', active: true, unit: 'mm' });
    expect(alarm.value).toBeCloseTo(2.25, 9);
    expect(alarm.evidence).toEqual({ before: { atMs: t0 + 200, value: 12.31 }, after: { atMs: t0 + 300, value: 14.56 }, unit: 'mm' });
    expect(alarm.message).toMatch(/jumped from 12\.31 mm at 10:00:00 to 14\.56 mm at 10:00:00 \(\+2\.25 mm\) with no reset recorded/);
  });

  it('is explained by a reset of the gauge recorded within the grace time after the jump, not by one long after', () => {
    const jumps = jumpsOf([24.3, 24.3, 1.15, 1.16]);
    expect(unexplainedJumpAlarm({ gauge: 'g1', jumps, resetsAtMs: [t0 + 60_000] }).active).toBe(false);
    expect(unexplainedJumpAlarm({ gauge: 'g1', jumps, resetsAtMs: [t0 + 600_000] }).active).toBe(true);
    expect(unexplainedJumpAlarm({ gauge: 'g1', jumps, resetsAtMs: [t0 - 60_000] }).active).toBe(true);
  });

  it('does not compare readings far apart in time: a change over minutes is movement, not a knock', () => {
    expect(jumpBetween({ tMs: t0, mm: 5 }, { tMs: t0 + 60_000, mm: 7 }, { resolutionMm: 0.01 })).toBeNull();
    expect(jumpBetween({ tMs: t0, mm: 5 }, { tMs: t0 + 1_000, mm: 7 }, { resolutionMm: 0.01 })).not.toBeNull();
  });

  it('on a fine gauge asks for a step of millimetres, not only of divisions (plate settling after a top-up is not a knock; common practice)', () => {
    // 0.001 mm gauge: 0.2 mm in 2 s is 200 divisions, but a plate can settle that fast right after a top-up.
    expect(jumpBetween({ tMs: t0, mm: 5 }, { tMs: t0 + 2_000, mm: 5.2 }, { resolutionMm: 0.001 })).toBeNull();
    expect(jumpBetween({ tMs: t0, mm: 5 }, { tMs: t0 + 2_000, mm: 5.6 }, { resolutionMm: 0.001 })).not.toBeNull();
  });

  it('stays quiet on normal data: steady settlement with noise of a division or two', () => {
    // 10 minutes at 10 Hz: 0.02 mm/min creep plus ±0.02 mm noise, rounded to the 0.01 mm division.
    const values = Array.from({ length: 6000 }, (_, i) => Math.round((5 + 0.02 * (i / 600) + 0.02 * Math.sin(i * 1.7)) * 100) / 100);
    const jumps = jumpsOf(values);
    expect(jumps).toEqual([]);
    expect(unexplainedJumpAlarm({ gauge: 'g1', jumps, resetsAtMs: [] }).active).toBe(false);
  });
});
