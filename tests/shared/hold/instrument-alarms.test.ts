import { describe, expect, it } from 'vitest';
import type { Calibration } from '@shared/calibration/schema';
import {
  emptyInstrumentWatch,
  gaugeResolutionMm,
  gaugeTravelMm,
  type InstrumentAlarmInput,
  type InstrumentWatch,
  instrumentAlarms,
  type KitInstrument,
  rigResolutionMm,
  watchReading,
  watchReset,
} from '@shared/hold/instrument-alarms';
import type { RigChannelInput } from '@shared/schemas/instruments';

// An invented rig: two 50 mm indicators (0.001 and 0.01 mm), an oil-pressure transducer in bar, a jack certified 0–50 MPa.
const mm: Calibration = { inputUnit: 'mm', outputUnit: 'mm', curve: { kind: 'linear', c0: 0, c1: 1 }, range: [0, 50] };
const bar: Calibration = { inputUnit: 'bar', outputUnit: 'bar', curve: { kind: 'linear', c0: 0, c1: 1 }, range: [0, 700] };
const jackLine: Calibration = { inputUnit: 'MPa', outputUnit: 'kN', curve: { kind: 'linear', c0: 0.35, c1: 4.92 }, range: [0, 50] };
const kitOf = (over: Partial<Record<number, Partial<KitInstrument>>> = {}) =>
  new Map<number, KitInstrument>(
    (
      [
        [1, { serial: 'DG-1', resolution: 0.001, travelMm: 50, calibration: mm, dueOn: '2027-06-01' }],
        [2, { serial: 'DG-2', resolution: 0.01, travelMm: 50, calibration: mm, dueOn: '2027-06-01' }],
        [3, { serial: 'PT-1', resolution: 0.1, travelMm: null, calibration: bar, dueOn: '2027-06-01' }],
        [4, { serial: 'JK-1', resolution: null, travelMm: null, calibration: jackLine, dueOn: '2027-06-01' }],
      ] as [number, KitInstrument][]
    ).map(([id, k]) => [id, { ...k, ...over[id] }]),
  );
const gauge = (key: string, instrumentId: number | null): RigChannelInput => ({
  key,
  role: 'gauge',
  label: `Gauge ${key}`,
  instrumentId,
  profileId: 'ascii-polled-mm',
  port: '',
  gauge: { xMm: 0, yMm: 0, direction: 1, travelMm: 25 },
});
const channels: RigChannelInput[] = [gauge('g1', 1), gauge('g2', 2), { key: 'p1', role: 'pressure', label: 'Oil pressure', instrumentId: 3, profileId: 'modbus-hr0-int16', port: '', gauge: null }];
const t0 = Date.parse('2026-12-02T10:00:00Z');
const now = Date.parse('2026-12-02T12:00:00Z');

/** Readings 100 ms apart per channel, as the engine feeds them. */
function watched(series: Record<string, number[]>, held = true): InstrumentWatch {
  let w = emptyInstrumentWatch();
  const n = Math.max(...Object.values(series).map((s) => s.length));
  for (let i = 0; i < n; i++) {
    for (const [key, values] of Object.entries(series)) {
      if (i >= values.length) continue;
      const role = channels.find((c) => c.key === key)!.role;
      w = watchReading(w, { key, role, tMs: t0 + i * 100, raw: values[i], value: values[i] }, { resolutionMm: 0.01, held });
    }
  }
  return w;
}
const input = (over: Partial<InstrumentAlarmInput> = {}): InstrumentAlarmInput => ({
  channels,
  kit: kitOf(),
  jack: { instrumentId: 4, calibration: jackLine },
  oil: { value: 120, unit: 'bar' },
  watch: watched({ g1: [5, 5.001, 5.002], g2: [5.01, 5.01, 5.02], p1: [120, 120.3, 119.8] }),
  sinceMs: t0,
  nowWallMs: now,
  ...over,
});
const active = (alarms: ReturnType<typeof instrumentAlarms>) => alarms.filter((a) => a.active).map((a) => `${a.code}:${a.subject}`);

describe('gauge resolution and travel come from the instrument', () => {
  it("uses the instrument's travel and resolution, else the channel's travel and the common 0.01 mm", () => {
    const kit = kitOf();
    expect(gaugeTravelMm(channels[0], kit)).toBe(50);
    expect(gaugeTravelMm(gauge('g9', null), kit)).toBe(25);
    expect(gaugeResolutionMm(channels[0], kit)).toBe(0.001);
    expect(gaugeResolutionMm(gauge('g9', null), kit)).toBe(0.01);
    // The mean of two gauges is judged by the coarser division.
    expect(rigResolutionMm(channels, kit)).toBe(0.01);
    expect(rigResolutionMm([channels[0]], kit)).toBe(0.001);
  });
});

describe('instrument alarms', () => {
  it('stay quiet on normal data: calibrations in force, readings inside their ranges, no jump', () => {
    const alarms = instrumentAlarms(input());
    expect(active(alarms)).toEqual([]);
    // One calibration alarm per instrument (the jack too), a range alarm per calibrated channel and the jack, a jump rule per gauge.
    expect(alarms.map((a) => `${a.code}:${a.subject}`).sort()).toEqual(
      [
        'calibration-overdue:DG-1',
        'calibration-overdue:DG-2',
        'calibration-overdue:PT-1',
        'calibration-overdue:JK-1',
        'outside-calibration:g1',
        'outside-calibration:g2',
        'outside-calibration:p1',
        'outside-calibration:jack',
        'unexplained-jump:g1',
        'unexplained-jump:g2',
      ].sort(),
    );
  });

  it('raise calibration-overdue for an instrument overdue at the start, and for one that expires during the run', () => {
    expect(active(instrumentAlarms(input({ kit: kitOf({ 2: { dueOn: '2026-11-20' } }) })))).toEqual(['calibration-overdue:DG-2']);
    const expiring = kitOf({ 4: { dueOn: '2026-12-02' } });
    expect(active(instrumentAlarms(input({ kit: expiring, nowWallMs: Date.parse('2026-12-02T23:59:00Z') })))).toEqual([]);
    expect(active(instrumentAlarms(input({ kit: expiring, nowWallMs: Date.parse('2026-12-03T00:01:00Z') })))).toEqual(['calibration-overdue:JK-1']);
    expect(active(instrumentAlarms(input({ kit: kitOf({ 3: { dueOn: null } }) })))).toEqual(['calibration-overdue:PT-1']);
  });

  it('flag the oil pressure beyond the jack calibration (550 bar = 55 MPa on a jack certified to 50 MPa)', () => {
    const alarms = instrumentAlarms(input({ oil: { value: 550, unit: 'bar' }, watch: watched({ p1: [550] }) }));
    expect(active(alarms)).toEqual(['outside-calibration:jack']);
    const jack = alarms.find((a) => a.subject === 'jack')!;
    expect(jack).toMatchObject({ value: 55, limit: 50, unit: 'MPa' });
    expect(jack.message).toMatch(/Oil pressure on jack JK-1 reads 55\.00 MPa, beyond its calibration \(0–50 MPa\)/);
  });

  it("flag a channel's raw reading beyond its own calibration", () => {
    expect(active(instrumentAlarms(input({ watch: watched({ p1: [120, 760] }) })))).toEqual(['outside-calibration:p1']);
  });

  it('raise an unexplained jump with its evidence, explained by a reset recorded soon after, forgotten with the stage', () => {
    const w = watched({ g1: [5, 5.001, 7.5, 7.501] });
    const jumps = instrumentAlarms(input({ watch: w })).find((a) => a.code === 'unexplained-jump' && a.subject === 'g1')!;
    expect(jumps).toMatchObject({ active: true, evidence: { before: { atMs: t0 + 100, value: 5.001 }, after: { atMs: t0 + 200, value: 7.5 }, unit: 'mm' } });
    expect(active(instrumentAlarms(input({ watch: watchReset(w, 'g1', t0 + 30_000) })))).toEqual([]);
    expect(active(instrumentAlarms(input({ watch: watchReset(w, 'g2', t0 + 30_000) })))).toEqual(['unexplained-jump:g1']);
    expect(active(instrumentAlarms(input({ watch: w, sinceMs: t0 + 60_000 })))).toEqual([]);
  });

  it('look for jumps only under a held load: while pumping the plate itself moves that fast', () => {
    expect(active(instrumentAlarms(input({ watch: watched({ g1: [5, 5.001, 7.5, 7.501] }, false) })))).toEqual([]);
  });
});
